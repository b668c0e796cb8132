package kinetics

import (
	"fmt"
	"math"
	"testing"

	"undercool/cnt"
	"undercool/kinetics/internal/bracket"
)

// denseMin is the brute-force minimum of ln t_X on a fine grid, for
// comparison with the search.
func denseMin(md *Model, lo, hi, X float64, j JMAK, step float64) (Tmin, lnt float64) {
	lnt = math.Inf(1)
	for T := lo; T <= hi; T += step {
		if v := md.avrami(md.At(T), j).LnTime(X); v < lnt {
			Tmin, lnt = T, v
		}
	}
	return Tmin, lnt
}

// TestNoseAgainstGrid compares the search with a 0.005 K grid: the nose
// temperature must be within the grid step plus the tolerance, and its
// time no longer than the best grid time (up to rounding).
func TestNoseAgainstGrid(t *testing.T) {
	for _, tc := range []struct {
		name   string
		md     *Model
		lo, hi float64
		j      JMAK
	}{
		{"alloy", testAlloy(t), 575, 1138.5, JMAK{}},
		{"alloy, lag", testAlloy(t), 575, 1138.5, JMAK{Lag: true}},
		{"alloy, site saturated", testAlloy(t), 575, 1138.5, JMAK{Nuclei: 1e14}},
		{"glass", testGlass(t), 520, 1290, JMAK{}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			const X = 1e-6
			n, err := tc.md.Nose(tc.lo, tc.hi, X, tc.j)
			if err != nil {
				t.Fatal(err)
			}
			if !n.Inside() {
				t.Fatalf("nose at an edge: %+v", n)
			}
			gT, glnt := denseMin(tc.md, tc.lo, tc.hi, X, tc.j, 0.005)
			// The curve is flat at the nose: ln t moves by ~1e-9 over 0.01 K,
			// so the grid can only place it to a few tenths of a kelvin.
			if math.Abs(n.T-gT) > 0.5 {
				t.Errorf("nose %.3f K, dense grid %.3f K", n.T, gT)
			}
			if n.LnTime > glnt+1e-9 {
				t.Errorf("nose ln t %.12f > grid minimum %.12f", n.LnTime, glnt)
			}
			t.Logf("nose %.3f K, %d evaluations", n.T, n.Evaluations)
			if n.Evaluations > 100 {
				t.Errorf("%d evaluations, want at most 100", n.Evaluations)
			}
		})
	}
}

// TestNoseLocatedTo001K checks the 0.01 K accuracy where it can be seen:
// on each side of the nose, 0.01 K away, the time is not shorter — to
// within the rounding of ln t, since the bottom of the curve is flat.
func TestNoseLocatedTo001K(t *testing.T) {
	md := testAlloy(t)
	n, err := md.Nose(575, 1138.5, 0.5, JMAK{})
	if err != nil {
		t.Fatal(err)
	}
	// −ln K is smooth; test on it with a parabola through three points
	// 1 K apart: its vertex must lie within 0.01 K of the nose.
	f := func(T float64) float64 { return -md.avrami(md.At(T), JMAK{}).LnK }
	h := 1.0
	fm, f0, fp := f(n.T-h), f(n.T), f(n.T+h)
	vertex := n.T + h*(fm-fp)/(2*(fm-2*f0+fp))
	if math.Abs(vertex-n.T) > NoseTolerance {
		t.Errorf("nose %.4f K, parabola vertex %.4f K: off by more than %g K", n.T, vertex, NoseTolerance)
	}
}

