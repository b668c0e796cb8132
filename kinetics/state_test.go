package kinetics_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"undercool/cnt"
	"undercool/kinetics"
)

// goldCallister is the gold of Callister, Materials Science and Engineering:
// An Introduction, Example Problem 10.1 (from memory): ΔHf = −1.16e9 J/m³,
// γ = 0.132 J/m², Tm = 1337 K, a = 0.413 nm with 4 atoms per cell, written
// per mole: Vm = N_A·a³/4, ΔH = 1.16e9 J/m³·Vm. The mobility is invented.
func goldCallister() kinetics.Material {
	const a = 0.413e-9
	vm := cnt.Avogadro * a * a * a / 4
	return kinetics.Material{
		Name:     "gold (Callister Example Problem 10.1; invented mobility)",
		Driving:  cnt.Linear{Te: 1337, DH: 1.16e9 * vm},
		Vm:       vm,
		Gamma:    0.132,
		Mobility: kinetics.Arrhenius{D0: 1e-7, Q: 40e3},
	}
}

// The model reproduces the book's nucleus at ΔT = 230 K through the
// per-mole path (Δg → Δμ = Δg/N_A → cnt.Critical). Tolerances as in
// cnt's TestCriticalGoldCallister: the book prints 3 figures and rounds
// between steps.
func TestModelGoldCallister(t *testing.T) {
	md := mustModel(t, goldCallister())
	s := md.At(1337 - 230)
	for _, c := range []struct {
		name           string
		got, want, tol float64
	}{
		{"ΔT (K)", s.Undercooling, 230, 1e-12},
		{"Δg_v (J/m³)", s.DrivingVolume(md.Material().Vm), 1.16e9 * 230 / 1337, 1e-12},
		{"r* (m)", s.Nucleus.Radius, 1.32e-9, 5e-3},
		{"ΔG* (J)", s.Nucleus.Barrier, 9.64e-19, 5e-3},
		{"n* (atoms)", s.Nucleus.Size, 548, 1e-2},
	} {
		if !close(c.got, c.want, c.tol) {
			t.Errorf("%s = %.5g, want %.4g within %g", c.name, c.got, c.want, c.tol)
		}
	}
	if s.Flags != 0 {
		t.Errorf("flags %v at ΔT = 230 K, want none", s.Flags.Keys())
	}
}

// At agrees with the cnt functions it is built from, for each prefactor.
func TestModelAtMatchesCNT(t *testing.T) {
	base := goldCallister()
	tf := base
	tf.Prefactor = kinetics.PrefactorTurnbullFisher
	fixed := base
	fixed.Prefactor, fixed.J0, fixed.Mobility = kinetics.PrefactorFixed, 1e39, nil
	for _, m := range []kinetics.Material{base, tf, fixed} {
		md := mustModel(t, m)
		for _, T := range []float64{700, 1000, 1107, 1300} {
			s := md.At(T)
			kT := cnt.Boltzmann * T
			dmu := m.Driving.PerMole(T) / cnt.Avogadro
			n := cnt.Critical(dmu, m.Gamma, md.MolecularVolume(), md.ShapeFactor(), T)
			if s.Nucleus != n || s.Dmu != dmu {
				t.Errorf("%s T=%g: nucleus %+v, want %+v", m.Prefactor, T, s.Nucleus, n)
			}
			var want float64
			switch m.Prefactor {
			case kinetics.PrefactorAttachment:
				lnD := m.Mobility.LnDiffusivity(T)
				lnB := cnt.LnAttachment(lnD, n.Size, md.JumpDistance())
				want = cnt.LnRate(md.LnSites(), n.Zeldovich, lnB, n.Barrier, T)
				if s.LnBeta != lnB || s.LnD != lnD {
					t.Errorf("T=%g: ln β*, ln D = %g, %g, want %g, %g", T, s.LnBeta, s.LnD, lnB, lnD)
				}
				if u := kinetics.GrowthRate(lnD, md.JumpDistance(), dmu/kT); s.Growth != u {
					t.Errorf("T=%g: u = %g, want %g", T, s.Growth, u)
				}
				if got, w := s.TimeLag(), cnt.TimeLag(n.Zeldovich, lnB); got != w {
					t.Errorf("T=%g: τ = %g, want %g", T, got, w)
				}
			case kinetics.PrefactorTurnbullFisher:
				want = cnt.LnRateTurnbullFisher(md.LnSites(), 40e3, n.Barrier, T)
			case kinetics.PrefactorFixed:
				want = cnt.LnRateFixed(math.Log(1e39), n.Barrier, T)
				if !math.IsNaN(s.Growth) || !math.IsNaN(s.TimeLag()) {
					t.Errorf("no mobility: u, τ = %g, %g, want NaN, NaN", s.Growth, s.TimeLag())
				}
			}
			if !close(s.LnJ, want, 1e-14) || md.LnJ(T) != s.LnJ || md.GrowthRate(T) != s.Growth && !math.IsNaN(s.Growth) {
				t.Errorf("%s T=%g: ln J = %.15g, want %.15g", m.Prefactor, T, s.LnJ, want)
			}
			if s.Log10J() != s.LnJ/math.Ln10 {
				t.Errorf("Log10J = %g, want %g", s.Log10J(), s.LnJ/math.Ln10)
			}
		}
	}
}

