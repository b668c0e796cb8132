package main

import (
	"io"
	"strings"

	"github.com/spf13/pflag"

	"undercool/presets"
	"undercool/presets/answer"
)

func init() {
	commands["fit"] = &command{
		summary: "Fit a model to measurements in a CSV file whose header names carry units: " +
			"arrhenius (Q and the pre-exponential from ln y against 1/T), " +
			"interface (the interfacial energy and a prefactor scale from measured nucleation rates, the rest of the material from --material and flags; with --gamma-law linear, gamma at --gamma-t-ref and its slope dgamma/dT together) or " +
			"growth (the kinetic coefficient of growth from measured growth rates, columns temperature_UNIT and growth_rate_UNIT: log10 u_g and the decoupling exponent xi of the viscosity-power law, or u_0 and Q_u of the Arrhenius law with --growth arrhenius; the driving force and viscosity from --material) or " +
			"avrami (n and k from transformed fractions against time) or " +
			"induction (the interfacial energy and the apparent prefactor A of a solution from induction times, ln t against 1/(T^3 ln^2 S); columns temperature_UNIT, supersaturation, induction_time_UNIT) or " +
			"kissinger (the apparent activation energy E and pre-exponential A from the peak temperatures of heating scans, ln(beta/Tp^2) against 1/Tp; columns heating_rate_UNIT, peak_temperature_UNIT) or " +
			"ozawa (with peak_temperature_UNIT: E from ln(beta) against 1/Tp, Ozawa-Flynn-Wall with Doyle's approximation; with temperature_UNIT and fraction: Ozawa's exponent m at each temperature from ln(-ln(1-X)) against ln(beta)). " +
			"The energy of a crystallization peak is apparent: it mixes nucleation and growth and is not the activation energy of diffusion. " +
			"Estimates come with standard errors and 95 % intervals (Student t, N - 2 degrees of freedom); two points give the exact answer and no interval. " +
			"Lines starting with # are comments; FILE - reads standard input.",
		usage:   "undercool fit arrhenius|interface|growth|avrami|induction|kissinger|ozawa FILE.csv [--weights] [--material NAME|FILE.toml] [value flags] [--keep-prefactor] [--keep-xi] [--card-out FILE.toml] [--plot FILE.svg|png] [--format F]",
		example: "undercool fit arrhenius testdata/fit/diffusion.csv --card-out solute.toml",
		setup:   setupFit,
	}
}

// fitKinds are the accepted first arguments of fit.
var fitKinds = []string{"arrhenius", "interface", "growth", "avrami", "induction", "kissinger", "ozawa"}

// fitFlags are the flags of the fit command.
type fitFlags struct {
	weights bool
	keepA   bool
	keepXi  bool
	cardOut *pathFlag
	kind    *choiceFlag
	plot    *plotFlag
	mf      *materialFlags
	volume  *quantityFlag
	format  *formatFlag
}

