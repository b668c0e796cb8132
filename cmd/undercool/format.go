package main

import (
	"strings"

	"github.com/spf13/pflag"
)

// formatFlag is --format, shared by every command with a result.
type formatFlag struct{ value string }

func addFormatFlag(fs *pflag.FlagSet) *formatFlag {
	f := &formatFlag{}
	fs.StringVar(&f.value, "format", "table", "output format: table, csv, json or markdown")
	return f
}

func (f *formatFlag) check() error {
	if !contains(formats, f.value) {
		return usagef("--format: %q is not one of %s", f.value, strings.Join(formats, ", "))
	}
	return nil
}
