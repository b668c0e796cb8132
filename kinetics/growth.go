package kinetics

import "math"

// GrowthRate is the interface-controlled (normal) growth velocity of a
// crystal face, for ln D (m²/s), jump distance λ (m) and the driving force
// per molecule in units of k_BT, x = Δμ/k_BT:
//
//	u = (D/λ)·[1 − exp(−Δμ/k_BT)]
//
// Turnbull D., Cohen M.H., in Modern Aspects of the Vitreous State (1960);
// Uhlmann, J. Non-Cryst. Solids 7 (1972) 337, eq. 5.
// Special cases: x ≤ 0 (no driving force) or ln D = −Inf gives 0.
func GrowthRate(lnD, jump, x float64) float64 {
	if !(x > 0) {
		return 0
	}
	return math.Exp(lnD) / jump * -math.Expm1(-x)
}
