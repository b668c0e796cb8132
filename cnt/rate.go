package cnt

import "math"

// LnAttachment is the logarithm of the frequency at which molecules join the
// critical nucleus by interface diffusion, for ln D (D in m²/s), critical
// size n* and jump distance λ (m):
//
//	β* = 24·D·n*^(2/3)/λ²
//
// Turnbull and Fisher (1949); Kelton and Greer (2010) eq. 2.45.
// It is carried as a logarithm so that a vanishing mobility (ln D = −Inf)
// or a huge one never under- or overflows.
func LnAttachment(lnD, size, jump float64) float64 {
	return ln24 + lnD + 2.0/3*math.Log(size) - 2*math.Log(jump)
}

const ln24 = 3.1780538303479456196 // ln 24, the attachment geometry factor

// LnRate is the natural logarithm of the steady-state nucleation rate per
// m³·s with the kinetic prefactor written out,
//
//	J = N·Z·β*·exp(−ΔG*/k_BT)
//
// with lnN the logarithm of the number density of sites (m⁻³) and lnBeta
// that of β* (1/s). Kelton and Greer (2010) eq. 2.30.
// Special cases: Z = 0, ln β* = −Inf or ΔG* = +Inf gives −Inf (no nucleation).
func LnRate(lnN, zeldovich, lnBeta, barrier, T float64) float64 {
	if zeldovich == 0 || math.IsInf(lnBeta, -1) || math.IsInf(barrier, 1) {
		return math.Inf(-1)
	}
	return lnN + math.Log(zeldovich) + lnBeta - barrier/(Boltzmann*T)
}

// LnRateTurnbullFisher is the Turnbull–Fisher rate with an Arrhenius jump
// frequency across the interface of activation energy Q (J/mol):
//
//	J = N·(k_BT/h)·exp(−Q/RT)·exp(−ΔG*/k_BT)
//
// Turnbull D., Fisher J.C., J. Chem. Phys. 17 (1949) 71, eq. 12.
func LnRateTurnbullFisher(lnN, Q, barrier, T float64) float64 {
	if math.IsInf(barrier, 1) {
		return math.Inf(-1)
	}
	return lnN + math.Log(Boltzmann*T/Planck) - Q/(Gas*T) - barrier/(Boltzmann*T)
}

// LnRateFixed is the rate with a given prefactor J0 (m⁻³·s⁻¹), as used for
// textbook and fitted prefactors:
//
//	J = J0·exp(−ΔG*/k_BT)
func LnRateFixed(lnJ0, barrier, T float64) float64 {
	if math.IsInf(barrier, 1) {
		return math.Inf(-1)
	}
	return lnJ0 - barrier/(Boltzmann*T)
}

// TimeLag is the transient time before the steady-state rate is reached,
//
//	τ ≈ 1/(2π·Z²·β*)
//
// the form of Kelton and Greer (2010) §3.3; other treatments differ by a
// constant factor of order one (Kashchiev D., Surf. Sci. 14 (1969) 209, has
// 6/(π³·Z²·β*) for the time lag of the number of nuclei, from memory).
// Special cases: Z = 0 or β* = 0 gives +Inf.
func TimeLag(zeldovich, lnBeta float64) float64 {
	return math.Exp(-lnBeta) / (2 * math.Pi * zeldovich * zeldovich)
}
