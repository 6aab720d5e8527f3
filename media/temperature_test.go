package media

import (
	"math"
	"strings"
	"testing"
)

// T-ARR-1 (METHODS-LAB §1.6 and §6, checks from the IAPWS-2008 table at
// 0.1 MPa: 20 °C 1.0016, 25 °C 0.8900, 37 °C 0.6913 mPa·s): E_a(20–37 °C)
// = 16.49 kJ/mol; the Arrhenius value at 25 °C is 0.8942 mPa·s (+0.47 %
// against the table).
func TestArrheniusVector(t *testing.T) {
	ea := ActivationEnergy(20, 1.0016e-3, 37, 0.6913e-3)
	near(t, "T-ARR-1 E_a", ea, 16.49e3, 5e-4)
	near(t, "T-ARR-1 η(25 °C)", 1.0016e-3*ArrheniusShift(ea, 20, 25), 0.8942e-3, 1e-4)
}

// Water-ratio scaling (METHODS-LAB §1.6 test vector): a plasma-like fluid
// of 1.80 mPa·s at 20 °C is 1.242 mPa·s at 37 °C.
func TestWaterRatioVector(t *testing.T) {
	near(t, "plasma-like fluid at 37 °C", 1.80e-3*WaterRatioShift(20, 37), 1.242e-3, 1e-3)
}

func mucusFile(dep *TemperatureDependence) MediumFile {
	t := 20.0
	return MediumFile{Format: MediumFileFormat, Version: MediumFileVersionTemperature, Name: "test mucus", Density: 1010, TemperatureC: &t,
		Model: ModelHerschelBulkley, Parameters: map[string]float64{PYield: 10, PConsistency: 2, PFlowIndex: 0.5},
		ShearRateRange: [2]float64{0.1, 100}, TemperatureDependence: dep}
}

// A medium file with an Arrhenius dependence, used at 37 °C: every
// stress is multiplied by a_T (T-ARR-1's E_a takes 1.0016 to 0.6913 mPa·s,
// a factor 0.6913/1.0016), the flow index is kept, and a temperature
// outside the stated range is warned about.
func TestPropertiesAtTemperature(t *testing.T) {
	ea := ActivationEnergy(20, 1.0016e-3, 37, 0.6913e-3)
	f := mucusFile(&TemperatureDependence{Method: TempArrhenius, ActivationEnergy: &ea, RangeC: &[2]float64{15, 37}})
	if err := f.Check(); err != nil {
		t.Fatal(err)
	}
	p20, _ := f.PropertiesAt(math.NaN())
	p37, err := f.PropertiesAt(37)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "stress ratio 37/20 °C at 5 1/s", p37.ApparentViscosity(5)/p20.ApparentViscosity(5), 0.6913/1.0016, 1e-9)
	if len(p37.Warnings) != 0 {
		t.Errorf("37 °C is in range, got %v", p37.Warnings)
	}
	p5, _ := f.PropertiesAt(5)
	if len(p5.Warnings) != 1 || p5.Warnings[0].Code != WarnOutOfRange {
		t.Errorf("5 °C is outside 15–37 °C; warnings %v", p5.Warnings)
	}
	hb := p37.Rheology.(MeasuredRheology).Model.(HerschelBulkley)
	if hb.N != 0.5 {
		t.Errorf("flow index changed to %g", hb.N)
	}
}

// A table dependence interpolates ln η linearly in 1/T: at the table's
// temperatures it returns the table's ratios exactly.
func TestTableDependence(t *testing.T) {
	d := TemperatureDependence{Method: TempTable, Table: []TemperatureViscosity{{10, 4e-3}, {20, 3e-3}, {30, 2e-3}}}
	if err := d.Check(); err != nil {
		t.Fatal(err)
	}
	near(t, "a_T(20→10)", d.Shift(20, 10), 4.0/3, 1e-12)
	near(t, "a_T(20→30)", d.Shift(20, 30), 2.0/3, 1e-12)
	// between 20 and 30 °C the value is the two-point Arrhenius one
	ea := ActivationEnergy(20, 3e-3, 30, 2e-3)
	near(t, "a_T(20→25)", d.Shift(20, 25), ArrheniusShift(ea, 20, 25), 1e-12)
}

// Old files stay valid; a dependence needs version 2 and a reference
// temperature; a file without one says the temperature is ignored.
func TestTemperatureFileRules(t *testing.T) {
	f := mucusFile(nil)
	f.Version = 1
	if err := f.Check(); err != nil {
		t.Fatalf("version-1 file refused: %v", err)
	}
	p, _ := f.PropertiesAt(30)
	if len(p.Warnings) != 1 || p.Warnings[0].Code != WarnIgnored {
		t.Errorf("warnings %v", p.Warnings)
	}
	ea := 40e3
	f = mucusFile(&TemperatureDependence{Method: TempArrhenius, ActivationEnergy: &ea, RangeC: &[2]float64{15, 37}})
	f.Version = 1
	if err := f.Check(); err == nil || !strings.Contains(err.Error(), "version") {
		t.Errorf("version 1 with a dependence: %v", err)
	}
	f.Version, f.TemperatureC = 2, nil
	if err := f.Check(); err == nil || !strings.Contains(err.Error(), "temperature_C") {
		t.Errorf("no reference temperature: %v", err)
	}
	f = mucusFile(&TemperatureDependence{Method: TempArrhenius, ActivationEnergy: &ea})
	if err := f.Check(); err == nil || !strings.Contains(err.Error(), "range_C") {
		t.Errorf("no range: %v", err)
	}
	f = mucusFile(&TemperatureDependence{Method: "guess"})
	if err := f.Check(); err == nil {
		t.Error("unknown method accepted")
	}
}
