package media

import (
	"fmt"
	"math"
	"sort"
)

// Viscometer geometries known to [NewGeometry].
const (
	GeometryCouette       = "couette"
	GeometryConePlate     = "cone-plate"
	GeometryParallelPlate = "parallel-plate"
	GeometryCapillary     = "capillary"
	GeometryFallingBall   = "falling-ball"
)

// GeometryNames lists the geometries in a fixed order.
var GeometryNames = []string{GeometryCouette, GeometryConePlate, GeometryParallelPlate, GeometryCapillary, GeometryFallingBall}

// Thresholds for the per-point warnings (common practice, no source): a
// correction that changes a value by more than LargeCorrection, or a local
// slope whose standard error leaves the corrected value uncertain by more
// than NoisySlope (relative), is pointed out.
const (
	LargeCorrection = 0.25
	NoisySlope      = 0.05
)

// DefaultSlopeWindow is how many neighbouring readings the local slope is
// fitted over (common practice, no source: five points hold a quadratic
// with two degrees of freedom left).
const DefaultSlopeWindow = 5

// Reading is one raw viscometer reading. Each geometry uses its own fields.
type Reading struct {
	Line         int     // where the reading came from; carried to the results
	AngularSpeed float64 // rad/s (couette, cone-plate, parallel-plate)
	Torque       float64 // N·m (couette, cone-plate, parallel-plate)
	FlowRate     float64 // m³/s (capillary)
	PressureDrop float64 // Pa (capillary)
	TubeLength   float64 // m (capillary); NaN for the geometry's length
	FallSpeed    float64 // m/s, terminal speed (falling ball)
}

// FlowPoint is one point of a reduced flow curve.
type FlowPoint struct {
	Lines     []int   // the readings that made it
	ShearRate float64 // 1/s, corrected
	Stress    float64 // Pa, corrected
	Slope     float64 // local log–log slope the correction used; NaN when none
	SlopeSE   float64 // standard error of Slope; NaN when unknown
	// SlopeSpread is the relative uncertainty of the corrected value that
	// the slope's standard error causes; NaN when unknown.
	SlopeSpread float64
	Correction  float64 // corrected ÷ Newtonian-formula value − 1, of Corrects
	Corrects    string  // "shear rate", "stress", "viscosity" or "" when nothing is corrected
	Reynolds    float64 // Reynolds number of the flow in the instrument; NaN when not computed
	Notes       []string
}

// Viscosity is the apparent viscosity of the point, Pa·s.
func (p FlowPoint) Viscosity() float64 { return p.Stress / p.ShearRate }

// Rejected is a reading, or a group of readings, that gave no point.
type Rejected struct {
	Lines  []int
	Reason string
}

// FlowCurve is the result of reducing one geometry's readings.
type FlowCurve struct {
	Geometry string
	Points   []FlowPoint
	Rejected []Rejected
	Methods  []string
	Warnings []string
}

// Geometry turns raw readings into a flow curve.
type Geometry interface {
	Name() string
	Check() error
	Reduce(rs []Reading, window int) (FlowCurve, error)
}

