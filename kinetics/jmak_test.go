package kinetics

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"undercool/cnt"
)

// sameFloat is a NaN-aware equality with a relative tolerance.
func sameFloat(a, b, rel float64) bool {
	switch {
	case math.IsNaN(a) || math.IsNaN(b):
		return math.IsNaN(a) && math.IsNaN(b)
	case math.IsInf(a, 0) || math.IsInf(b, 0):
		return a == b
	}
	return math.Abs(a-b) <= rel*math.Max(math.Abs(a), math.Abs(b))
}

// TestAvramiRecrystallization checks the Avrami form against the
// recrystallization problem of Callister W.D., Rethwisch D.G., Materials
// Science and Engineering: An Introduction (Wiley), chapter on phase
// transformations: Avrami exponent n = 2.5, fraction 0.40 after 200 min,
// and the book's answer, the rate 1/t_0.5 = 4.4e-3 per min (answer from
// memory, two digits). The law is built from the answer (n and t_0.5 =
// 1/4.4e-3 min) and must give the problem's fraction back at 200 min.
// Tolerance: the answer's rounding, 4.35e-3 to 4.45e-3 per min, moves
// X(200 min) between 0.387 and 0.404 (by hand), so ±0.009 about 0.40.
func TestAvramiRecrystallization(t *testing.T) {
	const n, rate = 2.5, 4.4e-3 // per min
	half := 60 / rate           // s
	a := Avrami{LnK: math.Log(math.Ln2) - n*math.Log(half), N: n, LnLag: math.Inf(-1)}
	if got := a.Fraction(200 * 60); math.Abs(got-0.40) > 0.009 {
		t.Errorf("X(200 min) = %.4f, the problem's 0.40 (±0.009 from the answer's two digits)", got)
	}
	if got := a.Time(0.5); math.Abs(got-half) > 1e-9*half {
		t.Errorf("t_0.5 = %.9g s, built from %.9g s", got, half)
	}
}

// TestContinuousExtendedVolume checks the (π/3)·J·u³·t⁴ of Continuous
// against the extended-volume integral it comes from (Avrami 1939; Porter,
// Easterling and Sherif, 3rd ed. (2009), §5.8.1),
//
//	X_ext(t) = ∫₀ᵗ J·(4π/3)·[u·(t − t')]³ dt'
//
// evaluated with gonum's Gauss–Legendre quadrature (exact for this
// polynomial; tolerance 1e-12 relative, rounding only).
func TestContinuousExtendedVolume(t *testing.T) {
	const J, u = 3.7e14, 2.2e-6 // m⁻³ s⁻¹, m/s: invented test values
	a := Continuous(math.Log(J), math.Log(u))
	if a.N != 4 {
		t.Fatalf("Avrami exponent %g, want 4", a.N)
	}
	for _, tt := range []float64{1e-3, 0.5, 7, 300} {
		ext := quad.Fixed(func(s float64) float64 {
			r := u * (tt - s)
			return J * 4 * math.Pi / 3 * r * r * r
		}, 0, tt, 8, nil, 0)
		want := -math.Expm1(-ext)
		if got := a.Fraction(tt); !sameFloat(got, want, 1e-12) {
			t.Errorf("t = %g s: X = %.15g, want %.15g from the integral", tt, got, want)
		}
		if want > 1e-300 && want < 1-1e-12 {
			if back := a.Time(want); !sameFloat(back, tt, 1e-9) {
				t.Errorf("t_X(%g) = %.12g s, want %g", want, back, tt)
			}
		}
	}
}

// TestSiteSaturated checks X = 1 − exp(−(4π/3)·N·(u·t)³) (Christian 2002,
// §4): the extended volume is N spheres of radius u·t (exact).
func TestSiteSaturated(t *testing.T) {
	const N, u = 1e18, 1e-9
	a := SiteSaturated(math.Log(N), math.Log(u))
	for _, tt := range []float64{1, 100, 1e4} {
		r := u * tt
		want := -math.Expm1(-N * 4 * math.Pi / 3 * r * r * r)
		if got := a.Fraction(tt); !sameFloat(got, want, 1e-12) {
			t.Errorf("t = %g: X = %.15g, want %.15g", tt, got, want)
		}
	}
	// t_0.5 by hand: (ln 2/(4π/3·N·u³))^(1/3) = (0.693147/4.18879e-9)^(1/3)
	// = (1.654765e8)^(1/3) = 549.008 s.
	if got := a.Time(0.5); math.Abs(got-549.008) > 0.001 {
		t.Errorf("t_0.5 = %.4f s, want 549.008", got)
	}
}

