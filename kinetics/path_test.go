package kinetics

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"undercool/cnt"
)

// testModel is a metal-like material of our own for the exact checks (not
// a real material): linear driving force, Arrhenius mobility.
func testModel(t testing.TB) *Model {
	md, err := NewModel(Material{
		Name: "test", Driving: cnt.Linear{Te: 1200, DH: 13000},
		Vm: 8e-6, Gamma: 0.12, Mobility: Arrhenius{D0: 1e-7, Q: 60000},
	})
	if err != nil {
		t.Fatal(err)
	}
	return md
}

// TestRateScalingExact: on the same temperatures, a path at rate 10q has
// ln Xext lower by exactly 4·ln 10 and ln N lower by ln 10 at every point.
func TestRateScalingExact(t *testing.T) {
	md := testModel(t)
	p1 := LinearPath(1200, 500, 3, 2000)
	p2 := LinearPath(1200, 500, 30, 2000)
	s1, _ := md.Along(p1)
	s2, _ := md.Along(p2)
	for i := range s1.LnXext {
		if math.IsInf(s1.LnXext[i], -1) {
			continue
		}
		if d := s1.LnXext[i] - s2.LnXext[i]; !scalar.EqualWithinAbs(d, 4*math.Ln10, 1e-9) {
			t.Fatalf("point %d: ln Xext(q) − ln Xext(10q) = %.12g, want 4 ln 10 = %.12g", i, d, 4*math.Ln10)
		}
		if d := s1.LnN[i] - s2.LnN[i]; !scalar.EqualWithinAbs(d, math.Ln10, 1e-9) {
			t.Fatalf("point %d: ln N(q) − ln N(10q) = %.12g, want ln 10", i, d)
		}
	}
	c, err := md.LinearCooling(500)
	if err != nil {
		t.Fatal(err)
	}
	qc := c.CriticalRate(1e-3)
	if X := c.Fraction(qc); !scalar.EqualWithinRel(X, 1e-3, 1e-12) {
		t.Errorf("fraction at the critical rate = %.15g, want 1e-3", X)
	}
	if X := c.Fraction(qc * 2); !scalar.EqualWithinRel(-math.Log1p(-X), -math.Log1p(-1e-3)/16, 1e-12) {
		t.Errorf("fraction at twice the critical rate: extended volume not 1/16 of the target")
	}
}

// TestLinearPathEqualsRate: a linear cooling given as a measured path of
// 2,001 points gives what the rate computation gives. Both integrate the
// same straight path to the tolerance of pathint.go (1e-8 of every piece):
// tolerance 1e-6 on ln Xext and ln N, 1e-4 K on where X = 1e-6 and one
// nucleus in 1 mm³ are reached (ln Xext changes by some 0.04 per K there).
func TestLinearPathEqualsRate(t *testing.T) {
	md := testModel(t)
	c, err := md.LinearCooling(500)
	if err != nil {
		t.Fatal(err)
	}
	for _, q := range []float64{c.CriticalRate(0.5) / 3, c.CriticalRate(1e-6) / 2} {
		p := LinearPath(1200, 500, q, 2000)
		r, s, err := md.AlongPath(p, 1e-6)
		if err != nil {
			t.Fatal(err)
		}
		if want := c.LnXextUnit() - 4*math.Log(q); !scalar.EqualWithinAbs(r.LnXext, want, 1e-6) {
			t.Errorf("q = %.4g K/s: path ln Xext = %.9f, rate %.9f", q, r.LnXext, want)
		}
		pt := c.Reach(q, 1e-6)
		if !pt.Reached || !r.Reached || math.Abs(pt.Temp-r.TempReached) > 1e-4 {
			t.Errorf("q = %.4g K/s: 1e-6 reached at %.6f K on the path, %.6f K by the rate (%v %v)", q, r.TempReached, pt.Temp, r.Reached, pt.Reached)
		}
		on := c.Onset(1e-9, q)
		onp := OnsetAlong(p, s, 1e-9)
		if on.Reached != onp.Reached || math.Abs(on.Temp-onp.Temp) > 1e-4 || !scalar.EqualWithinAbs(on.LnExpected, onp.LnExpected, 1e-6) {
			t.Errorf("q = %.4g K/s: onset in 1 mm3 at %.6f K on the path, %.6f K by the rate", q, onp.Temp, on.Temp)
		}
	}
}

