package kinetics_test

import (
	"errors"
	"math"
	"testing"

	"undercool/cnt"
	"undercool/kinetics"
)

// testGlass is an invented glass former (a VFT melt with a glass
// transition), used to check the laws of the interface, the glassy branch
// and growth by hand; its numbers describe no real material.
func testGlass() kinetics.Material {
	return kinetics.Material{
		Name:     "invented test glass",
		Driving:  cnt.ThompsonSpaepen{Te: 1300, DH: 57e3},
		Vm:       60e-6,
		Gamma:    0.12,
		Tg:       730,
		Mobility: kinetics.VFT{A: -3, B: 2700, T0: 546},
	}
}

// TestGammaLaws: the interfacial energy of each law at hand-worked
// temperatures, and the nucleus it gives equal to that of a constant γ of
// the same value (the law enters only through γ(T)).
//
//	linear:      0.12 + 2e-4·(800 − 730) = 0.134 J/m2
//	negentropic: 0.12·800/730           = 0.131506849… J/m2
func TestGammaLaws(t *testing.T) {
	cases := []struct {
		law   kinetics.GammaLaw
		slope float64
		want  float64 // γ(800 K), J/m²
	}{
		{kinetics.GammaConstant, 0, 0.12},
		{kinetics.GammaLinear, 2e-4, 0.134},
		{kinetics.GammaNegentropic, 0, 0.12 * 800 / 730},
	}
	for _, c := range cases {
		m := testGlass()
		m.GammaLaw, m.GammaTRef, m.GammaSlope = c.law, 730, c.slope
		md := mustModel(t, m)
		if got := md.GammaAt(800); !close(got, c.want, 1e-14) {
			t.Errorf("%v: γ(800 K) = %.15g, want %.15g", c.law, got, c.want)
		}
		if got := md.GammaAt(730); !close(got, 0.12, 1e-15) {
			t.Errorf("%v: γ(T_ref) = %.15g, want 0.12", c.law, got)
		}
		flat := testGlass()
		flat.Gamma = c.want
		want := mustModel(t, flat).At(800)
		got := md.At(800)
		if !close(got.Nucleus.Barrier, want.Nucleus.Barrier, 1e-13) || !close(got.LnJ, want.LnJ, 1e-13) {
			t.Errorf("%v: at 800 K ΔG* = %g, ln J = %g; a constant γ(800 K) gives %g, %g", c.law, got.Nucleus.Barrier, got.LnJ, want.Nucleus.Barrier, want.LnJ)
		}
	}
}

// TestGammaNotPositive: a linear law with dγ/dT = 2e-4 J/m2/K and
// γ(730 K) = 0.12 J/m2 reaches zero at 730 − 0.12/2e-4 = 130 K (by hand).
// Asked for temperatures reaching below it, the model says so with the
// crossing; at such a temperature there is no nucleus and no rate, flagged.
func TestGammaNotPositive(t *testing.T) {
	m := testGlass()
	m.Mobility = kinetics.Arrhenius{D0: 1e-6, Q: 3e5} // no VFT divergence in the way
	m.GammaLaw, m.GammaTRef, m.GammaSlope = kinetics.GammaLinear, 730, 2e-4
	md := mustModel(t, m)
	if err := md.CheckGamma(200, 1200); err != nil {
		t.Errorf("200–1200 K: %v, want nil (γ > 0 there)", err)
	}
	err := md.CheckGamma(1200, 100)
	var ge *kinetics.GammaError
	if !errors.As(err, &ge) {
		t.Fatalf("100–1200 K: %v, want a *GammaError", err)
	}
	if !close(ge.Zero, 130, 1e-12) || ge.Lo != 100 || ge.Hi != 1200 {
		t.Errorf("GammaError %+v, want the zero at 130 K over 100–1200 K", ge)
	}
	s := md.At(120)
	if !math.IsNaN(s.LnJ) || s.Flags&kinetics.FlagGammaNotPositive == 0 || !math.IsInf(s.Nucleus.Radius, 1) {
		t.Errorf("at 120 K: ln J = %v, flags %v, r* = %v; want NaN, gamma_not_positive, +Inf", s.LnJ, s.Flags.Keys(), s.Nucleus.Radius)
	}
	// A negentropic or constant law is positive wherever T is.
	m.GammaLaw = kinetics.GammaNegentropic
	if err := mustModel(t, m).CheckGamma(1, 2000); err != nil {
		t.Errorf("negentropic: %v", err)
	}
	m.GammaTRef = 0
	if _, err := kinetics.NewModel(m); err == nil {
		t.Error("a negentropic law without its reference temperature was accepted")
	}
}

