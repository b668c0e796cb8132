package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
	"sync"
	"time"

	"github.com/spf13/pflag"

	"undercool/kinetics"
	"undercool/kinetics/sample"
	"undercool/presets"
)

// Limits of --samples.
const (
	defaultSamples = 2000
	maxSamples     = 1000000 // beyond this the run takes minutes and P5/P95 no longer move
	// maxEvaluations caps samples × headline results (a rate table of many
	// rows), so a typo cannot start an hour-long run.
	maxEvaluations = 50000000
)

// spreadFlags are --spread, --samples, --seed and --no-spread.
type spreadFlags struct {
	given   []string
	samples int
	seed    uint64
	none    bool
	fs      *pflag.FlagSet
}

// addSpreadFlags registers the uncertainty flags of a command.
func addSpreadFlags(fs *pflag.FlagSet) *spreadFlags {
	sf := &spreadFlags{fs: fs}
	fs.StringArrayVar(&sf.given, "spread", nil, "standard deviation of an input, NAME=VALUE, repeatable: relative (gamma=2%), absolute with its unit (q=3kJ/mol, te=5K) or a factor (d0=x3); normal, log-normal for "+strings.Join(presets.LogNormalKeys(), ", "))
	fs.IntVar(&sf.samples, "samples", defaultSamples, fmt.Sprintf("Monte Carlo samples for the uncertainty bands, 1 to %d", maxSamples))
	fs.Uint64Var(&sf.seed, "seed", 1, "seed of the random draws, 0 to 2^64-1; the same seed gives the same bands on any number of cores")
	fs.BoolVar(&sf.none, "no-spread", false, "ignore the [spread] table of the material card")
	return sf
}

// spreadPlan is what a run will sample: the spreads resolved against the
// card, in the order of presets.Params.
type spreadPlan struct {
	card    *presets.Card
	specs   []presets.SpreadSpec
	spreads []sample.Spread
	samples int
	seed    uint64
}

// check validates the flags before any work: the NAME=VALUE syntax, the
// parameter, the value and --samples.
func (sf *spreadFlags) check() error {
	if sf.fs.Changed("samples") && !(sf.samples >= 1 && sf.samples <= maxSamples) {
		if sf.samples > maxSamples {
			return usagef("--samples: %d is more than the %d allowed (2000 is usually enough; P5 and P95 settle to about 1 %% of their spread by 20000)", sf.samples, maxSamples)
		}
		return usagef("--samples: %d: give at least 1 sample (default %d)", sf.samples, defaultSamples)
	}
	_, err := sf.flagSpecs()
	return err
}

// flagSpecs parses the --spread flags.
func (sf *spreadFlags) flagSpecs() (map[string]presets.SpreadSpec, error) {
	out := map[string]presets.SpreadSpec{}
	for _, g := range sf.given {
		name, value, ok := strings.Cut(g, "=")
		name = strings.ReplaceAll(strings.TrimSpace(name), "-", "_")
		if !ok || name == "" {
			return nil, usagef("--spread: %q is not NAME=VALUE (e.g. gamma=2%% or q=3kJ/mol)", g)
		}
		if _, dup := out[name]; dup {
			return nil, usagef("--spread: %s is given twice", name)
		}
		s, err := presets.ParseSpread(name, value)
		if err != nil {
			return nil, usagef("--spread: %v", err)
		}
		s.Source = "command line"
		out[name] = s
	}
	return out, nil
}

