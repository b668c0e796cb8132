package kinetics

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/integrate/quad"

	"undercool/cnt"
)

// lnMeanE returns ln E(x) with E(x) = (eˣ − 1)/x, E(0) = 1: the integral of
// exp(a + x·s/h) over s in [0, h] is exp(a)·h·E(x). It never overflows.
func lnMeanE(x float64) float64 {
	switch {
	case math.Abs(x) < 1e-8:
		return x / 2
	case x > 0:
		return x + math.Log(-math.Expm1(-x)/x)
	default:
		return math.Log(math.Expm1(x) / x)
	}
}

// centroid is the mean position, as a fraction of the interval, of
// exp(x·s) on s in [0, 1]: 1/(1 − e^(−x)) − 1/x, 1/2 at x = 0.
func centroid(x float64) float64 {
	if math.Abs(x) < 1e-4 {
		return 0.5 + x/12
	}
	return -1/math.Expm1(-x) - 1/x
}

// interval is the reference form of one step of accum.step, written
// in logarithms: it gives, for interval [t_i, t_{i+1}] with ln J linear in time
// between its ends a and b, the logarithm of its nuclei ∫J dt and the
// J-weighted mean position in it (fraction of the step).
func interval(a, b, h float64) (lnW, pos float64) {
	switch {
	case math.IsInf(a, -1) && math.IsInf(b, -1):
		return math.Inf(-1), 0.5
	case math.IsInf(a, -1):
		a = b - negligibleDrop
	case math.IsInf(b, -1):
		b = a - negligibleDrop
	}
	x := b - a
	return a + math.Log(h) + lnMeanE(x), centroid(x)
}

// bruteXext is the O(N²) reference for integrate: the same nuclei per step
// (w_i, ℓ_i) summed directly at every point, with the largest ln w_i
// factored out.
func bruteXext(t, lnJ, u []float64) []float64 {
	n := len(t)
	L := make([]float64, n)
	lnW := make([]float64, n-1)
	ell := make([]float64, n-1)
	for i := 0; i+1 < n; i++ {
		h := t[i+1] - t[i]
		L[i+1] = L[i] + h*(u[i]+u[i+1])/2
		var pos float64
		lnW[i], pos = interval(lnJ[i], lnJ[i+1], h)
		ell[i] = L[i] + pos*(L[i+1]-L[i])
	}
	out := make([]float64, n)
	out[0] = math.Inf(-1)
	for k := 1; k < n; k++ {
		top := math.Inf(-1)
		for i := 0; i < k; i++ {
			top = math.Max(top, lnW[i])
		}
		var sum float64
		for i := 0; i < k; i++ {
			d := L[k] - ell[i]
			sum += math.Exp(lnW[i]-top) * d * d * d
		}
		out[k] = math.Log(4*math.Pi/3) + top + math.Log(sum)
	}
	return out
}

// growthDominated is a path where all nucleation happens in a short burst
// early and is followed by long, fast growth, with uneven steps and ln J
// spanning some 900 decades: the case where fixed-origin moments cancel.
func growthDominated(n int) (t, lnJ, u []float64) {
	t, lnJ, u = make([]float64, n), make([]float64, n), make([]float64, n)
	var tt float64
	for i := range t {
		tt += 0.5 + 0.4*math.Sin(float64(i)*1.7) // uneven steps, 0.1–0.9 s
		t[i] = tt
	}
	for i := range t {
		x := t[i] / t[n-1]
		lnJ[i] = 40 - 2000*(x-0.05)*(x-0.05)/0.001 // a burst at 5 % of the path
		if lnJ[i] < -2000 {
			lnJ[i] = -2000
		}
		u[i] = 1e-6 * (1 + 50*x) // growth keeps rising
	}
	lnJ[0] = math.Inf(-1)
	return t, lnJ, u
}

func TestIntegrateMatchesBruteForce(t *testing.T) {
	for _, tc := range []struct {
		name string
		n    int
		mk   func(int) ([]float64, []float64, []float64)
	}{
		{"growth-dominated", 600, growthDominated},
		{"late nucleation", 400, func(n int) ([]float64, []float64, []float64) {
			tt, lnJ, u := growthDominated(n)
			for i := range lnJ {
				x := float64(i) / float64(n-1)
				lnJ[i] = -300 + 320*x // rises to the end: nuclei near the current length
			}
			return tt, lnJ, u
		}},
	} {
		tt, lnJ, u := tc.mk(tc.n)
		got := integrate(tt, lnJ, u, nil).LnXext
		want := bruteXext(tt, lnJ, u)
		for i := range got {
			if math.IsInf(want[i], -1) {
				if !math.IsInf(got[i], -1) {
					t.Errorf("%s: point %d: got %g, want -Inf", tc.name, i, got[i])
				}
				continue
			}
			// Both sum the same non-negative terms in another order: agreement
			// to a few ulps of the logarithm's argument.
			if !scalar.EqualWithinAbsOrRel(got[i], want[i], 1e-11, 1e-11) {
				t.Errorf("%s: point %d: ln Xext = %.15g, brute force %.15g", tc.name, i, got[i], want[i])
			}
		}
	}
}

