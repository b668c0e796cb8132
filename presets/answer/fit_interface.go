package answer

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"gonum.org/v1/gonum/floats"

	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// InterfaceColumns are the columns of an interface fit's data.
func InterfaceColumns() []presets.Column {
	return []presets.Column{
		{Quantity: "temperature", Kind: units.Temperature, Required: true},
		{Quantity: "rate", Kind: units.RateDensity, Required: true},
		WeightColumn,
	}
}

// InterfaceInputs are the inputs of an interface fit: the material and the file.
type InterfaceInputs struct {
	Material
	File     string `json:"data_file"`
	Points   int    `json:"points"`
	Weighted bool   `json:"weighted"`
}

// FitInterface is the interfacial energy (with the slope of a linear
// law) and a prefactor scale fitted to measured nucleation rates with the
// rest of the material held.
type FitInterface struct {
	Inputs InterfaceInputs `json:"inputs"`
	Gamma
	Law       string   `json:"gamma_law"`
	TRef      Num      `json:"gamma_t_ref_k"` // null for a constant gamma
	Slope     Num      `json:"gamma_slope_j_per_m2_k"`
	SlopeSE   Num      `json:"gamma_slope_se_j_per_m2_k"`
	SlopeCI   Interval `json:"gamma_slope_ci95_j_per_m2_k"`
	Held      bool     `json:"prefactor_held"`
	Scale     Num      `json:"prefactor_scale"`
	ScaleCI   Interval `json:"prefactor_scale_ci95"`
	LnScale   Num      `json:"ln_prefactor_scale" result:"ln of the prefactor scale"`
	LnScaleSE Num      `json:"ln_prefactor_scale_se"`
	Scatter
	ClassicalSlope Num            `json:"classical_slope_k_j2_per_m6"`
	LinearGamma    Num            `json:"classical_gamma_j_per_m2"`
	Sites          Num            `json:"fitted_sites_per_m3"`
	J0             Num            `json:"fitted_j0_per_m3_s"`
	Flags          []string       `json:"flags"`
	Rows           []InterfaceRow `json:"rows"`

	Fit      *fit.InterfaceFit `json:"-"`
	T, LnJ   []float64         `json:"-"` // the points fitted: K and ln J
	card     *presets.Card
	Data     FitData `json:"-"`
	names    Names
	noMobLaw bool
}

// InterfaceRow is one measured rate with the fitted one.
type InterfaceRow struct {
	Line       string  `json:"line" col:"line"`
	T          Num     `json:"temperature_k" col:"T (K),f2"`
	TC         Num     `json:"temperature_c" col:"T (°C),f2,2"`
	Log10J     Num     `json:"log10_rate_per_m3_s" col:"log10 J (m^-3 s^-1),f3"`
	Fitted     Num     `json:"fitted_log10_rate_per_m3_s" col:"fitted,f3"`
	Residual   Num     `json:"residual_log10" col:"residual (decades),f3"`
	Size       Num     `json:"critical_size" col:"n*,g4,1"`
	ClassicalX Num     `json:"classical_x_m6_per_k_j2" col:"1/(T dg_v^2) (K^-1 m6/J2),g5,3"`
	ClassicalY Num     `json:"classical_y" col:"classical y,f4,3"`
	Flags      Strings `json:"flags" col:"flags"`
}

// StartGamma gives a card without an interfacial energy the one the
// classical plot of the data suggests, so that the card builds a model to
// fit: a fit must not ask for its own result. The fit searches the whole
// range of γ, so the start only names the model; the fit replaces it. A
// card that has gamma is left alone. Errors: the card's own (a value
// missing besides gamma), and those of the data (*BadData).
func StartGamma(c *presets.Card, data FitData) error {
	if c.Has("gamma") {
		return nil
	}
	if err := data.positive("rate"); err != nil {
		return err
	}
	if err := data.aboveZero(); err != nil {
		return err
	}
	const placeholder = 0.1 // J/m2: the classical plot does not depend on γ
	probe := c.Clone()
	if err := probe.Set("gamma", fmt.Sprintf("%g J/m2", placeholder), "placeholder"); err != nil {
		panic("answer: StartGamma: " + err.Error())
	}
	md, err := probe.Model()
	if err != nil {
		return err
	}
	d := data.Data
	lnJ := make([]float64, len(d.Lines))
	for i, j := range d.Columns["rate"] {
		lnJ[i] = math.Log(j)
	}
	_, _, _, g := fit.Classical(md, d.Columns["temperature"], lnJ, data.W)
	source := fmt.Sprintf("start of the fit, from the classical plot of %s; the fit replaces it", data.Name())
	if !(g >= fit.GammaFitMin && g <= fit.GammaFitMax) {
		g = math.Sqrt(fit.GammaFitMin * fit.GammaFitMax)
		source = fmt.Sprintf("start of the fit (the classical plot of %s gives none); the fit replaces it", data.Name())
	}
	return c.Set("gamma", fmt.Sprintf("%.4g J/m2", g), source)
}

