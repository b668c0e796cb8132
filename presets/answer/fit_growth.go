package answer

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/floats"

	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// GrowthColumns are the columns of a growth fit's data.
func GrowthColumns() []presets.Column {
	return []presets.Column{
		{Quantity: "temperature", Kind: units.Temperature, Required: true},
		{Quantity: "growth_rate", Kind: units.Velocity, Required: true},
		WeightColumn,
	}
}

// GrowthInputs are the inputs of a growth fit: the material and the file.
type GrowthInputs struct {
	Material
	File     string `json:"data_file"`
	Points   int    `json:"points"`
	Weighted bool   `json:"weighted"`
}

// FitGrowth is the kinetic coefficient of growth fitted to measured growth
// rates: log10 u_g and ξ of the viscosity-power law, or u_0 and Q_u of
// the Arrhenius law.
type FitGrowth struct {
	Inputs    GrowthInputs `json:"inputs"`
	Law       string       `json:"growth"`
	Ug        Num          `json:"growth_ug_m_per_s,omitempty"`
	UgCI      Interval     `json:"growth_ug_ci95_m_per_s"`
	Log10Ug   Num          `json:"log10_growth_ug"`
	Log10UgSE Num          `json:"log10_growth_ug_se"`
	Xi        Num          `json:"growth_xi"`
	XiSE      Num          `json:"growth_xi_se"`
	XiCI      Interval     `json:"growth_xi_ci95"`
	XiHeld    bool         `json:"growth_xi_held"`
	U0        Num          `json:"growth_u0_m_per_s"`
	U0CI      Interval     `json:"growth_u0_ci95_m_per_s"`
	Q         Num          `json:"growth_q_j_per_mol"`
	QSE       Num          `json:"growth_q_se_j_per_mol"`
	QCI       Interval     `json:"growth_q_ci95_j_per_mol"`
	DoF       int          `json:"degrees_of_freedom"`
	SD        Num          `json:"residual_sd_log10"`
	T95       Num          `json:"student_t"`
	Flags     []string     `json:"flags"`
	Rows      []GrowthRow  `json:"rows"`

	Fit  *fit.GrowthFit `json:"-"`
	T, U []float64      `json:"-"` // the points fitted: K and m/s
	card *presets.Card
	Data FitData `json:"-"`
	nm   Names
}

// GrowthRow is one measured growth rate with the fitted one.
type GrowthRow struct {
	Line     string  `json:"line" col:"line"`
	T        Num     `json:"temperature_k" col:"T (K),f2"`
	TC       Num     `json:"temperature_c" col:"T (°C),f2"`
	Log10U   Num     `json:"log10_growth_rate_m_per_s" col:"log10 u (m/s),f3"`
	Fitted   Num     `json:"fitted_log10_growth_rate_m_per_s" col:"fitted,f3"`
	Residual Num     `json:"residual_log10" col:"residual (decades),f3"`
	X        Num     `json:"x" col:"x,g5"`
	Y        Num     `json:"y" col:"y,f4"`
	Flags    Strings `json:"flags" col:"flags"`
}

