package media_test

import (
	"fmt"

	"github.com/flowregime/flowregime/media"
)

// The viscosity of water from temperature and density, IAPWS R12-08
// (Huber et al. 2009), replaying the release's Table 4 check value at
// 298.15 K and 998 kg/m³: 889.735100 µPa·s.
func ExampleWaterViscosity() {
	mu := media.WaterViscosity(298.15, 998)
	fmt.Printf("%.6f µPa·s\n", mu*1e6)
	// Output: 889.735100 µPa·s
}

// The density of liquid water, IAPWS-IF97 region 1, replaying the
// verification value of IAPWS R7-97(2012), Table 5: specific volume
// 0.100215168e-2 m³/kg at 300 K and 3 MPa.
func ExampleWaterDensityIF97() {
	rho := media.WaterDensityIF97(300, 3e6)
	fmt.Printf("v = %.8e m³/kg\n", 1/rho)
	// Output: v = 1.00215168e-03 m³/kg
}

// Sea-water density by EOS-80, replaying the UNESCO (1981, Tech. Pap. Mar.
// Sci. 38) check value at practical salinity 35, 25 °C (IPTS-68) and zero
// sea pressure: 1023.34306 kg/m³.
func ExampleSeawaterDensityEOS80() {
	fmt.Printf("%.5f kg/m³\n", media.SeawaterDensityEOS80(35, 25, 0))
	// Output: 1023.34306 kg/m³
}

// The standard atmosphere at 5000 m' geopotential height, replaying the
// ISO 2533:1975 (= US Standard Atmosphere 1976) table row: 255.650 K and
// 54019.9 Pa.
func ExampleStandardAtmosphere() {
	tK, p := media.StandardAtmosphere(5000)
	fmt.Printf("%.3f K, %.1f Pa\n", tK, p)
	// Output: 255.650 K, 54019.9 Pa
}

// A struct literal with only the known fields: sea water of practical
// salinity 35 at 25 °C. Fields left at zero are not given; the defaults
// used are listed in Assumed. The density matches the UNESCO (1981) check
// value 1023.34306 kg/m³ to the 0.01 kg/m³ printed here (the check value's
// 25 °C is on IPTS-68, 0.006 K from ITS-90's, about 0.002 kg/m³).
func ExampleLookup() {
	p, err := media.Lookup(media.Conditions{Medium: "seawater", TemperatureC: 25, SalinityPractical: 35})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("density %.2f kg/m³ at %.0f Pa\n", p.Density, p.PressurePa)
	for _, d := range p.Assumed {
		fmt.Println("assumed", d)
	}
	// Output:
	// density 1023.34 kg/m³ at 101325 Pa
	// assumed DepthM 0 m (not given)
	// assumed AltitudeM 0 m (not given)
	// assumed PressurePa 101325 Pa (not given)
}

// A zero temperature is "not given" (20 °C for water) unless its field is
// named in StatedZero. Fresh water at 0 °C and 1 atm: 999.84 kg/m³ (Tanaka
// et al. 2001, Metrologia 38, 301, eq. 1: 999.8428 kg/m³).
func ExampleConditions_statedZero() {
	p, err := media.Lookup(media.Conditions{Medium: "freshwater", StatedZero: media.FieldTemperature})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.2f kg/m³ at %g °C\n", p.Density, p.TemperatureC)
	// Output: 999.84 kg/m³ at 0 °C
}
