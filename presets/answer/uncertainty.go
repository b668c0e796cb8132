package answer

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"undercool/kinetics/sample"
	"undercool/presets"
)

// Sampling is a Monte Carlo run asked for on a card: the spreads of its
// values and the draws.
type Sampling struct {
	card    *presets.Card
	specs   []presets.SpreadSpec // in the order of presets.Params
	spreads []sample.Spread
	Samples int
	Seed    uint64
	// MaxEvaluations caps samples × headline results (0: no cap).
	MaxEvaluations int
	// Progress, when not nil, is told of the samples done.
	Progress func(done, total int)
}

// NewSampling resolves the spreads of a card (its [spread] table and the
// caller's, which win) for a run of n samples from seed; nil when there
// are none. A spread the card cannot have is a *presets.SpreadError.
func NewSampling(c *presets.Card, specs map[string]presets.SpreadSpec, n int, seed uint64) (*Sampling, error) {
	if len(specs) == 0 {
		return nil, nil
	}
	spreads, err := c.Resolve(specs)
	if err != nil {
		return nil, err
	}
	s := &Sampling{card: c, spreads: spreads, Samples: n, Seed: seed}
	for _, sp := range spreads {
		s.specs = append(s.specs, specs[sp.Key])
	}
	return s, nil
}

// TooManyError is a run of more evaluations than Sampling.MaxEvaluations.
type TooManyError struct{ Samples, Results, Max int }

func (e *TooManyError) Error() string {
	return fmt.Sprintf("%d samples of %d results is more than %d evaluations", e.Samples, e.Results, e.Max)
}

// headline is one result that gets an uncertainty band.
type headline struct {
	key   string               // JSON key, ending in its unit
	label string               // how the text names it: "nose time"
	log   bool                 // a positive quantity; sensitivity in decades
	text  func(float64) string // how a value reads in text
	// row ≥ 0: the band belongs to that row of the answer's table (and
	// gets P5, P50 and P95 columns there); -1: a summary line.
	row int
}

// unit is the unit of the headline's sensitivity.
func (h headline) unit() string {
	if !h.log && strings.HasSuffix(h.key, "_k") {
		return "K"
	}
	return "decades"
}

// labelAt is the label of a headline, with its row's temperature.
func (h headline) labelAt(rowTemps []float64) string {
	if h.row >= 0 {
		return fmt.Sprintf("%s at %.2f K", h.label, rowTemps[h.row])
	}
	return h.label
}

// Uncertainty is the uncertainty of an answer's headline results: the
// bands, the spreads drawn and the sensitivity of each result to each.
type Uncertainty struct {
	run      *sample.Uncertainty
	heads    []headline
	specs    []presets.SpreadSpec
	rowTemps []float64
}

// minBandSamples is the fewest samples whose P5 and P95 are not simply
// their smallest and largest: the empirical P5 of n samples is the
// ⌈0.05·n⌉-th smallest, the smallest itself up to n = 20 (and with one
// sample P5 = P50 = P95 is that sample).
const minBandSamples = 21

// Warning says that the bands are meaningless, for too few samples; ""
// when they are not.
func (u *Uncertainty) Warning() string {
	n := u.run.Samples
	switch {
	case n >= minBandSamples:
		return ""
	case n == 1:
		return "with 1 sample the bands are meaningless: P5 = P50 = P95 is that one draw (a band needs a few hundred samples or more; the default is 2000)"
	}
	return fmt.Sprintf("with %d samples the bands are meaningless: P5 and P95 are the smallest and largest of the %d draws (at least %d tell them apart; a band needs a few hundred or more, the default is 2000)", n, n, minBandSamples)
}

// run samples the headline results of an answer; rowTemps are the
// temperatures of the table rows, for per-row headlines.
func (s *Sampling) run(heads []headline, eval sample.Eval, rowTemps []float64) (*Uncertainty, error) {
	if s.MaxEvaluations > 0 && s.Samples*len(heads) > s.MaxEvaluations {
		return nil, &TooManyError{s.Samples, len(heads), s.MaxEvaluations}
	}
	outs := make([]sample.Output, len(heads))
	for i, h := range heads {
		outs[i] = sample.Output{Key: h.key, Log: h.log}
	}
	mc := sample.MonteCarlo{
		Spreads: s.spreads, Build: s.card.Vary(s.spreads), Outputs: outs, Eval: eval,
		Samples: s.Samples, Seed: s.Seed, Progress: s.Progress,
	}
	u, err := mc.Run()
	if err != nil {
		return nil, &SamplingError{err}
	}
	return &Uncertainty{run: u, heads: heads, specs: s.specs, rowTemps: rowTemps}, nil
}

// SamplingError is a Monte Carlo run that failed: a spread too wide for
// its range, a sample without a model.
type SamplingError struct{ Err error }

