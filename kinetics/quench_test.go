package kinetics

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"undercool/cnt"
)

// esTest are C-curve constants of our own, of the size published for
// aluminium alloys (k1 = ln 0.995 as in Evancho and Staley 1974), used only
// to check the arithmetic. They describe no real alloy.
var esTest = EvanchoStaley{K1: math.Log(0.995), K2: 1e-10, K3: 4000, K4: 760, K5: 130000}

// TestEvanchoStaleyFormula checks C(T) against the formula written out by
// hand at 600 K.
func TestEvanchoStaleyFormula(t *testing.T) {
	const T = 600.0
	R := cnt.Gas
	want := -esTest.K1 * esTest.K2 * math.Exp(esTest.K3*esTest.K4*esTest.K4/(R*T*(esTest.K4-T)*(esTest.K4-T))) * math.Exp(esTest.K5/(R*T))
	if got := esTest.Time(T); !scalar.EqualWithinRel(got, want, 1e-12) {
		t.Errorf("C(600 K) = %g s, want %g s", got, want)
	}
	for _, T := range []float64{760, 800, 0, -5, math.NaN()} {
		if got := esTest.LnInvTime(T); !math.IsInf(got, -1) {
			t.Errorf("ln(1/C(%g K)) = %g, want -Inf (at or above the solvus, or no temperature)", T, got)
		}
	}
}

func TestEvanchoStaleyCheck(t *testing.T) {
	if err := esTest.Check(); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name string
		c    EvanchoStaley
	}{
		{"k1", EvanchoStaley{K1: 0.1, K2: 1, K3: 1, K4: 700, K5: 1}},
		{"k2", EvanchoStaley{K1: -0.005, K2: 0, K3: 1, K4: 700, K5: 1}},
		{"k3", EvanchoStaley{K1: -0.005, K2: 1, K3: math.NaN(), K4: 700, K5: 1}},
		{"k4", EvanchoStaley{K1: -0.005, K2: 1, K3: 1, K4: -700, K5: 1}},
		{"k5", EvanchoStaley{K1: -0.005, K2: 1, K3: 1, K4: 700, K5: math.Inf(1)}},
	} {
		err := tc.c.Check()
		if err == nil || err.Error()[:2] != tc.name {
			t.Errorf("%s bad: err = %v, want it to name %s", tc.name, err, tc.name)
		}
	}
}

// TestQuenchIsothermal: a hold at one temperature for t seconds has Q = t/C(T)
// exactly, all of it in one band, and reaches Q = 1 at t = C(T).
func TestQuenchIsothermal(t *testing.T) {
	const T = 620.0
	C := esTest.Time(T)
	p, err := NewPath([]float64{0, C, 3 * C}, []float64{T, T, T})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Quench(p, esTest, 25)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinRel(r.Q, 3, 1e-12) {
		t.Errorf("Q = %.15g, want 3", r.Q)
	}
	if !r.Reached || !scalar.EqualWithinRel(r.TimeReached, C, 1e-12) {
		t.Errorf("Q = 1 at %g s, want %g s", r.TimeReached, C)
	}
	if len(r.Bands) != 1 || r.Bands[0].Lo != 600 || r.Bands[0].Share != 1 {
		t.Errorf("bands = %+v, want one band 600–625 K with all of Q", r.Bands)
	}
	if got, want := esTest.Retained(r.Q), math.Pow(0.995, 3); !scalar.EqualWithinRel(got, want, 1e-12) {
		t.Errorf("retained fraction %g, want 0.995³ = %g", got, want)
	}
}

