package main

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/answer"
	"undercool/presets/units"
)

// The flags of the commands are values that check themselves while the
// command line is parsed (pflag.Value): a command receives numbers, not
// strings, and asks a value whether it was given (set), not the FlagSet.
// A bad value fails the parse with a *valueError, which run prints as
// "--name: what is wrong".

// valueError is what a flag's value says is wrong with it.
type valueError struct{ err error }

func (e *valueError) Error() string { return e.err.Error() }

func bad(format string, a ...any) error { return &valueError{fmt.Errorf(format, a...)} }

// given records whether a flag was given; every value type embeds it.
type given struct {
	set  bool
	text string // as given
}

func (g *given) String() string { return g.text }
func (g *given) Type() string   { return "string" }

// quantityFlag is one positive quantity of a kind: a volume, a band width,
// a number of nuclei.
type quantityFlag struct {
	given
	kind units.Kind
	what string // in the error for a value not positive, "" for none
	x    float64
}

func (q *quantityFlag) Set(s string) error {
	v, err := units.Parse(s, q.kind)
	if err != nil {
		return &valueError{err}
	}
	if !(v > 0) {
		if q.what != "" {
			return bad("%q must be positive (%s)", s, q.what)
		}
		return bad("%q must be positive", s)
	}
	q.x, q.given = v, given{true, s}
	return nil
}

// addQuantity declares a flag of a positive quantity.
func addQuantity(fs *pflag.FlagSet, name string, kind units.Kind, what, help string) *quantityFlag {
	q := &quantityFlag{kind: kind, what: what}
	fs.Var(q, name, help)
	return q
}

// addVolume declares --volume, the volume of a sample or a vessel.
func addVolume(fs *pflag.FlagSet, what, help string) *quantityFlag {
	return addQuantity(fs, "volume", units.Volume, what, help)
}

// isBare reports whether a quantity is written as a number without a unit.
func isBare(s string) bool {
	s = strings.TrimSpace(s)
	return s != "" && strings.IndexFunc(s, func(r rune) bool { return !strings.ContainsRune("0123456789.+-eE", r) }) < 0
}

// parseTemp reads one temperature above absolute zero, and whether it was
// written bare (kelvin).
func parseTemp(s string) (float64, bool, error) {
	t, err := units.Parse(s, units.Temperature)
	if err != nil {
		return 0, false, &valueError{err}
	}
	s = strings.TrimSpace(s)
	bare := isBare(s)
	if !(t > 0) {
		if bare {
			return 0, false, bad("%q is at or below absolute zero (a bare number is kelvin; write %sC for Celsius)", s, s)
		}
		return 0, false, bad("%q is at or below absolute zero", s)
	}
	return t, bare, nil
}

// bareTemps is a flag that read temperatures written without a unit
// (kelvin): run notes each such flag once, "read as 650 K (376.85 °C)".
type bareTemps interface{ bareKelvin() []float64 }

// maxBareListed is how many bare temperatures of one flag its note names.
const maxBareListed = 3

// bareNote is the note on a flag's bare temperatures: how each was read,
// and how to write it in Celsius.
func bareNote(name string, temps []float64) string {
	var read []string
	for i, t := range temps {
		if i == maxBareListed {
			read = append(read, "…")
			break
		}
		read = append(read, fmt.Sprintf("%s K (%.2f °C)", strconv.FormatFloat(t, 'f', -1, 64), units.Celsius(t)))
	}
	return fmt.Sprintf("--%s: read as %s; write %sC for Celsius", name, strings.Join(read, ", "), strconv.FormatFloat(temps[0], 'f', -1, 64))
}

// tempFlag is one temperature.
type tempFlag struct {
	given
	bare []float64
	x    float64 // K
}

func (f *tempFlag) Set(s string) error {
	t, bare, err := parseTemp(s)
	if err != nil {
		return err
	}
	f.x, f.given, f.bare = t, given{true, s}, nil
	if bare {
		f.bare = []float64{t}
	}
	return nil
}

