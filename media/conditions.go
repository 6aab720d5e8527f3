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

// Conditions describes where a medium is, as a user states it. A field left
// at its zero value, or NaN, is not given and takes its documented default;
// every default used is listed in [Properties.Assumed]. Pressure, when
// given, is absolute and wins over depth.
//
// A zero pressure, depth, altitude, humidity or temperature offset is either
// impossible or the default, so zero there simply means "not given". For
// temperature, salinity and latitude zero is a real value (0 °C, fresh
// water's salinity, the equator): a zero there counts as stated only when
// its field is named in StatedZero, e.g.
//
//	media.Conditions{Medium: "seawater", TemperatureC: 0, StatedZero: media.FieldTemperature}
//
// [Unset] gives the other convention, used by the command line: every field
// NaN until set, and any number set, zero included, is stated.
type Conditions struct {
	Medium            string  // one of Kinds, or a lab fluid (see LabKinds)
	TemperatureC      float64 // °C; water default 20 °C, air default the standard atmosphere
	TemperatureOffset float64 // K added to the standard-atmosphere temperature (air only)
	SalinityPractical float64 // practical salinity; default 35 g/kg of reference-composition salinity
	PressurePa        float64 // absolute pressure, Pa
	DepthM            float64 // depth below the water surface, m
	AltitudeM         float64 // geometric altitude, m: of the air, or of a lake's surface; default 0
	HumidityPercent   float64 // relative humidity of air, %; default 0
	LatitudeDeg       float64 // for depth in sea water; default 45°

	// StatedZero names the fields whose zero is a stated value rather
	// than "not given".
	StatedZero Field
}

// Field names one of the numeric fields of [Conditions], for
// [Conditions.StatedZero] and [Default.Field]. Fields combine with |.
type Field uint16

// The fields of [Conditions].
const (
	FieldTemperature Field = 1 << iota
	FieldTemperatureOffset
	FieldSalinity
	FieldPressure
	FieldDepth
	FieldAltitude
	FieldHumidity
	FieldLatitude

	// AllFields names every field.
	AllFields = FieldTemperature | FieldTemperatureOffset | FieldSalinity | FieldPressure |
		FieldDepth | FieldAltitude | FieldHumidity | FieldLatitude
)

// fieldNames holds each Field's name in Conditions, in bit order.
var fieldNames = [...]string{"TemperatureC", "TemperatureOffset", "SalinityPractical", "PressurePa",
	"DepthM", "AltitudeM", "HumidityPercent", "LatitudeDeg"}

// String returns the names of the fields, joined by "|".
func (f Field) String() string {
	var names []string
	for i, n := range fieldNames {
		if f&(1<<i) != 0 {
			names = append(names, n)
		}
	}
	return strings.Join(names, "|")
}

// ErrUnknownMedium is wrapped by Lookup's error for a medium name it does
// not know (a mistake in the caller's input, not a failed computation).
var ErrUnknownMedium = errors.New("unknown medium")

// Unset returns Conditions for the medium with every field NaN (not given)
// and every zero stated: set a field to give it, zero included.
func Unset(medium string) Conditions {
	n := math.NaN()
	return Conditions{Medium: medium, TemperatureC: n, TemperatureOffset: n, SalinityPractical: n,
		PressurePa: n, DepthM: n, AltitudeM: n, HumidityPercent: n, LatitudeDeg: n, StatedZero: AllFields}
}

// fields returns pointers to the numeric fields in Field bit order.
func (c *Conditions) fields() [8]*float64 {
	return [8]*float64{&c.TemperatureC, &c.TemperatureOffset, &c.SalinityPractical, &c.PressurePa,
		&c.DepthM, &c.AltitudeM, &c.HumidityPercent, &c.LatitudeDeg}
}

// stated returns c with every field that was not given set to NaN, the
// form the media functions below read.
func (c Conditions) stated() Conditions {
	if c.StatedZero == AllFields {
		return c
	}
	for i, v := range c.fields() {
		if *v == 0 && c.StatedZero&(1<<i) == 0 {
			*v = math.NaN()
		}
	}
	c.StatedZero = AllFields
	return c
}

