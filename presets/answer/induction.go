package answer

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/presets"
)

// InductionInput asks for the induction time of a volume held at one
// temperature (a vessel of solution, a droplet).
type InductionInput struct {
	Card       *presets.Card
	Model      *kinetics.Model
	T, V, X    float64 // K; m³; the detected fraction of the crystal volume
	VolumeText string  // the volume as given, for the header
	Sampling   *Sampling
	Names      Names
}

// InductionInputs are the inputs of an induction time: the material, the
// volume and where the growth rate came from.
type InductionInputs struct {
	Material
	Volume     Num    `json:"volume_m3"`
	GrowthFrom string `json:"growth_rate_from"` // model, growth_rate (measured) or none
}

// Induction is the induction time of a held volume: the mononuclear wait
// for the first nucleus and the polynuclear time to the fraction, and which
// dominates.
type Induction struct {
	Inputs      InductionInputs `json:"inputs"`
	T           Num             `json:"temperature_k"`
	V           Num             `json:"volume_m3"`
	X           Num             `json:"fraction"`
	S           Num             `json:"supersaturation"`
	LnS         Num             `json:"ln_supersaturation"`
	Mono        Num             `json:"induction_time_s"`
	Poly        Num             `json:"polynuclear_time_s"`
	Dominant    string          `json:"dominant"` // mononuclear, polynuclear, unknown or "" (never)
	Time        Num             `json:"time_s"`
	Never       bool            `json:"never"`
	NeverReason string          `json:"never_reason"`
	Nucleus
	Flags       Strings      `json:"flags"`
	Uncertainty *Uncertainty `json:"uncertainty,omitempty"`

	state      kinetics.State
	polyTime   float64
	volumeText string
	names      Names
}

// Inductions computes the induction times at T, with the band of the
// dominating one when there are spreads.
func Inductions(in InductionInput) (*Induction, error) {
	md, T, V, X := in.Model, in.T, in.V, in.X
	lnU, growthFrom := math.NaN(), "model" // NaN: the model's u(T), a measured growth_rate where given
	switch {
	case md.Material().Growth > 0:
		growthFrom = "growth_rate"
	case !md.HasGrowth():
		growthFrom = "none"
	}
	ind := md.InductionAt(T, V, X, lnU)
	s := ind.State
	drives := s.Dmu > 0
	mono, poly := ind.Mono(), ind.PolyTime()
	lnS := math.NaN()
	if sol, ok := md.Solution(); ok {
		lnS = sol.LnS(T)
	}
	a := &Induction{
		Inputs: InductionInputs{Describe(in.Card, md), Num(V), growthFrom},
		T:      Num(T), V: Num(V), X: Num(X), S: Num(math.Exp(lnS)), LnS: Num(lnS),
		Mono: Num(mono), Poly: Num(poly), Time: Num(ind.Time()), Never: math.IsInf(mono, 1) || math.IsNaN(mono),
		Nucleus: nucleusOf(s), Flags: s.Flags.Keys(),
		state: s, polyTime: poly, volumeText: in.VolumeText, names: in.Names,
	}
	if growthFrom == "none" {
		a.Poly = Num(math.NaN())
	}
	switch {
	case s.Flags&kinetics.FlagOutsideTable != 0:
		a.NeverReason = "the temperature lies outside the solubility table"
	case !drives && !math.IsNaN(lnS):
		a.NeverReason = fmt.Sprintf("S = %.4g <= 1: the solution is not supersaturated, no driving force", math.Exp(lnS))
	case !drives:
		a.NeverReason = fmt.Sprintf("no driving force at or above the equilibrium temperature (%.2f K)", md.Te())
	case a.Never:
		a.NeverReason = "no nucleation at this temperature"
	}
	switch {
	case a.Never:
	case growthFrom == "none":
		a.Dominant = "unknown"
	case ind.Poly:
		a.Dominant = "polynuclear"
	default:
		a.Dominant = "mononuclear"
	}
	heads, eval := inductionHeadlines(T, V, X, lnU)
	var err error
	if a.Uncertainty, err = sampled(in.Sampling, heads, eval, nil); err != nil {
		return nil, err
	}
	return a, nil
}

// inductionHeadlines is the band of the induction time of a volume V held
// at T until X: the longer of the mononuclear and the polynuclear time;
// lnU is the growth rate to use (NaN: the model's own).
func inductionHeadlines(T, V, X, lnU float64) ([]headline, func(*kinetics.Model) ([]float64, error)) {
	heads := []headline{{key: "induction_time_s", label: fmt.Sprintf("induction time at %.2f K", T), log: true, text: ReadableTime, row: -1}}
	eval := func(md *kinetics.Model) ([]float64, error) {
		t := md.InductionAt(T, V, X, lnU).Time()
		if math.IsNaN(t) {
			t = math.Inf(1)
		}
		return []float64{t}, nil
	}
	return heads, eval
}

