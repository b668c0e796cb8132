package answer

import (
	"errors"
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// InductionColumns are the columns of an induction-time file.
func InductionColumns() []presets.Column {
	return []presets.Column{
		{Quantity: "temperature", Kind: units.Temperature, Required: true},
		{Quantity: "supersaturation", Kind: units.Dimensionless, Required: true},
		{Quantity: "induction_time", Kind: units.Time, Required: true},
		WeightColumn,
	}
}

// InductionFitInputs are the inputs of an induction-time fit.
type InductionFitInputs struct {
	Name     string `json:"material"`
	Card     string `json:"card"`
	Vm       Num    `json:"molar_volume_m3_per_mol"`
	V        Num    `json:"molecular_volume_m3"`
	Shape    Num    `json:"shape_factor"`
	Volume   Num    `json:"volume_m3"` // null: none given
	File     string `json:"data_file"`
	Points   int    `json:"points"`
	Weighted bool   `json:"weighted"`
}

// FitInduction is the interfacial energy and the apparent prefactor of a
// solution fitted to induction times.
type FitInduction struct {
	Inputs InductionFitInputs `json:"inputs"`
	Gamma
	A         Num      `json:"pre_exponential"`
	ACI       Interval `json:"pre_exponential_ci95"`
	LnA       Num      `json:"ln_pre_exponential"`
	LnASE     Num      `json:"ln_pre_exponential_se"`
	LnAV      Num      `json:"ln_rate_times_volume_per_s"`
	Slope     Num      `json:"slope_k3"`
	Intercept Num      `json:"intercept_ln_s"`
	Scatter
	MinSize Num               `json:"critical_size_min"`
	MaxSize Num               `json:"critical_size_max"`
	Flags   Strings           `json:"flags"`
	Rows    []InductionRow    `json:"rows"`
	Fit     *fit.InductionFit `json:"-"`
	Times   []float64         `json:"-"` // s

	card       *presets.Card
	Data       FitData `json:"-"`
	volumeText string
	names      Names
}

// InductionRow is one measured induction time with the fitted line.
type InductionRow struct {
	Line     string `json:"line" col:"line"`
	T        Num    `json:"temperature_k" col:"T (K),f2"`
	S        Num    `json:"supersaturation" col:"S,g5"`
	Time     Num    `json:"induction_time_s" col:"t_ind (s),g5"`
	X        Num    `json:"x_per_k3" col:"1/(T^3 ln^2 S) (K^-3),g5,2"`
	LnT      Num    `json:"ln_time" col:"ln t,f4,2"`
	Fitted   Num    `json:"fitted_ln_time" col:"fitted,f4,1"`
	Residual Num    `json:"residual_ln" col:"residual,f4"`
	Size     Num    `json:"critical_size" col:"n*,g4,1"`
}

// InductionFitInput asks for γ and A from induction times.
type InductionFitInput struct {
	Card       *presets.Card // the crystal's molar volume (vm, or molar_mass and density) and contact angle
	Data       FitData       // read with InductionColumns
	V          float64       // m³, the volume of each sample; 0: unknown (A·V only)
	VolumeText string
	Names      Names
}

// InductionTimes fits ln t_ind against 1/(T³·ln²S). Errors: a card
// without a molar volume (*presets.MissingError of vm); the file's points
// (*BadData).
func InductionTimes(in InductionFitInput) (*FitInduction, error) {
	card, d := in.Card, in.Data
	vm, ok := card.MolarVolume()
	if !ok {
		return nil, &presets.MissingError{File: card.File, Key: "vm", Why: "the molar volume of the crystal, or molar_mass and density"}
	}
	theta := 180.0
	if card.Has("theta") {
		theta = card.SI("theta")
	}
	shape := cnt.ShapeFactor(theta)
	T, S, ti := d.Columns["temperature"], d.Columns["supersaturation"], d.Columns["induction_time"]
	v := vm / cnt.Avogadro
	res, err := fit.Induction(T, S, ti, d.W, v, shape, in.V)
	if err != nil {
		var pe *kinetics.PointError
		if errors.As(err, &pe) || errors.Is(err, fit.ErrFewPoints) || errors.Is(err, fit.ErrSameX) {
			return nil, badData(d.Data, err)
		}
		return nil, &BadData{fmt.Sprintf("%s: %v", d.File, err)}
	}
	line := res.Line
	volume := Num(in.V)
	if in.V == 0 {
		volume = Num(math.NaN())
	}
	a := &FitInduction{
		Inputs: InductionFitInputs{card.Name, card.File, Num(vm), Num(v), Num(shape), volume, d.File, line.N, d.W != nil},
		Gamma:  Gamma{Num(res.Gamma), Num(res.GammaSE), res.GammaCI},
		A:      Num(res.A), ACI: res.ACI, LnA: Num(res.LnA), LnASE: Num(res.LnASE), LnAV: Num(res.LnAV),
		Slope: Num(res.Slope), Intercept: Num(line.Intercept),
		Scatter: scatterOf(line.R2, line.ResidualSD, line.DoF, line.T),
		MinSize: Num(res.MinSize), MaxSize: Num(res.MaxSize), Flags: res.Flags.Keys(),
		Fit: res, Times: ti, card: card, Data: d, volumeText: in.VolumeText, names: in.Names,
	}
	a.Rows = []InductionRow{}
	for i := range T[:listed(d, len(T))] {
		n := cnt.Critical(cnt.Boltzmann*T[i]*math.Log(S[i]), res.Gamma, v, shape, T[i])
		a.Rows = append(a.Rows, InductionRow{
			fmt.Sprint(d.Lines[i]), Num(T[i]), Num(S[i]), Num(ti[i]), Num(res.X[i]), Num(math.Log(ti[i])),
			Num(line.At(res.X[i])), Num(line.Residuals[i]), Num(n.Size),
		})
	}
	return a, nil
}

// Doc is how the fit reads.
func (a *FitInduction) Doc() Doc {
	res, line, in := a.Fit, a.Fit.Line, a.Inputs
	V := float64(in.Volume)
	d := Doc{
		Title: "undercool fit induction: interfacial energy and prefactor from induction times",
		About: []string{
			fmt.Sprintf("material: %s (%s); v = %.4g m3 per molecule (V_m = %.4g m3/mol), f(theta) = %.4g", in.Name, in.Card, float64(in.V), float64(in.Vm), float64(in.Shape)),
			a.Data.line(line.N, "temperature", "supersaturation", "induction_time"),
			"fit: ln t_ind = -ln(A V) + B'/(T^3 ln^2 S), B' = 16 pi f gamma^3 v^2/(3 k_B^3); induction taken as mononuclear, t_ind = 1/(J V), J = A exp(-16 pi f gamma^3 v^2/(3 (k_B T)^3 ln^2 S))",
		},
	}
	if V > 0 {
		d.About = append(d.About, fmt.Sprintf("volume of each sample: %s (%.4g m3)", a.volumeText, V))
	}
	d.Summary = []string{a.Gamma.text(4)}
	if V > 0 {
		ci := line.InterceptCI()
		d.Summary = append(d.Summary, fmt.Sprintf("A = %s m^-3 s^-1%s", Sig(4)(res.A), spreadText(math.NaN(), res.ACI, g(4), " m^-3 s^-1"))+lnText("A", res.LnA, res.LnASE, [2]float64{-ci[1] - math.Log(V), -ci[0] - math.Log(V)}))
	} else {
		d.Summary = append(d.Summary, fmt.Sprintf("A·V = %s s^-1 (give %s for A itself)", Sig(4)(math.Exp(res.LnAV)), a.names.of("volume")))
	}
	d.Summary = append(d.Summary,
		fmt.Sprintf("slope B' = %.5g K^3, intercept %.5g (ln s)", res.Slope, line.Intercept),
		statsLine(line.N, line.DoF, line.R2, line.ResidualSD, "ln t"),
		fmt.Sprintf("critical nucleus over the data with the fitted gamma: %.3g to %.3g molecules", res.MinSize, res.MaxSize))
	d.Table = tableOf(a.Rows)
	d.Notes = append(d.Notes, intervalNote(line.Exact(), "line", line.T, line.DoF, "; gamma's interval is the slope's through the cube root, A's is exp of that of ln A"))
	d.Notes = append(d.Notes, FlagNotes(res.Flags)...)
	if res.Flags&kinetics.FlagSmallNucleus != 0 {
		d.Notes = append(d.Notes, "the fitted gamma gives a critical nucleus below 10 molecules: CNT is outside its range, and gamma and A are apparent values that correlate these data (common for crystallization from solution)")
	}
	d.Notes = append(d.Notes, "induction taken as mononuclear (the wait for the first nucleus); where growth to a detectable amount dominates, the slope still gives gamma but A is not the nucleation prefactor")
	return fitDoc(d, a.Data, a.names, Caution)
}

// Card is the material card with the fitted γ and A as a fixed prefactor.
// It needs the volume of the samples (for A): without it, an *InputError
// of "card-out".
func (a *FitInduction) Card() (*presets.Card, []string, error) {
	if !(float64(a.Inputs.Volume) > 0) {
		return nil, nil, &InputError{"card-out", fmt.Errorf("the card needs the prefactor A, so give %s", a.names.of("volume"))}
	}
	base, res, name := a.card, a.Fit, a.Data.Name()
	c := base.Clone()
	if c.File == "command line" {
		c.Name, c.Kind, c.Driving = "fitted-solution", "solution", "solution"
	}
	c.Name += "-fit"
	c.Description = fmt.Sprintf("%s (gamma and the apparent prefactor A fitted to the induction times of %s)", base.Description, name)
	c.Prefactor = "fixed"
	src := fmt.Sprintf("undercool fit induction of %s, %d points", name, res.Line.N)
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
	c.Standing = fittedStanding(base.Standing, a.Data, "fit induction")
	header := []string{
		"Written by undercool fit induction: gamma and the apparent prefactor A (as j0, prefactor fixed)",
		"fitted to " + name + "; every other value as in " + base.File + ".",
		"Apparent values: they correlate these induction times; the critical nucleus they imply may hold only a few molecules.",
	}
	return c, header, nil
}
