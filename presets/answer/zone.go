package answer

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// DefaultZoneEnd is where a cooled solution's path ends unless told, as a
// fraction of the saturation temperature (about 60 K below a solution
// saturated at room temperature; common practice for a search range).
const DefaultZoneEnd = 0.8

// ZoneInput asks for the metastable zone of a solution cooled at rates from
// its saturation temperature: where the first nucleus appears in a volume.
type ZoneInput struct {
	Card       *presets.Card
	Model      *kinetics.Model // with a solution driving force
	V          float64         // m³
	VolumeText string          // the volume as given, for the header
	Rates      []float64       // K/s
	End        float64         // K; 0: the default end
	EndText    string          // End as given, for messages
	Names      Names
}

// InputError is an input the caller gave that does not fit the material.
type InputError struct {
	Input string // its name, e.g. "end"
	Err   error
}

func (e *InputError) Error() string { return e.Input + ": " + e.Err.Error() }
func (e *InputError) Unwrap() error { return e.Err }

// ZoneInputs are the inputs of a metastable zone.
type ZoneInputs struct {
	Material
	V   Num `json:"volume_m3"`
	End Num `json:"end_temperature_k"`
}

// Zone is the metastable zone width at each cooling rate.
type Zone struct {
	Inputs ZoneInputs `json:"inputs"`
	*ZoneOnset
	Order *Num      `json:"nyvlt_order,omitempty"` // of q ∝ ΔT_max^m, from two or more widths
	Rows  []ZoneRow `json:"rows"`

	about, summary, notes []string
	flags                 kinetics.Flag
}

// ZoneOnset is the onset of the one rate asked for.
type ZoneOnset struct {
	T     Num `json:"onset_temperature_k"`
	Width Num `json:"onset_undercooling_k"`
	S     Num `json:"supersaturation_at_onset"`
	Rate  Num `json:"cooling_rate_k_per_s"`
}

// ZoneRow is the onset at one rate; NaN where none is reached on the path.
type ZoneRow struct {
	RateMin Num     `json:"cooling_rate_k_per_min" col:"rate (K/min),g4"`
	Rate    Num     `json:"cooling_rate_k_per_s" col:"rate (K/s),g4,2"`
	T       Num     `json:"onset_temperature_k" col:"onset T (K),f2"`
	TC      Num     `json:"onset_temperature_c" col:"onset T (°C),f2,2"`
	Width   Num     `json:"onset_undercooling_k" col:"ΔT_max (K),f3"`
	S       Num     `json:"supersaturation_at_onset" col:"S at onset,g4"`
	Time    Num     `json:"onset_time_s" col:"time (s),g4,1"`
	Size    Num     `json:"critical_size_at_onset" col:"n* at onset,g3,1"`
	Flags   Strings `json:"flags" col:"flags"`
}