// TestGlassyBranch: below T_g the viscosity follows the Arrhenius line
// log10 η = log10 η(T_g) + E_g/(R ln 10)·(1/T − 1/T_g), continuous at T_g.
// By hand, for the test glass (VFT A = −3, B = 2700 K, T0 = 546 K, T_g = 730 K):
// log10 η(730 K) = −3 + 2700/184 = 11.673913…; with E_g = 150 kJ/mol at
// 700 K, E_g/(R ln 10)·(1/700 − 1/730) = 0.459983… (R = 8.314462618…),
// so log10 η(700 K) = 12.133896…. Without E_g the VFT law itself is used
// (−3 + 2700/154 = 14.532467…) and flagged as an extrapolation.
func TestGlassyBranch(t *testing.T) {
	m := testGlass()
	liquid := mustModel(t, m)
	m.GlassQ = 150e3
	glass := mustModel(t, m)
	atTg := -3 + 2700.0/184
	for _, md := range []*kinetics.Model{liquid, glass} {
		if got := md.Log10Viscosity(730); !close(got, atTg, 1e-14) {
			t.Errorf("log10 η(T_g) = %.15g, want %.15g", got, atTg)
		}
	}
	want := atTg + 150e3/(cnt.Gas*math.Ln10)*(1.0/700-1.0/730)
	if got := glass.Log10Viscosity(700); !close(got, want, 1e-14) || math.Abs(got-12.133896) > 5e-6 {
		t.Errorf("glassy log10 η(700 K) = %.9g, want %.9g (12.133896 by hand)", got, want)
	}
	if got := liquid.Log10Viscosity(700); !close(got, -3+2700.0/154, 1e-14) {
		t.Errorf("extrapolated log10 η(700 K) = %.9g, want 14.532467", got)
	}
	// Continuous at T_g: a step of 1e-9 K across it changes log10 η by
	// less than 1e-6 (the slope is finite on both sides).
	if d := glass.Log10Viscosity(730-1e-9) - glass.Log10Viscosity(730+1e-9); math.Abs(d) > 1e-6 {
		t.Errorf("log10 η jumps by %g at T_g", d)
	}
	// ln D follows the same viscosity through Stokes–Einstein.
	lam := glass.JumpDistance()
	wantLnD := math.Log(cnt.Boltzmann*700/(3*math.Pi*lam)) - want*math.Ln10
	if got := glass.At(700).LnD; !close(got, wantLnD, 1e-13) {
		t.Errorf("glassy ln D(700 K) = %.15g, want %.15g", got, wantLnD)
	}
	// The flags name the branch below T_g, and nothing above it.
	for _, c := range []struct {
		md   *kinetics.Model
		T    float64
		want kinetics.Flag
	}{
		{liquid, 700, kinetics.FlagBelowTgLiquid}, {glass, 700, kinetics.FlagBelowTgGlassy},
		{liquid, 760, 0}, {glass, 760, 0},
	} {
		got := c.md.At(c.T).Flags & (kinetics.FlagBelowTgLiquid | kinetics.FlagBelowTgGlassy)
		if got != c.want {
			t.Errorf("glassy %v at %g K: flags %v, want %v", c.md.Glassy(), c.T, got.Keys(), c.want.Keys())
		}
	}
	// E_g needs a viscosity law and T_g.
	m.Mobility = kinetics.Arrhenius{D0: 1e-6, Q: 3e5}
	if _, err := kinetics.NewModel(m); err == nil {
		t.Error("glass Q with an Arrhenius mobility was accepted")
	}
}

// TestViscosityPowerIsNormalGrowth: with ξ = 1 and the Stokes–Einstein
// u_g = k_B·T_g/(3π·λ²·η(T_g)) (the defaults) the viscosity-power law is
// normal growth u = (D/λ)·[1 − exp(−Δμ/k_BT)] with D from the same
// viscosity, at every temperature: above T_g, below it on either branch,
// for VFT and WLF. Exact up to rounding (1e-12 relative).
func TestViscosityPowerIsNormalGrowth(t *testing.T) {
	wlf := testGlass()
	wlf.Mobility = kinetics.WLF{Tg: 730, C1: 17.44, C2: 51.6, EtaG: 1e12}
	for _, base := range []kinetics.Material{testGlass(), wlf} {
		for _, eg := range []float64{0, 150e3} {
			base.GlassQ = eg
			normal := mustModel(t, base)
			m := base
			m.GrowthLaw = kinetics.ViscosityPower{}
			power := mustModel(t, m)
			for _, T := range []float64{650, 700, 729.9, 730, 800, 1000, 1290} {
				want, got := normal.At(T).Growth, power.At(T).Growth
				if !close(got, want, 1e-12) {
					t.Errorf("%s, E_g %g: u(%g K) = %.15g, normal growth %.15g", base.Mobility.Name(), eg, T, got, want)
				}
			}
		}
	}
}