// InterfaceCard completes a card for a fit of its linear interfacial-energy
// law to data: without a slope the fit starts from none, and without its
// reference temperature takes the mean temperature of the data (to 0.1 K).
// Other laws, and a card that has both, are returned as they are.
func InterfaceCard(c *presets.Card, data FitData) (*presets.Card, error) {
	if c.Choice("gamma_law") != "linear" || (c.Has("gamma_slope") && c.Has("gamma_t_ref")) {
		return c, nil
	}
	out := c.Clone()
	out.GammaLaw = "linear"
	if !c.Has("gamma_slope") {
		if err := out.Set("gamma_slope", "0 J/m2/K", "start of undercool fit interface"); err != nil {
			return nil, err
		}
	}
	if !c.Has("gamma_t_ref") {
		T := data.Columns["temperature"]
		mean := 0.0
		for _, t := range T {
			mean += t / float64(len(T))
		}
		if err := out.Set("gamma_t_ref", fmt.Sprintf("%.1f K", math.Round(mean*10)/10), "mean temperature of "+data.Name()); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// Interface fits the interfacial-energy law of the card's model and a
// prefactor scale (unless keep holds it) to a file read with
// InterfaceColumns, every other value from the model (which must have a
// rate): γ for a constant law, γ(T_ref) for a negentropic one, γ(T_ref)
// and dγ/dT for a linear one. Errors: the file's points (*BadData); a fit
// that finds no γ.
func Interface(c *presets.Card, md *kinetics.Model, data FitData, keep bool, names Names) (*FitInterface, error) {
	d := data.Data
	T := d.Columns["temperature"]
	if err := data.positive("rate"); err != nil {
		return nil, err
	}
	lnJ := make([]float64, len(T))
	for i, j := range d.Columns["rate"] {
		lnJ[i] = math.Log(j)
	}
	if err := data.aboveZero(); err != nil {
		return nil, err
	}
	law := md.Material().GammaLaw
	res, err := fit.InterfaceWith(md, T, lnJ, data.W, fit.InterfaceOptions{Slope: law == kinetics.GammaLinear, KeepScale: keep})
	if err != nil {
		var pe *kinetics.PointError
		if errors.As(err, &pe) || errors.Is(err, fit.ErrFewPoints) || len(T) < 2 || sameAll(T) {
			return nil, badData(d, err)
		}
		return nil, fmt.Errorf("%s: %w", d.File, err)
	}
	m := Describe(c, md)
	a := &FitInterface{
		Inputs: InterfaceInputs{m, d.File, res.N, data.W != nil},
		Gamma:  Gamma{Num(res.Gamma), Num(res.GammaSE), res.GammaCI},
		Law:    res.Law.String(), TRef: Num(math.NaN()), Slope: Num(res.Slope), SlopeSE: Num(res.SlopeSE), SlopeCI: res.SlopeCI, Held: keep,
		Scale: Num(res.Scale), ScaleCI: res.ScaleCI, LnScale: Num(res.LnScale), LnScaleSE: Num(res.LnScaleSE),
		Scatter:        scatterOf(res.R2, res.ResidualSD, res.DoF, res.T),
		ClassicalSlope: Num(math.NaN()), LinearGamma: Num(res.LinearGamma), Sites: Num(math.NaN()), J0: Num(math.NaN()),
		Flags: res.Flags.Keys(),
		Fit:   res, T: T, LnJ: lnJ, card: c, Data: data, names: names, noMobLaw: md.Material().Mobility == nil,
	}
	if res.Law != kinetics.GammaConstant {
		a.TRef = Num(res.TRef)
	}
	if res.Linear != nil {
		a.ClassicalSlope = Num(res.Linear.Slope)
	}
	if f := res.Fitted(); keep {
		// the prefactor as the material has it: nothing fitted
	} else if f.Prefactor == kinetics.PrefactorFixed {
		a.J0 = Num(f.J0)
	} else {
		a.Sites = Num(f.Sites)
	}
	a.Rows = []InterfaceRow{}
	for i, t := range T[:listed(data, len(T))] {
		s := res.Model.At(t)
		a.Rows = append(a.Rows, InterfaceRow{
			fmt.Sprint(d.Lines[i]), Num(t), Num(units.Celsius(t)), Num(lnJ[i] / math.Ln10),
			Num((lnJ[i] - res.Residuals[i]) / math.Ln10), Num(res.Residuals[i] / math.Ln10),
			Num(s.Nucleus.Size), Num(res.LinearX[i]), Num(res.LinearY[i]), s.Flags.Keys(),
		})
	}
	return a, nil
}

func sameAll(T []float64) bool {
	for _, t := range T {
		if t != T[0] {
			return false
		}
	}
	return true
}

// Doc is how the fit reads.
func (a *FitInterface) Doc() Doc {
	res := a.Fit
	d := Doc{Title: "undercool fit interface: interfacial energy from measured nucleation rates"}
	over := "gamma and A"
	switch {
	case res.Law == kinetics.GammaLinear && a.Held:
		over = "gamma(T_ref) and dgamma/dT, A held at 1"
	case res.Law == kinetics.GammaLinear:
		over = "gamma(T_ref), dgamma/dT and A"
	case a.Held:
		over = "gamma, A held at 1"
	}
	d.About = append(a.Inputs.About(), a.Data.line(res.N, "temperature", "rate"),
		fmt.Sprintf("fit: ln J_measured = ln A + ln J_model(T; gamma law %s), least squares over %s; every other value from the material (its gamma is only replaced)", res.Law, over))
	residual := ""
	if !res.Exact() {
		residual = fmt.Sprintf(" (%.3g decades)", res.ResidualSD/math.Ln10)
	}
	gl := a.Gamma.text(5)
	if res.Law != kinetics.GammaConstant {
		gl = fmt.Sprintf("at T_ref = %.2f K: %s", res.TRef, gl)
	}
	d.Summary = []string{gl}
	switch res.Law {
	case kinetics.GammaLinear:
		d.Summary = append(d.Summary, fmt.Sprintf("dgamma/dT = %.5g J/m2/K%s", res.Slope, spreadText(res.SlopeSE, res.SlopeCI, g(4), " J/m2/K")))
	case kinetics.GammaNegentropic:
		d.Summary = append(d.Summary, fmt.Sprintf("gamma(T) = gamma(T_ref)·T/T_ref, T_ref = %.2f K (negentropic)", res.TRef))
	}
	if a.Held {
		d.Summary = append(d.Summary, "prefactor: the material's, held (A = 1)")
	} else {
		d.Summary = append(d.Summary, fmt.Sprintf("prefactor scale A = %s (the model's rate times A)%s", Sig(4)(res.Scale), spreadText(math.NaN(), res.ScaleCI, g(4), "")))
	}
	d.Summary = append(d.Summary, statsLine(res.N, res.DoF, res.R2, res.ResidualSD, "ln J")+residual)
	if res.Linear != nil {
		lg := "no gamma (the slope is not negative)"
		if !math.IsNaN(res.LinearGamma) {
			lg = fmt.Sprintf("gamma = %.4g J/m2", res.LinearGamma)
		}
		lhs := "ln J - ln D"
		if a.noMobLaw {
			lhs = "ln J"
		}
		d.Summary = append(d.Summary, fmt.Sprintf("classical plot (%s against 1/(T dg_v^2)): slope %.5g K J2/m6, %s; it leaves out the temperature dependence of the prefactor, for comparison only", lhs, res.Linear.Slope, lg))
	}
	d.Table = tableOf(a.Rows)
	d.Notes = append(d.Notes, intervalNote(res.Exact(), "fit", res.T, res.DoF, ", SE from the Jacobian at the minimum (linear approximation); A's interval is exp of that of ln A"))
	if res.Law == kinetics.GammaLinear && !a.Held {
		d.Notes = append(d.Notes, "gamma(T_ref), dgamma/dT and A trade off against each other over a narrow range of temperature: their intervals are wide together, and holding A (--keep-prefactor) narrows them at the price of trusting the model's prefactor")
	}
	d.Notes = append(d.Notes, FlagNotes(res.Flags)...)
	return fitDoc(d, a.Data, a.names, Caution)
}

// Card is the material card with the fitted interfacial-energy law and,
// unless it was held, the prefactor scale folded into the site density (or
// into j0 for a fixed prefactor). Its standing: calibrated on the rows of
// the data, checked against none; its calibrated range the data's span.
func (a *FitInterface) Card() (*presets.Card, []string, error) {
	base, res, name := a.card, a.Fit, a.Data.Name()
	c := base.Clone()
	c.Name = base.Name + "-fit"
	what := "gamma"
	if res.Law == kinetics.GammaLinear {
		what = "gamma(T)"
		c.GammaLaw = "linear"
	}
	if !a.Held {
		what += " and the prefactor scale"
	}
	c.Description = fmt.Sprintf("%s (%s fitted to %s)", base.Description, what, name)
	src := fmt.Sprintf("undercool fit interface of %s, %d points, with the other values of %s", name, res.N, base.File)
	gs := src
	if !res.Exact() {
		gs += fmt.Sprintf(", 95 %% interval %.5g to %.5g J/m2", res.GammaCI[0], res.GammaCI[1])
	}
	values := [][3]string{{"gamma", fmt.Sprintf("%.7g J/m2", res.Gamma), gs}}
	if res.Law != kinetics.GammaConstant {
		values = append(values, [3]string{"gamma_t_ref", fmt.Sprintf("%.6g K", res.TRef), "reference temperature of the fitted law (" + src + ")"})
	}
	if res.Law == kinetics.GammaLinear {
		ss := src
		if !res.Exact() {
			ss += fmt.Sprintf(", 95 %% interval %.5g to %.5g J/m2/K", res.SlopeCI[0], res.SlopeCI[1])
		}
		values = append(values, [3]string{"gamma_slope", fmt.Sprintf("%.7g J/m2/K", res.Slope), ss})
	}
	if !a.Held {
		m := res.Fitted()
		what := "the base site density"
		if m.Prefactor == kinetics.PrefactorFixed {
			what = "the base j0"
		}
		scale := fmt.Sprintf("%s times the prefactor scale A = %.5g fitted by undercool fit interface to %s", what, res.Scale, name)
		folded := [3]string{"sites", fmt.Sprintf("%.7g m-3", m.Sites), scale}
		if m.Prefactor == kinetics.PrefactorFixed {
			folded = [3]string{"j0", fmt.Sprintf("%.7g /m3/s", m.J0), scale}
		}
		values = append(values, folded)
	}
	lo, hi := floats.Min(a.T), floats.Max(a.T)
	span := "span of the temperatures of " + name + ", fitted by undercool fit interface"
	values = append(values, [3]string{"calibrated_t_min", fmt.Sprintf("%.6g K", lo), span}, [3]string{"calibrated_t_max", fmt.Sprintf("%.6g K", hi), span})
	if err := setValues(c, values...); err != nil {
		return nil, nil, err
	}
	c.Standing = fittedStanding(base.Standing, a.Data, "fit interface")
	header := []string{
		fmt.Sprintf("%s with %s fitted by undercool fit interface to %s.", base.Name, what, name),
		"Every other value is the base card's. Calibrated on the data, checked against none: an estimate until held-out data agree.",
	}
	return c, header, nil
}

// fittedStanding is the standing of a card written by a fit on a base
// card: calibrated on every row of the data and on the rows the base was
// calibrated on, checked against none (the fit changes what the base's
// checks checked).
func fittedStanding(base presets.Standing, d FitData, by string) presets.Standing {
	rows := append([]string(nil), base.Calibrated...)
	for _, l := range d.Lines {
		if r := fmt.Sprintf("%s:%d", d.Name(), l); !slices.Contains(rows, r) {
			rows = append(rows, r)
		}
	}
	return presets.Standing{Calibrated: rows, Note: "written by undercool " + by + "; not checked against held-out data"}
}