// plan returns the spreads of a run: the card's [spread] table (unless
// --no-spread) with the --spread flags over it; nil when there are none.
func (sf *spreadFlags) plan(c *presets.Card, md *kinetics.Model) (*spreadPlan, error) {
	flags, err := sf.flagSpecs()
	if err != nil {
		return nil, err
	}
	all := map[string]presets.SpreadSpec{}
	if !sf.none {
		for k, s := range c.Spreads {
			all[k] = s
		}
	}
	for k, s := range flags {
		all[k] = s
	}
	if len(all) == 0 {
		if sf.fs.Changed("samples") || sf.fs.Changed("seed") {
			return nil, usagef("--samples and --seed need a spread: give --spread NAME=VALUE (e.g. gamma=2%%) or a card with a [spread] table")
		}
		return nil, nil
	}
	p := &spreadPlan{card: c, samples: sf.samples, seed: sf.seed}
	spreads, err := c.Resolve(all)
	if err != nil {
		where := "--spread"
		var se *presets.SpreadError
		if errors.As(err, &se) && all[se.Key].Line > 0 {
			where = fmt.Sprintf("%s:%d: [spread]", c.File, all[se.Key].Line)
		}
		return nil, usagef("%s: %v", where, err)
	}
	for _, s := range spreads {
		p.specs = append(p.specs, all[s.Key])
	}
	p.spreads = spreads
	return p, nil
}

// headline is one result that gets an uncertainty band.
type headline struct {
	key   string               // JSON key, ending in its unit
	label string               // how the text names it: "nose time"
	log   bool                 // a positive quantity; sensitivity in decades
	text  func(float64) string // how a value reads in text
	// row ≥ 0: the band belongs to that row of the result's table (and
	// gets P5, P50 and P95 columns there); -1: a summary line.
	row int
}

// run samples the plan, with a progress bar on a terminal.
func (p *spreadPlan) run(e *env, md *kinetics.Model, heads []headline, eval sample.Eval) (*sample.Uncertainty, error) {
	if n := p.samples * len(heads); n > maxEvaluations {
		return nil, usagef("--samples: %d samples of %d results is more than %d evaluations; use fewer samples or fewer rows", p.samples, len(heads), maxEvaluations)
	}
	outs := make([]sample.Output, len(heads))
	for i, h := range heads {
		outs[i] = sample.Output{Key: h.key, Log: h.log}
	}
	mc := sample.MonteCarlo{
		Spreads: p.spreads, Build: p.card.Vary(p.spreads), Outputs: outs, Eval: eval,
		Samples: p.samples, Seed: p.seed,
	}
	bar := newProgress(e.stderr)
	mc.Progress = bar.update
	u, err := mc.Run()
	bar.finish()
	if err != nil {
		return nil, usagef("--spread: %v", err)
	}
	return u, nil
}

// progress draws a bar on stderr for a run that lasts over a second, only
// when stderr is a terminal.
type progress struct {
	w     io.Writer
	on    bool
	start time.Time
	mu    sync.Mutex
	drawn bool
	last  time.Time
}

func newProgress(w io.Writer) *progress {
	p := &progress{w: w, start: time.Now()}
	if f, ok := w.(*os.File); ok {
		if fi, err := f.Stat(); err == nil && fi.Mode()&os.ModeCharDevice != 0 {
			p.on = true
		}
	}
	return p
}

func (p *progress) update(done, total int) {
	if !p.on {
		return
	}
	now := time.Now()
	if now.Sub(p.start) < time.Second {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.drawn && now.Sub(p.last) < 100*time.Millisecond && done < total {
		return
	}
	const width = 30
	n := width * done / total
	fmt.Fprintf(p.w, "\rundercool: sampling [%s%s] %d/%d", strings.Repeat("#", n), strings.Repeat(".", width-n), done, total)
	p.drawn, p.last = true, now
}

func (p *progress) finish() {
	if p.drawn {
		fmt.Fprintf(p.w, "\r%s\r", strings.Repeat(" ", 70))
	}
}

// bandText is "P5 / P50 / P95" of a band in the headline's format.
func bandText(h headline, b sample.Percentiles) string {
	return h.text(b.P5) + " / " + h.text(b.P50) + " / " + h.text(b.P95)
}

// kelvin formats a temperature in K with two decimals.
func kelvin(x float64) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return dash
	}
	return strconv.FormatFloat(x, 'f', 2, 64) + " K"
}

// plain formats a value with n decimals.
func plain(n int) func(float64) string {
	return func(x float64) string { return fixed(n)(x) }
}

