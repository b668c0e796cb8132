package fit

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
)

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

	temps, lnY, w []float64 // the points as fitted, for Straighter
}

// Arrhenius fits y = A·exp(−Q/RT) to temperatures T (K) and positive
// values y, with optional relative weights w (nil: equal) on the points of
// ln y. It returns a *kinetics.PointError for a temperature or value that is not
// positive and finite, ErrFewPoints for fewer than two points and ErrSameX
// when all temperatures are equal. Two points give the exact line and no
// intervals (NaN).
func Arrhenius(T, y, w []float64) (*ArrheniusFit, error) {
	if len(T) != len(y) {
		panic("fit: Arrhenius: slices differ in length")
	}
	x := make([]float64, len(T))
	ly := make([]float64, len(T))
	for i := range T {
		if !(T[i] > 0) || math.IsInf(T[i], 1) {
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("temperature must be above absolute zero, got %g K", T[i])}
		}
		if !(y[i] > 0) || math.IsInf(y[i], 1) {
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("value must be positive and finite to take its logarithm, got %g", y[i])}
		}
		x[i], ly[i] = 1/T[i], math.Log(y[i])
	}
	l, err := Line(x, ly, w)
	if err != nil {
		if err == ErrSameX {
			return nil, fmt.Errorf("all temperatures are the same: an kinetics.Arrhenius fit needs at least two different temperatures")
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
	f.temps, f.lnY, f.w = T, ly, w
	return f, nil
}

// Straighter reports whether the points lie on a much straighter line with
// every temperature shifted by dT kelvin: the sum of squared residuals at
// most a quarter of the one as given, with at least two degrees of freedom
// so that straightness means something (common practice). A shift that
// takes a temperature to or below absolute zero gives false. It is the
// test for a temperature column in the wrong scale (dT = ±273.15 K).
//
// Only the sum of squares of the shifted line matters here, so it is
// streamed, storing nothing: a pass for the sums of the line (the running
// means and co-moments of Welford's update in its weighted form, West
// D.H.D., Commun. ACM 22 (1979) 532), a pass for its residuals.
func (f *ArrheniusFit) Straighter(dT float64) bool {
	if f.Line.DoF < 2 {
		return false
	}
	var sumW, mx, my, sxx, sxy float64
	for i, T := range f.temps {
		if !(T+dT > 0) {
			return false
		}
		x, y, w := 1/(T+dT), f.lnY[i], weight(f.w, i)
		sumW += w
		dx, dy := x-mx, y-my
		mx += w / sumW * dx
		my += w / sumW * dy
		sxx += w * dx * (x - mx)
		sxy += w * dx * (y - my)
	}
	if !(sxx > 0) {
		return false
	}
	slope := sxy / sxx
	var shifted, asGiven float64
	for i, T := range f.temps {
		r, w := f.lnY[i]-(my+slope*(1/(T+dT)-mx)), weight(f.w, i)
		shifted += w * r * r
		asGiven += w * f.Line.Residuals[i] * f.Line.Residuals[i]
	}
	return shifted <= asGiven/4
}

// weight is the weight of point i, 1 without weights.
func weight(w []float64, i int) float64 {
	if w == nil {
		return 1
	}
	return w[i]
}
