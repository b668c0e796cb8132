package kinetics_test

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"undercool/cnt"
	"undercool/kinetics"
)

// testMetal is an invented material with metal-like values (close to gold's
// melting point, enthalpy and volume; the mobility is made up), used where a
// valid model is needed and the numbers themselves are not under test.
func testMetal() kinetics.Material {
	return kinetics.Material{
		Name:     "invented test metal",
		Driving:  cnt.Linear{Te: 1337, DH: 12550},
		Vm:       10.2e-6,
		Gamma:    0.132,
		Mobility: kinetics.Arrhenius{D0: 1e-7, Q: 40e3},
	}
}

func mustModel(t testing.TB, m kinetics.Material) *kinetics.Model {
	t.Helper()
	md, err := kinetics.NewModel(m)
	if err != nil {
		t.Fatalf("NewModel(%s): %v", m.Name, err)
	}
	return md
}

func TestNewModelValid(t *testing.T) {
	m := testMetal()
	md := mustModel(t, m)
	v := m.Vm / cnt.Avogadro
	if got := md.MolecularVolume(); !close(got, v, 1e-15) {
		t.Errorf("v = %g, want Vm/NA = %g", got, v)
	}
	if got := md.JumpDistance(); !close(got, math.Cbrt(v), 1e-15) {
		t.Errorf("λ = %g, want v^(1/3) = %g", got, math.Cbrt(v))
	}
	if got := md.LnSites(); !close(got, -math.Log(v), 1e-15) {
		t.Errorf("ln N = %g, want −ln v = %g", got, -math.Log(v))
	}
	if md.ShapeFactor() != 1 || md.Material().Theta != 180 {
		t.Errorf("theta 0 should mean homogeneous: f = %g, θ = %g", md.ShapeFactor(), md.Material().Theta)
	}
	if !md.HasRate() || !md.HasGrowth() {
		t.Errorf("HasRate, HasGrowth = %v, %v with a mobility law", md.HasRate(), md.HasGrowth())
	}

	m.Jump, m.Sites, m.Theta = 2.5e-10, 1e20, 60
	md = mustModel(t, m)
	if md.JumpDistance() != 2.5e-10 || !close(md.LnSites(), math.Log(1e20), 1e-15) || md.ShapeFactor() != cnt.ShapeFactor(60) {
		t.Errorf("given λ, N, θ not used: %g, %g, %g", md.JumpDistance(), md.LnSites(), md.ShapeFactor())
	}

	// No mobility law: nucleus only, unless the prefactor is fixed.
	m = testMetal()
	m.Mobility = nil
	md = mustModel(t, m)
	if md.HasRate() || md.HasGrowth() {
		t.Errorf("no mobility: HasRate, HasGrowth = %v, %v, want false, false", md.HasRate(), md.HasGrowth())
	}
	m.Prefactor, m.J0 = kinetics.PrefactorFixed, 1e40
	md = mustModel(t, m)
	if !md.HasRate() || md.HasGrowth() {
		t.Errorf("fixed prefactor, no mobility: HasRate, HasGrowth = %v, %v, want true, false", md.HasRate(), md.HasGrowth())
	}

	// A table fills in Te from its sign change.
	tab, err := cnt.NewTable([]float64{300, 400, 500}, []float64{2000, 1000, -500}, "hand")
	if err != nil {
		t.Fatal(err)
	}
	m = testMetal()
	m.Driving = tab
	md = mustModel(t, m)
	if te := md.Te(); !close(te, 400+100*1000.0/1500, 1e-14) {
		t.Errorf("Te from table = %g, want 466.667", te)
	}
}