// spreadDescription says how a spread was given and what it is, e.g.
// "gamma 2% (normal, σ = 0.00236 J/m2, card)".
func spreadDescription(s presets.SpreadSpec, sp sample.SpreadUse) string {
	p, _ := presets.ParamByKey(s.Key)
	unit := p.Kinds[0].SI
	from := "command line"
	if s.Line > 0 {
		from = fmt.Sprintf("card line %d, %s", s.Line, s.Source)
	}
	var sd string
	if sp.Dist == sample.LogNormal {
		sd = fmt.Sprintf("σ(ln) = %.3g, ±1σ = ×/÷ %.3g", sp.SD, math.Exp(sp.SD))
	} else {
		sd = fmt.Sprintf("σ = %.4g %s", sp.SD, unit)
	}
	return fmt.Sprintf("%s %s (%s, %s; %s)", s.Key, s.Text, sp.Dist, sd, from)
}

// effectText is one sensitivity cell, "−0.52 / +0.49".
func effectText(e sample.Effect) string {
	f := func(x float64) string {
		if math.IsNaN(x) {
			return dash
		}
		if math.Abs(x) < 0.005 {
			return "0.00" // no sign on a change that rounds to nothing
		}
		return strconv.FormatFloat(x, 'f', 2, 64)
	}
	plus, minus := f(e.Plus), f(e.Minus)
	if e.Plus >= 0.005 {
		plus = "+" + plus
	}
	if e.Minus >= 0.005 {
		minus = "+" + minus
	}
	return minus + " / " + plus
}

