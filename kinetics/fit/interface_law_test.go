package fit

import (
	"math"
	"testing"

	"undercool/cnt"
	"undercool/kinetics"
)

// lawGlass is an invented glass former with a linear γ(T) rising with
// temperature, as fits of silicate-glass rates find (values invented for
// the tests, not a real material).
func lawGlass(t testing.TB) *kinetics.Model {
	md, err := kinetics.NewModel(kinetics.Material{
		Name: "invented law glass", Driving: cnt.ThompsonSpaepen{Te: 1300, DH: 57e3}, Vm: 60e-6,
		Gamma: 0.124, GammaLaw: kinetics.GammaLinear, GammaTRef: 730, GammaSlope: 1.8e-4,
		Tg: 730, Mobility: kinetics.VFT{A: -2.93, B: 2700, T0: 546},
	})
	if err != nil {
		t.Fatal(err)
	}
	return md
}

// Round trip of the linear law: rates made by the model with γ(730 K) =
// 0.124 J/m2, dγ/dT = 1.8e-4 J/m2/K and a scale A come back (to 1e-6 on
// exact data), from a start with a constant γ; with A held, two
// parameters; noisy data keep the truth inside the 95 % intervals. The fitted material reproduces the data to its
// residuals.
func TestFitInterfaceLinearRoundTrip(t *testing.T) {
	truth := lawGlass(t)
	start := truth.Material()
	start.GammaLaw, start.GammaSlope, start.Gamma = kinetics.GammaConstant, 0, 0.2
	from, err := kinetics.NewModel(start)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name         string
		scale, noise float64
		keep         bool
		n            int
		tol          float64
	}{
		{"exact, scale fitted", 30, 0, false, 6, 1e-6},
		{"exact, scale held", 1, 0, true, 5, 1e-6},
		{"two points, scale held: exact", 1, 0, true, 2, 1e-6},
		// With noise, γ, its slope and A trade off against each other
		// (the columns of the Jacobian are nearly parallel over 100 K):
		// the point estimates wander, the intervals must hold the truth.
		{"noisy", 30, 0.1, false, 9, 0},
	} {
		T, lnJ := rateData(truth, c.scale, 700, 800, c.n, c.noise)
		f, err := InterfaceWith(from, T, lnJ, nil, InterfaceOptions{Slope: true, TRef: 730, KeepScale: c.keep})
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if c.noise == 0 && (!relClose(f.Gamma, 0.124, c.tol) || !relClose(f.Slope, 1.8e-4, 30*c.tol) || !relClose(f.Scale, c.scale, 100*c.tol)) {
			t.Errorf("%s: γ(730) = %.8g, dγ/dT = %.6g, A = %.6g; want 0.124, 1.8e-4, %g", c.name, f.Gamma, f.Slope, f.Scale, c.scale)
		}
		if f.Law != kinetics.GammaLinear || f.TRef != 730 || f.KeepScale != c.keep {
			t.Errorf("%s: law %v about %g K, keep %v", c.name, f.Law, f.TRef, f.KeepScale)
		}
		if c.noise > 0 {
			for _, ci := range []struct {
				name  string
				v     [2]float64
				truth float64
			}{{"γ", f.GammaCI, 0.124}, {"slope", f.SlopeCI, 1.8e-4}, {"A", f.ScaleCI, c.scale}} {
				if !(ci.v[0] <= ci.truth && ci.truth <= ci.v[1]) {
					t.Errorf("%s: %s interval %v misses %g", c.name, ci.name, ci.v, ci.truth)
				}
			}
		}
		if f.Exact() != (c.n == f.Params) || (f.Exact() && !math.IsNaN(f.SlopeSE)) {
			t.Errorf("%s: exact %v with %d points and %d parameters, slope SE %g", c.name, f.Exact(), c.n, f.Params, f.SlopeSE)
		}
		reproduces(t, c.name, f, T, lnJ)
	}
	// Fewer points than parameters.
	T, lnJ := rateData(truth, 1, 700, 800, 2, 0)
	if _, err := InterfaceWith(from, T, lnJ, nil, InterfaceOptions{Slope: true}); err == nil {
		t.Error("three parameters from two points: no error")
	}
}

// With A held and a constant law, the one-parameter fit agrees with the
// two-parameter one where the data's scale is 1 (exact data).
func TestFitInterfaceKeepScale(t *testing.T) {
	md := fitDemo(t, kinetics.PrefactorAttachment)
	T, lnJ := rateData(md, 1, 880, 1000, 5, 0)
	f, err := InterfaceWith(withGamma(t, md, 0.2), T, lnJ, nil, InterfaceOptions{KeepScale: true})
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.Gamma, 0.118, 1e-7) || f.Scale != 1 || f.Params != 1 || f.DoF != 4 {
		t.Errorf("γ = %.10g, A = %g, %d parameters, %d dof", f.Gamma, f.Scale, f.Params, f.DoF)
	}
}

func BenchmarkFitInterfaceLinear(b *testing.B) {
	md := lawGlass(b)
	T, lnJ := rateData(md, 3, 700, 800, 8, 0.1)
	for b.Loop() {
		if _, err := InterfaceWith(md, T, lnJ, nil, InterfaceOptions{Slope: true}); err != nil {
			b.Fatal(err)
		}
	}
}
