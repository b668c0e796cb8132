package fit

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
)

// InductionFit is the interfacial energy γ and the apparent prefactor A
// fitted to induction times of supersaturated solutions, taken as
// mononuclear, t_ind = 1/(J·V), with the apparent rate J = A·exp(−B/ln²S):
//
//	ln t_ind = −ln(A·V) + β·x,   x = 1/(T³·ln²S),   β = 16π·f·γ³·v²/(3·k_B³)
//
// a straight line (LineFit) whose slope gives
//
//	γ = [3·k_B³·β/(16π·f·v²)]^(1/3)
//
// and whose intercept gives A = exp(−intercept)/V. Mullin J.W.,
// Crystallization, 4th ed. (2001), §5.3 (from memory); Granberg et al.,
// Chem. Eng. Sci. 56 (2001) 2305, use this plot for paracetamol.
//
// Intervals: γ is a monotone function of the slope, so its 95 % interval is
// that of the slope mapped through the cube root (a slope interval reaching
// below zero gives a lower bound of 0); SE(γ) = γ·SE(β)/(3β) to first order.
// The interval of A is the exponent of that of ln A, so it is not symmetric.
type InductionFit struct {
	Line             *LineFit      // ln t_ind (s) against 1/(T³·ln²S) (K⁻³)
	X                []float64     // the abscissae 1/(T³·ln²S), K⁻³
	Slope            float64       // β, K³
	Gamma, GammaSE   float64       // J/m²
	GammaCI          [2]float64    // 95 % interval, J/m²
	LnA, LnASE       float64       // ln A, A in m⁻³·s⁻¹; NaN without a volume
	A                float64       // apparent prefactor, m⁻³·s⁻¹ (NaN without a volume)
	ACI              [2]float64    // 95 % interval of A
	LnAV             float64       // ln(A·V), A·V in s⁻¹: −intercept
	MinSize, MaxSize float64       // n* over the data with the fitted γ, molecules
	Flags            kinetics.Flag // small-nucleus and low-barrier flags over the data
}

// Induction fits γ and A to induction times t (s) measured at
// temperatures T (K) and supersaturations S, for a crystal of molecular
// volume v (m³), shape factor f (1 for homogeneous) and vessel volume V
// (m³; 0 when unknown: A is then not given, only A·V), with optional
// relative weights w on ln t (nil: equal). It returns a
// *kinetics.PointError for a temperature or time that is not positive and finite or
// an S ≤ 1 (no driving force: no induction time to fit), ErrFewPoints for
// fewer than two points, ErrSameX when every point has the same
// 1/(T³·ln²S), and an error when the times do not grow as S falls (slope
// ≤ 0: no interfacial energy).
func Induction(T, S, t, w []float64, v, f, V float64) (*InductionFit, error) {
	if len(T) != len(S) || len(T) != len(t) || (w != nil && len(w) != len(T)) {
		panic("fit: Induction: slices differ in length")
	}
	if !(v > 0) || !(f > 0 && f <= 1) || !(V >= 0) {
		panic("fit: Induction: need v > 0, 0 < f ≤ 1 and V ≥ 0")
	}
	x := make([]float64, len(T))
	y := make([]float64, len(T))
	for i := range T {
		switch {
		case !(T[i] > 0) || math.IsInf(T[i], 1):
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("temperature must be above absolute zero, got %g K", T[i])}
		case !(S[i] > 1) || math.IsInf(S[i], 1):
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("supersaturation must be above 1 (S <= 1 is no driving force, no nucleation), got %g", S[i])}
		case !(t[i] > 0) || math.IsInf(t[i], 1):
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("induction time must be positive and finite, got %g s", t[i])}
		}
		ls := math.Log(S[i])
		x[i] = 1 / (T[i] * T[i] * T[i] * ls * ls)
		y[i] = math.Log(t[i])
	}
	line, err := Line(x, y, w)
	if err != nil {
		return nil, err
	}
	if !(line.Slope > 0) {
		return nil, fmt.Errorf("the induction times do not grow as the supersaturation falls (slope %.4g K^3 of ln t against 1/(T^3 ln^2 S) is not positive): no interfacial energy fits", line.Slope)
	}
	k := cnt.Boltzmann
	c := 3 * k * k * k / (16 * math.Pi * f * v * v) // γ³ = c·β
	gamma := func(beta float64) float64 {
		if !(beta > 0) {
			return 0
		}
		return math.Cbrt(c * beta)
	}
	fit := &InductionFit{Line: line, X: x, Slope: line.Slope, Gamma: gamma(line.Slope), LnAV: -line.Intercept}
	fit.GammaSE = fit.Gamma * line.SlopeSE / (3 * line.Slope)
	ci := line.SlopeCI()
	fit.GammaCI = [2]float64{gamma(ci[0]), gamma(ci[1])}
	if math.IsNaN(ci[0]) {
		fit.GammaCI = [2]float64{math.NaN(), math.NaN()}
	}
	nan := math.NaN()
	fit.LnA, fit.LnASE, fit.A, fit.ACI = nan, nan, nan, [2]float64{nan, nan}
	if V > 0 {
		fit.LnA = -line.Intercept - math.Log(V)
		fit.LnASE = line.InterceptSE
		fit.A = math.Exp(fit.LnA)
		ici := line.InterceptCI()
		fit.ACI = [2]float64{math.Exp(-ici[1] - math.Log(V)), math.Exp(-ici[0] - math.Log(V))}
	}
	fit.MinSize, fit.MaxSize = math.Inf(1), 0
	for i := range T {
		kT := k * T[i]
		n := cnt.Critical(kT*math.Log(S[i]), fit.Gamma, v, f, T[i])
		fit.MinSize = math.Min(fit.MinSize, n.Size)
		fit.MaxSize = math.Max(fit.MaxSize, n.Size)
		if n.Size < kinetics.SmallNucleus {
			fit.Flags |= kinetics.FlagSmallNucleus
		}
		if n.Barrier < kinetics.LowBarrier*kT {
			fit.Flags |= kinetics.FlagLowBarrier
		}
	}
	return fit, nil
}
