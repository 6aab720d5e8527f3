package media

import (
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/stat"
)

// Capillary is a tube viscometer: inner diameter Diameter and length Length
// (m). FluidDensity (kg/m³; 0 when unknown) enables the laminar-flow check.
type Capillary struct{ Diameter, Length, FluidDensity float64 }

func (g Capillary) Name() string { return GeometryCapillary }

// Check refuses an impossible geometry.
func (g Capillary) Check() error {
	if !positive(g.Diameter, g.Length) || g.FluidDensity < 0 || math.IsInf(g.FluidDensity, 0) || math.IsNaN(g.FluidDensity) {
		return errorf("a capillary needs a positive diameter and length (have %g m, %g m)", g.Diameter, g.Length)
	}
	return nil
}

// CapillaryApparentRate is the Newtonian (apparent) wall shear rate,
// γ̇_app = 32Q/(πD³) = 8V̄/D (Hagen–Poiseuille; Steffe 1996, §2).
func CapillaryApparentRate(flow, diameter float64) float64 {
	return 32 * flow / (math.Pi * math.Pow(diameter, 3))
}

// CapillaryWallStress is the wall shear stress τ_w = ΔP D/(4L), from the
// force balance on the fluid in the tube.
func CapillaryWallStress(dp, diameter, length float64) float64 { return dp * diameter / (4 * length) }

// RabinowitschFactor is the Rabinowitsch–Mooney correction γ̇_w/γ̇_app =
// (3n′ + 1)/(4n′), n′ = d ln τ_w / d ln γ̇_app (Rabinowitsch 1929, Z. Phys.
// Chem. A145:1; Mooney 1931, J. Rheol. 2:210; Springer reference entry
// "Rabinowitsch correction").
func RabinowitschFactor(n float64) float64 { return (3*n + 1) / (4 * n) }

// wallPoint is the wall stress at one flow rate before the shear-rate
// correction.
type wallPoint struct {
	lines []int
	flow  float64
	tau   float64
	notes []string
}

// Reduce gives the wall stress (with the Bagley end correction when the
// readings hold two tube lengths or more), the apparent wall shear rate,
// and the Rabinowitsch–Mooney corrected wall shear rate. Bagley comes
// first, then Rabinowitsch (Göttfert application note "Bagley correction").
func (g Capillary) Reduce(rs []Reading, window int) (FlowCurve, error) {
	c := FlowCurve{Geometry: g.Name(), Methods: []string{
		"apparent wall shear rate γ̇_app = 32Q/(πD³); wall stress τ_w = ΔP D/(4L)",
		"Rabinowitsch–Mooney wall shear rate γ̇_w = γ̇_app(3n′+1)/(4n′), n′ = local slope of ln τ_w against ln γ̇_app (Rabinowitsch 1929; Mooney 1931)",
	}}
	var ok []Reading
	lengths := map[float64]bool{}
	for _, r := range rs {
		if math.IsNaN(r.TubeLength) {
			r.TubeLength = g.Length
		}
		if !positive(r.FlowRate, r.PressureDrop, r.TubeLength) {
			c.Rejected = append(c.Rejected, Rejected{[]int{r.Line}, fmt.Sprintf("flow rate %g m³/s, pressure drop %g Pa and tube length %g m must all be positive and finite", r.FlowRate, r.PressureDrop, r.TubeLength)})
			continue
		}
		ok = append(ok, r)
		lengths[r.TubeLength] = true
	}
	var wps []wallPoint
	if len(lengths) > 1 {
		c.Methods = append(c.Methods, "Bagley end correction: at each flow rate ΔP against L/R is a straight line, ΔP = 2τ_w(L/R + e) (Bagley 1957, J. Appl. Phys. 28:624)")
		wps = g.bagley(ok, &c)
	} else {
		for _, r := range ok {
			wps = append(wps, wallPoint{lines: []int{r.Line}, flow: r.FlowRate, tau: CapillaryWallStress(r.PressureDrop, g.Diameter, r.TubeLength)})
		}
	}
	sort.SliceStable(wps, func(i, j int) bool { return wps[i].flow < wps[j].flow })
	x, y := make([]float64, len(wps)), make([]float64, len(wps))
	for i, w := range wps {
		x[i], y[i] = CapillaryApparentRate(w.flow, g.Diameter), w.tau
	}
	s, se, err := slopesOf(x, y, window, "Rabinowitsch–Mooney")
	if err != nil {
		return c, err
	}
	var pts []FlowPoint
	turbulent := 0
	for i, w := range wps {
		p := FlowPoint{Lines: w.lines, ShearRate: x[i] * RabinowitschFactor(s[i]), Stress: w.tau, Slope: s[i], SlopeSE: se[i],
			SlopeSpread: slopeSpread(RabinowitschFactor, s[i], se[i]),
			Correction:  RabinowitschFactor(s[i]) - 1, Corrects: "shear rate", Reynolds: math.NaN(), Notes: w.notes}
		if g.FluidDensity > 0 {
			p.Reynolds = g.metznerReed(w.flow, w.tau)
			if p.Reynolds > 2100 {
				p.Notes = append(p.Notes, fmt.Sprintf("Reynolds number %.0f is above 2100: the flow may not be laminar", p.Reynolds))
				turbulent++
			}
		}
		pts = append(pts, p)
	}
	c.keepRising(pts, "ln wall stress against ln apparent shear rate")
	if turbulent > 0 {
		c.Warnings = append(c.Warnings, fmt.Sprintf("%d point(s) have a Reynolds number above 2100, where tube flow may not be laminar and every formula here fails", turbulent))
	}
	if g.FluidDensity > 0 {
		c.Methods = append(c.Methods, "laminar check: Metzner–Reed Reynolds number Re = ρV̄D/(τ_w/γ̇_app) = 8ρV̄²/τ_w below 2100 (Metzner & Reed 1955, AIChE J. 1:434)")
	}
	c.judge()
	return c, nil
}