func setupFit(fs *pflag.FlagSet, e *env) func([]string) error {
	f := &fitFlags{}
	fs.BoolVar(&f.weights, "weights", false, "weigh the points by the file's weight column (relative weights on the logarithm, each > 0)")
	fs.BoolVar(&f.keepA, "keep-prefactor", false, "fit interface: hold the material's prefactor (A = 1) and fit only the interfacial energy (and its slope)")
	fs.BoolVar(&f.keepXi, "keep-xi", false, "fit growth: hold the decoupling exponent xi at the material's (--growth-xi, default 1) and fit only u_g")
	f.cardOut = addOutput(fs, "card-out", "write the fitted values as a material card FILE.toml, loadable with --material (arrhenius with a diffusivity column, interface, growth)")
	f.kind = addChoice(fs, "kind", "metal", presets.KindChoices, "kind of material written by arrhenius --card-out without --material: "+strings.Join(presets.KindChoices, ", "))
	f.plot = addPlot(fs, "draw the data and the fit (arrhenius: log y against 1000/T; avrami: the linearized plot; interface: log J against T and the classical plot; kissinger, ozawa: the line against 1000/Tp, or ln(-ln(1-X)) against ln(beta) at each temperature)")
	f.mf = addMaterialFlags(fs)
	f.volume = addVolume(fs, "", "fit induction: the volume of each sample, for the prefactor A from A·V, m3, L, mL, uL or mm3 (> 0)")
	f.format = addFormat(fs, e)
	setGroup(fs, groupOutput, "card-out", "kind")
	return func(args []string) error {
		if len(args) == 0 {
			return usagef("fit: give the kind of fit (%s) and a data file", strings.Join(fitKinds, ", "))
		}
		kind := args[0]
		if !contains(fitKinds, kind) {
			return usagef("fit: %q is not a kind of fit (%s)", kind, strings.Join(fitKinds, ", "))
		}
		if len(args) != 2 {
			return usagef("fit %s: give one data file (or - for standard input), got %d arguments", kind, len(args)-1)
		}
		if f.keepA && kind != "interface" {
			return usagef("--keep-prefactor: only fit interface holds a prefactor")
		}
		if f.keepXi && kind != "growth" {
			return usagef("--keep-xi: only fit growth has the exponent xi")
		}
		if f.cardOut.set && !strings.HasSuffix(strings.ToLower(f.cardOut.text), ".toml") {
			return usagef("--card-out: %q must end in .toml", f.cardOut.text)
		}
		if err := e.files.input(args[1]); err != nil {
			return err
		}
		a, card, err := f.fit(e, kind, args[1])
		if err != nil {
			return err
		}
		return f.finish(e, a, card)
	}
}

// carded is a fit that can be written as a card: the card and its header.
type carded func() (*presets.Card, []string, error)

