package presets

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"undercool/cnt"
	"undercool/kinetics"
)

// solutionCard is an invented solute in an invented solvent (values of the
// size met for small drug molecules), used to test the loader.
const solutionCard = `# invented for the tests
name = "test-solution"
kind = "solution"
description = "invented for the tests"
driving = "solution"

[values]
gamma      = { value = "2.5 mJ/m2",    source = "invented for the tests" }
molar_mass = { value = "180 g/mol",    source = "invented for the tests" }
density    = { value = "1.4 g/cm3",    source = "invented for the tests" }
`

func writeTemp(t *testing.T, name, text string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func solutionModel(t *testing.T, set map[string]string, table string) (*kinetics.Model, error) {
	t.Helper()
	c := mustParse(t, solutionCard, "test.toml")
	for k, v := range set {
		if err := c.Set(k, v, "test"); err != nil {
			t.Fatalf("Set(%s, %s): %v", k, v, err)
		}
	}
	if table != "" {
		c.SolubilityFile = writeTemp(t, "sol.csv", table)
	}
	return c.Model()
}

func TestSolutionCardDrivings(t *testing.T) {
	// V_m = M/ρ = 0.180/1400 m³/mol (common practice).
	md, err := solutionModel(t, map[string]string{"sat_temp": "40C", "dh_sol": "25 kJ/mol"}, "")
	if err != nil {
		t.Fatal(err)
	}
	m := md.Material()
	if want := 0.180 / 1400; math.Abs(m.Vm-want) > 1e-15 {
		t.Errorf("vm = %g, want M/ρ = %g", m.Vm, want)
	}
	if vh, ok := m.Driving.(cnt.VantHoff); !ok || vh.Tsat != 313.15 || vh.DHsol != 25e3 || md.Te() != 313.15 {
		t.Errorf("sat_temp + dh_sol: driving %#v, Te %g", m.Driving, md.Te())
	}

	md, err = solutionModel(t, map[string]string{"supersaturation": "2.5", "sat_temp": "300"}, "")
	if err != nil {
		t.Fatal(err)
	}
	if s, ok := md.Material().Driving.(cnt.Supersaturation); !ok || s.S != 2.5 || md.Te() != 300 {
		t.Errorf("fixed S: driving %#v, Te %g", md.Material().Driving, md.Te())
	}

	// A table in g/kg with conc in g/kg: T_sat where c_sat = conc (ln c linear in 1/T).
	table := "# invented\ntemperature_c,solubility_g_per_kg\n10,10\n20,15\n30,22\n40,32\n"
	md, err = solutionModel(t, map[string]string{"conc": "22 g/kg"}, table)
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := md.Material().Driving.(*cnt.SolubilityTable); !ok || math.Abs(md.Te()-303.15) > 1e-9 {
		t.Errorf("table + conc: driving %T, Te %g, want 303.15", md.Material().Driving, md.Te())
	}
	// The same with sat_temp: conc is the solubility there.
	md, err = solutionModel(t, map[string]string{"sat_temp": "30C"}, table)
	if err != nil {
		t.Fatal(err)
	}
	if tab := md.Material().Driving.(*cnt.SolubilityTable); math.Abs(tab.Conc-0.022) > 1e-15 || md.Te() != 303.15 {
		t.Errorf("table + sat_temp: conc %g, Te %g", tab.Conc, md.Te())
	}
	// A value on the card gives way to the other one given on the command line.
	c, _ := Parse([]byte(solutionCard+`sat_temp = { value = "40 C", source = "invented for the tests" }
`), "test.toml")
	c.SolubilityFile = writeTemp(t, "sol.csv", table)
	if err := c.Set("conc", "15 g/kg", "command line"); err != nil {
		t.Fatal(err)
	}
	if md, err := c.Model(); err != nil || math.Abs(md.Te()-293.15) > 1e-9 {
		t.Errorf("card sat_temp, command-line conc: %v, Te %v; want 293.15", err, md)
	}
	// A fixed S wins over the table, which still gives T_sat.
	md, err = solutionModel(t, map[string]string{"supersaturation": "1.8", "conc": "15 g/kg"}, table)
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := md.Material().Driving.(cnt.Supersaturation); !ok || math.Abs(md.Te()-293.15) > 1e-9 {
		t.Errorf("fixed S + table: driving %T, Te %g", md.Material().Driving, md.Te())
	}
}

func TestSolutionCardMobilityAndDiffusion(t *testing.T) {
	c, _ := Parse([]byte(solutionCard), "test.toml")
	for k, v := range map[string]string{"sat_temp": "313.15", "dh_sol": "25 kJ/mol", "solvent_viscosity": "0.89 mPa*s", "conc": "0.2 mol/l"} {
		if err := c.Set(k, v, "test"); err != nil {
			t.Fatal(err)
		}
	}
	c.Mobility, c.Prefactor = "stokes-einstein", "diffusion"
	md, err := c.Model()
	if err != nil {
		t.Fatal(err)
	}
	m := md.Material()
	// 0.2 mol/l = 200 mol/m³, times N_A.
	if want := 200 * cnt.Avogadro; math.Abs(m.Conc-want) > 1e-6*want {
		t.Errorf("number concentration %g, want %g", m.Conc, want)
	}
	if se, ok := m.Mobility.(kinetics.SolventViscosity); !ok || math.Abs(se.Eta-0.89e-3) > 1e-15 {
		t.Errorf("mobility %#v", m.Mobility)
	}
	// A mass concentration needs the molar mass: 36 g/l / 0.180 kg/mol = 200 mol/m³.
	c.Values["conc"], _ = ParseValue(mustParam("conc"), "36 g/l")
	md, err = c.Model()
	if err != nil {
		t.Fatal(err)
	}
	if want := 200 * cnt.Avogadro; math.Abs(md.Material().Conc-want) > 1e-6*want {
		t.Errorf("number concentration from g/l %g, want %g", md.Material().Conc, want)
	}
	c.Values["conc"], _ = ParseValue(mustParam("conc"), "36 g/kg")
	if _, err := c.Model(); err == nil || !strings.Contains(err.Error(), "number_conc") {
		t.Errorf("mass ratio without number_conc: %v", err)
	}
}

func mustParam(k string) Param {
	p, ok := ParamByKey(k)
	if !ok {
		panic(k)
	}
	return p
}

// A fixed supersaturation needs no saturation temperature: the model
// answers at a given temperature (Δg = k_B·T·ln S per molecule) and has no
// T_e, so every undercooling is NaN.
func TestFixedSupersaturationWithoutSatTemp(t *testing.T) {
	md, err := solutionModel(t, map[string]string{"supersaturation": "2"}, "")
	if err != nil {
		t.Fatal(err)
	}
	if md.HasTe() || !math.IsNaN(md.At(300).Undercooling) {
		t.Errorf("HasTe %v, undercooling %g: want no T_e and NaN", md.HasTe(), md.At(300).Undercooling)
	}
	want := cnt.Boltzmann * 300 * math.Log(2) // J per molecule
	if got := md.At(300).Dmu; math.Abs(got-want) > 1e-12*want {
		t.Errorf("Δμ at 300 K = %g J, want k_B T ln 2 = %g J", got, want)
	}
}

func TestSolutionCardErrors(t *testing.T) {
	good := "temperature_k,solubility_g_per_kg\n283.15,10\n293.15,15\n303.15,22\n"
	for _, c := range []struct {
		name  string
		set   map[string]string
		table string
		msg   string
	}{
		{"nothing", nil, "", `driving "solution" needs a supersaturation`},
		{"table without conc", nil, good, "needs the solution's concentration"},
		{"conc in other units", map[string]string{"conc": "0.1 mol/l"}, good, "is a molar concentration but the solubility table"},
		{"conc outside the table", map[string]string{"conc": "30 g/kg"}, good, "lies outside the solubilities of"},
		{"sat_temp outside the table", map[string]string{"sat_temp": "50C"}, good, "lies outside the solubility table"},
		{"conc and sat_temp disagree", map[string]string{"conc": "15 g/kg", "sat_temp": "25C"}, good, "disagree"},
		{"negative solubility", map[string]string{"conc": "15 g/kg"}, "temperature_k,solubility_g_per_kg\n283.15,10\n293.15,-15\n", "sol.csv:3: the solubility must be positive"},
		{"non-numeric solubility", map[string]string{"conc": "15 g/kg"}, "temperature_k,solubility_g_per_kg\n283.15,10\n293.15,abc\n", "sol.csv:3:"},
		{"temperatures not monotonic", map[string]string{"conc": "15 g/kg"}, "temperature_k,solubility_g_per_kg\n283.15,10\n303.15,22\n293.15,15\n", "sol.csv:4: temperatures must be strictly monotonic"},
		{"solubility not monotonic", map[string]string{"conc": "12 g/kg"}, "temperature_k,solubility_g_per_kg\n283.15,10\n293.15,15\n303.15,14\n", "sol.csv:4: the solubility does not rise"},
		{"solubility not monotonic, descending file", map[string]string{"conc": "12 g/kg"}, "temperature_k,solubility_g_per_kg\n303.15,14\n293.15,15\n283.15,10\n", "sol.csv:2: the solubility does not rise"},
		{"bad solubility unit", map[string]string{"conc": "12 g/kg"}, "temperature_k,solubility_kg\n283.15,10\n293.15,15\n", "the solubility column must be solubility_UNIT"},
		{"fixed S, non-monotonic table", map[string]string{"supersaturation": "2", "conc": "12 g/kg"}, "temperature_k,solubility_g_per_kg\n283.15,10\n293.15,15\n303.15,14\n", "does not rise"},
	} {
		_, err := solutionModel(t, c.set, c.table)
		if err == nil || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%s: error %v, want one containing %q", c.name, err, c.msg)
		}
	}
	// Values that never reach the card: S, conc and solubility must be positive numbers.
	for _, c := range []struct{ key, text, msg string }{
		{"supersaturation", "-2", "must be positive"},
		{"supersaturation", "0", "must be positive"},
		{"supersaturation", "two", "not a number"},
		{"supersaturation", "nan", "not a number"},
		{"conc", "-5 g/kg", "must be positive"},
		{"conc", "5 furlongs", "is not a molar concentration"},
		{"dh_sol", "-20 kJ/mol", "must be positive"},
	} {
		_, err := ParseValue(mustParam(c.key), c.text)
		if err == nil || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%s = %q: error %v, want one containing %q", c.key, c.text, err, c.msg)
		}
	}
}