// TestGrowthLawsByHand: each growth law at one temperature against the
// formula worked by hand.
//
// Viscosity power, u_g = 2e-12 m/s, ξ = 0.6, test glass at 900 K:
// log10 η(900) = −3 + 2700/354 = 4.627119, log10 η(T_g) = 11.673913, so
// u = 2e-12·(900/730)·10^(0.6·7.046794)·[1 − exp(−Δμ/kT)].
// Arrhenius, u_0 = 10 m/s, Q_u = 200 kJ/mol at 900 K:
// u = 10·exp(−200000/(R·900))·[1 − exp(−Δμ/kT)].
func TestGrowthLawsByHand(t *testing.T) {
	m := testGlass()
	md := mustModel(t, m)
	s := md.At(900)
	thermo := -math.Expm1(-s.Dmu / (cnt.Boltzmann * 900))
	m.GrowthLaw = kinetics.ViscosityPower{Ug: 2e-12, Xi: 0.6}
	want := 2e-12 * (900.0 / 730) * math.Pow(10, 0.6*((-3+2700.0/184)-(-3+2700.0/354))) * thermo
	if got := mustModel(t, m).At(900).Growth; !close(got, want, 1e-12) {
		t.Errorf("viscosity power: u(900 K) = %.15g, want %.15g", got, want)
	}
	m.GrowthLaw = kinetics.ArrheniusGrowth{U0: 10, Q: 200e3}
	want = 10 * math.Exp(-200e3/(cnt.Gas*900)) * thermo
	if got := mustModel(t, m).At(900).Growth; !close(got, want, 1e-12) {
		t.Errorf("arrhenius: u(900 K) = %.15g, want %.15g", got, want)
	}
	// No growth without driving force, whatever the law.
	if u := mustModel(t, m).At(1300).Growth; u != 0 {
		t.Errorf("arrhenius at T_e: u = %g, want 0", u)
	}
	// Viscosity-power growth needs a viscosity law.
	m.Mobility, m.GrowthLaw = kinetics.Arrhenius{D0: 1e-6, Q: 3e5}, kinetics.ViscosityPower{Xi: 0.6}
	if _, err := kinetics.NewModel(m); err == nil {
		t.Error("viscosity-power growth with an Arrhenius mobility was accepted")
	}
}

// TestGrowthTable: a table made from an Arrhenius rate u = 1e3·exp(−25000 K/T)
// at 800, 900 and 1000 K is reproduced exactly between its rows, since ln u
// is linear in 1/T (interpolation in 1/T of ln u is exact for it); outside
// the table the rate is zero and flagged. The measured rate is u itself.
func TestGrowthTable(t *testing.T) {
	law := func(T float64) float64 { return 1e3 * math.Exp(-25000/T) }
	temps := []float64{1000, 800, 900} // any order
	us := make([]float64, len(temps))
	for i, T := range temps {
		us[i] = law(T)
	}
	tab, err := kinetics.NewGrowthTable(temps, us, "hand")
	if err != nil {
		t.Fatal(err)
	}
	m := testGlass()
	m.GrowthLaw = tab
	md := mustModel(t, m)
	for _, T := range []float64{800, 833.3, 900, 951, 1000} {
		s := md.At(T)
		if !close(s.Growth, law(T), 1e-12) || s.Flags&kinetics.FlagOutsideGrowthTable != 0 {
			t.Errorf("u(%g K) = %.15g, flags %v; want %.15g", T, s.Growth, s.Flags.Keys(), law(T))
		}
	}
	for _, T := range []float64{799, 1001} {
		s := md.At(T)
		if s.Growth != 0 || s.Flags&kinetics.FlagOutsideGrowthTable == 0 {
			t.Errorf("u(%g K) = %g, flags %v; want 0 and outside_growth_table", T, s.Growth, s.Flags.Keys())
		}
	}
	for _, bad := range [][2][]float64{
		{{800}, {1e-6}},
		{{800, 800}, {1e-6, 2e-6}},
		{{800, 900}, {1e-6, 0}},
		{{800, math.NaN()}, {1e-6, 1e-6}},
	} {
		if _, err := kinetics.NewGrowthTable(bad[0], bad[1], "bad"); err == nil {
			t.Errorf("table %v accepted", bad)
		}
	}
}

// TestCalibratedRange: a material calibrated on 700–800 K flags every
// temperature outside that range, and a span that leaves it.
func TestCalibratedRange(t *testing.T) {
	m := testGlass()
	m.CalibratedLo, m.CalibratedHi = 750, 800
	md := mustModel(t, m)
	for T, want := range map[float64]bool{749: true, 750: false, 780: false, 800: false, 801: true} {
		if got := md.At(T).Flags&kinetics.FlagOutsideCalibrated != 0; got != want {
			t.Errorf("at %g K: outside_calibrated_range %v, want %v", T, got, want)
		}
	}
	if md.SpanFlags(760, 790)&kinetics.FlagOutsideCalibrated != 0 || md.SpanFlags(760, 900)&kinetics.FlagOutsideCalibrated == 0 {
		t.Error("span flags of the calibrated range")
	}
	m.CalibratedHi = 0
	if _, err := kinetics.NewModel(m); err == nil {
		t.Error("a calibrated range with one end was accepted")
	}
}
