package kinetics_test

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"undercool/cnt"
	"undercool/kinetics"
)

func solClose(got, want, tol float64) bool { return scalar.EqualWithinRel(got, want, tol) }

// testSolute is an invented molecular crystal in an invented solvent, with
// values of the size met for small drug molecules (V_m ≈ 117 cm³/mol,
// γ = 2 mJ/m²); not a real system.
func testSolute(d cnt.DrivingForce) kinetics.Material {
	return kinetics.Material{
		Name:    "invented test solute",
		Driving: d,
		Vm:      116.9e-6,
		Gamma:   2e-3,
	}
}

// The apparent form practitioners fit to induction times,
//
//	J = A·exp(−B/ln²S),  B = 16π·γ³·v²/(3·k_B³·T³)
//
// (Mullin, Crystallization, 4th ed. (2001), eq. 5.5, from memory; Granberg
// et al., Chem. Eng. Sci. 56 (2001) 2305, use it to get γ) is the fixed
// prefactor J0 = A with the solution driving force Δμ = k_BT·ln S:
// ΔG*/k_BT = 16πγ³v²/(3(k_BT·ln S)²·k_BT) = B/ln²S. Checked to 1e-12.
func TestFixedPrefactorIsApparentForm(t *testing.T) {
	const A = 1e20 // m⁻³ s⁻¹, invented
	for _, S := range []float64{1.2, 1.5, 2, 3, 10} {
		m := testSolute(cnt.Supersaturation{S: S, Tsat: 320})
		m.Prefactor, m.J0 = kinetics.PrefactorFixed, A
		md, err := kinetics.NewModel(m)
		if err != nil {
			t.Fatal(err)
		}
		v := md.MolecularVolume()
		for _, T := range []float64{278.15, 298.15, 313.15} {
			k := cnt.Boltzmann
			B := 16 * math.Pi * math.Pow(m.Gamma, 3) * v * v / (3 * k * k * k * T * T * T)
			lnS := math.Log(S)
			want := math.Log(A) - B/(lnS*lnS)
			if got := md.LnJ(T); !solClose(got, want, 1e-12) {
				t.Errorf("S=%g T=%g: ln J = %.15g, want ln A − B/ln²S = %.15g", S, T, got, want)
			}
		}
	}
}

// With the van 't Hoff driving force, a solution is, for the model, a melt
// with T_e = T_sat and ΔH = ΔH_sol under Turnbull's linear law (the
// identity of cnt.VantHoff): every state agrees to rounding.
func TestVantHoffModelIsLinearModel(t *testing.T) {
	const tsat, dh = 313.15, 21.8e3
	a := testSolute(cnt.VantHoff{Tsat: tsat, DHsol: dh})
	b := testSolute(cnt.Linear{Te: tsat, DH: dh})
	for _, m := range []*kinetics.Material{&a, &b} {
		m.Mobility = kinetics.SoluteDiffusivity{D: 1e-9}
		m.Prefactor, m.Conc = kinetics.PrefactorDiffusion, 1e26
	}
	ma, err := kinetics.NewModel(a)
	if err != nil {
		t.Fatal(err)
	}
	mb, err := kinetics.NewModel(b)
	if err != nil {
		t.Fatal(err)
	}
	for _, T := range []float64{263.15, 283.15, 293.15, 303.15, 310.15} {
		sa, sb := ma.At(T), mb.At(T)
		if !solClose(sa.LnJ, sb.LnJ, 1e-12) || !solClose(sa.Nucleus.Size, sb.Nucleus.Size, 1e-12) || !solClose(sa.Growth, sb.Growth, 1e-12) {
			t.Errorf("T=%g: van 't Hoff (ln J %.15g, n* %g, u %g) != linear (%.15g, %g, %g)",
				T, sa.LnJ, sa.Nucleus.Size, sa.Growth, sb.LnJ, sb.Nucleus.Size, sb.Growth)
		}
	}
}