// Zones computes the onset at each rate. Errors: an end not below the
// saturation temperature, or below a solubility table (*InputError).
func Zones(in ZoneInput) (*Zone, error) {
	md := in.Model
	sol, _ := md.Solution()
	tsat := md.Te()
	end, why := DefaultZoneEnd*tsat, fmt.Sprintf("default %.2g T_sat; give %s to change it", DefaultZoneEnd, in.Names.of("end"))
	tab, isTable := sol.(*cnt.SolubilityTable)
	if isTable && tab.T[0] > end {
		end, why = tab.T[0], "the coldest row of the solubility table"
	}
	if in.End > 0 {
		end, why = in.End, in.Names.of("end")
		if !(end < tsat) {
			return nil, &InputError{"end", fmt.Errorf("%s is not below the saturation temperature %s: the path starts at saturation and cools from there", in.EndText, KelvinCelsius(tsat))}
		}
		if isTable && end < tab.T[0] {
			return nil, &InputError{"end", fmt.Errorf("%s is below the solubility table %s, which starts at %.2f K", in.EndText, tab.Label, tab.T[0])}
		}
	}
	a := &Zone{Inputs: ZoneInputs{Describe(in.Card, md), Num(in.V), Num(end)}}
	a.about = append(a.Inputs.About(),
		fmt.Sprintf("path: linear cooling from the saturation temperature %s to %.2f K (%s)", KelvinCelsius(tsat), end, why),
		fmt.Sprintf("onset: the first nucleus expected in %s (%.4g m3), where V times the integral of J dt reaches 1", in.VolumeText, in.V))
	var lnQ, lnW []float64
	nan := Num(math.NaN())
	for _, q := range in.Rates {
		o, err := md.MetastableZone(in.V, q, end)
		if err != nil {
			return nil, err
		}
		if !o.Reached {
			a.Rows = append(a.Rows, ZoneRow{Num(q * 60), Num(q), nan, nan, nan, nan, nan, nan, Strings{"not_reached"}})
			a.notes = append(a.notes, fmt.Sprintf("at %.4g K/min fewer than one nucleus is expected by %.2f K (%s expected): no onset on this path", q*60, end, expectedText(o.LnExpected)))
			continue
		}
		s := md.At(o.Temp)
		a.flags |= s.Flags
		w := tsat - o.Temp
		a.Rows = append(a.Rows, ZoneRow{Num(q * 60), Num(q), Num(o.Temp), Num(units.Celsius(o.Temp)), Num(w), Num(math.Exp(sol.LnS(o.Temp))), Num(o.Time), Num(s.Nucleus.Size), s.Flags.Keys()})
		lnQ, lnW = append(lnQ, math.Log(q)), append(lnW, math.Log(w))
	}
	if r := a.Rows; len(r) == 1 && len(lnW) == 1 {
		a.summary = []string{fmt.Sprintf("onset at %.4g K/min: %.2f K (%.2f °C), metastable zone width %.3f K, S = %.4g", r[0].RateMin, r[0].T, r[0].TC, r[0].Width, r[0].S)}
		a.ZoneOnset = &ZoneOnset{r[0].T, r[0].Width, r[0].S, r[0].Rate}
	}
	if len(lnW) >= 2 {
		if l, err := fit.Line(lnW, lnQ, nil); err == nil {
			a.summary = append(a.summary, fmt.Sprintf("rate against width: ln q = %.4g + %.4g ln ΔT_max (the apparent order m of Nyvlt's relation q ∝ ΔT_max^m)", l.Intercept, l.Slope))
			m := Num(l.Slope)
			a.Order = &m
		}
	}
	return a, nil
}

// expectedText writes a small expected number of nuclei from its logarithm.
func expectedText(lnN float64) string {
	switch {
	case math.IsInf(lnN, -1):
		return "none"
	case lnN > math.Log(1e-3):
		return fmt.Sprintf("%.3g", math.Exp(lnN))
	}
	return fmt.Sprintf("10^%.1f", lnN/math.Ln10)
}

// Doc is how the zone reads.
func (a *Zone) Doc() Doc {
	d := Doc{Title: "undercool cool: metastable zone width of a cooled solution", About: a.about, Summary: a.summary, Table: tableOf(a.Rows)}
	d.Notes = append(append(d.Notes, a.notes...), FlagNotes(a.flags)...)
	if a.flags&kinetics.FlagSmallNucleus != 0 {
		d.Notes = append(d.Notes, "the critical nucleus at the onset holds fewer than 10 molecules: CNT is outside its range; with an apparent gamma and prefactor the width is a correlation of the measurements they came from")
	}
	d.Notes = append(d.Notes, "this is the onset of the first nucleus; a measured width also needs the crystals to grow to a detectable amount, so it is wider (Kubota N., J. Cryst. Growth 310 (2008) 629)")
	d.Notes = append(d.Notes, Caution)
	a.Inputs.mark(&d, "onset")
	return d
}
