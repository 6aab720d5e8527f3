package regime

import (
	"math"

	"github.com/flowregime/flowregime/media"
)

// RenaudX returns the drag correction factor X(n) of a sphere in creeping
// flow of a power-law fluid, F = 3πK Uⁿ d^(2−n) X(n), by the closed form
// X(n) = 6^((n−1)/2) (3/(n² + n + 1))^(n+1); X(1) = 1, X > 1 for n < 1.
// It reproduces the numerical results tabulated in Chhabra (2007), Bubbles,
// Drops, and Particles in Non-Newtonian Fluids, 2nd ed., CRC, to a few per
// cent for 0.4 ≤ n ≤ 1.
//
// Reference: Renaud, M., Mauret, E. & Chhabra, R. P. (2004), Power-law fluid
// flow over a sphere: average shear rate and drag coefficient, Can. J. Chem.
// Eng. 82, 1066–1070 (formula not seen in the original; its maximum, 1.46
// near n = 0.4, matches the published "up to 46 per cent" above Newtonian
// drag quoted from Chhabra's tables in Coulson & Richardson's Chemical
// Engineering, vol. 2; see the test).
func RenaudX(n float64) float64 {
	return math.Pow(6, (n-1)/2) * math.Pow(3/(n*n+n+1), n+1)
}

// PowerLawCreepingDrag returns the creeping-flow drag (N) of a sphere of
// diameter d moving at u through a power-law fluid of consistency k and
// flow index n: 3πK uⁿ d^(2−n) X(n).
func PowerLawCreepingDrag(k, n, u, d float64) float64 {
	return 3 * math.Pi * k * math.Pow(u, n) * math.Pow(d, 2-n) * RenaudX(n)
}

// GeneralizedReynolds returns the Reynolds number of a power-law fluid for
// a particle, Re = ρ U^(2−n) Lⁿ / K (Metzner–Reed form as used for
// particles by Chhabra 2007), which equals ρUL/η(U/L): the Newtonian
// Reynolds number on the apparent viscosity at shear rate U/L. NaN unless
// the fluid is power-law or Herschel–Bulkley.
func GeneralizedReynolds(rh media.Rheology, rho, u, l float64) float64 {
	k, n, ok := powerLawPart(rh)
	if !ok {
		return math.NaN()
	}
	return rho * math.Pow(u, 2-n) * math.Pow(l, n) / k
}

// BinghamNumber returns the ratio of yield stress to viscous stress at the
// characteristic shear rate γ̇ = U/L: τ_y L/(μ_p U) for Bingham and Casson
// fluids, τ_y/(K γ̇ⁿ) for Herschel–Bulkley (Chhabra & Richardson 2008,
// Non-Newtonian Flow and Applied Rheology, 2nd ed., ch. 5). NaN without a
// yield stress.
func BinghamNumber(rh media.Rheology, u, l float64) float64 {
	g := u / l
	switch m := model(rh).(type) {
	case media.Bingham:
		return m.TauY / (m.MuP * g)
	case media.Casson:
		return m.TauY / (m.EtaC * g)
	case media.HerschelBulkley:
		return m.TauY / (m.K * math.Pow(g, m.N))
	}
	return math.NaN()
}

func model(rh media.Rheology) media.Rheology {
	if mr, ok := rh.(media.MeasuredRheology); ok {
		return mr.Model
	}
	return rh
}

func powerLawPart(rh media.Rheology) (k, n float64, ok bool) {
	switch m := model(rh).(type) {
	case media.PowerLaw:
		return m.K, m.N, true
	case media.HerschelBulkley:
		return m.K, m.N, true
	}
	return 0, 0, false
}

func yieldStress(rh media.Rheology) float64 {
	if m, ok := model(rh).(media.Model); ok {
		return media.YieldStress(m)
	}
	return 0
}

// BerisCritical is the critical yield parameter of a sphere in a Bingham
// fluid, Y_g = 3τ_y/(d Δρ g): the sphere moves only below 0.143 (Beris,
// A. N., Tsamopoulos, J. A., Armstrong, R. C. & Brown, R. A. (1985),
// Creeping motion of a sphere through a Bingham plastic, J. Fluid Mech.
// 158, 219–244). In the other common definition, Y = τ_y/(g d Δρ), the
// critical value is 0.143/3 = 0.048.
const BerisCritical = 0.143

// YieldParameter returns Y_g = 3τ_y/(d |Δρ| g).
func YieldParameter(tauY, d, drho float64) float64 {
	return 3 * tauY / (d * math.Abs(drho) * media.StandardGravity)
}
