package fit

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/kinetics/internal/bracket"
)

// firstOrderPeak is the peak temperature of a first-order law
// dα/dt = A·exp(−E/RT)·(1−α) heated at beta K/s: the root of
// β·E/(R·T²) = A·exp(−E/(R·T)), written in logarithms and solved by Brent
// to 1e-12 K.
func firstOrderPeak(t *testing.T, E, A, beta float64) float64 {
	t.Helper()
	g := func(T float64) float64 { return math.Log(beta*E/cnt.Gas) - 2*math.Log(T) - math.Log(A) + E/(cnt.Gas*T) }
	T, err := bracket.Root(g, 150, 3000, 1e-12)
	if err != nil {
		t.Fatal(err)
	}
	return T
}

// perMin turns heating rates in K/min into K/s.
func perMin(r ...float64) []float64 {
	out := make([]float64, len(r))
	for i, x := range r {
		out[i] = x / 60
	}
	return out
}

// Kissinger's relation is exact for first-order kinetics (Kissinger H.E.,
// Anal. Chem. 29 (1957) 1702): peaks computed from it to 1e-12 K must give
// E and A back to 1e-6, whatever the energy.
func TestPeakKissingerFirstOrder(t *testing.T) {
	for _, c := range []struct{ E, A float64 }{
		{150e3, 1e12}, // a typical crystallization exotherm near 450–500 K
		{300e3, 1e20}, // a metallic glass near 700 K
		{80e3, 1e7},
	} {
		beta := perMin(1, 2, 5, 10, 20, 40)
		Tp := make([]float64, len(beta))
		for i, b := range beta {
			Tp[i] = firstOrderPeak(t, c.E, c.A, b)
		}
		f, err := PeakKissinger(beta, Tp, nil)
		if err != nil {
			t.Fatal(err)
		}
		if !relClose(f.E, c.E, 1e-6) || !relClose(f.A, c.A, 1e-6) {
			t.Errorf("E = %.9g J/mol, A = %.9g /s; want %g and %g", f.E, f.A, c.E, c.A)
		}
		if !(f.ECI[0] <= c.E && c.E <= f.ECI[1]) || !(f.ACI[0] <= c.A && c.A <= f.ACI[1]) {
			t.Errorf("intervals %v, %v miss the exact values", f.ECI, f.ACI)
		}
		if f.Method != Kissinger || !relClose(f.Reduced[1], c.E/(cnt.Gas*Tp[0]), 1e-12) {
			t.Errorf("method %s, reduced range %v", f.Method, f.Reduced)
		}
	}
}

