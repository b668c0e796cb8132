package main

import (
	"fmt"
	"math"
	"path/filepath"
	"strings"

	"gonum.org/v1/gonum/unit/constant"

	"undercool/cnt"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// arrheniusQuantity is a column fit arrhenius accepts as its y.
type arrheniusQuantity struct {
	col    presets.Column
	symbol string // in the law, e.g. "D"
	unit   string // SI unit of y (and of the pre-exponential)
	invert bool   // y is 1/column (times, viscosities)
}

// arrheniusQuantities are the rate-like columns, in the order they are
// matched (rate_constant before rate).
var arrheniusQuantities = []arrheniusQuantity{
	{presets.Column{Quantity: "diffusivity", Kind: units.Diffusivity}, "D", "m2/s", false},
	{presets.Column{Quantity: "rate_constant", Kind: units.Dimensionless}, "k", "the unit of the file", false},
	{presets.Column{Quantity: "rate", Kind: units.RateDensity}, "J", "m^-3 s^-1", false},
	{presets.Column{Quantity: "time", Kind: units.Time}, "1/t", "1/s", true},
	{presets.Column{Quantity: "viscosity", Kind: units.Viscosity}, "1/eta", "1/(Pa s)", true},
	{presets.Column{Quantity: "value", Kind: units.Dimensionless}, "y", "the unit of the file", false},
}

var electronVolt = float64(constant.ElementaryCharge) // J per eV, exact (SI 2019)

func (f *fitFlags) arrhenius(e *env, path string) error {
	cols := []presets.Column{{Quantity: "temperature", Kind: units.Temperature, Required: true}}
	var names []string
	for _, q := range arrheniusQuantities {
		cols = append(cols, q.col)
		names = append(names, q.col.Quantity)
	}
	d, w, notes, err := f.readFitData(e, path, cols)
	if err != nil {
		return err
	}
	var q *arrheniusQuantity
	for i := range arrheniusQuantities {
		if _, ok := d.Columns[arrheniusQuantities[i].col.Quantity]; ok {
			if q != nil {
				return usagef("%s: two rate-like columns (%s and %s); give one", d.File, d.Headers[q.col.Quantity], d.Headers[arrheniusQuantities[i].col.Quantity])
			}
			q = &arrheniusQuantities[i]
		}
	}
	if q == nil {
		return usagef("%s: no rate-like column; accepted: %s (with their units, e.g. diffusivity_m2_per_s, time_min, viscosity_pa_s)", d.File, strings.Join(names, ", "))
	}
	T := d.Columns["temperature"]
	raw := d.Columns[q.col.Quantity]
	y := make([]float64, len(raw))
	for i, v := range raw {
		if !(v > 0) {
			return usagef("%s:%d: column %q: %g must be positive to take its logarithm", d.File, d.Lines[i], d.Headers[q.col.Quantity], v)
		}
		y[i] = v
		if q.invert {
			y[i] = 1 / v
		}
	}
	if err := aboveZero(d, T); err != nil {
		return err
	}
	res, err := fit.Arrhenius(T, y, w)
	if err != nil {
		return fitError(d, err)
	}
	l := res.Line
	warnings := celsiusWarnings(T, res)
	kj := func(x float64) string { return fmt.Sprintf("%.4g", x/1e3) }
	law := fmt.Sprintf("%s = A exp(-Q/RT)", q.symbol)
	if q.symbol == "D" {
		law = "D = D0 exp(-Q/RT)"
	}
	r := &result{
		title: "undercool fit arrhenius: ln y against 1/T by least squares",
		about: []string{
			dataLine(d, l.N, w, "temperature", q.col.Quantity),
			fmt.Sprintf("law: %s with y = %s in %s; R = %.9g J/(mol K)", law, q.symbol, q.unit, cnt.Gas),
		},
		inputs: object{{"data_file", d.File}, {"points", l.N}, {"temperature_column", d.Headers["temperature"]},
			{"value_column", d.Headers[q.col.Quantity]}, {"quantity", q.symbol}, {"weighted", w != nil}},
	}
	for _, wn := range warnings {
		r.summary = append(r.summary, "warning: "+wn.Text)
	}
	r.summary = append(r.summary,
		fmt.Sprintf("Q = %s kJ/mol (%.0f J/mol, %.4g eV)%s", kj(res.Q), res.Q, res.Q/(cnt.Avogadro*electronVolt), spreadText(res.QSE, res.QCI, kj, " kJ/mol")),
		fmt.Sprintf("pre-exponential = %s %s%s%s", sig(4)(res.A), q.unit, spreadText(math.NaN(), res.ACI, g(4), ""), lnText("A", res.LnA, res.LnASE, res.Line.InterceptCI())),
		statsLine(l.N, l.DoF, l.R2, l.ResidualSD, "ln y"),
	)
	r.extra = object{
		{"activation_energy_j_per_mol", res.Q},
		{"activation_energy_se_j_per_mol", res.QSE},
		{"activation_energy_ci95_j_per_mol", ciJSON(res.QCI)},
		{"activation_energy_kj_per_mol", res.Q / 1e3},
		{"activation_energy_ev", res.Q / (cnt.Avogadro * electronVolt)},
		{"pre_exponential", res.A},
		{"pre_exponential_unit", q.unit},
		{"pre_exponential_ci95", ciJSON(res.ACI)},
		{"ln_pre_exponential", res.LnA},
		{"ln_pre_exponential_se", res.LnASE},
	}
	r.extra = append(r.extra, scatterJSON("residual_sd_ln", l.R2, l.ResidualSD, l.DoF, l.T)...)
	r.extra = append(r.extra, kv{"warnings", warningsJSON(warnings)})
	r.cols = []column{
		{"line", "line", nil},
		{"T (K)", "temperature_k", fixed(2)},
		{"T (°C)", "temperature_c", fixed(2)},
		{"1000/T (1/K)", "inverse_temperature_per_k", scaled(1e3, 5)},
		{q.symbol + " (" + q.unit + ")", "value", sig(4)},
		{"fitted", "fitted_value", sig(4)},
		{"residual (ln)", "residual_ln", fixed(4)},
	}
	for i, t := range T {
		r.rows = append(r.rows, []any{fmt.Sprint(d.Lines[i]), t, t - units.CelsiusOffset, 1 / t, y[i], math.Exp(l.At(1 / t)), l.Residuals[i]})
	}
	r.notes = append(r.notes, intervalNote(l.Exact(), "line", l.T, l.DoF, "; the pre-exponential's interval is exp of that of ln A"))
	return f.finish(e, r, notes,
		func() error { return arrheniusPlot(f.pf, dataName(d), q.symbol, q.unit, T, y, res) },
		func() (*presets.Card, []string, error) {
			if q.col.Quantity != "diffusivity" {
				return nil, nil, usagef("--card-out: a card holds an Arrhenius diffusivity (d0, q); %s has a %s column", d.File, d.Headers[q.col.Quantity])
			}
			return f.arrheniusCard(d, res)
		})
}

func weighted(w []float64) string {
	if w == nil {
		return ""
	}
	return ", weight (relative weights on ln y)"
}

// arrheniusCard is the card --card-out writes: the --material card with d0
// and q replaced, or a card holding only them.
func (f *fitFlags) arrheniusCard(d *presets.Data, res *fit.ArrheniusFit) (*presets.Card, []string, error) {
	var c *presets.Card
	header := []string{fmt.Sprintf("d0 and q fitted by undercool fit arrhenius to %s.", dataName(d))}
	if f.materialGiven() != "" {
		var err error
		if c, err = f.mf.card(); err != nil {
			return nil, nil, err
		}
		c.Name += "-fit"
	} else {
		stem := strings.TrimSuffix(dataName(d), filepath.Ext(dataName(d)))
		c = &presets.Card{Name: "fit-" + strings.ReplaceAll(stem, " ", "-"), Kind: f.kind, Driving: "linear", Values: map[string]presets.Value{}}
		header = append(header,
			"Only d0 and q come from the fit. The driving force \"linear\" is a placeholder: give the",
			"rest with flags (--te, --dh, --vm, --gamma, --driving) or add it here with its sources.")
	}
	c.Mobility = "arrhenius"
	c.Description = strings.TrimSpace(c.Description + " (d0 and q fitted to " + dataName(d) + ")")
	src := fmt.Sprintf("undercool fit arrhenius of %s, %d points", dataName(d), res.Line.N)
	qs, ds := src, src
	if !res.Line.Exact() {
		qs += fmt.Sprintf(", 95 %% interval %.5g to %.5g kJ/mol", res.QCI[0]/1e3, res.QCI[1]/1e3)
		ds += fmt.Sprintf(", 95 %% interval %.4g to %.4g m2/s", res.ACI[0], res.ACI[1])
	} else {
		qs += ", exact line through two points"
		ds = qs
	}
	if err := setValues(c,
		[3]string{"q", fmt.Sprintf("%.7g kJ/mol", res.Q/1e3), qs},
		[3]string{"d0", fmt.Sprintf("%.7g m2/s", res.A), ds}); err != nil {
		return nil, nil, err
	}
	return c, header, nil
}