func TestNewPathBad(t *testing.T) {
	for _, tc := range []struct {
		name      string
		time, tmp []float64
		index     int
	}{
		{"time equal", []float64{0, 1, 1}, []float64{900, 800, 700}, 2},
		{"time back", []float64{0, 2, 1}, []float64{900, 800, 700}, 2},
		{"temperature zero", []float64{0, 1, 2}, []float64{900, 0, 700}, 1},
		{"NaN time", []float64{0, math.NaN(), 2}, []float64{900, 800, 700}, 1},
		{"Inf temperature", []float64{0, 1, 2}, []float64{900, 800, math.Inf(1)}, 2},
	} {
		_, err := NewPath(tc.time, tc.tmp)
		var pe *PointError
		if !errors.As(err, &pe) || pe.Index != tc.index {
			t.Errorf("%s: err = %v, want a PointError at index %d", tc.name, err, tc.index)
		}
	}
	if _, err := NewPath([]float64{0}, []float64{900}); err == nil {
		t.Error("one point: no error")
	}
}

func TestNoRateNoGrowth(t *testing.T) {
	md, err := NewModel(Material{Driving: cnt.Linear{Te: 1200, DH: 13000}, Vm: 8e-6, Gamma: 0.12})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := md.LinearCooling(0); !errors.Is(err, ErrNoRate) {
		t.Errorf("no mobility, no prefactor: err = %v, want ErrNoRate", err)
	}
	md2, _ := NewModel(Material{Driving: cnt.Linear{Te: 1200, DH: 13000}, Vm: 8e-6, Gamma: 0.12, Prefactor: PrefactorFixed, J0: 1e40})
	if _, err := md2.LinearCooling(0); !errors.Is(err, ErrNoGrowth) {
		t.Errorf("fixed prefactor, no mobility: err = %v, want ErrNoGrowth", err)
	}
	if _, err := md2.Along(LinearPath(1200, 600, 10, 100)); err != nil {
		t.Errorf("nuclei only: %v", err)
	}
}

// TestNothingNucleates: a path that never goes below T_e gives no nuclei,
// fraction 0, no onset: an answer, not an error.
func TestNothingNucleates(t *testing.T) {
	md := testModel(t)
	p, _ := NewPath([]float64{0, 1, 2}, []float64{1300, 1250, 1200})
	r, s, err := md.AlongPath(p, 0.01)
	if err != nil {
		t.Fatal(err)
	}
	if r.Fraction != 0 || r.Reached || !math.IsInf(r.LnNuclei, -1) {
		t.Errorf("above T_e: %+v", r)
	}
	if o := OnsetAlong(p, s, 1); o.Reached || o.Expected() != 0 {
		t.Errorf("above T_e: onset %+v", o)
	}
}

// TestReachAtCriticalRate: at the critical rate the fraction is reached at
// the end of the path, not "never".
func TestReachAtCriticalRate(t *testing.T) {
	md := testModel(t)
	for _, end := range []float64{0, 600} {
		c, err := md.LinearCooling(end)
		if err != nil {
			t.Fatal(err)
		}
		qc := c.CriticalRate(1e-6)
		p := c.Reach(qc, 1e-6)
		if !p.Reached || math.Abs(p.Temp-c.End) > 1 {
			t.Errorf("end %g: at the critical rate X reached %v at %.2f K, want at the end %.2f K", end, p.Reached, p.Temp, c.End)
		}
		if p := c.Reach(qc*1.01, 1e-6); p.Reached {
			t.Errorf("end %g: 1 %% above the critical rate X is reached at %.2f K", end, p.Temp)
		}
	}
}
