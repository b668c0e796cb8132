package fit

import (
	"errors"
	"math"
	"testing"

	"undercool/cnt"
	"undercool/kinetics"
)

// growthGlass is an invented glass former with a VFT viscosity and a
// growth law of known constants (invented for the tests).
func growthGlass(t testing.TB, law kinetics.GrowthLaw) *kinetics.Model {
	md, err := kinetics.NewModel(kinetics.Material{
		Name: "invented growth glass", Driving: cnt.ThompsonSpaepen{Te: 1300, DH: 57e3}, Vm: 60e-6,
		Gamma: 0.12, Tg: 730, Mobility: kinetics.VFT{A: -2.93, B: 2700, T0: 546}, GrowthLaw: law,
	})
	if err != nil {
		t.Fatal(err)
	}
	return md
}

// growthData samples u of md at n temperatures from T0 to T1, times
// 10^(±noise) alternately.
func growthData(md *kinetics.Model, T0, T1 float64, n int, noise float64) (T, u []float64) {
	T, lu := sampled(T0, T1, n, noise, func(t, e float64) float64 { return math.Log10(md.GrowthRate(t)) + e })
	u = make([]float64, n)
	for i := range lu {
		u[i] = math.Pow(10, lu[i])
	}
	return T, u
}

// Round trip of both growth laws: rates made by a law with known constants
// come back exactly (1e-9) from exact data, the intervals hold the truth
// with noise, and ξ held gives u_g alone. The model the fit starts from
// has normal (Stokes–Einstein) growth: only its driving force and
// viscosity enter.
func TestFitGrowthRoundTrip(t *testing.T) {
	base := growthGlass(t, nil)
	truth := growthGlass(t, kinetics.ViscosityPower{Ug: 2.1e-12, Xi: 0.63})
	T, u := growthData(truth, 730, 1200, 7, 0)
	f, err := GrowthViscosityPower(base, T, u, nil, false)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.Ug, 2.1e-12, 1e-9) || !relClose(f.Xi, 0.63, 1e-9) || f.DoF != 5 {
		t.Errorf("viscosity power: u_g = %.12g, ξ = %.12g, %d dof; want 2.1e-12, 0.63", f.Ug, f.Xi, f.DoF)
	}
	for i, r := range f.Residuals {
		if math.Abs(r) > 1e-9 {
			t.Errorf("residual %d = %g", i, r)
		}
	}
	T, u = growthData(truth, 730, 1200, 9, 0.2)
	f, err = GrowthViscosityPower(base, T, u, nil, false)
	if err != nil {
		t.Fatal(err)
	}
	if !(f.UgCI[0] <= 2.1e-12 && 2.1e-12 <= f.UgCI[1]) || !(f.XiCI[0] <= 0.63 && 0.63 <= f.XiCI[1]) {
		t.Errorf("noisy: u_g %v, ξ %v miss the truth", f.UgCI, f.XiCI)
	}
	// ξ held at the model's: one point is enough, and exact.
	held := growthGlass(t, kinetics.ViscosityPower{Xi: 0.63})
	f, err = GrowthViscosityPower(held, []float64{900}, []float64{truth.GrowthRate(900)}, nil, true)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.Ug, 2.1e-12, 1e-12) || f.Xi != 0.63 || !f.Exact() {
		t.Errorf("ξ held: u_g = %.12g, ξ = %g, exact %v", f.Ug, f.Xi, f.Exact())
	}

	arr := growthGlass(t, kinetics.ArrheniusGrowth{U0: 3e4, Q: 250e3})
	T, u = growthData(arr, 800, 1200, 6, 0)
	g, err := GrowthArrhenius(base, T, u, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(g.Arrhenius.A, 3e4, 1e-9) || !relClose(g.Arrhenius.Q, 250e3, 1e-9) {
		t.Errorf("arrhenius: u_0 = %.12g, Q = %.12g; want 3e4, 250e3", g.Arrhenius.A, g.Arrhenius.Q)
	}
}

func TestFitGrowthBadInput(t *testing.T) {
	base := growthGlass(t, nil)
	var pe *kinetics.PointError
	if _, err := GrowthViscosityPower(base, []float64{900, 1300, 1000}, []float64{1e-8, 1e-6, 1e-7}, nil, false); !errors.As(err, &pe) || pe.Index != 1 {
		t.Errorf("at T_e: %v", err)
	}
	if _, err := GrowthViscosityPower(base, []float64{900, 1000}, []float64{1e-8, 0}, nil, false); !errors.As(err, &pe) || pe.Index != 1 {
		t.Errorf("zero rate: %v", err)
	}
	if _, err := GrowthViscosityPower(base, []float64{900}, []float64{1e-8}, nil, false); !errors.Is(err, ErrFewPoints) {
		t.Errorf("one point, two parameters: %v", err)
	}
	m := base.Material()
	m.Mobility, m.Tg = kinetics.Arrhenius{D0: 1e-6, Q: 3e5}, 0
	arr, _ := kinetics.NewModel(m)
	if _, err := GrowthViscosityPower(arr, []float64{900, 1000}, []float64{1e-8, 1e-7}, nil, false); !errors.Is(err, ErrNoViscosity) {
		t.Errorf("no viscosity law: %v", err)
	}
	// Below the VFT T0 the law gives no viscosity.
	if _, err := GrowthViscosityPower(base, []float64{500, 1000}, []float64{1e-15, 1e-7}, nil, false); !errors.As(err, &pe) || pe.Index != 0 {
		t.Errorf("below T0: %v", err)
	}
}

func BenchmarkFitGrowth(b *testing.B) {
	base := growthGlass(b, nil)
	truth := growthGlass(b, kinetics.ViscosityPower{Ug: 2.1e-12, Xi: 0.63})
	T, u := growthData(truth, 730, 1200, 20, 0.1)
	for b.Loop() {
		if _, err := GrowthViscosityPower(base, T, u, nil, false); err != nil {
			b.Fatal(err)
		}
	}
}
