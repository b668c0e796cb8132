package main

import (
	"errors"
	"fmt"
	"math"
	"path/filepath"
	"strings"

	"github.com/spf13/pflag"
	"gonum.org/v1/gonum/floats"

	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

func init() {
	commands["fit"] = &command{
		summary: "Fit a model to measurements in a CSV file whose header names carry units: " +
			"arrhenius (Q and the pre-exponential from ln y against 1/T), " +
			"interface (the interfacial energy and a prefactor scale from measured nucleation rates, the rest of the material from --material and flags) or " +
			"avrami (n and k from transformed fractions against time) or " +
			"induction (the interfacial energy and the apparent prefactor A of a solution from induction times, ln t against 1/(T^3 ln^2 S); columns temperature_UNIT, supersaturation, induction_time_UNIT). " +
			"Estimates come with standard errors and 95 % intervals (Student t, N - 2 degrees of freedom); two points give the exact answer and no interval. " +
			"Lines starting with # are comments; FILE - reads standard input.",
		usage:   "undercool fit arrhenius|interface|avrami|induction FILE.csv [--weights] [--material NAME|FILE.toml] [value flags] [--card-out FILE.toml] [--plot FILE.svg|png] [--format F]",
		example: "undercool fit arrhenius testdata/fit/diffusion.csv --card-out solute.toml",
		setup:   setupFit,
	}
}

// fitKinds are the accepted first arguments of fit.
var fitKinds = []string{"arrhenius", "interface", "avrami", "induction"}

// fitFlags are the flags of the fit command.
type fitFlags struct {
	weights bool
	cardOut string
	kind    string
	mf      *materialFlags
	ff      *formatFlag
	pf      *plotFlag
	fs      *pflag.FlagSet
}

func setupFit(fs *pflag.FlagSet) func(*env, []string) error {
	f := &fitFlags{fs: fs}
	fs.BoolVar(&f.weights, "weights", false, "weigh the points by the file's weight column (relative weights on the logarithm, each > 0)")
	fs.StringVar(&f.cardOut, "card-out", "", "write the fitted values as a material card FILE.toml, loadable with --material (arrhenius with a diffusivity column, interface)")
	fs.StringVar(&f.kind, "kind", "metal", "kind of material written by arrhenius --card-out without --material: "+strings.Join(presets.KindChoices, ", "))
	f.pf = addPlotFlag(fs, "draw the data and the fit (arrhenius: log y against 1000/T; avrami: the linearized plot; interface: log J against T and the classical plot)")
	f.mf = addMaterialFlags(fs)
	fi := addFitInductionFlags(fs) // --volume (fit_induction.go)
	f.ff = addFormatFlag(fs)
	return func(e *env, args []string) error {
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
		if err := f.ff.check(); err != nil {
			return err
		}
		if err := f.pf.check(); err != nil {
			return err
		}
		if f.cardOut != "" && !strings.HasSuffix(strings.ToLower(f.cardOut), ".toml") {
			return usagef("--card-out: %q must end in .toml", f.cardOut)
		}
		if !contains(presets.KindChoices, f.kind) {
			return usagef("--kind: %q is not one of %s", f.kind, strings.Join(presets.KindChoices, ", "))
		}
		switch kind {
		case "arrhenius":
			return f.arrhenius(e, args[1])
		case "interface":
			return f.iface(e, args[1])
		case "induction":
			return f.induction(e, args[1], fi)
		default:
			return f.avrami(e, args[1])
		}
	}
}

// fitOwnFlags are the flags of fit itself; every other flag describes a material.
var fitOwnFlags = []string{"weights", "card-out", "kind", "plot", "format", "volume"}

// materialGiven returns the name of a material flag that was given, if any.
func (f *fitFlags) materialGiven() string {
	var given []string
	f.fs.Visit(func(fl *pflag.Flag) {
		if !contains(fitOwnFlags, fl.Name) {
			given = append(given, fl.Name)
		}
	})
	if len(given) == 0 {
		return ""
	}
	if contains(given, "material") {
		return "material"
	}
	return given[0]
}

// weightColumn is the optional column of relative weights.
var weightColumn = presets.Column{Quantity: "weight", Kind: units.Dimensionless}

// readFitData reads the data file and returns it with the weights, if asked for.
func (f *fitFlags) readFitData(e *env, path string, cols []presets.Column) (*presets.Data, []float64, []string, error) {
	d, err := presets.ReadDataFile(path, e.stdin, append(cols, weightColumn))
	if err != nil {
		return nil, nil, nil, usagef("%v", err)
	}
	var notes []string
	w, has := d.Columns["weight"]
	switch {
	case f.weights && !has:
		return nil, nil, nil, usagef("--weights: %s has no weight column", d.File)
	case !f.weights && has:
		notes = append(notes, "the weight column is ignored; give --weights to use it")
		w = nil
	}
	for i, wi := range w {
		if !(wi > 0) {
			return nil, nil, nil, usagef("%s:%d: column \"weight\": %g must be positive", d.File, d.Lines[i], wi)
		}
	}
	return d, w, notes, nil
}

// fitError turns an error of a fit into one naming the file line.
func fitError(d *presets.Data, err error) error {
	var pe *kinetics.PointError
	if errors.As(err, &pe) && pe.Index >= 0 && pe.Index < len(d.Lines) {
		return usagef("%s:%d: %s", d.File, d.Lines[pe.Index], pe.Msg)
	}
	if errors.Is(err, fit.ErrFewPoints) {
		return usagef("%s: %d data rows; a fit of 2 parameters needs at least 2", d.File, len(d.Lines))
	}
	return usagef("%s: %v", d.File, err)
}

// spread formats the standard error and 95 % interval of an estimate,
// ", SE s unit, 95 % [lo, hi] unit", or says there are none (two points).
// se may be NaN alone (an interval without a standard error of its own).
func spreadText(se float64, v [2]float64, format func(float64) string, unit string) string {
	if math.IsNaN(v[0]) || math.IsNaN(v[1]) {
		return " (two points: exact, no interval)"
	}
	s := ""
	if !math.IsNaN(se) {
		s = ", SE " + format(se) + unit
	}
	return s + ", 95 % [" + format(v[0]) + ", " + format(v[1]) + "]" + unit
}

// ciJSON is an interval for JSON: [low, high], or null when there is none.
func ciJSON(v [2]float64) any {
	if math.IsNaN(v[0]) || math.IsNaN(v[1]) || math.IsInf(v[0], 0) || math.IsInf(v[1], 0) {
		return nil
	}
	return []float64{v[0], v[1]}
}

// lnText is "; ln NAME = v" with its spread, or without one for an exact fit.
func lnText(name string, v, se float64, ci [2]float64) string {
	s := fmt.Sprintf("; ln %s = %.5g", name, v)
	if math.IsNaN(se) {
		return s
	}
	return s + spreadText(se, ci, g(4), "")
}

// g formats a float with n significant digits.
func g(n int) func(float64) string {
	return func(x float64) string { return sig(n)(x) }
}

// statsLine describes the scatter of a fit.
func statsLine(n, dof int, r2, sd float64, of string) string {
	if dof == 0 {
		return "points: 2 (exact fit, no scatter to estimate)"
	}
	return fmt.Sprintf("points: %d, %d degrees of freedom; R2 = %.5f; residual SD = %.3g in %s", n, dof, r2, sd, of)
}

// fitWarning is a remark on the data that does not stop the fit.
type fitWarning struct {
	Key  string // snake_case name, for JSON
	Text string // one sentence
}

// coldLimit is the temperature below which a whole Arrhenius data set is
// suspected of being degrees Celsius written as kelvin: diffusion or
// annealing data of a metal all below 250 K is rare (common practice).
const coldLimit = 250.0 // K

// celsiusWarnings applies two rules of thumb for a temperature column in
// the wrong scale (common practice): every temperature below coldLimit, or
// a fit that is much straighter with every temperature shifted by ±273.15 K.
func celsiusWarnings(T []float64, f *fit.ArrheniusFit) []fitWarning {
	var out []fitWarning
	if floats.Max(T) < coldLimit {
		out = append(out, fitWarning{"all_below_250_k", fmt.Sprintf(
			"every temperature is below %g K; if they are degrees Celsius, name the column temperature_c", coldLimit)})
	}
	if f.Straighter(units.CelsiusOffset) {
		out = append(out, fitWarning{"straighter_if_celsius", "the temperatures look like degrees Celsius read as kelvin: the points lie on a much straighter line 273.15 K higher; name the column temperature_c if so"})
	}
	if f.Straighter(-units.CelsiusOffset) {
		out = append(out, fitWarning{"straighter_if_kelvin", "the temperatures look like kelvin read as degrees Celsius: the points lie on a much straighter line 273.15 K lower; name the column temperature_k if so"})
	}
	return out
}

// warningsJSON lists fit warnings for JSON.
func warningsJSON(ws []fitWarning) []object {
	out := []object{}
	for _, w := range ws {
		out = append(out, object{{"key", w.Key}, {"text", w.Text}})
	}
	return out
}

// dataName is how a data file is named in a card's source: its base name,
// or "standard input".
func dataName(d *presets.Data) string {
	if d.File == "stdin" {
		return "standard input"
	}
	return filepath.Base(d.File)
}

// dataLine is the about line naming the data file, its points and the
// headers of the columns fitted.
func dataLine(d *presets.Data, n int, w []float64, quantities ...string) string {
	heads := make([]string, len(quantities))
	for i, q := range quantities {
		heads[i] = d.Headers[q]
	}
	return fmt.Sprintf("data: %s, %d points; columns %s%s", d.File, n, strings.Join(heads, ", "), weighted(w))
}

// aboveZero checks that every temperature of the data lies above absolute zero.
func aboveZero(d *presets.Data, T []float64) error {
	for i, t := range T {
		if !(t > 0) {
			return usagef("%s:%d: column %q: %s K is at or below absolute zero", d.File, d.Lines[i], d.Headers["temperature"], sig(6)(t))
		}
	}
	return nil
}

// gammaText is the summary line of a fitted interfacial energy, in J/m2 and
// in mJ/m2 with digits significant digits, with its spread.
func gammaText(gamma, se float64, ci [2]float64, digits int) string {
	mj := func(x float64) string { return fmt.Sprintf("%.*g", digits, x*1e3) }
	return fmt.Sprintf("gamma = %.5g J/m2 (%s mJ/m2)%s", gamma, mj(gamma), spreadText(se, ci, mj, " mJ/m2"))
}

// gammaJSON are the JSON entries of a fitted interfacial energy.
func gammaJSON(gamma, se float64, ci [2]float64) object {
	return object{
		{"gamma_j_per_m2", gamma},
		{"gamma_se_j_per_m2", se},
		{"gamma_ci95_j_per_m2", ciJSON(ci)},
	}
}

// scatterJSON are the JSON entries of a fit's scatter; sdKey names the
// residual standard deviation.
func scatterJSON(sdKey string, r2, sd float64, dof int, t float64) object {
	return object{
		{"r2", r2},
		{sdKey, sd},
		{"degrees_of_freedom", dof},
		{"student_t", t},
	}
}

// intervalNote says how a fit's intervals are made: none for two points
// (what, the line or the fit, passes through both), else estimate ± t·SE,
// followed by how, which tells how the derived intervals follow.
func intervalNote(exact bool, what string, t float64, dof int, how string) string {
	if exact {
		return "two points: the " + what + " passes through both; no standard errors or intervals"
	}
	return fmt.Sprintf("intervals: estimate ± t·SE with Student t = %.4f (%d degrees of freedom)%s", t, dof, how)
}

// finish adds the data file's notes and the caution to r, writes the plot
// and the card where they are asked for (each with its note), and renders
// r. card is nil for a fit that writes none. The card is built before any
// file is written, so a card that cannot be made leaves no plot behind.
func (f *fitFlags) finish(e *env, r *result, notes []string, plot func() error, card func() (*presets.Card, []string, error)) error {
	r.notes = append(r.notes, notes...)
	r.notes = append(r.notes, caution)
	var c *presets.Card
	var header []string
	if f.cardOut != "" && card != nil {
		var err error
		if c, header, err = card(); err != nil {
			return err
		}
	}
	if f.pf.wanted() {
		if err := plot(); err != nil {
			return err
		}
		r.notes = append(r.notes, "plot written: "+f.pf.path)
	}
	if c != nil {
		if err := writeCard(f.cardOut, c, header); err != nil {
			return err
		}
		r.notes = append(r.notes, "card written: "+f.cardOut)
	}
	return r.render(e.stdout, f.ff.value)
}