// Each required value, each range, each mobility parameter: NewModel
// returns an error naming the key (DESIGN §4: the message names what is
// wrong and what is allowed).
func TestNewModelErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	noCross, err := cnt.NewTable([]float64{300, 400}, []float64{2000, 1000}, "")
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name string
		edit func(*kinetics.Material)
		key  string
	}{
		{"no driving force", func(m *kinetics.Material) { m.Driving = nil }, "driving-force"},
		{"te = 0", func(m *kinetics.Material) { m.Driving = cnt.Linear{Te: 0, DH: 12550} }, "Te"},
		{"te < 0", func(m *kinetics.Material) { m.Driving = cnt.Linear{Te: -5, DH: 12550} }, "Te"},
		{"te NaN", func(m *kinetics.Material) { m.Driving = cnt.Linear{Te: nan, DH: 12550} }, "Te"},
		{"te +Inf", func(m *kinetics.Material) { m.Driving = cnt.Linear{Te: inf, DH: 12550} }, "Te"},
		{"table without sign change, no te", func(m *kinetics.Material) { m.Driving = noCross }, "equilibrium temperature"},
		{"vm = 0", func(m *kinetics.Material) { m.Vm = 0 }, "Vm"},
		{"vm NaN", func(m *kinetics.Material) { m.Vm = nan }, "Vm"},
		{"vm +Inf", func(m *kinetics.Material) { m.Vm = inf }, "Vm"},
		{"gamma = 0", func(m *kinetics.Material) { m.Gamma = 0 }, "Gamma"},
		{"gamma < 0", func(m *kinetics.Material) { m.Gamma = -0.1 }, "Gamma"},
		{"theta < 0", func(m *kinetics.Material) { m.Theta = -10 }, "Theta"},
		{"theta > 180", func(m *kinetics.Material) { m.Theta = 180.5 }, "Theta"},
		{"theta NaN", func(m *kinetics.Material) { m.Theta = nan }, "Theta"},
		{"sites < 0", func(m *kinetics.Material) { m.Sites = -1 }, "Sites"},
		{"sites NaN", func(m *kinetics.Material) { m.Sites = nan }, "Sites"},
		{"sites +Inf", func(m *kinetics.Material) { m.Sites = inf }, "Sites"},
		{"jump < 0", func(m *kinetics.Material) { m.Jump = -1e-10 }, "Jump"},
		{"tg < 0", func(m *kinetics.Material) { m.Tg = -1 }, "Tg"},
		{"j0 < 0", func(m *kinetics.Material) { m.J0 = -1 }, "J0"},
		{"fixed prefactor without j0", func(m *kinetics.Material) { m.Prefactor = kinetics.PrefactorFixed }, "J0"},
		{"arrhenius d0 = 0", func(m *kinetics.Material) { m.Mobility = kinetics.Arrhenius{Q: 1e5} }, "D0"},
		{"arrhenius d0 NaN", func(m *kinetics.Material) { m.Mobility = kinetics.Arrhenius{D0: nan, Q: 1e5} }, "D0"},
		{"arrhenius q NaN", func(m *kinetics.Material) { m.Mobility = kinetics.Arrhenius{D0: 1e-5, Q: nan} }, "Q"},
		{"arrhenius q Inf", func(m *kinetics.Material) { m.Mobility = kinetics.Arrhenius{D0: 1e-5, Q: inf} }, "Q"},
		{"vft b = 0", func(m *kinetics.Material) { m.Mobility = kinetics.VFT{A: -4, T0: 100, Jump: 3e-10} }, "VFT"},
		{"vft t0 < 0", func(m *kinetics.Material) { m.Mobility = kinetics.VFT{A: -4, B: 500, T0: -1, Jump: 3e-10} }, "VFT"},
		{"vft a NaN", func(m *kinetics.Material) { m.Mobility = kinetics.VFT{A: nan, B: 500, T0: 100, Jump: 3e-10} }, "VFT"},
		{"wlf tg = 0", func(m *kinetics.Material) { m.Mobility = kinetics.WLF{C1: 17.44, C2: 51.6, EtaG: 1e12, Jump: 3e-10} }, "Tg"},
		{"wlf c1 = 0", func(m *kinetics.Material) { m.Mobility = kinetics.WLF{Tg: 300, C2: 51.6, EtaG: 1e12, Jump: 3e-10} }, "C1"},
		{"wlf c2 = 0", func(m *kinetics.Material) { m.Mobility = kinetics.WLF{Tg: 300, C1: 17.44, EtaG: 1e12, Jump: 3e-10} }, "C2"},
		{"wlf eta-g = 0", func(m *kinetics.Material) { m.Mobility = kinetics.WLF{Tg: 300, C1: 17.44, C2: 51.6, Jump: 3e-10} }, "EtaG"},
	} {
		m := testMetal()
		c.edit(&m)
		md, err := kinetics.NewModel(m)
		if err == nil || md != nil || !strings.Contains(err.Error(), c.key) {
			t.Errorf("%s: NewModel = %v, %v; want an error naming %q", c.name, md, err, c.key)
		}
	}
}

