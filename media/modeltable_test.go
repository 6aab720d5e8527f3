package media

import "testing"

// Every model of the table builds from its own parameters: NewModel with
// the names and values of a model's Params gives that model back, so the
// table's parameter order, the constructor and Params agree. The yield
// stress and time constant are the parameters so named. (Structural check;
// the models' formulas are tested against published fits in fit_test.go.)
func TestModelTableRoundTrip(t *testing.T) {
	for _, d := range modelDefs {
		var vals params
		for i := range d.params {
			vals[i] = float64(i + 2) // distinct and positive
		}
		if d.plateau() {
			vals[0], vals[1] = 5, 0.5 // η₀ > η∞
		}
		m := d.make(vals)
		if m.Name() != d.name {
			t.Errorf("%s builds a %s", d.name, m.Name())
		}
		ps := map[string]float64{}
		for i, p := range m.Params() {
			if p.Name != d.params[i] || p.Value != vals[i] {
				t.Errorf("%s parameter %d: Params says %s = %g, table %s = %g", d.name, i, p.Name, p.Value, d.params[i], vals[i])
			}
			ps[p.Name] = p.Value
		}
		back, err := NewModel(d.name, ps)
		if err != nil || back != m {
			t.Errorf("%s: NewModel gives %v, %v; want %v", d.name, back, err, m)
		}
		if got, want := YieldStress(m), ps[PYield]; got != want {
			t.Errorf("%s: yield stress %g, want %g", d.name, got, want)
		}
		if got, want := timeConstant(m), ps[PTime]; got != want {
			t.Errorf("%s: time constant %g, want %g", d.name, got, want)
		}
	}
	if _, err := NewModel(ModelCross, map[string]float64{PZero: 1, PInfinite: 2, PTime: 1, PTransition: 1}); err == nil {
		t.Error("η∞ > η₀ accepted")
	}
}