// The shipped paracetamol card loads, and with a saturation temperature it
// gives the small nucleus the card warns of: at γ = 2 mJ/m² (Chem. Eng. Sci.
// 56 (2001) 2305, apparent value) and S ≈ 2 the critical nucleus holds a
// few molecules.
func TestParacetamolCard(t *testing.T) {
	c, err := Preset("paracetamol-acetone-water")
	if err != nil {
		t.Fatal(err)
	}
	if err := c.Set("sat_temp", "40C", "test"); err != nil {
		t.Fatal(err)
	}
	md, err := c.Model()
	if err != nil {
		t.Fatal(err)
	}
	// V_m = 151.16/1.293 cm³/mol = 116.9 cm³/mol.
	if vm := md.Material().Vm; math.Abs(vm-116.906e-6) > 0.01e-6 {
		t.Errorf("vm = %g, want 116.9 cm3/mol", vm)
	}
	s := md.At(283.15) // 30 K below saturation: ln S = (21.8e3/R)(30/(283.15·313.15)) ≈ 0.887
	if s.Flags&kinetics.FlagSmallNucleus == 0 || !(s.Nucleus.Size < 10) {
		t.Errorf("n* = %g, flags %v: want the small-nucleus flag", s.Nucleus.Size, s.Flags.Keys())
	}
	if md.HasRate() {
		t.Errorf("the card ships no rate model")
	}
}

