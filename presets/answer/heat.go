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

// HeatInput asks what heating does to a glass: linear heating from From to
// To at one rate, the critical heating rate, the DSC peaks at several
// rates, or a schedule of ramps and holds; with the nuclei a prior cooling
// quenched in (CooledAt) for linear heating.
type HeatInput struct {
	Card     *presets.Card
	Model    *kinetics.Model
	From, To float64 // K; To 0: T_e
	Rate     float64 // K/s, linear heating at one rate
	Critical bool    // the critical heating rate
	DSC      []float64
	Schedule *kinetics.Schedule // a schedule instead of linear heating
	// CooledAt is the rate (K/s) of a cooling from T_e that made the glass:
	// the nuclei it left at From are carried into the heating. 0: a
	// nucleus-free glass.
	CooledAt float64
	X        float64 // the fraction to stay below or to reach
	Names    Names
}

// HeatInputs are the inputs of heating: the material and the path.
type HeatInputs struct {
	Material
	Path     string `json:"path"` // "linear heating" or "schedule"
	From     Num    `json:"start_temperature_k"`
	To       Num    `json:"end_temperature_k"`
	Schedule string `json:"schedule,omitempty"`
	X        Num    `json:"target_fraction"`
}

// Quenched are the nuclei a cooling from T_e at a rate left in the glass
// where heating starts.
type Quenched struct {
	CoolingRate Num `json:"cooling_rate_k_per_s"`
	PerVolume   Num `json:"nuclei_per_m3" result:"quenched-in nuclei per volume"`
	MeanRadius  Num `json:"mean_radius_m"`
	Fraction    Num `json:"fraction"` // the fraction they already fill
}

// HeatRow is heating at one rate as it passes a temperature.
type HeatRow struct {
	T        Num `json:"temperature_k" col:"T (K),f2"`
	Time     Num `json:"time_s" col:"time,time"`
	Fraction Num `json:"fraction" col:"fraction,g4"`
	Crystals Num `json:"crystals_per_m3" col:"crystals (m^-3),g4,2"`
	Rate     Num `json:"rate_per_k" col:"dX/dT (1/K),g4,1"`
}

// HeatRateRow is heating at one rate to the end of the path.
type HeatRateRow struct {
	Rate     Num `json:"heating_rate_k_per_s" col:"rate (K/s),g4"`
	Fraction Num `json:"fraction" col:"fraction at end,g4" result:"fraction at the end of heating"`
	T        Num `json:"temperature_k" col:"X reached at T (K),f2"`
	Time     Num `json:"time_s" col:"after,time"`
}

// DSCRow is the DSC peak of a scan at one heating rate.
type DSCRow struct {
	RateMin  Num `json:"heating_rate_k_per_min" col:"rate (K/min),g4"`
	Rate     Num `json:"heating_rate_k_per_s" col:"rate (K/s),g4,3"`
	Onset    Num `json:"onset_temperature_k" col:"onset (K),f2"`
	Peak     Num `json:"peak_temperature_k" col:"peak (K),f2"`
	PeakC    Num `json:"peak_temperature_c" col:"peak (°C),f2,2"`
	Fraction Num `json:"fraction_at_peak" col:"X at peak,g4,1"`
	Height   Num `json:"peak_rate_per_k" col:"dX/dT at peak (1/K),g4,4"`
}

// StepRow is where a schedule stands at the end of one of its steps.
type StepRow struct {
	Step     string `json:"step" col:"step"`
	T        Num    `json:"temperature_k" col:"T at end (K),f2"`
	Time     Num    `json:"time_s" col:"at,time"`
	Crystals Num    `json:"crystals_per_m3" col:"crystals (m^-3),g4"`
	Fraction Num    `json:"fraction" col:"fraction,g4"`
}

// heating is what every answer of heating holds.
type heating struct {
	Path    *kinetics.Heating `json:"-"` // linear heating (nil for a schedule)
	Model   *kinetics.Model   `json:"-"`
	X       float64           `json:"-"`
	Flags   kinetics.Flag     `json:"-"`
	summary []string
	notes   []string
}