// metznerReed is the generalised Reynolds number ρV̄D/μ_app with
// μ_app = τ_w/γ̇_app, which is 8ρV̄²/τ_w (Metzner & Reed 1955, AIChE J.
// 1:434). For a power-law fluid it equals the form
// ρV̄^(2−n)D^n/(8^(n−1)((3n+1)/(4n))^n K) quoted in CHAM's PHOENICS
// validation case for power-law pipe flow.
func (g Capillary) metznerReed(flow, tau float64) float64 {
	v := flow / (math.Pi * g.Diameter * g.Diameter / 4)
	return 8 * g.FluidDensity * v * v / tau
}

// bagley groups the readings by flow rate and fits ΔP against L/R in each
// group: the slope is 2τ_w and the intercept 2τ_w·e, e the end correction
// in radii. A flow rate measured at one length only is rejected.
func (g Capillary) bagley(rs []Reading, c *FlowCurve) []wallPoint {
	sort.SliceStable(rs, func(i, j int) bool { return rs[i].FlowRate < rs[j].FlowRate })
	var out []wallPoint
	radius := g.Diameter / 2
	for i := 0; i < len(rs); {
		j := i + 1
		for j < len(rs) && math.Abs(rs[j].FlowRate-rs[i].FlowRate) <= 1e-6*rs[i].FlowRate {
			j++
		}
		group := rs[i:j]
		i = j
		var lines []int
		var lr, dp []float64
		lens := map[float64]bool{}
		longest := group[0]
		for _, r := range group {
			lines = append(lines, r.Line)
			lr = append(lr, r.TubeLength/radius)
			dp = append(dp, r.PressureDrop)
			lens[r.TubeLength] = true
			if r.TubeLength > longest.TubeLength {
				longest = r
			}
		}
		if len(lens) < 2 {
			c.Rejected = append(c.Rejected, Rejected{lines, fmt.Sprintf("flow rate %g m³/s was measured with one tube length only; the end correction needs two lengths or more at the same flow rate", group[0].FlowRate)})
			continue
		}
		a, b := stat.LinearRegression(lr, dp, nil, false)
		if !(b > 0) {
			c.Rejected = append(c.Rejected, Rejected{lines, fmt.Sprintf("at flow rate %g m³/s the pressure drop does not rise with tube length (slope %.3g Pa per radius); no end correction exists", group[0].FlowRate, b)})
			continue
		}
		tau, e := b/2, a/b
		plain := CapillaryWallStress(longest.PressureDrop, g.Diameter, longest.TubeLength)
		notes := []string{fmt.Sprintf("end correction e = %.3g radii; wall stress %+.1f %% against the longest tube uncorrected", e, 100*(tau/plain-1))}
		if e < 0 {
			notes = append(notes, "negative end correction: the longer tubes gave too little pressure drop (leak, slip or a bad reading?)")
		}
		out = append(out, wallPoint{lines: lines, flow: group[0].FlowRate, tau: tau, notes: notes})
	}
	return out
}

