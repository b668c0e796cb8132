package kinetics

import (
	"errors"
	"fmt"
	"math"

	"undercool/cnt"
)

// Crystallization from solution: the mobility of a solute in its solvent,
// the induction time of a held solution and the metastable zone width of a
// cooled one. Everything is built on Model.At (ln J and u), as for a melt;
// only the driving force (cnt.Solution) and the attachment
// (PrefactorDiffusion) are particular to solutions.
//
// References:
//
//	Kashchiev D., van Rosmalen G.M., Review: Nucleation in solutions
//	  revisited, Cryst. Res. Technol. 38 (2003) 555 (from memory).
//	Mullin J.W., Crystallization, 4th ed., Butterworth-Heinemann (2001), ch. 5.

// SoluteDiffusivity is a diffusivity of the solute in the solvent that does
// not change with temperature (a measured value at the working temperature):
//
//	D = D_s
type SoluteDiffusivity struct {
	D float64 // m²/s, > 0
}

func (m SoluteDiffusivity) LnDiffusivity(T float64) float64 { return math.Log(m.D) }
func (SoluteDiffusivity) Name() string                      { return "diffusivity" }

// SolventViscosity is the Stokes–Einstein diffusivity of a solute molecule
// of diameter λ in a solvent of viscosity η (constant; the value at the
// working temperature):
//
//	D = k_BT/(3πηλ)
//
// Einstein A., Ann. Phys. 17 (1905) 549.
type SolventViscosity struct {
	Eta  float64 // Pa·s, > 0
	Jump float64 // λ, m, > 0
}

func (m SolventViscosity) LnDiffusivity(T float64) float64 {
	return lnStokesEinstein(T, math.Log(m.Eta), m.Jump)
}
func (SolventViscosity) Name() string { return "stokes-einstein" }

// measuredGrowth is a measured growth rate u (m/s) used in place of the
// mobility law's: u where there is a driving force, 0 where there is none
// (a crystal does not grow from a solution that is not supersaturated).
// Measured rates of crystals in solution are far below the interface-
// controlled (D/λ)·[1 − exp(−Δμ/k_BT)] with the solvent's diffusivity, which
// leaves out the integration of molecules into the crystal surface.
func measuredGrowth(u, dmu float64) float64 {
	if !(dmu > 0) {
		return 0
	}
	return u
}

// checkDiffusion is the check NewModel makes of a material with the
// diffusion-controlled prefactor.
func checkDiffusion(m Material) error {
	if m.Mobility == nil {
		return errors.New("the diffusion prefactor needs the solute's diffusivity: a mobility law (solute_diffusivity or solvent_viscosity)")
	}
	if !(m.Conc > 0) || math.IsInf(m.Conc, 1) {
		return fmt.Errorf("the diffusion prefactor needs the number concentration of solute molecules (m^-3), positive and finite, got %g", m.Conc)
	}
	return nil
}

// Solution returns the solution driving force of the model, if it has one.
func (md *Model) Solution() (cnt.Solution, bool) {
	s, ok := md.m.Driving.(cnt.Solution)
	return s, ok
}

// Induction is what a held solution does at one temperature: the
// mononuclear induction time, the waiting time for the first nucleus in
// the vessel,
//
//	t_mono = 1/(J·V)
//
// and the polynuclear time, for many nuclei growing at u until the
// fraction X of the final crystal volume has formed (JMAK, Continuous),
//
//	t_poly = [3·(−ln(1 − X))/(π·J·u³)]^(1/4)
//
// Kashchiev and van Rosmalen (2003) §6, induction time (from memory). The
// slower of the two is what an experiment sees first as crystals: in a small
// vessel the wait for one nucleus dominates, in a large one the growth of many.
type Induction struct {
	State  State
	LnMono float64 // ln t_mono, s; +Inf: no nucleation
	LnPoly float64 // ln t_poly, s; +Inf: never; NaN: no growth rate
	// Poly reports whether the polynuclear time is the longer one (dominates).
	Poly bool
}

// Mono is t_mono, s (+Inf: never).
func (in Induction) Mono() float64 { return math.Exp(in.LnMono) }

// PolyTime is t_poly, s (+Inf: never; NaN: no growth rate).
func (in Induction) PolyTime() float64 { return math.Exp(in.LnPoly) }

// Time is the longer, dominating time, s.
func (in Induction) Time() float64 {
	if in.Poly {
		return in.PolyTime()
	}
	return in.Mono()
}

// InductionAt evaluates the induction times of a volume V (m³, > 0) held
// at T (K) until the fraction X (0 < X < 1). lnU is ln of the growth rate
// to use (m/s), or NaN for the model's own u(T). It panics on V ≤ 0 or X
// outside (0, 1) (a programming mistake: callers check their flags).
// Special cases: no driving force or no mobility gives +Inf times; no rate
// model gives NaN.
func (md *Model) InductionAt(T, V, X, lnU float64) Induction {
	if !(V > 0) || !(X > 0 && X < 1) {
		panic("kinetics: InductionAt: need V > 0 and 0 < X < 1")
	}
	s := md.At(T)
	in := Induction{State: s, LnMono: -s.LnJ - math.Log(V), LnPoly: math.NaN()}
	if math.IsNaN(lnU) {
		lnU = md.lnGrowth(s)
	}
	if !(s.Dmu > 0) {
		lnU = math.Inf(-1)
	}
	if !math.IsNaN(lnU) && !math.IsNaN(s.LnJ) {
		in.LnPoly = Continuous(s.LnJ, lnU).LnTime(X)
	}
	in.Poly = in.LnPoly > in.LnMono
	return in
}