// Heat is linear heating at one rate.
type Heat struct {
	Inputs   HeatInputs `json:"inputs"`
	Quenched *Quenched  `json:"quenched_in,omitempty"`
	Rate     Num        `json:"heating_rate_k_per_s"`
	Fraction Num        `json:"fraction" result:"fraction at the end of heating"`
	Crystals Num        `json:"crystals_per_m3"`
	Reached  *TimeAt    `json:"fraction_reached"`              // null: not reached
	Critical Num        `json:"critical_heating_rate_k_per_s"` // +Inf: none, the quenched-in nuclei fill X (JSON null)
	Flags    Strings    `json:"flags"`
	Rows     []HeatRow  `json:"rows"`
	heating
}

// HeatCritical is the critical heating rate beside the critical cooling
// rate of the same card.
type HeatCritical struct {
	Inputs   HeatInputs    `json:"inputs"`
	Quenched *Quenched     `json:"quenched_in,omitempty"`
	Rate     Num           `json:"critical_heating_rate_k_per_s"` // 0: none needed; +Inf: none, the quenched-in nuclei fill X (JSON null)
	Cooling  Num           `json:"critical_cooling_rate_k_per_s"`
	CoolEnd  Num           `json:"cooling_end_temperature_k"`
	Ratio    Num           `json:"heating_to_cooling_ratio"`
	Flags    Strings       `json:"flags"`
	Rows     []HeatRateRow `json:"rows"`
	heating
}

// DSC is the forward DSC peaks of linear heating at several rates, with the
// apparent energy Kissinger's line gives on them.
type DSC struct {
	Inputs   HeatInputs `json:"inputs"`
	Quenched *Quenched  `json:"quenched_in,omitempty"`
	// ApparentE is Kissinger's E on the interior peaks (NaN for fewer
	// than two), GrowthE the growth speed's own activation energy at the
	// middle peak, −R·d ln u/d(1/T).
	ApparentE Num                `json:"kissinger_apparent_energy_j_per_mol"`
	GrowthE   Num                `json:"growth_activation_energy_j_per_mol"`
	Flags     Strings            `json:"flags"`
	Rows      []DSCRow           `json:"rows"`
	Peaks     []kinetics.DSCPeak `json:"-"`
	heating
}

// HeatSchedule is a schedule of ramps and holds: the crystals and the
// fraction at the end of every step.
type HeatSchedule struct {
	Inputs   HeatInputs `json:"inputs"`
	Fraction Num        `json:"fraction" result:"fraction at the end of the schedule"`
	Crystals Num        `json:"crystals_per_m3"`
	Reached  *TimeAt    `json:"fraction_reached"` // null: not reached
	Flags    Strings    `json:"flags"`
	Rows     []StepRow  `json:"rows"`
	heating
}

// heatRows is the number of rows of the table along a heating path.
const heatRows = 11

// heatFactors are the rates of the table about the critical heating rate,
// as multiples of it.
var heatFactors = []float64{0.1, 0.3, 1, 3, 10}

// ErrHeatStart is returned when heating would start at or above T_e.
var ErrHeatStart = errors.New("heating must start below the equilibrium temperature")