// With noise on the peak temperatures (±0.5 K, alternating, the scatter
// of a careful DSC), the 95 % intervals of E and ln A hold the exact values.
func TestPeakKissingerNoise(t *testing.T) {
	const E, A = 200e3, 1e15
	beta := perMin(1, 2, 5, 10, 20, 50)
	Tp := make([]float64, len(beta))
	for i, b := range beta {
		Tp[i] = firstOrderPeak(t, E, A, b) + 0.5*float64(1-2*(i%2))
	}
	f, err := PeakKissinger(beta, Tp, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !(f.ECI[0] < E && E < f.ECI[1]) {
		t.Errorf("E = %.5g, 95 %% %v misses %g", f.E, f.ECI, E)
	}
	if lo, hi := f.LnA-f.Arrhenius.Line.T*f.LnASE, f.LnA+f.Arrhenius.Line.T*f.LnASE; !(lo < math.Log(A) && math.Log(A) < hi) {
		t.Errorf("ln A = %.5g ± %.3g misses %.5g", f.LnA, f.Arrhenius.Line.T*f.LnASE, math.Log(A))
	}
	if !relClose(math.Log(f.ACI[0]), f.LnA-f.Arrhenius.Line.T*f.LnASE, 1e-12) {
		t.Error("the interval of A is not exp of that of ln A")
	}
	// The delta-method SE of ln A = b0 + ln(−b1), from the covariance of
	// the line, against the same first-order propagation done by brute
	// force: the derivative of ln A with each ordinate by refitting with
	// that ordinate moved, SE² = s²·Σ(∂ln A/∂y_i)².
	x, y := make([]float64, len(Tp)), make([]float64, len(Tp))
	for i := range Tp {
		x[i], y[i] = 1/Tp[i], math.Log(beta[i]/(Tp[i]*Tp[i]))
	}
	lnA := func() float64 {
		l, err := Line(x, y, nil)
		if err != nil {
			t.Fatal(err)
		}
		return l.Intercept + math.Log(-l.Slope)
	}
	var ss float64
	for i := range y {
		const h = 1e-6
		y[i] += h
		up := lnA()
		y[i] -= 2 * h
		down := lnA()
		y[i] += h
		d := (up - down) / (2 * h)
		ss += d * d
	}
	if want := f.Arrhenius.Line.ResidualSD * math.Sqrt(ss); !relClose(f.LnASE, want, 1e-6) {
		t.Errorf("SE(ln A) = %.9g, by refitting %.9g", f.LnASE, want)
	}
}

// Peaks that lie exactly on the Ozawa–Flynn–Wall line give E back to
// rounding; first-order peaks give it within Doyle's linearization. With
// x = E/(RT), d ln p/dx ≈ −(1 + 2/x) (the leading terms of the asymptotic
// series of the temperature integral), so the energy read with Doyle's
// slope 1.0516 is biased by (1 + 2/x)/1.0516 − 1: from +3.7 % at x = 20 to
// −1.9 % at x = 60. The tolerance, 4 %, is that bound (set beforehand).
func TestPeakOzawa(t *testing.T) {
	const E = 180e3
	beta := perMin(2, 5, 10, 20)
	Tp := make([]float64, len(beta))
	for i, b := range beta {
		Tp[i] = 1 / ((30 - math.Log(b)) * cnt.Gas / (DoyleSlope * E))
	}
	f, err := PeakOzawa(beta, Tp, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.E, E, 1e-9) || !math.IsNaN(f.A) || !math.IsNaN(f.LnA) {
		t.Errorf("on the line: E = %.10g, want %g; A = %g must be NaN", f.E, E, f.A)
	}
	for _, c := range []struct{ E, A float64 }{{150e3, 1e12}, {300e3, 1e20}, {80e3, 1e7}} {
		for i, b := range beta {
			Tp[i] = firstOrderPeak(t, c.E, c.A, b)
		}
		f, err := PeakOzawa(beta, Tp, nil)
		if err != nil {
			t.Fatal(err)
		}
		if !relClose(f.E, c.E, 0.04) {
			t.Errorf("first order, E = %g: Ozawa gives %.5g (x = %.3g to %.3g)", c.E, f.E, f.Reduced[0], f.Reduced[1])
		}
		k, err := PeakKissinger(beta, Tp, nil)
		if err != nil {
			t.Fatal(err)
		}
		// The two slopes differ by the 2·ln Tp of Kissinger's ordinate
		// and Doyle's factor only.
		if !relClose(f.Arrhenius.Q-k.Arrhenius.Q, 2*cnt.Gas/meanInverse(Tp), 0.05) {
			t.Errorf("slopes differ by %g J/mol, expected about 2R·mean(Tp) = %g", f.Arrhenius.Q-k.Arrhenius.Q, 2*cnt.Gas/meanInverse(Tp))
		}
	}
}

func meanInverse(T []float64) float64 {
	var s float64
	for _, t := range T {
		s += 1 / t
	}
	return s / float64(len(T))
}

// Two peaks give the exact line and no intervals.
func TestPeakTwoPoints(t *testing.T) {
	f, err := PeakKissinger(perMin(5, 20), []float64{500, 515}, nil)
	if err != nil {
		t.Fatal(err)
	}
	want := cnt.Gas * math.Log((20.0/(515*515))/(5.0/(500*500))) / (1.0/500 - 1.0/515)
	if !relClose(f.E, want, 1e-12) {
		t.Errorf("E = %.10g, by hand %.10g", f.E, want)
	}
	if !math.IsNaN(f.ECI[0]) || !math.IsNaN(f.ACI[0]) || !math.IsNaN(f.LnASE) || math.IsNaN(f.A) {
		t.Errorf("two points: intervals %v %v must be NaN, A = %g a number", f.ECI, f.ACI, f.A)
	}
}

func TestPeakErrors(t *testing.T) {
	var pe *kinetics.PointError
	if _, err := PeakKissinger([]float64{0.1, -0.2}, []float64{500, 510}, nil); !errors.As(err, &pe) || pe.Index != 1 {
		t.Errorf("negative rate: %v", err)
	}
	if _, err := PeakOzawa([]float64{0.1, 0.2}, []float64{500, math.NaN()}, nil); !errors.As(err, &pe) || pe.Index != 1 {
		t.Errorf("NaN peak: %v", err)
	}
	if _, err := PeakKissinger([]float64{0.1}, []float64{500}, nil); !errors.Is(err, ErrFewPoints) {
		t.Errorf("one point: %v", err)
	}
	if _, err := PeakKissinger([]float64{0.1, 0.2}, []float64{500, 500}, nil); err == nil || err.Error() != "every peak lies at the same temperature: no energy can be fitted" {
		t.Errorf("one temperature: %v", err)
	}
	// Peaks falling as the rate rises: no positive energy.
	for _, fit := range []func(b, T, w []float64) (*PeakFit, error){PeakKissinger, PeakOzawa} {
		if _, err := fit([]float64{0.1, 0.2, 0.4}, []float64{520, 510, 500}, nil); err == nil {
			t.Error("falling peaks must fail")
		}
	}
	if _, err := PeakKissinger([]float64{0.1, 0.2}, []float64{500, 510}, []float64{1, 0}); !errors.As(err, &pe) || pe.Index != 1 {
		t.Errorf("zero weight: %v", err)
	}
}

// Ozawa's method on fractions that follow his law exactly returns m and K.
func TestOzawaExponentExact(t *testing.T) {
	const m, K = 2.7, 3e-6 // K in (K/s)^m
	beta := perMin(0.5, 1, 2, 5, 10, 20, 1000)
	X := make([]float64, len(beta))
	for i, b := range beta {
		X[i] = -math.Expm1(-K / math.Pow(b, m))
	}
	X[0] = 1 // fully transformed at the slowest scan: left out
	f, err := OzawaExponent(beta, X, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.M, m, 1e-9) || !relClose(math.Exp(f.LnK), K, 1e-9) {
		t.Errorf("m = %.12g, K = %.6g; want %g, %g", f.M, math.Exp(f.LnK), m, K)
	}
	if len(f.Skipped) != 1 || f.Skipped[0] != 0 || len(f.Used) != 6 || !(f.MCI[0] <= m && m <= f.MCI[1]) {
		t.Errorf("skipped %v, used %v, interval %v", f.Skipped, f.Used, f.MCI)
	}
	if _, err := OzawaExponent(beta[1:4], []float64{0.1, 0.2, 0.3}, nil); err == nil {
		t.Error("a fraction rising with the rate must fail")
	}
	if _, err := OzawaExponent(beta[1:3], []float64{0.1, 1}, nil); err == nil {
		t.Error("one usable point must fail")
	}
}

// Ozawa's exponent from the physics it was made for: sporadic nucleation
// at J(T) and 3-D growth at u(T), both set by temperature alone, heated
// from T0 at constant rates. The fraction at a temperature T follows from
// the extended volume in time, X_ext = (4π/3)∫J(t′)[∫_{t′}^t u ds]³dt′,
// computed here for each rate on its own time axis by nested Gauss–Legendre
// quadrature (gonum quad.Fixed, 64 and 48 nodes, converged to 1e-12 on
// these smooth integrands); Ozawa (1971) gives m = 4, the exponent of the
// isothermal law, to the accuracy of the quadrature.
func TestOzawaExponentJMAK(t *testing.T) {
	const T0, T = 600.0, 700.0
	J := func(T float64) float64 { return 1e22 * math.Exp(-150e3/(cnt.Gas*T)) } // m^-3 s^-1
	u := func(T float64) float64 { return 1e2 * math.Exp(-120e3/(cnt.Gas*T)) }  // m/s
	fraction := func(beta float64) float64 {
		tEnd := (T - T0) / beta
		temp := func(s float64) float64 { return T0 + beta*s }
		grown := func(t1 float64) float64 {
			return quad.Fixed(func(s float64) float64 { return u(temp(s)) }, t1, tEnd, 48, quad.Legendre{}, 0)
		}
		ext := quad.Fixed(func(t1 float64) float64 { g := grown(t1); return J(temp(t1)) * g * g * g }, 0, tEnd, 64, quad.Legendre{}, 0)
		return -math.Expm1(-4 * math.Pi / 3 * ext)
	}
	beta := perMin(4, 6, 9, 13.5)
	X := make([]float64, len(beta))
	for i, b := range beta {
		X[i] = fraction(b)
		if !(X[i] > 1e-6 && X[i] < 0.999) {
			t.Fatalf("the scenario must give fractions inside (0, 1): %g at %g K/s", X[i], b)
		}
	}
	f, err := OzawaExponent(beta, X, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.M, 4, 1e-9) {
		t.Errorf("m = %.12g, want 4", f.M)
	}
}