// addUncertainty puts a run's bands and sensitivity on a result: P5, P50
// and P95 summary lines (or table columns for per-row results), the
// "uncertainty" JSON block, a sensitivity table ranked per result, and
// notes that say what was sampled and how the quantiles are read.
func addUncertainty(r *result, p *spreadPlan, u *sample.Uncertainty, heads []headline, rowTemps []float64) {
	head := fmt.Sprintf("uncertainty (%d samples, seed %d): P5 / P50 / P95", u.Samples, u.Seed)
	r.summary = append(r.summary, head)
	block := object{{"samples", u.Samples}, {"seed", u.Seed}, {"quantiles", sample.QuantileDefinition}}
	var spreads []any
	for i, s := range p.specs {
		su := u.Spreads[i]
		js := object{{"parameter", s.Key}, {"text", s.Text}, {"distribution", su.Dist.String()}, {"base_si", su.Base}}
		if su.Dist == sample.LogNormal {
			js = append(js, kv{"sd_ln", su.SD})
		} else {
			js = append(js, kv{"sd_si", su.SD})
		}
		js = append(js, kv{"source", s.Source}, kv{"redrawn", su.Redrawn})
		spreads = append(spreads, js)
	}
	block = append(block, kv{"spreads", spreads})

	sens := func(k int) []any {
		var out []any
		for _, e := range u.Sensitivity[k] {
			out = append(out, object{{"parameter", e.Key}, {"minus_1sd", e.Minus}, {"plus_1sd", e.Plus}})
		}
		return out
	}
	band := func(k int) object {
		b := u.Bands[k]
		return object{{"p5", b.P5}, {"p50", b.P50}, {"p95", b.P95}, {"base", u.Base[k]}, {"missing", b.Missing}}
	}
	unitOf := func(h headline) string {
		if h.log {
			return "decades"
		}
		if strings.HasSuffix(h.key, "_k") {
			return "K"
		}
		return "decades"
	}
	var rows []any
	sensJSON := object{}
	perRow := false
	for k, h := range heads {
		if h.row >= 0 {
			perRow = true
			o := object{{"temperature_k", rowTemps[h.row]}, {h.key, band(k)}, {"sensitivity_unit", unitOf(h)}, {"sensitivity", sens(k)}}
			rows = append(rows, o)
			continue
		}
		r.summary = append(r.summary, fmt.Sprintf("  %s: %s", h.label, bandText(h, u.Bands[k])))
		block = append(block, kv{h.key, band(k)})
		sensJSON = append(sensJSON, kv{h.key, object{{"unit", unitOf(h)}, {"ranking", sens(k)}}})
	}
	if perRow {
		block = append(block, kv{"rows", rows})
		r.summary = append(r.summary, "  per temperature: see the P5, P50 and P95 columns")
		addBandColumns(r, u, heads)
	}
	if len(sensJSON) > 0 {
		block = append(block, kv{"sensitivity", sensJSON})
	}
	r.extra = append(r.extra, kv{"uncertainty", block})

	// The sensitivity table: one row per result, one column per spread,
	// each cell the change for −1σ / +1σ, and the ranking.
	t := table{title: "sensitivity: change of each result for −1σ / +1σ of one input alone (others at their values); ranked, largest first"}
	t.cols = []column{{"result", "result", nil}, {"unit", "unit", nil}}
	for _, s := range p.specs {
		t.cols = append(t.cols, column{s.Key + " −1σ / +1σ", s.Key, nil})
	}
	t.cols = append(t.cols, column{"ranking", "ranking", nil})
	for k, h := range heads {
		label := h.label
		if h.row >= 0 {
			label = fmt.Sprintf("%s at %.2f K", h.label, rowTemps[h.row])
		}
		row := []any{label, unitOf(h)}
		byKey := map[string]sample.Effect{}
		var rank []string
		for _, e := range u.Sensitivity[k] {
			byKey[e.Key] = e
			rank = append(rank, e.Key)
		}
		for _, s := range p.specs {
			row = append(row, effectText(byKey[s.Key]))
		}
		row = append(row, strings.Join(rank, " > "))
		t.rows = append(t.rows, row)
	}
	r.tables = append(r.tables, t)

	var given []string
	for i, s := range p.specs {
		given = append(given, spreadDescription(s, u.Spreads[i]))
	}
	r.notes = append(r.notes, "spreads, drawn independently: "+strings.Join(given, "; "))
	r.notes = append(r.notes, "normal spreads are absolute or relative to the value; log-normal ones ("+strings.Join(presets.LogNormalKeys(), ", ")+") have the value as median; quantiles: "+sample.QuantileDefinition)
	for _, su := range u.Spreads {
		if su.Redrawn > 0 {
			r.notes = append(r.notes, fmt.Sprintf("%s: %d draws fell outside %s and were drawn again (the distribution is truncated there)", su.Key, su.Redrawn, su.Range))
		}
	}
	for k, h := range heads {
		if m := u.Bands[k].Missing; m > 0 {
			label := h.label
			if h.row >= 0 {
				label = fmt.Sprintf("%s at %.2f K", h.label, rowTemps[h.row])
			}
			r.notes = append(r.notes, fmt.Sprintf("%s: %d of %d samples have no answer and are left out of the quantiles", label, m, u.Samples))
		}
	}
}

// addBandColumns appends P5, P50 and P95 columns for the per-row results
// (one headline per row, all of the same key).
func addBandColumns(r *result, u *sample.Uncertainty, heads []headline) {
	var key, label string
	var text func(float64) string
	byRow := map[int]int{}
	for k, h := range heads {
		if h.row >= 0 {
			byRow[h.row], key, label, text = k, h.key, h.label, h.text
		}
	}
	cell := func(f func(float64) string) func(any) string {
		return func(v any) string {
			if x, ok := v.(float64); ok {
				return f(x)
			}
			return cellText(v)
		}
	}
	for _, q := range []string{"P5", "P50", "P95"} {
		r.cols = append(r.cols, column{q + " " + label, strings.ToLower(q) + "_" + key, cell(text)})
	}
	for i := range r.rows {
		k, ok := byRow[i]
		if !ok {
			r.rows[i] = append(r.rows[i], math.NaN(), math.NaN(), math.NaN())
			continue
		}
		b := u.Bands[k]
		r.rows[i] = append(r.rows[i], b.P5, b.P50, b.P95)
	}
}

