package media

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// Medium kinds known to [Lookup].
const (
	KindAir        = "air"
	KindFreshWater = "freshwater"
	KindSeawater   = "seawater"
)

// Kinds lists the built-in media.
var Kinds = []string{KindAir, KindFreshWater, KindSeawater}

// Defaults used by [Lookup] for conditions left unset (NaN).
const (
	DefaultWaterTemperatureC = 20.0
	DefaultSalinityGkg       = 35.0 // reference-composition salinity, g/kg
	DefaultLatitudeDeg       = 45.0
)

// Conditions describes where a medium is, as a user states it. Any field
// left NaN takes its documented default. Pressure, when given, is absolute
// and wins over depth.
type Conditions struct {
	Medium            string  // one of Kinds
	TemperatureC      float64 // °C; water default 20 °C, air default the standard atmosphere
	TemperatureOffset float64 // K added to the standard-atmosphere temperature (air only)
	SalinityPractical float64 // practical salinity; default 35 g/kg of reference-composition salinity
	PressurePa        float64 // absolute pressure, Pa
	DepthM            float64 // depth below the water surface, m
	AltitudeM         float64 // geometric altitude, m: of the air, or of a lake's surface; default 0
	HumidityPercent   float64 // relative humidity of air, %; default 0
	LatitudeDeg       float64 // for depth in sea water; default 45°
}

// Unset returns Conditions for the medium with every condition unset.
// ErrUnknownMedium is wrapped by Lookup's error for a medium name it does
// not know (a mistake in the caller's input, not a failed computation).
var ErrUnknownMedium = errors.New("unknown medium")

func Unset(medium string) Conditions {
	n := math.NaN()
	return Conditions{Medium: medium, TemperatureC: n, TemperatureOffset: n, SalinityPractical: n,
		PressurePa: n, DepthM: n, AltitudeM: n, HumidityPercent: n, LatitudeDeg: n}
}

func or(v, def float64) float64 {
	if math.IsNaN(v) {
		return def
	}
	return v
}

// Lookup returns the properties of the medium at the conditions.
func Lookup(c Conditions) (Properties, error) { return lookup(c, false) }

// LookupBrief is [Lookup] without the method notes and with warnings that
// carry their codes only, for batch work that reads neither.
func LookupBrief(c Conditions) (Properties, error) { return lookup(c, true) }

func lookup(c Conditions, brief bool) (Properties, error) {
	for _, v := range []float64{c.TemperatureC, c.TemperatureOffset, c.SalinityPractical, c.PressurePa, c.DepthM, c.AltitudeM, c.HumidityPercent, c.LatitudeDeg} {
		if math.IsInf(v, 0) {
			return Properties{}, fmt.Errorf("media: conditions must be finite numbers, not infinity")
		}
	}
	if IsMediumFile(c.Medium) {
		f, err := LoadMediumFile(c.Medium)
		if err != nil {
			return Properties{}, err
		}
		return f.At(c)
	}
	switch strings.ToLower(c.Medium) {
	case KindAir:
		if !math.IsNaN(c.DepthM) || !math.IsNaN(c.SalinityPractical) {
			return Properties{}, fmt.Errorf("media: depth and salinity apply to water, not air; use altitude or pressure")
		}
		return air(AirConditions{
			TemperatureC: c.TemperatureC, OffsetK: or(c.TemperatureOffset, 0),
			PressurePa: c.PressurePa, AltitudeM: or(c.AltitudeM, 0), HumidityPercent: or(c.HumidityPercent, 0),
		}, brief)
	case KindFreshWater, KindSeawater:
		if !math.IsNaN(c.HumidityPercent) || !math.IsNaN(c.TemperatureOffset) {
			return Properties{}, fmt.Errorf("media: humidity and temperature offset apply to air, not water")
		}
		return water(c, brief)
	case "":
		return Properties{}, fmt.Errorf("media: no medium given; accepted: %s", strings.Join(Kinds, ", "))
	default:
		if p, ok, err := lookupLab(c, brief); ok {
			return p, err
		}
		return Properties{}, fmt.Errorf("media: %w %q; accepted: %s, %s, or a medium file (.json)", ErrUnknownMedium, c.Medium, strings.Join(Kinds, ", "), strings.Join(LabKinds, ", "))
	}
}