// TestNoseIndependentOfFraction: in the constant-rate JMAK law
// ln t_X = [ln(−ln(1−X)) − ln K(T)]/4, so the curves for different X are
// the same curve shifted in ln t and share their nose (exact; Christian
// 2002, §4, for the form). Checked two ways: the shift is the same at every
// temperature, and minimizing ln t_X itself for each X, independently of
// Nose, finds the same temperature within the search tolerance.
func TestNoseIndependentOfFraction(t *testing.T) {
	md := testAlloy(t)
	fr := []float64{1e-6, 0.01, 0.5, 0.99}
	for _, T := range []float64{1100, 1000, 900, 800, 700, 600} {
		_, a := md.Isothermal(T, JMAK{})
		for _, X := range fr[1:] {
			got := a.LnTime(X) - a.LnTime(fr[0])
			want := (lnExtent(X) - lnExtent(fr[0])) / 4
			if !sameFloat(got, want, 1e-9) {
				t.Errorf("T = %g, X = %g: shift %.12g, want %.12g", T, X, got, want)
			}
		}
	}
	var first float64
	for i, X := range fr {
		x, _, err := bracket.MinimizeScan(func(T float64) float64 { return md.avrami(md.At(T), JMAK{}).LnTime(X) },
			575, 1138.5, 24, NoseTolerance)
		if err != nil {
			t.Fatal(err)
		}
		if i == 0 {
			first = x
		} else if math.Abs(x-first) > 2*NoseTolerance {
			t.Errorf("X = %g: minimum of ln t_X at %.4f K, X = %g at %.4f K", X, x, fr[0], first)
		}
	}
	ttt, err := md.TTT([]float64{900, 800}, fr, JMAK{}, 575, 1138.5)
	if err != nil {
		t.Fatal(err)
	}
	for k := range fr {
		if ttt.Noses[k].T != ttt.Noses[0].T {
			t.Errorf("TTT nose %d at %g K, nose 0 at %g K", k, ttt.Noses[k].T, ttt.Noses[0].T)
		}
		if k > 0 && !(ttt.Noses[k].LnTime > ttt.Noses[k-1].LnTime) {
			t.Errorf("nose times not increasing with X: %+v", ttt.Noses)
		}
	}
}

// TestNoseWithLag: the lag only adds time, so the lagged curve lies above
// the plain one everywhere; with τ ≪ t the noses nearly coincide.
func TestNoseWithLag(t *testing.T) {
	md := testAlloy(t)
	plain, err := md.Nose(575, 1138.5, 0.5, JMAK{})
	if err != nil {
		t.Fatal(err)
	}
	lag, err := md.Nose(575, 1138.5, 0.5, JMAK{Lag: true})
	if err != nil {
		t.Fatal(err)
	}
	if !(lag.LnTime >= plain.LnTime) {
		t.Errorf("lagged nose time %g < plain %g", lag.LnTime, plain.LnTime)
	}
	if math.Abs(lag.T-plain.T) > 20 {
		t.Errorf("lagged nose %g K, plain %g K", lag.T, plain.T)
	}
}

func TestNoseSpecialCases(t *testing.T) {
	md := testAlloy(t)
	// Range above T_e: nothing transforms.
	n, err := md.Nose(1160, 1300, 0.5, JMAK{})
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsNaN(n.T) || !math.IsInf(n.LnTime, 1) || n.Inside() {
		t.Errorf("above T_e: %+v, want T NaN, ln t +Inf", n)
	}
	// A range cut above the nose (near 776 K): the time still falls at the low end.
	n, err = md.Nose(900, 1100, 0.5, JMAK{})
	if err != nil {
		t.Fatal(err)
	}
	if n.Edge != -1 || math.Abs(n.T-900) > 2*NoseTolerance {
		t.Errorf("cut above the nose: %+v, want edge -1 at 900 K", n)
	}
	// Cut below: edge +1.
	n, err = md.Nose(600, 700, 0.5, JMAK{})
	if err != nil {
		t.Fatal(err)
	}
	if n.Edge != 1 {
		t.Errorf("cut below the nose: %+v, want edge +1", n)
	}
	// Range straddling T_e and VFT T0: the nose is found inside.
	g := testGlass(t)
	n, err = g.Nose(300, 1500, 1e-6, JMAK{})
	if err != nil {
		t.Fatal(err)
	}
	if !n.Inside() {
		t.Errorf("glass over 300–1500 K: %+v, want inside", n)
	}
	for _, X := range []float64{0, 1, -1, math.NaN()} {
		if _, err := md.Nose(600, 1100, X, JMAK{}); err == nil {
			t.Errorf("X = %g: no error", X)
		}
	}
}

