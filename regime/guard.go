package regime

import (
	"math"
)

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
		return errorf("%s; check the inputs", result)
	}
	return &RangeError{Input: worst.name, Value: worst.v, Unit: worst.unit, Result: result}
}

// flowInputs are the organism's inputs of the Reynolds number and the
// drag. The medium's properties are not among them: media refuses
// conditions that would make them extreme.
func flowInputs(o *Organism) []quantity {
	return []quantity{{"length", "m", o.Body.Length}, {"diameter", "m", o.Body.Diameter}, {"speed", "m/s", o.Speed},
		{"drag coefficient", "", o.Body.DragCoefficient}, {"reference area", "m²", o.Body.ReferenceArea}}
}

// usable reports whether v is a finite number above zero.
func usable(v float64) bool { return v > 0 && !math.IsInf(v, 0) }

// checkReynolds refuses a Reynolds number that overflowed or underflowed,
// before any drag law is asked about it.
func checkReynolds(re float64, o *Organism) error {
	if usable(re) {
		return nil
	}
	what := "the Reynolds number overflows"
	if re == 0 {
		what = "the Reynolds number underflows to zero"
	} else if math.IsNaN(re) {
		what = "the Reynolds number is not a number"
	}
	return rangeError(what, flowInputs(o)...)
}

// checkResult refuses a result with a number that is not finite, or a
// drag, area or power that underflowed to zero: none of them may reach an
// output. Quantities that do not apply are NaN by convention and pass. It
// runs for every batch row, so the inputs to blame are gathered only when
// a check fails.
func checkResult(r *Result, o *Organism) error {
	d := &r.Drag.Chosen
	required := [...]float64{d.Force, d.ReferenceArea, d.Coefficient, r.Power.Total}
	for i, v := range required {
		if !usable(v) {
			return resultError(r, o, i, v)
		}
	}
	optional := [...]float64{r.Strouhal, r.AdvanceRatio, r.ReducedFrequency, r.Peclet, r.CoastTime, r.CoastDistance,
		r.GeneralizedRe, r.BinghamNumber, r.Deborah, r.Weissenberg}
	for i, v := range optional {
		if math.IsInf(v, 0) {
			return resultError(r, o, len(required)+i, v)
		}
	}
	for i := range r.Drag.Estimates {
		e := &r.Drag.Estimates[i]
		if !usable(e.Force) || !usable(e.Coefficient) || !usable(e.Reynolds) || !usable(e.ReferenceArea) {
			return rangeError("the drag by "+e.Law+" is not a finite positive number", flowInputs(o)...)
		}
	}
	return nil
}

// resultNames name checkResult's values in its order: required, then
// optional.
var resultNames = [...]string{"drag", "reference area", "drag coefficient", "power",
	"Strouhal number", "advance ratio", "reduced frequency", "Péclet number", "coasting time", "coasting distance",
	"generalised Reynolds number", "Bingham number", "Deborah number", "Weissenberg number"}

// resultError blames the inputs of checkResult's value i, which is v.
func resultError(r *Result, o *Organism, i int, v float64) error {
	flow := flowInputs(o)
	stroke := []quantity{{"frequency", "Hz", o.Frequency}, {"amplitude", "m", o.Amplitude}, {"speed", "m/s", o.Speed}}
	inputs := flow
	switch resultNames[i] {
	case "power", "coasting time", "coasting distance":
		inputs = append(flow, quantity{"mass", "kg", o.Mass}, quantity{"span", "m", o.Span},
			quantity{"wing length", "m", o.WingLength}, quantity{"chord", "m", o.Chord}, quantity{"wing area", "m²", o.WingArea})
	case "Strouhal number", "advance ratio", "reduced frequency", "Deborah number":
		inputs = stroke
	case "Péclet number":
		inputs = append(flow, quantity{"diffusivity", "m²/s", o.Diffusivity})
	}
	what := "the " + resultNames[i]
	switch {
	case math.IsInf(v, 0):
		what += " overflows"
	case v == 0:
		what += " underflows to zero"
	default:
		what += " is not a finite positive number"
	}
	return rangeError(what, inputs...)
}

// checkCurve refuses a power curve with a number that is not finite.
func checkCurve(pc *PowerCurve, o *Organism, lo, hi float64) error {
	inputs := []quantity{{"length", "m", o.Body.Length}, {"mass", "kg", o.Mass}, {"span", "m", o.Span},
		{"from speed", "m/s", lo}, {"to speed", "m/s", hi}}
	vals := []float64{pc.MinPowerSpeed, pc.MinPower, pc.MaxRangeSpeed, pc.MinCostOfTr}
	if !pc.Gliding { // a glide has no hover: its Hover is NaN by design
		vals = append(vals, pc.Hover)
	}
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
