package main

import (
	"bytes"
	"fmt"
	"math"

	"github.com/spf13/pflag"

	"undercool/cnt"
	"undercool/kinetics"
)

func init() {
	commands["rate"] = &command{
		summary: "The critical nucleus and the steady-state nucleation and growth rates over a range of temperatures.",
		usage:   "undercool rate [--material NAME|FILE.toml] [value flags] [--temps LIST | --range FROM:TO:STEP] [--format F]",
		example: "undercool rate --material demo-alloy --range 1100:700:50",
		setup:   setupRate,
	}
}

// scaled shows an SI value multiplied by factor with n significant digits.
func scaled(factor float64, n int) func(any) string {
	return func(v any) string {
		if x, ok := v.(float64); ok {
			return sig(n)(x * factor)
		}
		return cellText(v)
	}
}

// none turns a value that does not exist (no driving force) into NaN.
func none(x float64, ok bool) float64 {
	if !ok || math.IsInf(x, 0) {
		return math.NaN()
	}
	return x
}

// rateColumns are the columns of the nucleus and rate table.
var rateColumns = []column{
	{"T (K)", "temperature_k", fixed(2)},
	{"T (°C)", "temperature_c", fixed(2)},
	{"ΔT (K)", "undercooling_k", fixed(2)},
	{"Δg (J/m3)", "driving_force_j_per_m3", sig(4)},
	{"r* (nm)", "critical_radius_m", scaled(1e9, 4)},
	{"n*", "critical_size", sig(4)},
	{"ΔG* (J)", "barrier_j", sig(4)},
	{"ΔG*/kT", "barrier_kt", sig(4)},
	{"Z", "zeldovich", sig(3)},
	{"D (m2/s)", "diffusivity_m2_per_s", sig(3)},
	{"log10 J (m^-3 s^-1)", "log10_rate_per_m3_s", fixed(3)},
	{"u (m/s)", "growth_rate_m_per_s", sig(3)},
	{"flags", "flags", nil},
}

// rateRow is one row of the rate table.
func rateRow(md *kinetics.Model, s kinetics.State) []any {
	drives := s.Dmu > 0
	kT := cnt.Boltzmann * s.T
	return []any{
		s.T, s.T - 273.15, s.Undercooling,
		none(s.DrivingVolume(md.Material().Vm), drives),
		none(s.Nucleus.Radius, drives), none(s.Nucleus.Size, drives),
		none(s.Nucleus.Barrier, drives), none(s.Nucleus.Barrier/kT, drives),
		none(s.Nucleus.Zeldovich, drives),
		math.Exp(s.LnD), none(s.Log10J(), true), s.Growth,
		s.Flags.Keys(),
	}
}

// flagNotes explains every flag raised in a set of states.
func flagNotes(all kinetics.Flag) []string {
	var notes []string
	keys, about := all.Keys(), all.Descriptions()
	for i := range keys {
		notes = append(notes, fmt.Sprintf("flag %s: %s", keys[i], about[i]))
	}
	return notes
}

func setupRate(fs *pflag.FlagSet) func(*env, []string) error {
	mf := addMaterialFlags(fs)
	tf := addTempFlags(fs, 21)
	ff := addFormatFlag(fs)
	sf := addSpreadFlags(fs)
	pf := addPlotFlag(fs, "draw log10 J and u against temperature")
	return func(e *env, args []string) error {
		if err := checkStart("rate", args, ff, sf); err != nil {
			return err
		}
		if err := pf.check(); err != nil {
			return err
		}
		c, md, err := mf.model()
		if err != nil {
			return err
		}
		lo, hi := defaultSpan(md)
		temps, err := tf.list(e, lo, hi)
		if err != nil {
			return err
		}
		about, inputs := describeCard(c, md)
		r := &result{
			title:  "undercool rate: critical nucleus and steady-state rates",
			about:  about,
			inputs: inputs,
			cols:   rateColumns,
		}
		var all kinetics.Flag
		for _, T := range temps {
			s := md.At(T)
			all |= s.Flags
			r.rows = append(r.rows, rateRow(md, s))
		}
		addSupersaturationColumn(r, md, temps) // solution_flags.go
		r.notes = flagNotes(all)
		if !md.HasRate() {
			r.notes = append(r.notes, "no rate: the material has no mobility law; give --mobility with its values, or --prefactor fixed with --j0")
		}
		if plan, err := sf.plan(c, md); err != nil {
			return err
		} else if plan != nil && md.HasRate() {
			heads, eval := rateHeadlines(temps)
			u, err := plan.run(e, md, heads, eval)
			if err != nil {
				return err
			}
			addUncertainty(r, plan, u, heads, temps)
		}
		r.notes = append(r.notes, caution)
		if err := writeRatePlot(pf, c.Name, md, temps); err != nil {
			return err
		}
		return r.render(e.stdout, ff.value)
	}
}

// checkStart rejects arguments to a command that takes none, then checks
// --format and the spread flags.
func checkStart(name string, args []string, ff *formatFlag, sf *spreadFlags) error {
	if len(args) > 0 {
		return usagef("%s: unexpected argument %q", name, args[0])
	}
	if err := ff.check(); err != nil {
		return err
	}
	return sf.check()
}

// renderWithPlot renders r, then writes the plot where one is asked for,
// and only then prints r, so that a failed plot leaves no output.
func renderWithPlot(e *env, r *result, format string, pf *plotFlag, plot func() error) error {
	var out bytes.Buffer
	if err := r.render(&out, format); err != nil {
		return err
	}
	if pf.wanted() {
		if err := plot(); err != nil {
			return err
		}
	}
	_, err := e.stdout.Write(out.Bytes())
	return err
}

// caution is the one-line reminder every result carries.
const caution = "estimates only: rates depend on gamma cubed inside an exponential; process decisions follow local codes, validated procedures and licensed practice"