func hasFlag(s kinetics.State, f kinetics.Flag) bool { return s.Flags&f != 0 }

func TestModelAtFlags(t *testing.T) {
	gold := mustModel(t, goldCallister())

	// No driving force at and above Te: no nucleus, zero rate and growth.
	for _, T := range []float64{1337, 1337.001, 1500} {
		s := gold.At(T)
		if s.Flags != kinetics.FlagNoDrivingForce {
			t.Errorf("T = %g: flags %v, want [no_driving_force]", T, s.Flags.Keys())
		}
		if !math.IsInf(s.LnJ, -1) || s.Growth != 0 || !math.IsInf(s.Nucleus.Radius, 1) || !math.IsNaN(s.LnBeta) {
			t.Errorf("T = %g: ln J %g, u %g, r* %g, ln β* %g; want -Inf, 0, +Inf, NaN", T, s.LnJ, s.Growth, s.Nucleus.Radius, s.LnBeta)
		}
	}

	// Small nucleus and low barrier: the flags are set exactly where n* < 10
	// and ΔG* < 5 kT, over a sweep that crosses both limits.
	weak := goldCallister()
	weak.Gamma = 0.05
	for _, m := range []kinetics.Material{goldCallister(), weak} {
		md := mustModel(t, m)
		var small, low bool
		for T := 10.0; T < 1337; T += 3 {
			s := md.At(T)
			kT := cnt.Boltzmann * T
			if hasFlag(s, kinetics.FlagSmallNucleus) != (s.Nucleus.Size < kinetics.SmallNucleus) {
				t.Errorf("γ=%g T=%g: n* = %g, small_nucleus = %v", m.Gamma, T, s.Nucleus.Size, hasFlag(s, kinetics.FlagSmallNucleus))
			}
			if hasFlag(s, kinetics.FlagLowBarrier) != (s.Nucleus.Barrier < kinetics.LowBarrier*kT) {
				t.Errorf("γ=%g T=%g: ΔG*/kT = %g, low_barrier = %v", m.Gamma, T, s.Nucleus.Barrier/kT, hasFlag(s, kinetics.FlagLowBarrier))
			}
			small = small || hasFlag(s, kinetics.FlagSmallNucleus)
			low = low || hasFlag(s, kinetics.FlagLowBarrier)
		}
		if !small || m.Gamma == 0.05 && !low {
			t.Errorf("γ=%g: sweep never set small_nucleus (%v) / low_barrier (%v)", m.Gamma, small, low)
		}
	}
	// Callister's gold at ΔT = 1037 K (T = 300 K): n* ≈ 5 atoms.
	if s := gold.At(300); !hasFlag(s, kinetics.FlagSmallNucleus) {
		t.Errorf("gold at 300 K: n* = %g, flags %v, want small_nucleus", s.Nucleus.Size, s.Flags.Keys())
	}

	// No mobility below the VFT T0: ln D = −Inf, no nucleation, no growth.
	glass := goldCallister()
	glass.Mobility = kinetics.VFT{A: -4.5, B: 3000, T0: 500, Jump: 3e-10}
	md := mustModel(t, glass)
	for _, T := range []float64{300, 499.9, 500} {
		s := md.At(T)
		if !hasFlag(s, kinetics.FlagNoMobility) || !math.IsInf(s.LnD, -1) || !math.IsInf(s.LnJ, -1) || s.Growth != 0 {
			t.Errorf("VFT, T = %g: flags %v, ln D %g, ln J %g, u %g", T, s.Flags.Keys(), s.LnD, s.LnJ, s.Growth)
		}
	}
	if s := md.At(501); hasFlag(s, kinetics.FlagNoMobility) {
		t.Errorf("VFT, T = 501 above T0: flags %v", s.Flags.Keys())
	}

	// WLF more than 100 K above Tg.
	glass.Mobility = kinetics.WLF{Tg: 600, C1: kinetics.WLFC1, C2: kinetics.WLFC2, EtaG: kinetics.EtaAtTg, Jump: 3e-10}
	md = mustModel(t, glass)
	for _, c := range []struct {
		T    float64
		want bool
	}{{650, false}, {700, false}, {700.5, true}, {900, true}} {
		if got := hasFlag(md.At(c.T), kinetics.FlagWLFFarAboveTg); got != c.want {
			t.Errorf("WLF Tg = 600 K, T = %g: wlf_far_above_tg = %v, want %v", c.T, got, c.want)
		}
	}
	if s := md.At(500); !hasFlag(s, kinetics.FlagNoMobility) || !math.IsInf(s.LnJ, -1) {
		t.Errorf("WLF below Tg − C2: flags %v, ln J %g", s.Flags.Keys(), s.LnJ)
	}

	// Outside a tabulated driving force.
	tab, _ := cnt.NewTable([]float64{800, 1000, 1400}, []float64{5000, 3000, -1000}, "hand")
	tm := goldCallister()
	tm.Driving = tab
	md = mustModel(t, tm)
	if s := md.At(700); s.Flags != kinetics.FlagOutsideTable {
		t.Errorf("table, T = 700: flags %v, want [outside_table]", s.Flags.Keys())
	}
}