// The diffusion-controlled rate written out by hand from its parts:
//
//	J = N·Z·β*·exp(−ΔG*/k_BT),  β* = 4π·r*·D·c,  N = 1/v
//
// Kashchiev and van Rosmalen, Cryst. Res. Technol. 38 (2003) 555 (from memory).
func TestDiffusionPrefactor(t *testing.T) {
	const S, T, D, c = 2.5, 298.15, 7e-10, 3e26
	m := testSolute(cnt.Supersaturation{S: S, Tsat: 320})
	m.Mobility = kinetics.SoluteDiffusivity{D: D}
	m.Prefactor, m.Conc = kinetics.PrefactorDiffusion, c
	md, err := kinetics.NewModel(m)
	if err != nil {
		t.Fatal(err)
	}
	v := md.MolecularVolume()
	kT := cnt.Boltzmann * T
	dmu := kT * math.Log(S)
	r := 2 * m.Gamma * v / dmu
	dg := 16 * math.Pi * math.Pow(m.Gamma, 3) * v * v / (3 * dmu * dmu)
	n := 32 * math.Pi * math.Pow(m.Gamma, 3) * v * v / (3 * dmu * dmu * dmu)
	z := math.Sqrt(dg / (3 * math.Pi * kT * n * n))
	beta := 4 * math.Pi * r * D * c
	want := math.Log(z*beta/v) - dg/kT
	s := md.At(T)
	if !solClose(s.LnJ, want, 1e-12) || !solClose(s.LnBeta, math.Log(beta), 1e-12) {
		t.Errorf("ln J, ln β* = %.15g, %.15g; want %.15g, %.15g", s.LnJ, s.LnBeta, want, math.Log(beta))
	}
	// Small nuclei are the rule here: at S = 2.5 and γ = 2 mJ/m², n* is a
	// handful of molecules and the state says CNT is out of its range.
	if !(s.Nucleus.Size < kinetics.SmallNucleus) || s.Flags&kinetics.FlagSmallNucleus == 0 {
		t.Errorf("n* = %g, flags %v: want the small-nucleus flag", s.Nucleus.Size, s.Flags.Keys())
	}
}

func TestDiffusionPrefactorChecks(t *testing.T) {
	m := testSolute(cnt.Supersaturation{S: 2, Tsat: 320})
	m.Prefactor, m.Conc = kinetics.PrefactorDiffusion, 1e26
	if _, err := kinetics.NewModel(m); err == nil {
		t.Errorf("diffusion prefactor without a mobility law accepted")
	}
	m.Mobility = kinetics.SoluteDiffusivity{D: 1e-9}
	for _, c := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		m.Conc = c
		if _, err := kinetics.NewModel(m); err == nil {
			t.Errorf("diffusion prefactor with concentration %g accepted", c)
		}
	}
	if p, ok := kinetics.ParsePrefactor("diffusion"); !ok || p != kinetics.PrefactorDiffusion || p.String() != "diffusion" {
		t.Errorf("ParsePrefactor(diffusion) = %v, %v", p, ok)
	}
}

// Stokes–Einstein at a fixed solvent viscosity, D = k_BT/(3πηλ): for water
// at 25 °C, η = 0.890 mPa·s (CRC Handbook of Chemistry and Physics,
// viscosity of water, from memory) and a 0.5 nm molecule, D = 9.815e-10 m²/s
// (by hand: 4.1164e-21 J/(3π·0.890e-3 Pa·s·0.5e-9 m) = 4.1164e-21/4.1940e-12).
func TestSolventViscosity(t *testing.T) {
	m := kinetics.SolventViscosity{Eta: 0.890e-3, Jump: 0.5e-9}
	got := math.Exp(m.LnDiffusivity(298.15))
	if !solClose(got, 9.8149e-10, 1e-4) {
		t.Errorf("D = %.6g m2/s, want 9.8149e-10", got)
	}
	if m.Name() != "stokes-einstein" || (kinetics.SoluteDiffusivity{}).Name() != "diffusivity" {
		t.Errorf("names %q, %q", m.Name(), kinetics.SoluteDiffusivity{}.Name())
	}
	if got := (kinetics.SoluteDiffusivity{D: 1e-9}).LnDiffusivity(300); got != math.Log(1e-9) {
		t.Errorf("ln D = %g", got)
	}
}

