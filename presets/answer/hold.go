package answer

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/presets"
)

// HoldInput asks for the time to reach a fraction in an isothermal hold.
type HoldInput struct {
	Card     *presets.Card
	Model    *kinetics.Model
	T, X     float64 // K; the fraction, in (0, 1)
	JMAK     kinetics.JMAK
	Sampling *Sampling
}

// Hold is the time to a fraction at one temperature, with the rates and
// the critical nucleus there.
type Hold struct {
	Inputs      TransformInputs `json:"inputs"`
	T           Num             `json:"temperature_k"`
	X           Num             `json:"fraction"`
	Time        Num             `json:"time_s"` // null: never
	Never       bool            `json:"never"`
	NeverReason string          `json:"never_reason"`
	Nucleus
	Lag         Num          `json:"time_lag_s"`
	Flags       Strings      `json:"flags"`
	Uncertainty *Uncertainty `json:"uncertainty,omitempty"`

	State kinetics.State `json:"-"` // the model at T
	j     kinetics.JMAK
	flags kinetics.Flag
}

// Holds computes the time to X at T, with its band when there are spreads.
func Holds(in HoldInput) (*Hold, error) {
	md, T, X, j := in.Model, in.T, in.X, in.JMAK
	if err := checkGamma(md, T); err != nil {
		return nil, err
	}
	s, av := md.Isothermal(T, j)
	lnt := av.LnTime(X)
	t, _ := Seconds(lnt)
	a := &Hold{
		Inputs: TransformInputs{Describe(in.Card, md), describeJMAK(j)},
		T:      Num(T), X: Num(X), Time: Num(t), Never: math.IsInf(t, 1) || math.IsNaN(t),
		Nucleus: nucleusOf(s), Lag: Num(math.NaN()), Flags: s.Flags.Keys(),
		State: s, j: j, flags: s.Flags,
	}
	if j.Nuclei == 0 && s.Dmu > 0 {
		a.Lag = Num(s.TimeLag())
	}
	if j.Nuclei > 0 {
		a.Log10J = Num(math.NaN())
	}
	if a.Never {
		a.NeverReason = neverReason(md, s, j, lnt)
	}
	heads, eval := holdHeadlines(T, X, j)
	var err error
	if a.Uncertainty, err = sampled(in.Sampling, heads, eval, nil); err != nil {
		return nil, err
	}
	return a, nil
}

// Nucleus is the model at the temperature of an answer: the undercooling,
// the critical nucleus (null without a driving force) and the rates.
type Nucleus struct {
	Undercooling Num `json:"undercooling_k"`
	Radius       Num `json:"critical_radius_m"`
	Size         Num `json:"critical_size"`
	Barrier      Num `json:"barrier_j"`
	BarrierKT    Num `json:"barrier_kt"`
	Log10J       Num `json:"log10_rate_per_m3_s"`
	Growth       Num `json:"growth_rate_m_per_s"`
}

func nucleusOf(s kinetics.State) Nucleus {
	drives := s.Dmu > 0
	return Nucleus{
		Undercooling: Num(s.Undercooling),
		Radius:       none(s.Nucleus.Radius, drives), Size: none(s.Nucleus.Size, drives),
		Barrier: none(s.Nucleus.Barrier, drives), BarrierKT: none(s.Nucleus.Barrier/(cnt.Boltzmann*s.T), drives),
		Log10J: none(s.Log10J(), true), Growth: Num(s.Growth),
	}
}

// neverReason says why a hold never reaches its fraction.
func neverReason(md *kinetics.Model, s kinetics.State, j kinetics.JMAK, lnt float64) string {
	switch {
	case s.Flags&kinetics.FlagOutsideTable != 0:
		return "the temperature lies outside the tabulated driving force"
	case !(s.Dmu > 0) && !md.HasTe():
		return "no driving force"
	case !(s.Dmu > 0):
		return fmt.Sprintf("no driving force at or above the equilibrium temperature (T_e = %.2f K)", md.Te())
	case s.Flags&kinetics.FlagNoMobility != 0:
		return "no mobility: below the temperature where the viscosity law diverges"
	case s.Flags&kinetics.FlagOutsideGrowthTable != 0:
		return "no growth: the temperature lies outside the measured growth-rate table"
	case j.Nuclei == 0 && math.IsInf(s.LnJ, -1):
		return "no nucleation at this temperature"
	case !math.IsInf(lnt, 1):
		return "the time is beyond 1.8e308 s"
	}
	return "nothing transforms at this temperature"
}

