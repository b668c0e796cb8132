package fit

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"

	"undercool/kinetics"
)

// Confidence is the two-sided coverage of every interval the fits report.
const Confidence = 0.95

// ErrFewPoints is returned when a fit has fewer points than parameters.
var ErrFewPoints = errors.New("a straight-line fit needs at least 2 points")

// ErrSameX is returned when every point has the same abscissa, so no slope
// can be found (all temperatures, or all times, equal).
var ErrSameX = errors.New("all points have the same abscissa: no slope can be fitted")

// LineFit is a straight line y = Intercept + Slope·x fitted by (weighted)
// least squares, with the statistics needed for intervals.
//
// Weights are relative (w_i ∝ 1/σ_i²): the scale of the scatter is estimated
// from the residuals, so multiplying every weight by a constant changes
// nothing. With N points and DoF = N − 2,
//
//	s²          = Σ w_i·r_i² / DoF
//	S_xx        = Σ w_i·(x_i − x̄_w)²
//	SE(slope)²  = s² / S_xx
//	SE(icept)²  = s²·(1/Σw + x̄_w²/S_xx)
//	cov         = −s²·x̄_w / S_xx
//
// and 95 % intervals are estimate ± t·SE with t the 0.975 quantile of
// Student's t with DoF degrees of freedom. Draper N.R., Smith H., Applied
// Regression Analysis, 3rd ed., Wiley (1998), §§1.3–1.4 and §9.2 (weighted).
//
// Two points give the exact line: DoF = 0, the standard errors and t are
// NaN and the intervals are not defined (Exact reports it).
type LineFit struct {
	N                    int
	Intercept, Slope     float64
	InterceptSE, SlopeSE float64 // NaN when Exact
	Covariance           float64 // cov(intercept, slope); NaN when Exact
	DoF                  int
	T                    float64   // Student t quantile for the intervals; NaN when Exact
	R2                   float64   // (weighted) coefficient of determination
	ResidualSD           float64   // s; NaN when Exact
	Residuals            []float64 // y_i − (Intercept + Slope·x_i)
	Weighted             bool

	sumW, meanX, sxx float64
}

// Exact reports whether the line passes through its (two) points with
// nothing left to estimate the scatter from.
func (l *LineFit) Exact() bool { return l.DoF == 0 }

// SlopeCI is the 95 % interval of the slope; NaNs when Exact.
func (l *LineFit) SlopeCI() [2]float64 { return ci95(l.Slope, l.SlopeSE, l.T) }

// InterceptCI is the 95 % interval of the intercept; NaNs when Exact.
func (l *LineFit) InterceptCI() [2]float64 { return ci95(l.Intercept, l.InterceptSE, l.T) }

// At is the fitted line at x.
func (l *LineFit) At(x float64) float64 { return l.Intercept + l.Slope*x }

// AtSE is the standard error of the fitted line at x (of the mean
// response, not of a new observation):
//
//	SE(x)² = s²·(1/Σw + (x − x̄_w)²/S_xx)
//
// NaN when Exact.
func (l *LineFit) AtSE(x float64) float64 {
	if l.Exact() {
		return math.NaN()
	}
	d := x - l.meanX
	return l.ResidualSD * math.Sqrt(1/l.sumW+d*d/l.sxx)
}

// InverseSE is the first-order (delta-method) standard error of the
// abscissa x0 at which the line reaches a given ordinate y0,
// x0 = (y0 − Intercept)/Slope:
//
//	SE(x0) ≈ SE_line(x0) / |Slope|
//
// Draper and Smith (1998) §3.2 (inverse prediction), first order. NaN when Exact.
func (l *LineFit) InverseSE(y0 float64) float64 {
	x0 := (y0 - l.Intercept) / l.Slope
	return l.AtSE(x0) / math.Abs(l.Slope)
}

func ci95(v, se, t float64) [2]float64 {
	return [2]float64{v - t*se, v + t*se}
}

// StudentT95 is the two-sided 95 % critical value of Student's t with dof
// degrees of freedom (the 0.975 quantile); NaN for dof < 1.
func StudentT95(dof int) float64 {
	if dof < 1 {
		return math.NaN()
	}
	return distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(dof)}.Quantile(0.5 + Confidence/2)
}

// Line fits y = a + b·x by least squares. w may be nil (equal weights);
// otherwise every weight must be positive and finite. x and y must be
// finite and of equal length (a programming mistake otherwise).
// It returns ErrFewPoints for fewer than two points, ErrSameX when all x
// are equal, and a *kinetics.PointError for a bad weight.
func Line(x, y, w []float64) (*LineFit, error) {
	if len(x) != len(y) || (w != nil && len(w) != len(x)) {
		panic("fit: Line: slices differ in length")
	}
	n := len(x)
	if n < 2 {
		return nil, ErrFewPoints
	}
	for i, wi := range w {
		if !(wi > 0) || math.IsInf(wi, 1) {
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("weight must be positive and finite, got %g", wi)}
		}
	}
	l := &LineFit{N: n, DoF: n - 2, Weighted: w != nil}
	var sumW, sx float64
	for i, xi := range x {
		wi := 1.0
		if w != nil {
			wi = w[i]
		}
		sumW += wi
		sx += wi * xi
	}
	meanX := sx / sumW
	var sxx float64
	for i, xi := range x {
		wi := 1.0
		if w != nil {
			wi = w[i]
		}
		d := xi - meanX
		sxx += wi * d * d
	}
	// A spread below rounding of the mean is no spread at all.
	if !(sxx > 0) || math.Sqrt(sxx/sumW) <= 1e-12*math.Abs(meanX) {
		return nil, ErrSameX
	}
	l.sumW, l.meanX, l.sxx = sumW, meanX, sxx
	l.Intercept, l.Slope = stat.LinearRegression(x, y, w, false)
	l.Residuals = make([]float64, n)
	var ssr float64
	for i, xi := range x {
		r := y[i] - l.At(xi)
		l.Residuals[i] = r
		wi := 1.0
		if w != nil {
			wi = w[i]
		}
		ssr += wi * r * r
	}
	if ssr == 0 {
		l.R2 = 1
	} else {
		l.R2 = stat.RSquared(x, y, w, l.Intercept, l.Slope)
	}
	if l.Exact() {
		nan := math.NaN()
		l.InterceptSE, l.SlopeSE, l.Covariance, l.T, l.ResidualSD = nan, nan, nan, nan, nan
		l.R2 = 1
		return l, nil
	}
	s2 := ssr / float64(l.DoF)
	l.ResidualSD = math.Sqrt(s2)
	l.SlopeSE = math.Sqrt(s2 / sxx)
	l.InterceptSE = math.Sqrt(s2 * (1/sumW + meanX*meanX/sxx))
	l.Covariance = -s2 * meanX / sxx
	l.T = StudentT95(l.DoF)
	return l, nil
}
