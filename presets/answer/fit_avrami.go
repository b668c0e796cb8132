package answer

import (
	"fmt"
	"math"
	"strings"

	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// AvramiColumns are the columns of an Avrami fit's data.
func AvramiColumns() []presets.Column {
	return []presets.Column{
		{Quantity: "time", Kind: units.Time, Required: true},
		{Quantity: "fraction", Kind: units.Fraction, Required: true},
		WeightColumn,
	}
}

// AvramiInputs are the inputs of an Avrami fit.
type AvramiInputs struct {
	File       string `json:"data_file"`
	Rows       int    `json:"rows"`
	PointsUsed int    `json:"points_used"`
	TimeColumn string `json:"time_column"`
	Weighted   bool   `json:"weighted"`
}

// FitAvrami is X = 1 − exp(−k·tⁿ) fitted to transformed fractions.
type FitAvrami struct {
	Inputs   AvramiInputs `json:"inputs"`
	N        Num          `json:"avrami_exponent" result:"Avrami exponent n"`
	NSE      Num          `json:"avrami_exponent_se"`
	NCI      Interval     `json:"avrami_exponent_ci95"`
	K        Num          `json:"rate_constant"`
	KUnit    string       `json:"rate_constant_unit"`
	KCI      Interval     `json:"rate_constant_ci95"`
	LnK      Num          `json:"ln_rate_constant" result:"ln of the rate constant k"`
	LnKSE    Num          `json:"ln_rate_constant_se"`
	Half     Num          `json:"half_time_s"`
	HalfCI   Interval     `json:"half_time_ci95_s"`
	T95      Num          `json:"time_to_95_percent_s"`
	T95CI    Interval     `json:"time_to_95_percent_ci95_s"`
	R2       Num          `json:"r2"`
	SD       Num          `json:"residual_sd"`
	DoF      int          `json:"degrees_of_freedom"`
	StudentT Num          `json:"student_t"`
	LeftOut  []int        `json:"left_out_lines"`
	Rows     []AvramiRow  `json:"rows"`

	Fit   *fit.AvramiFit `json:"-"`
	Time  []float64      `json:"-"` // s
	X     []float64      `json:"-"`
	Data  FitData        `json:"-"`
	names Names
}

// AvramiRow is one point with the fitted fraction; a point at X = 0 or 1
// is left out of the fit.
type AvramiRow struct {
	Line     string `json:"line" col:"line"`
	T        Num    `json:"time_s" col:"t (s),g5"`
	X        Num    `json:"fraction" col:"X,f4"`
	LnT      Num    `json:"ln_time" col:"ln t,f4,2"`
	LnLn     Num    `json:"ln_minus_ln_one_minus_x" col:"ln(-ln(1-X)),f4,2"`
	Fitted   Num    `json:"fitted_fraction" col:"fitted X,f4"`
	Residual Num    `json:"residual" col:"residual,f4,1"`
	Used     string `json:"used" col:"used"`
}

// Avrami fits ln(−ln(1−X)) against ln t to a file read with AvramiColumns.
// Errors: the file's points (*BadData).
func Avrami(data FitData, names Names) (*FitAvrami, error) {
	d := data.Data
	t, X := d.Columns["time"], d.Columns["fraction"]
	for i, x := range X {
		if x < 0 || x > 1 {
			return nil, data.bad(i, fmt.Sprintf("column \"fraction\": %s lies outside [0, 1] (a transformed fraction; points at 0 and 1 are left out of the fit)", Sig(6)(x)))
		}
	}
	res, err := fit.Avrami(t, X, data.W)
	if err != nil {
		return nil, badData(d, err)
	}
	l := res.Line
	a := &FitAvrami{
		Inputs: AvramiInputs{d.File, len(t), l.N, d.Headers["time"], data.W != nil},
		N:      Num(res.N), NSE: Num(res.NSE), NCI: res.NCI, K: Num(res.K), KUnit: "s^-n", KCI: res.KCI,
		LnK: Num(res.LnK), LnKSE: Num(res.LnKSE),
		Half: Num(res.HalfTime()), HalfCI: res.TimeToCI(0.5), T95: Num(res.TimeTo(0.95)), T95CI: res.TimeToCI(0.95),
		R2: Num(l.R2), SD: Num(l.ResidualSD), DoF: l.DoF, StudentT: Num(l.T), LeftOut: []int{},
		Fit: res, Time: t, X: X, Data: data, names: names,
	}
	for _, i := range res.Skipped {
		a.LeftOut = append(a.LeftOut, d.Lines[i])
	}
	used := map[int]int{}
	for j, i := range res.Used {
		used[i] = j
	}
	nan := Num(math.NaN())
	a.Rows = []AvramiRow{}
	for i := range t[:listed(data, len(t))] {
		r := AvramiRow{Line: fmt.Sprint(d.Lines[i]), T: Num(t[i]), X: Num(X[i]), LnT: nan, LnLn: nan, Residual: nan, Used: "left out",
			Fitted: Num(-math.Expm1(-res.K * math.Pow(t[i], res.N)))}
		if t[i] > 0 {
			r.LnT = Num(math.Log(t[i]))
		}
		if j, ok := used[i]; ok {
			r.LnLn, r.Residual, r.Used = Num(math.Log(-math.Log1p(-X[i]))), Num(l.Residuals[j]), "yes"
		}
		a.Rows = append(a.Rows, r)
	}
	return a, nil
}

// timeUnit returns the unit of a time header (time_min → "min") and its
// length in seconds.
func timeUnit(header string) (string, float64) {
	u := strings.TrimPrefix(strings.ToLower(header), "time_")
	s, err := units.Parse("1"+u, units.Time)
	if err != nil || !(s > 0) {
		return "s", 1
	}
	return u, s
}

// Doc is how the fit reads.
func (a *FitAvrami) Doc() Doc {
	res, l, d := a.Fit, a.Fit.Line, a.Data
	unit, factor := timeUnit(d.Headers["time"])
	inUnit := func(s float64) string {
		if factor == 1 {
			return Sig(4)(s) + " s"
		}
		return fmt.Sprintf("%s s (%s %s)", Sig(4)(s), Sig(4)(s/factor), unit)
	}
	doc := Doc{
		Title: "undercool fit avrami: ln(-ln(1-X)) against ln t by least squares",
		About: []string{
			fmt.Sprintf("data: %s, %d rows, %d used; columns %s, %s%s", d.File, len(a.Time), l.N, d.Headers["time"], d.Headers["fraction"], d.weighted()),
			"law: X = 1 - exp(-k t^n), t in s, k in s^-n",
		},
	}
	doc.Summary = []string{
		fmt.Sprintf("n = %.4g%s", res.N, spreadText(res.NSE, res.NCI, g(4), "")),
		fmt.Sprintf("k = %s s^-%.4g%s%s", Sig(4)(res.K), res.N, spreadText(math.NaN(), res.KCI, g(4), ""), lnText("k", res.LnK, res.LnKSE, l.InterceptCI())),
	}
	if factor != 1 {
		doc.Summary = append(doc.Summary, fmt.Sprintf("k = %s %s^-%.4g with t in %s", Sig(4)(res.K*math.Pow(factor, res.N)), unit, res.N, unit))
	}
	doc.Summary = append(doc.Summary,
		fmt.Sprintf("half time = %s%s", inUnit(float64(a.Half)), spreadText(math.NaN(), a.HalfCI, g(4), " s")),
		fmt.Sprintf("t(X = 0.95) = %s%s", inUnit(float64(a.T95)), spreadText(math.NaN(), a.T95CI, g(4), " s")),
		statsLine(l.N, l.DoF, l.R2, l.ResidualSD, "ln(-ln(1-X))"),
	)
	if len(a.LeftOut) > 0 {
		var s []string
		for i, n := range a.LeftOut {
			if i == 20 {
				s = append(s, "…") // the JSON lists them all
				break
			}
			s = append(s, fmt.Sprint(n))
		}
		doc.Summary = append(doc.Summary, fmt.Sprintf("left out: %d rows with X = 0 or 1 (lines %s)", len(a.LeftOut), strings.Join(s, ", ")))
	}
	doc.Table = tableOf(a.Rows)
	doc.Notes = append(doc.Notes, intervalNote(l.Exact(), "line", l.T, l.DoF, "; those of k and the times are first-order (delta method) on their logarithms"))
	return fitDoc(doc, d, a.names, FitCaution)
}