// TestFixedOriginCancels shows why the moments are re-centred: nuclei born
// in the last steps, after the crystals have grown 10¹⁰ times further than
// they will grow now. Expanding the cube about L = 0 loses every digit;
// integrate keeps them.
func TestFixedOriginCancels(t *testing.T) {
	n := 400
	tt, _, u := growthDominated(n)
	u[n-3], u[n-2], u[n-1] = 1e-13, 1e-13, 1e-13
	lnJ := make([]float64, n)
	for i := range lnJ {
		lnJ[i] = -math.Inf(1)
		if i == n-3 {
			lnJ[i] = 0
		}
		if i == n-2 {
			lnJ[i] = 0
		}
	}
	want := bruteXext(tt, lnJ, u)[n-1]
	got := integrate(tt, lnJ, u, nil).LnXext[n-1]
	// The brute force subtracts lengths 10¹⁰ times larger than their
	// difference, so it is itself good to about 1e-6 here.
	if !scalar.EqualWithinAbs(got, want, 1e-6) {
		t.Fatalf("re-centred moments: %g, brute force %g", got, want)
	}
	// fixed origin: Σw(L−ℓ)³ = L³M0 − 3L²M1 + 3LM2 − M3
	var L float64
	var M [4]float64
	for i := 0; i+1 < n; i++ {
		h := tt[i+1] - tt[i]
		L1 := L + h*(u[i]+u[i+1])/2
		lnW, pos := interval(lnJ[i], lnJ[i+1], h)
		w := math.Exp(lnW)
		ell := L + pos*(L1-L)
		M[0] += w
		M[1] += w * ell
		M[2] += w * ell * ell
		M[3] += w * ell * ell * ell
		L = L1
	}
	naive := L*L*L*M[0] - 3*L*L*M[1] + 3*L*M[2] - M[3]
	exact := math.Exp(want) / (4 * math.Pi / 3)
	if math.Abs(naive-exact) < 0.5*exact {
		t.Errorf("fixed-origin expansion gave %g against %g: the test no longer shows the cancellation", naive, exact)
	}
}

func TestLnMeanEAndCentroid(t *testing.T) {
	for _, x := range []float64{-800, -50, -1, -1e-3, -1e-9, 0, 1e-9, 1e-3, 1, 50, 800} {
		var want, wantC float64
		if math.Abs(x) < 1e-6 {
			want, wantC = x/2, 0.5+x/12
		} else if x > 0 {
			// (e^x − 1)/x in logs; mean of s·e^(xs) on [0,1]
			want = x + math.Log((1-math.Exp(-x))/x)
			wantC = 1/(1-math.Exp(-x)) - 1/x
		} else {
			want = math.Log((math.Exp(x) - 1) / x)
			wantC = 1/(1-math.Exp(-x)) - 1/x
		}
		if got := lnMeanE(x); !scalar.EqualWithinAbsOrRel(got, want, 1e-12, 1e-12) || math.IsInf(got, 0) {
			t.Errorf("lnMeanE(%g) = %g, want %g", x, got, want)
		}
		if got := centroid(x); !scalar.EqualWithinAbsOrRel(got, wantC, 1e-9, 1e-9) || !(got >= 0 && got <= 1) {
			t.Errorf("centroid(%g) = %g, want %g", x, got, wantC)
		}
	}
}

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

// TestLinearPathEqualsRate: a linear curve integrated point by point as a
// measured path gives the fraction of the rate computation.
func TestLinearPathEqualsRate(t *testing.T) {
	md := testModel(t)
	c, err := md.LinearCooling(500)
	if err != nil {
		t.Fatal(err)
	}
	for _, q := range []float64{c.CriticalRate(0.5) / 3, c.CriticalRate(1e-6) / 2} {
		p := LinearPath(1200, 500, q, 20000)
		r, _, err := md.AlongPath(p, 1e-6)
		if err != nil {
			t.Fatal(err)
		}
		want := c.LnXextUnit() - 4*math.Log(q)
		// The even 0.035 K steps of the path against the refined grid:
		// the extended volume agrees to 0.1 %.
		if !scalar.EqualWithinAbs(r.LnXext, want, 1e-3) {
			t.Errorf("q = %.4g K/s: path ln Xext = %.6f, rate %.6f", q, r.LnXext, want)
		}
		if !scalar.EqualWithinRel(r.Fraction, c.Fraction(q), 1e-3) {
			t.Errorf("q = %.4g K/s: path fraction %.6g, rate %.6g", q, r.Fraction, c.Fraction(q))
		}
		// Where the fraction is reached: ln Xext grows by only ~0.04 per K
		// there, so the grid's 0.4 % in Xext far from the peak of J moves
		// the crossing by 0.1 K; tolerance 0.25 K.
		pt := c.Reach(q, 1e-6)
		if !pt.Reached || !r.Reached || math.Abs(pt.Temp-r.TempReached) > 0.25 {
			t.Errorf("q = %.4g K/s: 1e-6 reached at %.3f K on the path, %.3f K by the rate (%v %v)", q, r.TempReached, pt.Temp, r.Reached, pt.Reached)
		}
		on := c.Onset(1e-9, q)
		_, s, _ := md.AlongPath(p, 0.5)
		onp := OnsetAlong(p, s, 1e-9)
		if on.Reached != onp.Reached || math.Abs(on.Temp-onp.Temp) > 0.05 {
			t.Errorf("q = %.4g K/s: onset in 1 mm3 at %.3f K on the path, %.3f K by the rate", q, onp.Temp, on.Temp)
		}
	}
}

