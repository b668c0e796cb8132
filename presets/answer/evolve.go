package answer

import (
	"context"
	"fmt"
	"math"
	"sort"
	"strings"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/kinetics/population"
	"undercool/presets"
)

// EvolveInput asks how a population of particles in size classes evolves
// along a thermal schedule: the precipitates of an ageing alloy or the
// crystals of a batch crystallizer (the card's presets.Population).
type EvolveInput struct {
	Card     *presets.Card
	System   *presets.Population
	Schedule kinetics.Schedule
	// Times are the output times, s from the start of the schedule,
	// ascending, with the end of the schedule added when they stop short
	// of it (the final state); nil: Rows times, half spread evenly in time over the
	// schedule and half evenly in log time over six decades after the
	// parent first becomes supersaturated, with the start, that onset, the
	// break points and the end.
	Times []float64
	Rows  int // default DefaultEvolveRows
	Bins  int // bins of the final distribution's histogram; default DefaultEvolveBins
	// Options are the numerical settings (MaxClasses, RelTol, ConcTol,
	// Progress); their Times are set from Times and Rows.
	Options population.Options
	// Progress, if set, is called after every output row with the rows
	// done and their number.
	Progress func(done, total int)
	Names    Names
}

// Defaults of an evolve answer.
const (
	DefaultEvolveRows = 25
	DefaultEvolveBins = 20
	// evolveDecades is the span in log time of the default rows.
	evolveDecades = 6
)

// EvolveInputs are the inputs of an evolve answer: the material, the
// system, the schedule as understood and the numerical settings.
type EvolveInputs struct {
	Material
	Alloy        *AlloyUsed        `json:"alloy,omitempty"`
	Crystallizer *CrystallizerUsed `json:"crystallizer,omitempty"`
	Schedule     ScheduleUsed      `json:"schedule"`
	MaxClasses   int               `json:"max_classes"`
	RelTol       Num               `json:"size_tolerance"`
	ConcTol      Num               `json:"balance_tolerance"`
}

// AlloyUsed is the ageing alloy of a run.
type AlloyUsed struct {
	C0      Num `json:"c0"`
	Cp      Num `json:"cp"`
	SolvusA Num `json:"solvus_a"`
	SolvusB Num `json:"solvus_b_k"`
	SolvusT Num `json:"solvus_temperature_k"` // of c0
	Lattice Num `json:"lattice_m"`
	Sites   Num `json:"sites_per_m3"`
}

// CrystallizerUsed is the batch crystallizer of a run.
type CrystallizerUsed struct {
	C0          Num               `json:"c0_mol_per_m3"` // dissolved at the start, per m³ of solvent
	Solubility  string            `json:"solubility"`
	Growth      string            `json:"growth"` // "power" or "diffusion"
	Kg          Num               `json:"growth_kg_m_per_s,omitempty"`
	Order       Num               `json:"growth_order,omitempty"`
	ShapeFactor Num               `json:"kv"`
	Seeds       []population.Seed `json:"seeds"`
	Nucleation  bool              `json:"primary_nucleation"`
}

// ScheduleUsed is the schedule as understood: its text and its steps.
type ScheduleUsed struct {
	Text  string     `json:"text"`
	Steps []StepUsed `json:"steps"`
}

// StepUsed is one step of a schedule.
type StepUsed struct {
	Kind  string `json:"kind" col:"step"`
	Text  string `json:"text" col:"as written"`
	From  Num    `json:"from_k" col:"from (K),f2"`
	To    Num    `json:"to_k" col:"to (K),f2"`
	Start Num    `json:"start_s" col:"starts at,time"`
	End   Num    `json:"end_s" col:"ends at,time"`
}

