package regime_test

import (
	"fmt"
	"log"

	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// A fish 30 cm long cruising at 0.6 m/s with a tail beat of 4 Hz and
// 6 cm, in sea water at 5 °C, practical salinity 35, at the surface. Both
// struct literals give only what was measured: a field left zero is "not
// given", and the results say what was assumed instead (the medium's
// Assumed list: at the surface, at one standard atmosphere; the Result's
// Warnings: towing power, efficiency 1, for want of a propulsive
// efficiency).
//
// Check values: the density is EOS-80's, whose published check value at
// S = 35, t = 5 °C, 0 bar is 1027.67547 kg/m³ (UNESCO 1981, Tech. Pap.
// Mar. Sci. 38); St = fA/U = 4 × 0.06/0.6 = 0.40, the top of the band of
// cruising animals (Taylor, Nudds & Thomas 2003, Nature 425, 707); Re =
// UL/ν with Sharqawy et al.'s (2010) viscosity. The drag is turbulent skin
// friction times Hoerner's (1965) form factor on the body's wetted area:
// this package's own output, not a published value.
func Example_fish() {
	sea, err := media.Lookup(media.Conditions{Medium: media.KindSeawater, TemperatureC: 5, SalinityPractical: 35})
	if err != nil {
		log.Fatal(err)
	}
	fish := regime.Organism{Body: regime.Body{Shape: regime.Spheroid, Length: 0.30, Diameter: 0.06}, Speed: 0.6, Frequency: 4, Amplitude: 0.06}
	r, err := regime.Calc(fish, sea)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("sea water: %.2f kg/m³\n", sea.Density)
	fmt.Printf("Re = %.3g (%s), St = %.2f (%s the 0.2–0.4 band)\n", r.Reynolds, r.Regime, r.Strouhal, r.StrouhalBand)
	fmt.Printf("drag %.3g N (%s), power %.3g W (%s)\n", r.Drag.Chosen.Force, r.Drag.Chosen.Law, r.Power.Total, r.Power.Kind)
	for _, d := range sea.Assumed {
		fmt.Println("assumed:", d)
	}
	// Output:
	// sea water: 1027.68 kg/m³
	// Re = 1.14e+05 (inertial), St = 0.40 (within the 0.2–0.4 band)
	// drag 0.0691 N (skin friction, turbulent on animal bodies), power 0.0415 W (towing)
	// assumed: DepthM 0 m (not given)
	// assumed: AltitudeM 0 m (not given)
	// assumed: PressurePa 101325 Pa (not given)
}

// A quartz grain 20 µm across (2650 kg/m³) in water at 20 °C settles in
// Stokes' regime: U = (ρp − ρf) g d²/(18μ) (Stokes 1851) with the water's
// density and viscosity of the IAPWS releases (998.21 kg/m³, IAPWS-95;
// 1.0016 mPa·s, IAPWS R12-08) gives 0.359 mm/s at Re 0.0072, where the
// settling law is Stokes' own.
func ExampleSettle_quartzGrain() {
	water, err := media.FreshWater(20, media.StandardPressurePa)
	if err != nil {
		log.Fatal(err)
	}
	s, err := regime.Settle(regime.Particle{Shape: regime.Sphere, Diameter: 20e-6, Density: 2650}, water)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("%s at %.3g mm/s, Re = %.2g, law: %s\n", s.Direction, s.Speed*1e3, s.Reynolds, s.Law)
	// Output:
	// sinking at 0.359 mm/s, Re = 0.0072, law: Stokes
}

// A water drop 1 mm across falling in still air at 20 °C, 1013 hPa and
// 50 % relative humidity: Gunn & Kinzer (1949, J. Meteorol. 6, 243, their
// table) measured 4.03 m/s. A rigid sphere on the standard drag curve
// comes within 1 %; drops above about 1 mm flatten and fall slower than a
// sphere.
func ExampleSettle_raindrop() {
	air, err := media.Air(media.AirConditions{TemperatureC: 20, PressurePa: 101300, HumidityPercent: 50})
	if err != nil {
		log.Fatal(err)
	}
	s, err := regime.Settle(regime.Particle{Shape: regime.Sphere, Diameter: 1e-3, Density: 998.2}, air)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("%.2f m/s at Re = %.3g (measured: 4.03 m/s)\n", s.Speed, s.Reynolds)
	// Output:
	// 3.99 m/s at Re = 264 (measured: 4.03 m/s)
}
