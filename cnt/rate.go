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

// LnAttachmentCap is the logarithm of the attachment frequency of a
// critical nucleus that is a spherical cap, of n* molecules (size), shape
// factor f = ShapeFactor(θ) and contact angle θ (degrees), on a flat
// substrate:
//
//	β* = 24·D·(n*/f)^(2/3)/λ² · (1 − cos θ)/2
//
// Molecules join the cap across its curved surface, 2πr*²(1 − cos θ),
// which is the share (1 − cos θ)/2 (CapArea) of the surface of the sphere
// of the same radius r*; that sphere holds n*/f molecules and by the
// homogeneous law (LnAttachment) takes 24·D·(n*/f)^(2/3)/λ² of them per
// second. The attachment frequency proportional to the area the cluster
// exposes to the parent phase: Kelton and Greer (2010) ch. 6 (from memory);
// the same area law in the transient heterogeneous-nucleation model of
// Xu W., Lan Z., Peng B., Wen R., Ma X., RSC Adv. 4 (2014),
// doi:10.1039/c4ra03074e.
//
// With the cap's Zeldovich factor Z = Z_hom/√f (Critical), the kinetic
// prefactor is
//
//	Z·β* = Z_hom·β*_hom/√(2 + cos θ)
//
// (Z_hom, β*_hom of the sphere of radius r*): it changes by at most a
// factor 1/√3 between no wetting and complete wetting, while the barrier
// f·ΔG*_hom vanishes. With B = ΔG*_hom/k_BT,
//
//	d ln J/dθ = sin θ/(2·(2 + cos θ)) − (3/4)·B·sin³θ
//
// so J at a fixed site density rises as θ falls wherever
// B·sin²θ·(2 + cos θ) ≥ 2/3: everywhere but at the two ends. Within a few
// degrees of 180° the cap's contact patch takes attachment area (to second
// order in 180° − θ) faster than the barrier falls (fourth order): J dips
// by at most 1/(12·B) in ln J before it rises. Near 0°, with the barrier
// below a thousandth of k_BT, J levels off at N·Z_hom·β*_hom/√3 after a dip
// of at most 1/(108·B). For a barrier of 10 k_BT or more both dips are
// below 1 % in J; the steady-state CNT rate is not that precise anywhere.
// θ = 180° gives LnAttachment(lnD, size, jump) exactly.
// Special cases: f = 0 (θ = 0) gives −Inf.
func LnAttachmentCap(lnD, size, shape, thetaDeg, jump float64) float64 {
	if shape == 1 {
		return LnAttachment(lnD, size, jump)
	}
	if !(shape > 0) {
		return math.Inf(-1)
	}
	return LnAttachment(lnD, size/shape, jump) + math.Log(CapArea(thetaDeg))
}

// SitesOnParticles is the number density of heterogeneous nucleation sites
// (m⁻³) on particles of a second phase, n particles per m³ each of surface
// area a (m²), counting one site per molecule of the new phase that fits
// on the surface, of area v^(2/3) for a molecular volume v (m³):
//
//	N = n·a/v^(2/3)
//
// Common practice (sites as the molecules in contact with the substrate;
// Christian (2002) §10.4 counts them per unit area of interface, from
// memory). Special cases: any input not positive and finite gives NaN.
func SitesOnParticles(perVolume, area, v float64) float64 {
	for _, x := range []float64{perVolume, area, v} {
		if !(x > 0) || math.IsInf(x, 1) {
			return math.NaN()
		}
	}
	return perVolume * area / math.Pow(v, 2.0/3)
}

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

// LnTimeLag is the logarithm of the time lag of nucleation, the intercept
// with the time axis of the line the number of nuclei approaches once the
// rate is steady, N(t) → J_s·(t − θ):
//
//	θ = (π²/6)·τ = 2/(3π·Z²·β*),  τ = 4/(π³·Z²·β*)
//
// τ is the characteristic time of Kashchiev's series for the transient
// rate, J(t) = J_s·[1 + 2·Σ_{m≥1} (−1)^m·exp(−m²·t/τ)]: the time to diffuse,
// at the attachment frequency β*, across the critical region of width
// 2/(√π·Z). Integrating the series gives the intercept, larger by
// Σ 2(−1)^(m+1)/m² = π²/6. Kashchiev D., Surf. Sci. 14 (1969) 209;
// Kashchiev D., Nucleation: Basic Theory with Applications (2000) ch. 16
// (both from memory). The intercept is what a model that starts
// nucleation at θ and runs it at the steady rate after (JMAK with a lag)
// needs: it reproduces N(t) once the transient is over.
//
// Accuracy: against the Becker–Döring master equation of a droplet whose
// attachment follows the surface (internal/beckerdoring, the clusters past
// n*), the lag is 1.15·θ at a barrier of 40 k_BT (n* = 100), and from 0.72·θ
// to 1.6·θ over 10 to 160 k_BT (TestTimeLagMasterEquation). Kashchiev's
// solution holds the clusters below the critical region at equilibrium
// throughout; their relaxation, which it leaves out, takes longer the
// higher the barrier.
//
// Special cases: Z = 0 or β* = 0 (ln β* = −Inf) gives +Inf.
func LnTimeLag(zeldovich, lnBeta float64) float64 { return lnPerZ2Beta(lnLagFactor, zeldovich, lnBeta) }

var lnLagFactor = math.Log(2 / (3 * math.Pi)) // ln(π²/6 · 4/π³)

// TimeLag is exp(LnTimeLag), s; +Inf where it overflows.
func TimeLag(zeldovich, lnBeta float64) float64 { return math.Exp(LnTimeLag(zeldovich, lnBeta)) }

// Incubation is the incubation time τ (s) of a transient nucleation rate
// written with the factor
//
//	J(t) = J_s·exp(−τ/t),  τ = 1/(2π·Z²·β*)
//
// t the time since the parent became supersaturated. The factor is the
// form of the size-class precipitation models after Kampmann R., Wagner R.,
// in Decomposition of Alloys: the Early Stages, Pergamon (1984) 91; the
// constant is the estimate of Kelton K.F., Greer A.L., Nucleation in
// Condensed Matter (2010) §3.3 (both from memory). It is not the time lag
// (LnTimeLag): exp(−τ/t) approaches 1 only as 1 − τ/t, and the nuclei it
// counts fall behind J_s·t by about τ·ln(t/τ), without bound.
//
// Accuracy: against the Becker–Döring master equation of the Al–Sc test
// alloy's own nucleus (internal/beckerdoring; kinetics/population,
// TestIncubationMasterEquation), the rate past the size where particles are
// born reaches half its steady value 1.25, 1.48 and 1.61 times later than
// the form's half time τ/ln 2, at barriers of 6.8, 14 and 21 k_BT (n* = 12,
// 51, 102): the form runs ahead of the master equation, more so the higher
// the barrier, as Kashchiev's lag does (LnTimeLag).
//
// Special cases: Z = 0 or β* = 0 (ln β* = −Inf) gives +Inf.
func Incubation(zeldovich, lnBeta float64) float64 {
	return math.Exp(lnPerZ2Beta(lnIncubationFactor, zeldovich, lnBeta))
}

var lnIncubationFactor = math.Log(1 / (2 * math.Pi))

// lnPerZ2Beta is ln(c/(Z²·β*)) for ln c = lnC.
func lnPerZ2Beta(lnC, zeldovich, lnBeta float64) float64 {
	return lnC - lnBeta - 2*math.Log(zeldovich)
}