// TestQuenchBands: the shares of a linear quench add up to 1, each band
// holds the integral over its own range, and the band through the nose of
// the C-curve holds the most.
func TestQuenchBands(t *testing.T) {
	p := LinearPath(750, 300, 20, 4500) // 0.1 K steps, uneven band edges
	r, err := Quench(p, esTest, 50)
	if err != nil {
		t.Fatal(err)
	}
	var sum, sumQ float64
	best := 0
	for i, b := range r.Bands {
		sum += b.Share
		sumQ += b.Q
		if b.Q > r.Bands[best].Q {
			best = i
		}
		if i > 0 && !(b.Hi <= r.Bands[i-1].Lo) {
			t.Errorf("bands out of order: %+v after %+v", b, r.Bands[i-1])
		}
	}
	if !scalar.EqualWithinRel(sum, 1, 1e-12) || !scalar.EqualWithinRel(sumQ, r.Q, 1e-12) {
		t.Errorf("shares add up to %g, band Q to %g of %g", sum, sumQ, r.Q)
	}
	// one band by direct integration: ∫_{550}^{600} dT/(q·C(T)) on a fine grid
	var want float64
	const q, n = 20.0, 20000
	for k := 0; k < n; k++ {
		T := 550 + 50*(float64(k)+0.5)/n
		want += 50.0 / n / q / esTest.Time(T)
	}
	for _, b := range r.Bands {
		if b.Lo == 550 && !scalar.EqualWithinRel(b.Q, want, 1e-4) {
			t.Errorf("band 550–600 K: Q = %g, direct %g", b.Q, want)
		}
	}
	// the nose of this C-curve lies where d ln(1/C)/dT = 0
	nose := r.Bands[best]
	if !(esTest.Time(nose.Lo) < esTest.Time(nose.Hi+100)) {
		t.Errorf("largest share in %g–%g K, not near the nose", nose.Lo, nose.Hi)
	}
}

func TestQuenchBadBand(t *testing.T) {
	p := LinearPath(750, 300, 20, 10)
	for _, w := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		if _, err := Quench(p, esTest, w); err == nil {
			t.Errorf("band width %g: no error", w)
		}
	}
}

// TestQuenchTooManyBands: a band width far below the span of the path, or
// so narrow that band numbers pass 2^53, is an error, not a loop over
// billions of bands or a band at a wrapped-around number.
func TestQuenchTooManyBands(t *testing.T) {
	p := LinearPath(750, 300, 20, 10)
	for _, w := range []float64{1e-3, 1e-7, 1e-300, 5e-324} {
		if _, err := Quench(p, esTest, w); !errors.Is(err, ErrTooManyBands) {
			t.Errorf("band width %g over 450 K: error %v, want ErrTooManyBands", w, err)
		}
	}
	hold := Path{Time: []float64{0, 10}, Temp: []float64{600, 600}}
	if _, err := Quench(hold, esTest, 1e-300); !errors.Is(err, ErrTooManyBands) {
		t.Errorf("band width 1e-300 K at 600 K: error %v, want ErrTooManyBands", err)
	}
	if r, err := Quench(p, esTest, 0.005); err != nil || len(r.Bands) > MaxBands {
		t.Errorf("band width 0.005 K over 450 K: %d bands, error %v", len(r.Bands), err)
	}
}

// TestAdditivityIsothermal: with the material's own TTT curve as C-curve,
// an isothermal hold reaches the additivity sum 1 at the JMAK time t_X.
func TestAdditivityIsothermal(t *testing.T) {
	md := testModel(t)
	const T, X = 900.0, 0.01
	_, a := md.Isothermal(T, JMAK{})
	tx := a.Time(X)
	n := 4000
	times, temps := make([]float64, n+1), make([]float64, n+1)
	for i := range times {
		times[i], temps[i] = 2*tx*float64(i)/float64(n), T
	}
	p, _ := NewPath(times, temps)
	r, err := md.Additivity(p, X, 10)
	if err != nil {
		t.Fatal(err)
	}
	if !r.Reached || !scalar.EqualWithinRel(r.TimeReached, tx, 1e-9) || !scalar.EqualWithinRel(r.Q, 2, 1e-9) {
		t.Errorf("sum %g, reached 1 at %g s; want 2 and t_X = %g s", r.Q, r.TimeReached, tx)
	}
	// and the exact path integral agrees: X(t_X) = X for an isothermal hold
	// (closed form on a hold; the crossing solved to 1e-12 of a step)
	pr, _, _ := md.AlongPath(p, X)
	if !pr.Reached || !scalar.EqualWithinRel(pr.TimeReached, tx, 1e-9) {
		t.Errorf("path integral reaches %g at %g s, JMAK t_X = %g s", X, pr.TimeReached, tx)
	}
}