// fit runs one fit and says how its card is made (nil: it has none).
func (f *fitFlags) fit(e *env, kind, path string) (answer.Answer, carded, error) {
	read := func(cols []presets.Column) (answer.FitData, error) {
		d, err := presets.ReadDataFile(path, e.stdin, cols)
		if err != nil {
			return answer.FitData{}, usage(err)
		}
		return answer.Weigh(d, f.weights, flagNames)
	}
	switch kind {
	case "arrhenius":
		data, err := read(answer.ArrheniusColumns())
		if err != nil {
			return nil, nil, err
		}
		a, err := answer.Arrhenius(data, flagNames)
		if err != nil {
			return nil, nil, err
		}
		return a, func() (*presets.Card, []string, error) {
			var base *presets.Card
			if f.mf.given() != "" {
				var err error
				if base, err = f.mf.card(); err != nil {
					return nil, nil, err
				}
			}
			return a.Card(base, f.kind.value)
		}, nil
	case "interface":
		if f.mf.given() == "" {
			return nil, nil, usagef("fit interface: give the material with --material NAME|FILE.toml (and flags); every value but gamma is taken from it")
		}
		c, err := f.mf.card()
		if err != nil {
			return nil, nil, err
		}
		data, err := read(answer.InterfaceColumns())
		if err != nil {
			return nil, nil, err
		}
		// gamma is what the fit finds: without one, start from the classical plot.
		if err := answer.StartGamma(c, data); err != nil {
			return nil, nil, usage(err)
		}
		if c, err = answer.InterfaceCard(c, data); err != nil {
			return nil, nil, err
		}
		md, err := c.Model()
		if err != nil {
			return nil, nil, usage(err)
		}
		if !md.HasRate() {
			return nil, nil, usagef("fit interface: the material has no rate; give a mobility law (--mobility with its values) or --prefactor fixed with --j0")
		}
		a, err := answer.Interface(c, md, data, f.keepA, flagNames)
		if err != nil {
			return nil, nil, err
		}
		return a, a.Card, nil
	case "growth":
		if f.mf.given() == "" {
			return nil, nil, usagef("fit growth: give the material with --material NAME|FILE.toml (and flags); its driving force and viscosity are used")
		}
		c, err := f.mf.card()
		if err != nil {
			return nil, nil, err
		}
		// The fit needs the driving force and the viscosity, not the law it
		// fits: the model is built with normal growth unless ξ is held.
		law := c.Choice("growth")
		if f.keepXi && law == "arrhenius" {
			return nil, nil, usagef("--keep-xi: the exponent xi belongs to the viscosity-power law, not arrhenius")
		}
		base := c.Clone()
		if !f.keepXi {
			base.Growth, base.GrowthFile = "normal", ""
		}
		md, err := base.Model()
		if err != nil {
			return nil, nil, usage(err)
		}
		if law != "arrhenius" {
			law = "viscosity-power"
			if !md.HasViscosity() {
				law = "arrhenius"
			}
		}
		if f.keepXi && law != "viscosity-power" {
			return nil, nil, usagef("--keep-xi: the exponent xi belongs to the viscosity-power law, not %s", law)
		}
		data, err := read(answer.GrowthColumns())
		if err != nil {
			return nil, nil, err
		}
		a, err := answer.Growth(c, md, data, law, f.keepXi, flagNames)
		if err != nil {
			return nil, nil, err
		}
		return a, a.Card, nil
	case "induction":
		c, err := f.mf.card()
		if err != nil {
			return nil, nil, err
		}
		if _, ok := c.MolarVolume(); !ok {
			return nil, nil, usagef("fit induction: give the molar volume of the crystal: --vm, or --molar-mass and --density (or a --material card with them)")
		}
		data, err := read(answer.InductionColumns())
		if err != nil {
			return nil, nil, err
		}
		a, err := answer.InductionTimes(answer.InductionFitInput{Card: c, Data: data, V: f.volume.x, VolumeText: f.volume.text, Names: flagNames})
		if err != nil {
			return nil, nil, err
		}
		return a, a.Card, nil
	}
	// The rest use no material and have no card.
	if n := f.mf.given(); n != "" {
		return nil, nil, usagef("--%s: fit %s uses no material; give only the data file", n, kind)
	}
	if f.cardOut.set {
		return nil, nil, usagef("--card-out: a material card has no place for %s; use the JSON output (--format json)", noCard[kind])
	}
	switch kind {
	case "kissinger":
		data, err := read(answer.PeakColumns())
		if err != nil {
			return nil, nil, err
		}
		a, err := answer.Kissinger(data, flagNames)
		return a, nil, err
	case "ozawa":
		data, err := read(answer.OzawaColumns())
		if err != nil {
			return nil, nil, err
		}
		a, err := answer.Ozawa(data, flagNames)
		return a, nil, err
	}
	data, err := read(answer.AvramiColumns())
	if err != nil {
		return nil, nil, err
	}
	a, err := answer.Avrami(data, flagNames)
	return a, nil, err
}

// noCard says what a fit without a card finds.
var noCard = map[string]string{
	"avrami":    "the Avrami n and k",
	"kissinger": "an apparent activation energy of DSC peaks",
	"ozawa":     "an apparent activation energy of DSC peaks or Ozawa's exponent",
}

// finish writes the plot and the card where they are asked for (each with
// its note) and renders the fit. The card is made before any file is
// written, so a card that cannot be made leaves no plot behind.
func (f *fitFlags) finish(e *env, a answer.Answer, card carded) error {
	if err := f.format.check(a); err != nil { // before any file is written
		return err
	}
	var notes []string
	var c *presets.Card
	var header []string
	if f.cardOut.set && card != nil {
		var err error
		if c, header, err = card(); err != nil {
			return err
		}
	}
	if f.plot.set {
		if err := fitPlot(f.plot, a); err != nil {
			return err
		}
		notes = append(notes, "plot written: "+f.plot.path)
	}
	if c != nil {
		if err := writeCard(&e.files, f.cardOut.text, c, header); err != nil {
			return err
		}
		notes = append(notes, "card written: "+f.cardOut.text)
	}
	return render(e.stdout, f.format, annotated{a, notes})
}

// writeCard stages a card in path, after checking that it reads back as
// a card.
func writeCard(fl *files, path string, c *presets.Card, header []string) error {
	data := c.TOML(header)
	if _, err := presets.Parse(data, path); err != nil {
		return placef("--card-out: the card does not read back: %v", err)
	}
	return fl.write(path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}