// rateHeadlines are the bands of the rate table: log10 J at each row.
func rateHeadlines(temps []float64) ([]headline, sample.Eval) {
	heads := make([]headline, len(temps))
	for i := range temps {
		heads[i] = headline{key: "log10_rate_per_m3_s", label: "log10 J", text: plain(3), row: i}
	}
	eval := func(md *kinetics.Model) ([]float64, error) {
		out := make([]float64, len(temps))
		for i, T := range temps {
			out[i] = md.LnJ(T) / math.Ln10
			if math.IsInf(out[i], -1) {
				out[i] = math.Inf(-1) // no nucleation: below every rate
			}
		}
		return out, nil
	}
	return heads, eval
}

// apply runs the spreads of a command, if there are any, and adds the
// bands, the sensitivity and the notes to r. rowTemps are the
// temperatures of the table rows, for per-row headlines.
func (sf *spreadFlags) apply(e *env, r *result, c *presets.Card, md *kinetics.Model, heads []headline, eval sample.Eval, rowTemps []float64) error {
	plan, err := sf.plan(c, md)
	if err != nil || plan == nil {
		return err
	}
	u, err := plan.run(e, md, heads, eval)
	if err != nil {
		return err
	}
	addUncertainty(r, plan, u, heads, rowTemps)
	return nil
}

// seconds formats a time band readably ("3.2 min", "never").
func seconds(t float64) string { return readableTime(t) }

// tttHeadlines are the bands of a TTT curve: the nose temperature and
// time for each fraction. A nose outside [lo, hi] has no answer.
func tttHeadlines(fractions []float64, j kinetics.JMAK, lo, hi float64) ([]headline, sample.Eval) {
	var heads []headline
	for _, X := range fractions {
		suffix, label := "", ""
		if len(fractions) > 1 {
			suffix, label = "_x_"+fracLabel(X), " (X = "+fracLabel(X)+")"
		}
		heads = append(heads,
			headline{key: "nose_temperature_k" + suffix, label: "nose temperature" + label, text: kelvin, row: -1},
			headline{key: "nose_time_s" + suffix, label: "nose time" + label, log: true, text: seconds, row: -1})
	}
	eval := func(md *kinetics.Model) ([]float64, error) {
		out := make([]float64, 0, 2*len(fractions))
		for _, X := range fractions {
			n, err := md.Nose(lo, hi, X, j)
			if err != nil {
				return nil, err
			}
			switch {
			case math.IsNaN(n.T): // nothing transforms in the range
				out = append(out, math.NaN(), math.Inf(1))
			case !n.Inside():
				out = append(out, math.NaN(), math.NaN())
			default:
				t, _ := secondsOf(n.LnTime)
				out = append(out, n.T, t)
			}
		}
		return out, nil
	}
	return heads, eval
}

// holdHeadlines is the band of a hold: the time to X at T.
func holdHeadlines(T, X float64, j kinetics.JMAK) ([]headline, sample.Eval) {
	heads := []headline{{key: "time_s", label: fmt.Sprintf("time to X = %s at %.2f K", fracLabel(X), T), log: true, text: seconds, row: -1}}
	eval := func(md *kinetics.Model) ([]float64, error) {
		_, a := md.Isothermal(T, j)
		t, _ := secondsOf(a.LnTime(X))
		if math.IsNaN(t) {
			t = math.Inf(1)
		}
		return []float64{t}, nil
	}
	return heads, eval
}

