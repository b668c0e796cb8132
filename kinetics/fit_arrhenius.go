package kinetics

import (
	"fmt"
	"math"

	"undercool/cnt"
)

// CelsiusOffset is the kelvin value of 0 °C (exact by definition of the scale).
const CelsiusOffset = 273.15

// ColdLimit is the temperature below which a whole Arrhenius data set is
// suspected of being degrees Celsius written as kelvin: diffusion or
// annealing data of a metal all below 250 K is rare (common practice).
const ColdLimit = 250.0 // K

// FitWarning is a remark on the data that does not stop the fit.
type FitWarning struct {
	Key  string // snake_case name, for JSON
	Text string // one sentence
}

// ArrheniusFit is a rate-like quantity y(T) = A·exp(−Q/RT) fitted as a
// straight line of ln y against 1/T:
//
//	ln y = ln A − (Q/R)·(1/T)
//
// so Q = −R·slope and A = exp(intercept). The interval of A is the exponent
// of the interval of ln A, so it is not symmetric about A.
// Arrhenius S., Z. Phys. Chem. 4 (1889) 226; Callister W.D., Materials
// Science and Engineering: An Introduction, §5.5 (Q and D0 from a log D
// against 1/T plot).
type ArrheniusFit struct {
	Line       *LineFit   // ln y against 1/T (1/K)
	Q, QSE     float64    // activation energy and its standard error, J/mol
	QCI        [2]float64 // 95 % interval of Q, J/mol
	LnA, LnASE float64    // ln of the pre-exponential (in the unit of y) and its SE
	A          float64    // pre-exponential, unit of y
	ACI        [2]float64 // 95 % interval of A
	Warnings   []FitWarning
}

// FitArrhenius fits y = A·exp(−Q/RT) to temperatures T (K) and positive
// values y, with optional relative weights w (nil: equal) on the points of
// ln y. It returns a *PointError for a temperature or value that is not
// positive and finite, ErrFewPoints for fewer than two points and ErrSameX
// when all temperatures are equal. Two points give the exact line and no
// intervals (NaN).
func FitArrhenius(T, y, w []float64) (*ArrheniusFit, error) {
	if len(T) != len(y) {
		panic("kinetics: FitArrhenius: slices differ in length")
	}
	x := make([]float64, len(T))
	ly := make([]float64, len(T))
	for i := range T {
		if !(T[i] > 0) || math.IsInf(T[i], 1) {
			return nil, &PointError{i, fmt.Sprintf("temperature must be above absolute zero, got %g K", T[i])}
		}
		if !(y[i] > 0) || math.IsInf(y[i], 1) {
			return nil, &PointError{i, fmt.Sprintf("value must be positive and finite to take its logarithm, got %g", y[i])}
		}
		x[i], ly[i] = 1/T[i], math.Log(y[i])
	}
	l, err := FitLine(x, ly, w)
	if err != nil {
		if err == ErrSameX {
			return nil, fmt.Errorf("all temperatures are the same: an Arrhenius fit needs at least two different temperatures")
		}
		return nil, err
	}
	f := &ArrheniusFit{Line: l}
	f.Q, f.QSE = -cnt.Gas*l.Slope, cnt.Gas*l.SlopeSE
	sci := l.SlopeCI()
	f.QCI = [2]float64{-cnt.Gas * sci[1], -cnt.Gas * sci[0]}
	f.LnA, f.LnASE = l.Intercept, l.InterceptSE
	f.A = math.Exp(f.LnA)
	ici := l.InterceptCI()
	f.ACI = [2]float64{math.Exp(ici[0]), math.Exp(ici[1])}
	f.Warnings = celsiusWarnings(T, ly, w, l)
	return f, nil
}

// celsiusWarnings applies two rules of thumb for a temperature column in
// the wrong scale (common practice): every temperature below ColdLimit, or
// a fit that is much straighter with every temperature shifted by ±273.15 K
// (the sum of squared residuals at most a quarter of the one as given, with
// at least two degrees of freedom so that straightness means something).
func celsiusWarnings(T, ly, w []float64, l *LineFit) []FitWarning {
	var out []FitWarning
	maxT := T[0]
	minT := T[0]
	for _, t := range T {
		maxT = math.Max(maxT, t)
		minT = math.Min(minT, t)
	}
	if maxT < ColdLimit {
		out = append(out, FitWarning{"all_below_250_k", fmt.Sprintf(
			"every temperature is below %g K; if they are degrees Celsius, name the column temperature_c", ColdLimit)})
	}
	if l.DoF < 2 {
		return out
	}
	ssr := sumSquares(l.Residuals, w)
	for _, shift := range []float64{CelsiusOffset, -CelsiusOffset} {
		if minT+shift <= 0 {
			continue
		}
		x := make([]float64, len(T))
		for i, t := range T {
			x[i] = 1 / (t + shift)
		}
		ls, err := FitLine(x, ly, w)
		if err != nil {
			continue
		}
		if sumSquares(ls.Residuals, w) <= ssr/4 {
			what := "the temperatures look like degrees Celsius read as kelvin: the points lie on a much straighter line 273.15 K higher; name the column temperature_c if so"
			key := "straighter_if_celsius"
			if shift < 0 {
				what = "the temperatures look like kelvin read as degrees Celsius: the points lie on a much straighter line 273.15 K lower; name the column temperature_k if so"
				key = "straighter_if_kelvin"
			}
			out = append(out, FitWarning{key, what})
		}
	}
	return out
}

func sumSquares(r, w []float64) float64 {
	var s float64
	for i, ri := range r {
		wi := 1.0
		if w != nil {
			wi = w[i]
		}
		s += wi * ri * ri
	}
	return s
}
