package regime

import (
	"fmt"

	"github.com/flowregime/flowregime/media"
)

// Screening thresholds for survey data. Each flags a measurement worth a
// second look, not an impossible one.
const (
	// WarnSpeed flags a speed in body lengths per second beyond what
	// organisms of that size are known to reach.
	WarnSpeed = "speed-beyond-known"

	// Swimmers of 10 cm and more rarely exceed about
	// 25 body lengths per second even in sprints (Wardle, C. S. (1975),
	// Limit of fish swimming speed, Nature 255, 725–727, recalled from
	// memory); 30 BL/s is used.
	maxRelativeSpeedLarge = 30.0
	largeBody             = 0.1 // m

	// No organism of any size is known to exceed about 1000 body lengths
	// per second; the fastest relative speeds reported, copepod escape jumps
	// and mites, are a few hundred (common practice, no single source).
	maxRelativeSpeed = 1000.0
)

// screen adds to ws warnings for measurements that look implausible
// ([Options].Screen). Strouhal-number and consistency checks are made by
// [Calc] itself.
func screen(o *Organism, r *Result, note noter, ws *[]Warning) {
	bl := o.Speed / o.Body.Length
	switch {
	case bl > maxRelativeSpeed:
		note.detail(ws, WarnSpeed, media.Detail{Quantity: "speed", Value: bl, Unit: "BL/s", Relation: "> 1000"}, func() string {
			return fmt.Sprintf("speed: %.3g body lengths per second is beyond any organism known (about 1000 BL/s at most)", bl)
		})
	case o.Body.Length >= largeBody && bl > maxRelativeSpeedLarge && !r.Medium.Gas:
		note.detail(ws, WarnSpeed, media.Detail{Quantity: "speed", Value: bl, Unit: "BL/s", Relation: "> 30 for a swimmer of 10 cm or more"}, func() string {
			return fmt.Sprintf("speed: %.3g body lengths per second is beyond what swimmers of 10 cm and more reach (about 25–30 BL/s in sprints; Wardle 1975)", bl)
		})
	}
}

// StrouhalUnusual reports whether a Strouhal number is beyond what animals
// with that kind of locomotion show. Swimmers, and flyers in fast flight,
// keep to 0.05–1 (common practice, no single source; cruisers keep to
// 0.2–0.4, Taylor, Nudds & Thomas 2003, Nature 425, 707). A stroke in air is
// flapping flight, where St above 1 is normal in slow flight and hovering:
// with a tip excursion A ≈ ΦR, St = fA/U ≈ 1/(2J) for the advance ratio
// J = U/(2ΦfR), and hovering is J < 0.1 (Ellington 1984, The aerodynamics
// of hovering insect flight III: Kinematics, Phil. Trans. R. Soc. B 305,
// 41–78; pages recalled from memory), so St > 1 (J below about 0.5) is slow flight, not a mistake. Only
// the lower bound screens flyers.
func StrouhalUnusual(st float64, flying bool) bool {
	if st < StrouhalScreenLow {
		return true
	}
	return st > StrouhalScreenHigh && !flying
}

// strouhalDetail is the short reason of a Strouhal flag.
func strouhalDetail(st float64) media.Detail {
	rel := "> 1 for a swimmer"
	if st < StrouhalScreenLow {
		rel = "< 0.05"
	}
	return media.Detail{Quantity: "strouhal", Value: st, Relation: rel}
}