// EvolveRow is the state at one output time. The system's own columns are
// pointers: an alloy has a mean radius and a matrix concentration, a
// crystallizer a mean size, a concentration and a yield.
type EvolveRow struct {
	Time            Num  `json:"time_s" col:"t (s),g6"`
	Since           Num  `json:"time_supersaturated_s" col:"since S > 1,elapsed"` // null before the parent first became supersaturated
	T               Num  `json:"temperature_k" col:"T (K),f2"`
	NumberDensity   Num  `json:"number_density_per_m3" col:"N (m^-3),g4" result:"number density"`
	MeanRadius      *Num `json:"mean_radius_m,omitempty" col:"mean r (nm),nm"`
	MeanSize        *Num `json:"mean_size_m,omitempty" col:"mean L (um),um"`
	VolumeFraction  Num  `json:"volume_fraction" col:"f_v,g4" result:"volume fraction"`
	Matrix          *Num `json:"matrix_concentration,omitempty" col:"matrix c,g4"`
	Concentration   *Num `json:"concentration_mol_per_m3,omitempty" col:"C (mol/m3),g5"`
	Supersaturation Num  `json:"supersaturation" col:"S,g4"`
	Yield           *Num `json:"yield,omitempty" col:"yield,f4"`
	Log10Rate       Num  `json:"log10_rate_per_m3_s" col:"log10 J,log10"`
	CriticalRadius  Num  `json:"critical_radius_m" col:"r* (nm),nm"`
}

// HistogramBin is one bin of the final distribution: sizes from and to
// (m), the particles in it per m³, and its share of their volume.
type HistogramBin struct {
	Lo     Num `json:"from_m"`
	Hi     Num `json:"to_m"`
	Number Num `json:"number_per_m3"`
	Volume Num `json:"volume_share"`
}

// Evolve is a run of a population along a schedule: the time table, the
// final distribution (every class, and a histogram in log size), the
// volume-weighted D10, D50 and D90 of a crystallizer, the yield and the
// closure of the solute balance.
type Evolve struct {
	Inputs           EvolveInputs       `json:"inputs"`
	System           string             `json:"system"` // "alloy" or "crystallizer"
	Rows             []EvolveRow        `json:"rows"`
	Final            []population.Class `json:"final_distribution"`
	Histogram        []HistogramBin     `json:"histogram"`
	D10              *Num               `json:"d10_m,omitempty"`
	D50              *Num               `json:"d50_m,omitempty"`
	D90              *Num               `json:"d90_m,omitempty"`
	Yield            Num                `json:"yield" result:"yield"` // of the solute dissolved at the start, now in particles
	EquilibriumYield Num                `json:"equilibrium_yield"`    // at the final temperature
	Balance          Num                `json:"solute_balance_error"`
	Steps            int                `json:"steps"`
	PeakClasses      int                `json:"peak_classes"`
	SmallestNucleus  Num                `json:"smallest_nucleus"` // fewest molecules in a critical nucleus while nucleating (J ≥ 1 m⁻³ s⁻¹); null: none
	// Onset is when the parent as charged first became supersaturated
	// along the schedule (s, schedule time); null: never.
	Onset Num `json:"supersaturated_at_s"`

	// Kind is the size a distribution is measured by: "radius" (alloy) or
	// "size" (crystallizer, the length L).
	Kind string `json:"-"`
	sch  kinetics.Schedule
	card *presets.Card
}

