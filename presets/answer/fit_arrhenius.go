package answer

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/unit/constant"

	"undercool/cnt"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// arrheniusQuantity is a column an Arrhenius fit accepts as its y.
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

// ArrheniusColumns are the columns of an Arrhenius fit's data: the
// temperature, one rate-like column and the weights.
func ArrheniusColumns() []presets.Column {
	cols := []presets.Column{{Quantity: "temperature", Kind: units.Temperature, Required: true}}
	for _, q := range arrheniusQuantities {
		cols = append(cols, q.col)
	}
	return append(cols, WeightColumn)
}

var electronVolt = float64(constant.ElementaryCharge) // J per eV, exact (SI 2019)

// coldLimit is the temperature below which a whole Arrhenius data set is
// suspected of being degrees Celsius written as kelvin: diffusion or
// annealing data of a metal all below 250 K is rare (common practice).
const coldLimit = 250.0 // K

// Warning is a remark on the data that does not stop the fit.
type Warning struct {
	Key  string `json:"key"`  // snake_case name
	Text string `json:"text"` // one sentence
}

// ArrheniusInputs are the inputs of an Arrhenius fit.
type ArrheniusInputs struct {
	File     string `json:"data_file"`
	Points   int    `json:"points"`
	TColumn  string `json:"temperature_column"`
	YColumn  string `json:"value_column"`
	Quantity string `json:"quantity"`
	Weighted bool   `json:"weighted"`
}

// FitArrhenius is y = A·exp(−Q/RT) fitted to a data file.
type FitArrhenius struct {
	Inputs   ArrheniusInputs `json:"inputs"`
	Q        Num             `json:"activation_energy_j_per_mol" result:"activation energy Q"`
	QSE      Num             `json:"activation_energy_se_j_per_mol"`
	QCI      Interval        `json:"activation_energy_ci95_j_per_mol"`
	QkJ      Num             `json:"activation_energy_kj_per_mol"`
	QeV      Num             `json:"activation_energy_ev"`
	A        Num             `json:"pre_exponential"`
	AUnit    string          `json:"pre_exponential_unit"`
	ACI      Interval        `json:"pre_exponential_ci95"`
	LnA      Num             `json:"ln_pre_exponential" result:"ln of the pre-exponential"`
	LnASE    Num             `json:"ln_pre_exponential_se"`
	Scatter                  // r2, residual_sd_ln, degrees_of_freedom, student_t
	Warnings []Warning       `json:"warnings"`
	Rows     []ArrheniusRow  `json:"rows"`

	Fit   *fit.ArrheniusFit `json:"-"`
	T, Y  []float64         `json:"-"` // the points fitted: K and y in the unit of the law
	q     arrheniusQuantity
	Data  FitData `json:"-"`
	names Names
}

// ArrheniusRow is one point of the data with the fitted value.
type ArrheniusRow struct {
	Line     string `json:"line" col:"line"`
	T        Num    `json:"temperature_k" col:"T (K),f2"`
	TC       Num    `json:"temperature_c" col:"T (°C),f2,2"`
	InvT     Num    `json:"inverse_temperature_per_k" col:"1000/T (1/K),per_kk,1"`
	Y        Num    `json:"value" col:"y,g4"`
	Fitted   Num    `json:"fitted_value" col:"fitted,g4"`
	Residual Num    `json:"residual_ln" col:"residual (ln),f4"`
}

// Arrhenius fits ln y against 1/T to a file read with ArrheniusColumns.
// Errors: the file's points (*BadData).
func Arrhenius(data FitData, names Names) (*FitArrhenius, error) {
	d := data.Data
	var q *arrheniusQuantity
	var accepted []string
	for i := range arrheniusQuantities {
		accepted = append(accepted, arrheniusQuantities[i].col.Quantity)
		if _, ok := d.Columns[arrheniusQuantities[i].col.Quantity]; ok {
			if q != nil {
				return nil, &BadData{fmt.Sprintf("%s: two rate-like columns (%s and %s); give one", d.File, d.Headers[q.col.Quantity], d.Headers[arrheniusQuantities[i].col.Quantity])}
			}
			q = &arrheniusQuantities[i]
		}
	}
	if q == nil {
		return nil, &BadData{fmt.Sprintf("%s: no rate-like column; accepted: %s (with their units, e.g. diffusivity_m2_per_s, time_min, viscosity_pa_s)", d.File, strings.Join(accepted, ", "))}
	}
	T := d.Columns["temperature"]
	raw := d.Columns[q.col.Quantity]
	y := make([]float64, len(raw))
	for i, v := range raw {
		if !(v > 0) {
			return nil, data.bad(i, fmt.Sprintf("column %q: %g must be positive to take its logarithm", d.Headers[q.col.Quantity], v))
		}
		y[i] = v
		if q.invert {
			y[i] = 1 / v
		}
	}
	if err := data.aboveZero(); err != nil {
		return nil, err
	}
	res, err := fit.Arrhenius(T, y, data.W)
	if err != nil {
		return nil, badData(d, err)
	}
	l := res.Line
	eV := res.Q / (cnt.Avogadro * electronVolt)
	a := &FitArrhenius{
		Inputs: ArrheniusInputs{d.File, l.N, d.Headers["temperature"], d.Headers[q.col.Quantity], q.symbol, data.W != nil},
		Q:      Num(res.Q), QSE: Num(res.QSE), QCI: res.QCI, QkJ: Num(res.Q / 1e3), QeV: Num(eV),
		A: Num(res.A), AUnit: q.unit, ACI: res.ACI, LnA: Num(res.LnA), LnASE: Num(res.LnASE),
		Scatter:  scatterOf(l.R2, l.ResidualSD, l.DoF, l.T),
		Warnings: celsiusWarnings(T, res, "temperature"),
		Fit:      res, T: T, Y: y, q: *q, Data: data, names: names,
	}
	a.Rows = []ArrheniusRow{}
	for i, t := range T[:listed(data, len(T))] {
		a.Rows = append(a.Rows, ArrheniusRow{fmt.Sprint(d.Lines[i]), Num(t), Num(units.Celsius(t)), Num(1 / t), Num(y[i]), Num(math.Exp(l.At(1 / t))), Num(l.Residuals[i])})
	}
	return a, nil
}

