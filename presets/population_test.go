package presets

import (
	"errors"
	"math"
	"strings"
	"testing"

	"undercool/cnt"
	"undercool/kinetics/population"
)

func mustPopulation(t *testing.T, name string, set map[string]string) *Population {
	t.Helper()
	c, err := Preset(name)
	if err != nil {
		t.Fatal(err)
	}
	for k, v := range set {
		if err := c.Set(k, v, "test"); err != nil {
			t.Fatalf("Set(%s, %s): %v", k, v, err)
		}
	}
	p, err := c.Population()
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return p
}

// The alloy card builds the ageing alloy of its values: the solvus
// through Fujikawa et al.'s two points, 0.186 at.% at 913 K and 0.033 at.%
// at 743 K, is met to the five digits printed on the card, and the alloy's
// solvus temperature is the model's T_e (to rounding).
func TestAlloyCardPopulation(t *testing.T) {
	p := mustPopulation(t, "al-sc", nil)
	a := p.Alloy
	if a == nil || p.Crystallizer != nil {
		t.Fatalf("al-sc is not an alloy: %+v", p)
	}
	if a.C0 != 0.0018 || a.Cp != 0.25 || a.Lattice != 0.4103e-9 {
		t.Errorf("c0, cp, lattice = %g, %g, %g", a.C0, a.Cp, a.Lattice)
	}
	for _, pt := range [][2]float64{{913, 0.00186}, {743, 0.00033}} {
		if c := math.Exp(a.Solvus.LnSolubility(pt[0])); math.Abs(c-pt[1]) > 1e-4*pt[1] {
			t.Errorf("solvus at %g K: %.6g, want %g", pt[0], c, pt[1])
		}
	}
	te := a.Solvus.(population.Solvus).Temperature(a.C0)
	if math.Abs(te-p.Model.Te()) > 1e-9*te {
		t.Errorf("solvus temperature %g K, model T_e %g K", te, p.Model.Te())
	}
	if a.Sites != 0 || math.Abs(a.Vm-10.399e-6) > 1e-18 || a.Gamma != 0.094 {
		t.Errorf("sites, vm, gamma = %g, %g, %g", a.Sites, a.Vm, a.Gamma)
	}
}

// The solution card builds a batch crystallizer: the charge is conc
// (143 g/L) over the molar mass, 946.0 mol per m³ of solvent, saturated at
// 25 °C by the van 't Hoff law of the card; the interfacial energy on the
// card is Mersmann's estimate from its own density and solubility,
// γ = 0.414·k_BT·(ρN_A/M)^(2/3)·ln(ρ/(M·c*)) at 25 °C (Mersmann A., J.
// Cryst. Growth 102 (1990) 841, from memory), to the three digits printed.
// Without a growth constant its growth is diffusion-limited; with one, the
// power law.
func TestCrystallizerCardPopulation(t *testing.T) {
	p := mustPopulation(t, "paracetamol-ethanol", nil)
	x := p.Crystallizer
	if x == nil || p.Alloy != nil {
		t.Fatalf("paracetamol-ethanol is not a crystallizer")
	}
	const M, rho = 0.15116, 1293.0
	if want := 143 / M; math.Abs(x.C0-want) > 1e-9*want {
		t.Errorf("C0 = %.6g mol/m3, want %.6g", x.C0, want)
	}
	if c := math.Exp(x.Solubility.LnSolubility(298.15)); math.Abs(c-x.C0) > 1e-9*x.C0 {
		t.Errorf("solubility at 25 C = %.6g, want the charge %.6g", c, x.C0)
	}
	cc := rho / M
	mersmann := 0.414 * cnt.Boltzmann * 298.15 * math.Pow(cc*cnt.Avogadro, 2.0/3) * math.Log(cc/x.C0)
	if g := x.Nucleus.Gamma; math.Abs(g-mersmann) > 0.005*mersmann {
		t.Errorf("gamma = %.4g J/m2, Mersmann's estimate %.4g J/m2", g, mersmann)
	}
	if x.Growth.Law != population.GrowthDiffusion || x.NoNucleation || len(x.Seeds) != 0 {
		t.Errorf("growth %v, no nucleation %v, seeds %v", x.Growth, x.NoNucleation, x.Seeds)
	}
	p = mustPopulation(t, "paracetamol-ethanol", map[string]string{"growth_kg": "0.1 um/s", "growth_order": "1.5", "seed_mass": "5 g/L", "seed_size": "100 um"})
	x = p.Crystallizer
	if g := x.Growth; g.Law != population.GrowthPower || g.Kg != 1e-7 || g.Order != 1.5 {
		t.Errorf("growth = %+v", g)
	}
	if len(x.Seeds) != 1 || x.Seeds[0].Mass != 5 || math.Abs(x.Seeds[0].Size-100e-6) > 1e-18 || x.MolarMass != M {
		t.Errorf("seeds %+v, molar mass %g", x.Seeds, x.MolarMass)
	}
}