// Evolves runs the population along the schedule. Errors: an output time
// outside the schedule (an *InputError on "times"), a solubility law
// without a value on the schedule, a run that cannot meet its tolerances
// (population.ErrStepUnderflow, ErrTooManySteps), or the context's error.
func Evolves(ctx context.Context, in EvolveInput) (*Evolve, error) {
	s := in.Schedule
	onset := firstSupersaturated(s, in.System.Supersaturated)
	times, err := evolveTimes(s, onset, in.Times, in.Rows)
	if err != nil {
		return nil, &InputError{Input: "times", Err: err}
	}
	opt := in.Options
	opt.Times = times
	if in.Progress != nil {
		done := 0
		opt.Progress = func(population.Progress) { done++; in.Progress(done, len(times)) }
	}
	md := in.System.Model
	a := &Evolve{sch: s, card: in.Card, Onset: Num(onset)}
	a.Inputs = EvolveInputs{Material: Describe(in.Card, md), Schedule: scheduleUsed(s),
		MaxClasses: orInt(opt.MaxClasses, population.DefaultMaxClasses),
		RelTol:     Num(orFloat(opt.RelTol, population.DefaultRelTol)), ConcTol: Num(orFloat(opt.ConcTol, population.DefaultConcTol))}
	var v float64 // volume per molecule of the particles, m³
	switch sys := in.System; {
	case sys.Alloy != nil:
		res, err := sys.Alloy.Run(ctx, s, opt)
		if err != nil {
			return nil, err
		}
		a.alloy(sys.Alloy, res)
		v = sys.Alloy.Vm / cnt.Avogadro
	case sys.Crystallizer != nil:
		x := sys.Crystallizer
		res, err := x.Run(ctx, s, opt)
		if err != nil {
			return nil, err
		}
		a.crystallizer(x, res)
		v = x.Nucleus.Vm / cnt.Avogadro
	default:
		panic("answer: Evolves: no system")
	}
	a.Histogram = histogram(a.Final, orInt(in.Bins, DefaultEvolveBins))
	for i := range a.Rows {
		a.Rows[i].Since = Num(math.NaN())
		if t := float64(a.Rows[i].Time); t >= onset {
			a.Rows[i].Since = Num(t - onset)
		}
	}
	a.SmallestNucleus = Num(math.Inf(1))
	for _, r := range a.Rows {
		if float64(r.Log10Rate) >= 0 {
			rs := float64(r.CriticalRadius)
			a.SmallestNucleus = Num(math.Min(float64(a.SmallestNucleus), 4*math.Pi/3*rs*rs*rs/v))
		}
	}
	return a, nil
}

func orInt(x, def int) int {
	if x == 0 {
		return def
	}
	return x
}

func orFloat(x, def float64) float64 {
	if x == 0 {
		return def
	}
	return x
}

// firstSupersaturated is the first time along the schedule at which sat
// holds (to 1e-9 of the duration; the solubility is taken monotonic in
// temperature, so within a straight piece the time is found by
// bisection); NaN if it never does.
func firstSupersaturated(s kinetics.Schedule, sat func(T float64) bool) float64 {
	for i, t := range s.Time {
		if sat(s.Temp[i]) {
			if i == 0 || s.Time[i-1] == t {
				return t
			}
			lo, hi := s.Time[i-1], t
			for hi-lo > 1e-9*s.Duration() {
				mid := (lo + hi) / 2
				if sat(s.At(mid)) {
					hi = mid
				} else {
					lo = mid
				}
			}
			return hi
		}
	}
	return math.NaN()
}

// evolveTimes are the absolute output times: the given ones after the
// schedule's start, and its end, or n more: half spread evenly in time over the
// schedule (the course of a cooling, of coarsening), half evenly in log
// time over six decades after the onset of supersaturation, or the start
// without one (the nucleation after a quench); with the start, the onset,
// the break points and the end.
func evolveTimes(s kinetics.Schedule, onset float64, given []float64, n int) ([]float64, error) {
	t0, d := s.Start(), s.Duration()
	if given != nil {
		out := make([]float64, len(given))
		for i, t := range given {
			switch {
			case !(t >= 0) || t > d*(1+1e-12):
				return nil, fmt.Errorf("%s is outside the schedule, which lasts %s", ReadableTime(t), ReadableTime(d))
			case i > 0 && !(t > given[i-1]):
				return nil, fmt.Errorf("the times must increase: %s comes after %s", ReadableTime(t), ReadableTime(given[i-1]))
			}
			out[i] = math.Min(t0+t, s.End())
		}
		if out[len(out)-1] < s.End()*(1-1e-12) {
			out = append(out, s.End()) // the final state is at the end
		}
		return out, nil
	}
	if n == 0 {
		n = DefaultEvolveRows
	}
	out := append([]float64{t0, s.End()}, s.Breaks()...)
	base := t0
	if onset > t0 && onset < s.End() {
		base = onset
		out = append(out, onset)
	}
	nlog := n / 2
	for k := range nlog {
		f := -evolveDecades + evolveDecades*float64(k)/float64(max(nlog-1, 1))
		out = append(out, base+(s.End()-base)*math.Pow(10, f))
	}
	for k := 1; k <= n-nlog; k++ {
		out = append(out, t0+d*float64(k)/float64(n-nlog))
	}
	sort.Float64s(out)
	uniq := out[:0]
	for _, t := range out {
		if len(uniq) == 0 || t-uniq[len(uniq)-1] > 1e-9*math.Max(d, math.Abs(t)) {
			uniq = append(uniq, t)
		}
	}
	uniq[len(uniq)-1] = s.End()
	return uniq, nil
}

