package cli

import (
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/cmd/internal/quantity"
)

// refuseUncertain refuses, as a usage mistake, an input with an
// uncertainty ("12±1mm") given to a command that does not propagate one:
// an uncertainty is propagated or refused, never dropped.
func refuseUncertain(command string, src inputs.Source) error {
	if label, text, ok := inputs.FirstUncertain(src); ok {
		return uncertainUsage(command, label, text)
	}
	return nil
}

// refuseUncertainValue is [refuseUncertain] for one parsed flag value.
func refuseUncertainValue(command, flag, text string, v quantity.Value) error {
	if v.SD > 0 {
		return uncertainUsage(command, "--"+flag, text)
	}
	return nil
}

func uncertainUsage(command, label, text string) error {
	return usagef("%s %s: %s does not propagate an uncertainty (±); give the value alone, or use calc, which propagates it", label, text, command)
}