// Heats answers heating: a *Heat, *HeatCritical, *DSC or *HeatSchedule.
// Errors: those of the model, ErrHeatStart, kinetics.ErrHeatingRange,
// kinetics.ErrScheduleJump.
func Heats(in HeatInput) (Answer, error) {
	md := in.Model
	if in.Schedule != nil {
		return heatSchedule(in)
	}
	to := in.To
	if to == 0 {
		to = md.Te()
	}
	if !(in.From < md.Te()) {
		return nil, fmt.Errorf("%w (start %.2f K, equilibrium %.2f K)", ErrHeatStart, in.From, md.Te())
	}
	if err := checkGamma(md, in.From, math.Min(to, md.Te())); err != nil {
		return nil, err
	}
	inputs := HeatInputs{Material: Describe(in.Card, md), Path: "linear heating", From: Num(in.From), To: Num(to), X: Num(in.X)}
	prior, q, err := quenched(in)
	if err != nil {
		return nil, err
	}
	h, err := md.LinearHeating(in.From, to, prior)
	if err != nil {
		return nil, err
	}
	hb := heating{Path: h, Model: md, X: in.X, Flags: md.SpanFlags(in.From, math.Min(to, md.Te()))}
	line := fmt.Sprintf("path: linear heating from %.2f K to %.2f K", in.From, to)
	if q != nil {
		line += fmt.Sprintf(", with the nuclei left by cooling from Te = %.2f K at %s", md.Te(), RateText(in.CooledAt))
		hb.summary = append(hb.summary, fmt.Sprintf("quenched in by cooling at %s: %.4g nuclei per m3, mean radius %.4g m, filling X = %.4g",
			RateText(in.CooledAt), float64(q.PerVolume), float64(q.MeanRadius), float64(q.Fraction)))
	}
	inputs.about = append(inputs.about, line, heatTransformLine)
	switch {
	case len(in.DSC) > 0:
		return hb.dsc(inputs, q, in.DSC), nil
	}
	// +Inf is an answer (no rate is fast enough), NaN a failed computation
	qc := h.CriticalRate(in.X)
	if math.IsNaN(qc) {
		return nil, &UndefinedError{"critical heating rate", qc}
	}
	if in.Critical {
		return hb.critical(inputs, q, qc)
	}
	return hb.atRate(inputs, q, in.Rate, qc), nil
}

// noneFastEnough says that no heating rate keeps the fraction below X.
func noneFastEnough(X float64) string {
	return fmt.Sprintf("critical heating rate: none; the quenched-in nuclei already fill X = %s (the cooling that made the glass was slower than its critical cooling rate)", FracLabel(X))
}

// heatTransformLine names the transformation model of heating.
const heatTransformLine = "transformation: extended volume Xext = (4 pi/3) q^-4 integral J(T') [integral_T'^T u dT'']^3 dT' on linear heating at rate q from a nucleus-free start (plus the growth of the nuclei carried in), X = 1 - exp(-Xext)"

// quenched are the nuclei of the prior cooling (kinetics.NoNuclei without
// one) and what the answer says of them (nil without one).
func quenched(in HeatInput) (kinetics.Nuclei, *Quenched, error) {
	if in.CooledAt == 0 {
		return kinetics.NoNuclei, nil, nil
	}
	cl, err := in.Model.LinearCooling(in.From)
	if err != nil {
		return kinetics.Nuclei{}, nil, err
	}
	n := cl.Nuclei(in.CooledAt, in.From)
	return n, &Quenched{CoolingRate: Num(in.CooledAt), PerVolume: Num(math.Exp(n.LnM[0])), MeanRadius: Num(n.MeanRadius()),
		Fraction: Num(kinetics.Fraction(n.LnXext()))}, nil
}

// atRate is heating at one rate: the fraction along the path.
func (hb heating) atRate(inputs HeatInputs, q *Quenched, rate, qc float64) *Heat {
	h := hb.Path
	end := h.At(h.To, rate)
	a := &Heat{Inputs: inputs, Quenched: q, Rate: Num(rate), Fraction: Num(end.Fraction), Crystals: Num(math.Exp(end.LnNuclei)),
		Critical: Num(qc), Flags: hb.Flags.Keys(), heating: hb}
	line := fmt.Sprintf("fraction at %.2f K after heating at %s: %.4g, %.4g crystals per m3", h.To, RateText(rate), end.Fraction, math.Exp(end.LnNuclei))
	if p := h.Reach(rate, hb.X); p.Reached {
		line += fmt.Sprintf("; X = %s reached at %.2f K after %s", FracLabel(hb.X), p.Temp, ReadableTime(p.Time))
		a.Reached = &TimeAt{Num(p.Temp), Num(p.Time)}
	} else {
		line += fmt.Sprintf("; X = %s not reached", FracLabel(hb.X))
	}
	a.summary = append(a.summary, line, fmt.Sprintf("critical heating rate to stay below X = %s: %s", FracLabel(hb.X), RateText(qc)))
	if math.IsInf(qc, 1) {
		a.summary[len(a.summary)-1] = noneFastEnough(hb.X)
	}
	for _, T := range Spread(h.From, h.To, heatRows) {
		p := h.At(T, rate)
		a.Rows = append(a.Rows, HeatRow{Num(T), Num(p.Time), Num(p.Fraction), Num(math.Exp(p.LnNuclei)), Num(math.Exp(p.LnRate))})
	}
	return a
}