func scheduleUsed(s kinetics.Schedule) ScheduleUsed {
	u := ScheduleUsed{Text: s.String()}
	for _, st := range s.Steps {
		u.Steps = append(u.Steps, StepUsed{Kind: st.Kind.String(), Text: st.Text, From: Num(st.From), To: Num(st.To), Start: Num(st.Start), End: Num(st.End)})
	}
	return u
}

func numPtr(x float64) *Num { n := Num(x); return &n }

// alloy fills the answer from an alloy's run.
func (a *Evolve) alloy(al *population.Alloy, res *population.AlloyResult) {
	a.System, a.Kind = "alloy", "radius"
	sv := al.Solvus.(population.Solvus)
	a.Inputs.Alloy = &AlloyUsed{C0: Num(al.C0), Cp: Num(al.Cp), SolvusA: Num(sv.A), SolvusB: Num(sv.B), SolvusT: Num(sv.Temperature(al.C0)),
		Lattice: Num(orFloat(al.Lattice, math.Cbrt(al.Vm/cnt.Avogadro))), Sites: Num(orFloat(al.Sites, cnt.Avogadro/al.Vm))}
	for _, r := range res.Rows {
		a.Rows = append(a.Rows, EvolveRow{Time: Num(r.Time), T: Num(r.Temperature), NumberDensity: Num(r.NumberDensity),
			MeanRadius: numPtr(r.MeanRadius), VolumeFraction: Num(r.VolumeFraction), Matrix: numPtr(r.Matrix),
			Supersaturation: Num(r.Supersaturation), Log10Rate: Num(r.Log10Rate), CriticalRadius: Num(r.CriticalRadius)})
	}
	a.common(res.Summary)
	last := res.Rows[len(res.Rows)-1]
	a.Yield = Num(last.VolumeFraction * al.Cp / al.C0)
	ceq := math.Exp(al.Solvus.LnSolubility(last.Temperature))
	a.EquilibriumYield = Num(math.Max(0, (al.C0-ceq)/(al.Cp-ceq)) * al.Cp / al.C0)
}

// crystallizer fills the answer from a crystallizer's run.
func (a *Evolve) crystallizer(x *population.Crystallizer, res *population.CrystalResult) {
	a.System, a.Kind = "crystallizer", "size"
	u := &CrystallizerUsed{C0: Num(x.C0), Solubility: solubilityName(x.Solubility), ShapeFactor: Num(orFloat(x.ShapeFactor, math.Pi/6)),
		Seeds: append([]population.Seed{}, x.Seeds...), Nucleation: !x.NoNucleation}
	if x.Growth.Law == population.GrowthPower {
		u.Growth, u.Kg, u.Order = "power", Num(x.Growth.Kg), Num(x.Growth.Order)
	} else {
		u.Growth = "diffusion"
	}
	a.Inputs.Crystallizer = u
	for _, r := range res.Rows {
		a.Rows = append(a.Rows, EvolveRow{Time: Num(r.Time), T: Num(r.Temperature), NumberDensity: Num(r.NumberDensity),
			MeanSize: numPtr(r.MeanSize), VolumeFraction: Num(r.VolumeFraction), Concentration: numPtr(r.Concentration),
			Supersaturation: Num(r.Supersaturation), Yield: numPtr(r.Yield), Log10Rate: Num(r.Log10Rate), CriticalRadius: Num(r.CriticalRadius)})
	}
	a.common(res.Summary)
	a.D10, a.D50, a.D90 = numPtr(res.D10), numPtr(res.D50), numPtr(res.D90)
	a.Yield = Num(res.Yield)
	last := res.Rows[len(res.Rows)-1]
	a.EquilibriumYield = Num(math.Max(0, (x.C0-last.Solubility)/x.C0))
}

