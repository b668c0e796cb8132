package answer

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"undercool/kinetics/fit"
	"undercool/presets/units"
)

// OzawaExponentInputs are the inputs of Ozawa's exponent fit.
type OzawaExponentInputs struct {
	File       string `json:"data_file"`
	Rows       int    `json:"rows"`
	TColumn    string `json:"temperature_column"`
	RateColumn string `json:"heating_rate_column"`
	Weighted   bool   `json:"weighted"`
}

// FitOzawaExponent is Ozawa's exponent m, fitted at each temperature of a
// file to the fractions reached there in scans at several heating rates.
type FitOzawaExponent struct {
	Inputs    OzawaExponentInputs `json:"inputs"`
	Exponents []OzawaAt           `json:"temperatures"`
	NotFitted []OzawaNotFitted    `json:"not_fitted"`
	Rows      []OzawaRow          `json:"rows"`

	Fits  []*fit.OzawaExponentFit `json:"-"` // beside Exponents
	Beta  [][]float64             `json:"-"` // the rates (K/s) of each fitted temperature, all rows
	X     [][]float64             `json:"-"` // and the fractions
	Data  FitData                 `json:"-"`
	names Names
}

// OzawaAt is the exponent at one temperature.
type OzawaAt struct {
	T      Num      `json:"temperature_k" col:"T (K),f2"`
	TC     Num      `json:"temperature_c" col:"T (°C),f2,2"`
	Used   int      `json:"points_used" col:"points"`
	M      Num      `json:"avrami_exponent" col:"m,f4" result:"Ozawa exponent m"`
	MSE    Num      `json:"avrami_exponent_se" col:"SE,g3"`
	MCI    Interval `json:"avrami_exponent_ci95"`
	LnK    Num      `json:"ln_rate_constant" col:"ln K,f4,1"`
	LnKSE  Num      `json:"ln_rate_constant_se"`
	KUnits string   `json:"rate_constant_unit"`
}

// OzawaNotFitted is a temperature without an exponent, and why.
type OzawaNotFitted struct {
	T      Num    `json:"temperature_k"`
	Reason string `json:"reason"`
}

// OzawaRow is one scan at one temperature.
type OzawaRow struct {
	Line     string `json:"line" col:"line"`
	T        Num    `json:"temperature_k" col:"T (K),f2"`
	RateMin  Num    `json:"heating_rate_k_per_min" col:"rate (K/min),g4"`
	X        Num    `json:"fraction" col:"X,f4"`
	LnB      Num    `json:"ln_heating_rate" col:"ln beta,f4,2"`
	LnLn     Num    `json:"ln_minus_ln_one_minus_x" col:"ln(-ln(1-X)),f4,2"`
	Fitted   Num    `json:"fitted_fraction" col:"fitted X,f4"`
	Residual Num    `json:"residual" col:"residual,f4,1"`
	Used     string `json:"used" col:"used"`
}