func (f *tempFlag) bareKelvin() []float64 { return f.bare }

// addTemp declares a flag of one temperature. (A bare temperature's note
// is made by run, for every flag alike, so e is not needed.)
func addTemp(fs *pflag.FlagSet, _ *env, name, help string) *tempFlag {
	f := &tempFlag{}
	fs.Var(f, name, help)
	return f
}

// maxRows caps a temperature list so a typo in a step cannot exhaust memory.
const maxRows = 100000

// tempsFlag is --temps, a list of temperatures.
type tempsFlag struct {
	given
	bare []float64
	T    []float64
}

func (f *tempsFlag) Set(s string) error {
	f.T, f.bare = nil, nil
	for _, p := range strings.Split(s, ",") {
		t, bare, err := parseTemp(p)
		if err != nil {
			return err
		}
		f.T = append(f.T, t)
		if bare {
			f.bare = append(f.bare, t)
		}
	}
	f.given = given{true, s}
	return nil
}

func (f *tempsFlag) bareKelvin() []float64 { return f.bare }

// rangeFlag is --range FROM:TO[:STEP]; without a step, points rows.
type rangeFlag struct {
	given
	bare   []float64
	points int
	T      []float64
}

func (f *rangeFlag) bareKelvin() []float64 { return f.bare }

func (f *rangeFlag) Set(s string) error {
	parts := strings.Split(s, ":")
	if len(parts) < 2 || len(parts) > 3 {
		return bad("%q is not FROM:TO:STEP or FROM:TO", s)
	}
	f.bare = nil
	var ends [2]float64
	for i := range ends {
		t, bare, err := parseTemp(parts[i])
		if err != nil {
			return err
		}
		ends[i] = t
		if bare {
			f.bare = append(f.bare, t)
		}
	}
	from, to := ends[0], ends[1]
	f.given = given{true, s}
	switch {
	case from == to:
		f.T = []float64{from}
		return nil
	case len(parts) == 2:
		f.T = answer.Spread(from, to, f.points)
		return nil
	}
	step, err := units.Parse(parts[2], units.TemperatureDifference)
	if err != nil {
		return bad("step: %v", err)
	}
	step = math.Abs(step)
	if !(step > 0) {
		return bad("the step must not be zero")
	}
	n := math.Floor(math.Abs(to-from)/step+1e-9) + 1
	if n > maxRows {
		return bad("%g rows is more than the %d allowed; use a larger step", n, maxRows)
	}
	sign := 1.0
	if to < from {
		sign = -1
	}
	f.T = make([]float64, int(n))
	for i := range f.T {
		f.T[i] = from + sign*float64(i)*step
	}
	return nil
}

// tempFlags choose the temperatures of a table: --temps or --range.
type tempFlags struct {
	temps *tempsFlag
	span  *rangeFlag
}

func addTempFlags(fs *pflag.FlagSet, _ *env, points int) *tempFlags {
	tf := &tempFlags{&tempsFlag{}, &rangeFlag{points: points}}
	fs.Var(tf.temps, "temps", "comma-separated temperatures, each K, C or F (bare = K), e.g. 1100K,800C")
	fs.Var(tf.span, "range", "temperatures FROM:TO:STEP (or FROM:TO for the default number of rows), e.g. 1000:600:10 or 900C:500C:25C")
	return tf
}

// given reports whether the temperatures were given.
func (tf *tempFlags) given() bool { return tf.temps.set || tf.span.set }

// list returns the temperatures asked for, or the material's default range
// from its top down when neither flag is given.
func (tf *tempFlags) list(md *kinetics.Model) ([]float64, error) {
	switch {
	case tf.temps.set && tf.span.set:
		return nil, usagef("--temps and --range: give one or the other")
	case tf.temps.set:
		return tf.temps.T, nil
	case tf.span.set:
		return tf.span.T, nil
	case !md.HasTe():
		return nil, noTe("--temps", "no default temperatures: give them with --temps or --range")
	}
	lo, hi := answer.DefaultSpan(md)
	return answer.Spread(hi, lo, tf.span.points), nil
}

