package kinetics_test

import (
	"math"
	"testing"

	"undercool/kinetics"
)

// Normal growth u = (D/λ)·[1 − exp(−Δμ/k_BT)] (Uhlmann, J. Non-Cryst.
// Solids 7 (1972) 337, eq. 5). By hand: D = 1e-9 m²/s, λ = 0.3 nm, x = 1:
// u = 3.33333·(1 − 1/e) = 3.33333·0.632121 = 2.10707 m/s.
func TestGrowthRateHand(t *testing.T) {
	if got := kinetics.GrowthRate(math.Log(1e-9), 3e-10, 1); !close(got, 2.10707, 1e-5) {
		t.Errorf("u = %.6g m/s, want 2.10707 (hand)", got)
	}
}

// Limits of the growth law: for Δμ ≪ k_BT, u ≈ (D/λ)·Δμ/k_BT (linear in the
// driving force, with relative error x/2); for Δμ ≫ k_BT, u → D/λ (every jump
// forward sticks). Both follow from the expansion of 1 − e^(−x).
func TestGrowthRateLimits(t *testing.T) {
	const lnD, lambda = -20.0, 4e-10
	dl := math.Exp(lnD) / lambda
	for _, x := range []float64{1e-15, 1e-12, 1e-8, 1e-4, 1e-2} {
		u := kinetics.GrowthRate(lnD, lambda, x)
		if r := u / (dl * x); !(math.Abs(r-1) <= x/2*1.01+1e-15) {
			t.Errorf("x = %g: u/(D/λ·x) = %.17g, want 1 − x/2", x, r)
		}
	}
	for _, c := range []struct{ x, tol float64 }{{10, 5e-5}, {40, 1e-15}, {700, 0}, {math.Inf(1), 0}} {
		u := kinetics.GrowthRate(lnD, lambda, c.x)
		if !(math.Abs(u/dl-1) <= c.tol) {
			t.Errorf("x = %g: u/(D/λ) = %.17g, want 1 within %g", c.x, u/dl, c.tol)
		}
	}
	// u never falls as the driving force rises and never exceeds D/λ.
	prev := 0.0
	for x := 1e-6; x < 100; x *= 1.5 {
		u := kinetics.GrowthRate(lnD, lambda, x)
		if u < prev || u > dl {
			t.Fatalf("x = %g: u = %g after %g (D/λ = %g)", x, u, prev, dl)
		}
		prev = u
	}
}

// No driving force or no mobility: no growth, u = 0 exactly (doc comment).
func TestGrowthRateSpecialCases(t *testing.T) {
	for _, c := range []struct {
		name   string
		lnD, x float64
	}{
		{"x = 0", -20, 0},
		{"x < 0 (above Te)", -20, -0.3},
		{"x = -Inf", -20, math.Inf(-1)},
		{"ln D = -Inf (no mobility)", math.Inf(-1), 2},
		{"no mobility, no driving force", math.Inf(-1), 0},
		// Not in the doc comment: a NaN driving force gives 0 like "none".
		{"x = NaN", -20, math.NaN()},
	} {
		if got := kinetics.GrowthRate(c.lnD, 3e-10, c.x); got != 0 {
			t.Errorf("%s: u = %g, want 0", c.name, got)
		}
	}
}
