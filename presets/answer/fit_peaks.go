package answer

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// The columns of the heating-scan fits: the heating rate of each scan, and
// the temperature of its peak (Kissinger, Ozawa–Flynn–Wall) or the
// fraction it reached at a temperature (Ozawa's exponent).
var (
	rateColumn     = presets.Column{Quantity: "heating_rate", Kind: units.HeatingRate, Required: true}
	peakColumn     = presets.Column{Quantity: "peak_temperature", Kind: units.Temperature}
	atColumn       = presets.Column{Quantity: "temperature", Kind: units.Temperature}
	fractionColumn = presets.Column{Quantity: "fraction", Kind: units.Fraction}
)

// PeakColumns are the columns of a Kissinger fit's data.
func PeakColumns() []presets.Column {
	p := peakColumn
	p.Required = true
	return []presets.Column{rateColumn, p, WeightColumn}
}

// OzawaColumns are the columns of an Ozawa fit's data: the peaks (for the
// activation energy), or a temperature and the fraction reached there
// (for the exponent).
func OzawaColumns() []presets.Column {
	return []presets.Column{rateColumn, peakColumn, atColumn, fractionColumn, WeightColumn}
}

// PeaksInputs are the inputs of a fit to DSC peaks.
type PeaksInputs struct {
	File       string `json:"data_file"`
	Points     int    `json:"points"`
	RateColumn string `json:"heating_rate_column"`
	TColumn    string `json:"peak_temperature_column"`
	Method     string `json:"method"`
	Ordinate   string `json:"ordinate"`
	Weighted   bool   `json:"weighted"`
}

// FitPeaks is an apparent activation energy fitted to the peak
// temperatures of heating scans, by Kissinger's line or the
// Ozawa–Flynn–Wall line.
type FitPeaks struct {
	Inputs          PeaksInputs `json:"inputs"`
	E               Num         `json:"activation_energy_j_per_mol" result:"apparent activation energy E"`
	ESE             Num         `json:"activation_energy_se_j_per_mol"`
	ECI             Interval    `json:"activation_energy_ci95_j_per_mol"`
	EkJ             Num         `json:"activation_energy_kj_per_mol"`
	EeV             Num         `json:"activation_energy_ev"`
	*KissingerTerms             // Kissinger only
	*DoyleTerms                 // Ozawa only
	// Reduced is the range of E/(R·Tp) over the peaks.
	Reduced  [2]Num    `json:"reduced_energy_range"`
	Scatter            // r2, residual_sd_ln, degrees_of_freedom, student_t
	Warnings []Warning `json:"warnings"`
	Rows     []PeakRow `json:"rows"`

	Fit      *fit.PeakFit `json:"-"`
	Beta, Tp []float64    `json:"-"` // K/s and K
	Data     FitData      `json:"-"`
	names    Names
}

// KissingerTerms are the pre-exponential of Kissinger's line: exact for a
// first-order law, a scale of the line otherwise.
type KissingerTerms struct {
	A     Num      `json:"pre_exponential_per_s" result:"pre-exponential A"`
	ACI   Interval `json:"pre_exponential_ci95_per_s"`
	LnA   Num      `json:"ln_pre_exponential" result:"ln of the pre-exponential"`
	LnASE Num      `json:"ln_pre_exponential_se"`
}

// DoyleTerms say how the Ozawa–Flynn–Wall energy is read off its slope.
type DoyleTerms struct {
	Slope Num    `json:"doyle_slope"` // E = −R·slope/Slope
	Range [2]Num `json:"doyle_valid_reduced_energy_range"`
}

// PeakRow is one scan: its rate, its peak and the line through them.
type PeakRow struct {
	Line     string `json:"line" col:"line"`
	RateMin  Num    `json:"heating_rate_k_per_min" col:"rate (K/min),g4"`
	Rate     Num    `json:"heating_rate_k_per_s" col:"rate (K/s),g4,3"`
	Tp       Num    `json:"peak_temperature_k" col:"Tp (K),f2"`
	TpC      Num    `json:"peak_temperature_c" col:"Tp (°C),f2,2"`
	InvT     Num    `json:"inverse_temperature_per_k" col:"1000/Tp (1/K),per_kk,1"`
	Y        Num    `json:"ordinate" col:"y,f4"`
	Fitted   Num    `json:"fitted_ordinate" col:"fitted y,f4,4"`
	Residual Num    `json:"residual" col:"residual,f4"`
}