// Doc is how the induction time reads; a spreadsheet gets it as one row.
func (a *Induction) Doc() Doc {
	s, T := a.state, float64(a.T)
	d := Doc{Title: "undercool hold: induction time of a held volume", About: a.Inputs.About()}
	d.About = append(d.About, fmt.Sprintf("vessel: %s (%.4g m3); detection at the fraction X = %s of the crystal volume", a.volumeText, float64(a.V), FracLabel(float64(a.X))))
	where := KelvinCelsius(T)
	mono := float64(a.Mono)
	if a.Never {
		d.Summary = []string{fmt.Sprintf("induction time at %s: never: %s", where, a.NeverReason)}
	} else {
		d.Summary = []string{
			fmt.Sprintf("induction time, mononuclear (first nucleus, 1/(J V)) at %s: %s (%.4g s)", where, ReadableTime(mono), mono),
			fmt.Sprintf("polynuclear time to X = %s (many nuclei growing, JMAK): %s", FracLabel(float64(a.X)), a.polyText()),
		}
		switch a.Dominant {
		case "unknown":
			d.Summary = append(d.Summary, "dominates: not known without a growth rate; the induction time is at least the mononuclear one")
		case "mononuclear":
			d.Summary = append(d.Summary, "dominates: mononuclear: the wait for the first nucleus in this volume is the longer step")
		default:
			d.Summary = append(d.Summary, "dominates: polynuclear: many nuclei form before any grows to a detectable amount; the growth sets the time")
		}
	}
	if lnS := float64(a.LnS); !math.IsNaN(lnS) {
		d.Summary = append(d.Summary, fmt.Sprintf("supersaturation S = %.4g (ln S = %.4g); driving force %.4g J/mol", math.Exp(lnS), lnS, s.DrivingMole))
	}
	if s.Dmu > 0 {
		kT := cnt.Boltzmann * T
		d.Summary = append(d.Summary, fmt.Sprintf("critical nucleus: radius %.4g nm, %.4g molecules, barrier %.4g J (%.4g kT)",
			s.Nucleus.Radius*1e9, s.Nucleus.Size, s.Nucleus.Barrier, s.Nucleus.Barrier/kT))
	}
	d.Summary = append(d.Summary, "nucleation rate: log10 J = "+Fixed(3)(a.Log10J)+" (J in m^-3 s^-1)")
	d.Summary = append(d.Summary, "growth rate: u = "+Sig(4)(s.Growth)+" m/s ("+a.Inputs.GrowthFrom+")")
	d.Record = &Table{
		Cols: []Col{
			{Head: "T (K)", Key: "temperature_k"}, {Head: "V (m3)", Key: "volume_m3"}, {Head: "S", Key: "supersaturation"},
			{Head: "t_ind (s)", Key: "induction_time_s"}, {Head: "t_poly (s)", Key: "polynuclear_time_s"}, {Head: "dominant", Key: "dominant"},
			{Head: "log10 J", Key: "log10_rate_per_m3_s"}, {Head: "n*", Key: "critical_size"}, {Head: "flags", Key: "flags"},
		},
		Rows: [][]any{{T, float64(a.V), float64(a.S), mono, float64(a.Poly), a.Dominant, float64(a.Log10J), float64(a.Size), []string(a.Flags)}},
	}
	d.Notes = FlagNotes(s.Flags)
	if s.Flags&kinetics.FlagSmallNucleus != 0 {
		d.Notes = append(d.Notes, fmt.Sprintf("the critical nucleus holds %.2g molecules: CNT is outside its range; with an apparent gamma and prefactor fitted to induction times the times are a correlation of those measurements, not a prediction", s.Nucleus.Size))
	}
	d.Notes = append(d.Notes, "induction times: mononuclear 1/(J V), polynuclear [3(-ln(1-X))/(pi J u^3)]^(1/4); the longer one dominates (Kashchiev and van Rosmalen, Cryst. Res. Technol. 38 (2003) 555)")
	a.Inputs.mark(&d)
	a.Uncertainty.addTo(&d)
	d.Notes = append(d.Notes, Caution)
	return d
}

func (a *Induction) polyText() string {
	if a.Inputs.GrowthFrom == "none" {
		return fmt.Sprintf("not known (no growth rate: give %s, a measured crystal growth rate)", a.names.of("growth_rate"))
	}
	if t := a.polyTime; math.IsInf(t, 1) || math.IsNaN(t) {
		return "never"
	} else {
		return fmt.Sprintf("%s (%.4g s)", ReadableTime(t), t)
	}
}
