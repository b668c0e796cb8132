package main

import (
	"bytes"

	"github.com/spf13/pflag"

	"undercool/presets/answer"
)

func init() {
	commands["rate"] = &command{
		summary: "The critical nucleus and the steady-state nucleation and growth rates over a range of temperatures.",
		usage:   "undercool rate [--material NAME|FILE.toml] [value flags] [--temps LIST | --range FROM:TO:STEP] [--format F]",
		example: "undercool rate --material demo-alloy --range 1100:700:50",
		setup:   setupRate,
	}
}

func setupRate(fs *pflag.FlagSet, e *env) func([]string) error {
	mf := addMaterialFlags(fs)
	tf := addTempFlags(fs, e, 21)
	ff := addFormat(fs, e)
	sf := addSpreadFlags(fs)
	pf := addPlot(fs, "draw log10 J and u against temperature")
	return func(args []string) error {
		if err := start("rate", args, sf); err != nil {
			return err
		}
		c, md, err := mf.model()
		if err != nil {
			return err
		}
		temps, err := tf.list(md)
		if err != nil {
			return err
		}
		smp, err := sf.sampling(e, c)
		if err != nil {
			return err
		}
		a, err := answer.Rates(answer.RateInput{Card: c, Model: md, Temps: temps, Sampling: smp, Names: flagNames})
		if err != nil {
			return err
		}
		if pf.set {
			if err := writeRatePlot(pf, figureName(c), md, temps); err != nil {
				return err
			}
		}
		return render(e.stdout, ff, a)
	}
}

// start checks what every command with a result checks before any work:
// no arguments, and --samples.
func start(name string, args []string, sf *spreadFlags) error {
	if err := noArgs(name, args); err != nil {
		return err
	}
	return sf.check()
}

// renderWithPlot renders a, then writes the plot where one is asked for,
// and only then prints a, so that a failed plot leaves no output.
func renderWithPlot(e *env, a answer.Answer, format *formatFlag, pf *plotFlag, plot func() error) error {
	var out bytes.Buffer
	if err := render(&out, format, a); err != nil {
		return err
	}
	if pf.set {
		if err := plot(); err != nil {
			return err
		}
	}
	_, err := e.stdout.Write(out.Bytes())
	return err
}
