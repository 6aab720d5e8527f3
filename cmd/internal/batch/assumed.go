package batch

import (
	"math"
	"strings"
	"unsafe"

	"github.com/flowregime/flowregime/cmd/internal/decimal"
	"github.com/flowregime/flowregime/cmd/internal/inputs"
	"github.com/flowregime/flowregime/media"
	"github.com/flowregime/flowregime/regime"
)

// Codes of the "assumed" column: each names a default or an assumption
// that changed the row's result, as name=value where there is a value.
const (
	AssumedWaterTemperature = "temperature=20C"
	AssumedAirTemperature   = "temperature=standard-atmosphere"
	AssumedAirAltitude      = "altitude=0m"
	AssumedHumidity         = "humidity=0%"
	AssumedSalinity         = "salinity=35g/kg"
	AssumedLatitude         = "latitude=45deg"
	AssumedSphere           = "shape=sphere"
	AssumedTowing           = "efficiency=1"
	AssumedFlapping         = "flapping"
	AssumedGliding          = "gliding"
	AssumedInducedFactor    = "induced-factor=1.15"
	AssumedProfileRatio     = "profile-power=1.2Pam"
	AssumedProfileLeftOut   = "profile-power=0"
	AssumedShearRate        = "shear-rate=U/L"
)

// AssumedMeaning says each assumption in plain words, for the end summary.
var AssumedMeaning = map[string]string{
	AssumedWaterTemperature: "no temperature: water at 20 °C",
	AssumedAirTemperature:   "no air temperature: the standard atmosphere's at the altitude",
	AssumedAirAltitude:      "no altitude or pressure: air at sea level",
	AssumedHumidity:         "no humidity: dry air",
	AssumedSalinity:         "no salinity: 35 g/kg",
	AssumedLatitude:         "a depth in sea water without latitude: 45°",
	AssumedSphere:           "no diameter or shape: a sphere as wide as the length",
	AssumedTowing:           "no efficiency: towing power (efficiency 1)",
	AssumedFlapping:         "a flyer without wingbeat frequency: continuous flapping",
	AssumedGliding:          "a wingbeat frequency of 0: gliding",
	AssumedInducedFactor:    "no induced-power factor: 1.15 (Pennycuick 2008)",
	AssumedProfileRatio:     "no wing area or chord: profile power 1.2 × absolute minimum power (Pennycuick 1975)",
	AssumedProfileLeftOut:   "a glide without wing area or chord: profile drag left out",
	AssumedShearRate:        "no shear rate in a non-Newtonian medium: speed/length",
}

// Assumptions appends the codes of the defaults and assumptions that
// shaped one row's result; shapeGiven says whether the row named a shape.
// It only compares and appends constant strings.
func Assumptions(out []string, in *inputs.Input, r *regime.Result, shapeGiven bool) []string {
	o := &in.Organism
	nan := math.IsNaN
	out = MediumAssumptions(out, &in.Conditions, &r.Medium)
	if o.Body.Shape == regime.Sphere && !shapeGiven && nan(o.Body.Diameter) {
		out = append(out, AssumedSphere)
	}
	if r.Medium.Rheology != nil && nan(o.ShearRate) {
		out = append(out, AssumedShearRate)
	}
	switch r.Power.Kind {
	case regime.PowerTowing:
		out = append(out, AssumedTowing)
	case regime.PowerFlight, regime.PowerGliding:
		if r.Power.Kind == regime.PowerFlight && nan(o.Frequency) && !o.Gliding {
			out = append(out, AssumedFlapping)
		}
		if o.Frequency == 0 {
			out = append(out, AssumedGliding)
		}
		if nan(o.InducedFactor) && r.Power.Kind == regime.PowerFlight {
			out = append(out, AssumedInducedFactor)
		}
		if fp := r.Power.Flight; fp != nil {
			switch fp.ProfileMethod {
			case regime.ProfileRatioFlat:
				out = append(out, AssumedProfileRatio)
			case regime.ProfileNone:
				out = append(out, AssumedProfileLeftOut)
			}
		}
	}
	return out
}