// Growth fits the growth law law ("viscosity-power" or "arrhenius") to a
// file read with GrowthColumns, the driving force and the viscosity from
// the card's model; with keepXi the exponent ξ is the model's (growth_xi,
// default 1) and u_g alone is fitted. Errors: the file's points (*BadData);
// a model without a viscosity law for viscosity-power.
func Growth(c *presets.Card, md *kinetics.Model, data FitData, law string, keepXi bool, names Names) (*FitGrowth, error) {
	d := data.Data
	T, u := d.Columns["temperature"], d.Columns["growth_rate"]
	if err := data.aboveZero(); err != nil {
		return nil, err
	}
	if err := data.positive("growth_rate"); err != nil {
		return nil, err
	}
	var res *fit.GrowthFit
	var err error
	if law == "arrhenius" {
		res, err = fit.GrowthArrhenius(md, T, u, data.W)
	} else {
		res, err = fit.GrowthViscosityPower(md, T, u, data.W, keepXi)
	}
	if err != nil {
		var pe *kinetics.PointError
		switch {
		case errors.Is(err, fit.ErrNoViscosity):
			return nil, &InputError{"growth", fmt.Errorf("%w; or fit the arrhenius law", err)}
		case errors.As(err, &pe), errors.Is(err, fit.ErrFewPoints), errors.Is(err, fit.ErrSameX):
			return nil, badData(d, err)
		}
		return nil, fmt.Errorf("%s: %w", d.File, err)
	}
	nan := Num(math.NaN())
	a := &FitGrowth{
		Inputs: GrowthInputs{Describe(c, md), d.File, res.N, data.W != nil}, Law: res.Law,
		Ug: nan, Log10Ug: nan, Log10UgSE: nan, Xi: nan, XiSE: nan, U0: nan, Q: nan, QSE: nan,
		UgCI: Interval{math.NaN(), math.NaN()}, XiCI: Interval{math.NaN(), math.NaN()}, U0CI: Interval{math.NaN(), math.NaN()}, QCI: Interval{math.NaN(), math.NaN()},
		DoF: res.DoF, SD: Num(res.ResidualSD), T95: Num(res.T), Flags: res.Flags.Keys(),
		Fit: res, T: T, U: u, card: c, Data: data, nm: names,
	}
	if res.Law == "arrhenius" {
		ar := res.Arrhenius
		a.U0, a.U0CI, a.Q, a.QSE, a.QCI = Num(ar.A), ar.ACI, Num(ar.Q), Num(ar.QSE), ar.QCI
	} else {
		a.Ug, a.UgCI, a.Log10Ug, a.Log10UgSE = Num(res.Ug), res.UgCI, Num(res.Log10Ug), Num(res.Log10UgSE)
		a.Xi, a.XiSE, a.XiCI, a.XiHeld = Num(res.Xi), Num(res.XiSE), res.XiCI, res.KeepXi
	}
	a.Rows = []GrowthRow{}
	for i, t := range T[:listed(data, len(T))] {
		a.Rows = append(a.Rows, GrowthRow{
			fmt.Sprint(d.Lines[i]), Num(t), Num(units.Celsius(t)), Num(math.Log10(u[i])),
			Num(math.Log10(u[i]) - res.Residuals[i]), Num(res.Residuals[i]), Num(res.X[i]), Num(res.Y[i]),
			res.Model.At(t).Flags.Keys(),
		})
	}
	return a, nil
}

// Doc is how the fit reads.
func (a *FitGrowth) Doc() Doc {
	res := a.Fit
	d := Doc{Title: "undercool fit growth: the kinetic coefficient of growth from measured growth rates"}
	var how string
	if res.Law == "arrhenius" {
		how = "fit: u = u_0 exp(-Q_u/RT) [1 - exp(-dmu/kT)]: a straight line of ln(u/[1 - exp(-dmu/kT)]) against 1/T; the driving force from the material"
	} else {
		how = "fit: u = u_g (T/Tg) (eta(Tg)/eta(T))^xi [1 - exp(-dmu/kT)]: a straight line of y = log10 u - log10[(T/Tg)(1 - exp(-dmu/kT))] against x = log10 eta(Tg) - log10 eta(T); the driving force and the viscosity (with its branch below Tg) from the material"
		if res.KeepXi {
			how = "fit: u = u_g (T/Tg) (eta(Tg)/eta(T))^xi [1 - exp(-dmu/kT)] with xi held at the material's: log10 u_g is the mean of y - xi x; the driving force and the viscosity from the material"
		}
	}
	d.About = append(a.Inputs.About(), a.Data.line(res.N, "temperature", "growth_rate"), how)
	if res.Law == "arrhenius" {
		ar := res.Arrhenius
		d.Summary = []string{
			fmt.Sprintf("u_0 = %s m/s%s", Sig(4)(ar.A), spreadText(math.NaN(), ar.ACI, g(4), " m/s")),
			fmt.Sprintf("Q_u = %.4g kJ/mol%s", ar.Q/1e3, spreadText(ar.QSE/1e3, [2]float64{ar.QCI[0] / 1e3, ar.QCI[1] / 1e3}, g(4), " kJ/mol")),
		}
	} else {
		spread := " (exact, no interval)"
		if !res.Exact() {
			spread = spreadText(res.Log10UgSE, ci95Log(res), g(4), "")
		}
		d.Summary = []string{fmt.Sprintf("u_g = %s m/s (log10 u_g = %.4f%s)", Sig(4)(res.Ug), res.Log10Ug, spread)}
		if res.KeepXi {
			d.Summary = append(d.Summary, fmt.Sprintf("xi = %.4g, held at the material's", res.Xi))
		} else {
			d.Summary = append(d.Summary, fmt.Sprintf("xi = %.4g%s", res.Xi, spreadText(res.XiSE, res.XiCI, g(4), "")))
		}
	}
	stats := fmt.Sprintf("points: %d, %d degrees of freedom", res.N, res.DoF)
	if !res.Exact() {
		stats += fmt.Sprintf("; residual SD = %.3g decades", res.ResidualSD)
	} else {
		stats += " (exact, no scatter to estimate)"
	}
	d.Summary = append(d.Summary, stats)
	d.Table = tableOf(a.Rows)
	dof := res.DoF
	d.Notes = append(d.Notes, intervalNote(res.Exact(), "fit", res.T, dof, "; the interval of u_g (and u_0) is 10^ (e^) of that of its logarithm"),
		"x and y are the coordinates of the straight line fitted (viscosity power: x = log10 eta(Tg) - log10 eta(T), y as above; arrhenius: x = 1/T in 1/K, y = ln of the kinetic coefficient)",
		"growth and viscosity decouple in fragile glass formers: Ediger M.D., Harrowell P., Yu L., J. Chem. Phys. 128 (2008) 034709")
	d.Notes = append(d.Notes, FlagNotes(res.Flags)...)
	return fitDoc(d, a.Data, a.nm, FitCaution)
}