// A solubility table in g/L becomes mol per m³ of solvent with the molar
// mass, and the charge is conc; a table in g/kg has no volume and is refused.
func TestCrystallizerTable(t *testing.T) {
	c := mustParse(t, solutionCard, "test.toml")
	c.SolubilityFile = writeTemp(t, "sol.csv", "temperature_c,solubility_g_per_l\n10,90\n20,120\n30,160\n")
	for k, v := range map[string]string{"conc": "150 g/L", "j0": "1e10 /m3/s", "growth_kg": "1e-7 m/s"} {
		if err := c.Set(k, v, "test"); err != nil {
			t.Fatal(err)
		}
	}
	c.Prefactor = "fixed"
	p, err := c.Population()
	if err != nil {
		t.Fatal(err)
	}
	x := p.Crystallizer
	if want := 150 / 0.180; math.Abs(x.C0-want) > 1e-9*want {
		t.Errorf("C0 = %g, want %g mol/m3", x.C0, want)
	}
	if c20, want := math.Exp(x.Solubility.LnSolubility(293.15)), 120/0.180; math.Abs(c20-want) > 1e-9*want {
		t.Errorf("solubility at 20 C = %g, want %g mol/m3", c20, want)
	}
	c.SolubilityFile = writeTemp(t, "sol.csv", "temperature_c,solubility_g_per_kg\n10,90\n20,120\n30,160\n")
	if err := c.Set("conc", "150 g/kg", "test"); err != nil {
		t.Fatal(err)
	}
	if _, err := c.Population(); err == nil || !strings.Contains(err.Error(), "per volume of solvent") {
		t.Errorf("mass ratio: %v, want the per-volume refusal", err)
	}
}

// Cards evolve cannot follow, and values it lacks, are errors that name
// the card and the value.
func TestPopulationErrors(t *testing.T) {
	tests := []struct {
		card    string
		set     map[string]string
		drop    []string
		missing string // the key of a *MissingError
		want    string
	}{
		{card: "demo-alloy", want: "not driving thompson-spaepen"},
		{card: "al-sc", drop: []string{"c0"}, missing: "c0"},
		{card: "al-sc", drop: []string{"solvus_b"}, missing: "solvus_b"},
		{card: "al-sc", set: map[string]string{"c0": "0.3"}, want: "must lie below cp"},
		{card: "al-sc", set: map[string]string{"c0": "0.2", "solvus_a": "-5"}, want: "never a single solid solution"},
		{card: "al-sc", set: map[string]string{"theta": "60"}, want: "not theta"},
		{card: "paracetamol-acetone-water", missing: "conc"},
		{card: "paracetamol-ethanol", set: map[string]string{"seed_mass": "1 g/L"}, missing: "seed_size"},
		{card: "paracetamol-ethanol", set: map[string]string{"supersaturation": "2"}, want: "not a fixed supersaturation"},
		{card: "paracetamol-acetone-water", set: map[string]string{"conc": "0.05"}, want: "per volume of solvent"},
		{card: "paracetamol-acetone-water", set: map[string]string{"conc": "1 mol/L"}, missing: "growth_kg"},
		{card: "paracetamol-acetone-water", set: map[string]string{"conc": "1 mol/L", "growth_kg": "1e-7 m/s"}, want: "nothing can crystallize"},
	}
	for _, tc := range tests {
		c, err := Preset(tc.card)
		if err != nil {
			t.Fatal(err)
		}
		for k, v := range tc.set {
			if err := c.Set(k, v, "test"); err != nil {
				t.Fatal(err)
			}
		}
		for _, k := range tc.drop {
			delete(c.Values, k)
		}
		_, err = c.Population()
		var me *MissingError
		switch {
		case err == nil:
			t.Errorf("%s %v -%v: no error", tc.card, tc.set, tc.drop)
		case tc.missing != "":
			if !errors.As(err, &me) || me.Key != tc.missing {
				t.Errorf("%s %v -%v: %v, want missing %s", tc.card, tc.set, tc.drop, err, tc.missing)
			}
		case !strings.Contains(err.Error(), tc.want) || !strings.HasPrefix(err.Error(), "preset "+tc.card):
			t.Errorf("%s %v -%v: %v, want %q after the card's name", tc.card, tc.set, tc.drop, err, tc.want)
		}
	}
}

// The crystallizer card outside evolve, as its standing says: ttt, hold and
// cool grow its crystals at the interface-controlled rate of the
// Stokes–Einstein diffusivity, about 0.3 m/s at 5 °C (between 0.1 and
// 1 m/s), orders of magnitude above growth from solution, and linear cooling
// runs below 50 K, far below the freezing of ethanol: the note calls their
// times not credible.
func TestCrystallizerCardOutsideEvolve(t *testing.T) {
	c, err := Preset("paracetamol-ethanol")
	if err != nil {
		t.Fatal(err)
	}
	md, err := c.Model()
	if err != nil {
		t.Fatal(err)
	}
	if u := md.At(278.15).Growth; !(u > 0.1 && u < 1) {
		t.Errorf("growth at 5 °C: %.3g m/s, the note says about 0.3 m/s", u)
	}
	cool, err := md.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	if end := cool.End; !(end < 50) {
		t.Errorf("linear cooling ends at %.1f K; the note says it runs to a few kelvin", end)
	}
	if !strings.Contains(c.Standing.Note, "not credible") || !c.Standing.Estimate() {
		t.Errorf("standing %q: an estimate whose note calls ttt, hold and cool not credible", c.Standing)
	}
}