// holdHeadlines is the band of a hold: the time to X at T.
func holdHeadlines(T, X float64, j kinetics.JMAK) ([]headline, func(*kinetics.Model) ([]float64, error)) {
	heads := []headline{{key: "time_s", label: fmt.Sprintf("time to X = %s at %.2f K", FracLabel(X), T), log: true, text: ReadableTime, row: -1}}
	eval := func(md *kinetics.Model) ([]float64, error) {
		_, a := md.Isothermal(T, j)
		t, _ := Seconds(a.LnTime(X))
		if math.IsNaN(t) {
			t = math.Inf(1)
		}
		return []float64{t}, nil
	}
	return heads, eval
}

// Doc is how the hold reads: the time, the nucleus and the rates; a
// spreadsheet gets them as one row.
func (a *Hold) Doc() Doc {
	s, T, t := a.State, float64(a.T), float64(a.Time)
	d := Doc{Title: "undercool hold: time to transform at one temperature", About: a.Inputs.about()}
	answer := fmt.Sprintf("time to X = %s at %s: %s", FracLabel(float64(a.X)), KelvinCelsius(T), ReadableTime(t))
	if !a.Never && t >= 60 {
		answer += fmt.Sprintf(" (%.4g s)", t)
	}
	if a.Never {
		answer += ": " + a.NeverReason
	}
	d.Summary = []string{answer}
	if s.Dmu > 0 {
		kT := cnt.Boltzmann * T
		d.Summary = append(d.Summary,
			fmt.Sprintf("undercooling %.2f K; driving force %.4g J/mol", s.Undercooling, s.DrivingMole),
			// near absolute zero the size and barrier/kT overflow: the dash, as in the tables
			fmt.Sprintf("critical nucleus: radius %s nm, %s molecules, barrier %s J (%s kT)",
				Sig(4)(s.Nucleus.Radius*1e9), Sig(4)(s.Nucleus.Size), Sig(4)(s.Nucleus.Barrier), Sig(4)(s.Nucleus.Barrier/kT)))
	} else {
		d.Summary = append(d.Summary, fmt.Sprintf("undercooling %.2f K: no driving force, no nucleus", s.Undercooling))
	}
	if a.j.Nuclei > 0 {
		d.Summary = append(d.Summary, fmt.Sprintf("nuclei: %.4g per m3, present from the start", a.j.Nuclei))
	} else {
		d.Summary = append(d.Summary, "nucleation rate: log10 J = "+Fixed(3)(a.Log10J)+" (J in m^-3 s^-1)")
	}
	d.Summary = append(d.Summary, "growth rate: u = "+Sig(4)(s.Growth)+" m/s")
	if a.j.Lag {
		d.Summary = append(d.Summary, "time lag: "+ReadableTime(float64(a.Lag))+" (included in the time)")
	}
	d.Record = &Table{
		Cols: []Col{
			{Head: "T (K)", Key: "temperature_k"}, {Head: "X", Key: "fraction"}, {Head: "time (s)", Key: "time_s"},
			{Head: "log10 J", Key: "log10_rate_per_m3_s"}, {Head: "u", Key: "growth_rate_m_per_s"},
			{Head: "r*", Key: "critical_radius_m"}, {Head: "n*", Key: "critical_size"}, {Head: "ΔG*", Key: "barrier_j"},
			{Head: "tau", Key: "time_lag_s"}, {Head: "flags", Key: "flags"},
		},
		Rows: [][]any{{T, float64(a.X), t, float64(a.Log10J), s.Growth, float64(a.Radius), float64(a.Size), float64(a.Barrier), float64(a.Lag), []string(a.Flags)}},
	}
	d.Notes = FlagNotes(a.flags)
	if a.j.Lag {
		d.Notes = append(d.Notes, LagNote)
	}
	a.Inputs.mark(&d)
	a.Uncertainty.addTo(&d)
	d.Notes = append(d.Notes, Caution)
	return d
}
