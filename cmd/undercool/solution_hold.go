package main

import (
	"fmt"
	"math"

	"github.com/spf13/pflag"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/units"
)

// solutionHoldFlags are the flags hold has for the induction time of a
// held volume (a vessel of solution, a droplet).
type solutionHoldFlags struct {
	volume string
	fs     *pflag.FlagSet
	sf     *spreadFlags // the uncertainty flags of hold (spread.go)
}

func addSolutionHoldFlags(fs *pflag.FlagSet) *solutionHoldFlags {
	sh := &solutionHoldFlags{fs: fs}
	fs.StringVar(&sh.volume, "volume", "", "vessel volume for the induction time 1/(J V) and the polynuclear time to --fraction, m3, L, mL, uL, mm3 or um3 (> 0); with it hold reports both and which dominates")
	return sh
}

// run answers hold with --volume: the induction time of the volume held at
// T. It reports whether it handled the command (false: no --volume, the
// ordinary hold goes on).
func (sh *solutionHoldFlags) run(e *env, c *presets.Card, md *kinetics.Model, T, X float64, format string) (bool, error) {
	if !sh.fs.Changed("volume") {
		return false, nil
	}
	for _, n := range []string{"lag", "nuclei"} {
		if sh.fs.Changed(n) {
			return true, usagef("--%s and --volume: the induction time is for nuclei forming at the steady rate; give one or the other", n)
		}
	}
	V, err := parsePositive("volume", sh.volume, units.Volume, "")
	if err != nil {
		return true, err
	}
	if !md.HasRate() {
		return true, usagef("the material has no nucleation rate, so no induction time: give --prefactor fixed with --j0 (the apparent A that fit induction gives), or a mobility law (--solvent-viscosity, --solute-diffusivity, --d0 and --q)")
	}
	lnU, growthFrom := math.NaN(), "model" // NaN: the model's u(T), a measured growth_rate where given
	switch {
	case md.Material().Growth > 0:
		growthFrom = "growth_rate"
	case !md.HasGrowth():
		growthFrom = "none"
	}
	in := md.InductionAt(T, V, X, lnU)
	s := in.State
	drives := s.Dmu > 0
	kT := cnt.Boltzmann * T
	mono := in.Mono()
	poly := in.PolyTime()
	never := math.IsInf(mono, 1) || math.IsNaN(mono)
	reason := ""
	lnS := math.NaN()
	if sol, ok := md.Solution(); ok {
		lnS = sol.LnS(T)
	}
	switch {
	case s.Flags&kinetics.FlagOutsideTable != 0:
		reason = "the temperature lies outside the solubility table"
	case !drives && !math.IsNaN(lnS):
		reason = fmt.Sprintf("S = %.4g <= 1: the solution is not supersaturated, no driving force", math.Exp(lnS))
	case !drives:
		reason = fmt.Sprintf("no driving force at or above the equilibrium temperature (%.2f K)", md.Te())
	case never:
		reason = "no nucleation at this temperature"
	}
	dominant := ""
	switch {
	case never:
	case growthFrom == "none":
		dominant = "unknown"
	case in.Poly:
		dominant = "polynuclear"
	default:
		dominant = "mononuclear"
	}

	about, inputs := describeCard(c, md)
	about = append(about, fmt.Sprintf("vessel: %s (%.4g m3); detection at the fraction X = %s of the crystal volume", sh.volume, V, fracLabel(X)))
	inputs = append(inputs, kv{"volume_m3", V}, kv{"growth_rate_from", growthFrom})
	r := &result{title: "undercool hold: induction time of a held volume", about: about, inputs: inputs}
	where := fmt.Sprintf("%.2f K (%.2f °C)", T, T-273.15)
	if never {
		r.summary = []string{fmt.Sprintf("induction time at %s: never: %s", where, reason)}
	} else {
		r.summary = []string{
			fmt.Sprintf("induction time, mononuclear (first nucleus, 1/(J V)) at %s: %s (%.4g s)", where, readableTime(mono), mono),
			fmt.Sprintf("polynuclear time to X = %s (many nuclei growing, JMAK): %s", fracLabel(X), polyText(poly, growthFrom)),
		}
		switch dominant {
		case "unknown":
			r.summary = append(r.summary, "dominates: not known without a growth rate; the induction time is at least the mononuclear one")
		case "mononuclear":
			r.summary = append(r.summary, "dominates: mononuclear: the wait for the first nucleus in this volume is the longer step")
		default:
			r.summary = append(r.summary, "dominates: polynuclear: many nuclei form before any grows to a detectable amount; the growth sets the time")
		}
	}
	if !math.IsNaN(lnS) {
		r.summary = append(r.summary, fmt.Sprintf("supersaturation S = %.4g (ln S = %.4g); driving force %.4g J/mol", math.Exp(lnS), lnS, s.DrivingMole))
	}
	if drives {
		r.summary = append(r.summary, fmt.Sprintf("critical nucleus: radius %.4g nm, %.4g molecules, barrier %.4g J (%.4g kT)",
			s.Nucleus.Radius*1e9, s.Nucleus.Size, s.Nucleus.Barrier, s.Nucleus.Barrier/kT))
	}
	r.summary = append(r.summary, "nucleation rate: log10 J = "+fixed(3)(none(s.Log10J(), true))+" (J in m^-3 s^-1)")
	u := s.Growth
	r.summary = append(r.summary, "growth rate: u = "+sig(4)(u)+" m/s ("+growthFrom+")")

	polyJSON := poly
	if growthFrom == "none" {
		polyJSON = math.NaN()
	}
	r.extra = object{
		{"temperature_k", T}, {"volume_m3", V}, {"fraction", X},
		{"supersaturation", math.Exp(lnS)}, {"ln_supersaturation", lnS},
		{"induction_time_s", mono}, {"polynuclear_time_s", polyJSON}, {"dominant", dominant},
		{"time_s", in.Time()}, {"never", never}, {"never_reason", reason},
		{"undercooling_k", s.Undercooling},
		{"critical_radius_m", none(s.Nucleus.Radius, drives)}, {"critical_size", none(s.Nucleus.Size, drives)},
		{"barrier_j", none(s.Nucleus.Barrier, drives)}, {"barrier_kt", none(s.Nucleus.Barrier/kT, drives)},
		{"log10_rate_per_m3_s", none(s.Log10J(), true)}, {"growth_rate_m_per_s", u},
		{"flags", nonNil(s.Flags.Keys())},
	}
	if format == "csv" {
		r.cols = []column{
			{"T (K)", "temperature_k", nil}, {"V (m3)", "volume_m3", nil}, {"S", "supersaturation", nil},
			{"t_ind (s)", "induction_time_s", nil}, {"t_poly (s)", "polynuclear_time_s", nil}, {"dominant", "dominant", nil},
			{"log10 J", "log10_rate_per_m3_s", nil}, {"n*", "critical_size", nil}, {"flags", "flags", nil},
		}
		r.rows = [][]any{{T, V, math.Exp(lnS), mono, polyJSON, dominant, none(s.Log10J(), true), none(s.Nucleus.Size, drives), s.Flags.Keys()}}
	}
	r.notes = flagNotes(s.Flags)
	if s.Flags&kinetics.FlagSmallNucleus != 0 {
		r.notes = append(r.notes, fmt.Sprintf("the critical nucleus holds %.2g molecules: CNT is outside its range; with an apparent gamma and prefactor fitted to induction times the times are a correlation of those measurements, not a prediction", s.Nucleus.Size))
	}
	r.notes = append(r.notes, "induction times: mononuclear 1/(J V), polynuclear [3(-ln(1-X))/(pi J u^3)]^(1/4); the longer one dominates (Kashchiev and van Rosmalen, Cryst. Res. Technol. 38 (2003) 555)")
	if sh.sf != nil {
		heads, eval := inductionHeadlines(T, V, X, lnU)
		if err := sh.sf.apply(e, r, c, md, heads, eval, nil); err != nil {
			return true, err
		}
	}
	r.notes = append(r.notes, caution)
	return true, r.render(e.stdout, format)
}

func polyText(t float64, from string) string {
	if from == "none" {
		return "not known (no growth rate: give --growth-rate, a measured crystal growth rate)"
	}
	if math.IsInf(t, 1) || math.IsNaN(t) {
		return "never"
	}
	return fmt.Sprintf("%s (%.4g s)", readableTime(t), t)
}