func or(v, def float64) float64 {
	if math.IsNaN(v) {
		return def
	}
	return v
}

// Lookup returns the properties of the built-in medium or lab fluid named
// by c.Medium at the conditions c, with the methods used and every default
// applied (see [Conditions]). It never reads files: a measured medium is a
// [MediumFile], evaluated by its At method.
func Lookup(c Conditions) (Properties, error) { return lookup(c, false) }

// Options change what [Options.Lookup] returns.
type Options struct {
	// Brief leaves out Methods, Assumed and the warnings' Message texts
	// (their Code and Detail stay), for work over many rows that reads
	// none of them: nothing is formatted.
	Brief bool
}

// Lookup is [Lookup] with the options o.
func (o Options) Lookup(c Conditions) (Properties, error) { return lookup(c, o.Brief) }

func lookup(c Conditions, brief bool) (Properties, error) {
	c = c.stated()
	for _, v := range c.fields() {
		if math.IsInf(*v, 0) {
			return Properties{}, errorf("conditions must be finite numbers, not infinity")
		}
	}
	p, err := lookupStated(c, brief)
	if err == nil && !brief {
		p.Assumed = c.defaults(p)
	}
	return p, err
}

// lookupStated is [Lookup] on conditions whose unstated fields are NaN.
func lookupStated(c Conditions, brief bool) (Properties, error) {
	switch strings.ToLower(c.Medium) {
	case KindAir:
		if !math.IsNaN(c.DepthM) || !math.IsNaN(c.SalinityPractical) {
			return Properties{}, errorf("depth and salinity apply to water, not air; use altitude or pressure")
		}
		return air(AirConditions{
			TemperatureC: c.TemperatureC, OffsetK: or(c.TemperatureOffset, 0),
			PressurePa: c.PressurePa, AltitudeM: or(c.AltitudeM, 0), HumidityPercent: or(c.HumidityPercent, 0),
		}, brief)
	case KindFreshWater, KindSeawater:
		if !math.IsNaN(c.HumidityPercent) || !math.IsNaN(c.TemperatureOffset) {
			return Properties{}, errorf("humidity and temperature offset apply to air, not water")
		}
		return water(c, brief)
	case "":
		return Properties{}, errorf("no medium given; accepted: %s", strings.Join(Kinds, ", "))
	default:
		if p, ok, err := lookupLab(c, brief); ok {
			return p, err
		}
		return Properties{}, errorf("%w %q; accepted: %s, %s, or a medium file (.json)", ErrUnknownMedium, c.Medium, strings.Join(Kinds, ", "), strings.Join(LabKinds, ", "))
	}
}

// Default is a condition that [Lookup] filled in because it was not given.
type Default struct {
	Field Field   // the condition
	Value float64 // the value used, in Unit
	Unit  string
}

// String gives the default in words, e.g. "TemperatureC 20 °C (not given)".
func (d Default) String() string {
	return fmt.Sprintf("%s %.6g %s (not given)", d.Field, d.Value, d.Unit)
}

// defaults lists the conditions that c (unstated fields NaN) left to a
// default in the properties p.
func (c Conditions) defaults(p Properties) []Default {
	nan := math.IsNaN
	var ds []Default
	add := func(f Field, v float64, unit string) { ds = append(ds, Default{f, v, unit}) }
	if nan(c.TemperatureC) {
		add(FieldTemperature, p.TemperatureC, "°C")
	}
	switch strings.ToLower(c.Medium) {
	case KindAir:
		if nan(c.TemperatureC) && nan(c.TemperatureOffset) {
			add(FieldTemperatureOffset, 0, "K")
		}
		if nan(c.AltitudeM) && (nan(c.TemperatureC) || nan(c.PressurePa)) {
			add(FieldAltitude, 0, "m")
		}
		if nan(c.PressurePa) {
			add(FieldPressure, p.PressurePa, "Pa")
		}
		if nan(c.HumidityPercent) {
			add(FieldHumidity, 0, "%")
		}
	case KindFreshWater, KindSeawater:
		sea := strings.ToLower(c.Medium) == KindSeawater
		if sea && nan(c.SalinityPractical) {
			add(FieldSalinity, p.SalinityPractical, "")
		}
		if !nan(c.PressurePa) {
			break
		}
		if nan(c.DepthM) {
			add(FieldDepth, 0, "m")
		}
		if nan(c.AltitudeM) {
			add(FieldAltitude, 0, "m")
		}
		add(FieldPressure, p.PressurePa, "Pa")
		if sea && nan(c.LatitudeDeg) && c.DepthM > 0 {
			add(FieldLatitude, DefaultLatitudeDeg, "°")
		}
	}
	return ds
}