// Wall corrections for a falling ball.
const (
	WallHabermanSayre = "haberman-sayre"
	WallFaxen         = "faxen"
)

// FallingBall is a ball of diameter BallDiameter and density BallDensity
// falling on the axis of a tube of diameter TubeDiameter filled with fluid
// of density FluidDensity (m, kg/m³), with the wall correction Wall.
type FallingBall struct {
	BallDiameter, TubeDiameter, BallDensity, FluidDensity float64
	Wall                                                  string
}

func (g FallingBall) Name() string { return GeometryFallingBall }

// Check refuses an impossible geometry.
func (g FallingBall) Check() error {
	switch {
	case !positive(g.BallDiameter, g.TubeDiameter, g.BallDensity, g.FluidDensity):
		return errorf("a falling ball needs a positive ball diameter, tube diameter, ball density and fluid density")
	case g.BallDiameter >= g.TubeDiameter:
		return errorf("the ball (%g m) must be narrower than the tube (%g m)", g.BallDiameter, g.TubeDiameter)
	case g.BallDensity <= g.FluidDensity:
		return errorf("the ball (%g kg/m³) must be denser than the fluid (%g kg/m³) to fall", g.BallDensity, g.FluidDensity)
	case g.Wall != WallHabermanSayre && g.Wall != WallFaxen:
		return errorf("unknown wall correction %q; accepted: %s, %s", g.Wall, WallHabermanSayre, WallFaxen)
	}
	return nil
}

// FaxenFactor is v/v∞ for a sphere on the axis of a tube, λ = d/D:
// 1 − 2.10444λ + 2.08877λ³ − 0.94813λ⁵ (Faxén 1923, Arkiv för Matematik,
// Astronomi och Fysik 17:1–28). The viscosity is μ = f·μ_Stokes.
func FaxenFactor(lambda float64) float64 {
	l2 := lambda * lambda
	return 1 - 2.10444*lambda + 2.08877*lambda*l2 - 0.94813*lambda*l2*l2
}

// HabermanSayreK is the drag factor K of a sphere on the axis of a tube,
// drag = 6πμaU·K, K = (1 − 0.75857λ⁵)/(1 − 2.1050λ + 2.0865λ³ − 1.7068λ⁵
// + 0.72603λ⁶) (Haberman & Sayre 1958, David Taylor Model Basin Report
// 1143, doi 10.21236/AD0206307). The viscosity is μ = μ_Stokes/K.
func HabermanSayreK(lambda float64) float64 {
	l2 := lambda * lambda
	l5 := l2 * l2 * lambda
	return (1 - 0.75857*l5) / (1 - 2.1050*lambda + 2.0865*lambda*l2 - 1.7068*l5 + 0.72603*l5*lambda)
}

// StokesViscosity is the viscosity from a sphere's terminal speed in Stokes
// flow, μ = (ρ_s − ρ_f) g d²/(18 v) (Stokes 1851, Trans. Camb. Phil. Soc.
// 9:8).
func StokesViscosity(d, rhoBall, rhoFluid, v float64) float64 {
	return (rhoBall - rhoFluid) * StandardGravity * d * d / (18 * v)
}