// critical is the critical heating rate, beside the critical cooling rate
// of the same card (linear cooling from T_e to T_g, or where the rest is
// negligible: cool --critical).
func (hb heating) critical(inputs HeatInputs, q *Quenched, qh float64) (*HeatCritical, error) {
	h := hb.Path
	cl, err := hb.Model.LinearCooling(0)
	if err != nil {
		return nil, err
	}
	qcool := cl.CriticalRate(hb.X)
	a := &HeatCritical{Inputs: inputs, Quenched: q, Rate: Num(qh), Cooling: Num(qcool), CoolEnd: Num(cl.End), Ratio: Num(qh / qcool),
		Flags: hb.Flags.Keys(), Rows: []HeatRateRow{}, heating: hb}
	switch {
	case math.IsInf(qh, 1):
		a.summary = append(a.summary, noneFastEnough(hb.X))
	case qh > 0 && q != nil:
		a.summary = append(a.summary, fmt.Sprintf("critical heating rate to stay below X = %s at %.2f K: %s (exact path integral; with the nuclei carried in, the root of a polynomial in 1/rate)", FracLabel(hb.X), h.To, RateText(qh)))
	case qh > 0:
		a.summary = append(a.summary, fmt.Sprintf("critical heating rate to stay below X = %s at %.2f K: %s (exact path integral; Xext scales as rate^-4 from a nucleus-free start)", FracLabel(hb.X), h.To, RateText(qh)))
	default:
		a.summary = append(a.summary, "critical heating rate: none needed, nothing nucleates on the path")
	}
	a.summary = append(a.summary, fmt.Sprintf("critical cooling rate from Te = %.2f K to %.2f K (%s): %s", cl.Te, cl.End, cl.Reason, RateText(qcool)))
	if qh > 0 && qcool > 0 && !math.IsInf(qh, 1) {
		a.summary = append(a.summary, fmt.Sprintf("heating/cooling ratio: %.4g (nuclei formed at low temperature on heating grow fast at high temperature)", qh/qcool))
		for _, f := range heatFactors {
			r := f * qh
			p := h.Reach(r, hb.X)
			row := HeatRateRow{Rate: Num(r), Fraction: Num(h.At(h.To, r).Fraction), T: Num(math.NaN()), Time: Num(math.NaN())}
			if p.Reached {
				row.T, row.Time = Num(p.Temp), Num(p.Time)
			}
			a.Rows = append(a.Rows, row)
		}
	}
	return a, nil
}