// checkSolution holds a shipped solution card to ranges met in solution
// crystallization (common practice): molar volumes of 20–1000 cm³/mol,
// apparent interfacial energies of 0.5–50 mJ/m² (values fitted to induction
// times sit well below those of melts), an enthalpy of solution per T_sat of
// 5–300 J/(mol K), and at 10 % below T_sat a positive driving force with a
// nucleus of 0.1–30 nm. A small nucleus must be flagged, not hidden.
func checkSolution(t *testing.T, c *Card, m *kinetics.Model) {
	t.Helper()
	mat := m.Material()
	if _, ok := m.Solution(); !ok {
		t.Fatalf("solution card without a solution driving force: %T", mat.Driving)
	}
	if vm := mat.Vm * 1e6; !(vm >= 20 && vm <= 1000) {
		t.Errorf("vm = %g cm3/mol", vm)
	}
	if g := mat.Gamma * 1e3; !(g >= 0.5 && g <= 50) {
		t.Errorf("gamma = %g mJ/m2", g)
	}
	if s := m.At(m.Te() - 1).DrivingMole; !(s >= 5 && s <= 300) {
		t.Errorf("dg per kelvin below saturation = %g J/(mol K)", s)
	}
	s := m.At(0.9 * m.Te())
	if !(s.Dmu > 0) {
		t.Fatalf("no driving force 10 %% below saturation")
	}
	if r := s.Nucleus.Radius * 1e9; !(r > 0.1 && r < 15) {
		t.Errorf("r* = %g nm", r)
	}
	if s.Nucleus.Size < kinetics.SmallNucleus && s.Flags&kinetics.FlagSmallNucleus == 0 {
		t.Errorf("n* = %g not flagged", s.Nucleus.Size)
	}
}

// Each family of concentration units reads, and the family is kept.
func TestReadSolubilityFamilies(t *testing.T) {
	for _, c := range []struct {
		header string
		si     float64 // of the value 2 in the file
		family string
	}{
		{"solubility_mol_per_l", 2000, "molar concentration"},
		{"solubility_g_per_l", 2, "mass concentration"},
		{"solubility_mg_per_ml", 2, "mass concentration"},
		{"solubility_g_per_kg", 0.002, "mass ratio"},
		{"solubility_g_per_100g", 0.02, "mass ratio"},
		{"solubility", 2, "number"},
	} {
		p := writeTemp(t, "s.csv", "temperature_k,"+c.header+"\n300,1\n310,2\n")
		sol, err := readSolubility(p)
		if err != nil {
			t.Errorf("%s: %v", c.header, err)
			continue
		}
		if math.Abs(sol.C[1]-c.si) > 1e-12*c.si || sol.Kind.Name != c.family {
			t.Errorf("%s: value %g (%s), want %g (%s)", c.header, sol.C[1], sol.Kind.Name, c.si, c.family)
		}
	}
}
