package main

import (
	"strings"

	"github.com/spf13/pflag"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/units"
)

// materialFlags choose a material and override its values: --material,
// the model choices, and one flag per value of presets.Params.
type materialFlags struct {
	material   *pathFlag // a preset's name or a card file; its files are the command's
	driving    *choiceFlag
	mobility   *choiceFlag
	prefactor  *choiceFlag
	gammaLaw   *choiceFlag
	growth     *choiceFlag
	solubility *textFlag
	values     []*valueFlag // in the order of presets.Params
}

// valueFlag is one value of a card given on the command line.
type valueFlag struct {
	given
	p presets.Param
	v presets.Value
}

func (f *valueFlag) Set(s string) error {
	v, err := presets.ParseValue(f.p, s)
	if err != nil {
		return &valueError{err}
	}
	v.Source = "command line"
	f.v, f.given = v, given{true, s}
	return nil
}

// bareKelvin is the value of a temperature (te, tg, sat_temp, vft_t0)
// written without a unit.
func (f *valueFlag) bareKelvin() []float64 {
	if f.set && f.v.Kind.Name == units.Temperature.Name && isBare(f.text) {
		return []float64{f.v.SI}
	}
	return nil
}

// flagName is the flag of a card key or an input: '_' written '-'.
func flagName(key string) string { return strings.ReplaceAll(key, "_", "-") }

// flagNames names an input by its flag, for the hints of an answer.
func flagNames(input string) string { return "--" + flagName(input) }

// choicesHelp lists the choices of a model axis for help, the table choice
// of the driving force written as a file.
func choicesHelp(choices []string) string {
	var out []string
	for _, c := range choices {
		if c != "table" {
			out = append(out, c)
		}
	}
	return strings.Join(out, ", ")
}

// addMaterialFlags declares --material, the model choices and one flag per card value.
func addMaterialFlags(fs *pflag.FlagSet) *materialFlags {
	mf := &materialFlags{}
	mf.material = addInput(fs, "material", "shipped card name or path to a .toml card (see undercool materials)")
	mf.material.isPath = presets.IsPath
	isCSV := func(s string) bool { return strings.HasSuffix(strings.ToLower(s), ".csv") }
	driving := choicesHelp(presets.DrivingChoices)
	mf.driving = addChoice(fs, "driving", "", presets.DrivingChoices, "driving force: "+driving+", or FILE.csv with temperature_k and dg_j_per_mol columns")
	mf.driving.choices = without(presets.DrivingChoices, "table")
	mf.driving.other, mf.driving.msg = isCSV, driving+", or a FILE.csv"
	mf.mobility = addChoice(fs, "mobility", "", presets.MobilityChoices, "mobility law: "+strings.Join(presets.MobilityChoices, ", ")+" (stokes-einstein and diffusivity: a solute in a solvent)")
	mf.prefactor = addChoice(fs, "prefactor", "", presets.PrefactorChoices, "rate prefactor: "+strings.Join(presets.PrefactorChoices, ", ")+" (attachment: the default; diffusion: solutions)")
	mf.gammaLaw = addChoice(fs, "gamma-law", "", presets.GammaLawChoices, "interfacial energy law: "+strings.Join(presets.GammaLawChoices, ", ")+" (linear: --gamma at --gamma-t-ref plus --gamma-slope (T - ref); negentropic: gamma proportional to T)")
	growth := choicesHelp(presets.GrowthChoices)
	mf.growth = addChoice(fs, "growth", "", presets.GrowthChoices, "growth law: "+growth+" (viscosity-power: --growth-ug, --growth-xi; arrhenius: --growth-u0, --growth-q), or FILE.csv with temperature_k and growth_rate_m_per_s columns")
	mf.growth.choices = without(presets.GrowthChoices, "table")
	mf.growth.other, mf.growth.msg = isCSV, growth+", or a FILE.csv"
	mf.solubility = addText(fs, "solubility", "solubility table FILE.csv (temperature_UNIT, solubility_UNIT) for driving solution, with --conc or --sat-temp")
	setGroup(fs, groupMaterial, "material", "driving", "mobility", "prefactor")
	setGroup(fs, groupSolution, "solubility")
	for _, p := range presets.Params {
		f := &valueFlag{p: p}
		help := p.About
		if u := p.Units(); u != "" {
			help += " (" + u + ")"
		}
		fs.Var(f, p.Flag(), help)
		setGroup(fs, paramGroup(p), p.Flag())
		mf.values = append(mf.values, f)
	}
	return mf
}

