// Package bracket holds the one-dimensional searches of the project, once:
// a bracketing minimizer and a bracketing root finder, both after Brent.
// gonum has neither; every package under kinetics that needs one uses these.
//
// Brent R.P., Algorithms for Minimization without Derivatives, Prentice-Hall
// (1973), ch. 4 (zero) and ch. 5 (localmin).
package bracket

import (
	"errors"
	"math"
)

var (
	// ErrNoBracket is returned by Root when f does not change sign on the interval.
	ErrNoBracket = errors.New("bracket: the function does not change sign on the interval")
	// ErrNoConvergence is returned when a search runs out of its iteration budget.
	ErrNoConvergence = errors.New("bracket: search did not converge")
	// ErrNotFinite is returned by Root when f is NaN on the interval.
	ErrNotFinite = errors.New("bracket: the function is NaN on the interval")
)

const (
	maxSearchIter = 200
	cGold         = 0.3819660112501051 // (3 − √5)/2, the golden-section fraction
	sqrtEps       = 1.4901161193847656e-08
	machEps       = 2.220446049250313e-16
)

func checkInterval(name string, lo, hi, tol float64) {
	if !(lo < hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		panic("bracket: " + name + ": need finite lo < hi")
	}
	if !(tol > 0) {
		panic("bracket: " + name + ": need tol > 0")
	}
}

// Minimize finds a local minimum of f on [lo, hi] by Brent's method,
// golden-section steps safeguarding parabolic interpolation. It returns x
// and f(x), with x within tol (plus 1.5e-8·|x|, below which f cannot resolve
// a minimum) of a local minimizer of f in [lo, hi]. If f decreases towards
// an end, x lies within that distance of the end.
//
// f may return +Inf, and NaN is taken as +Inf, but a stretch of +Inf that
// covers the first trial point lo + 0.382·(hi − lo) hides the minimum; use
// MinimizeScan for such a function. A unimodal f costs of the order of
// log(1/tol) evaluations (about 20 to go from a 100 K interval to 0.01 K);
// the budget is 200 iterations, then ErrNoConvergence.
//
// Brent (1973) ch. 5, procedure localmin. It panics unless lo < hi are
// finite and tol > 0.
func Minimize(f func(float64) float64, lo, hi, tol float64) (x, fx float64, err error) {
	checkInterval("Minimize", lo, hi, tol)
	g := func(x float64) float64 {
		y := f(x)
		if math.IsNaN(y) {
			return math.Inf(1)
		}
		return y
	}
	a, b := lo, hi
	x = a + cGold*(b-a)
	w, v := x, x
	fx = g(x)
	fw, fv := fx, fx
	var d, e float64
	for range maxSearchIter {
		m := 0.5 * (a + b)
		tol1 := sqrtEps*math.Abs(x) + tol/2
		tol2 := 2 * tol1
		if math.Abs(x-m) <= tol2-0.5*(b-a) {
			return x, fx, nil
		}
		var p, q, r float64
		if math.Abs(e) > tol1 {
			r = (x - w) * (fx - fv)
			q = (x - v) * (fx - fw)
			p = (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				p = -p
			} else {
				q = -q
			}
			r, e = e, d
		}
		var u float64
		if math.Abs(p) < math.Abs(0.5*q*r) && p > q*(a-x) && p < q*(b-x) {
			// Parabolic step.
			d = p / q
			u = x + d
			if u-a < tol2 || b-u < tol2 {
				d = math.Copysign(tol1, m-x)
			}
		} else {
			// Golden-section step into the larger part.
			if x < m {
				e = b - x
			} else {
				e = a - x
			}
			d = cGold * e
		}
		if math.Abs(d) >= tol1 {
			u = x + d
		} else {
			u = x + math.Copysign(tol1, d)
		}
		fu := g(u)
		if fu <= fx {
			if u < x {
				b = x
			} else {
				a = x
			}
			v, fv = w, fw
			w, fw = x, fx
			x, fx = u, fu
		} else {
			if u < x {
				a = u
			} else {
				b = u
			}
			switch {
			case fu <= fw || w == x:
				v, fv = w, fw
				w, fw = u, fu
			case fu <= fv || v == x || v == w:
				v, fv = u, fu
			}
		}
	}
	return x, fx, ErrNoConvergence
}

