package main

import (
	"math"

	"github.com/spf13/pflag"

	"undercool/presets"
)

func init() {
	commands["materials"] = &command{
		summary: "List the shipped material cards, or show one card with every value, its unit and its source.",
		usage:   "undercool materials [NAME|FILE.toml] [--format F]",
		example: "undercool materials lithium-disilicate",
		setup:   setupMaterials,
	}
}

func setupMaterials(fs *pflag.FlagSet) func(*env, []string) error {
	ff := addFormatFlag(fs)
	return func(e *env, args []string) error {
		if err := ff.check(); err != nil {
			return err
		}
		switch len(args) {
		case 0:
			return listMaterials(e, ff.value)
		case 1:
			return showMaterial(e, args[0], ff.value)
		}
		return usagef("materials: give at most one material, got %d", len(args))
	}
}

func listMaterials(e *env, format string) error {
	r := &result{
		title:  "undercool materials: shipped material cards",
		about:  []string{"show one with: undercool materials NAME; use one with: --material NAME"},
		inputs: object{},
		cols: []column{
			{"name", "name", nil}, {"kind", "kind", nil},
			{"T_e (K)", "equilibrium_temperature_k", fixed(2)}, {"description", "description", nil},
		},
	}
	for _, n := range presets.Names() {
		c, err := presets.Preset(n)
		if err != nil {
			return err // a shipped card that does not load is a bug, caught by the tests
		}
		te := math.NaN()
		if c.Has("te") {
			te = c.SI("te")
		} else if c.Driving == "solution" && c.Has("sat_temp") {
			te = c.SI("sat_temp") // a solution's equilibrium is its saturation temperature
		}
		r.rows = append(r.rows, []any{c.Name, c.Kind, te, c.Description})
	}
	return r.render(e.stdout, format)
}

func showMaterial(e *env, name, format string) error {
	c, err := presets.Open(name)
	if err != nil {
		return usagef("materials: %v", err)
	}
	driving := c.Driving
	if c.Driving == "table" {
		driving += " " + c.DrivingFile
	}
	mob, pre := c.Mobility, c.Prefactor
	if mob == "" {
		mob = "none"
	}
	if pre == "" {
		pre = "attachment"
	}
	r := &result{
		title: "undercool materials: " + c.Name,
		about: []string{
			"card: " + c.File, "kind: " + c.Kind, "description: " + c.Description,
			"models: driving force " + driving + "; mobility " + mob + "; prefactor " + pre,
		},
		inputs: object{{"material", c.Name}, {"card", c.File}, {"kind", c.Kind}, {"description", c.Description},
			{"driving", driving}, {"mobility", mob}, {"prefactor", pre}},
		cols: []column{
			{"key", "key", nil}, {"value", "text", nil}, {"SI value", "value_si", sig(6)},
			{"SI unit", "unit_si", nil}, {"meaning", "meaning", nil}, {"source", "source", nil},
		},
	}
	for _, p := range presets.Params {
		v, ok := c.Values[p.Key]
		if !ok {
			continue
		}
		r.rows = append(r.rows, []any{p.Key, v.Text, v.SI, v.Kind.SI, p.About, v.Source})
	}
	return r.render(e.stdout, format)
}
