package answer

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/units"
)

// RateInput asks for the critical nucleus and the steady-state rates of a
// card's model at temperatures.
type RateInput struct {
	Card     *presets.Card
	Model    *kinetics.Model
	Temps    []float64 // K
	Sampling *Sampling // nil: no uncertainty
	Names    Names
}

// Rate is the nucleus and rate table.
type Rate struct {
	Inputs      Material     `json:"inputs"`
	Uncertainty *Uncertainty `json:"uncertainty,omitempty"`
	Rows        []RateRow    `json:"rows"`

	flags  kinetics.Flag
	noRate bool
	names  Names
}

// RateRow is the model at one temperature.
type RateRow struct {
	T             Num     `json:"temperature_k" col:"T (K),f2"`
	TC            Num     `json:"temperature_c" col:"T (°C),f2,3"`
	Undercooling  Num     `json:"undercooling_k" col:"ΔT (K),f2,1"`
	S             *Num    `json:"supersaturation,omitempty" col:"S,g4,1"` // solutions only
	DrivingVolume Num     `json:"driving_force_j_per_m3" col:"Δg (J/m3),g4,4"`
	Radius        Num     `json:"critical_radius_m" col:"r* (nm),nm,1"`
	Size          Num     `json:"critical_size" col:"n*,g4,2"`
	Barrier       Num     `json:"barrier_j" col:"ΔG* (J),g4,4"`
	BarrierKT     Num     `json:"barrier_kt" col:"ΔG*/kT,g4,1"`
	Zeldovich     Num     `json:"zeldovich" col:"Z,g3,4"`
	D             Num     `json:"diffusivity_m2_per_s" col:"D (m2/s),g3,4"`
	Log10J        Num     `json:"log10_rate_per_m3_s" col:"log10 J (m^-3 s^-1),f3"`
	U             Num     `json:"growth_rate_m_per_s" col:"u (m/s),g3"`
	Flags         Strings `json:"flags" col:"flags"`
	// The band of log10 J with spreads.
	P5  *Num `json:"p5_log10_rate_per_m3_s,omitempty" col:"P5 log10 J,f3"`
	P50 *Num `json:"p50_log10_rate_per_m3_s,omitempty" col:"P50 log10 J,f3"`
	P95 *Num `json:"p95_log10_rate_per_m3_s,omitempty" col:"P95 log10 J,f3"`
}

// none turns a value that does not exist (no driving force) into NaN.
func none(x float64, ok bool) Num {
	if !ok || math.IsInf(x, 0) {
		return Num(math.NaN())
	}
	return Num(x)
}

// Rates computes the table, with the band of log10 J at each temperature
// when there are spreads and the model has a rate.
func Rates(in RateInput) (*Rate, error) {
	md := in.Model
	if err := checkGamma(md, in.Temps...); err != nil {
		return nil, err
	}
	a := &Rate{Inputs: Describe(in.Card, md), noRate: !md.HasRate(), names: in.Names}
	sol, isSol := md.Solution()
	for _, T := range in.Temps {
		s := md.At(T)
		a.flags |= s.Flags
		drives := s.Dmu > 0
		kT := cnt.Boltzmann * s.T
		row := RateRow{
			T: Num(s.T), TC: Num(units.Celsius(s.T)), Undercooling: Num(s.Undercooling),
			DrivingVolume: none(s.DrivingVolume(md.Material().Vm), drives),
			Radius:        none(s.Nucleus.Radius, drives), Size: none(s.Nucleus.Size, drives),
			Barrier: none(s.Nucleus.Barrier, drives), BarrierKT: none(s.Nucleus.Barrier/kT, drives),
			Zeldovich: none(s.Nucleus.Zeldovich, drives),
			D:         Num(math.Exp(s.LnD)), Log10J: none(s.Log10J(), true), U: Num(s.Growth),
			Flags: s.Flags.Keys(),
		}
		if isSol {
			S := Num(math.Exp(sol.LnS(T)))
			row.S = &S
		}
		a.Rows = append(a.Rows, row)
	}
	if md.HasRate() {
		heads, eval := rateHeadlines(in.Temps)
		u, err := sampled(in.Sampling, heads, eval, in.Temps)
		if err != nil {
			return nil, err
		}
		a.Uncertainty = u
		for i, b := range u.rowBands(len(a.Rows)) {
			a.Rows[i].P5, a.Rows[i].P50, a.Rows[i].P95 = b[0], b[1], b[2]
		}
	}
	return a, nil
}

// rateHeadlines are the bands of the rate table: log10 J at each row.
func rateHeadlines(temps []float64) ([]headline, func(md *kinetics.Model) ([]float64, error)) {
	heads := make([]headline, len(temps))
	for i := range temps {
		heads[i] = headline{key: "log10_rate_per_m3_s", label: "log10 J", text: plain(3), row: i}
	}
	eval := func(md *kinetics.Model) ([]float64, error) {
		out := make([]float64, len(temps))
		for i, T := range temps {
			out[i] = md.LnJ(T) / math.Ln10
			if math.IsInf(out[i], -1) {
				out[i] = math.Inf(-1) // no nucleation: below every rate
			}
		}
		return out, nil
	}
	return heads, eval
}

// Doc is how the table reads.
func (a *Rate) Doc() Doc {
	d := Doc{Title: "undercool rate: critical nucleus and steady-state rates", About: a.Inputs.About(), Table: tableOf(a.Rows)}
	d.Notes = FlagNotes(a.flags)
	if a.noRate {
		n := a.names
		d.Notes = append(d.Notes, fmt.Sprintf("no rate: the material has no mobility law; give %s with its values, or %s fixed with %s", n.of("mobility"), n.of("prefactor"), n.of("j0")))
	}
	a.Inputs.mark(&d, "log10_rate_per_m3_s", "growth_rate_m_per_s")
	a.Uncertainty.addTo(&d)
	d.Notes = append(d.Notes, Caution)
	return d
}

// FlagNotes explains every validity flag raised.
func FlagNotes(all kinetics.Flag) []string {
	var notes []string
	keys, about := all.Keys(), all.Descriptions()
	for i := range keys {
		notes = append(notes, fmt.Sprintf("flag %s: %s", keys[i], about[i]))
	}
	return notes
}

// The one-line reminders that close every result, each fitting what it
// computed.
const (
	// Caution closes every answer that rests on a nucleation rate or an
	// interfacial energy.
	Caution = "estimates only: rates depend on gamma cubed inside an exponential; process decisions follow local codes, validated procedures and licensed practice"
	// FitCaution closes a fit with no interfacial energy in it (Arrhenius, Avrami).
	FitCaution = "estimates only: a fitted law describes its data within their scatter and range, not beyond; process decisions follow local codes, validated procedures and licensed practice"
	// QuenchCaution closes a quench factor from C-curve constants alone.
	QuenchCaution = "estimates only: a quench factor holds for the alloy, temper and property its C-curve constants were measured for; process decisions follow local codes, validated procedures and licensed practice"
)