// noTe is the error of a command that needs the saturation temperature a
// fixed supersaturation was given without.
func noTe(where, what string) error {
	return usagef("%s: a fixed supersaturation without a saturation temperature has %s (or give --sat-temp)", where, what)
}

// defaultFraction is the usual detectability limit of a crystal fraction in
// a glass (Uhlmann D.R., J. Non-Cryst. Solids 7 (1972) 337).
const defaultFraction = "1e-6"

// fractionFlag is --fraction: one fraction, or with list several.
type fractionFlag struct {
	given
	list bool
	X    []float64
}

func (f *fractionFlag) Set(s string) error {
	parts := strings.Split(s, ",")
	if !f.list && len(parts) > 1 {
		return bad("give one fraction strictly between 0 and 1, got %q", s)
	}
	var out []float64
	for _, p := range parts {
		p = strings.TrimSpace(p)
		x, err := units.Parse(p, units.Fraction) // 0.01 or 1%
		switch {
		case err != nil:
			return bad("%q is not a number strictly between 0 and 1 (or a percentage, e.g. 1%%)", p)
		case !(x > 0 && x < 1):
			return bad("%q is not a number strictly between 0 and 1", p)
		}
		out = append(out, x)
	}
	f.X, f.given = out, given{true, s}
	return nil
}

// addFraction declares --fraction, with its default.
func addFraction(fs *pflag.FlagSet, list bool, help string) *fractionFlag {
	f := &fractionFlag{list: list}
	if err := f.Set(defaultFraction); err != nil {
		panic(err)
	}
	f.given = given{false, defaultFraction}
	fs.Var(f, "fraction", help)
	return f
}

// ratesFlag is --rate: one or more positive cooling rates (heating rates
// with heating); a bare number takes the unit of the last.
type ratesFlag struct {
	given
	heating bool
	q       []float64 // K/s
}

func (f *ratesFlag) Set(s string) error {
	kind, what := units.CoolingRate, "a cooling rate, K/s"
	if f.heating {
		kind, what = units.HeatingRate, "a heating rate, K/s"
	}
	if strings.TrimSpace(s) == "" {
		return bad("give one or more rates, comma-separated, e.g. 2,5,10,20K/min")
	}
	parts := strings.Split(s, ",")
	_, unit := splitUnit(strings.TrimSpace(parts[len(parts)-1]))
	var out []float64
	for _, p := range parts {
		t := strings.TrimSpace(p)
		if n, u := splitUnit(t); u == "" && n != "" {
			t += unit
		}
		q, err := units.Parse(t, kind)
		if err != nil {
			return &valueError{err}
		}
		if !(q > 0) {
			return bad("%q must be positive (%s)", strings.TrimSpace(p), what)
		}
		out = append(out, q)
	}
	f.q, f.given = out, given{true, s}
	return nil
}

// splitUnit splits "10K/s" into "10" and "K/s".
func splitUnit(s string) (num, unit string) {
	i := strings.IndexFunc(s, func(r rune) bool {
		return !(r >= '0' && r <= '9' || r == '.' || r == '+' || r == '-' || r == 'e' || r == 'E')
	})
	// an exponent 'e' followed by a letter is a unit, not an exponent
	for i > 0 && (s[i-1] == 'e' || s[i-1] == 'E') {
		i--
	}
	if i < 0 {
		return s, ""
	}
	return s[:i], s[i:]
}

// choiceFlag is one of a list of names, or anything other accepts.
type choiceFlag struct {
	given
	choices []string
	other   func(string) bool // nil: none
	msg     string            // the error's list of what is allowed; "": the choices
	value   string
}

