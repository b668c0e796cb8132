package main

import (
	"fmt"
	"math"
	"strings"

	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

func (f *fitFlags) avrami(e *env, path string) error {
	if n := f.materialGiven(); n != "" {
		return usagef("--%s: fit avrami uses no material; give only the data file", n)
	}
	if f.cardOut != "" {
		return usagef("--card-out: a material card has no place for the Avrami n and k; use the JSON output (--format json)")
	}
	cols := []presets.Column{
		{Quantity: "time", Kind: units.Time, Required: true},
		{Quantity: "fraction", Kind: units.Dimensionless, Required: true},
	}
	d, w, notes, err := f.readFitData(e, path, cols)
	if err != nil {
		return err
	}
	t, X := d.Columns["time"], d.Columns["fraction"]
	for i, x := range X {
		if x < 0 || x > 1 {
			return usagef("%s:%d: column \"fraction\": %s lies outside [0, 1] (a transformed fraction; points at 0 and 1 are left out of the fit)", d.File, d.Lines[i], sig(6)(x))
		}
	}
	res, err := fit.Avrami(t, X, w)
	if err != nil {
		return fitError(d, err)
	}
	l := res.Line
	unit, factor := timeUnit(d.Headers["time"])
	inUnit := func(s float64) string {
		if factor == 1 {
			return sig(4)(s) + " s"
		}
		return fmt.Sprintf("%s s (%s %s)", sig(4)(s), sig(4)(s/factor), unit)
	}
	half, t95 := res.HalfTime(), res.TimeTo(0.95)
	halfCI, t95CI := res.TimeToCI(0.5), res.TimeToCI(0.95)
	var leftLines []int
	for _, i := range res.Skipped {
		leftLines = append(leftLines, d.Lines[i])
	}
	r := &result{
		title: "undercool fit avrami: ln(-ln(1-X)) against ln t by least squares",
		about: []string{
			fmt.Sprintf("data: %s, %d rows, %d used; columns %s, %s%s", d.File, len(t), l.N, d.Headers["time"], d.Headers["fraction"], weighted(w)),
			"law: X = 1 - exp(-k t^n), t in s, k in s^-n",
		},
		inputs: object{{"data_file", d.File}, {"rows", len(t)}, {"points_used", l.N}, {"time_column", d.Headers["time"]}, {"weighted", w != nil}},
	}
	r.summary = []string{
		fmt.Sprintf("n = %.4g%s", res.N, spreadText(res.NSE, res.NCI, g(4), "")),
		fmt.Sprintf("k = %s s^-%.4g%s%s", sig(4)(res.K), res.N, spreadText(math.NaN(), res.KCI, g(4), ""), lnText("k", res.LnK, res.LnKSE, res.Line.InterceptCI())),
	}
	if factor != 1 {
		r.summary = append(r.summary, fmt.Sprintf("k = %s %s^-%.4g with t in %s", sig(4)(res.K*math.Pow(factor, res.N)), unit, res.N, unit))
	}
	r.summary = append(r.summary,
		fmt.Sprintf("half time = %s%s", inUnit(half), spreadText(math.NaN(), halfCI, g(4), " s")),
		fmt.Sprintf("t(X = 0.95) = %s%s", inUnit(t95), spreadText(math.NaN(), t95CI, g(4), " s")),
		statsLine(l.N, l.DoF, l.R2, l.ResidualSD, "ln(-ln(1-X))"),
	)
	if len(leftLines) > 0 {
		var s []string
		for _, n := range leftLines {
			s = append(s, fmt.Sprint(n))
		}
		r.summary = append(r.summary, fmt.Sprintf("left out: %d rows with X = 0 or 1 (lines %s)", len(leftLines), strings.Join(s, ", ")))
	}
	r.extra = object{
		{"avrami_exponent", res.N},
		{"avrami_exponent_se", res.NSE},
		{"avrami_exponent_ci95", ciJSON(res.NCI)},
		{"rate_constant", res.K},
		{"rate_constant_unit", "s^-n"},
		{"rate_constant_ci95", ciJSON(res.KCI)},
		{"ln_rate_constant", res.LnK},
		{"ln_rate_constant_se", res.LnKSE},
		{"half_time_s", half},
		{"half_time_ci95_s", ciJSON(halfCI)},
		{"time_to_95_percent_s", t95},
		{"time_to_95_percent_ci95_s", ciJSON(t95CI)},
	}
	r.extra = append(r.extra, scatterJSON("residual_sd", l.R2, l.ResidualSD, l.DoF, l.T)...)
	r.extra = append(r.extra, kv{"left_out_lines", append([]int{}, leftLines...)})
	r.cols = []column{
		{"line", "line", nil},
		{"t (s)", "time_s", sig(5)},
		{"X", "fraction", fixed(4)},
		{"ln t", "ln_time", fixed(4)},
		{"ln(-ln(1-X))", "ln_minus_ln_one_minus_x", fixed(4)},
		{"fitted X", "fitted_fraction", fixed(4)},
		{"residual", "residual", fixed(4)},
		{"used", "used", nil},
	}
	used := map[int]int{}
	for j, i := range res.Used {
		used[i] = j
	}
	for i := range t {
		fitted := -math.Expm1(-res.K * math.Pow(t[i], res.N))
		lnT, lnLn, res, u := math.NaN(), math.NaN(), math.NaN(), "left out"
		if t[i] > 0 {
			lnT = math.Log(t[i])
		}
		if j, ok := used[i]; ok {
			lnLn, res, u = math.Log(-math.Log1p(-X[i])), l.Residuals[j], "yes"
		}
		r.rows = append(r.rows, []any{fmt.Sprint(d.Lines[i]), t[i], X[i], lnT, lnLn, fitted, res, u})
	}
	r.notes = append(r.notes, intervalNote(l.Exact(), "line", l.T, l.DoF, "; those of k and the times are first-order (delta method) on their logarithms"))
	return f.finish(e, r, notes, func() error { return avramiPlot(f.pf, dataName(d), t, X, res) }, nil)
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