// ci95Log is the 95 % interval of log10 u_g.
func ci95Log(res *fit.GrowthFit) [2]float64 {
	return [2]float64{math.Log10(res.UgCI[0]), math.Log10(res.UgCI[1])}
}

// Card is the material card with the fitted growth law; its standing:
// calibrated on the rows of the data, checked against none.
func (a *FitGrowth) Card() (*presets.Card, []string, error) {
	base, res, name := a.card, a.Fit, a.Data.Name()
	c := base.Clone()
	c.Name = base.Name + "-fit"
	c.Growth = res.Law
	c.Description = fmt.Sprintf("%s (growth %s fitted to %s)", base.Description, res.Law, name)
	src := fmt.Sprintf("undercool fit growth of %s, %s, with the driving force and viscosity of %s", name, pointsText(res.N), base.File)
	with := func(ci [2]float64, f func(float64) string, unit string) string {
		if math.IsNaN(ci[0]) {
			return src
		}
		return fmt.Sprintf("%s, 95 %% interval %s to %s%s", src, f(ci[0]), f(ci[1]), unit)
	}
	g6 := func(x float64) string { return fmt.Sprintf("%.5g", x) }
	var values [][3]string
	if res.Law == "arrhenius" {
		ar := res.Arrhenius
		values = [][3]string{
			{"growth_u0", fmt.Sprintf("%.7g m/s", ar.A), with(ar.ACI, g6, " m/s")},
			{"growth_q", fmt.Sprintf("%.7g kJ/mol", ar.Q/1e3), with([2]float64{ar.QCI[0] / 1e3, ar.QCI[1] / 1e3}, g6, " kJ/mol")},
		}
	} else {
		xs := with(res.XiCI, g6, "")
		if res.KeepXi {
			xs = "held in " + src
			if v, ok := base.Values["growth_xi"]; ok {
				xs = v.Source
			}
		}
		values = [][3]string{
			{"growth_ug", fmt.Sprintf("%.7g m/s", res.Ug), with(res.UgCI, g6, " m/s")},
			{"growth_xi", fmt.Sprintf("%.7g", res.Xi), xs},
		}
	}
	span := "span of the temperatures of " + name + ", fitted by undercool fit growth"
	if !c.Has("calibrated_t_min") {
		values = append(values, [3]string{"calibrated_t_min", fmt.Sprintf("%.6g K", floats.Min(a.T)), span}, [3]string{"calibrated_t_max", fmt.Sprintf("%.6g K", floats.Max(a.T)), span})
	}
	if err := setValues(c, values...); err != nil {
		return nil, nil, err
	}
	c.Standing = fittedStanding(base.Standing, a.Data, "fit growth")
	header := []string{
		fmt.Sprintf("%s with its growth law (%s) fitted by undercool fit growth to %s.", base.Name, res.Law, name),
		"Every other value is the base card's. Calibrated on the data, checked against none: an estimate until held-out data agree.",
	}
	return c, header, nil
}

// pointsText is "1 point" or "N points".
func pointsText(n int) string {
	if n == 1 {
		return "1 point"
	}
	return fmt.Sprintf("%d points", n)
}
