package fit

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"undercool/cnt"
	"undercool/kinetics"
)

// Callister W.D., Materials Science and Engineering: An Introduction (Wiley),
// chapter 5, the worked example that reads two points off the log10 D
// against 1/T line of copper diffusing in gold: 1/T = 0.8e-3 K⁻¹ at
// log10 D = −12.40 and 1/T = 1.1e-3 K⁻¹ at log10 D = −15.45 (D in m²/s),
// giving Qd = 194,000 J/mol and D0 = 5.2e-5 m²/s. From memory (example number
// and values could not be verified). Tolerances: the book rounds ln 10 to 2.3
// and R to 8.31 (Q within 0.5 %), and exponentiates the rounded Q for D0,
// which moves it by about 4 % (5 % allowed).
func TestFitArrheniusCallisterCuInAu(t *testing.T) {
	T := []float64{1 / 0.8e-3, 1 / 1.1e-3}
	D := []float64{math.Pow(10, -12.40), math.Pow(10, -15.45)}
	f, err := Arrhenius(T, D, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.Q, 194000, 0.005) {
		t.Errorf("Q = %.0f J/mol, book 194000", f.Q)
	}
	if !relClose(f.A, 5.2e-5, 0.05) {
		t.Errorf("D0 = %.3g m2/s, book 5.2e-5", f.A)
	}
	if !f.Line.Exact() || !math.IsNaN(f.QCI[0]) || !math.IsNaN(f.ACI[1]) || !math.IsNaN(f.QSE) {
		t.Errorf("two points must give no interval: %+v", f)
	}
}

// arrheniusData makes n points of y = A·exp(−Q/RT) between T0 and T1 with a
// deterministic ±noise on ln y (alternating sign, so it does not bias Q).
func arrheniusData(A, Q, T0, T1 float64, n int, noise float64) (T, y []float64) {
	return sampled(T0, T1, n, noise, func(t, e float64) float64 { return A * math.Exp(-Q/(cnt.Gas*t)+e) })
}

// sampled makes n points f(t, e) at even temperatures t from T0 to T1,
// where e is the deterministic ±noise (alternating sign) to add to ln y.
func sampled(T0, T1 float64, n int, noise float64, f func(t, e float64) float64) (T, y []float64) {
	for i := range n {
		t := T0 + (T1-T0)*float64(i)/float64(n-1)
		e := noise
		if i%2 == 1 {
			e = -noise
		}
		T = append(T, t)
		y = append(y, f(t, e))
	}
	return T, y
}

func TestFitArrheniusRoundTrip(t *testing.T) {
	// Exact data: Q and A come back to rounding.
	T, y := arrheniusData(2.0e-7, 62e3, 700, 1100, 8, 0)
	f, err := Arrhenius(T, y, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.Q, 62e3, 1e-9) || !relClose(f.A, 2.0e-7, 1e-9) || f.Line.R2 != 1 && !relClose(f.Line.R2, 1, 1e-12) {
		t.Errorf("exact data: Q = %.10g, A = %.10g, R² = %g", f.Q, f.A, f.Line.R2)
	}
	// Noisy data: within 0.1 % of the truth, and the truth inside the intervals.
	T, y = arrheniusData(3.5e-5, 194e3, 800, 1300, 12, 0.002)
	f, err = Arrhenius(T, y, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.Q, 194e3, 1e-3) || !relClose(f.A, 3.5e-5, 1e-2) {
		t.Errorf("noisy: Q = %.6g, A = %.6g", f.Q, f.A)
	}
	if !(f.QCI[0] < 194e3 && 194e3 < f.QCI[1]) || !(f.ACI[0] < 3.5e-5 && 3.5e-5 < f.ACI[1]) {
		t.Errorf("noisy: intervals %v %v miss the truth", f.QCI, f.ACI)
	}
	if !(f.ACI[0] < f.A && f.A < f.ACI[1]) || !relClose(f.QSE, cnt.Gas*f.Line.SlopeSE, 1e-15) {
		t.Errorf("interval of A must bracket A: %v, %g", f.ACI, f.A)
	}
}

