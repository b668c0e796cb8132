package main

import (
	"fmt"
	"sort"
	"strings"

	"github.com/spf13/pflag"

	"undercool/kinetics"
	"undercool/presets"
)

// materialFlags are the flags that choose a material and override its values.
type materialFlags struct {
	material   string
	driving    string
	mobility   string
	prefactor  string
	solubility string             // --solubility FILE.csv (solution_flags.go)
	values     map[string]*string // card key → flag text
	fs         *pflag.FlagSet
}

func flagName(key string) string { return strings.ReplaceAll(key, "_", "-") }

// addMaterialFlags registers --material, the model choices and one flag per card value.
func addMaterialFlags(fs *pflag.FlagSet) *materialFlags {
	mf := &materialFlags{values: map[string]*string{}, fs: fs}
	fs.StringVar(&mf.material, "material", "", "shipped card name or path to a .toml card (see undercool materials)")
	fs.StringVar(&mf.driving, "driving", "", "driving force: linear, hoffman, thompson-spaepen, cp, solution, or FILE.csv with temperature_k and dg_j_per_mol columns")
	fs.StringVar(&mf.mobility, "mobility", "", "mobility law: "+strings.Join(presets.MobilityChoices, ", ")+" (stokes-einstein and diffusivity: a solute in a solvent)")
	fs.StringVar(&mf.prefactor, "prefactor", "", "rate prefactor: attachment (default), turnbull-fisher, fixed or diffusion (solutions)")
	fs.StringVar(&mf.solubility, "solubility", "", "solubility table FILE.csv (temperature_UNIT, solubility_UNIT) for driving solution, with --conc or --sat-temp")
	for _, p := range presets.Params {
		units := p.Kinds[0].SI
		if len(p.Kinds) > 1 {
			units += " or " + p.Kinds[1].SI
		}
		help := p.About
		if units != "" {
			help += " (" + units + ")"
		}
		mf.values[p.Key] = fs.String(flagName(p.Key), "", help)
	}
	return mf
}

// set reports whether the user gave a flag.
func (mf *materialFlags) set(name string) bool { return mf.fs.Changed(name) }

// card returns the material card with every flag applied.
func (mf *materialFlags) card() (*presets.Card, error) {
	var c *presets.Card
	if mf.material != "" {
		var err error
		if c, err = presets.Open(mf.material); err != nil {
			return nil, usagef("--material: %v", err)
		}
	} else {
		c = &presets.Card{Name: "command line", Kind: "demo", Driving: "linear", Values: map[string]presets.Value{}, File: "command line"}
	}
	keys := make([]string, 0, len(mf.values))
	for k := range mf.values {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		if !mf.set(flagName(k)) {
			continue
		}
		if err := c.Set(k, *mf.values[k], "command line"); err != nil {
			return nil, usagef("--%s: %v", flagName(k), err)
		}
	}
	mf.applySolution(c)
	if mf.set("driving") {
		switch d := mf.driving; {
		case strings.HasSuffix(strings.ToLower(d), ".csv"):
			c.Driving, c.DrivingFile = "table", d
		case d != "table" && contains(presets.DrivingChoices, d):
			c.Driving = d
		default:
			return nil, usagef("--driving: %q is not one of linear, hoffman, thompson-spaepen, cp, solution, or a FILE.csv", d)
		}
	}
	if mf.set("mobility") {
		if !contains(presets.MobilityChoices, mf.mobility) {
			return nil, usagef("--mobility: %q is not one of %s", mf.mobility, strings.Join(presets.MobilityChoices, ", "))
		}
		c.Mobility = mf.mobility
	} else if c.Mobility == "" {
		c.Mobility = inferMobility(c)
	}
	if mf.set("prefactor") {
		if !contains(presets.PrefactorChoices, mf.prefactor) {
			return nil, usagef("--prefactor: %q is not one of %s", mf.prefactor, strings.Join(presets.PrefactorChoices, ", "))
		}
		c.Prefactor = mf.prefactor
	}
	if c.Prefactor == "turnbull-fisher" && c.Mobility != "arrhenius" {
		return nil, usagef("--prefactor turnbull-fisher needs an arrhenius mobility law (--mobility arrhenius with --d0 and --q)")
	}
	return c, nil
}