// WallFactor is the factor μ/μ_Stokes of the chosen wall correction.
func (g FallingBall) WallFactor() float64 {
	lambda := g.BallDiameter / g.TubeDiameter
	if g.Wall == WallFaxen {
		return FaxenFactor(lambda)
	}
	return 1 / HabermanSayreK(lambda)
}

// Reduce gives one viscosity per ball from its terminal speed, corrected
// for the tube wall, with the ball's Reynolds number. The shear rate given
// with it is the largest on the sphere in Stokes flow, 3v/d (from Stokes's
// solution; recalled from memory), a label for the point rather than a
// uniform rate: a falling ball measures a Newtonian viscosity.
func (g FallingBall) Reduce(rs []Reading, _ int) (FlowCurve, error) {
	lambda := g.BallDiameter / g.TubeDiameter
	wall := "Haberman & Sayre (1958) μ = μ_Stokes/K"
	if g.Wall == WallFaxen {
		wall = "Faxén (1923) μ = f(λ)·μ_Stokes"
	}
	c := FlowCurve{Geometry: g.Name(), Methods: []string{
		"Stokes viscosity μ_Stokes = (ρ_s − ρ_f) g d²/(18 v) (Stokes 1851)",
		fmt.Sprintf("wall correction for λ = d/D = %.3g: %s, factor %.5g", lambda, wall, g.WallFactor()),
		"shear rate shown as 3v/d, the largest on the ball in Stokes flow; the viscosity is Newtonian",
	}}
	f := g.WallFactor()
	if !(f > 0) {
		return c, errorf("the %s wall correction is not positive at λ = %.3g; use a narrower ball", g.Wall, lambda)
	}
	// One implementation of Haberman & Sayre states validity for λ ≤ 0.8.
	if lambda > 0.8 {
		c.Warnings = append(c.Warnings, fmt.Sprintf("ball-to-tube ratio %.3g is above 0.8, beyond the stated range of the Haberman & Sayre correction", lambda))
	}
	if alt := FaxenFactor(lambda) * HabermanSayreK(lambda); math.Abs(alt-1) > 0.01 {
		c.Warnings = append(c.Warnings, fmt.Sprintf("at λ = %.3g the Faxén and Haberman & Sayre wall corrections differ by %.1f %%: use a narrower ball or a wider tube", lambda, 100*math.Abs(alt-1)))
	}
	slow := 0
	for _, r := range rs {
		if !positive(r.FallSpeed) {
			c.Rejected = append(c.Rejected, Rejected{[]int{r.Line}, fmt.Sprintf("fall speed %g m/s must be positive and finite", r.FallSpeed)})
			continue
		}
		mu := f * StokesViscosity(g.BallDiameter, g.BallDensity, g.FluidDensity, r.FallSpeed)
		rate := 3 * r.FallSpeed / g.BallDiameter
		p := FlowPoint{Lines: []int{r.Line}, ShearRate: rate, Stress: mu * rate, Slope: math.NaN(), SlopeSE: math.NaN(), SlopeSpread: math.NaN(),
			Correction: f - 1, Corrects: "viscosity", Reynolds: g.FluidDensity * r.FallSpeed * g.BallDiameter / mu}
		// Oseen's drag, C_D = (24/Re)(1 + 3Re/16), puts the Stokes error
		// near 2 % at Re = 0.1 (Oseen 1910; recalled from memory).
		if p.Reynolds > 0.1 {
			p.Notes = append(p.Notes, fmt.Sprintf("Reynolds number %.3g is above 0.1: Stokes drag is low by about %.1f %% (Oseen)", p.Reynolds, 100*3*p.Reynolds/16))
			slow++
		}
		c.Points = append(c.Points, p)
	}
	if slow > 0 {
		c.Warnings = append(c.Warnings, fmt.Sprintf("%d ball(s) fell with a Reynolds number above 0.1, where Stokes's law errs by more than 2 %%: use a smaller or lighter ball", slow))
	}
	c.judge()
	return c, nil
}
