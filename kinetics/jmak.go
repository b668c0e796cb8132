package kinetics

import (
	"fmt"
	"math"

	"undercool/cnt"
)

// JMAK chooses how the new phase appears in an isothermal transformation
// in three dimensions (Johnson–Mehl–Avrami–Kolmogorov).
type JMAK struct {
	// Nuclei is the number density of pre-existing nuclei, m⁻³, for site
	// saturation; 0 means continuous nucleation at the steady rate J(T).
	Nuclei float64
	// Lag adds the transient time lag τ(T) of nucleation to the time
	// (continuous nucleation only).
	Lag bool
}

// Check returns an error for a number density that is not positive and
// finite, or for a lag asked with site saturation (pre-existing nuclei need
// no time to form).
func (j JMAK) Check() error {
	if j.Nuclei != 0 && (!(j.Nuclei > 0) || math.IsInf(j.Nuclei, 1)) {
		return fmt.Errorf("the number of nuclei must be positive and finite, got %g per m^3", j.Nuclei)
	}
	if j.Nuclei > 0 && j.Lag {
		return fmt.Errorf("the time lag applies to nucleation; with pre-existing nuclei there is none")
	}
	return nil
}

// Describe names the model in a few words, for output.
func (j JMAK) Describe() string {
	switch {
	case j.Nuclei > 0:
		return fmt.Sprintf("JMAK 3-D, site saturation with %.3g nuclei per m^3 (Avrami exponent 3)", j.Nuclei)
	case j.Lag:
		return "JMAK 3-D, continuous nucleation (Avrami exponent 4), time lag added"
	default:
		return "JMAK 3-D, continuous nucleation (Avrami exponent 4), no time lag"
	}
}

// Avrami is an isothermal transformation law at one temperature in the form
//
//	X(t) = 1 − exp(−K·(t − τ)ⁿ),  t > τ;  X = 0 before τ
//
// with the rate constant K (s⁻ⁿ) carried as ln K so that nothing overflows,
// the Avrami exponent n, and a delay τ (ln τ = −Inf for none).
// Avrami M., J. Chem. Phys. 7 (1939) 1103; 8 (1940) 212.
type Avrami struct {
	LnK   float64 // ln K, K in s⁻ⁿ; −Inf: it never transforms
	N     float64 // Avrami exponent, > 0
	LnLag float64 // ln τ, τ in s; −Inf: no delay
}

// Continuous is the Avrami law for steady nucleation at rate J (m⁻³·s⁻¹)
// of spheres growing at speed u (m/s), from ln J and ln u:
//
//	X(t) = 1 − exp(−(π/3)·J·u³·t⁴)
//
// Johnson W.A., Mehl R.F., Trans. AIME 135 (1939) 416; Porter D.A.,
// Easterling K.E., Sherif M.Y., Phase Transformations in Metals and Alloys,
// 3rd ed. (2009), §5.8.1.
// Special cases: ln J = −Inf or ln u = −Inf gives ln K = −Inf (never).
func Continuous(lnJ, lnU float64) Avrami {
	return Avrami{LnK: math.Log(math.Pi/3) + lnJ + 3*lnU, N: 4, LnLag: math.Inf(-1)}
}

// SiteSaturated is the Avrami law for a number density N (m⁻³) of nuclei
// present from the start, growing as spheres at speed u (m/s):
//
//	X(t) = 1 − exp(−(4π/3)·N·u³·t³)
//
// Christian J.W., The Theory of Transformations in Metals and Alloys (2002), §4.
// Special case: ln u = −Inf gives ln K = −Inf (never).
func SiteSaturated(lnN, lnU float64) Avrami {
	return Avrami{LnK: math.Log(4*math.Pi/3) + lnN + 3*lnU, N: 3, LnLag: math.Inf(-1)}
}

// lnExtent is ln(−ln(1 − X)), the logarithm of the extended volume
// fraction at which the real one is X.
func lnExtent(X float64) float64 { return math.Log(-math.Log1p(-X)) }

