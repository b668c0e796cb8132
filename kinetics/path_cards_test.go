package kinetics_test

import (
	"math"
	"testing"

	"undercool/kinetics"
	"undercool/presets"
)

// TestSparseCurveSamePath: the same 1 K/s cooling of the Vit1 card from
// 936 K to 600 K given as 2, 11 and 101 points, and as a linear rate from
// T_e (937 K, 1 K above the curve's start, where nothing nucleates), gives
// the same fraction, the same point where X = 1e-7 is reached and the same
// onset in 1 mm³. Tolerance 1e-4 relative on the fraction and the expected
// nuclei (the aim for a measured curve), 0.01 K on the crossings. A curve
// between its points is straight in T(t), so these are one path.
func TestSparseCurveSamePath(t *testing.T) {
	md := shippedModel(t, "vit1")
	c, err := md.LinearCooling(600)
	if err != nil {
		t.Fatal(err)
	}
	want := c.Fraction(1)
	reach := c.Reach(1, 1e-7)
	onset := c.Onset(1e-9, 1)
	for _, n := range []int{1, 10, 100} {
		p := kinetics.LinearPath(936, 600, 1, n)
		r, s, err := md.AlongPath(p, 1e-7)
		if err != nil {
			t.Fatal(err)
		}
		if d := r.Fraction/want - 1; !(math.Abs(d) <= 1e-4) {
			t.Errorf("%d points: fraction %.8g, linear rate %.8g (%+.2g)", n+1, r.Fraction, want, d)
		}
		if r.Reached != reach.Reached || (r.Reached && math.Abs(r.TempReached-reach.Temp) > 0.01) {
			t.Errorf("%d points: X = 1e-7 reached %v at %.4f K, linear rate %v at %.4f K", n+1, r.Reached, r.TempReached, reach.Reached, reach.Temp)
		}
		o := kinetics.OnsetAlong(p, s, 1e-9)
		if o.Reached != onset.Reached || math.Abs(o.Temp-onset.Temp) > 0.01 || !(math.Abs(o.LnExpected-onset.LnExpected) <= 1e-4) {
			t.Errorf("%d points: onset %v at %.4f K (ln N %.6f), linear rate %v at %.4f K (ln N %.6f)", n+1, o.Reached, o.Temp, o.LnExpected, onset.Reached, onset.Temp, onset.LnExpected)
		}
		t.Logf("%3d points: fraction %.10g (%+.2g), X = 1e-7 at %.5f K, onset at %.5f K", n+1, r.Fraction, r.Fraction/want-1, r.TempReached, o.Temp)
	}
}

// TestFractionNeverFalls: a longer path can never transform less. The
// demo alloy cooled at 1 K/s and at its critical rate to its automatic end
// (where the rest adds 1e-6 of the extended volume) and to ever colder
// given ends: the fraction never falls, and ending at 300 K gives at least
// the fraction of the automatic end.
func TestFractionNeverFalls(t *testing.T) {
	md := shippedModel(t, "demo-alloy")
	auto, err := md.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	for _, q := range []float64{1, auto.CriticalRate(1e-6)} {
		prev, prevEnd := auto.Fraction(q), auto.End
		for _, end := range []float64{540, 500, 400, 300, 200, 100, 50} {
			c, err := md.LinearCooling(end)
			if err != nil {
				t.Fatal(err)
			}
			if X := c.Fraction(q); X < prev {
				t.Errorf("q = %.4g K/s: ending at %g K gives %.10g, less than %.10g ending at %.2f K", q, end, X, prev, prevEnd)
			} else {
				prev, prevEnd = X, end
			}
		}
	}
}

// wlfSucrose is the sucrose card with its WLF constant C1 replaced: a
// mobility law taken far outside its range, so that the growth speed spans
// hundreds of decades along the path (u reaches 1e123 m/s with C1 = 200,
// passes the float64 range with 1000).
func wlfSucrose(t *testing.T, c1 string) *kinetics.Model {
	t.Helper()
	c, err := presets.Preset("sucrose")
	if err != nil {
		t.Fatal(err)
	}
	if err := c.Set("wlf_c1", c1, "a value far outside the law's range, for the test"); err != nil {
		t.Fatal(err)
	}
	md, err := c.Model()
	if err != nil {
		t.Fatal(err)
	}
	return md
}

// TestGrowthBeyondRange: the integrator carries the growth speed by its
// logarithm. With C1 = 200 the extended volume of linear cooling (1e290
// and more at 1 K/s) matches the Gauss–Kronrod reference, which works in
// SI, to 1e-6 (the stated tolerance); with C1 = 1000 the speed passes
// 1e308 m/s, the reference overflows, and the extended volume is still a
// finite logarithm (larger than at 200); with C1 = 3000 the speed where
// nucleation counts lies more than e^745 below the speed near T_e, the
// normalized sums cannot hold it, and the answer is NaN (a failed
// computation for the command), never the "nothing transforms" of an
// underflow.
func TestGrowthBeyondRange(t *testing.T) {
	md := wlfSucrose(t, "200")
	c, err := md.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	ref := kinetics.RefCoolingLnXext(md, c.End, 1e-10)
	if d := math.Expm1(c.LnXextUnit() - ref); !(math.Abs(d) <= 1e-6) {
		t.Errorf("C1 = 200: ln Xext %.10g, reference %.10g (%+.2g)", c.LnXextUnit(), ref, d)
	}
	big := wlfSucrose(t, "1000")
	cb, err := big.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	if x := cb.LnXextUnit(); math.IsNaN(x) || math.IsInf(x, 0) || !(x > c.LnXextUnit()) {
		t.Errorf("C1 = 1000: ln Xext %g, want finite and above %g (C1 = 200)", x, c.LnXextUnit())
	}
	lost := wlfSucrose(t, "3000")
	cl, err := lost.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	if x := cl.LnXextUnit(); !math.IsNaN(x) {
		t.Errorf("C1 = 3000: ln Xext %g, want NaN (the growth underflows where nucleation counts)", x)
	}
	t.Logf("ln Xext at 1 K/s: C1 = 200 %.6g (reference %.6g), 1000 %.6g", c.LnXextUnit(), ref, cb.LnXextUnit())
}