func water(c Conditions, brief bool) (Properties, error) {
	sea := strings.ToLower(c.Medium) == KindSeawater
	if !sea && !math.IsNaN(c.SalinityPractical) && c.SalinityPractical != 0 {
		return Properties{}, errorf("fresh water has no salinity; use seawater for salty water")
	}
	t := or(c.TemperatureC, DefaultWaterTemperatureC)
	depth := or(c.DepthM, 0)
	if depth < 0 {
		return Properties{}, outOfRange("depth", FieldDepth, depth, 0, MaxWaterDepthM, "m", "depth %.4g m is negative; give a depth of 0 m or more below the surface", depth)
	}
	if depth > MaxWaterDepthM {
		return Properties{}, outOfRange("depth", FieldDepth, depth, 0, MaxWaterDepthM, "m", "depth %.6g m is beyond the deepest accepted, %g m (the deepest ocean, the Challenger Deep, is about 10.9 km); give a depth of 0–%g m", depth, MaxWaterDepthM, MaxWaterDepthM)
	}
	surface := StandardPressurePa
	var notes []string
	if alt := or(c.AltitudeM, 0); alt != 0 {
		_, ps := StandardAtmosphere(GeopotentialHeight(alt))
		if math.IsNaN(ps) {
			return Properties{}, outOfRange("surface altitude", FieldAltitude, alt, geometricAltitude(ussaLowH), geometricAltitude(ussaTopH), "m", "surface altitude %.6g m is outside −5 km to 32 km", alt)
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
					return Properties{}, outOfRange("latitude", FieldLatitude, lat, -90, 90, "°", "latitude %.4g° is outside −90° to 90°", lat)
				}
				p = surface + SeaPressureAtDepth(depth, lat)*1e4
				if !brief {
					notes = append(notes, fmt.Sprintf("depth to pressure: Saunders & Fofonoff 1976 (Fofonoff & Millard 1983) at latitude %.4g°", lat))
				}
			}
		}
		props, err = seawater(t, sp, p, brief)
	} else {
		var iso *if97Isotherm // built once for the depth step and the density
		if math.IsNaN(p) {
			p = surface
			if depth > 0 {
				iso = new(if97Isotherm)
				iso.set(t + ZeroCelsiusK)
				p = freshPressureAtDepth(iso, surface, depth)
				if !brief {
					notes = append(notes, "depth to pressure: hydrostatic, IAPWS-IF97 density at the mean pressure, standard gravity")
				}
			}
		}
		props, err = freshWater(t, p, brief, iso)
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
// water of the isotherm iso below a surface at pressure ps, integrating
// dp = ρ g dz with the IAPWS-IF97 density at the mean pressure of the column.
//
// The fixed-point iteration p ← ps + ρ((ps+p)/2)·g·z contracts by
// c = (∂ρ/∂p)·g·z/2 = ρκgz/2 per step (κ the compressibility), under 0.03
// down to MaxWaterDepthM, so its error after a step is about c times the
// step: it stops once the step squared over the step before it, an
// estimate of the error left, is below depthPressureTol, or after five
// steps. TestFreshPressureAtDepthConverged bounds the difference from the
// converged pressure over the accepted temperatures and depths.
func freshPressureAtDepth(iso *if97Isotherm, ps, z float64) float64 {
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
