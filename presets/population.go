package presets

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/kinetics/population"
	"undercool/presets/units"
)

// A card with driving "dilute" is a precipitate of fixed composition
// forming from a dilute binary solid solution (an age-hardening alloy):
// c0, cp and the solvus ln c_eq = A − B/T (solvus_a, solvus_b) give the
// driving force at the nominal composition for every command, and with
// the mobility law, vm, gamma, sites and lattice the ageing alloy of
// evolve (Card.Population). A card with driving "solution" and a
// solubility law (sat_temp and dh_sol, or a solubility table) is, with
// its concentration conc, a batch crystallizer for evolve.

// dilute is the driving force of a dilute solid solution held at c0.
func (b *builder) dilute() (cnt.DrivingForce, error) {
	c := b.c
	c0 := b.need("c0", "solute mole fraction of the alloy, for driving dilute")
	cp := b.need("cp", "solute mole fraction of the precipitate, for driving dilute")
	s := population.Solvus{A: b.need("solvus_a", "solvus constant A, for driving dilute"), B: b.need("solvus_b", "solvus constant B, for driving dilute")}
	if b.err != nil {
		return nil, b.err
	}
	if !(c0 < cp) {
		return nil, fmt.Errorf("%s: c0 %s must lie below cp %s (the precipitate is richer in solute than the alloy)", c.File, c.Values["c0"].Text, c.Values["cp"].Text)
	}
	te := s.Temperature(c0)
	if math.IsNaN(te) {
		return nil, fmt.Errorf("%s: the solvus ln c_eq = %g - %g K/T lies below c0 = %g at every temperature: the alloy is never a single solid solution", c.File, s.A, s.B, c0)
	}
	return cnt.DiluteSolid{C0: c0, Cp: cp, Solvus: s, Te: te}, nil
}

// Population is the size-class system of a card for evolve: an ageing
// alloy (driving dilute) or a batch crystallizer (driving solution), and
// the card's model, which describes nucleation at the starting state.
type Population struct {
	Alloy        *population.Alloy        // driving dilute; nil otherwise
	Crystallizer *population.Crystallizer // driving solution; nil otherwise
	Model        *kinetics.Model
}

// Population builds the size-class system the card describes, from the
// same model as Card.Model with the values only evolve reads (lattice;
// growth_kg, growth_order, kv, seed_mass, seed_size). Errors name the card;
// a missing value is a *MissingError.
func (c *Card) Population() (*Population, error) {
	md, _, err := c.build()
	if err != nil {
		return nil, err
	}
	b := &builder{c: c, read: map[string]float64{}}
	p := &Population{Model: md}
	switch c.Driving {
	case "dilute":
		p.Alloy, err = b.alloy(md)
	case "solution":
		p.Crystallizer, err = b.crystallizer(md)
	default:
		return nil, fmt.Errorf("%s: evolve follows a precipitating alloy (driving dilute, with c0, cp, solvus_a and solvus_b) or a crystallizing solution (driving solution), not driving %s", c.File, c.Driving)
	}
	if err != nil {
		return nil, err
	}
	return p, nil
}

// Supersaturated reports whether the parent as charged (with none of its
// solute in particles) is supersaturated at temperature T (K).
func (p *Population) Supersaturated(T float64) bool {
	if p.Alloy != nil {
		return p.Alloy.Supersaturated(T)
	}
	return p.Crystallizer.Supersaturated(T)
}

// alloy is the ageing alloy of a dilute card.
func (b *builder) alloy(md *kinetics.Model) (*population.Alloy, error) {
	c, m := b.c, md.Material()
	d := m.Driving.(cnt.DiluteSolid)
	switch {
	case m.Mobility == nil:
		b.need("d0", "the diffusivity of the solute in the matrix (Arrhenius d0 and q), for evolve")
		return nil, b.err
	case m.Theta < 180:
		return nil, fmt.Errorf("%s: evolve's alloy nucleates homogeneously at its sites; give sites for the nucleation sites, not theta", c.File)
	case m.Prefactor != kinetics.PrefactorAttachment:
		return nil, fmt.Errorf("%s: evolve's alloy takes the attachment rate 4 pi r*^2 D c/a^4 of a solid solution; prefactor %s does not apply", c.File, m.Prefactor)
	}
	a := &population.Alloy{
		C0: d.C0, Cp: d.Cp, Solvus: d.Solvus.(population.Solvus), Vm: m.Vm, Gamma: m.Gamma,
		Mobility: m.Mobility, Lattice: b.given("lattice"), Sites: m.Sites,
	}
	if err := a.Check(); err != nil {
		return nil, fmt.Errorf("%s: %v", c.File, err)
	}
	return a, nil
}