func water(c Conditions, brief bool) (Properties, error) {
	sea := strings.ToLower(c.Medium) == KindSeawater
	if !sea && !math.IsNaN(c.SalinityPractical) && c.SalinityPractical != 0 {
		return Properties{}, fmt.Errorf("media: fresh water has no salinity; use seawater for salty water")
	}
	t := or(c.TemperatureC, DefaultWaterTemperatureC)
	depth := or(c.DepthM, 0)
	if depth < 0 {
		return Properties{}, fmt.Errorf("media: depth %.4g m is negative; give a depth of 0 m or more below the surface", depth)
	}
	if depth > MaxWaterDepthM {
		return Properties{}, fmt.Errorf("media: depth %.6g m is beyond the deepest accepted, %g m (the deepest ocean, the Challenger Deep, is about 10.9 km); give a depth of 0–%g m", depth, MaxWaterDepthM, MaxWaterDepthM)
	}
	surface := StandardPressurePa
	var notes []string
	if alt := or(c.AltitudeM, 0); alt != 0 {
		_, ps := StandardAtmosphere(GeopotentialHeight(alt))
		if math.IsNaN(ps) {
			return Properties{}, fmt.Errorf("media: surface altitude %.6g m is outside −5 km to 32 km", alt)
		}
		surface = ps
		if !brief {
			notes = append(notes, fmt.Sprintf("surface pressure: US Standard Atmosphere 1976 at %.6g m altitude, %.6g Pa", alt, ps))
		}
	}
	p := c.PressurePa
	var props Properties
	var err error
	if sea {
		sp := or(c.SalinityPractical, PracticalFromAbsolute(DefaultSalinityGkg))
		if math.IsNaN(p) {
			p = surface
			if depth > 0 {
				lat := or(c.LatitudeDeg, DefaultLatitudeDeg)
				if lat < -90 || lat > 90 {
					return Properties{}, fmt.Errorf("media: latitude %.4g° is outside −90° to 90°", lat)
				}
				p = surface + SeaPressureAtDepth(depth, lat)*1e4
				if !brief {
					notes = append(notes, fmt.Sprintf("depth to pressure: Saunders & Fofonoff 1976 (Fofonoff & Millard 1983) at latitude %.4g°", lat))
				}
			}
		}
		props, err = seawater(t, sp, p, brief)
	} else {
		if math.IsNaN(p) {
			p = surface
			if depth > 0 {
				p = freshPressureAtDepth(t, surface, depth)
				if !brief {
					notes = append(notes, "depth to pressure: hydrostatic, IAPWS-IF97 density at the mean pressure, standard gravity")
				}
			}
		}
		props, err = freshWater(t, p, brief)
	}
	if err != nil {
		return Properties{}, err
	}
	props.Methods = append(props.Methods, notes...)
	if !math.IsNaN(c.DepthM) && math.IsNaN(c.PressurePa) {
		props.DepthM = depth
	}
	return props, nil
}

// freshPressureAtDepth returns the absolute pressure at depth z (m) in fresh
// water of temperature tC below a surface at pressure ps, integrating
// dp = ρ g dz with the IAPWS-IF97 density at the mean pressure of the column.
//
// The fixed-point iteration p ← ps + ρ((ps+p)/2)·g·z contracts by
// c = (∂ρ/∂p)·g·z/2 = ρκgz/2 per step (κ the compressibility), under 0.03
// down to MaxWaterDepthM, so its error after a step is about c times the
// step: it stops once the step squared over the step before it, an
// estimate of the error left, is below depthPressureTol, or after five
// steps. TestFreshPressureAtDepthConverged bounds the difference from the
// converged pressure over the accepted temperatures and depths.
func freshPressureAtDepth(tC, ps, z float64) float64 {
	var iso if97Isotherm
	iso.set(tC + ZeroCelsiusK)
	p := ps + 1000*StandardGravity*z
	prev := 0.0 // the step before, 0 before the second step
	for range 5 {
		next := ps + iso.density((ps+p)/2)*StandardGravity*z
		step := math.Abs(next - p)
		p = next
		if step == 0 || prev > 0 && step*step <= depthPressureTol*prev {
			break
		}
		prev = step
	}
	return p
}

// depthPressureTol (Pa) is the error left in freshPressureAtDepth's
// pressure at which it stops: a relative error in density of about
// κ·1e-6 Pa ≈ 5e-16, far below the six digits printed.
const depthPressureTol = 1e-6