// TestLnTimeNoOverflow: a rate of 10⁻⁷⁰⁰ per m³·s cannot be held as a
// float64, its logarithm can. By hand: log10 t_0.5 = [log10(ln 2) −
// log10(π/3) + 700 + 9]/4 = [−0.159174 − 0.020029 + 709]/4 = 177.205201.
func TestLnTimeNoOverflow(t *testing.T) {
	a := Continuous(-700*math.Ln10, math.Log(1e-3))
	if got := a.LnTime(0.5) / math.Ln10; math.Abs(got-177.205201) > 2e-6 {
		t.Errorf("log10 t = %.7f, want 177.205201", got)
	}
	if got := a.Fraction(a.Time(0.5)); math.Abs(got-0.5) > 1e-12 {
		t.Errorf("Fraction(t_0.5) = %g, want 0.5", got)
	}
	// Slower still: the time itself is beyond float64 (+Inf), its log is not.
	c := Continuous(-1500*math.Ln10, math.Log(1e-3))
	if got := c.Time(0.5); !math.IsInf(got, 1) {
		t.Errorf("Time = %g, want +Inf (beyond float64)", got)
	}
	if got := c.LnTime(0.5) / math.Ln10; math.Abs(got-377.205201) > 2e-6 {
		t.Errorf("log10 t = %.7f, want 377.205201", got)
	}
	// A huge rate: X = 1 after a second, no NaN.
	b := Continuous(700*math.Ln10, 0)
	if got := b.Fraction(1); got != 1 {
		t.Errorf("Fraction = %g, want 1", got)
	}
}

func TestAvramiSpecialCases(t *testing.T) {
	ok := Avrami{LnK: 0, N: 4, LnLag: math.Inf(-1)}
	never := Avrami{LnK: math.Inf(-1), N: 4, LnLag: math.Inf(-1)}
	unknown := Avrami{LnK: math.NaN(), N: 4, LnLag: math.Inf(-1)}
	lagged := Avrami{LnK: math.Log(math.Log(2) / 1e4), N: 4, LnLag: math.Log(5)} // t_0.5 = 10 s + 5 s
	tests := []struct {
		name string
		got  float64
		want float64
	}{
		{"X = 0", ok.LnTime(0), math.NaN()},
		{"X = 1", ok.LnTime(1), math.NaN()},
		{"X < 0", ok.LnTime(-0.1), math.NaN()},
		{"X NaN", ok.LnTime(math.NaN()), math.NaN()},
		{"never", never.LnTime(0.5), math.Inf(1)},
		{"never, time", never.Time(0.5), math.Inf(1)},
		{"never, fraction", never.Fraction(1e30), 0},
		{"unknown", unknown.LnTime(0.5), math.NaN()},
		{"unknown fraction", unknown.Fraction(1), math.NaN()},
		{"fraction at 0", ok.Fraction(0), 0},
		{"fraction at +Inf", ok.Fraction(math.Inf(1)), 1},
		{"fraction NaN t", ok.Fraction(math.NaN()), math.NaN()},
		{"lag added", lagged.Time(0.5), 15},
		{"before the lag", lagged.Fraction(4.9), 0},
		{"after the lag", lagged.Fraction(15), 0.5},
	}
	for _, tc := range tests {
		if !sameFloat(tc.got, tc.want, 1e-12) {
			t.Errorf("%s: got %g, want %g", tc.name, tc.got, tc.want)
		}
	}
}

func TestLogAddExp(t *testing.T) {
	for _, tc := range []struct{ a, b, want float64 }{
		{math.Log(2), math.Log(3), math.Log(5)},
		{math.Inf(-1), 1, 1},
		{1000, 1000, 1000 + math.Ln2},
		{-1000, 5, 5},
		{math.NaN(), 1, math.NaN()},
	} {
		if got := logAddExp(tc.a, tc.b); !sameFloat(got, tc.want, 1e-15) {
			t.Errorf("logAddExp(%g, %g) = %g, want %g", tc.a, tc.b, got, tc.want)
		}
	}
}

func TestJMAKCheck(t *testing.T) {
	for _, tc := range []struct {
		j    JMAK
		fail bool
	}{
		{JMAK{}, false},
		{JMAK{Lag: true}, false},
		{JMAK{Nuclei: 1e15}, false},
		{JMAK{Nuclei: -1}, true},
		{JMAK{Nuclei: math.NaN()}, true},
		{JMAK{Nuclei: math.Inf(1)}, true},
		{JMAK{Nuclei: 1e15, Lag: true}, true},
	} {
		if err := tc.j.Check(); (err != nil) != tc.fail {
			t.Errorf("%+v: err = %v, want failure %v", tc.j, err, tc.fail)
		}
	}
}