// TestSpecialCases: the documented special inputs, NaN-aware.
func TestSpecialCases(t *testing.T) {
	for _, tc := range []struct {
		name      string
		got, want float64
	}{
		{"Fraction(-Inf): nothing nucleated", Fraction(math.Inf(-1)), 0},
		{"Fraction(800): saturated", Fraction(800), 1},
		{"Fraction(ln 1e-9)", Fraction(math.Log(1e-9)), -math.Expm1(-1e-9)},
		{"C(T) above the solvus", esTest.Time(800), math.Inf(1)},
		{"ln 1/C at the solvus", esTest.LnInvTime(760), math.Inf(-1)},
		{"ln 1/C of NaN", esTest.LnInvTime(math.NaN()), math.Inf(-1)},
		{"nose estimate", NoseEstimate(1000, 800, 4), 50},
	} {
		same := tc.got == tc.want || (math.IsNaN(tc.got) && math.IsNaN(tc.want)) || scalar.EqualWithinRel(tc.got, tc.want, 1e-12)
		if !same {
			t.Errorf("%s: got %g, want %g", tc.name, tc.got, tc.want)
		}
	}
	// Above T_e the whole path: no nuclei, quench factor 0, nothing retained lost.
	md := testModel(t)
	p := LinearPath(1400, 1250, 10, 50)
	a, err := md.AnalyzeCurve(p, 1e-3, 25)
	if err != nil {
		t.Fatal(err)
	}
	if a.Path.Fraction != 0 || a.Additivity.Q != 0 || a.Additivity.Reached {
		t.Errorf("path above T_e: %+v, %+v", a.Path, a.Additivity)
	}
	for _, b := range a.Additivity.Bands {
		if b.Share != 0 || math.IsNaN(b.Share) {
			t.Errorf("path above T_e: band %+v", b)
		}
	}
	// End at or above T_e is an error, not a panic.
	if _, err := md.LinearCooling(1300); err == nil {
		t.Error("end above T_e: no error")
	}
}

// TestQuenchSampledReference: a 60 s quench of our own (Newtonian cooling
// from 753 K towards 293 K, time constant 8 s) sampled every 0.1 s,
// against the test C-curve: the quench factor against the reference, the
// same path (straight between samples) integrated segment by segment by
// adaptive Gauss–Kronrod in time to 1e-12 (reference_test.go). Tolerance
// 1e-5 relative (the aim), on the total and on every band.
func TestQuenchSampledReference(t *testing.T) {
	n := 600
	time, temp := make([]float64, n+1), make([]float64, n+1)
	for i := range time {
		time[i] = 0.1 * float64(i)
		temp[i] = 293 + 460*math.Exp(-time[i]/8)
	}
	p, err := NewPath(time, temp)
	if err != nil {
		t.Fatal(err)
	}
	r, err := Quench(p, esTest, 25)
	if err != nil {
		t.Fatal(err)
	}
	var want float64
	for i := 0; i < n; i++ {
		want += adaptiveTotal(func(tt float64) float64 {
			T := temp[i] + (temp[i+1]-temp[i])*(tt-time[i])/(time[i+1]-time[i])
			return 1 / esTest.Time(T)
		}, time[i], time[i+1], 1e-12)
	}
	if d := r.Q/want - 1; !(math.Abs(d) <= 1e-5) {
		t.Errorf("Q = %.12g, reference %.12g (%+.2g)", r.Q, want, d)
	} else {
		t.Logf("Q = %.12g, reference %.12g (%+.2g)", r.Q, want, d)
	}
	if r.Running[n] != r.Q {
		t.Errorf("running Q at the end %.15g, total %.15g", r.Running[n], r.Q)
	}
}

// TestQuenchProperty: the retained property fraction comes only with a
// published C-curve, and is exp(k1·Q) of its quench factor.
func TestQuenchProperty(t *testing.T) {
	p := LinearPath(750, 300, 20, 45)
	q, err := Quench(p, esTest, 25)
	if err != nil {
		t.Fatal(err)
	}
	r, err := QuenchProperty(p, esTest, 25)
	if err != nil {
		t.Fatal(err)
	}
	if r.Q != q.Q || !scalar.EqualWithinRel(r.Retained, math.Exp(esTest.K1*q.Q), 1e-15) || !(r.Retained > 0 && r.Retained <= 1) {
		t.Errorf("Q = %g (quench %g), retained %g", r.Q, q.Q, r.Retained)
	}
	if _, err := QuenchProperty(p, esTest, 0); err == nil {
		t.Error("band width 0: no error")
	}
}
