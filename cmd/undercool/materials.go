package main

import (
	"github.com/spf13/pflag"

	"undercool/presets"
	"undercool/presets/answer"
)

func init() {
	commands["materials"] = &command{
		summary: "List the shipped material cards, or show one card with every value, its unit and its source.",
		usage:   "undercool materials [NAME|FILE.toml] [--format F]",
		example: "undercool materials lithium-disilicate",
		setup:   setupMaterials,
	}
}

func setupMaterials(fs *pflag.FlagSet, e *env) func([]string) error {
	ff := addFormat(fs, e)
	return func(args []string) error {
		switch len(args) {
		case 0:
			a, err := answer.ListShipped(flagNames)
			if err != nil {
				return err
			}
			return render(e.stdout, ff, a)
		case 1:
			c, err := presets.Open(args[0])
			if err != nil {
				return usagef("materials: %v", err)
			}
			return render(e.stdout, ff, answer.Show(c))
		}
		return usagef("materials: give at most one material, got %d", len(args))
	}
}