// ordinates name the line of each method.
var ordinates = map[string]string{
	fit.Kissinger: "ln(beta/Tp^2), beta in K/s",
	fit.Ozawa:     "ln(beta), beta in K/s",
}

// Kissinger fits Kissinger's line to a file read with PeakColumns.
// Errors: the file's points (*BadData).
func Kissinger(data FitData, names Names) (*FitPeaks, error) {
	return peaks(fit.Kissinger, data, names)
}

// Ozawa fits a file read with OzawaColumns: the Ozawa–Flynn–Wall energy
// when it has peak temperatures, Ozawa's exponent when it has fractions at
// temperatures. Errors: the file's columns and points (*BadData).
func Ozawa(data FitData, names Names) (Answer, error) {
	d := data.Data
	_, peak := d.Columns["peak_temperature"]
	_, at := d.Columns["temperature"]
	_, frac := d.Columns["fraction"]
	switch {
	case peak && (at || frac):
		return nil, &BadData{fmt.Sprintf("%s: a peak_temperature column with temperature or fraction columns; give the peaks (for the activation energy) or a temperature and the fractions (for the exponent), not both", d.File)}
	case peak:
		return peaks(fit.Ozawa, data, names)
	case at && frac:
		return OzawaExponent(data, names)
	}
	return nil, &BadData{fmt.Sprintf("%s: give peak_temperature_UNIT (for the activation energy) or temperature_UNIT and fraction (for the exponent) beside %s", d.File, d.Headers["heating_rate"])}
}

func peaks(method string, data FitData, names Names) (*FitPeaks, error) {
	d := data.Data
	beta, Tp := d.Columns["heating_rate"], d.Columns["peak_temperature"]
	if err := data.positiveRates(); err != nil {
		return nil, err
	}
	for i, t := range Tp {
		if !(t > 0) {
			return nil, data.bad(i, fmt.Sprintf("column %q: %s K is at or below absolute zero", d.Headers["peak_temperature"], Sig(6)(t)))
		}
	}
	res, err := fit.PeakKissinger(beta, Tp, data.W)
	if method == fit.Ozawa {
		res, err = fit.PeakOzawa(beta, Tp, data.W)
	}
	if err != nil {
		return nil, badData(d, err)
	}
	l := res.Arrhenius.Line
	a := &FitPeaks{
		Inputs: PeaksInputs{d.File, l.N, d.Headers["heating_rate"], d.Headers["peak_temperature"], method, ordinates[method], data.W != nil},
		E:      Num(res.E), ESE: Num(res.ESE), ECI: res.ECI, EkJ: Num(res.E / 1e3), EeV: Num(res.E / (cnt.Avogadro * electronVolt)),
		Reduced:  [2]Num{Num(res.Reduced[0]), Num(res.Reduced[1])},
		Scatter:  scatterOf(l.R2, l.ResidualSD, l.DoF, l.T),
		Warnings: celsiusWarnings(Tp, res.Arrhenius, "peak_temperature"),
		Fit:      res, Beta: beta, Tp: Tp, Data: data, names: names,
	}
	if method == fit.Kissinger {
		a.KissingerTerms = &KissingerTerms{Num(res.A), res.ACI, Num(res.LnA), Num(res.LnASE)}
	} else {
		a.DoyleTerms = &DoyleTerms{Num(fit.DoyleSlope), [2]Num{Num(fit.DoyleRange[0]), Num(fit.DoyleRange[1])}}
		if res.Reduced[0] < fit.DoyleRange[0] || res.Reduced[1] > fit.DoyleRange[1] {
			a.Warnings = append(a.Warnings, Warning{"outside_doyle_range", fmt.Sprintf(
				"E/(R Tp) runs from %.3g to %.3g, outside %g to %g where Doyle's approximation holds: the energy is biased by more than a few per cent",
				res.Reduced[0], res.Reduced[1], fit.DoyleRange[0], fit.DoyleRange[1])})
		}
	}
	a.Rows = []PeakRow{}
	for i, t := range Tp[:listed(data, len(Tp))] {
		y := res.LnY(beta[i], t)
		a.Rows = append(a.Rows, PeakRow{fmt.Sprint(d.Lines[i]), Num(beta[i] * 60), Num(beta[i]), Num(t), Num(units.Celsius(t)), Num(1 / t),
			Num(y), Num(l.At(1 / t)), Num(l.Residuals[i])})
	}
	return a, nil
}