// MinimizeScan finds the lowest local minimum it can see of f on [lo, hi]:
// it evaluates f at n ≥ 3 evenly spaced points, ends included, and refines
// the lowest with Minimize on the interval between its two neighbours.
// The scan guards against a function with more than one dip; the answer
// comes from Minimize, not from the scan. It costs n evaluations plus
// those of Minimize. If every scanned value is +Inf or NaN, it returns
// x = NaN and fx = +Inf with a nil error: f has no finite value there.
// It panics under the conditions of Minimize or if n < 3.
func MinimizeScan(f func(float64) float64, lo, hi float64, n int, tol float64) (x, fx float64, err error) {
	checkInterval("MinimizeScan", lo, hi, tol)
	if n < 3 {
		panic("bracket: MinimizeScan: need n >= 3")
	}
	best, fbest := -1, math.Inf(1)
	step := (hi - lo) / float64(n-1)
	at := func(i int) float64 {
		if i == n-1 {
			return hi
		}
		return lo + float64(i)*step
	}
	for i := range n {
		if y := f(at(i)); y < fbest {
			best, fbest = i, y
		}
	}
	if best < 0 {
		return math.NaN(), math.Inf(1), nil
	}
	a, b := at(max(best-1, 0)), at(min(best+1, n-1))
	x, fx, err = Minimize(f, a, b, tol)
	if fbest < fx {
		// Minimize stays within tol of a minimizer of the bracket; a grid
		// point can only win if the bracket holds a flat-bottomed or
		// non-smooth dip. Keep the lower value.
		return at(best), fbest, err
	}
	return x, fx, err
}

// Root finds x in [lo, hi] where f changes sign, by Brent's method
// (bisection safeguarding inverse quadratic interpolation), to within tol
// (plus 4.4e-16·|x|). f(lo) and f(hi) must have opposite signs or one be
// zero, else ErrNoBracket; a NaN value gives ErrNotFinite. f may return
// ±Inf (as a logarithm does where a quantity vanishes): such steps fall back
// to bisection. The budget is 200 iterations, then ErrNoConvergence.
//
// Brent (1973) ch. 4, procedure zero. It panics unless lo < hi are finite
// and tol > 0.
func Root(f func(float64) float64, lo, hi, tol float64) (float64, error) {
	checkInterval("Root", lo, hi, tol)
	a, b := lo, hi
	fa, fb := f(a), f(b)
	switch {
	case math.IsNaN(fa) || math.IsNaN(fb):
		return math.NaN(), ErrNotFinite
	case fa == 0:
		return a, nil
	case fb == 0:
		return b, nil
	case (fa > 0) == (fb > 0):
		return math.NaN(), ErrNoBracket
	}
	c, fc := a, fa
	d := b - a
	e := d
	finite := func(xs ...float64) bool {
		for _, x := range xs {
			if math.IsInf(x, 0) {
				return false
			}
		}
		return true
	}
	for range maxSearchIter {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*machEps*math.Abs(b) + tol/2
		xm := 0.5 * (c - b)
		if math.Abs(xm) <= tol1 || fb == 0 {
			return b, nil
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) && finite(fa, fb, fc) {
			s := fb / fa
			var p, q float64
			if a == c {
				// Secant step.
				p = 2 * xm * s
				q = 1 - s
			} else {
				// Inverse quadratic interpolation.
				q = fa / fc
				r := fb / fc
				p = s * (2*xm*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < math.Min(3*xm*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e, d = d, p/q
			} else {
				d, e = xm, xm
			}
		} else {
			d, e = xm, xm
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else {
			b += math.Copysign(tol1, xm)
		}
		fb = f(b)
		if math.IsNaN(fb) {
			return math.NaN(), ErrNotFinite
		}
	}
	return b, ErrNoConvergence
}