func (f *choiceFlag) Set(s string) error {
	if !contains(f.choices, s) && (f.other == nil || !f.other(s)) {
		allowed := f.msg
		if allowed == "" {
			allowed = strings.Join(f.choices, ", ")
		}
		return bad("%q is not one of %s", s, allowed)
	}
	f.value, f.given = s, given{true, s}
	return nil
}

func addChoice(fs *pflag.FlagSet, name, def string, choices []string, help string) *choiceFlag {
	f := &choiceFlag{choices: choices, value: def, given: given{text: def}}
	fs.Var(f, name, help)
	return f
}

// formatFlag is --format, with --columns: how a result is drawn, and on
// whose screen.
type formatFlag struct {
	*choiceFlag
	columns *columnsFlag
	e       *env
}

// columnsFlag is --columns KEY,KEY...: the columns of a table to show, by
// their JSON keys, in this order.
type columnsFlag struct {
	given
	keys []string
}

func (f *columnsFlag) Set(s string) error {
	f.keys = nil
	for _, k := range strings.Split(s, ",") {
		if k = strings.TrimSpace(k); k == "" {
			return bad("%q: give column keys separated by commas, e.g. temperature_k,log10_rate_per_m3_s", s)
		}
		if contains(f.keys, k) {
			return bad("%s is given twice", k)
		}
		f.keys = append(f.keys, k)
	}
	f.given = given{true, s}
	return nil
}

// addFormat declares --format and --columns, shared by every command with a result.
func addFormat(fs *pflag.FlagSet, e *env) *formatFlag {
	f := &formatFlag{addChoice(fs, "format", "table", formats, "output format: table, csv, json or markdown"), &columnsFlag{}, e}
	fs.Var(f.columns, "columns", "the columns of the table to show, in order, by their JSON keys (as --format csv heads them), e.g. temperature_k,log10_rate_per_m3_s; default: those that fit the screen ($COLUMNS, else the terminal, else 100 characters)")
	setGroup(fs, groupOutput, "format", "columns")
	return f
}

// Formats are the accepted values of --format.
var formats = []string{"table", "csv", "json", "markdown"}

// spreadFlags are --spread, --samples, --seed and --no-spread.
type spreadFlags struct {
	given
	specs   map[string]presets.SpreadSpec
	raw     []string // as given, for the command that makes a memo again
	samples *uintFlag
	seed    *uintFlag
	none    bool
}

// uintFlag is a whole number, parsed as pflag parses its own (so a bad
// one reads as pflag says it).
type uintFlag struct {
	given
	bits int // 64 for a seed; 0 for a count (an int)
	n    uint64
	i    int
}

func (f *uintFlag) Set(s string) error {
	if f.bits == 0 {
		i, err := strconv.ParseInt(s, 0, 64)
		if err != nil {
			return err
		}
		f.i = int(i)
	} else {
		n, err := strconv.ParseUint(s, 0, f.bits)
		if err != nil {
			return err
		}
		f.n = n
	}
	f.given = given{true, s}
	return nil
}

func (f *uintFlag) Type() string {
	if f.bits == 0 {
		return "int"
	}
	return "uint64"
}

// Limits of --samples.
const (
	defaultSamples = 2000
	maxSamples     = 1000000 // beyond this the run takes minutes and P5/P95 no longer move
	// maxEvaluations caps samples × headline results (a rate table of many
	// rows), so a typo cannot start an hour-long run.
	maxEvaluations = 50000000
)

func (sf *spreadFlags) Set(s string) error {
	name, value, ok := strings.Cut(s, "=")
	name = strings.ReplaceAll(strings.TrimSpace(name), "-", "_")
	if !ok || name == "" {
		return bad("%q is not NAME=VALUE (e.g. gamma=2%% or q=3kJ/mol)", s)
	}
	if _, dup := sf.specs[name]; dup {
		return bad("%s is given twice", name)
	}
	spec, err := presets.ParseSpread(name, value)
	if err != nil {
		return &valueError{err}
	}
	spec.Source = "command line"
	sf.specs[name] = spec
	sf.raw = append(sf.raw, s)
	sf.set = true
	return nil
}