// celsiusWarnings applies two rules of thumb for a temperature column in
// the wrong scale (common practice), named by its quantity: every
// temperature below coldLimit (coldWarning), or a fit that is much
// straighter with every temperature shifted by ±273.15 K.
func celsiusWarnings(T []float64, f *fit.ArrheniusFit, quantity string) []Warning {
	out := coldWarning(T, quantity)
	if f.Straighter(units.CelsiusOffset) {
		out = append(out, Warning{"straighter_if_celsius", fmt.Sprintf("the temperatures look like degrees Celsius read as kelvin: the points lie on a much straighter line %g K higher; name the column %s_c if so", units.CelsiusOffset, quantity)})
	}
	if f.Straighter(-units.CelsiusOffset) {
		out = append(out, Warning{"straighter_if_kelvin", fmt.Sprintf("the temperatures look like kelvin read as degrees Celsius: the points lie on a much straighter line %g K lower; name the column %s_k if so", units.CelsiusOffset, quantity)})
	}
	return out
}

// coldWarning is the first rule of celsiusWarnings, for any column of
// temperatures read as kelvin, named by its quantity: every one below
// coldLimit suggests degrees Celsius written as kelvin. Empty (not nil:
// JSON []) otherwise.
func coldWarning(T []float64, quantity string) []Warning {
	if floats.Max(T) < coldLimit {
		return []Warning{{"all_below_250_k", fmt.Sprintf(
			"every temperature is below %g K; if they are degrees Celsius, name the column %s_c", coldLimit, quantity)}}
	}
	return []Warning{}
}

// Doc is how the fit reads.
func (a *FitArrhenius) Doc() Doc {
	res, l, q := a.Fit, a.Fit.Line, a.q
	kj := func(x float64) string { return fmt.Sprintf("%.4g", x/1e3) }
	law := fmt.Sprintf("%s = A exp(-Q/RT)", q.symbol)
	if q.symbol == "D" {
		law = "D = D0 exp(-Q/RT)"
	}
	d := Doc{
		Title: "undercool fit arrhenius: ln y against 1/T by least squares",
		About: []string{
			a.Data.line(l.N, "temperature", q.col.Quantity),
			fmt.Sprintf("law: %s with y = %s in %s; R = %.9g J/(mol K)", law, q.symbol, q.unit, cnt.Gas),
		},
	}
	for _, w := range a.Warnings {
		d.Summary = append(d.Summary, "warning: "+w.Text)
	}
	d.Summary = append(d.Summary,
		fmt.Sprintf("Q = %s kJ/mol (%.0f J/mol, %.4g eV)%s", kj(res.Q), res.Q, float64(a.QeV), spreadText(res.QSE, res.QCI, kj, " kJ/mol")),
		fmt.Sprintf("pre-exponential = %s %s%s%s", Sig(4)(res.A), q.unit, spreadText(math.NaN(), res.ACI, g(4), ""), lnText("A", res.LnA, res.LnASE, l.InterceptCI())),
		statsLine(l.N, l.DoF, l.R2, l.ResidualSD, "ln y"),
	)
	d.Table = tableOf(a.Rows)
	d.Table.Cols[4].Head = q.symbol + " (" + q.unit + ")"
	d.Notes = append(d.Notes, intervalNote(l.Exact(), "line", l.T, l.DoF, "; the pre-exponential's interval is exp of that of ln A"))
	return fitDoc(d, a.Data, a.names, FitCaution)
}

// Card is the material card the fit gives: base (nil: none) with d0 and q
// replaced, or a card of kind holding only them. Only a diffusivity
// belongs on a card; any other column is an *InputError of "card-out".
func (a *FitArrhenius) Card(base *presets.Card, kind string) (*presets.Card, []string, error) {
	if a.q.col.Quantity != "diffusivity" {
		return nil, nil, &InputError{"card-out", fmt.Errorf("a card holds an Arrhenius diffusivity (d0, q); %s has a %s column", a.Data.File, a.Data.Headers[a.q.col.Quantity])}
	}
	name, res := a.Data.Name(), a.Fit
	header := []string{fmt.Sprintf("d0 and q fitted by undercool fit arrhenius to %s.", name)}
	var c *presets.Card
	if base != nil {
		c = base.Clone()
		c.Name += "-fit"
	} else {
		stem := strings.TrimSuffix(name, filepathExt(name))
		c = &presets.Card{Name: "fit-" + strings.ReplaceAll(stem, " ", "-"), Kind: kind, Driving: "linear", Values: map[string]presets.Value{}}
		var rest []string
		for _, in := range []string{"te", "dh", "vm", "gamma", "driving"} {
			rest = append(rest, a.names.of(in))
		}
		header = append(header,
			"Only d0 and q come from the fit. The driving force \"linear\" is a placeholder: give the",
			"rest with flags ("+strings.Join(rest, ", ")+") or add it here with its sources.")
	}
	c.Mobility = "arrhenius"
	c.Description = strings.TrimSpace(c.Description + " (d0 and q fitted to " + name + ")")
	src := fmt.Sprintf("undercool fit arrhenius of %s, %d points", name, res.Line.N)
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
