package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"undercool/kinetics"
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

// defaultFraction is the usual detectability limit of a crystal fraction in
// a glass (Uhlmann D.R., J. Non-Cryst. Solids 7 (1972) 337).
const defaultFraction = "1e-6"

// plotPoints is the number of temperatures a TTT or rate plot is drawn
// with, whatever the number of table rows.
const plotPoints = 200

// jmakFlags are the flags that choose the isothermal transformation law.
type jmakFlags struct {
	fraction string
	lag      bool
	nuclei   string
	fs       *pflag.FlagSet
}

func addJMAKFlags(fs *pflag.FlagSet, list bool) *jmakFlags {
	jf := &jmakFlags{fs: fs}
	help := "transformed fraction, strictly between 0 and 1 (1e-6: the usual detection limit)"
	if list {
		help = "transformed fraction(s), each strictly between 0 and 1, comma-separated for several curves, e.g. 0.01,0.5,0.99 (1e-6: the usual detection limit)"
	}
	fs.StringVar(&jf.fraction, "fraction", defaultFraction, help)
	fs.BoolVar(&jf.lag, "lag", false, "add the transient time lag of nucleation, tau = 1/(2 pi Z^2 beta*), to the time (default off)")
	fs.StringVar(&jf.nuclei, "nuclei", "", "site saturation: this many pre-existing nuclei per volume grow, none form (m^-3 or cm-3, > 0); default continuous nucleation at J(T)")
	return jf
}

// fractions parses --fraction; one value unless list is true.
func (jf *jmakFlags) fractions(list bool) ([]float64, error) {
	parts := strings.Split(jf.fraction, ",")
	if !list && len(parts) > 1 {
		return nil, usagef("--fraction: give one fraction strictly between 0 and 1, got %q", jf.fraction)
	}
	var out []float64
	for _, p := range parts {
		s := strings.TrimSpace(p)
		x, err := strconv.ParseFloat(s, 64)
		if err != nil || !(x > 0 && x < 1) {
			return nil, usagef("--fraction: %q is not a number strictly between 0 and 1", s)
		}
		out = append(out, x)
	}
	return out, nil
}

// jmak returns the transformation law the flags ask for.
func (jf *jmakFlags) jmak() (kinetics.JMAK, error) {
	j := kinetics.JMAK{Lag: jf.lag}
	if jf.fs.Changed("nuclei") {
		n, err := parsePositive("nuclei", jf.nuclei, units.NumberDensity, "nuclei per m^3")
		if err != nil {
			return j, err
		}
		j.Nuclei = n
	}
	if j.Nuclei > 0 && j.Lag {
		return j, usagef("--lag and --nuclei: the time lag is that of forming nuclei; with pre-existing nuclei there is none, give one or the other")
	}
	return j, nil
}

// law parses --fraction (one value unless list is true), then the
// transformation law.
func (jf *jmakFlags) law(list bool) ([]float64, kinetics.JMAK, error) {
	fractions, err := jf.fractions(list)
	if err != nil {
		return nil, kinetics.JMAK{}, err
	}
	j, err := jf.jmak()
	if err != nil {
		return nil, kinetics.JMAK{}, err
	}
	return fractions, j, nil
}

// describeJMAK adds the transformation law to a result's header lines and
// JSON inputs.
func describeJMAK(about []string, inputs object, j kinetics.JMAK) ([]string, object) {
	about = append(about, "transformation: "+j.Describe())
	inputs = append(inputs, kv{"transformation", j.Describe()}, kv{"time_lag", j.Lag})
	if j.Nuclei > 0 {
		inputs = append(inputs, kv{"nuclei_per_m3", j.Nuclei})
	}
	return about, inputs
}

// lagNote explains the time lag where --lag adds it.
const lagNote = "time lag: nucleation taken to start after tau = 1/(2 pi Z^2 beta*) and run at the steady rate after; other treatments differ by a factor of order one"

// transformError turns a model that cannot give times into a usage error
// that says which values are missing.
func transformError(md *kinetics.Model, j kinetics.JMAK) error {
	if err := md.CanTransform(j); err != nil {
		if !md.HasGrowth() {
			return usagef("the material has no mobility law, so no growth rate and no time to transform: give --mobility with its values (--d0 and --q, or --vft-a, --vft-b and --vft-t0, or --tg)")
		}
		return usagef("%v", err)
	}
	return nil
}

// plotFlag is --plot.
type plotFlag struct {
	path   string
	format string
	fs     *pflag.FlagSet
}

