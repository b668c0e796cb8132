package main

import (
	"fmt"
	"strings"

	"github.com/spf13/pflag"
	"gonum.org/v1/gonum/floats"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/answer"
	"undercool/presets/units"
)

func init() {
	commands["ttt"] = &command{
		summary: "The TTT curve: the time to transform a fraction in an isothermal hold at each temperature, with the nose (the fastest temperature) found to 0.01 K.",
		usage:   "undercool ttt [--material NAME|FILE.toml] [value flags] [--fraction X[,X...]] [--lag | --nuclei N] [--temps LIST | --range FROM:TO[:STEP]] [--plot FILE.svg|FILE.png] [--format F]",
		example: "undercool ttt --material demo-alloy --fraction 0.01,0.5,0.99 --plot ttt.svg",
		setup:   setupTTT,
	}
}

// plotPoints is the number of temperatures a TTT or rate plot is drawn
// with, whatever the number of table rows.
const plotPoints = 200

// jmakFlags are the flags that choose the isothermal transformation law.
type jmakFlags struct {
	fraction *fractionFlag
	lag      bool
	nuclei   *quantityFlag
}

func addJMAKFlags(fs *pflag.FlagSet, list bool) *jmakFlags {
	help := "transformed fraction, strictly between 0 and 1 (1e-6: the usual detection limit)"
	if list {
		help = "transformed fraction(s), each strictly between 0 and 1, comma-separated for several curves, e.g. 0.01,0.5,0.99 (1e-6: the usual detection limit)"
	}
	jf := &jmakFlags{fraction: addFraction(fs, list, help)}
	fs.BoolVar(&jf.lag, "lag", false, "add the time lag of nucleation, Kashchiev's theta = 2/(3 pi Z^2 beta*), to the time (default off)")
	jf.nuclei = addQuantity(fs, "nuclei", units.NumberDensity, "nuclei per m^3", "site saturation: this many pre-existing nuclei per volume grow, none form (m^-3 or cm-3, > 0); default continuous nucleation at J(T)")
	return jf
}

// jmak is the transformation law the flags ask for.
func (jf *jmakFlags) jmak() (kinetics.JMAK, error) {
	j := kinetics.JMAK{Lag: jf.lag, Nuclei: jf.nuclei.x}
	if j.Nuclei > 0 && j.Lag {
		return j, usagef("--lag and --nuclei: the time lag is that of forming nuclei; with pre-existing nuclei there is none, give one or the other")
	}
	return j, nil
}

// canTransform turns a model that cannot give times into bad input that
// says which values are missing.
func canTransform(md *kinetics.Model, j kinetics.JMAK) error {
	if err := md.CanTransform(j); err != nil {
		if !md.HasGrowth() {
			return noMobility("time to transform")
		}
		return usage(err)
	}
	return nil
}

// noseSpan is the nose-search range of a table: the span of the
// temperatures given, or the material's default range (also for a single
// temperature, which has no curve to find a nose on).
func noseSpan(temps []float64, given bool, md *kinetics.Model) (lo, hi float64) {
	if given {
		lo, hi = floats.Min(temps), floats.Max(temps)
	}
	if (!given || !(lo < hi)) && md.HasTe() {
		lo, hi = answer.DefaultSpan(md)
	}
	return lo, hi
}

func setupTTT(fs *pflag.FlagSet, e *env) func([]string) error {
	mf := addMaterialFlags(fs)
	jf := addJMAKFlags(fs, true)
	tf := addTempFlags(fs, e, 31)
	pf := addPlot(fs, "draw the TTT curve(s), temperature against log time,")
	ff := addFormat(fs, e)
	sf := addSpreadFlags(fs)
	return func(args []string) error {
		if err := start("ttt", args, sf); err != nil {
			return err
		}
		j, err := jf.jmak()
		if err != nil {
			return err
		}
		c, md, err := mf.model()
		if err != nil {
			return err
		}
		if err := canTransform(md, j); err != nil {
			return err
		}
		temps, err := tf.list(md)
		if err != nil {
			return err
		}
		lo, hi := noseSpan(temps, tf.given(), md)
		if !(lo < hi) {
			return noTe("--temps", "no default range to find the nose in: give two temperatures or more")
		}
		smp, err := sf.sampling(e, c)
		if err != nil {
			return err
		}
		a, err := answer.TTTs(answer.TTTInput{Card: c, Model: md, Temps: temps, Fractions: jf.fraction.X, JMAK: j, Lo: lo, Hi: hi, Sampling: smp, Names: flagNames})
		if err != nil {
			return err
		}
		return renderWithPlot(e, a, ff, pf, func() error {
			return writeTTTPlot(pf, md, c, a.Curves)
		})
	}
}

// writeTTTPlot draws the TTT curves of a table on plotPoints temperatures
// over its nose range, whatever its rows, and writes the file.
func writeTTTPlot(pf *plotFlag, md *kinetics.Model, c *presets.Card, table *kinetics.TTT) error {
	fig, err := tttFigureOf(md, c, table)
	if err != nil {
		return err
	}
	p, err := fig.plot()
	if err != nil {
		return err
	}
	return savePlots(pf, p)
}

// tttFigureOf is the figure of the TTT curves of a table.
func tttFigureOf(md *kinetics.Model, c *presets.Card, table *kinetics.TTT) (*tttFigure, error) {
	fig := &tttFigure{}
	if err := tttCurves(fig, md, table.Fractions, table.JMAK, table.Lo, table.Hi); err != nil {
		return nil, err
	}
	labels := make([]string, len(table.Fractions))
	for k, X := range table.Fractions {
		labels[k] = answer.FracLabel(X)
	}
	fig.title = fmt.Sprintf("TTT, %s: X = %s", figureName(c), strings.Join(labels, ", "))
	if j := table.JMAK; j.Nuclei > 0 {
		fig.title += fmt.Sprintf(", %.3g nuclei/m3", j.Nuclei)
	} else if j.Lag {
		fig.title += ", with time lag"
	}
	return fig, nil
}