func TestFlagKeys(t *testing.T) {
	all := kinetics.FlagNoDrivingForce | kinetics.FlagSmallNucleus | kinetics.FlagLowBarrier |
		kinetics.FlagNoMobility | kinetics.FlagWLFFarAboveTg | kinetics.FlagOutsideTable
	want := "no_driving_force small_nucleus low_barrier no_mobility wlf_far_above_tg outside_table"
	if got := strings.Join(all.Keys(), " "); got != want {
		t.Errorf("Keys() = %q, want %q", got, want)
	}
	if n := len(all.Descriptions()); n != 6 {
		t.Errorf("%d descriptions, want 6", n)
	}
	if kinetics.Flag(0).Keys() != nil || kinetics.Flag(0).Descriptions() != nil {
		t.Errorf("no flags should give no keys")
	}
	if got := (kinetics.FlagLowBarrier | kinetics.FlagNoDrivingForce).Keys(); strings.Join(got, ",") != "no_driving_force,low_barrier" {
		t.Errorf("Keys() order = %v", got)
	}
}

// Wherever the model has a rate, ln J is a number or −Inf (no nucleation),
// never NaN and never +Inf, from 1 K to twice Te (DESIGN §3: no NaN/Inf in
// output; RULES).
func TestModelLnJNeverNaN(t *testing.T) {
	gold := goldCallister()
	vft := gold
	vft.Mobility = kinetics.VFT{A: -4.5, B: 3000, T0: 500, Jump: 3e-10}
	wlf := gold
	wlf.Mobility = kinetics.WLF{Tg: 600, C1: kinetics.WLFC1, C2: kinetics.WLFC2, EtaG: kinetics.EtaAtTg, Jump: 3e-10}
	tf := gold
	tf.Prefactor = kinetics.PrefactorTurnbullFisher
	fixed := gold
	fixed.Prefactor, fixed.J0, fixed.Mobility = kinetics.PrefactorFixed, 1e39, nil
	het := gold
	het.Theta, het.Sites = 20, 1e12
	hoff := gold
	hoff.Driving = cnt.Hoffman{Te: 1337, DH: gold.Driving.(cnt.Linear).DH}
	cp := gold
	cp.Driving = cnt.ConstantCp{Te: 1337, DH: gold.Driving.(cnt.Linear).DH, DCp: 3}
	for _, m := range []kinetics.Material{gold, vft, wlf, tf, fixed, het, hoff, cp} {
		md := mustModel(t, m)
		for T := 1.0; T <= 2*1337; T += 0.7 {
			s := md.At(T)
			if math.IsNaN(s.LnJ) || math.IsInf(s.LnJ, 1) {
				t.Fatalf("%s/%s/%s, T = %g: ln J = %g (flags %v)", m.Driving.Name(), mobName(m), m.Prefactor, T, s.LnJ, s.Flags.Keys())
			}
			if md.HasGrowth() && (math.IsNaN(s.Growth) || math.IsInf(s.Growth, 0) || s.Growth < 0) {
				t.Fatalf("%s/%s, T = %g: u = %g", m.Driving.Name(), mobName(m), T, s.Growth)
			}
		}
	}
	// Without a rate model, ln J is NaN by contract.
	none := gold
	none.Mobility = nil
	if s := mustModel(t, none).At(1000); !math.IsNaN(s.LnJ) || !math.IsNaN(s.Growth) {
		t.Errorf("no rate model: ln J, u = %g, %g, want NaN, NaN", s.LnJ, s.Growth)
	}
}

