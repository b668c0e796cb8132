package main

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/units"
)

// curveColumns are the columns of a measured cooling curve.
var curveColumns = []presets.Column{
	{Quantity: "time", Kind: units.Time, Required: true},
	{Quantity: "temperature", Kind: units.Temperature, Required: true},
}

// readCurve reads a measured curve and checks it as a path; errors name the
// file and line.
func readCurve(path string, e *env) (kinetics.Path, *presets.Data, error) {
	d, err := presets.ReadDataFile(path, e.stdin, curveColumns)
	if err != nil {
		return kinetics.Path{}, nil, usagef("--curve: %v", err)
	}
	p, err := kinetics.NewPath(d.Columns["time"], d.Columns["temperature"])
	if err != nil {
		var pe *kinetics.PointError
		if errors.As(err, &pe) {
			return kinetics.Path{}, nil, usagef("--curve: %s:%d: %s (time must increase strictly from row to row)", d.File, d.Lines[pe.Index], pe.Msg)
		}
		return kinetics.Path{}, nil, usagef("--curve: %s: %v", d.File, err)
	}
	return p, d, nil
}

// ccurveNames are the constants of --c-curve, in order.
var ccurveNames = []string{"k1", "k2", "k3", "k4", "k5"}

// parseCCurve reads --c-curve k1=..,k2=..,k3=..,k4=..,k5=..: k1 a plain
// number, k2 a time (bare: s), k3 and k5 molar energies (bare: J/mol), k4 a
// temperature (bare: K).
func parseCCurve(s string) (kinetics.EvanchoStaley, error) {
	const form = "k1=-0.00501,k2=1e-10s,k3=4000,k4=760K,k5=130kJ/mol"
	vals := map[string]float64{}
	for _, part := range strings.Split(s, ",") {
		key, text, ok := strings.Cut(strings.TrimSpace(part), "=")
		key, text = strings.ToLower(strings.TrimSpace(key)), strings.TrimSpace(text)
		if !ok || key == "" {
			return kinetics.EvanchoStaley{}, usagef("--c-curve: %q is not NAME=VALUE (write %s)", strings.TrimSpace(part), form)
		}
		if !contains(ccurveNames, key) {
			return kinetics.EvanchoStaley{}, usagef("--c-curve: unknown constant %q (the constants are k1, k2, k3, k4, k5)", key)
		}
		if _, dup := vals[key]; dup {
			return kinetics.EvanchoStaley{}, usagef("--c-curve: %s given twice", key)
		}
		v, err := ccurveValue(key, text)
		if err != nil {
			return kinetics.EvanchoStaley{}, usagef("--c-curve: %s: %v", key, err)
		}
		vals[key] = v
	}
	for _, k := range ccurveNames {
		if _, ok := vals[k]; !ok {
			return kinetics.EvanchoStaley{}, usagef("--c-curve: missing constant %s (all of k1..k5 are needed, e.g. %s)", k, form)
		}
	}
	c := kinetics.EvanchoStaley{K1: vals["k1"], K2: vals["k2"], K3: vals["k3"], K4: vals["k4"], K5: vals["k5"]}
	if err := c.Check(); err != nil {
		return c, usagef("--c-curve: %v", err)
	}
	return c, nil
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

// bandColumns are the columns of the quench-factor table.
var bandColumns = []column{
	{"band (K)", "band", nil},
	{"from (K)", "band_high_k", fixed(1)},
	{"to (K)", "band_low_k", fixed(1)},
	timeColumn("time in band", "time_s"),
	{"part of Q", "quench_factor_part", sig(4)},
	{"share of Q (%)", "share_percent", fixed(2)},
}

func bandRows(q kinetics.QuenchResult) [][]any {
	var rows [][]any
	for _, b := range q.Bands {
		rows = append(rows, []any{fmt.Sprintf("%.0f–%.0f", b.Hi, b.Lo), b.Hi, b.Lo, b.Time, b.Q, 100 * b.Share})
	}
	return rows
}

// bandError is the error of the curve's quench factor: a --band too
// narrow for the curve is bad input, anything else a failed computation.
func bandError(err error, band, span float64) error {
	if errors.Is(err, kinetics.ErrTooManyBands) {
		return usagef("--band: %g K over a curve spanning %.2f K gives more than %d bands; use a wider band", band, span, kinetics.MaxBands)
	}
	return fmt.Errorf("cool: %v", err)
}

func runCurve(e *env, fs *pflag.FlagSet, mf *materialFlags, cf *coolFlags, format string, X, V, band float64, sf *spreadFlags) error {
	var es *kinetics.EvanchoStaley
	if cf.set("c-curve") {
		c, err := parseCCurve(cf.ccurve)
		if err != nil {
			return err
		}
		es = &c
	}
	withMaterial := materialGiven(fs, mf)
	if !withMaterial && es == nil {
		return usagef("--curve: needs --material (for the fraction and the additivity sum) or --c-curve (for a quench factor alone)")
	}
	if !withMaterial && cf.set("volume") {
		return usagef("--volume: the onset of nucleation needs --material")
	}
	p, d, err := readCurve(cf.curve, e)
	if err != nil {
		return err
	}
	n := len(p.Time)
	Tmin, Tmax := math.Inf(1), math.Inf(-1)
	for _, T := range p.Temp {
		Tmin, Tmax = math.Min(Tmin, T), math.Max(Tmax, T)
	}
	r := &result{title: "undercool cool: measured cooling curve " + d.File}
	curveLine := fmt.Sprintf("curve: %s, %d points (%s, %s), %s to %s, %.2f to %.2f K",
		d.File, n, d.Headers["time"], d.Headers["temperature"], readableTime(p.Time[0]), readableTime(p.Time[n-1]), Tmax, Tmin)
	inputs := object{}
	var extra object
	var quench *kinetics.QuenchResult
	k1 := 0.0
	var card *presets.Card
	var model *kinetics.Model
	if withMaterial {
		c, md, err := mf.model()
		if err != nil {
			return err
		}
		card, model = c, md
		if err := coolError(md); err != nil {
			return err
		}
		about, in := describeCard(c, md)
		r.about, inputs = about, in
		a, err := md.AnalyzeCurve(p, X, band)
		if err != nil {
			return bandError(err, band, Tmax-Tmin)
		}
		te := md.Material().Te
		line := fmt.Sprintf("fraction at the end of the curve: %.4g (exact path integral)", a.Path.Fraction)
		reached := any(nil)
		if a.Path.Reached {
			line += fmt.Sprintf("; X = %s reached at %.2f K, %s into the curve", fracLabel(X), a.Path.TempReached, readableTime(a.Path.TimeReached))
			reached = object{{"temperature_k", a.Path.TempReached}, {"time_s", a.Path.TimeReached}}
		} else {
			line += fmt.Sprintf("; X = %s not reached", fracLabel(X))
		}
		r.summary = append(r.summary, line)
		extra = append(extra, kv{"fraction", a.Path.Fraction}, kv{"fraction_reached", reached})
		if V > 0 {
			o := kinetics.OnsetAlong(p, a.Sums, V)
			if o.Reached {
				r.summary = append(r.summary, fmt.Sprintf("onset in %.4g m3: first nucleus expected at %.2f K (undercooling %.2f K), %s into the curve", V, o.Temp, te-o.Temp, readableTime(o.Time)))
				extra = append(extra, kv{"onset_temperature_k", o.Temp}, kv{"onset_undercooling_k", te - o.Temp}, kv{"onset_time_s", o.Time})
			} else {
				r.summary = append(r.summary, fmt.Sprintf("onset in %.4g m3: none, %.3g nuclei expected on the whole curve", V, o.Expected()))
				extra = append(extra, kv{"onset_temperature_k", nil}, kv{"onset_undercooling_k", nil}, kv{"onset_time_s", nil})
			}
			extra = append(extra, kv{"expected_nuclei", o.Expected()})
		}
		s := a.Additivity
		line = fmt.Sprintf("additivity sum, integral of dt/t_X over the curve (t_X: isothermal time to X = %s): %.4g", fracLabel(X), s.Q)
		sreached := any(nil)
		if s.Reached {
			line += fmt.Sprintf("; reaches 1 at %.2f K, %s into the curve", s.TempReached, readableTime(s.TimeReached))
			sreached = object{{"temperature_k", s.TempReached}, {"time_s", s.TimeReached}}
		} else {
			line += "; does not reach 1"
		}
		r.summary = append(r.summary, line)
		extra = append(extra, kv{"additivity_sum", s.Q}, kv{"additivity_reached", sreached})
		if es == nil {
			quench = &s
			k1 = math.Log1p(-X)
		}
	}
	r.about = append(r.about, curveLine)
	inputs = append(inputs, kv{"path", "curve"}, kv{"curve", d.File}, kv{"points", n}, kv{"target_fraction", X})
	if V > 0 {
		inputs = append(inputs, kv{"volume_m3", V})
	}
	if withMaterial {
		r.about = append(r.about, transformLine)
	}
	cc := "the material's own TTT curve for X = " + fracLabel(X) + " (k1 = ln(1 - X))"
	if es != nil {
		q, err := kinetics.Quench(p, *es, band)
		if err != nil {
			return bandError(err, band, Tmax-Tmin)
		}
		quench, k1 = &q, es.K1
		cc = fmt.Sprintf("Evancho-Staley, k1 = %g, k2 = %g s, k3 = %g J/mol, k4 = %g K, k5 = %g J/mol", es.K1, es.K2, es.K3, es.K4, es.K5)
		inputs = append(inputs, kv{"c_curve", object{{"k1", es.K1}, {"k2_s", es.K2}, {"k3_j_per_mol", es.K3}, {"k4_k", es.K4}, {"k5_j_per_mol", es.K5}}})
	} else {
		inputs = append(inputs, kv{"c_curve", "ttt"})
	}
	r.about = append(r.about, "C-curve: "+cc)
	r.inputs = inputs
	retained := math.Exp(k1 * quench.Q)
	r.summary = append(r.summary, fmt.Sprintf("quench factor Q = integral of dt/C(T): %.4g; retained property fraction exp(k1 Q) = %.4g", quench.Q, retained))
	extra = append(extra, kv{"quench_factor", quench.Q}, kv{"retained_property_fraction", retained}, kv{"band_k", band})
	r.extra = extra
	r.cols = bandColumns
	r.rows = bandRows(*quench)
	r.notes = append(r.notes,
		fmt.Sprintf("the table is where along the curve the quench factor was collected: bands of %g K, hottest first", band),
		"additivity (Scheil) treats the path as a sequence of isothermal holds; it is exact only for isokinetic transformations (Cahn 1956)",
		caution)
	if model != nil {
		heads, eval := curveHeadlines(p, X, V, band)
		if err := sf.apply(e, r, card, model, heads, eval, nil); err != nil {
			return err
		}
	}
	return r.render(e.stdout, format)
}