// logAddExp is ln(eᵃ + eᵇ) without overflow.
func logAddExp(a, b float64) float64 {
	if a < b {
		a, b = b, a
	}
	if math.IsInf(b, -1) {
		return a
	}
	return a + math.Log1p(math.Exp(b-a))
}

// LnTime is the logarithm of the time (s) at which the fraction X is reached,
//
//	t_X = τ + [−ln(1 − X)/K]^(1/n)
//
// computed from ln K so that a rate of 10⁻³⁰⁰ or 10³⁰⁰ is as good as any.
// Special cases: X outside (0, 1) or NaN gives NaN; ln K = −Inf gives +Inf
// (never); ln K NaN gives NaN.
func (a Avrami) LnTime(X float64) float64 {
	if !(X > 0 && X < 1) || math.IsNaN(a.LnK) {
		return math.NaN()
	}
	if math.IsInf(a.LnK, -1) {
		return math.Inf(1)
	}
	return logAddExp(a.LnLag, (lnExtent(X)-a.LnK)/a.N)
}

// Time is exp(LnTime(X)), s; +Inf for never or beyond the float64 range.
func (a Avrami) Time(X float64) float64 { return math.Exp(a.LnTime(X)) }

// Fraction is X(t), the fraction transformed after t seconds.
// Special cases: t ≤ τ gives 0; NaN t or ln K gives NaN.
func (a Avrami) Fraction(t float64) float64 {
	if math.IsNaN(t) || math.IsNaN(a.LnK) {
		return math.NaN()
	}
	lag := math.Exp(a.LnLag)
	if !(t > lag) {
		return 0
	}
	// K·(t−τ)ⁿ in logs; exp overflows to +Inf, and then X = 1.
	return -math.Expm1(-math.Exp(a.LnK + a.N*math.Log(t-lag)))
}

// lnGrowth is ln u of an evaluated state, computed in logs (Model.state) so
// that a mobility of 10⁻⁴⁰⁰ m²/s gives a finite logarithm rather than u = 0;
// for normal growth
//
//	ln u = ln D − ln λ + ln(1 − exp(−Δμ/k_BT))
//
// −Inf without driving force or mobility, NaN without a growth law.
func (md *Model) lnGrowth(s State) float64 { return s.lnU }

// LnGrowth is ln u(T), u in m/s, computed in logs (no underflow where the
// mobility is tiny): −Inf without driving force or mobility, NaN without a
// mobility law.
func (md *Model) LnGrowth(T float64) float64 { return md.lnGrowth(md.At(T)) }

// Isothermal evaluates the model at T and returns the state and the Avrami
// law of an isothermal hold there. The law has ln K = −Inf where nothing
// transforms (no driving force, no mobility) and NaN where the model cannot
// say (no mobility law; no rate model for continuous nucleation).
// With j.Lag the delay is the time lag θ(T) = 2/(3π·Z²·β*) (see
// cnt.LnTimeLag), the transient treated as a step: no nucleation before θ,
// the steady rate after (which gives the number of nuclei exactly once the
// transient is over).
// It panics if j fails Check.
func (md *Model) Isothermal(T float64, j JMAK) (State, Avrami) {
	if err := j.Check(); err != nil {
		panic("kinetics: Isothermal: " + err.Error())
	}
	s := md.At(T)
	return s, md.avrami(s, j)
}

func (md *Model) avrami(s State, j JMAK) Avrami {
	lnU := md.lnGrowth(s)
	if j.Nuclei > 0 {
		return SiteSaturated(math.Log(j.Nuclei), lnU)
	}
	a := Continuous(s.LnJ, lnU)
	if j.Lag && !math.IsInf(a.LnK, -1) {
		a.LnLag = cnt.LnTimeLag(s.Nucleus.Zeldovich, s.LnBeta) // NaN where β* is not defined
	}
	return a
}