// coolHeadlines are the bands of linear cooling to end (0: automatic):
// the critical cooling rate for X (with critical), the fraction at the end
// for each rate, and with a volume V > 0 the onset undercooling at the
// critical rate or at each rate (no answer where no nucleus is expected).
func coolHeadlines(end, X, V float64, rates []float64, critical bool) ([]headline, sample.Eval) {
	var heads []headline
	several := len(rates) > 1
	if critical {
		heads = append(heads, headline{key: "critical_cooling_rate_k_per_s", label: "critical cooling rate", log: true, text: rateText, row: -1})
		if V > 0 {
			heads = append(heads, headline{key: "onset_undercooling_k", label: "onset undercooling at the critical rate", text: kelvin, row: -1})
		}
	}
	for _, q := range rates {
		suffix, label := "", ""
		if several {
			suffix, label = "_at_"+strconv.FormatFloat(q, 'g', 4, 64)+"_k_per_s", " at "+rateText(q)
		} else {
			label = " at " + rateText(q)
		}
		heads = append(heads, headline{key: "fraction" + suffix, label: "fraction" + label, log: true, text: sig3, row: -1})
		if V > 0 {
			heads = append(heads, headline{key: "onset_undercooling_k" + suffix, label: "onset undercooling" + label, text: kelvin, row: -1})
		}
	}
	eval := func(md *kinetics.Model) ([]float64, error) {
		out := make([]float64, 0, len(heads))
		c, err := md.LinearCooling(end)
		if err != nil {
			if errors.Is(err, kinetics.ErrEndAboveTe) {
				// This sample's T_e lies below the end: no path, no answer.
				for range heads {
					out = append(out, math.NaN())
				}
				return out, nil
			}
			return nil, err
		}
		onset := func(q float64) float64 {
			o := c.Onset(V, q)
			if !o.Reached {
				return math.NaN()
			}
			return c.Te - o.Temp
		}
		if critical {
			qc := c.CriticalRate(X)
			out = append(out, qc)
			if V > 0 {
				if qc > 0 {
					out = append(out, onset(qc))
				} else {
					out = append(out, math.NaN())
				}
			}
		}
		for _, q := range rates {
			out = append(out, c.Fraction(q))
			if V > 0 {
				out = append(out, onset(q))
			}
		}
		return out, nil
	}
	return heads, eval
}

// sig3 writes a value with three significant digits.
func sig3(x float64) string { return sig(3)(x) }

// curveHeadlines are the bands of a measured cooling curve: the fraction
// at its end, the onset undercooling in a volume V > 0 (no answer where no
// nucleus is expected) and the additivity sum.
func curveHeadlines(p kinetics.Path, X, V, band float64) ([]headline, sample.Eval) {
	heads := []headline{{key: "fraction", label: "fraction at the end of the curve", log: true, text: sig3, row: -1}}
	if V > 0 {
		heads = append(heads, headline{key: "onset_undercooling_k", label: "onset undercooling on the curve", text: kelvin, row: -1})
	}
	heads = append(heads, headline{key: "additivity_sum", label: "additivity sum", log: true, text: sig3, row: -1})
	eval := func(md *kinetics.Model) ([]float64, error) {
		a, err := md.AnalyzeCurve(p, X, band)
		if err != nil {
			return nil, err
		}
		out := []float64{a.Path.Fraction}
		if V > 0 {
			o := kinetics.OnsetAlong(p, a.Sums, V)
			if o.Reached {
				out = append(out, md.Te()-o.Temp)
			} else {
				out = append(out, math.NaN())
			}
		}
		return append(out, a.Additivity.Q), nil
	}
	return heads, eval
}

// inductionHeadlines is the band of the induction time of a volume V held
// at T until X (hold --volume): the longer of the mononuclear and the
// polynuclear time; lnU is the growth rate to use (NaN: the model's own).
// For the solution hold to call as
//
//	heads, eval := inductionHeadlines(T, V, X, lnU)
//	err := sf.apply(e, r, c, md, heads, eval, nil)
func inductionHeadlines(T, V, X, lnU float64) ([]headline, sample.Eval) {
	heads := []headline{{key: "induction_time_s", label: fmt.Sprintf("induction time at %.2f K", T), log: true, text: seconds, row: -1}}
	eval := func(md *kinetics.Model) ([]float64, error) {
		t := md.InductionAt(T, V, X, lnU).Time()
		if math.IsNaN(t) {
			t = math.Inf(1)
		}
		return []float64{t}, nil
	}
	return heads, eval
}