func (a *Evolve) common(s population.Summary) {
	a.Final = s.Final
	if a.Final == nil {
		a.Final = []population.Class{}
	}
	a.Balance, a.Steps, a.PeakClasses = Num(s.Balance), s.Steps, s.PeakClasses
}

// solubilityName says which solubility law a crystallizer follows.
func solubilityName(s population.Solubility) string {
	switch l := s.(type) {
	case population.VantHoffSolubility:
		return fmt.Sprintf("van 't Hoff, saturated at %.2f K, dh_sol %.4g kJ/mol", l.Law.Tsat, l.Law.DHsol/1e3)
	case *cnt.SolubilityTable:
		return "table " + l.Label
	}
	return fmt.Sprintf("%T", s)
}

// histogram sorts the classes into bins of equal width in log size
// (population.Histogram), each with its share of the particles' volume.
func histogram(cs []population.Class, k int) []HistogramBin {
	bins := population.Histogram(cs, k)
	out := make([]HistogramBin, len(bins))
	if len(bins) == 0 {
		return out
	}
	var total float64
	vol := make([]float64, len(bins))
	lo, step := bins[0].Lo, math.Log(bins[0].Hi/bins[0].Lo)
	for _, c := range cs {
		v := c.Number * c.Size * c.Size * c.Size
		total += v
		i := max(0, min(int(math.Log(c.Size/lo)/step), k-1)) // as population.Histogram bins it
		vol[i] += v
	}
	for i, b := range bins {
		out[i] = HistogramBin{Lo: Num(b.Lo), Hi: Num(b.Hi), Number: Num(b.Number), Volume: Num(vol[i] / total)}
	}
	return out
}

// sizeUnit is how a distribution's sizes read: nm for precipitates, µm for crystals.
func (a *Evolve) sizeUnit() (string, func(any) string) {
	if a.System == "alloy" {
		return "nm", formats["nm"]
	}
	return "um", formats["um"]
}

// HistogramTable is the histogram of the final distribution as a table.
func (a *Evolve) HistogramTable() Table {
	unit, size := a.sizeUnit()
	t := Table{Title: fmt.Sprintf("final distribution, %s in %d bins of equal width in log %s", a.Kind, len(a.Histogram), a.Kind),
		Cols: []Col{{Head: fmt.Sprintf("from (%s)", unit), Key: "from_m", Text: size}, {Head: fmt.Sprintf("to (%s)", unit), Key: "to_m", Text: size},
			{Head: "number (m^-3)", Key: "number_per_m3", Text: Sig(4)}, {Head: "volume share", Key: "volume_share", Text: Fixed(4)}}}
	for _, b := range a.Histogram {
		t.Rows = append(t.Rows, []any{float64(b.Lo), float64(b.Hi), float64(b.Number), float64(b.Volume)})
	}
	return t
}

// Doc is how the run reads: the inputs, the final state, the time table,
// the final distribution and the schedule as understood, with the model's
// assumptions and the cautions.
func (a *Evolve) Doc() Doc {
	d := Doc{Title: "undercool evolve: particles in size classes along a thermal schedule", About: a.about()}
	d.Summary = a.summary()
	d.Table = tableOf(a.Rows)
	if len(a.Histogram) > 0 {
		d.Tables = append(d.Tables, a.HistogramTable())
	}
	steps := *tableOf(a.Inputs.Schedule.Steps)
	steps.Title = "schedule as understood"
	d.Tables = append(d.Tables, steps)
	d.Notes = a.notes()
	a.Inputs.mark(&d, "number_density", "mean_radius", "mean_size", "volume_fraction")
	return d
}