func without(list []string, s string) []string {
	var out []string
	for _, x := range list {
		if x != s {
			out = append(out, x)
		}
	}
	return out
}

// given names the first material flag given, in the order of the help;
// "" for none.
func (mf *materialFlags) given() string {
	named := []struct {
		name string
		set  bool
	}{{"material", mf.material.set}, {"driving", mf.driving.set}, {"mobility", mf.mobility.set},
		{"prefactor", mf.prefactor.set}, {"gamma-law", mf.gammaLaw.set}, {"growth", mf.growth.set}, {"solubility", mf.solubility.set}}
	for _, f := range named {
		if f.set {
			return f.name
		}
	}
	for _, f := range mf.values {
		if f.set {
			return f.p.Flag()
		}
	}
	return ""
}

// card returns the material card with every flag applied.
func (mf *materialFlags) card() (*presets.Card, error) {
	var c *presets.Card
	if mf.material.set {
		var err error
		if c, err = presets.Open(mf.material.text); err != nil {
			return nil, usagef("--material: %v", err)
		}
	} else {
		c = &presets.Card{Name: "command line", Kind: "demo", Driving: "linear", Values: map[string]presets.Value{}, File: "command line"}
	}
	solution := mf.solubility.set
	var changed []string
	for _, f := range mf.values {
		if f.set {
			changed = append(changed, f.p.Key)
			c.Values[f.p.Key] = f.v
			solution = solution || f.p.For == presets.Choice{Axis: "driving", Name: "solution"}
		}
	}
	if mf.solubility.set {
		c.SolubilityFile = mf.solubility.text
	}
	// A value only a solution reads makes the driving force a solution,
	// unless --driving says otherwise.
	if solution && !mf.driving.set && c.Driving != "solution" {
		c.Driving = "solution"
		if c.Kind == "demo" && c.File == "command line" {
			c.Kind = "solution"
		}
	}
	if d := mf.driving; d.set {
		if strings.HasSuffix(strings.ToLower(d.value), ".csv") {
			c.Driving, c.DrivingFile = "table", d.value
		} else {
			c.Driving = d.value
		}
	}
	if mf.mobility.set {
		c.Mobility = mf.mobility.value
	}
	if mf.prefactor.set {
		c.Prefactor = mf.prefactor.value
	}
	if mf.gammaLaw.set {
		c.GammaLaw = mf.gammaLaw.value
	}
	if g := mf.growth; g.set {
		if strings.HasSuffix(strings.ToLower(g.value), ".csv") {
			c.Growth, c.GrowthFile = "table", g.value
		} else {
			c.Growth, c.GrowthFile = g.value, ""
		}
	}
	for _, f := range []struct {
		name string
		set  bool
	}{{"driving", mf.driving.set}, {"mobility", mf.mobility.set}, {"prefactor", mf.prefactor.set}, {"gamma_law", mf.gammaLaw.set}, {"growth", mf.growth.set}} {
		if f.set {
			changed = append(changed, f.name)
		}
	}
	c.Changed(changed)
	// The tables the card or the flags name are inputs too.
	if fl := mf.material.files; fl != nil {
		for _, path := range []string{c.DrivingFile, c.SolubilityFile, c.GrowthFile} {
			if err := fl.input(path); err != nil {
				return nil, err
			}
		}
	}
	return c, nil
}

// model returns the card and the model it describes.
func (mf *materialFlags) model() (*presets.Card, *kinetics.Model, error) {
	c, err := mf.card()
	if err != nil {
		return nil, nil, err
	}
	md, err := c.Model()
	if err != nil {
		return nil, nil, usage(err)
	}
	return c, md, nil
}

// noMobility is the error of a material that cannot give times, for a
// command that needs what.
func noMobility(what string) error {
	return usagef("the material has no mobility law, so no growth rate and no %s: give --mobility with its values (--d0 and --q, or --vft-a, --vft-b and --vft-t0, or --tg)", what)
}