func TestTTT(t *testing.T) {
	md := testAlloy(t)
	temps := []float64{1200, 1150, 1100, 900, 700}
	fr := []float64{0.01, 0.5, 0.99}
	ttt, err := md.TTT(temps, fr, JMAK{}, 575, 1138.5)
	if err != nil {
		t.Fatal(err)
	}
	for i, T := range temps {
		_, a := md.Isothermal(T, JMAK{})
		for k, X := range fr {
			if want := a.LnTime(X); !sameFloat(ttt.LnTime[i][k], want, 0) {
				t.Errorf("T = %g, X = %g: %g, want %g", T, X, ttt.LnTime[i][k], want)
			}
		}
	}
	if !math.IsInf(ttt.LnTime[0][0], 1) || !math.IsInf(ttt.LnTime[1][2], 1) {
		t.Errorf("at and above T_e: %v, want +Inf", ttt.LnTime[:2])
	}
	if ttt.Flags[0]&FlagNoDrivingForce == 0 {
		t.Errorf("flags above T_e: %v", ttt.Flags[0].Keys())
	}
	bad := []struct {
		name   string
		temps  []float64
		fr     []float64
		lo, hi float64
	}{
		{"fraction 0", temps, []float64{0}, 575, 1100},
		{"fraction 1", temps, []float64{0.5, 1}, 575, 1100},
		{"no fraction", temps, nil, 575, 1100},
		{"T negative", []float64{-5}, fr, 575, 1100},
		{"T NaN", []float64{math.NaN()}, fr, 575, 1100},
		{"range reversed", temps, fr, 1100, 575},
	}
	for _, tc := range bad {
		if _, err := md.TTT(tc.temps, tc.fr, JMAK{}, tc.lo, tc.hi); err == nil {
			t.Errorf("%s: no error", tc.name)
		}
	}
}

func ExampleModel_Nose() {
	md, err := NewModel(Material{
		Name:     "invented example material",
		Driving:  cnt.ThompsonSpaepen{Te: 1150, DH: 14.2e3},
		Vm:       9.8e-6,
		Gamma:    0.118,
		Mobility: Arrhenius{D0: 2e-7, Q: 62e3},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	n, err := md.Nose(575, 1138.5, 1e-6, JMAK{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("nose %.1f K, log10 t = %.2f (t in s)\n", n.T, n.LnTime/math.Ln10)
	// Output: nose 770.7 K, log10 t = -7.85 (t in s)
}

// 200 temperatures over the default-like range of the test alloy.
func benchTemps() []float64 {
	temps := make([]float64, 200)
	for i := range temps {
		temps[i] = 1138.5 - (1138.5-575)*float64(i)/199
	}
	return temps
}

func BenchmarkTTT200(b *testing.B) {
	md := testAlloy(b)
	temps := benchTemps()
	fr := []float64{1e-6}
	for b.Loop() {
		if _, err := md.TTT(temps, fr, JMAK{}, 575, 1138.5); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkTTT200ThreeFractionsLag(b *testing.B) {
	md := testAlloy(b)
	temps := benchTemps()
	fr := []float64{0.01, 0.5, 0.99}
	for b.Loop() {
		if _, err := md.TTT(temps, fr, JMAK{Lag: true}, 575, 1138.5); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkNose(b *testing.B) {
	md := testAlloy(b)
	for b.Loop() {
		if _, err := md.Nose(575, 1138.5, 1e-6, JMAK{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkNoseGlass(b *testing.B) {
	md := testGlass(b)
	for b.Loop() {
		if _, err := md.Nose(520, 1290, 1e-6, JMAK{}); err != nil {
			b.Fatal(err)
		}
	}
}