func (sf *spreadFlags) Type() string { return "stringArray" }

// addSpreadFlags declares the uncertainty flags of a command.
func addSpreadFlags(fs *pflag.FlagSet) *spreadFlags {
	sf := &spreadFlags{specs: map[string]presets.SpreadSpec{},
		samples: &uintFlag{given: given{text: strconv.Itoa(defaultSamples)}, i: defaultSamples},
		seed:    &uintFlag{given: given{text: "1"}, bits: 64, n: 1}}
	fs.Var(sf, "spread", "standard deviation of an input, NAME=VALUE, repeatable: relative (gamma=2%), absolute with its unit (q=3kJ/mol, te=5K) or a factor (d0=x3); normal, log-normal for "+strings.Join(presets.LogNormalKeys(), ", "))
	fs.Var(sf.samples, "samples", fmt.Sprintf("Monte Carlo samples for the uncertainty bands, 1 to %d", maxSamples))
	fs.Var(sf.seed, "seed", "seed of the random draws, 0 to 2^64-1; the same seed gives the same bands on any number of cores")
	fs.BoolVar(&sf.none, "no-spread", false, "ignore the [spread] table of the material card")
	setGroup(fs, groupUncertainty, "spread", "samples", "seed", "no-spread")
	return sf
}

// check validates --samples.
func (sf *spreadFlags) check() error {
	if n := sf.samples.i; !(n >= 1 && n <= maxSamples) {
		if n > maxSamples {
			return usagef("--samples: %d is more than the %d allowed (2000 is usually enough; P5 and P95 settle to about 1 %% of their spread by 20000)", n, maxSamples)
		}
		return usagef("--samples: %d: give at least 1 sample (default %d)", n, defaultSamples)
	}
	return nil
}

// sampling is the Monte Carlo run of a command on card c: the card's
// [spread] table (unless --no-spread) with the --spread flags over it; nil
// when there are none.
func (sf *spreadFlags) sampling(e *env, c *presets.Card) (*answer.Sampling, error) {
	all := map[string]presets.SpreadSpec{}
	if !sf.none {
		for k, s := range c.Spreads {
			all[k] = s
		}
	}
	for k, s := range sf.specs {
		all[k] = s
	}
	if len(all) == 0 && (sf.samples.set || sf.seed.set) {
		return nil, usagef("--samples and --seed need a spread: give --spread NAME=VALUE (e.g. gamma=2%%) or a card with a [spread] table")
	}
	s, err := answer.NewSampling(c, all, sf.samples.i, sf.seed.n)
	if err != nil {
		where := "--spread"
		var se *presets.SpreadError
		if errors.As(err, &se) && all[se.Key].Line > 0 {
			where = fmt.Sprintf("%s:%d: [spread]", c.File, all[se.Key].Line)
		}
		return nil, usagef("%s: %v", where, err)
	}
	if s != nil {
		s.MaxEvaluations = maxEvaluations
		bar := newProgress(e.stderr)
		s.Progress = bar.update
		e.finish = append(e.finish, bar.finish)
	}
	return s, nil
}

// ccurveFlag is --c-curve k1=..,k2=..,k3=..,k4=..,k5=..: k1 a plain
// number, k2 a time (bare: s), k3 and k5 molar energies (bare: J/mol), k4
// a temperature (bare: K).
type ccurveFlag struct {
	given
	bare []float64 // k4, when bare
	c    *kinetics.EvanchoStaley
}

func (f *ccurveFlag) bareKelvin() []float64 { return f.bare }

// ccurveNames are the constants of --c-curve, in order.
var ccurveNames = []string{"k1", "k2", "k3", "k4", "k5"}

