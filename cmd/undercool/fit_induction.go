package main

import (
	"errors"
	"fmt"
	"math"

	"github.com/spf13/pflag"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// fitInductionFlags are the flags only fit induction reads.
type fitInductionFlags struct {
	volume string
	fs     *pflag.FlagSet
}

func addFitInductionFlags(fs *pflag.FlagSet) *fitInductionFlags {
	fi := &fitInductionFlags{fs: fs}
	fs.StringVar(&fi.volume, "volume", "", "fit induction: the volume of each sample, for the prefactor A from A·V, m3, L, mL, uL or mm3 (> 0)")
	return fi
}

// inductionColumns are the columns of an induction-time file.
var inductionColumns = []presets.Column{
	{Quantity: "temperature", Kind: units.Temperature, Required: true},
	{Quantity: "supersaturation", Kind: units.Dimensionless, Required: true},
	{Quantity: "induction_time", Kind: units.Time, Required: true},
}

// induction fits γ and A to induction times: ln t_ind against 1/(T³·ln²S).
func (f *fitFlags) induction(e *env, path string, fi *fitInductionFlags) error {
	card, err := f.mf.card()
	if err != nil {
		return err
	}
	vm, ok := card.MolarVolume()
	if !ok {
		return usagef("fit induction: give the molar volume of the crystal: --vm, or --molar-mass and --density (or a --material card with them)")
	}
	theta := 180.0
	if card.Has("theta") {
		theta = card.SI("theta")
	}
	shape := cnt.ShapeFactor(theta)
	V := 0.0
	if fi.fs.Changed("volume") {
		if V, err = parsePositive("volume", fi.volume, units.Volume, ""); err != nil {
			return err
		}
	}
	d, w, notes, err := f.readFitData(e, path, inductionColumns)
	if err != nil {
		return err
	}
	T, S, ti := d.Columns["temperature"], d.Columns["supersaturation"], d.Columns["induction_time"]
	v := vm / cnt.Avogadro
	res, err := fit.Induction(T, S, ti, w, v, shape, V)
	if err != nil {
		var pe *kinetics.PointError
		if errors.As(err, &pe) || errors.Is(err, fit.ErrFewPoints) || errors.Is(err, fit.ErrSameX) {
			return fitError(d, err)
		}
		return usagef("%s: %v", d.File, err)
	}
	line := res.Line
	about := []string{
		fmt.Sprintf("material: %s (%s); v = %.4g m3 per molecule (V_m = %.4g m3/mol), f(theta) = %.4g", card.Name, card.File, v, vm, shape),
		dataLine(d, line.N, w, "temperature", "supersaturation", "induction_time"),
		"fit: ln t_ind = -ln(A V) + B'/(T^3 ln^2 S), B' = 16 pi f gamma^3 v^2/(3 k_B^3); induction taken as mononuclear, t_ind = 1/(J V), J = A exp(-16 pi f gamma^3 v^2/(3 (k_B T)^3 ln^2 S))",
	}
	if V > 0 {
		about = append(about, fmt.Sprintf("volume of each sample: %s (%.4g m3)", fi.volume, V))
	}
	inputs := object{
		{"material", card.Name}, {"card", card.File}, {"molar_volume_m3_per_mol", vm}, {"molecular_volume_m3", v},
		{"shape_factor", shape}, {"volume_m3", nanIfZero(V)},
		{"data_file", d.File}, {"points", line.N}, {"weighted", w != nil},
	}
	r := &result{
		title:  "undercool fit induction: interfacial energy and prefactor from induction times",
		about:  about,
		inputs: inputs,
	}
	r.summary = []string{
		gammaText(res.Gamma, res.GammaSE, res.GammaCI, 4),
	}
	if V > 0 {
		r.summary = append(r.summary, fmt.Sprintf("A = %s m^-3 s^-1%s", sig(4)(res.A), spreadText(math.NaN(), res.ACI, g(4), " m^-3 s^-1"))+lnText("A", res.LnA, res.LnASE, [2]float64{-line.InterceptCI()[1] - math.Log(V), -line.InterceptCI()[0] - math.Log(V)}))
	} else {
		r.summary = append(r.summary, fmt.Sprintf("A·V = %s s^-1 (give --volume for A itself)", sig(4)(math.Exp(res.LnAV))))
	}
	r.summary = append(r.summary,
		fmt.Sprintf("slope B' = %.5g K^3, intercept %.5g (ln s)", res.Slope, line.Intercept),
		statsLine(line.N, line.DoF, line.R2, line.ResidualSD, "ln t"),
		fmt.Sprintf("critical nucleus over the data with the fitted gamma: %.3g to %.3g molecules", res.MinSize, res.MaxSize))
	r.extra = gammaJSON(res.Gamma, res.GammaSE, res.GammaCI)
	r.extra = append(r.extra, object{
		{"pre_exponential", res.A},
		{"pre_exponential_ci95", ciJSON(res.ACI)},
		{"ln_pre_exponential", res.LnA},
		{"ln_pre_exponential_se", res.LnASE},
		{"ln_rate_times_volume_per_s", res.LnAV},
		{"slope_k3", res.Slope},
		{"intercept_ln_s", line.Intercept},
	}...)
	r.extra = append(r.extra, scatterJSON("residual_sd_ln", line.R2, line.ResidualSD, line.DoF, line.T)...)
	r.extra = append(r.extra, object{
		{"critical_size_min", res.MinSize},
		{"critical_size_max", res.MaxSize},
		{"flags", nonNil(res.Flags.Keys())},
	}...)
	r.cols = []column{
		{"line", "line", nil},
		{"T (K)", "temperature_k", fixed(2)},
		{"S", "supersaturation", sig(5)},
		{"t_ind (s)", "induction_time_s", sig(5)},
		{"1/(T^3 ln^2 S) (K^-3)", "x_per_k3", sig(5)},
		{"ln t", "ln_time", fixed(4)},
		{"fitted", "fitted_ln_time", fixed(4)},
		{"residual", "residual_ln", fixed(4)},
		{"n*", "critical_size", sig(4)},
	}
	for i := range T {
		n := cnt.Critical(cnt.Boltzmann*T[i]*math.Log(S[i]), res.Gamma, v, shape, T[i])
		r.rows = append(r.rows, []any{
			fmt.Sprint(d.Lines[i]), T[i], S[i], ti[i], res.X[i], math.Log(ti[i]),
			line.At(res.X[i]), line.Residuals[i], n.Size,
		})
	}
	r.notes = append(r.notes, intervalNote(line.Exact(), "line", line.T, line.DoF, "; gamma's interval is the slope's through the cube root, A's is exp of that of ln A"))
	r.notes = append(r.notes, flagNotes(res.Flags)...)
	if res.Flags&kinetics.FlagSmallNucleus != 0 {
		r.notes = append(r.notes, "the fitted gamma gives a critical nucleus below 10 molecules: CNT is outside its range, and gamma and A are apparent values that correlate these data (common for crystallization from solution)")
	}
	r.notes = append(r.notes, "induction taken as mononuclear (the wait for the first nucleus); where growth to a detectable amount dominates, the slope still gives gamma but A is not the nucleation prefactor")
	if f.cardOut != "" && !(V > 0) {
		return usagef("--card-out: the card needs the prefactor A, so give --volume")
	}
	return f.finish(e, r, notes,
		func() error { return inductionPlot(f.pf, dataName(d), ti, res) },
		func() (*presets.Card, []string, error) { return inductionCard(card, d, res) })
}

func nanIfZero(x float64) float64 {
	if x == 0 {
		return math.NaN()
	}
	return x
}

// inductionCard is the material card with the fitted γ and A as a fixed
// prefactor.
func inductionCard(base *presets.Card, d *presets.Data, res *fit.InductionFit) (*presets.Card, []string, error) {
	c := copyCard(base)
	if c.File == "command line" {
		c.Name, c.Kind, c.Driving = "fitted-solution", "solution", "solution"
	}
	c.Name += "-fit"
	c.Description = fmt.Sprintf("%s (gamma and the apparent prefactor A fitted to the induction times of %s)", base.Description, dataName(d))
	c.Prefactor = "fixed"
	src := fmt.Sprintf("undercool fit induction of %s, %d points", dataName(d), res.Line.N)
	gs, as := src, src
	if !res.Line.Exact() {
		gs += fmt.Sprintf(", 95 %% interval %.5g to %.5g J/m2", res.GammaCI[0], res.GammaCI[1])
		as += fmt.Sprintf(", 95 %% interval %.4g to %.4g m^-3 s^-1", res.ACI[0], res.ACI[1])
	}
	if err := setValues(c,
		[3]string{"gamma", fmt.Sprintf("%.7g J/m2", res.Gamma), gs},
		[3]string{"j0", fmt.Sprintf("%.7g /m3/s", res.A), as + "; apparent, belongs with the fitted gamma"}); err != nil {
		return nil, nil, err
	}
	header := []string{
		"Written by undercool fit induction: gamma and the apparent prefactor A (as j0, prefactor fixed)",
		"fitted to " + dataName(d) + "; every other value as in " + base.File + ".",
		"Apparent values: they correlate these induction times; the critical nucleus they imply may hold only a few molecules.",
	}
	return c, header, nil
}

// inductionPlot is the induction time on a log axis against 1/(T³·ln²S),
// with the fitted straight line.
func inductionPlot(pf *plotFlag, file string, t []float64, res *fit.InductionFit) error {
	pts := make(plotter.XYs, len(t))
	for i := range t {
		pts[i] = plotter.XY{X: res.X[i] * 1e8, Y: t[i]}
	}
	lo, hi := span(res.X)
	line := fitPlot(lo, hi, 50, func(x float64) (float64, bool) { return math.Exp(res.Line.At(x)), true })
	for i := range line {
		line[i].X *= 1e8
	}
	p := plot.New()
	p.Title.Text = "induction times, " + file
	p.X.Label.Text = "1/(T^3 ln^2 S) (1e-8 K^-3)"
	p.Y.Label.Text = "induction time (s), log scale"
	p.Y.Scale = plot.LogScale{}
	p.Y.Tick.Marker = decadeTicks{}
	p.X.Min, p.X.Max = lo*1e8, hi*1e8
	if err := dataAndLine(p, pts, line, "data", fmt.Sprintf("fit, gamma = %.4g mJ/m2", res.Gamma*1e3)); err != nil {
		return err
	}
	return savePlots(pf.path, pf.format, p)
}