// positiveRates checks that every heating rate is positive.
func (d FitData) positiveRates() error {
	for i, b := range d.Columns["heating_rate"] {
		if !(b > 0) {
			return d.bad(i, fmt.Sprintf("column %q: %s must be positive (a heating rate)", d.Headers["heating_rate"], Sig(6)(b)))
		}
	}
	return nil
}

// PeaksMeaning says what the apparent energy of a crystallization peak is
// and is not.
const PeaksMeaning = "E is apparent: for crystallization by nucleation and growth it mixes the temperature dependences of nucleation and of growth over the range of the peaks (Henderson, J. Non-Cryst. Solids 30 (1979) 301); it is not the activation energy of diffusion or of viscous flow, and does not carry the rate beyond the peaks"

// Doc is how the fit reads.
func (a *FitPeaks) Doc() Doc {
	res, l := a.Fit, a.Fit.Arrhenius.Line
	kj := func(x float64) string { return fmt.Sprintf("%.4g", x/1e3) }
	d := Doc{
		Title: "undercool fit kissinger: ln(beta/Tp^2) against 1/Tp by least squares",
		About: []string{a.Data.line(l.N, "heating_rate", "peak_temperature"),
			fmt.Sprintf("law: ln(beta/Tp^2) = ln(A R/E) - E/(R Tp), beta in K/s (Kissinger 1957; exact for a first-order law); R = %.9g J/(mol K)", cnt.Gas)},
	}
	if res.Method == fit.Ozawa {
		d.Title = "undercool fit ozawa: ln(beta) against 1/Tp by least squares (Ozawa-Flynn-Wall)"
		d.About[1] = fmt.Sprintf("law: ln(beta) = const - %.4f E/(R Tp) (Doyle's approximation of the temperature integral, for %g <= E/(R Tp) <= %g; the peak taken as a point of equal conversion)",
			fit.DoyleSlope, fit.DoyleRange[0], fit.DoyleRange[1])
	}
	for _, w := range a.Warnings {
		d.Summary = append(d.Summary, "warning: "+w.Text)
	}
	d.Summary = append(d.Summary, fmt.Sprintf("apparent E = %s kJ/mol (%.0f J/mol, %.4g eV)%s", kj(res.E), res.E, float64(a.EeV), spreadText(res.ESE, res.ECI, kj, " kJ/mol")))
	if res.Method == fit.Kissinger {
		d.Summary = append(d.Summary, fmt.Sprintf("pre-exponential A = %s 1/s%s%s", Sig(4)(res.A), spreadText(math.NaN(), res.ACI, g(4), ""), lnText("A", res.LnA, res.LnASE, [2]float64{math.Log(res.ACI[0]), math.Log(res.ACI[1])})))
	}
	d.Summary = append(d.Summary,
		fmt.Sprintf("E/(R Tp) = %.4g to %.4g over the peaks", res.Reduced[0], res.Reduced[1]),
		statsLine(l.N, l.DoF, l.R2, l.ResidualSD, "the ordinate"))
	d.Table = tableOf(a.Rows)
	d.Table.Cols[6].Head = "ln(beta/Tp^2)"
	if res.Method == fit.Ozawa {
		d.Table.Cols[6].Head = "ln(beta)"
	}
	how := "; A's interval is exp of that of ln A = intercept + ln(E/R), first order in both coefficients"
	if res.Method == fit.Ozawa {
		how = "; E's is the slope's divided by Doyle's factor"
	}
	d.Notes = append(d.Notes, intervalNote(l.Exact(), "line", l.T, l.DoF, how), PeaksMeaning)
	if res.Method == fit.Kissinger {
		d.Notes = append(d.Notes, "A is the pre-exponential of a first-order law; for other kinetics it only places the line")
	}
	return fitDoc(d, a.Data, a.names, FitCaution)
}