func addPlotFlag(fs *pflag.FlagSet, what string) *plotFlag {
	pf := &plotFlag{fs: fs}
	fs.StringVar(&pf.path, "plot", "", what+" to FILE.svg or FILE.png (written whole or not at all)")
	return pf
}

// check validates the path before any work; no file is made.
func (pf *plotFlag) check() error {
	if !pf.fs.Changed("plot") {
		return nil
	}
	f, err := checkPlotPath("plot", pf.path)
	pf.format = f
	return err
}

func (pf *plotFlag) wanted() bool { return pf.format != "" }

// fracLabel writes a fraction the way the output names it.
func fracLabel(X float64) string { return strconv.FormatFloat(X, 'g', 4, 64) }

// timeColumn shows seconds readably in tables ("3.2 min"), "never" for none.
func timeColumn(head, key string) column {
	return column{head, key, func(v any) string {
		if x, ok := v.(float64); ok {
			return readableTime(x)
		}
		return cellText(v)
	}}
}

// secondsOf turns ln t into seconds; +Inf for never (including a time
// beyond the float64 range), and reports whether it overflowed.
func secondsOf(lnt float64) (t float64, overflow bool) {
	t = math.Exp(lnt)
	return t, math.IsInf(t, 1) && !math.IsInf(lnt, 1)
}

// span returns the nose-search range for a temperature list: the span of
// the list the user gave, or the material's default range.
func noseSpan(temps []float64, given bool, md *kinetics.Model) (lo, hi float64) {
	if !given {
		return defaultSpan(md)
	}
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, T := range temps {
		lo, hi = math.Min(lo, T), math.Max(hi, T)
	}
	return lo, hi
}

func describeNose(n kinetics.Nose, X float64, lo, hi float64, several bool) (line string, js object) {
	label := "nose"
	if several {
		label = "nose (X = " + fracLabel(X) + ")"
	}
	js = object{{"fraction", X}}
	switch {
	case math.IsNaN(n.T):
		line = fmt.Sprintf("%s: none, nothing transforms between %.2f and %.2f K", label, lo, hi)
		js = append(js, kv{"temperature_k", nil}, kv{"time_s", nil}, kv{"inside_range", false})
	case !n.Inside():
		t, _ := secondsOf(n.LnTime)
		end, dir := "lower", "below"
		if n.Edge > 0 {
			end, dir = "upper", "above"
		}
		line = fmt.Sprintf("%s: not inside %.2f–%.2f K; the time still falls at the %s end (%s at %.2f K): the nose lies %s, widen --range",
			label, lo, hi, end, readableTime(t), n.T, dir)
		js = append(js, kv{"temperature_k", nil}, kv{"time_s", nil}, kv{"inside_range", false},
			kv{"fastest_in_range", object{{"temperature_k", n.T}, {"time_s", t}}})
	default:
		t, _ := secondsOf(n.LnTime)
		line = fmt.Sprintf("%s: %.2f K (%.2f °C), %s", label, n.T, n.T-273.15, readableTime(t))
		js = append(js, kv{"temperature_k", n.T}, kv{"time_s", t}, kv{"inside_range", true})
	}
	return line, js
}