// Induction times: t_mono = 1/(J·V) and the JMAK time to X, written out:
// t_poly = [3·(−ln(1−X))/(π·J·u³)]^(1/4) (Kashchiev and van Rosmalen 2003,
// from memory). The longer one dominates.
func TestInductionAt(t *testing.T) {
	m := testSolute(cnt.Supersaturation{S: 3, Tsat: 320})
	m.Prefactor, m.J0 = kinetics.PrefactorFixed, 1e4 // invented; J ≈ 9.4e3 m⁻³ s⁻¹ at 25 °C
	md, err := kinetics.NewModel(m)
	if err != nil {
		t.Fatal(err)
	}
	const T, X = 298.15, 1e-4
	J := math.Exp(md.LnJ(T))
	for _, c := range []struct {
		V, u     float64
		wantPoly bool
	}{
		{1e-9, 1e-7, false}, // 1 µL, fast growth: t_mono ≈ 1e5 s, t_poly ≈ 2e3 s
		{1e-3, 1e-9, true},  // 1 L, slow growth: t_mono ≈ 0.1 s, t_poly ≈ 6e4 s
	} {
		in := md.InductionAt(T, c.V, X, math.Log(c.u))
		mono := 1 / (J * c.V)
		poly := math.Pow(3*-math.Log1p(-X)/(math.Pi*J*c.u*c.u*c.u), 0.25)
		if !solClose(in.Mono(), mono, 1e-12) || !solClose(in.PolyTime(), poly, 1e-12) {
			t.Errorf("V=%g u=%g: t_mono, t_poly = %g, %g; want %g, %g", c.V, c.u, in.Mono(), in.PolyTime(), mono, poly)
		}
		if in.Poly != c.wantPoly || !solClose(in.Time(), math.Max(mono, poly), 1e-12) {
			t.Errorf("V=%g u=%g: Poly = %v, Time = %g; want %v, %g", c.V, c.u, in.Poly, in.Time(), c.wantPoly, math.Max(mono, poly))
		}
	}
	// No growth rate given and none in the model: no polynuclear time.
	in := md.InductionAt(T, 1e-6, X, math.NaN())
	if !math.IsNaN(in.LnPoly) || in.Poly {
		t.Errorf("no growth: ln t_poly = %g, Poly = %v", in.LnPoly, in.Poly)
	}
	// S ≤ 1: never.
	m.Driving = cnt.Supersaturation{S: 1, Tsat: 320}
	md1 := mustModel(t, m)
	in = md1.InductionAt(T, 1e-6, X, math.Log(1e-8))
	if !math.IsInf(in.Mono(), 1) || !math.IsInf(in.PolyTime(), 1) {
		t.Errorf("S = 1: times %g, %g, want +Inf", in.Mono(), in.PolyTime())
	}
}

// A measured growth rate replaces the mobility law's u(T): the same u at
// every supersaturated temperature, 0 without driving force, and the JMAK
// time of Continuous with it (Johnson and Mehl 1939, as in jmak.go).
func TestMeasuredGrowth(t *testing.T) {
	m := testSolute(cnt.VantHoff{Tsat: 313.15, DHsol: 28e3})
	m.Prefactor, m.J0, m.Growth = kinetics.PrefactorFixed, 1e3, 1e-8
	md, err := kinetics.NewModel(m)
	if err != nil {
		t.Fatal(err)
	}
	if !md.HasGrowth() {
		t.Fatal("a measured growth rate is a growth law")
	}
	for _, c := range []struct{ T, want float64 }{{298.15, 1e-8}, {283.15, 1e-8}, {313.15, 0}, {320, 0}} {
		if got := md.GrowthRate(c.T); got != c.want {
			t.Errorf("u(%g) = %g, want %g", c.T, got, c.want)
		}
	}
	if got := md.LnGrowth(320); !math.IsInf(got, -1) {
		t.Errorf("ln u above T_sat = %g, want −Inf", got)
	}
	s, a := md.Isothermal(298.15, kinetics.JMAK{})
	want := math.Pow(3*-math.Log1p(-1e-6)/(math.Pi*math.Exp(s.LnJ)*1e-24), 0.25)
	if got := a.Time(1e-6); !solClose(got, want, 1e-12) {
		t.Errorf("t(X = 1e-6) = %g s, want %g s", got, want)
	}
	m.Growth = -1
	if _, err := kinetics.NewModel(m); err == nil {
		t.Errorf("negative growth rate accepted")
	}
}
