package cli

import (
	"errors"
	"fmt"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/media"
	"github.com/spf13/pflag"
)

// mediumFlags are the flags that say where the fluid is. Every command that
// needs a medium binds them.
type mediumFlags struct{ fieldFlags }

const mediumFlagHelp = `
Medium conditions:
  Water: --temp (default 20 °C), --salinity for sea water (default 35 g/kg of
  reference-composition salinity; a bare number or psu is practical salinity
  PSS-78, g/kg or ‰ is reference-composition salinity), and either --depth
  below the surface or an absolute --pressure (default: one standard
  atmosphere at the surface). For a lake at altitude, --altitude sets the
  surface pressure from the standard atmosphere.
  Air: --altitude is geometric height above mean sea level (converted to
  geopotential height for the US Standard Atmosphere 1976 / ISO 2533);
  without --temp the air has the standard-atmosphere temperature there
  (15 °C at sea level) plus --temp-offset; with --temp the measured
  temperature is used and the pressure is still the standard one for the
  altitude, unless --pressure (absolute) is given. --humidity is relative
  humidity in % (default 0).
  Pressures are absolute; sea pressure (absolute less 101325 Pa) is printed
  for water as "sea pressure".`

// bind adds the medium conditions' flags (inputs.MediumFlag).
func (m *mediumFlags) bind(fs *pflag.FlagSet) { m.fieldFlags.bind(fs, inputs.MediumFlag) }

// source returns the medium flags as an inputs.Source.
func (m *mediumFlags) source() inputs.Flags { return m.fieldFlags.source(inputs.MediumFlag) }

// lookup parses the flags and evaluates the named medium.
// An uncertainty in a flag is refused: command does not propagate it.
func (m *mediumFlags) lookup(command, medium string) (media.Properties, error) {
	if err := refuseUncertain(command, m.source()); err != nil {
		return media.Properties{}, err
	}
	c, err := inputs.Conditions(m.source(), medium)
	if err != nil {
		return media.Properties{}, usageError{err}
	}
	p, err := inputs.LookupMedium(c, false)
	if err != nil {
		return p, lookupError(err)
	}
	return p, nil
}

// lookupError is a medium lookup's failure for the user: an unknown medium
// name is a usage mistake (exit 2); conditions that cannot be computed are
// not (exit 1).
func lookupError(err error) error {
	if errors.Is(err, media.ErrUnknownMedium) {
		return usageError{fmt.Errorf("%s", trimPkg(err))}
	}
	return fmt.Errorf("%s", trimPkg(err))
}

// trimPkg is a library error's message for users, without its package
// prefix.
func trimPkg(err error) string { return inputs.Reason(err) }
