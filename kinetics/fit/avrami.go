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
	l, used, skipped, err := fractionLine(t, X, w, fractionAxis{"an Avrami fit", "time", "s"})
	if err != nil {
		return nil, err
	}
	if !(l.Slope > 0) {
		return nil, fmt.Errorf("the fraction does not grow with time (fitted exponent %.3g): no Avrami law fits", l.Slope)
	}
	f := &AvramiFit{Line: l, Used: used, Skipped: skipped}
	f.N, f.NSE, f.NCI = l.Slope, l.SlopeSE, l.SlopeCI()
	f.LnK, f.LnKSE = l.Intercept, l.InterceptSE
	f.K = math.Exp(f.LnK)
	ici := l.InterceptCI()
	f.KCI = [2]float64{math.Exp(ici[0]), math.Exp(ici[1])}
	return f, nil
}

// fractionAxis names the abscissa of a linearized fraction fit in its
// messages: the fit, the quantity and its unit.
type fractionAxis struct{ fit, quantity, unit string }

// fractionLine fits the straight line ln(−ln(1−X)) = a + b·ln v of the
// Avrami and Ozawa plots. Points with X ≤ 0 or X ≥ 1 carry no information
// on it and are left out (skipped); the others are used. It returns a
// *kinetics.PointError for a used v that is not positive and finite, an
// error when fewer than two points are left or they all share one v.
func fractionLine(v, X, w []float64, ax fractionAxis) (l *LineFit, used, skipped []int, err error) {
	var x, y, ww []float64
	for i := range v {
		if !(X[i] > 0 && X[i] < 1) {
			skipped = append(skipped, i)
			continue
		}
		if !(v[i] > 0) || math.IsInf(v[i], 1) {
			return nil, nil, nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("%s must be positive and finite to take its logarithm, got %g %s", ax.quantity, v[i], ax.unit)}
		}
		used = append(used, i)
		x = append(x, math.Log(v[i]))
		y = append(y, math.Log(-math.Log1p(-X[i])))
		if w != nil {
			ww = append(ww, w[i])
		}
	}
	if len(x) < 2 {
		return nil, nil, nil, fmt.Errorf("%s needs at least 2 points with 0 < fraction < 1, got %d", ax.fit, len(x))
	}
	l, err = Line(x, y, ww)
	if err != nil {
		if pe, ok := err.(*kinetics.PointError); ok {
			pe.Index = used[pe.Index]
			return nil, nil, nil, pe
		}
		if err == ErrSameX {
			return nil, nil, nil, fmt.Errorf("all points with 0 < fraction < 1 have the same %s: no exponent can be fitted", ax.quantity)
		}
		return nil, nil, nil, err
	}
	return l, used, skipped, nil
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