// OzawaExponent fits Ozawa's exponent at each temperature of a file read
// with OzawaColumns that has temperature and fraction columns. A
// temperature with fewer than two scans at 0 < X < 1 is listed as not
// fitted; a file where no temperature can be fitted is a *BadData.
func OzawaExponent(data FitData, names Names) (*FitOzawaExponent, error) {
	d := data.Data
	T, beta, X := d.Columns["temperature"], d.Columns["heating_rate"], d.Columns["fraction"]
	if err := data.positiveRates(); err != nil {
		return nil, err
	}
	for i, x := range X {
		if x < 0 || x > 1 {
			return nil, data.bad(i, fmt.Sprintf("column %q: %s lies outside [0, 1] (a transformed fraction; points at 0 and 1 are left out of the fit)", d.Headers["fraction"], Sig(6)(x)))
		}
		if !(T[i] > 0) {
			return nil, data.bad(i, fmt.Sprintf("column %q: %s K is at or below absolute zero", d.Headers["temperature"], Sig(6)(T[i])))
		}
	}
	// The rows of each temperature, in rising temperature; values equal
	// to 1 µK are one temperature (a column in °C converts with rounding).
	groups := map[float64][]int{}
	for i, t := range T {
		k := math.Round(t * 1e6)
		groups[k] = append(groups[k], i)
	}
	keys := make([]float64, 0, len(groups))
	for k := range groups {
		keys = append(keys, k)
	}
	sort.Float64s(keys)
	a := &FitOzawaExponent{
		Inputs:    OzawaExponentInputs{d.File, len(T), d.Headers["temperature"], d.Headers["heating_rate"], data.W != nil},
		Exponents: []OzawaAt{}, NotFitted: []OzawaNotFitted{}, Rows: []OzawaRow{},
		Data: data, names: names,
	}
	fitted := map[int]*fit.OzawaExponentFit{} // by row
	used := map[int]bool{}
	for _, k := range keys {
		rows := groups[k]
		b, x, w := pick(beta, rows), pick(X, rows), pick(data.W, rows)
		t := T[rows[0]]
		res, err := fit.OzawaExponent(b, x, w)
		if err != nil {
			a.NotFitted = append(a.NotFitted, OzawaNotFitted{Num(t), err.Error()})
			continue
		}
		l := res.Line
		a.Exponents = append(a.Exponents, OzawaAt{Num(t), Num(units.Celsius(t)), l.N, Num(res.M), Num(res.MSE), res.MCI,
			Num(res.LnK), Num(res.LnKSE), fmt.Sprintf("(K/s)^%.4g", res.M)})
		a.Fits, a.Beta, a.X = append(a.Fits, res), append(a.Beta, b), append(a.X, x)
		for _, j := range rows {
			fitted[j] = res
		}
		for _, j := range res.Used {
			used[rows[j]] = true
		}
	}
	if len(a.Exponents) == 0 {
		var why []string
		for _, n := range a.NotFitted {
			why = append(why, fmt.Sprintf("%s K: %s", Sig(6)(float64(n.T)), n.Reason))
		}
		return nil, &BadData{fmt.Sprintf("%s: no temperature has two heating rates with 0 < fraction < 1 to fit (%s)", d.File, strings.Join(why, "; "))}
	}
	nan := Num(math.NaN())
	for i := range T[:listed(data, len(T))] {
		r := OzawaRow{Line: fmt.Sprint(d.Lines[i]), T: Num(T[i]), RateMin: Num(beta[i] * 60), X: Num(X[i]), LnB: Num(math.Log(beta[i])),
			LnLn: nan, Fitted: nan, Residual: nan, Used: "left out"}
		if res := fitted[i]; res != nil {
			y := res.Line.At(math.Log(beta[i]))
			r.Fitted = Num(-math.Expm1(-math.Exp(y)))
			if used[i] {
				ln := math.Log(-math.Log1p(-X[i]))
				r.LnLn, r.Residual, r.Used = Num(ln), Num(ln-y), "yes"
			}
		}
		a.Rows = append(a.Rows, r)
	}
	return a, nil
}

// pick is the values of x at rows; nil for nil.
func pick(x []float64, rows []int) []float64 {
	if x == nil {
		return nil
	}
	out := make([]float64, len(rows))
	for i, j := range rows {
		out[i] = x[j]
	}
	return out
}

// Doc is how the fit reads.
func (a *FitOzawaExponent) Doc() Doc {
	d := a.Data
	doc := Doc{
		Title: "undercool fit ozawa: ln(-ln(1-X)) against ln(beta) at each temperature (Ozawa's exponent)",
		About: []string{
			fmt.Sprintf("data: %s, %d rows; columns %s, %s, %s%s", d.File, len(d.Lines), d.Headers["temperature"], d.Headers["heating_rate"], d.Headers["fraction"], d.weighted()),
			"law: 1 - X(T) = exp(-K(T)/beta^m), beta in K/s (Ozawa 1971); m is the Avrami exponent when nucleation and growth rates depend on temperature alone",
		},
	}
	for i, e := range a.Exponents {
		l := a.Fits[i].Line
		stats := fmt.Sprintf("%d points, R2 = %.5f", l.N, l.R2)
		if l.Exact() {
			stats = "2 points, exact"
		}
		doc.Summary = append(doc.Summary, fmt.Sprintf("at %s K: m = %.4g%s (%s)", Sig(6)(float64(e.T)), float64(e.M), spreadText(float64(e.MSE), e.MCI, g(4), ""), stats))
	}
	for _, n := range a.NotFitted {
		doc.Summary = append(doc.Summary, fmt.Sprintf("at %s K: not fitted: %s", Sig(6)(float64(n.T)), n.Reason))
	}
	doc.Table = tableOf(a.Rows)
	doc.Tables = []Table{*tableOf(a.Exponents)}
	doc.Tables[0].Title = "exponent at each temperature"
	exact := true
	for _, f := range a.Fits {
		exact = exact && f.Line.Exact()
	}
	t, dof := math.NaN(), 0
	if len(a.Fits) == 1 {
		t, dof = a.Fits[0].Line.T, a.Fits[0].Line.DoF
	}
	how := "intervals: estimate ± t·SE with Student t at N - 2 degrees of freedom of each temperature's points"
	if len(a.Fits) == 1 || exact {
		how = intervalNote(exact, "line", t, dof, "")
	}
	doc.Notes = append(doc.Notes, how,
		"m below the isothermal Avrami exponent, or changing with temperature, says the rates depend on more than temperature (nuclei formed earlier in the scan, secondary crystallization); rows at X = 0 or 1 are left out")
	return fitDoc(doc, d, a.names, FitCaution)
}