func setupTTT(fs *pflag.FlagSet) func(*env, []string) error {
	mf := addMaterialFlags(fs)
	jf := addJMAKFlags(fs, true)
	tf := addTempFlags(fs, 31)
	pf := addPlotFlag(fs, "draw the TTT curve(s), temperature against log time,")
	ff := addFormatFlag(fs)
	sf := addSpreadFlags(fs)
	return func(e *env, args []string) error {
		if err := checkStart("ttt", args, ff, sf); err != nil {
			return err
		}
		fractions, j, err := jf.law(true)
		if err != nil {
			return err
		}
		if err := pf.check(); err != nil {
			return err
		}
		c, md, err := mf.model()
		if err != nil {
			return err
		}
		if err := transformError(md, j); err != nil {
			return err
		}
		lo, hi := defaultSpan(md)
		temps, err := tf.list(e, lo, hi)
		if err != nil {
			return err
		}
		given := fs.Changed("temps") || fs.Changed("range")
		lo, hi = noseSpan(temps, given, md)
		if !(lo < hi) {
			// One temperature: no curve to find a nose on; search the default range.
			lo, hi = defaultSpan(md)
		}
		ttt, err := md.TTT(temps, fractions, j, lo, hi)
		if err != nil {
			return fmt.Errorf("ttt: %v", err)
		}

		about, inputs := describeCard(c, md)
		about, inputs = describeJMAK(about, inputs, j)
		several := len(fractions) > 1
		r := &result{
			title:  "undercool ttt: time to transform in an isothermal hold",
			about:  about,
			inputs: inputs,
		}
		var noses []any
		for k, X := range fractions {
			line, js := describeNose(ttt.Noses[k], X, lo, hi, several)
			r.summary = append(r.summary, line)
			noses = append(noses, js)
		}
		if several {
			r.extra = object{{"fraction", fractions}, {"nose", noses}}
		} else {
			r.extra = object{{"fraction", fractions[0]}, {"nose", noses[0]}}
		}

		// Columns: one time column per fraction in tables and CSV; in JSON
		// one "time_s" per row, a list when there are several fractions.
		r.cols = []column{{"T (K)", "temperature_k", fixed(2)}, {"T (°C)", "temperature_c", fixed(2)}}
		json := ff.value == "json"
		switch {
		case json:
			r.cols = append(r.cols, column{"time (s)", "time_s", nil})
		case several:
			for _, X := range fractions {
				r.cols = append(r.cols, timeColumn("time to X = "+fracLabel(X), "time_s_x_"+fracLabel(X)))
			}
		default:
			r.cols = append(r.cols, timeColumn("time to X = "+fracLabel(fractions[0]), "time_s"))
		}
		r.cols = append(r.cols, column{"flags", "flags", nil})
		var all kinetics.Flag
		overflow := false
		for i, T := range ttt.T {
			row := []any{T, T - 273.15}
			times := make([]float64, len(fractions))
			for k := range fractions {
				var o bool
				times[k], o = secondsOf(ttt.LnTime[i][k])
				overflow = overflow || o
			}
			if json && several {
				row = append(row, times)
			} else if json {
				row = append(row, times[0])
			} else {
				for _, t := range times {
					row = append(row, t)
				}
			}
			row = append(row, ttt.Flags[i].Keys())
			all |= ttt.Flags[i]
			r.rows = append(r.rows, row)
		}
		r.notes = flagNotes(all)
		r.notes = append(r.notes, fmt.Sprintf("nose searched between %.2f and %.2f K to %.2g K; \"never\" in the table means nothing transforms there (no driving force or no mobility)", lo, hi, kinetics.NoseTolerance))
		if overflow {
			r.notes = append(r.notes, "never also stands for times beyond 1.8e308 s")
		}
		if j.Lag {
			r.notes = append(r.notes, lagNote)
		}
		heads, eval := tttHeadlines(fractions, j, lo, hi)
		if err := sf.apply(e, r, c, md, heads, eval, nil); err != nil {
			return err
		}
		r.notes = append(r.notes, caution)
		return renderWithPlot(e, r, ff.value, pf, func() error {
			return writeTTTPlot(pf, md, c.Name, fractions, j, lo, hi, ttt)
		})
	}
}

// writeTTTPlot draws the TTT curves on plotPoints temperatures over the
// nose range, whatever the table rows, and writes the file.
func writeTTTPlot(pf *plotFlag, md *kinetics.Model, name string, fractions []float64, j kinetics.JMAK, lo, hi float64, table *kinetics.TTT) error {
	temps := spread(hi, lo, plotPoints)
	fine, err := md.TTT(temps, fractions, j, lo, hi)
	if err != nil {
		return fmt.Errorf("ttt: %v", err)
	}
	m := md.Material()
	fig := &tttFigure{
		fractions: fractions,
		T:         temps,
		te:        md.Te(),
		tg:        m.Tg,
	}
	labels := make([]string, len(fractions))
	for k, X := range fractions {
		labels[k] = fracLabel(X)
	}
	fig.title = fmt.Sprintf("TTT, %s: X = %s", name, strings.Join(labels, ", "))
	if j.Nuclei > 0 {
		fig.title += fmt.Sprintf(", %.3g nuclei/m3", j.Nuclei)
	}
	if j.Lag {
		fig.title += ", with time lag"
	}
	fig.times = make([][]float64, len(temps))
	for i := range temps {
		fig.times[i] = make([]float64, len(fractions))
		for k := range fractions {
			fig.times[i][k], _ = secondsOf(fine.LnTime[i][k])
		}
	}
	for _, n := range table.Noses {
		if n.Inside() {
			t, _ := secondsOf(n.LnTime)
			fig.noses = append(fig.noses, [2]float64{n.T, t})
		} else {
			fig.noses = append(fig.noses, [2]float64{math.NaN(), math.NaN()})
		}
	}
	p, err := fig.plot()
	if err != nil {
		return err
	}
	return savePlots(pf.path, pf.format, p)
}