// MediumAssumptions appends the codes of the defaults that set the medium
// m from the conditions c.
func MediumAssumptions(out []string, c *media.Conditions, m *media.Properties) []string {
	nan := math.IsNaN
	switch {
	case inputs.IsMediumFile(c.Medium):
		// a measured medium, whatever its name: its file fixes its properties
	case m.Gas:
		if nan(c.TemperatureC) {
			out = append(out, AssumedAirTemperature)
		}
		if nan(c.PressurePa) && nan(c.AltitudeM) {
			out = append(out, AssumedAirAltitude)
		}
		if nan(c.HumidityPercent) {
			out = append(out, AssumedHumidity)
		}
	default:
		if nan(c.TemperatureC) {
			out = append(out, AssumedWaterTemperature)
		}
		if m.Medium == media.KindSeawater {
			if nan(c.SalinityPractical) {
				out = append(out, AssumedSalinity)
			}
			if !nan(c.DepthM) && c.DepthM > 0 && nan(c.PressurePa) && nan(c.LatitudeDeg) {
				out = append(out, AssumedLatitude)
			}
		}
	}
	return out
}

// reasonSep separates the reasons of one row.
const reasonSep = " | "

// appendReasons appends the reasons of a row's warnings, in their order,
// each once: the warning's detail with its value, else its message, else
// what its code means with the medium's conditions. ignored adds the
// reason of WarnUncertaintyIgnored.
func appendReasons(b []byte, ws []media.Warning, m *media.Properties, ignored bool) []byte {
	start := len(b)
	for i := range ws {
		w := &ws[i]
		if seenBefore(ws[:i], w) {
			continue
		}
		if len(b) > start {
			b = append(b, reasonSep...)
		}
		b = appendReason(b, w, m)
	}
	if ignored {
		if len(b) > start {
			b = append(b, reasonSep...)
		}
		b = append(b, "a value carries ± that is not propagated (give --uncertainty)"...)
	}
	return b
}

func seenBefore(ws []media.Warning, w *media.Warning) bool {
	for i := range ws {
		if ws[i].Code == w.Code && ws[i].Detail.Quantity == w.Detail.Quantity && ws[i].Detail.Relation == w.Detail.Relation && ws[i].Message == w.Message {
			return true
		}
	}
	return false
}

func appendReason(b []byte, w *media.Warning, m *media.Properties) []byte {
	d := &w.Detail
	switch {
	case d.Quantity != "":
		b = append(b, d.Quantity...)
		if !math.IsNaN(d.Value) {
			b = decimal.AppendG(append(b, ' '), d.Value, 3)
			if d.Unit != "" {
				b = append(append(b, ' '), d.Unit...)
			}
		}
		return append(append(b, ' '), d.Relation...)
	case w.Message != "":
		return append(b, strings.ReplaceAll(w.Message, reasonSep, "; ")...)
	case w.Code == media.WarnLabCaution:
		return append(append(b, m.Medium...), ": a practical hazard of this lab fluid (medium says which)"...)
	case w.Code == media.WarnOutOfRange:
		b = append(b, m.Medium...)
		b = decimal.AppendG(append(b, " at "...), m.TemperatureC, 4)
		b = append(b, " °C"...)
		if !math.IsNaN(m.PressurePa) {
			b = decimal.AppendG(append(b, ", "...), m.PressurePa/100, 5)
			b = append(b, " hPa"...)
		}
		return append(b, ": outside a property method's range (medium on this row says which)"...)
	case w.Code == regime.WarnModel:
		return append(b, "a model used at its limit (calc on this row says which)"...)
	}
	return append(b, w.Code...)
}

// appendBytesField is appendField for a field held in bytes, read in place
// without a copy (the view lives only during the call).
func appendBytesField(b, field []byte, delim byte) []byte {
	if len(field) == 0 {
		return b
	}
	return appendField(b, unsafe.String(&field[0], len(field)), delim)
}

// SphereForStroker returns a geometry warning when a body with a stroke
// (a beat frequency or amplitude given) was taken as a sphere as wide as it
// is long for want of a diameter or shape: such a body (a fish, a bird, an
// insect) is rarely round, and the drag of that sphere can be tens of times
// the animal's. The assumption itself is listed as shape=sphere; this makes
// it a flag, so the row shows among those whose inputs need a look.
func SphereForStroker(in *inputs.Input, shapeGiven bool) (media.Warning, bool) {
	o := &in.Organism
	if o.Body.Shape != regime.Sphere || shapeGiven || !math.IsNaN(o.Body.Diameter) || math.IsNaN(o.Frequency) && math.IsNaN(o.Amplitude) {
		return media.Warning{}, false
	}
	return media.Warning{Code: regime.WarnGeometry,
		Message: "shape: no diameter or shape given, so the body is a sphere as wide as its length; an animal with a stroke is rarely round, and that sphere's drag can be tens of times the animal's: give a diameter (body depth or width) or --shape",
		Detail:  media.Detail{Quantity: "length", Value: o.Body.Length, Unit: "m", Relation: "taken as a sphere's diameter for a body with a stroke"}}, true
}