func (e *SamplingError) Error() string { return e.Err.Error() }
func (e *SamplingError) Unwrap() error { return e.Err }

// sampled runs s (if not nil) for the headlines and returns the uncertainty.
func sampled(s *Sampling, heads []headline, eval sample.Eval, rowTemps []float64) (*Uncertainty, error) {
	if s == nil {
		return nil, nil
	}
	return s.run(heads, eval, rowTemps)
}

type bandJSON struct {
	P5      Num `json:"p5"`
	P50     Num `json:"p50"`
	P95     Num `json:"p95"`
	Base    Num `json:"base"`
	Missing int `json:"missing"`
}

type spreadJSON struct {
	Parameter    string `json:"parameter"`
	Text         string `json:"text"`
	Distribution string `json:"distribution"`
	Base         Num    `json:"base_si"`
	SDLn         *Num   `json:"sd_ln,omitempty"`
	SD           *Num   `json:"sd_si,omitempty"`
	Source       string `json:"source"`
	Redrawn      int    `json:"redrawn"`
}

type effectJSON struct {
	Parameter string `json:"parameter"`
	Minus     Num    `json:"minus_1sd"`
	Plus      Num    `json:"plus_1sd"`
}

type rankingJSON struct {
	Unit    string       `json:"unit"`
	Ranking []effectJSON `json:"ranking"`
}

func (u *Uncertainty) band(k int) bandJSON {
	b := u.run.Bands[k]
	return bandJSON{Num(b.P5), Num(b.P50), Num(b.P95), Num(u.run.Base[k]), b.Missing}
}

func (u *Uncertainty) ranking(k int) []effectJSON {
	var out []effectJSON
	for _, e := range u.run.Sensitivity[k] {
		out = append(out, effectJSON{e.Key, Num(e.Minus), Num(e.Plus)})
	}
	return out
}

// MarshalJSON writes the block: the draws, the spreads, a band per
// headline result (per row under "rows") and the sensitivity rankings.
func (u *Uncertainty) MarshalJSON() ([]byte, error) {
	r := u.run
	block := Object{{"samples", r.Samples}, {"seed", r.Seed}, {"quantiles", sample.QuantileDefinition}}
	if w := u.Warning(); w != "" {
		block = append(block, Field{"warning", w})
	}
	var spreads []spreadJSON
	for i, s := range u.specs {
		su := r.Spreads[i]
		js := spreadJSON{Parameter: s.Key, Text: s.Text, Distribution: su.Dist.String(), Base: Num(su.Base), Source: s.Source, Redrawn: su.Redrawn}
		sd := Num(su.SD)
		if su.Dist == sample.LogNormal {
			js.SDLn = &sd
		} else {
			js.SD = &sd
		}
		spreads = append(spreads, js)
	}
	block = append(block, Field{"spreads", spreads})
	var rows []Object
	var sens Object
	for k, h := range u.heads {
		if h.row >= 0 {
			rows = append(rows, Object{{"temperature_k", Num(u.rowTemps[h.row])}, {h.key, u.band(k)},
				{"sensitivity_unit", h.unit()}, {"sensitivity", u.ranking(k)}})
			continue
		}
		block = append(block, Field{h.key, u.band(k)})
		sens = append(sens, Field{h.key, rankingJSON{h.unit(), u.ranking(k)}})
	}
	if rows != nil {
		block = append(block, Field{"rows", rows})
	}
	if len(sens) > 0 {
		block = append(block, Field{"sensitivity", sens})
	}
	return block.MarshalJSON()
}

// rowBands are the P5, P50 and P95 of the per-row headlines by row, nil
// without any.
func (u *Uncertainty) rowBands(rows int) [][3]*Num {
	if u == nil {
		return nil
	}
	var out [][3]*Num
	for k, h := range u.heads {
		if h.row < 0 {
			continue
		}
		if out == nil {
			out = make([][3]*Num, rows)
			nan := Num(math.NaN())
			for i := range out {
				out[i] = [3]*Num{&nan, &nan, &nan}
			}
		}
		b := u.run.Bands[k]
		p5, p50, p95 := Num(b.P5), Num(b.P50), Num(b.P95)
		out[h.row] = [3]*Num{&p5, &p50, &p95}
	}
	return out
}