// TestCoolingAgainstQuadrature checks the extended volume of linear
// cooling against an independent evaluation of the double integral by
// Gauss–Legendre quadrature (gonum integrate/quad), with ln J scaled by
// its largest value:
//
//	Xext·q⁴ = (4π/3)·∫ J(T')·[G(T_end) − G(T')]³ dT',  G(T) = ∫_T^{T_e} u dT''
func TestCoolingAgainstQuadrature(t *testing.T) {
	md := testModel(t)
	const lo, hi = 500.0, 1200.0
	c, err := md.LinearCooling(lo)
	if err != nil {
		t.Fatal(err)
	}
	top := math.Inf(-1)
	for T := lo; T < hi; T += 0.25 {
		top = math.Max(top, md.LnJ(T))
	}
	const pieces = 400
	leg := quad.Legendre{}
	G := func(T float64) float64 { // ∫_T^{hi} u
		var s float64
		w := (hi - T) / 40
		for k := 0; k < 40; k++ {
			a := T + float64(k)*w
			s += quad.Fixed(func(x float64) float64 { return md.GrowthRate(x) }, a, a+w, 12, leg, 0)
		}
		return s
	}
	gEnd := G(lo)
	var sum float64
	w := (hi - lo) / pieces
	for k := 0; k < pieces; k++ {
		a := lo + float64(k)*w
		sum += quad.Fixed(func(T float64) float64 {
			lnJ := md.LnJ(T)
			if math.IsInf(lnJ, -1) {
				return 0
			}
			d := gEnd - G(T)
			return math.Exp(lnJ-top) * d * d * d
		}, a, a+w, 8, leg, 0)
	}
	want := math.Log(4*math.Pi/3) + top + math.Log(sum)
	// Tolerance: 1 % in the extended volume, 0.25 % in the critical rate.
	if !scalar.EqualWithinAbs(c.LnXextUnit(), want, 0.01) {
		t.Errorf("ln Xext(1 K/s) = %.6f, quadrature %.6f", c.LnXextUnit(), want)
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

// TestTabulatedEqualsDirect: Along interpolates the model on a grid; on a
// measured-looking path (Newtonian cooling, uneven steps) it agrees with
// evaluating the model at every point to 0.1 % in the extended volume and
// in the additivity sum.
func TestTabulatedEqualsDirect(t *testing.T) {
	md := testModel(t)
	const n = 5000
	tm, tp := make([]float64, n), make([]float64, n)
	var tt float64
	for i := range tm {
		tt += 2e-11 * (1 + 0.5*math.Sin(float64(i)))
		tm[i] = tt
		tp[i] = 400 + 850*math.Exp(-tt/1e-8)
	}
	p, err := NewPath(tm, tp)
	if err != nil {
		t.Fatal(err)
	}
	a, err := md.AnalyzeCurve(p, 1e-3, 25)
	if err != nil {
		t.Fatal(err)
	}
	d := md.alongDirect(p)
	if got, want := a.Path.LnXext, d.LnXext[n-1]; !scalar.EqualWithinAbs(got, want, 1e-3) {
		t.Errorf("ln Xext tabulated %.6f, direct %.6f", got, want)
	}
	if got, want := a.Path.LnNuclei, d.LnN[n-1]; !scalar.EqualWithinAbs(got, want, 1e-3) {
		t.Errorf("ln N tabulated %.6f, direct %.6f", got, want)
	}
	c, _ := md.TTTCurve(1e-3)
	q, _ := Quench(p, c, 25)
	if !scalar.EqualWithinRel(a.Additivity.Q, q.Q, 1e-3) {
		t.Errorf("additivity sum tabulated %.6g, direct %.6g", a.Additivity.Q, q.Q)
	}
	if a.Path.Fraction == 0 || a.Additivity.Q == 0 {
		t.Errorf("the test path transforms nothing: %+v", a.Path)
	}
	t.Logf("fraction %.4g, additivity sum %.4g", a.Path.Fraction, a.Additivity.Q)
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