// about are the header lines: the material, the system, the schedule and
// the numerics.
func (a *Evolve) about() []string {
	in := a.Inputs
	about := append([]string{}, in.Material.About()...)
	if a.card.Description != "" {
		about = append(about, "card: "+a.card.Description)
	}
	if al := in.Alloy; al != nil {
		about = append(about, fmt.Sprintf("alloy: c0 = %.4g, precipitate cp = %.4g (solute mole fractions); solvus ln c_eq = %.5g - %.5g K/T, c0 dissolves above %.2f K; lattice parameter %.4g nm; %.4g nucleation sites per m3",
			float64(al.C0), float64(al.Cp), float64(al.SolvusA), float64(al.SolvusB), float64(al.SolvusT), float64(al.Lattice)*1e9, float64(al.Sites)))
	}
	if x := in.Crystallizer; x != nil {
		growth := "diffusion-limited, dL/dt = 4 pi r_v D V_m (C - C_sat)/(3 k_v L^2)"
		if x.Growth == "power" {
			growth = fmt.Sprintf("G = k_g (S - 1)^g with k_g = %.4g m/s, g = %.4g", float64(x.Kg), float64(x.Order))
		}
		nuc := "primary nucleation by CNT"
		if !x.Nucleation {
			nuc = "no primary nucleation (the card has no rate model): seeded growth only"
		}
		seeds := "unseeded"
		if len(x.Seeds) > 0 {
			s := x.Seeds[0]
			seeds = fmt.Sprintf("seeded with %.4g kg/m3 of %.4g um crystals", s.Mass, s.Size*1e6)
		}
		about = append(about, fmt.Sprintf("crystallizer: %.5g mol per m3 of solvent dissolved at the start; solubility %s; growth %s; k_v = %.4g; %s; %s",
			float64(x.C0), x.Solubility, growth, float64(x.ShapeFactor), nuc, seeds))
	}
	lo, hi := a.sch.Span()
	about = append(about, fmt.Sprintf("schedule: %s (%s, %.2f to %.2f K)", in.Schedule.Text, ReadableTime(a.sch.Duration()), lo, hi),
		fmt.Sprintf("numerics: Lagrangian size classes, at most %d; adaptive Heun steps with size tolerance %.3g and solute-balance tolerance %.3g per step", in.MaxClasses, float64(in.RelTol), float64(in.ConcTol)))
	return about
}

func (a *Evolve) summary() []string {
	last := a.Rows[len(a.Rows)-1]
	unit, size := a.sizeUnit()
	var out []string
	mean := last.MeanRadius
	what := "mean radius"
	if mean == nil {
		mean, what = last.MeanSize, "mean size L"
	}
	end := fmt.Sprintf("at the end (%s, %s): ", ReadableTime(float64(last.Time)-a.sch.Start()), KelvinCelsius(float64(last.T)))
	if len(a.Final) == 0 {
		out = append(out, end+"no particles; supersaturation "+Sig(4)(last.Supersaturation))
	} else {
		out = append(out, end+fmt.Sprintf("%s particles per m3, %s %s %s, volume fraction %s, supersaturation %s",
			Sig(4)(last.NumberDensity), what, size(*mean), unit, Sig(4)(last.VolumeFraction), Sig(4)(last.Supersaturation)))
	}
	if a.D50 != nil {
		out = append(out, fmt.Sprintf("crystal size distribution by volume: D10 = %s um, D50 = %s um, D90 = %s um", formats["um"](*a.D10), formats["um"](*a.D50), formats["um"](*a.D90)))
	}
	out = append(out, fmt.Sprintf("yield: %s of the solute dissolved at the start is in particles (%s at equilibrium at the final temperature)", Fixed(4)(a.Yield), Fixed(4)(a.EquilibriumYield)),
		fmt.Sprintf("solute balance closes to %.2g (relative); %d steps, at most %d classes at once", float64(a.Balance), a.Steps, a.PeakClasses))
	return out
}

