package regime

import (
	"fmt"
	"math"
)

// RangeError says that a result left the range of floating-point numbers
// (it overflowed, underflowed to zero or became NaN) because an input is
// far beyond any organism. It names the input most likely at fault: of the
// inputs the result depends on, the one farthest from 1 in orders of
// magnitude of its SI unit.
type RangeError struct {
	Input  string  // "length", "speed", …
	Value  float64 // in SI units
	Unit   string
	Result string // "the Reynolds number overflows"
}

func (e *RangeError) Error() string {
	size := "large"
	if math.Abs(e.Value) < 1 {
		size = "small"
	}
	return fmt.Sprintf("regime: %s %g %s is too %s: %s; check its unit", e.Input, e.Value, e.Unit, size, e.Result)
}

// quantity is one input a result depends on.
type quantity struct {
	name, unit string
	v          float64
}

// rangeError blames the most extreme of the given inputs for result.
func rangeError(result string, qs ...quantity) error {
	var worst quantity
	far := -1.0
	for _, q := range qs {
		if !(q.v > 0) || math.IsInf(q.v, 0) {
			continue
		}
		if d := math.Abs(math.Log10(q.v)); d > far {
			worst, far = q, d
		}
	}
	if far < 0 {
		return fmt.Errorf("regime: %s; check the inputs", result)
	}
	return &RangeError{Input: worst.name, Value: worst.v, Unit: worst.unit, Result: result}
}

// flowInputs are the inputs of the Reynolds number and the drag.
func flowInputs(o *Organism, m mediumValues) []quantity {
	return []quantity{{"length", "m", o.Body.Length}, {"diameter", "m", o.Body.Diameter}, {"speed", "m/s", o.Speed},
		{"kinematic viscosity", "m²/s", m.nu}, {"density", "kg/m³", m.rho}}
}

// mediumValues are the medium's numbers the checks need.
type mediumValues struct{ rho, nu float64 }

// usable reports whether v is a finite number above zero.
func usable(v float64) bool { return v > 0 && !math.IsInf(v, 0) }

// checkReynolds refuses a Reynolds number that overflowed or underflowed,
// before any drag law is asked about it.
func checkReynolds(re float64, o *Organism, rho, nu float64) error {
	if usable(re) {
		return nil
	}
	what := "the Reynolds number overflows"
	if re == 0 {
		what = "the Reynolds number underflows to zero"
	} else if math.IsNaN(re) {
		what = "the Reynolds number is not a number"
	}
	return rangeError(what, flowInputs(o, mediumValues{rho, nu})...)
}

// checkResult refuses a result with a number that is not finite, or a
// drag, area or power that underflowed to zero: none of them may reach an
// output. Quantities that do not apply are NaN by convention and pass.
func checkResult(r *Result, o *Organism) error {
	mv := mediumValues{r.Medium.Density, r.Viscosity / r.Medium.Density}
	flow := flowInputs(o, mv)
	stroke := []quantity{{"frequency", "Hz", o.Frequency}, {"amplitude", "m", o.Amplitude}, {"speed", "m/s", o.Speed}}
	power := append(append([]quantity{}, flow...), quantity{"mass", "kg", o.Mass}, quantity{"span", "m", o.Span},
		quantity{"wing length", "m", o.WingLength}, quantity{"chord", "m", o.Chord}, quantity{"wing area", "m²", o.WingArea})
	d := &r.Drag.Chosen
	for _, c := range [...]struct {
		v        float64
		optional bool // NaN means "does not apply"
		name     string
		inputs   []quantity
	}{
		{d.Force, false, "drag", flow},
		{d.ReferenceArea, false, "reference area", flow},
		{d.Coefficient, false, "drag coefficient", flow},
		{r.Power.Total, false, "power", power},
		{r.Strouhal, true, "Strouhal number", stroke},
		{r.AdvanceRatio, true, "advance ratio", stroke},
		{r.ReducedFrequency, true, "reduced frequency", stroke},
		{r.Peclet, true, "Péclet number", append(flow, quantity{"diffusivity", "m²/s", o.Diffusivity})},
		{r.CoastTime, true, "coasting time", power},
		{r.CoastDistance, true, "coasting distance", power},
		{r.GeneralizedRe, true, "generalised Reynolds number", flow},
		{r.BinghamNumber, true, "Bingham number", flow},
		{r.Deborah, true, "Deborah number", stroke},
		{r.Weissenberg, true, "Weissenberg number", flow},
	} {
		switch {
		case c.optional && math.IsNaN(c.v):
		case math.IsInf(c.v, 0):
			return rangeError("the "+c.name+" overflows", c.inputs...)
		case math.IsNaN(c.v):
			return rangeError("the "+c.name+" is not a number", c.inputs...)
		case c.v == 0 && !c.optional:
			return rangeError("the "+c.name+" underflows to zero", c.inputs...)
		}
	}
	return checkEstimates(r.Drag.Estimates, flow)
}

// checkEstimates refuses another law's estimate that left the range of
// numbers, since every estimate is printed beside the chosen one.
func checkEstimates(es []Estimate, flow []quantity) error {
	for _, e := range es {
		for _, v := range [...]float64{e.Force, e.Coefficient, e.Reynolds, e.ReferenceArea} {
			if !usable(v) {
				return rangeError("the drag by "+e.Law+" is not a finite positive number", flow...)
			}
		}
	}
	return nil
}

// checkCurve refuses a power curve with a number that is not finite.
func checkCurve(pc *PowerCurve, o *Organism, lo, hi float64) error {
	inputs := []quantity{{"length", "m", o.Body.Length}, {"mass", "kg", o.Mass}, {"span", "m", o.Span},
		{"from speed", "m/s", lo}, {"to speed", "m/s", hi}}
	vals := []float64{pc.Hover, pc.MinPowerSpeed, pc.MinPower, pc.MaxRangeSpeed, pc.MinCostOfTr}
	for _, p := range pc.Points {
		vals = append(vals, p.Induced, p.Parasite, p.Profile, p.Total)
	}
	for _, v := range vals {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return rangeError("the flight power is not a finite number", inputs...)
		}
	}
	return nil
}
