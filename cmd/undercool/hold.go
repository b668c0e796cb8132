package main

import (
	"fmt"
	"math"

	"github.com/spf13/pflag"

	"undercool/cnt"
	"undercool/kinetics"
)

func init() {
	commands["hold"] = &command{
		summary: "The time to transform a fraction in an isothermal hold at one temperature (storage, an anneal), with the nucleation and growth rates and the critical nucleus there.",
		usage:   "undercool hold --at T [--material NAME|FILE.toml] [value flags] [--fraction X] [--lag | --nuclei N] [--format F]",
		example: "undercool hold --material demo-alloy --at 500C --fraction 0.01",
		setup:   setupHold,
	}
}

// neverReason says why a hold never reaches its fraction.
func neverReason(md *kinetics.Model, s kinetics.State, j kinetics.JMAK, lnt float64) string {
	switch {
	case s.Flags&kinetics.FlagOutsideTable != 0:
		return "the temperature lies outside the tabulated driving force"
	case !(s.Dmu > 0):
		return fmt.Sprintf("no driving force at or above the equilibrium temperature (T_e = %.2f K)", md.Te())
	case s.Flags&kinetics.FlagNoMobility != 0:
		return "no mobility: below the temperature where the viscosity law diverges"
	case j.Nuclei == 0 && math.IsInf(s.LnJ, -1):
		return "no nucleation at this temperature"
	case !math.IsInf(lnt, 1):
		return "the time is beyond 1.8e308 s"
	}
	return "nothing transforms at this temperature"
}

func setupHold(fs *pflag.FlagSet) func(*env, []string) error {
	mf := addMaterialFlags(fs)
	var at string
	fs.StringVar(&at, "at", "", "hold temperature, K, C or F (bare = K), above absolute zero; required")
	jf := addJMAKFlags(fs, false)
	sh := addSolutionHoldFlags(fs) // --volume: induction time (solution_hold.go)
	ff := addFormatFlag(fs)
	sf := addSpreadFlags(fs)
	sh.sf = sf
	return func(e *env, args []string) error {
		if err := checkStart("hold", args, ff, sf); err != nil {
			return err
		}
		if !fs.Changed("at") {
			return usagef("--at: required: the hold temperature, e.g. --at 700K or --at 450C")
		}
		T, err := parseTemp(e, "at", at)
		if err != nil {
			return err
		}
		fractions, j, err := jf.law(false)
		if err != nil {
			return err
		}
		X := fractions[0]
		c, md, err := mf.model()
		if err != nil {
			return err
		}
		if done, err := sh.run(e, c, md, T, X, ff.value); done {
			return err
		}
		if err := transformError(md, j); err != nil {
			return err
		}
		s, a := md.Isothermal(T, j)
		lnt := a.LnTime(X)
		t, _ := secondsOf(lnt)
		never := math.IsInf(t, 1) || math.IsNaN(t)
		drives := s.Dmu > 0
		kT := cnt.Boltzmann * T
		lag := math.NaN()
		if j.Nuclei == 0 && drives {
			lag = s.TimeLag()
		}
		log10J := none(s.Log10J(), true)
		if j.Nuclei > 0 {
			log10J = math.NaN()
		}

		about, inputs := describeCard(c, md)
		about, inputs = describeJMAK(about, inputs, j)
		r := &result{
			title:  "undercool hold: time to transform at one temperature",
			about:  about,
			inputs: inputs,
		}
		answer := fmt.Sprintf("time to X = %s at %.2f K (%.2f °C): %s", fracLabel(X), T, T-273.15, readableTime(t))
		if !never && t >= 60 {
			answer += fmt.Sprintf(" (%.4g s)", t)
		}
		reason := ""
		if never {
			reason = neverReason(md, s, j, lnt)
			answer += ": " + reason
		}
		r.summary = []string{answer}
		if drives {
			r.summary = append(r.summary,
				fmt.Sprintf("undercooling %.2f K; driving force %.4g J/mol", s.Undercooling, s.DrivingMole),
				// near absolute zero the size and barrier/kT overflow: the dash, as in the tables
				fmt.Sprintf("critical nucleus: radius %s nm, %s molecules, barrier %s J (%s kT)",
					sig(4)(s.Nucleus.Radius*1e9), sig(4)(s.Nucleus.Size), sig(4)(s.Nucleus.Barrier), sig(4)(s.Nucleus.Barrier/kT)))
		} else {
			r.summary = append(r.summary, fmt.Sprintf("undercooling %.2f K: no driving force, no nucleus", s.Undercooling))
		}
		if j.Nuclei > 0 {
			r.summary = append(r.summary, fmt.Sprintf("nuclei: %.4g per m3, present from the start", j.Nuclei))
		} else {
			r.summary = append(r.summary, "nucleation rate: log10 J = "+fixed(3)(log10J)+" (J in m^-3 s^-1)")
		}
		r.summary = append(r.summary, "growth rate: u = "+sig(4)(s.Growth)+" m/s")
		if j.Lag {
			r.summary = append(r.summary, "time lag: "+readableTime(lag)+" (included in the time)")
		}
		r.extra = object{
			{"temperature_k", T}, {"fraction", X}, {"time_s", t}, {"never", never}, {"never_reason", reason},
			{"undercooling_k", s.Undercooling},
			{"critical_radius_m", none(s.Nucleus.Radius, drives)}, {"critical_size", none(s.Nucleus.Size, drives)},
			{"barrier_j", none(s.Nucleus.Barrier, drives)}, {"barrier_kt", none(s.Nucleus.Barrier/kT, drives)},
			{"log10_rate_per_m3_s", log10J}, {"growth_rate_m_per_s", s.Growth},
			{"time_lag_s", lag}, {"flags", nonNil(s.Flags.Keys())},
		}
		if ff.value == "csv" {
			// One row, so a spreadsheet gets the same numbers.
			r.cols = []column{
				{"T (K)", "temperature_k", nil}, {"X", "fraction", nil}, {"time (s)", "time_s", nil},
				{"log10 J", "log10_rate_per_m3_s", nil}, {"u", "growth_rate_m_per_s", nil},
				{"r*", "critical_radius_m", nil}, {"n*", "critical_size", nil}, {"ΔG*", "barrier_j", nil},
				{"tau", "time_lag_s", nil}, {"flags", "flags", nil},
			}
			r.rows = [][]any{{T, X, t, log10J, s.Growth, none(s.Nucleus.Radius, drives), none(s.Nucleus.Size, drives),
				none(s.Nucleus.Barrier, drives), lag, s.Flags.Keys()}}
		}
		r.notes = flagNotes(s.Flags)
		if j.Lag {
			r.notes = append(r.notes, lagNote)
		}
		heads, eval := holdHeadlines(T, X, j)
		if err := sf.apply(e, r, c, md, heads, eval, nil); err != nil {
			return err
		}
		r.notes = append(r.notes, caution)
		return r.render(e.stdout, ff.value)
	}
}

// nonNil makes an empty list print as [] in JSON.
func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}