func mobName(m kinetics.Material) string {
	if m.Mobility == nil {
		return "none"
	}
	return m.Mobility.Name()
}

// Outside a tabulated driving force the model has no answer: ln J, the
// growth rate and the time lag are NaN and the state says why.
func TestModelOutsideTableLnJ(t *testing.T) {
	tab, _ := cnt.NewTable([]float64{800, 1000, 1400}, []float64{5000, 3000, -1000}, "hand")
	m := goldCallister()
	m.Driving = tab
	s := mustModel(t, m).At(700)
	if !math.IsNaN(s.LnJ) || !math.IsNaN(s.Growth) || !math.IsNaN(s.TimeLag()) || s.Flags&kinetics.FlagOutsideTable == 0 {
		t.Errorf("At(700 K) outside the table: ln J = %g, u = %g, lag = %g, flags %v; want NaN, NaN, NaN and outside_table",
			s.LnJ, s.Growth, s.TimeLag(), s.Flags.Keys())
	}
}

// ExampleModel_At evaluates a material at a few temperatures. The material is
// gold with the inputs of Callister's Example Problem 10.1 and an invented
// Arrhenius mobility (D0 = 1e-7 m²/s, Q = 40 kJ/mol): the rates are
// illustrative, not a prediction for gold.
func ExampleModel_At() {
	const a = 0.413e-9 // m, 4 atoms per cubic cell
	vm := cnt.Avogadro * a * a * a / 4
	md, err := kinetics.NewModel(kinetics.Material{
		Name:     "gold, invented mobility",
		Driving:  cnt.Linear{Te: 1337, DH: 1.16e9 * vm},
		Vm:       vm,
		Gamma:    0.132,
		Mobility: kinetics.Arrhenius{D0: 1e-7, Q: 40e3},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("T (K)  dT (K)  r* (nm)  n*         dG*/kT   log10 J   u (m/s)   flags")
	for _, T := range []float64{1400, 1300, 1107, 900, 300} {
		s := md.At(T)
		kT := cnt.Boltzmann * T
		fmt.Printf("%-6.0f %-7.0f %-8.3f %-10.4g %-8.4g %-9.2f %-9.3g %v\n",
			T, s.Undercooling, s.Nucleus.Radius*1e9, s.Nucleus.Size, s.Nucleus.Barrier/kT, s.Log10J(), s.Growth, s.Flags.Keys())
	}
	// Output:
	// T (K)  dT (K)  r* (nm)  n*         dG*/kT   log10 J   u (m/s)   flags
	// 1400   -63     +Inf     +Inf       +Inf     -Inf      0         [no_driving_force]
	// 1300   37      8.224    1.323e+05  2083     -864.68   0.294     []
	// 1107   230     1.323    550.7      63.32    12.42     1.02      []
	// 900    437     0.696    80.29      21.57    30.16     0.762     []
	// 300    1037    0.293    6.009      11.49    30.13     4.08e-05  [small_nucleus]
}

// NewModel accepts any θ in (0, 180]. For θ below about 1e-7° f(θ) rounds
// to 0; At then gives Z = NaN and, through ln β* = ln(24·D·0^(2/3)/λ²) = −Inf,
// ln J = −Inf ("no nucleation") for an all but barrierless nucleus, while at
// θ = 1e-6° ln J is large and positive.
func TestModelTinyContactAngle(t *testing.T) {
	m := goldCallister()
	m.Theta = 1e-7
	s := mustModel(t, m).At(1107)
	if math.IsNaN(s.Nucleus.Zeldovich) || math.IsInf(s.LnJ, -1) {
		t.Errorf("bug: kinetics/material.go NewModel accepts θ = 1e-7° where cnt.ShapeFactor = 0; At(1107 K): Z = %g, ln J = %g", s.Nucleus.Zeldovich, s.LnJ)
	}
}

// State.TimeLag says NaN only without a mobility law, and cnt.TimeLag gives
// +Inf for Z = 0; above Te with a mobility law the state has Z = 0 but
// LnBeta = NaN, so τ comes out NaN.
func TestStateTimeLagNoDrivingForce(t *testing.T) {
	s := mustModel(t, goldCallister()).At(1400)
	if tau := s.TimeLag(); !math.IsInf(tau, 1) {
		t.Errorf("bug: kinetics/state.go State.TimeLag above Te with a mobility law = %g, want +Inf (no nucleation, infinite lag) or a documented NaN", tau)
	}
}

// TestHeterogeneousSites: on a substrate with no site density given, every
// molecule counts as a site, and the model says so (DefaultSites and a flag
// on every state); with a density given it does not. At a fixed density the
// nickel card's rate at 1200 K rises from 15° to 1e-6° (with the
// homogeneous attachment law applied to the cap's n* it fell, from
// log10 J = 39.68 to 34.91).
func TestHeterogeneousSites(t *testing.T) {
	m := goldCallister()
	m.Theta = 60
	md := mustModel(t, m)
	if !md.DefaultSites() || md.At(1100).Flags&kinetics.FlagDefaultSites == 0 {
		t.Errorf("θ = 60° without sites: DefaultSites %v, flags %v", md.DefaultSites(), md.At(1100).Flags.Keys())
	}
	m.Sites = 1e20
	if md := mustModel(t, m); md.DefaultSites() || md.At(1100).Flags&kinetics.FlagDefaultSites != 0 {
		t.Errorf("θ = 60° with sites: flagged %v", md.At(1100).Flags.Keys())
	}
	if md := mustModel(t, goldCallister()); md.DefaultSites() {
		t.Error("homogeneous: DefaultSites")
	}
	ni := shippedModel(t, "ni").Material()
	lnJ := func(theta float64) float64 {
		m := ni
		m.Theta, m.Sites = theta, 1e20
		return mustModel(t, m).LnJ(1200)
	}
	if a, b := lnJ(15), lnJ(1e-6); !(b > a) {
		t.Errorf("nickel at 1200 K: log10 J = %.4f at 15°, %.4f at 1e-6°: want a rise", a/math.Ln10, b/math.Ln10)
	}
}