// inferMobility picks the law a card without one implies by its values.
func inferMobility(c *presets.Card) string {
	switch {
	case c.Has("d0") || c.Has("q"):
		return "arrhenius"
	case c.Has("vft_a") || c.Has("vft_b") || c.Has("vft_t0"):
		return "vft"
	case c.Has("solvent_viscosity"):
		return "stokes-einstein"
	case c.Has("solute_diffusivity"):
		return "diffusivity"
	}
	return "none"
}

// model returns the card and the model it describes.
func (mf *materialFlags) model() (*presets.Card, *kinetics.Model, error) {
	c, err := mf.card()
	if err != nil {
		return nil, nil, err
	}
	md, err := c.Model()
	if err != nil {
		return nil, nil, usagef("%v", err)
	}
	return c, md, nil
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// describeCard gives the header lines and the JSON inputs for a card and model.
func describeCard(c *presets.Card, md *kinetics.Model) ([]string, object) {
	m := md.Material()
	mob := "none"
	if m.Mobility != nil {
		mob = m.Mobility.Name()
	}
	driving := m.Driving.Name()
	if c.Driving == "table" {
		driving = "table " + c.DrivingFile
	}
	pre := m.Prefactor.String()
	lines := []string{
		materialLine(c),
		fmt.Sprintf("models: driving force %s; mobility %s; prefactor %s; %s", driving, mob, pre, nucleationSite(m)),
	}
	var vals []string
	values := object{}
	for _, p := range presets.Params {
		v, ok := c.Values[p.Key]
		if !ok {
			continue
		}
		vals = append(vals, fmt.Sprintf("%s = %s", p.Key, v.Text))
		values = append(values, kv{p.Key, object{{"value_si", v.SI}, {"unit_si", v.Kind.SI}, {"text", v.Text}, {"source", v.Source}}})
	}
	for i := 0; i < len(vals); i += 6 {
		j := min(i+6, len(vals))
		prefix := "values: "
		if i > 0 {
			prefix = "        "
		}
		lines = append(lines, prefix+strings.Join(vals[i:j], ", "))
	}
	lines = append(lines, fmt.Sprintf("derived: v = %.4g m3 per molecule, jump distance = %.4g m, f(theta) = %.4g", md.MolecularVolume(), md.JumpDistance(), md.ShapeFactor()))
	inputs := object{
		{"material", c.Name}, {"card", c.File}, {"driving", driving}, {"mobility", mob}, {"prefactor", pre},
		{"equilibrium_temperature_k", md.Te()}, {"molecular_volume_m3", md.MolecularVolume()}, {"jump_distance_m", md.JumpDistance()},
		{"shape_factor", md.ShapeFactor()}, {"values", values},
	}
	lines, inputs = describeSolution(c, md, lines, inputs)
	return lines, inputs
}

// materialLine names the material and where its card came from.
func materialLine(c *presets.Card) string {
	if c.File == c.Name {
		return "material: " + c.Name
	}
	return fmt.Sprintf("material: %s (%s)", c.Name, c.File)
}

func nucleationSite(m kinetics.Material) string {
	if m.Theta >= 180 {
		if m.Sites > 0 {
			return fmt.Sprintf("homogeneous, %.3g sites/m3", m.Sites)
		}
		return "homogeneous, every molecule a site"
	}
	sites := "every molecule a site"
	if m.Sites > 0 {
		sites = fmt.Sprintf("%.3g sites/m3", m.Sites)
	}
	return fmt.Sprintf("heterogeneous, contact angle %.4g deg, %s", m.Theta, sites)
}