// dsc is the forward DSC peaks at the rates (K/s).
func (hb heating) dsc(inputs HeatInputs, q *Quenched, rates []float64) *DSC {
	h := hb.Path
	a := &DSC{Inputs: inputs, Quenched: q, ApparentE: Num(math.NaN()), GrowthE: Num(math.NaN()), Flags: hb.Flags.Keys(), heating: hb}
	var beta, tp []float64
	for _, r := range rates {
		p := h.Peak(r)
		a.Peaks = append(a.Peaks, p)
		row := DSCRow{RateMin: Num(60 * r), Rate: Num(r), Onset: Num(math.NaN()), Peak: Num(p.T), PeakC: Num(units.Celsius(p.T)),
			Fraction: Num(p.Fraction), Height: Num(math.Exp(p.LnRate))}
		if p.Onset.Reached {
			row.Onset = Num(p.Onset.Temp)
		}
		switch {
		case !p.Interior:
			row.Peak, row.PeakC, row.Fraction, row.Height = Num(math.NaN()), Num(math.NaN()), Num(math.NaN()), Num(math.NaN())
		case p.Onset.Reached:
			beta, tp = append(beta, r), append(tp, p.T)
		}
		a.Rows = append(a.Rows, row)
	}
	if n := len(a.Rows) - len(tp); n > 0 {
		a.notes = append(a.notes, fmt.Sprintf("%d of the rates never reach the onset (X = %g %%) on the path: no exotherm a calorimeter would show; their dX/dT maximum (if any) is listed and left out of Kissinger's line",
			n, 100*kinetics.OnsetFraction))
	}
	if n := len(tp); n > 0 {
		a.GrowthE = Num(growthEnergy(hb.Model, tp[n/2]))
	}
	if f, err := fit.PeakKissinger(beta, tp, nil); err == nil {
		a.ApparentE = Num(f.E)
		a.summary = append(a.summary, fmt.Sprintf("Kissinger's line on these peaks: apparent E = %.4g kJ/mol; the growth speed's own activation energy at %.2f K is %.4g kJ/mol",
			f.E/1e3, tp[len(tp)/2], float64(a.GrowthE)/1e3))
		a.notes = append(a.notes, PeaksMeaning)
	} else if len(tp) < 2 {
		a.summary = append(a.summary, "Kissinger's line needs peaks at two rates or more inside the path")
	}
	for _, p := range a.Peaks {
		if !p.Interior {
			a.notes = append(a.notes, fmt.Sprintf("— for the peak: dX/dT is largest at an end of the path (%.2f to %.2f K), no peak inside it", h.From, math.Min(h.To, hb.Model.Te())))
			break
		}
	}
	return a
}

// growthEnergy is the growth speed's activation energy at T,
// −R·d ln u/d(1/T), by a central difference of ±0.1 K (J/mol).
func growthEnergy(md *kinetics.Model, T float64) float64 {
	const dT = 0.1
	lo, hi := md.At(T-dT).Growth, md.At(T+dT).Growth
	return -cnt.Gas * (math.Log(hi) - math.Log(lo)) / (1/(T+dT) - 1/(T-dT))
}

// heatSchedule is a schedule of ramps and holds: the path integral along
// it (Schedule.Path, then Model.AlongPath: pathint.go), read at the end of
// every step. The crystals per volume are the running ∫J dt of the path
// integral (its moment M₀), the fraction its running extended volume.
func heatSchedule(in HeatInput) (*HeatSchedule, error) {
	md, s := in.Model, *in.Schedule
	p, err := s.Path()
	if err != nil {
		return nil, err
	}
	lo, hi := s.Span()
	if err := checkGamma(md, lo, math.Min(hi, md.Te())); err != nil {
		return nil, err
	}
	res, sums, err := md.AlongPath(p, in.X)
	if err != nil {
		return nil, err
	}
	inputs := HeatInputs{Material: Describe(in.Card, md), Path: "schedule", From: Num(s.Temp[0]), To: Num(s.Temp[len(s.Temp)-1]),
		Schedule: s.String(), X: Num(in.X)}
	inputs.about = append(inputs.about, "schedule: "+s.String()+" ("+CurveSpan(p)+")", transformLine)
	hb := heating{Model: md, X: in.X, Flags: md.SpanFlags(lo, math.Min(hi, md.Te()))}
	a := &HeatSchedule{Inputs: inputs, Fraction: Num(res.Fraction), Crystals: Num(res.NucleiPerVolume), Flags: hb.Flags.Keys(), heating: hb}
	holds := 0
	for _, st := range s.Steps {
		if st.Kind == kinetics.StepStart {
			continue
		}
		j := pointAt(p.Time, st.End)
		row := StepRow{st.Text, Num(p.Temp[j]), Num(p.Time[j]), Num(math.Exp(sums.LnN[j])), Num(kinetics.Fraction(sums.LnXext[j]))}
		a.Rows = append(a.Rows, row)
		if st.Kind == kinetics.StepHold {
			holds++
			word := "after the first hold"
			if holds > 1 {
				word = fmt.Sprintf("after hold %d", holds)
			}
			a.summary = append(a.summary, fmt.Sprintf("%s (%s): %.4g crystals per m3, fraction %.4g", word, st.Text, float64(row.Crystals), float64(row.Fraction)))
		}
	}
	line := fmt.Sprintf("at the end of the schedule: fraction %.4g, %.4g crystals per m3", res.Fraction, res.NucleiPerVolume)
	if res.Reached {
		line += fmt.Sprintf("; X = %s reached at %.2f K, %s into the schedule", FracLabel(in.X), res.TempReached, ReadableTime(res.TimeReached))
		a.Reached = &TimeAt{Num(res.TempReached), Num(res.TimeReached)}
	} else {
		line += fmt.Sprintf("; X = %s not reached", FracLabel(in.X))
	}
	a.summary = append(a.summary, line)
	if s.Temp[0] < md.Te()*(1-FarBelowTe) {
		a.notes = append(a.notes, "the schedule starts nucleus-free: to carry the nuclei of the cooling that made the glass, start it at Te and write that cooling as its first step")
	}
	return a, nil
}

