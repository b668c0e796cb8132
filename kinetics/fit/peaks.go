package fit

import (
	"errors"
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
)

// The two methods of PeakFit.
const (
	Kissinger = "kissinger"
	Ozawa     = "ozawa-flynn-wall"
)

// DoyleSlope is the slope of Doyle's straight-line approximation of the
// temperature integral, ln p(x) ≈ −5.3305 − 1.0516·x with x = E/(RT):
// Doyle's log10 p(x) ≈ −2.315 − 0.4567·x times ln 10. Doyle C.D., J. Appl.
// Polym. Sci. 5 (1961) 285 and 6 (1962) 639 (from memory).
const DoyleSlope = 0.4567 * math.Ln10

// DoyleRange is the range of x = E/(RT) over which Doyle gave his straight
// line (from memory); outside it the Ozawa–Flynn–Wall energy is biased by
// more than a few per cent.
var DoyleRange = [2]float64{20, 60}

// PeakFit is an apparent activation energy E fitted to the temperatures
// Tp at which thermal-analysis scans at constant heating rates β peak
// (the maximum of a DSC or DTA exotherm), by one of two straight lines
// against 1/Tp:
//
//	Kissinger:        ln(β/Tp²) = ln(A·R/E) − E/(R·Tp)
//	Ozawa–Flynn–Wall: ln β      = const − 1.0516·E/(R·Tp)
//
// Kissinger's line is exact for a first-order law dα/dt = A·exp(−E/RT)·(1−α):
// at the peak, β·E/(R·Tp²) = A·exp(−E/(R·Tp)). Kissinger H.E., Reaction
// kinetics in differential thermal analysis, Anal. Chem. 29 (1957) 1702.
// The Ozawa–Flynn–Wall line treats the peak as a point of equal conversion
// at every rate and replaces the temperature integral by Doyle's straight
// line (DoyleSlope), valid for 20 ≤ E/(RT) ≤ 60. Ozawa T., Bull. Chem. Soc.
// Jpn. 38 (1965) 1881; Flynn J.H., Wall L.A., J. Polym. Sci. B 4 (1966) 323
// (from memory). It gives no pre-exponential without a model of the
// conversion, so A, LnA and their spreads are NaN.
//
// For crystallization by nucleation and growth E is apparent: a weighted
// mixture of the temperature dependences of nucleation and of growth over
// the range of the peaks, not the activation energy of diffusion or of
// viscous flow.
type PeakFit struct {
	Method    string        // Kissinger or Ozawa
	Arrhenius *ArrheniusFit // the line: β/Tp² (Kissinger) or β (Ozawa) against Tp, β in K/s
	E, ESE    float64       // apparent activation energy and its standard error, J/mol
	ECI       [2]float64    // 95 % interval of E, J/mol
	// Kissinger only (NaN otherwise): ln(A/s⁻¹), its standard error,
	// A in s⁻¹ and its 95 % interval. ln A = intercept + ln(E/R) depends on
	// both coefficients of the line: its variance is
	// SE(b0)² + SE(b1)²/b1² + 2·cov(b0, b1)/b1 (first order, delta method).
	LnA, LnASE float64
	A          float64
	ACI        [2]float64
	// Reduced is the smallest and largest E/(R·Tp) over the peaks.
	Reduced [2]float64
}

// PeakKissinger fits Kissinger's line to heating rates beta (K/s) and peak
// temperatures Tp (K), with optional relative weights w (nil: equal) on
// the points of the line. PeakOzawa fits the Ozawa–Flynn–Wall line.
// Errors: a *kinetics.PointError for a rate or temperature that is not
// positive and finite, ErrFewPoints for fewer than two points, an error
// when every peak lies at one temperature or when the peaks do not move
// to higher temperatures at faster heating (no positive energy).
func PeakKissinger(beta, Tp, w []float64) (*PeakFit, error) { return peaks(Kissinger, beta, Tp, w) }

// PeakOzawa fits the Ozawa–Flynn–Wall line; see PeakKissinger.
func PeakOzawa(beta, Tp, w []float64) (*PeakFit, error) { return peaks(Ozawa, beta, Tp, w) }

