package main

import (
	"math"
	"strings"

	"github.com/spf13/pflag"

	"undercool/kinetics"
	"undercool/presets/units"
)

// maxRows caps a temperature list so a typo in a step cannot exhaust memory.
const maxRows = 100000

// tempFlags choose the temperatures of a table.
type tempFlags struct {
	temps  string
	span   string
	fs     *pflag.FlagSet
	points int // rows of the default range
}

func addTempFlags(fs *pflag.FlagSet, points int) *tempFlags {
	tf := &tempFlags{fs: fs, points: points}
	fs.StringVar(&tf.temps, "temps", "", "comma-separated temperatures, each K, C or F (bare = K), e.g. 1100K,800C")
	fs.StringVar(&tf.span, "range", "", "temperatures FROM:TO:STEP (or FROM:TO for the default number of rows), e.g. 1000:600:10 or 900C:500C:25C")
	return tf
}

// coldBare is the temperature below which a bare number (kelvin) is more
// likely meant in degrees Celsius, and earns a note on stderr.
const coldBare = 150.0 // K

// parseTemp reads one temperature and checks it is above absolute zero.
// A bare number is kelvin; one that looks like Celsius gets a note.
func parseTemp(e *env, flag, s string) (float64, error) {
	t, err := units.Parse(s, units.Temperature)
	if err != nil {
		return 0, usagef("--%s: %v", flag, err)
	}
	bare := isBare(s)
	if !(t > 0) {
		if bare {
			return 0, usagef("--%s: %q is at or below absolute zero (a bare number is kelvin; write %sC for Celsius)", flag, s, strings.TrimSpace(s))
		}
		return 0, usagef("--%s: %q is at or below absolute zero", flag, s)
	}
	if bare && t < coldBare {
		e.note("--%s %s is read as %g K (a bare number is kelvin); write %sC for Celsius", flag, strings.TrimSpace(s), t, strings.TrimSpace(s))
	}
	return t, nil
}

// isBare reports whether a quantity is written without a unit.
func isBare(s string) bool {
	s = strings.TrimSpace(s)
	return s != "" && strings.IndexFunc(s, func(r rune) bool { return !strings.ContainsRune("0123456789.+-eE", r) }) < 0
}

// parsePositive reads the value of --flag as a quantity of kind and checks
// that it is positive; what, if not empty, says in the error what it is.
func parsePositive(flag, s string, kind units.Kind, what string) (float64, error) {
	v, err := units.Parse(s, kind)
	if err != nil {
		return 0, usagef("--%s: %v", flag, err)
	}
	if !(v > 0) {
		if what != "" {
			return 0, usagef("--%s: %q must be positive (%s)", flag, s, what)
		}
		return 0, usagef("--%s: %q must be positive", flag, s)
	}
	return v, nil
}

// list returns the temperatures asked for, or the default range [lo, hi]
// from hi down to lo when neither flag is given.
func (tf *tempFlags) list(e *env, lo, hi float64) ([]float64, error) {
	if tf.fs.Changed("temps") && tf.fs.Changed("range") {
		return nil, usagef("--temps and --range: give one or the other")
	}
	if tf.fs.Changed("temps") {
		var out []float64
		for _, s := range strings.Split(tf.temps, ",") {
			t, err := parseTemp(e, "temps", s)
			if err != nil {
				return nil, err
			}
			out = append(out, t)
		}
		return out, nil
	}
	if tf.fs.Changed("range") {
		parts := strings.Split(tf.span, ":")
		if len(parts) < 2 || len(parts) > 3 {
			return nil, usagef("--range: %q is not FROM:TO:STEP or FROM:TO", tf.span)
		}
		from, err := parseTemp(e, "range", parts[0])
		if err != nil {
			return nil, err
		}
		to, err := parseTemp(e, "range", parts[1])
		if err != nil {
			return nil, err
		}
		if from == to {
			return []float64{from}, nil
		}
		if len(parts) == 2 {
			return spread(from, to, tf.points), nil
		}
		step, err := units.Parse(parts[2], units.TemperatureDifference)
		if err != nil {
			return nil, usagef("--range: step: %v", err)
		}
		step = math.Abs(step)
		if !(step > 0) {
			return nil, usagef("--range: the step must not be zero")
		}
		n := math.Floor(math.Abs(to-from)/step+1e-9) + 1
		if n > maxRows {
			return nil, usagef("--range: %g rows is more than the %d allowed; use a larger step", n, maxRows)
		}
		sign := 1.0
		if to < from {
			sign = -1
		}
		out := make([]float64, int(n))
		for i := range out {
			out[i] = from + sign*float64(i)*step
		}
		return out, nil
	}
	return spread(hi, lo, tf.points), nil
}

// spread gives n evenly spaced temperatures from a to b inclusive.
func spread(a, b float64, n int) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = a + (b-a)*float64(i)/float64(n-1)
	}
	return out
}

// defaultSpan is the temperature range a material's tables cover by
// default: just below T_e down to the glass transition, the VFT T0 or, for
// a material with neither, half of T_e.
func defaultSpan(md *kinetics.Model) (lo, hi float64) {
	m := md.Material()
	hi = md.Te() * 0.99
	lo = 0.5 * md.Te()
	switch mob := m.Mobility.(type) {
	case kinetics.VFT:
		lo = math.Max(lo, mob.T0+0.05*(md.Te()-mob.T0))
	case kinetics.WLF:
		lo = mob.Tg
	}
	if m.Tg > 0 && m.Tg < hi {
		lo = m.Tg
	}
	return lo, hi
}