// pointAt is the last index of times at t.
func pointAt(times []float64, t float64) int {
	j := 0
	for i, x := range times {
		if x <= t {
			j = i
		}
	}
	return j
}

// doc is how every answer of heating reads.
func (hb heating) doc(title string, inputs HeatInputs, table *Table, notes ...string) Doc {
	d := Doc{Title: title, About: inputs.About(), Summary: hb.summary, Table: table}
	d.Notes = append(d.Notes, notes...)
	d.Notes = append(d.Notes, hb.notes...)
	d.Notes = append(d.Notes, "no time lag of nucleation; crystals carried in grow at u(T) from the start and none dissolves")
	if hb.Flags != 0 {
		d.Notes = append(d.Notes, "the path passes through temperatures where:")
		d.Notes = append(d.Notes, FlagNotes(hb.Flags)...)
	}
	d.Notes = append(d.Notes, HeatCaution)
	inputs.mark(&d, "fraction", "peak", "onset")
	return d
}

// HeatCaution is the caution of every answer of heating.
const HeatCaution = Caution + "; hot glass, furnaces and molten material can burn and injure people, and pharmaceutical decisions carry risk to patients"

// Doc is how heating at one rate reads.
func (a *Heat) Doc() Doc {
	return a.doc("undercool heat: linear heating", a.Inputs, tableOf(a.Rows),
		"the table is the state of heating as it passes each temperature: fraction, crystals per m3 and dX/dT (the DSC signal over the heat of crystallization and the heating rate)")
}

// Doc is how the critical heating rate reads.
func (a *HeatCritical) Doc() Doc {
	return a.doc("undercool heat: critical heating rate", a.Inputs, tableOf(a.Rows),
		"the table is heating at rates about the critical one: the fraction at the end of the path and where X is first reached; — where it is not")
}

// Doc is how the DSC peaks read.
func (a *DSC) Doc() Doc {
	return a.doc("undercool heat: DSC peaks", a.Inputs, tableOf(a.Rows),
		fmt.Sprintf("the peak is where dX/dT is largest (the exotherm's maximum: heat flow = dH q dX/dT); the onset is where X reaches %g %%", 100*kinetics.OnsetFraction))
}

// Doc is how a schedule reads.
func (a *HeatSchedule) Doc() Doc {
	return a.doc("undercool heat: schedule", a.Inputs, tableOf(a.Rows),
		"the table is the state at the end of every step: crystals per m3 (the integral of J dt) and the fraction (path integral)")
}