// testAlloy is an invented metal-like material (not a real one) with
// values of the common order for a melt: Thompson–Spaepen driving force,
// Arrhenius mobility.
func testAlloy(t testing.TB) *Model {
	return mustModel(t, Material{
		Name:     "test alloy (invented)",
		Driving:  cnt.ThompsonSpaepen{Te: 1150, DH: 14.2e3},
		Vm:       9.8e-6,
		Gamma:    0.118,
		Mobility: Arrhenius{D0: 2e-7, Q: 62e3},
	})
}

// testGlass is an invented oxide-glass-like material with a VFT viscosity.
func testGlass(t testing.TB) *Model {
	return mustModel(t, Material{
		Name:     "test glass (invented)",
		Driving:  cnt.Hoffman{Te: 1300, DH: 55e3},
		Vm:       60e-6,
		Gamma:    0.18,
		Mobility: VFT{A: -3, B: 4500, T0: 500, Jump: math.Cbrt(60e-6 / cnt.Avogadro)},
	})
}

// mustModel is NewModel for a material a test knows to be valid.
func mustModel(t testing.TB, m Material) *Model {
	t.Helper()
	md, err := NewModel(m)
	if err != nil {
		t.Fatal(err)
	}
	return md
}

func TestIsothermal(t *testing.T) {
	md := testAlloy(t)
	// Where the growth rate is representable, ln u from logs equals ln of u.
	for _, T := range []float64{1100, 900, 700, 500} {
		s, a := md.Isothermal(T, JMAK{})
		want := Continuous(s.LnJ, math.Log(s.Growth))
		if !sameFloat(a.LnK, want.LnK, 1e-12) || a.N != 4 || !math.IsInf(a.LnLag, -1) {
			t.Errorf("T = %g: %+v, want %+v", T, a, want)
		}
		_, al := md.Isothermal(T, JMAK{Lag: true})
		if !sameFloat(math.Exp(al.LnLag), s.TimeLag(), 1e-12) {
			t.Errorf("T = %g: lag %g, want State.TimeLag %g", T, math.Exp(al.LnLag), s.TimeLag())
		}
		_, ss := md.Isothermal(T, JMAK{Nuclei: 1e16})
		if want := SiteSaturated(math.Log(1e16), math.Log(s.Growth)); !sameFloat(ss.LnK, want.LnK, 1e-12) || ss.N != 3 {
			t.Errorf("T = %g: site saturated %+v, want %+v", T, ss, want)
		}
	}
	// Special temperatures: at and above T_e nothing forms (never, +Inf).
	for _, T := range []float64{1150, 1200} {
		for _, j := range []JMAK{{}, {Lag: true}, {Nuclei: 1e16}} {
			if _, a := md.Isothermal(T, j); !math.IsInf(a.LnTime(0.5), 1) {
				t.Errorf("T = %g, %+v: ln t = %g, want +Inf", T, j, a.LnTime(0.5))
			}
		}
	}
	// Below the VFT T0 there is no mobility: never.
	g := testGlass(t)
	if _, a := g.Isothermal(450, JMAK{}); !math.IsInf(a.LnTime(0.5), 1) {
		t.Errorf("below T0: ln t = %g, want +Inf", a.LnTime(0.5))
	}
	// Just above T0 the mobility underflows as D but not as ln D: finite time.
	if _, a := g.Isothermal(500.5, JMAK{}); math.IsInf(a.LnTime(0.5), 0) || math.IsNaN(a.LnTime(0.5)) {
		t.Errorf("just above T0: ln t = %g, want finite", a.LnTime(0.5))
	}
	// No mobility law: the model cannot say (NaN), and CanTransform says why.
	nm, err := NewModel(Material{Driving: cnt.Linear{Te: 1000, DH: 1e4}, Vm: 1e-5, Gamma: 0.1})
	if err != nil {
		t.Fatal(err)
	}
	if _, a := nm.Isothermal(900, JMAK{}); !math.IsNaN(a.LnTime(0.5)) {
		t.Errorf("no mobility: ln t = %g, want NaN", a.LnTime(0.5))
	}
	if nm.CanTransform(JMAK{}) == nil {
		t.Error("no mobility: CanTransform = nil")
	}
}

func ExampleContinuous() {
	// Steady nucleation at 10^12 per m³·s of spheres growing at 1 µm/s.
	a := Continuous(math.Log(1e12), math.Log(1e-6))
	fmt.Printf("t_0.5 = %.4g s; X(20 s) = %.4f\n", a.Time(0.5), a.Fraction(20))
	// Output: t_0.5 = 28.52 s; X(20 s) = 0.1543
}