func peaks(method string, beta, Tp, w []float64) (*PeakFit, error) {
	if len(beta) != len(Tp) {
		panic("fit: peaks: slices differ in length")
	}
	y := make([]float64, len(beta))
	for i, b := range beta {
		if !(b > 0) || math.IsInf(b, 1) {
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("heating rate must be positive and finite, got %g K/s", b)}
		}
		if !(Tp[i] > 0) || math.IsInf(Tp[i], 1) {
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("peak temperature must be above absolute zero, got %g K", Tp[i])}
		}
		y[i] = b
		if method == Kissinger {
			y[i] = b / (Tp[i] * Tp[i])
		}
	}
	a, err := Arrhenius(Tp, y, w)
	var pe *kinetics.PointError
	switch {
	case errors.As(err, &pe), errors.Is(err, ErrFewPoints):
		return nil, err
	case err != nil: // Arrhenius's only other error: one temperature
		return nil, errors.New("every peak lies at the same temperature: no energy can be fitted")
	}
	f := &PeakFit{Method: method, Arrhenius: a, E: a.Q, ESE: a.QSE, ECI: a.QCI}
	nan := math.NaN()
	f.LnA, f.LnASE, f.A, f.ACI = nan, nan, nan, [2]float64{nan, nan}
	if method == Ozawa {
		f.E, f.ESE = a.Q/DoyleSlope, a.QSE/DoyleSlope
		f.ECI = [2]float64{a.QCI[0] / DoyleSlope, a.QCI[1] / DoyleSlope}
	}
	if !(f.E > 0) {
		return nil, fmt.Errorf("the peaks do not move to higher temperatures at faster heating (fitted energy %.4g kJ/mol): no activation energy fits", f.E/1e3)
	}
	l := a.Line
	if method == Kissinger {
		b0, b1 := l.Intercept, l.Slope
		f.LnA = b0 + math.Log(-b1)
		f.A = math.Exp(f.LnA)
		if !l.Exact() {
			f.LnASE = math.Sqrt(l.InterceptSE*l.InterceptSE + l.SlopeSE*l.SlopeSE/(b1*b1) + 2*l.Covariance/b1)
			d := l.T * f.LnASE
			f.ACI = [2]float64{math.Exp(f.LnA - d), math.Exp(f.LnA + d)}
		}
	}
	f.Reduced = [2]float64{math.Inf(1), math.Inf(-1)}
	for _, t := range Tp {
		x := f.E / (cnt.Gas * t)
		f.Reduced = [2]float64{math.Min(f.Reduced[0], x), math.Max(f.Reduced[1], x)}
	}
	return f, nil
}

// LnY is the ordinate of the fitted line at a point: ln(β/Tp²) for
// Kissinger, ln β for Ozawa (β in K/s).
func (f *PeakFit) LnY(beta, Tp float64) float64 {
	if f.Method == Kissinger {
		return math.Log(beta / (Tp * Tp))
	}
	return math.Log(beta)
}

// OzawaExponentFit is the Avrami exponent found by Ozawa's method from the
// fractions X transformed at one temperature T in scans at several heating
// rates β:
//
//	1 − X(T) = exp(−K(T)/βᵐ),  so  ln(−ln(1 − X)) = ln K − m·ln β
//
// m is the negative of the slope of the straight line, K = exp(intercept)
// in (K/s)ᵐ. For nucleation and growth at rates that depend on temperature
// only, m is the Avrami exponent of the isothermal law. Ozawa T., Kinetics
// of non-isothermal crystallization, Polymer 12 (1971) 150 (from memory).
type OzawaExponentFit struct {
	Line       *LineFit   // ln(−ln(1−X)) against ln(β/(K/s)), over the points used
	M, MSE     float64    // Ozawa (Avrami) exponent and its standard error
	MCI        [2]float64 // 95 % interval of m
	LnK, LnKSE float64    // ln(K/(K/s)ᵐ) and its standard error
	Used       []int      // indices of the points in the fit
	Skipped    []int      // indices of the points left out: X ≤ 0 or X ≥ 1
}

// OzawaExponent fits Ozawa's line to heating rates beta (K/s) and the
// fractions X reached at one temperature, with optional relative weights
// w (nil: equal). Points with X ≤ 0 or X ≥ 1 are left out. Errors: a
// *kinetics.PointError for a used rate that is not positive and finite,
// an error for fewer than two used points, for one rate only, or when the
// fraction does not fall as the heating rate rises.
func OzawaExponent(beta, X, w []float64) (*OzawaExponentFit, error) {
	if len(beta) != len(X) || (w != nil && len(w) != len(beta)) {
		panic("fit: OzawaExponent: slices differ in length")
	}
	l, used, skipped, err := fractionLine(beta, X, w, fractionAxis{"an Ozawa fit", "heating rate", "K/s"})
	if err != nil {
		return nil, err
	}
	if !(l.Slope < 0) {
		return nil, fmt.Errorf("the fraction does not fall as the heating rate rises (fitted exponent %.3g): no Ozawa law fits", -l.Slope)
	}
	ci := l.SlopeCI()
	return &OzawaExponentFit{Line: l, M: -l.Slope, MSE: l.SlopeSE, MCI: [2]float64{-ci[1], -ci[0]},
		LnK: l.Intercept, LnKSE: l.InterceptSE, Used: used, Skipped: skipped}, nil
}
