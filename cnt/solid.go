package cnt

import "math"

// DiluteDriving is the driving force for a precipitate of solute mole
// fraction c_p forming from a dilute binary solid solution of solute mole
// fraction c whose equilibrium (solvus) fraction is c_eq, per atom of
// precipitate and in units of k_BT:
//
//	Δμ/k_BT = c_p·ln(c/c_eq) + (1 − c_p)·ln((1 − c)/(1 − c_eq))
//
// the ideal-dilute-solution expression for a precipitate of fixed
// composition (Perez M., Dumont M., Acevedo-Reyes D., Acta Mater. 56 (2008)
// 2119, eq. 7, from memory). Multiplied by k_BT it is
// Δμ for Critical with the volume per atom of the precipitate.
//
// Special cases: c ≤ c_eq gives a value ≤ 0 up to the small (1 − c_p) term
// (no driving force); c or c_eq outside (0, 1), or c_p outside (0, 1], gives NaN.
func DiluteDriving(c, ceq, cp float64) float64 {
	if !(c > 0 && c < 1) || !(ceq > 0 && ceq < 1) || !(cp > 0 && cp <= 1) {
		return math.NaN()
	}
	// log1p keeps ln(1 − c) exact for the small fractions of a dilute alloy.
	return cp*math.Log(c/ceq) + (1-cp)*(math.Log1p(-c)-math.Log1p(-ceq))
}

// LnAttachmentSolid is the logarithm of the rate at which solute atoms
// join a critical nucleus of radius r* (m) in a solid, by long-range
// diffusion of solute at mole fraction c with diffusivity D (ln D given,
// D in m²/s), for an atomic spacing a (m, the lattice parameter of the
// precipitate):
//
//	β* = 4π·r*²·D·c/a⁴
//
// Russell K.C., Adv. Colloid Interface Sci. 13 (1980) 205 (from memory);
// Perez, Dumont, Acevedo-Reyes (2008) eq. 4 (from memory).
// Special cases: r* = +Inf (no nucleus) gives NaN; ln D = −Inf gives −Inf.
func LnAttachmentSolid(lnD, radius, c, a float64) float64 {
	if math.IsInf(radius, 1) {
		return math.NaN()
	}
	return math.Log(4*math.Pi*radius*radius*c) - 4*math.Log(a) + lnD
}