// crystallizer is the batch crystallizer of a solution card: the charged
// concentration conc (per volume, in mol/m³ of solvent), its solubility
// law, the growth law and the seeds.
func (b *builder) crystallizer(md *kinetics.Model) (*population.Crystallizer, error) {
	c, m := b.c, md.Material()
	sol, _ := md.Solution()
	x := &population.Crystallizer{Nucleus: m, NoNucleation: !md.HasRate(), ShapeFactor: b.given("kv"), MolarMass: b.given("molar_mass")}
	switch d := sol.(type) {
	case cnt.VantHoff:
		conc := b.need("conc", "the concentration charged, saturated at sat_temp, for evolve")
		if b.err != nil {
			return nil, b.err
		}
		f, err := b.perMole(c.Values["conc"].Kind)
		if err != nil {
			return nil, err
		}
		x.C0 = conc * f
		x.Solubility = population.VantHoffSolubility{Law: d, Csat: x.C0}
	case *cnt.SolubilityTable:
		data := c.tables.sol
		f, err := b.perMole(data.Kind)
		if err != nil {
			return nil, err
		}
		scaled := make([]float64, len(data.C))
		for i, v := range data.C {
			scaled[i] = v * f
		}
		x.C0 = d.Conc * f
		tab, err := cnt.NewSolubilityTable(data.T, scaled, x.C0, d.Label)
		if err != nil {
			return nil, fmt.Errorf("%s: %v", data.File, err)
		}
		x.Solubility = tab
	default:
		return nil, fmt.Errorf("%s: evolve needs a solubility law that changes with temperature (sat_temp with dh_sol, or a solubility table with conc), not a fixed supersaturation", c.File)
	}
	if c.Has("growth_kg") {
		x.Growth = population.Growth{Law: population.GrowthPower, Kg: b.opt("growth_kg", 0), Order: b.opt("growth_order", 1)}
	} else {
		if m.Mobility == nil {
			b.need("growth_kg", "the crystal growth constant, or a mobility law (solute_diffusivity, solvent_viscosity) for diffusion-limited growth, for evolve")
			return nil, b.err
		}
		x.Growth = population.Growth{Law: population.GrowthDiffusion}
	}
	if c.Has("seed_mass") || c.Has("seed_size") {
		mass := b.need("seed_mass", "the mass of seed crystals per volume of solvent, with seed_size")
		size := b.need("seed_size", "the size of the seed crystals, with seed_mass")
		b.need("molar_mass", "the molar mass of the crystal, to count the seeds and their solute")
		if b.err != nil {
			return nil, b.err
		}
		x.Seeds = []population.Seed{{Mass: mass, Size: size}}
	}
	if x.NoNucleation && len(x.Seeds) == 0 {
		return nil, fmt.Errorf("%s: nothing can crystallize: the card has no nucleation rate model (a mobility law or prefactor fixed with j0) and no seeds (seed_mass, seed_size)", c.File)
	}
	if err := x.Check(); err != nil {
		return nil, fmt.Errorf("%s: %v", c.File, err)
	}
	return x, nil
}

// perMole is the factor from a concentration of a kind (in its SI unit)
// to mol per m³ of solvent: 1 for an amount concentration, 1/M for a mass
// concentration. A volume of solution is taken as its volume of solvent.
func (b *builder) perMole(k units.Kind) (float64, error) {
	c := b.c
	switch k.Name {
	case units.AmountConcentration.Name:
		return 1, nil
	case units.MassConcentration.Name:
		if M := b.need("molar_mass", "the molar mass of the solute, to turn a mass concentration into moles"); b.err == nil {
			return 1 / M, nil
		}
		return 0, b.err
	}
	return 0, fmt.Errorf("%s: evolve keeps the solute balance per volume of solvent: give conc (and the solubility table) as an amount concentration (mol/L) or a mass concentration (g/L, with molar_mass), not a %s", c.File, familyName(k))
}