func TestArrheniusStraighter(t *testing.T) {
	const shift = 273.15 // K, the Celsius offset
	// Kelvin data written as Celsius numbers into a kelvin column: the
	// curve is straight only once 273.15 is added back.
	T, y := arrheniusData(1e-4, 150e3, 773.15, 1173.15, 9, 0)
	asC := make([]float64, len(T))
	for i := range T {
		asC[i] = T[i] - shift
	}
	f, err := Arrhenius(asC, y, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !f.Straighter(shift) {
		t.Error("Celsius as kelvin: not straighter shifted up")
	}
	// The same data in kelvin is straighter neither way.
	f, _ = Arrhenius(T, y, nil)
	if f.Straighter(shift) || f.Straighter(-shift) {
		t.Error("kelvin data: straighter shifted")
	}
	// Kelvin read as Celsius (273.15 too much).
	asK := make([]float64, len(T))
	for i := range T {
		asK[i] = T[i] + shift
	}
	if f, _ = Arrhenius(asK, y, nil); !f.Straighter(-shift) {
		t.Error("kelvin as Celsius: not straighter shifted down")
	}
	// A shift past absolute zero, or too few points to judge, is not straighter.
	if f.Straighter(-2000) {
		t.Error("a shift below absolute zero counted")
	}
	f, _ = Arrhenius(asC[:3], y[:3], nil)
	if f.Straighter(shift) {
		t.Error("one degree of freedom judged")
	}
}

func TestFitArrheniusBadInput(t *testing.T) {
	var pe *kinetics.PointError
	if _, err := Arrhenius([]float64{800, 900, 1000}, []float64{1e-12, 0, 1e-11}, nil); !errors.As(err, &pe) || pe.Index != 1 {
		t.Errorf("zero value: %v", err)
	}
	if _, err := Arrhenius([]float64{800, -5, 1000}, []float64{1e-12, 1e-12, 1e-11}, nil); !errors.As(err, &pe) || pe.Index != 1 {
		t.Errorf("negative temperature: %v", err)
	}
	if _, err := Arrhenius([]float64{800, 800}, []float64{1e-12, 2e-12}, nil); err == nil {
		t.Error("duplicate temperatures only: no error")
	}
	if _, err := Arrhenius([]float64{800}, []float64{1e-12}, nil); !errors.Is(err, ErrFewPoints) {
		t.Errorf("one point: %v", err)
	}
}

func BenchmarkFitArrhenius1000(b *testing.B) {
	T, y := arrheniusData(2.0e-7, 62e3, 600, 1100, 1000, 0.01)
	b.ResetTimer()
	for b.Loop() {
		if _, err := Arrhenius(T, y, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// A million points, with the two checks for a temperature column in the
// wrong scale that fit arrhenius makes.
func BenchmarkFitArrhenius1e6(b *testing.B) {
	T, y := arrheniusData(2.0e-7, 62e3, 600, 1100, 1000000, 0.01)
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		f, err := Arrhenius(T, y, nil)
		if err != nil {
			b.Fatal(err)
		}
		if f.Straighter(273.15) || f.Straighter(-273.15) {
			b.Fatal("straighter")
		}
	}
}

func ExampleArrhenius() {
	// Invented diffusivities of a fictitious solute, m²/s.
	T := []float64{800, 900, 1000, 1100}
	D := []float64{1.1e-14, 2.6e-13, 3.0e-12, 2.1e-11}
	f, err := Arrhenius(T, D, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Q = %.1f kJ/mol, 95%% [%.1f, %.1f]\n", f.Q/1e3, f.QCI[0]/1e3, f.QCI[1]/1e3)
	fmt.Printf("D0 = %.2e m2/s, R2 = %.4f\n", f.A, f.Line.R2)
	// Output:
	// Q = 184.4 kJ/mol, 95% [176.7, 192.1]
	// D0 = 1.24e-02 m2/s, R2 = 0.9998
}
