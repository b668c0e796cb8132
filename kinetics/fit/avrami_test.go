package fit

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"undercool/kinetics"
)

// Callister W.D., Rethwisch D.G., Materials Science and Engineering: An
// Introduction (Wiley), chapter 10, end-of-chapter problem on the
// austenite-to-pearlite transformation obeying the Avrami law: fraction 0.2
// at 12.6 s and 0.8 at 28.2 s. Its published solution gives n = 2.453 and
// k = 4.46e-4 (s⁻ⁿ), printed to 4 and 3 digits (tolerances 0.05 % and
// 0.5 %). The solution then prints t(0.95) = 35.7 s, which follows from k
// misprinted there as 4.64e-4; with its own n and k the formula gives
// 36.3 s, which is what is checked (to 0.3 %).
func TestFitAvramiCallisterPearlite(t *testing.T) {
	f, err := Avrami([]float64{12.6, 28.2}, []float64{0.2, 0.8}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.N, 2.453, 5e-4) {
		t.Errorf("n = %.4f, published 2.453", f.N)
	}
	if !relClose(f.K, 4.46e-4, 5e-3) {
		t.Errorf("k = %.4g, published 4.46e-4", f.K)
	}
	want95 := math.Pow(-math.Log(0.05)/4.46e-4, 1/2.453)
	if !relClose(f.TimeTo(0.95), want95, 3e-3) || !relClose(want95, 36.3, 2e-3) {
		t.Errorf("t(0.95) = %.3f s, from the published n and k %.3f s", f.TimeTo(0.95), want95)
	}
	// The two points are reproduced exactly.
	for i, c := range [][2]float64{{12.6, 0.2}, {28.2, 0.8}} {
		if got := f.TimeTo(c[1]); !relClose(got, c[0], 1e-12) {
			t.Errorf("point %d: t(%g) = %g, want %g", i, c[1], got, c[0])
		}
	}
	if !f.Line.Exact() || !math.IsNaN(f.NCI[0]) || !math.IsNaN(f.TimeToCI(0.5)[0]) {
		t.Error("two points must give no intervals")
	}
}

func avramiData(n, k float64, times []float64, noise float64) []float64 {
	X := make([]float64, len(times))
	for i, t := range times {
		e := noise
		if i%2 == 1 {
			e = -noise
		}
		X[i] = -math.Expm1(-k * math.Pow(t, n) * math.Exp(e))
	}
	return X
}

func TestFitAvramiRoundTrip(t *testing.T) {
	times := []float64{0, 30, 60, 90, 120, 180, 240, 300, 420, 600, 3600}
	const n, k = 2.5, 1.5e-6 // s^-2.5
	X := avramiData(n, k, times, 0)
	X[len(X)-1] = 1 // complete: left out, as is the start at t = 0, X = 0
	f, err := Avrami(times, X, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.N, n, 1e-9) || !relClose(f.K, k, 1e-8) {
		t.Errorf("exact: n = %.10g, k = %.10g", f.N, f.K)
	}
	if len(f.Skipped) != 2 || f.Skipped[0] != 0 || f.Skipped[1] != len(times)-1 {
		t.Errorf("skipped %v, want [0 %d]", f.Skipped, len(times)-1)
	}
	half := math.Pow(math.Ln2/k, 1/n)
	if !relClose(f.HalfTime(), half, 1e-9) {
		t.Errorf("half time %g, want %g", f.HalfTime(), half)
	}
	// With noise: n and k within 0.1 % and 1 %, the truth inside the intervals.
	X = avramiData(n, k, times[1:len(times)-1], 0.003)
	f, err = Avrami(times[1:len(times)-1], X, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.N, n, 1e-3) || !relClose(f.K, k, 1e-2) {
		t.Errorf("noisy: n = %g, k = %g", f.N, f.K)
	}
	ci := f.TimeToCI(0.5)
	if !(f.NCI[0] < n && n < f.NCI[1]) || !(f.KCI[0] < k && k < f.KCI[1]) || !(ci[0] < half && half < ci[1]) {
		t.Errorf("noisy: intervals n %v, k %v, t½ %v miss the truth", f.NCI, f.KCI, ci)
	}
}

func TestFitAvramiBadInput(t *testing.T) {
	if _, err := Avrami([]float64{0, 10, 20}, []float64{0, 0.5, 1}, nil); err == nil {
		t.Error("one usable point: no error")
	}
	var pe *kinetics.PointError
	if _, err := Avrami([]float64{10, -1, 30}, []float64{0.1, 0.5, 0.9}, nil); !errors.As(err, &pe) || pe.Index != 1 {
		t.Errorf("negative time: %v", err)
	}
	if _, err := Avrami([]float64{10, 10, 30}, []float64{0.1, 0.5, 0.9}, []float64{1, 1, -1}); !errors.As(err, &pe) || pe.Index != 2 {
		t.Errorf("bad weight, index mapped back: %v", err)
	}
	if _, err := Avrami([]float64{10, 10}, []float64{0.1, 0.5}, nil); err == nil {
		t.Error("same times: no error")
	}
	if _, err := Avrami([]float64{10, 20}, []float64{0.5, 0.1}, nil); err == nil {
		t.Error("decreasing fraction: no error")
	}
	if f, _ := Avrami([]float64{10, 20}, []float64{0.1, 0.5}, nil); !math.IsNaN(f.TimeTo(1)) || !math.IsNaN(f.TimeTo(0)) {
		t.Error("TimeTo outside (0,1) must be NaN")
	}
}

func ExampleAvrami() {
	// Invented isothermal fractions; the first and last rows (X = 0, X = 1)
	// are left out of the straight line.
	t := []float64{0, 60, 120, 180, 240, 300, 900} // s
	X := []float64{0, 0.05, 0.31, 0.65, 0.88, 0.97, 1}
	f, err := Avrami(t, X, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	ci := f.NCI
	fmt.Printf("n = %.2f, 95%% [%.2f, %.2f]; left out rows %v\n", f.N, ci[0], ci[1], f.Skipped)
	fmt.Printf("half time %.0f s, t(0.95) %.0f s\n", f.HalfTime(), f.TimeTo(0.95))
	// Output:
	// n = 2.63, 95% [2.42, 2.85]; left out rows [0 6]
	// half time 157 s, t(0.95) 274 s
}
