package main

import (
	"errors"
	"fmt"
	"math"

	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

func (f *fitFlags) iface(e *env, path string) error {
	if f.materialGiven() == "" {
		return usagef("fit interface: give the material with --material NAME|FILE.toml (and flags); every value but gamma is taken from it")
	}
	card, model, err := f.mf.model()
	if err != nil {
		return err
	}
	if !model.HasRate() {
		return usagef("fit interface: the material has no rate; give a mobility law (--mobility with its values) or --prefactor fixed with --j0")
	}
	cols := []presets.Column{
		{Quantity: "temperature", Kind: units.Temperature, Required: true},
		{Quantity: "rate", Kind: units.RateDensity, Required: true},
	}
	d, w, notes, err := f.readFitData(e, path, cols)
	if err != nil {
		return err
	}
	T, J := d.Columns["temperature"], d.Columns["rate"]
	lnJ := make([]float64, len(J))
	for i, j := range J {
		if !(j > 0) {
			return usagef("%s:%d: column %q: %s must be positive to take its logarithm", d.File, d.Lines[i], d.Headers["rate"], sig(6)(j))
		}
		lnJ[i] = math.Log(j)
	}
	if err := aboveZero(d, T); err != nil {
		return err
	}
	res, err := fit.Interface(model, T, lnJ, w)
	if err != nil {
		var pe *kinetics.PointError
		if errors.As(err, &pe) || errors.Is(err, fit.ErrFewPoints) || len(T) < 2 || sameAll(T) {
			return fitError(d, err)
		}
		return fmt.Errorf("%s: %v", d.File, err)
	}
	about, inputs := describeCard(card, model)
	about = append(about, dataLine(d, res.N, w, "temperature", "rate"))
	about = append(about, "fit: ln J_measured = ln A + ln J_model(T; gamma), least squares over gamma and A; every other value from the material (its gamma is only replaced)")
	inputs = append(inputs, kv{"data_file", d.File}, kv{"points", res.N}, kv{"weighted", w != nil})
	r := &result{
		title:  "undercool fit interface: interfacial energy from measured nucleation rates",
		about:  about,
		inputs: inputs,
	}
	r.summary = []string{
		gammaText(res.Gamma, res.GammaSE, res.GammaCI, 5),
		fmt.Sprintf("prefactor scale A = %s (the model's rate times A)%s", sig(4)(res.Scale), spreadText(math.NaN(), res.ScaleCI, g(4), "")),
		statsLine(res.N, res.DoF, res.R2, res.ResidualSD, "ln J") + residualDecades(res),
	}
	if res.Linear != nil {
		lg := "no gamma (the slope is not negative)"
		if !math.IsNaN(res.LinearGamma) {
			lg = fmt.Sprintf("gamma = %.4g J/m2", res.LinearGamma)
		}
		lhs := "ln J - ln D"
		if model.Material().Mobility == nil {
			lhs = "ln J"
		}
		r.summary = append(r.summary, fmt.Sprintf("classical plot (%s against 1/(T dg_v^2)): slope %.5g K J2/m6, %s; it leaves out the temperature dependence of the prefactor, for comparison only", lhs, res.Linear.Slope, lg))
	}
	var linSlope any = math.NaN()
	if res.Linear != nil {
		linSlope = res.Linear.Slope
	}
	fitted := res.Fitted()
	r.extra = gammaJSON(res.Gamma, res.GammaSE, res.GammaCI)
	r.extra = append(r.extra, object{
		{"prefactor_scale", res.Scale},
		{"prefactor_scale_ci95", ciJSON(res.ScaleCI)},
		{"ln_prefactor_scale", res.LnScale},
		{"ln_prefactor_scale_se", res.LnScaleSE},
	}...)
	r.extra = append(r.extra, scatterJSON("residual_sd_ln", res.R2, res.ResidualSD, res.DoF, res.T)...)
	r.extra = append(r.extra, object{
		{"classical_slope_k_j2_per_m6", linSlope},
		{"classical_gamma_j_per_m2", res.LinearGamma},
		{"fitted_sites_per_m3", sitesOrNaN(fitted)},
		{"fitted_j0_per_m3_s", j0OrNaN(fitted)},
		{"flags", res.Flags.Keys()},
	}...)
	r.cols = []column{
		{"line", "line", nil},
		{"T (K)", "temperature_k", fixed(2)},
		{"T (°C)", "temperature_c", fixed(2)},
		{"log10 J (m^-3 s^-1)", "log10_rate_per_m3_s", fixed(3)},
		{"fitted", "fitted_log10_rate_per_m3_s", fixed(3)},
		{"residual (decades)", "residual_log10", fixed(3)},
		{"n*", "critical_size", sig(4)},
		{"1/(T dg_v^2) (K^-1 m6/J2)", "classical_x_m6_per_k_j2", sig(5)},
		{"classical y", "classical_y", fixed(4)},
		{"flags", "flags", nil},
	}
	for i, t := range T {
		s := res.Model.At(t)
		r.rows = append(r.rows, []any{
			fmt.Sprint(d.Lines[i]), t, t - units.CelsiusOffset, lnJ[i] / math.Ln10,
			(lnJ[i] - res.Residuals[i]) / math.Ln10, res.Residuals[i] / math.Ln10,
			s.Nucleus.Size, res.LinearX[i], res.LinearY[i], s.Flags.Keys(),
		})
	}
	r.notes = append(r.notes, intervalNote(res.Exact(), "fit", res.T, res.DoF, ", SE from the Jacobian at the minimum (linear approximation); A's interval is exp of that of ln A"))
	r.notes = append(r.notes, flagNotes(res.Flags)...)
	return f.finish(e, r, notes,
		func() error { return interfacePlot(f.pf, dataName(d), T, lnJ, res) },
		func() (*presets.Card, []string, error) { return interfaceCard(card, d, res) })
}

func residualDecades(res *fit.InterfaceFit) string {
	if res.Exact() {
		return ""
	}
	return fmt.Sprintf(" (%.3g decades)", res.ResidualSD/math.Ln10)
}

func sameAll(T []float64) bool {
	for _, t := range T {
		if t != T[0] {
			return false
		}
	}
	return true
}

func sitesOrNaN(m kinetics.Material) float64 {
	if m.Prefactor == kinetics.PrefactorFixed {
		return math.NaN()
	}
	return m.Sites
}

func j0OrNaN(m kinetics.Material) float64 {
	if m.Prefactor != kinetics.PrefactorFixed {
		return math.NaN()
	}
	return m.J0
}

// interfaceCard is the material card with the fitted gamma, and the
// prefactor scale folded into the site density (or into j0 for a fixed
// prefactor).
func interfaceCard(base *presets.Card, d *presets.Data, res *fit.InterfaceFit) (*presets.Card, []string, error) {
	c := copyCard(base)
	c.Name = base.Name + "-fit"
	c.Description = fmt.Sprintf("%s (gamma and the prefactor scale fitted to %s)", base.Description, dataName(d))
	src := fmt.Sprintf("undercool fit interface of %s, %d points, with the other values of %s", dataName(d), res.N, base.File)
	gs := src
	if !res.Exact() {
		gs += fmt.Sprintf(", 95 %% interval %.5g to %.5g J/m2", res.GammaCI[0], res.GammaCI[1])
	}
	m := res.Fitted()
	what := "the base site density"
	if m.Prefactor == kinetics.PrefactorFixed {
		what = "the base j0"
	}
	scale := fmt.Sprintf("%s times the prefactor scale A = %.5g fitted by undercool fit interface to %s", what, res.Scale, dataName(d))
	folded := [3]string{"sites", fmt.Sprintf("%.7g m-3", m.Sites), scale}
	if m.Prefactor == kinetics.PrefactorFixed {
		folded = [3]string{"j0", fmt.Sprintf("%.7g /m3/s", m.J0), scale}
	}
	if err := setValues(c, [3]string{"gamma", fmt.Sprintf("%.7g J/m2", res.Gamma), gs}, folded); err != nil {
		return nil, nil, err
	}
	header := []string{
		fmt.Sprintf("%s with gamma fitted by undercool fit interface to %s.", base.Name, dataName(d)),
		"The prefactor scale A is folded into the site density (or j0); every other value is the base card's.",
	}
	return c, header, nil
}