// positive reports whether every value is a positive finite number.
func positive(vs ...float64) bool {
	for _, v := range vs {
		if !(v > 0) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// rotational checks torque and speed of each reading and returns the usable
// ones in order of speed, rejecting the rest with their reason.
func rotational(rs []Reading, c *FlowCurve) []Reading {
	var ok []Reading
	for _, r := range rs {
		if !positive(r.AngularSpeed, r.Torque) {
			c.Rejected = append(c.Rejected, Rejected{[]int{r.Line}, fmt.Sprintf("speed %g rad/s and torque %g N·m must both be positive and finite", r.AngularSpeed, r.Torque)})
			continue
		}
		ok = append(ok, r)
	}
	sort.SliceStable(ok, func(i, j int) bool { return ok[i].AngularSpeed < ok[j].AngularSpeed })
	return ok
}

// slopesOf returns the local slopes of ln y against ln x over the window,
// or an error saying why none exist.
func slopesOf(x, y []float64, window int, what string) (s, se []float64, err error) {
	if len(x) < 3 {
		return nil, nil, errorf("the %s correction needs a local slope, and that needs 3 usable readings or more (have %d)", what, len(x))
	}
	s, se, err = LocalSlopes(x, y, window)
	if err != nil {
		return nil, nil, errorf("the %s correction: %v", what, trimMedia(err))
	}
	return s, se, nil
}

// trimMedia is the message of err without the package prefix.
func trimMedia(err error) string {
	if r, ok := err.(interface{ Reason() string }); ok {
		return r.Reason()
	}
	return err.Error()
}

// judge rejects points whose values overflowed, adds the per-point notes
// on the size of the correction and the noise of the slope, and a
// curve-level warning when any point has them.
func (c *FlowCurve) judge() {
	kept := c.Points[:0]
	for _, p := range c.Points {
		if !positive(p.ShearRate, p.Stress) {
			c.Rejected = append(c.Rejected, Rejected{p.Lines, fmt.Sprintf("the shear rate (%g 1/s) or stress (%g Pa) is not a positive finite number: the readings are out of any usable range", p.ShearRate, p.Stress)})
			continue
		}
		kept = append(kept, p)
	}
	c.Points = kept
	large, noisy := 0, 0
	for i := range c.Points {
		p := &c.Points[i]
		if math.Abs(p.Correction) > LargeCorrection {
			p.Notes = append(p.Notes, fmt.Sprintf("large correction: %s changed by %+.0f %%", p.Corrects, 100*p.Correction))
			large++
		}
		if p.SlopeSpread > NoisySlope {
			p.Notes = append(p.Notes, fmt.Sprintf("noisy slope %.3g ± %.2g leaves the %s uncertain by ±%.0f %%", p.Slope, p.SlopeSE, p.Corrects, 100*p.SlopeSpread))
			noisy++
		}
	}
	if large > 0 {
		c.Warnings = append(c.Warnings, fmt.Sprintf("%d point(s) have a correction above %.0f %%: check the geometry and the readings", large, 100*LargeCorrection))
	}
	if noisy > 0 {
		c.Warnings = append(c.Warnings, fmt.Sprintf("%d point(s) have a local slope so noisy that the corrected value is uncertain by more than %.0f %%: more readings, or a wider --window, steady the slope", noisy, 100*NoisySlope))
	}
}

// slopeSpread is half the relative change of a corrected value f(s)
// between s − se and s + se: the uncertainty the slope's standard error
// puts on it. It is infinite when either end gives no usable value.
func slopeSpread(f func(s float64) float64, s, se float64) float64 {
	if math.IsNaN(se) {
		return math.NaN()
	}
	lo, hi := f(s-se), f(s+se)
	if !positive(lo, hi) {
		return math.Inf(1)
	}
	return math.Abs(math.Log(hi/lo)) / 2
}

// keepRising keeps the points; it moves those whose slope is not positive to the
// rejected list: no correction exists for a reading that falls as the rate
// rises.
func (c *FlowCurve) keepRising(pts []FlowPoint, slopeName string) {
	for _, p := range pts {
		if !(p.Slope > 0) {
			c.Rejected = append(c.Rejected, Rejected{p.Lines, fmt.Sprintf("the local slope of %s is %.3g, not positive: the reading does not rise with the rate (wall slip, fracture or a bad reading), and no correction exists", slopeName, p.Slope)})
			continue
		}
		c.Points = append(c.Points, p)
	}
}

// Couette is a concentric-cylinder viscometer: a bob of radius BobRadius
// and immersed length BobLength in a cup of radius CupRadius (all m).
type Couette struct{ BobRadius, CupRadius, BobLength float64 }

func (g Couette) Name() string { return GeometryCouette }

// Check refuses an impossible geometry.
func (g Couette) Check() error {
	if !positive(g.BobRadius, g.CupRadius, g.BobLength) || !(g.CupRadius > g.BobRadius) {
		return errorf("a concentric cylinder needs positive bob radius, cup radius and bob length, with the cup wider than the bob (have bob %g m, cup %g m, length %g m)", g.BobRadius, g.CupRadius, g.BobLength)
	}
	return nil
}

// CouetteBobStress is the shear stress at the bob, σ_b = M/(2π h R_b²)
// (Steffe 1996, Rheological Methods in Food Process Engineering, 2nd ed.,
// §3.2, with Eq. 3.37).
func CouetteBobStress(torque, bobRadius, length float64) float64 {
	return torque / (2 * math.Pi * length * bobRadius * bobRadius)
}

// CouetteNewtonianRate is the Newtonian shear rate at the bob,
// γ̇_b = 2Ω α²/(α² − 1), α = R_c/R_b (Steffe 1996, Eq. 3.32).
func CouetteNewtonianRate(omega, alpha float64) float64 {
	return 2 * omega * alpha * alpha / (alpha*alpha - 1)
}

// CouettePowerLawRate is the shear rate at the bob for a local slope
// s = d ln σ_b / d ln Ω, γ̇_b = 2Ω / [s (1 − α^(−2/s))] (Steffe 1996,
// Eqs. 3.33 and 3.36; Steffe, p. 167, recommends it with s taken locally as
// an excellent approximation to Krieger's 1968 general method).
func CouettePowerLawRate(omega, alpha, s float64) float64 {
	return 2 * omega / (s * (1 - math.Pow(alpha, -2/s)))
}

// Reduce turns speed and torque readings into shear rate and stress at the
// bob, with the local slope of ln M against ln Ω.
func (g Couette) Reduce(rs []Reading, window int) (FlowCurve, error) {
	c := FlowCurve{Geometry: g.Name(), Methods: []string{
		"stress at the bob σ_b = M/(2π h R_b²) (Steffe 1996, Eq. 3.37)",
		"shear rate at the bob γ̇_b = 2Ω/[s(1 − α^(−2/s))], s = local slope of ln M against ln Ω (Steffe 1996, Eqs. 3.33, 3.36; p. 167)",
	}}
	ok := rotational(rs, &c)
	x, y := speeds(ok), torques(ok)
	s, se, err := slopesOf(x, y, window, "concentric-cylinder shear-rate")
	if err != nil {
		return c, err
	}
	alpha := g.CupRadius / g.BobRadius
	var pts []FlowPoint
	for i, r := range ok {
		gn := CouetteNewtonianRate(r.AngularSpeed, alpha)
		gb := CouettePowerLawRate(r.AngularSpeed, alpha, s[i])
		pts = append(pts, FlowPoint{Lines: []int{r.Line}, ShearRate: gb, Stress: CouetteBobStress(r.Torque, g.BobRadius, g.BobLength),
			Slope: s[i], SlopeSE: se[i], Correction: gb/gn - 1, Corrects: "shear rate", Reynolds: math.NaN(),
			SlopeSpread: slopeSpread(func(s float64) float64 { return CouettePowerLawRate(r.AngularSpeed, alpha, s) }, s[i], se[i])})
	}
	c.keepRising(pts, "ln torque against ln speed")
	// Steffe (1996, p. 167), after Yang & Krieger (1978): acceptable for
	// α from 1.01 to 1.40, often good up to 2.0.
	if alpha > 1.4 {
		c.Warnings = append(c.Warnings, fmt.Sprintf("cup-to-bob radius ratio %.3g is above 1.40, the range in which the local power-law shear rate is known to be accurate (Steffe 1996, p. 167)", alpha))
	}
	c.judge()
	return c, nil
}

// UnshearedWarnings names the points at which a fluid with a yield stress
// is not sheared across the whole gap: the stress at the cup, σ_b/α², is
// below the yield stress, and the shear-rate formula does not hold there
// (Steffe 1996, §3.2).
func (g Couette) UnshearedWarnings(pts []FlowPoint, yield float64) []string {
	var ws []string
	a2 := math.Pow(g.CupRadius/g.BobRadius, 2)
	for _, p := range pts {
		if yield > 0 && p.Stress/a2 < yield {
			ws = append(ws, fmt.Sprintf("line %d: the stress at the cup, %.3g Pa, is below the fitted yield stress %.3g Pa: part of the gap is not sheared and the shear rate there is not valid", p.Lines[0], p.Stress/a2, yield))
		}
	}
	return ws
}

func speeds(rs []Reading) []float64 {
	v := make([]float64, len(rs))
	for i, r := range rs {
		v[i] = r.AngularSpeed
	}
	return v
}

func torques(rs []Reading) []float64 {
	v := make([]float64, len(rs))
	for i, r := range rs {
		v[i] = r.Torque
	}
	return v
}

// ConePlate is a cone of radius Radius (m) and cone angle Angle (rad)
// on a plate.
type ConePlate struct{ Radius, Angle float64 }

func (g ConePlate) Name() string { return GeometryConePlate }

// Check refuses an impossible geometry.
func (g ConePlate) Check() error {
	if !positive(g.Radius, g.Angle) || g.Angle >= math.Pi/4 {
		return errorf("a cone and plate needs a positive radius and a cone angle between 0 and 45° (have %g m, %g rad)", g.Radius, g.Angle)
	}
	return nil
}

// Reduce gives σ = 3M/(2πR³) and γ̇ = Ω/tan θ, uniform across the gap for
// small θ (Steffe 1996, §3.3; the rheosys form factors C1 = 1/(⅔πR³),
// C2 = 1/θ). No correction is needed.
func (g ConePlate) Reduce(rs []Reading, _ int) (FlowCurve, error) {
	c := FlowCurve{Geometry: g.Name(), Methods: []string{"cone and plate: σ = 3M/(2πR³), γ̇ = Ω/tan θ, uniform across the gap (Steffe 1996, §3.3)"}}
	for _, r := range rotational(rs, &c) {
		c.Points = append(c.Points, FlowPoint{Lines: []int{r.Line}, ShearRate: r.AngularSpeed / math.Tan(g.Angle),
			Stress: 3 * r.Torque / (2 * math.Pi * math.Pow(g.Radius, 3)), Slope: math.NaN(), SlopeSE: math.NaN(), SlopeSpread: math.NaN(), Reynolds: math.NaN()})
	}
	c.judge()
	// Cone-and-plate viscometry of Casson and Herschel–Bulkley fluids
	// (Tohoku University): first-order expressions err by under 1 % only
	// up to 2°.
	if deg := g.Angle * 180 / math.Pi; deg > 2 {
		c.Warnings = append(c.Warnings, fmt.Sprintf("cone angle %.3g° is above 2°: for yield-stress fluids the simple cone-and-plate formulas may err by more than 1 %%", deg))
	}
	return c, nil
}

// ParallelPlate is two discs of radius Radius a gap Gap apart (m).
type ParallelPlate struct{ Radius, Gap float64 }

func (g ParallelPlate) Name() string { return GeometryParallelPlate }

// Check refuses an impossible geometry.
func (g ParallelPlate) Check() error {
	if !positive(g.Radius, g.Gap) {
		return errorf("parallel plates need a positive radius and gap (have %g m, %g m)", g.Radius, g.Gap)
	}
	return nil
}

// ParallelPlateRimStress is the shear stress at the rim,
// σ_R = (M/(2πR³))·(3 + d ln M / d ln γ̇_R), found by differentiating
// Steffe (1996) Eq. 3.62; Newtonian (slope 1) it is 2M/(πR³).
func ParallelPlateRimStress(torque, radius, slope float64) float64 {
	return torque / (2 * math.Pi * math.Pow(radius, 3)) * (3 + slope)
}

// Reduce gives the rim shear rate γ̇_R = ΩR/h (Steffe 1996, Eq. 3.59) and
// the rim stress with the local slope of ln M against ln γ̇_R.
func (g ParallelPlate) Reduce(rs []Reading, window int) (FlowCurve, error) {
	c := FlowCurve{Geometry: g.Name(), Methods: []string{
		"rim shear rate γ̇_R = ΩR/h (Steffe 1996, Eq. 3.59)",
		"rim stress σ_R = M/(2πR³)·(3 + d ln M/d ln γ̇_R), slope local (from Steffe 1996, Eq. 3.62)",
	}}
	ok := rotational(rs, &c)
	s, se, err := slopesOf(speeds(ok), torques(ok), window, "parallel-plate stress")
	if err != nil {
		return c, err
	}
	var pts []FlowPoint
	for i, r := range ok {
		sig := ParallelPlateRimStress(r.Torque, g.Radius, s[i])
		newt := 2 * r.Torque / (math.Pi * math.Pow(g.Radius, 3))
		pts = append(pts, FlowPoint{Lines: []int{r.Line}, ShearRate: r.AngularSpeed * g.Radius / g.Gap, Stress: sig,
			Slope: s[i], SlopeSE: se[i], Correction: sig/newt - 1, Corrects: "stress", Reynolds: math.NaN(),
			SlopeSpread: slopeSpread(func(s float64) float64 { return 3 + s }, s[i], se[i])})
	}
	c.keepRising(pts, "ln torque against ln speed")
	c.judge()
	return c, nil
}