// addTo puts the uncertainty on a doc: the P5, P50 and P95 summary lines
// (per-row results have their columns in the table instead), the
// sensitivity table, and notes that say what was sampled and how the
// quantiles are read.
func (u *Uncertainty) addTo(d *Doc) {
	if u == nil {
		return
	}
	r := u.run
	d.Summary = append(d.Summary, fmt.Sprintf("uncertainty (%d samples, seed %d): P5 / P50 / P95", r.Samples, r.Seed))
	if w := u.Warning(); w != "" {
		d.Summary = append(d.Summary, "  warning: "+w)
	}
	perRow := false
	for k, h := range u.heads {
		if h.row >= 0 {
			perRow = true
			continue
		}
		d.Summary = append(d.Summary, fmt.Sprintf("  %s: %s", h.label, u.BandText(k)))
	}
	if perRow {
		d.Summary = append(d.Summary, "  per temperature: see the P5, P50 and P95 columns")
	}
	d.Tables = append(d.Tables, u.SensitivityTable())
	var given []string
	for i, s := range u.specs {
		given = append(given, spreadDescription(s, r.Spreads[i]))
	}
	d.Notes = append(d.Notes, "spreads, drawn independently: "+strings.Join(given, "; "))
	d.Notes = append(d.Notes, "normal spreads are absolute or relative to the value; log-normal ones ("+strings.Join(presets.LogNormalKeys(), ", ")+") have the value as median; quantiles: "+sample.QuantileDefinition)
	for _, su := range r.Spreads {
		if su.Redrawn > 0 {
			d.Notes = append(d.Notes, fmt.Sprintf("%s: %d draws fell outside %s and were drawn again (the distribution is truncated there)", su.Key, su.Redrawn, su.Range))
		}
	}
	for k, h := range u.heads {
		if m := r.Bands[k].Missing; m > 0 {
			d.Notes = append(d.Notes, fmt.Sprintf("%s: %d of %d samples have no answer and are left out of the quantiles", h.labelAt(u.rowTemps), m, r.Samples))
		}
	}
}

// SensitivityTable is one row per headline result, one column per spread,
// each cell the change for −1σ / +1σ, and the ranking.
func (u *Uncertainty) SensitivityTable() Table {
	t := Table{Title: "sensitivity: change of each result for −1σ / +1σ of one input alone (others at their values); ranked, largest first"}
	t.Cols = []Col{{Head: "result", Key: "result"}, {Head: "unit", Key: "unit"}}
	for _, s := range u.specs {
		t.Cols = append(t.Cols, Col{Head: s.Key + " −1σ / +1σ", Key: s.Key})
	}
	t.Cols = append(t.Cols, Col{Head: "ranking", Key: "ranking"})
	for k, h := range u.heads {
		row := []any{h.labelAt(u.rowTemps), h.unit()}
		byKey := map[string]sample.Effect{}
		var rank []string
		for _, e := range u.run.Sensitivity[k] {
			byKey[e.Key] = e
			rank = append(rank, e.Key)
		}
		for _, s := range u.specs {
			row = append(row, EffectText(byKey[s.Key]))
		}
		row = append(row, strings.Join(rank, " > "))
		t.Rows = append(t.Rows, row)
	}
	return t
}

// BandText is "P5 / P50 / P95" of headline k in its format.
func (u *Uncertainty) BandText(k int) string {
	h, b := u.heads[k], u.run.Bands[k]
	return h.text(b.P5) + " / " + h.text(b.P50) + " / " + h.text(b.P95)
}

// spreadDescription says how a spread was given and what it is, e.g.
// "gamma 2% (normal, σ = 0.00236 J/m2, card)".
func spreadDescription(s presets.SpreadSpec, sp sample.SpreadUse) string {
	p, _ := presets.ParamByKey(s.Key)
	from := "command line"
	if s.Line > 0 {
		from = fmt.Sprintf("card line %d, %s", s.Line, s.Source)
	}
	var sd string
	if sp.Dist == sample.LogNormal {
		sd = fmt.Sprintf("σ(ln) = %.3g, ±1σ = ×/÷ %.3g", sp.SD, math.Exp(sp.SD))
	} else {
		sd = fmt.Sprintf("σ = %.4g %s", sp.SD, p.Kinds[0].SI)
	}
	return fmt.Sprintf("%s %s (%s, %s; %s)", s.Key, s.Text, sp.Dist, sd, from)
}

// EffectText is one sensitivity cell, "−0.52 / +0.49".
func EffectText(e sample.Effect) string {
	f := func(x float64) string {
		if math.IsNaN(x) {
			return Dash
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

// kelvin formats a temperature in K with two decimals.
func kelvin(x float64) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return Dash
	}
	return strconv.FormatFloat(x, 'f', 2, 64) + " K"
}

// plain formats a value with n decimals.
func plain(n int) func(float64) string {
	return func(x float64) string { return Fixed(n)(x) }
}

// sig3 writes a value with three significant digits.
func sig3(x float64) string { return Sig(3)(x) }

// RateText writes a cooling rate, K/s, with three significant digits: the
// one way every output writes one.
func RateText(q float64) string {
	if math.IsNaN(q) || math.IsInf(q, 0) {
		return Dash
	}
	return ThreeSig(q) + " K/s"
}