func (f *ccurveFlag) Set(s string) error {
	const form = "k1=-0.00501,k2=1e-10s,k3=4000,k4=760K,k5=130kJ/mol"
	vals := map[string]float64{}
	bareK4 := false
	for _, part := range strings.Split(s, ",") {
		key, text, ok := strings.Cut(strings.TrimSpace(part), "=")
		key, text = strings.ToLower(strings.TrimSpace(key)), strings.TrimSpace(text)
		bareK4 = bareK4 || key == "k4" && isBare(text)
		if !ok || key == "" {
			return bad("%q is not NAME=VALUE (write %s)", strings.TrimSpace(part), form)
		}
		if !contains(ccurveNames, key) {
			return bad("unknown constant %q (the constants are k1, k2, k3, k4, k5)", key)
		}
		if _, dup := vals[key]; dup {
			return bad("%s given twice", key)
		}
		v, err := ccurveValue(key, text)
		if err != nil {
			return bad("%s: %v", key, err)
		}
		vals[key] = v
	}
	for _, k := range ccurveNames {
		if _, ok := vals[k]; !ok {
			return bad("missing constant %s (all of k1..k5 are needed, e.g. %s)", k, form)
		}
	}
	c := kinetics.EvanchoStaley{K1: vals["k1"], K2: vals["k2"], K3: vals["k3"], K4: vals["k4"], K5: vals["k5"]}
	if err := c.Check(); err != nil {
		return &valueError{err}
	}
	f.c, f.given, f.bare = &c, given{true, s}, nil
	if bareK4 {
		f.bare = []float64{c.K4}
	}
	return nil
}

func ccurveValue(key, text string) (float64, error) {
	if text == "" {
		return 0, errors.New("missing value")
	}
	switch key {
	case "k1":
		return units.Parse(text, units.Dimensionless)
	case "k2":
		return units.Parse(text, units.Time)
	case "k4":
		return units.Parse(text, units.Temperature)
	}
	// k3, k5: a bare number is J/mol
	if x, err := strconv.ParseFloat(text, 64); err == nil {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return 0, fmt.Errorf("%q is not a finite number", text)
		}
		return x, nil
	}
	return units.Parse(text, units.MolarEnergy)
}

// plotFlag is --plot FILE.svg|FILE.png, checked before any work.
type plotFlag struct {
	given
	svgOnly string // not "": only SVG, and this is the error for anything else
	path    string
	format  string // "svg" or "png"
	files   *files // the command's files, once run has registered them
}

func (f *plotFlag) Set(s string) error {
	if f.svgOnly != "" && !strings.EqualFold(extension(s), ".svg") {
		return bad("%q: %s", s, f.svgOnly)
	}
	format, err := checkPlotPath(s)
	if err != nil {
		return err
	}
	f.path, f.format, f.given = s, format, given{true, s}
	return nil
}

func (f *plotFlag) register(name string, fl *files) error {
	f.files = fl
	if !f.set {
		return nil
	}
	return fl.output(name, f.path)
}

func addPlot(fs *pflag.FlagSet, what string) *plotFlag {
	f := &plotFlag{}
	fs.Var(f, "plot", what+" to FILE.svg or FILE.png (written whole or not at all)")
	setGroup(fs, groupOutput, "plot")
	return f
}

// dateFlag is --date YYYY-MM-DD.
type dateFlag struct {
	given
	date string
}

func (f *dateFlag) Set(s string) error {
	d, err := time.Parse("2006-01-02", s)
	if err != nil {
		return bad("%q is not a date YYYY-MM-DD", s)
	}
	f.date, f.given = d.Format("2006-01-02"), given{true, s}
	return nil
}

// textFlag is a string flag that knows whether it was given.
type textFlag struct{ given }

func (f *textFlag) Set(s string) error { f.given = given{true, s}; return nil }

func addText(fs *pflag.FlagSet, name, help string) *textFlag {
	f := &textFlag{}
	fs.Var(f, name, help)
	return f
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
