package fit

import (
	"fmt"
	"math"

	"undercool/kinetics"
)

// AvramiFit is the isothermal transformed fraction X(t) = 1 − exp(−k·tⁿ)
// fitted as a straight line of ln(−ln(1−X)) against ln t:
//
//	ln(−ln(1 − X)) = ln k + n·ln t
//
// so n is the slope and k = exp(intercept), in s⁻ⁿ. The time to reach a
// fraction X is t_X = [−ln(1−X)/k]^(1/n).
// Avrami M., J. Chem. Phys. 7 (1939) 1103, 8 (1940) 212, 9 (1941) 177;
// Christian J.W., The Theory of Transformations in Metals and Alloys (2002) §4.
type AvramiFit struct {
	Line       *LineFit   // ln(−ln(1−X)) against ln(t/s), over the points used
	N, NSE     float64    // Avrami exponent and its standard error
	NCI        [2]float64 // 95 % interval of n
	LnK, LnKSE float64    // ln(k/s⁻ⁿ) and its standard error
	K          float64    // rate constant, s⁻ⁿ
	KCI        [2]float64 // 95 % interval of k
	Used       []int      // indices of the points in the fit
	Skipped    []int      // indices of the points left out: X ≤ 0 or X ≥ 1
}

// Avrami fits the Avrami law to times t (s) and transformed fractions X,
// with optional relative weights w (nil: equal) on the linearized points.
// Points with X ≤ 0 or X ≥ 1 carry no information on the straight line and
// are left out (listed in Skipped). It returns a *kinetics.PointError for a time of
// a used point that is not positive and finite, ErrFewPoints when fewer than
// two points are left and ErrSameX when they all share one time.
func Avrami(t, X, w []float64) (*AvramiFit, error) {
	if len(t) != len(X) || (w != nil && len(w) != len(t)) {
		panic("fit: Avrami: slices differ in length")
	}
	f := &AvramiFit{}
	var x, y, ww []float64
	for i := range t {
		if !(X[i] > 0 && X[i] < 1) {
			f.Skipped = append(f.Skipped, i)
			continue
		}
		if !(t[i] > 0) || math.IsInf(t[i], 1) {
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("time must be positive and finite to take its logarithm, got %g s", t[i])}
		}
		f.Used = append(f.Used, i)
		x = append(x, math.Log(t[i]))
		y = append(y, math.Log(-math.Log1p(-X[i])))
		if w != nil {
			ww = append(ww, w[i])
		}
	}
	if len(x) < 2 {
		return nil, fmt.Errorf("an Avrami fit needs at least 2 points with 0 < fraction < 1, got %d", len(x))
	}
	l, err := Line(x, y, ww)
	if err != nil {
		if pe, ok := err.(*kinetics.PointError); ok {
			pe.Index = f.Used[pe.Index]
			return nil, pe
		}
		if err == ErrSameX {
			return nil, fmt.Errorf("all points with 0 < fraction < 1 have the same time: no exponent can be fitted")
		}
		return nil, err
	}
	if !(l.Slope > 0) {
		return nil, fmt.Errorf("the fraction does not grow with time (fitted exponent %.3g): no Avrami law fits", l.Slope)
	}
	f.Line = l
	f.N, f.NSE, f.NCI = l.Slope, l.SlopeSE, l.SlopeCI()
	f.LnK, f.LnKSE = l.Intercept, l.InterceptSE
	f.K = math.Exp(f.LnK)
	ici := l.InterceptCI()
	f.KCI = [2]float64{math.Exp(ici[0]), math.Exp(ici[1])}
	return f, nil
}

// TimeTo is the time (s) at which the fitted law reaches fraction X, 0 < X < 1:
//
//	t_X = [−ln(1 − X)/k]^(1/n)
//
// computed as exp((ln(−ln(1−X)) − ln k)/n). Special case: X outside (0, 1) gives NaN.
func (f *AvramiFit) TimeTo(X float64) float64 {
	if !(X > 0 && X < 1) {
		return math.NaN()
	}
	return math.Exp((math.Log(-math.Log1p(-X)) - f.LnK) / f.N)
}

// TimeToCI is a first-order (delta-method) 95 % interval of TimeTo(X),
// exp(ln t_X ± t·SE(ln t_X)) with SE from LineFit.InverseSE; NaNs when the
// fit is exact or X is outside (0, 1).
func (f *AvramiFit) TimeToCI(X float64) [2]float64 {
	if !(X > 0 && X < 1) || f.Line.Exact() {
		return [2]float64{math.NaN(), math.NaN()}
	}
	y0 := math.Log(-math.Log1p(-X))
	lt := (y0 - f.LnK) / f.N
	d := f.Line.T * f.Line.InverseSE(y0)
	return [2]float64{math.Exp(lt - d), math.Exp(lt + d)}
}

// HalfTime is the time to half transformation, t_½ = (ln 2/k)^(1/n), s.
func (f *AvramiFit) HalfTime() float64 { return f.TimeTo(0.5) }