func TestNewModelTurnbullFisherNeedsArrhenius(t *testing.T) {
	for _, mob := range []kinetics.Mobility{
		nil,
		kinetics.VFT{A: -4, B: 500, T0: 100, Jump: 3e-10},
		kinetics.WLF{Tg: 300, C1: 17.44, C2: 51.6, EtaG: 1e12, Jump: 3e-10},
	} {
		m := testMetal()
		m.Prefactor, m.Mobility = kinetics.PrefactorTurnbullFisher, mob
		if _, err := kinetics.NewModel(m); !errors.Is(err, kinetics.ErrNoMobility) {
			t.Errorf("turnbull-fisher with %v: error %v, want ErrNoMobility", mob, err)
		}
	}
	m := testMetal()
	m.Prefactor = kinetics.PrefactorTurnbullFisher
	mustModel(t, m)
}

func TestPrefactorNames(t *testing.T) {
	want := []string{"attachment", "turnbull-fisher", "fixed", "diffusion"}
	if got := kinetics.PrefactorNames(); strings.Join(got, ",") != strings.Join(want, ",") {
		t.Errorf("PrefactorNames() = %v, want %v", got, want)
	}
	for i, n := range want {
		p, ok := kinetics.ParsePrefactor(n)
		if !ok || int(p) != i || p.String() != n {
			t.Errorf("ParsePrefactor(%q) = %v, %v", n, p, ok)
		}
	}
	if _, ok := kinetics.ParsePrefactor("Attachment"); ok {
		t.Errorf("ParsePrefactor is case-sensitive; got ok for Attachment")
	}
}

// The VFT validation error says "finite vft-a", but infinite parameters pass.
func TestNewModelVFTInfinite(t *testing.T) {
	inf := math.Inf(1)
	var accepted []string
	for _, c := range []struct {
		name string
		vft  kinetics.VFT
	}{
		{"a = +Inf", kinetics.VFT{A: inf, B: 500, T0: 100, Jump: 3e-10}},
		{"a = -Inf", kinetics.VFT{A: -inf, B: 500, T0: 100, Jump: 3e-10}},
		{"b = +Inf", kinetics.VFT{A: -4, B: inf, T0: 100, Jump: 3e-10}},
		{"t0 = +Inf", kinetics.VFT{A: -4, B: 500, T0: inf, Jump: 3e-10}},
	} {
		m := testMetal()
		m.Mobility = c.vft
		if _, err := kinetics.NewModel(m); err == nil {
			accepted = append(accepted, c.name)
		}
	}
	if len(accepted) > 0 {
		t.Errorf("bug: kinetics/material.go NewModel (VFT case) accepts %s; the check tests only NaN for A and B > 0, T0 >= 0", strings.Join(accepted, ", "))
	}
}

// VFT and WLF carry their own jump distance for Stokes–Einstein; NewModel
// neither checks it nor fills it from Material.Jump/v^(1/3), so a law built
// without it gives D = +Inf.
func TestNewModelViscosityJump(t *testing.T) {
	var bad []string
	for _, mob := range []kinetics.Mobility{
		kinetics.VFT{A: -4, B: 500, T0: 100},
		kinetics.WLF{Tg: 300, C1: 17.44, C2: 51.6, EtaG: 1e12},
	} {
		m := testMetal()
		m.Mobility = mob
		md, err := kinetics.NewModel(m)
		if err != nil {
			continue // rejected: fine
		}
		s := md.At(1000)
		if math.IsInf(s.LnD, 0) || math.IsInf(s.LnJ, 0) || math.IsInf(s.Growth, 0) {
			bad = append(bad, fmt.Sprintf("%s (At(1000 K): ln D = %g, ln J = %g, u = %g)", mob.Name(), s.LnD, s.LnJ, s.Growth))
		}
	}
	if len(bad) > 0 {
		t.Errorf("bug: kinetics/material.go NewModel accepts a viscosity law with Jump = 0: %s", strings.Join(bad, "; "))
	}
}

// A molar volume so small that the molecule underflows is a unit mistake,
// not a material: refused, naming vm.
func TestNewModelTinyMolarVolume(t *testing.T) {
	m := testMetal()
	m.Vm = 1e-300
	_, err := kinetics.NewModel(m)
	if err == nil || !strings.HasPrefix(err.Error(), "Vm = ") {
		t.Errorf("Vm = 1e-300 m3/mol: err = %v, want an error naming vm", err)
	}
}