// modelNote says what an evolve run assumes, by system.
func (a *Evolve) modelNote() string {
	if a.System == "alloy" {
		return "model: spherical precipitates of fixed composition in a dilute binary matrix of the same volume per atom; classical homogeneous nucleation at the sites with the incubation factor exp(-tau/t), tau = 1/(2 pi Z^2 beta*), and beta* = 4 pi r*^2 D c/a^4; growth by solute diffusion with the Gibbs-Thomson solubility at the interface; coarsening is not added but follows (Kampmann and Wagner 1984; Myhr and Grong 2000; Perez, Dumont and Acevedo-Reyes 2008). Left out: elastic strain, the composition of early clusters, quenched-in vacancies, nucleation on dislocations and grain boundaries, loss of coherency"
	}
	return "model: a well-mixed batch with the solute balance per volume of solvent; primary nucleation by CNT (no secondary nucleation, breakage or agglomeration); the growth law above, the same for every crystal; crystals born just above the critical size (Randolph and Larson 1988 for the population balance)"
}

func (a *Evolve) notes() []string {
	notes := []string{a.modelNote()}
	if n := float64(a.SmallestNucleus); n < 10 {
		notes = append(notes, fmt.Sprintf("flag small_nucleus: while nucleating, the critical nucleus held as few as %.3g molecules; CNT is outside its range below about 10", n))
	}
	switch {
	case math.IsNaN(float64(a.Onset)):
		notes = append(notes, "the "+map[string]string{"alloy": "alloy", "crystallizer": "solution"}[a.System]+" as charged is never supersaturated along the schedule: nothing can form")
	case math.IsInf(float64(a.SmallestNucleus), 1) && len(a.Final) == 0:
		notes = append(notes, "nothing nucleated along the schedule (the rate stayed below 1 per m3 per s)")
	}
	notes = append(notes, "sizes: "+a.Kind+" of the particles; numbers per m3 of "+map[string]string{"alloy": "alloy", "crystallizer": "solvent"}[a.System])
	notes = append(notes, Caution)
	return notes
}

// textTable is a table with its cells as text, for a memo.
func (a *Evolve) textTable(t Table) Table {
	out := Table{Title: t.Title}
	for _, c := range t.Cols {
		out.Cols = append(out.Cols, text(c.Head))
	}
	for _, r := range t.Rows {
		row := make([]any, len(r))
		for i, v := range r {
			row[i] = t.Cols[i].Cell(v)
		}
		out.Rows = append(out.Rows, row)
	}
	return out
}

// memoBlocks are the section of a memo on the run: the question, the
// final state, the time table, the figure and the cautions.
func (a *Evolve) memoBlocks(plot string) []Block {
	bs := []Block{Heading(2, "Particles along the schedule (evolve)")}
	bs = append(bs, List(a.about()[len(a.Inputs.Material.About()):]...), List(a.summary()...), Para("Time table:"), TableBlock(a.textTable(*tableOf(a.Rows))))
	if len(a.Histogram) > 0 {
		h := a.HistogramTable()
		bs = append(bs, Para(strings.ToUpper(h.Title[:1])+h.Title[1:]+":"), TableBlock(a.textTable(h)))
	}
	if plot != "" {
		bs = append(bs, Para(fmt.Sprintf("![Particles of %s along the schedule](%s)", a.card.Name, plot)),
			Para("Against log time since the parent became supersaturated: the number density, the mean "+a.Kind+", the volume fraction and the supersaturation; below, where there are particles at the end, their distribution as a histogram in log "+a.Kind+"."))
	}
	var cautions []string
	for _, n := range a.notes() {
		if n != Caution {
			cautions = append(cautions, n)
		}
	}
	return append(bs, List(cautions...))
}
