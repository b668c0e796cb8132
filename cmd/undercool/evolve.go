package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/pflag"

	"undercool/cmd/undercool/internal/outfile"
	"undercool/kinetics"
	"undercool/kinetics/population"
	"undercool/presets"
	"undercool/presets/answer"
	"undercool/presets/units"
)

func init() {
	commands["evolve"] = &command{
		summary: "Particles in size classes along a thermal schedule, with the solute balance: the precipitates of an ageing alloy (number density, mean radius, volume fraction, the matrix depleted, coarsening) or the crystals of a batch cooling crystallizer (size distribution, D10/D50/D90, yield), by time, with the final distribution.",
		usage: "undercool evolve [--material NAME|FILE.toml] [value flags] (--schedule 'STEP; STEP ...' | --schedule @FILE | --curve FILE.csv) " +
			"[--times T[,T...] | --rows N] [--classes N] [--tol X] [--bins N] [--plot FILE.svg|FILE.png] [--dist-plot FILE.svg|FILE.png] [--format F]",
		example: "undercool evolve --material al-sc --schedule 'start at 640C; hold 1h; cool to 20C at 50K/s; jump to 300C; hold 24h'",
		setup:   setupEvolve,
	}
}

// scheduleHelp is the schedule syntax, for --help.
const scheduleHelp = "thermal schedule, steps separated by ';' or written one per line in @FILE ('#' starts a comment): " +
	"start at TEMP; hold DURATION [at TEMP]; cool to TEMP at RATE|in DURATION; heat to TEMP at RATE|in DURATION; jump to TEMP " +
	"(temperatures K, C or F, bare = K; durations s, min, h, d; rates K/s, K/min, C/min, K/h), e.g. 'start at 640C; hold 1h; cool to 20C at 50K/s; jump to 300C; hold 24h'"

// scheduleFlag is --schedule TEXT or @FILE, read and checked while parsing.
type scheduleFlag struct {
	given
	s    kinetics.Schedule
	file string // @FILE, an input of the command
}

// maxScheduleBytes caps a schedule file, as presets caps a card.
const maxScheduleBytes = 1 << 20

func (f *scheduleFlag) Set(s string) error {
	text, file := s, ""
	if name, ok := strings.CutPrefix(s, "@"); ok {
		data, err := presets.ReadFile(name, maxScheduleBytes, "a schedule file")
		var le *presets.LimitError
		switch {
		case errors.As(err, &le):
			return &valueError{err}
		case err != nil:
			return bad("cannot read the schedule file %s: %v", name, outfile.Reason(err))
		}
		text, file = string(data), name
	}
	sch, err := kinetics.ParseSchedule(text, readScheduleQuantity)
	if err != nil {
		var se *kinetics.ScheduleError
		if errors.As(err, &se) && file != "" {
			return bad("%s:%d: step %d %q: %v", file, scheduleLine(text, se.Step), se.Step, se.Text, se.Err)
		}
		if file != "" {
			return bad("%s: %v", file, err)
		}
		return &valueError{err}
	}
	f.s, f.file, f.given = sch, file, given{true, s}
	return nil
}

func (f *scheduleFlag) register(_ string, fl *files) error { return fl.input(f.file) }

// scheduleLine is the line (from 1) of a schedule's step n, counted as
// kinetics.ParseSchedule counts them.
func scheduleLine(text string, n int) int {
	k := 0
	for i, line := range strings.Split(text, "\n") {
		if j := strings.IndexByte(line, '#'); j >= 0 {
			line = line[:j]
		}
		for _, step := range strings.Split(line, ";") {
			if strings.TrimSpace(step) != "" {
				if k++; k == n {
					return i + 1
				}
			}
		}
	}
	return 0
}

// readScheduleQuantity reads the quantities of a schedule with the
// program's unit parser: a bare temperature is kelvin, a bare duration
// seconds; a rate needs its unit.
func readScheduleQuantity(word string, q kinetics.Quantity) (float64, error) {
	switch q {
	case kinetics.QuantityTemperature:
		return units.Parse(word, units.Temperature)
	case kinetics.QuantityDuration:
		return units.Parse(word, units.Time)
	}
	return units.Parse(word, units.CoolingRate)
}

// durationsFlag is --times, a list of durations (bare = s).
type durationsFlag struct {
	given
	t []float64
}

func (f *durationsFlag) Set(s string) error {
	f.t = nil
	for _, p := range strings.Split(s, ",") {
		t, err := units.Parse(p, units.Time)
		if err != nil {
			return &valueError{err}
		}
		if t < 0 {
			return bad("%q: a time must not be negative", strings.TrimSpace(p))
		}
		if len(f.t) >= maxRows {
			return bad("more than %d times", maxRows)
		}
		f.t = append(f.t, t)
	}
	f.given = given{true, s}
	return nil
}

// countFlag is a whole number within [lo, hi].
type countFlag struct {
	given
	lo, hi int
	n      int
}

func (f *countFlag) Set(s string) error {
	var n int
	if _, err := fmt.Sscan(s, &n); err != nil || fmt.Sprint(n) != strings.TrimSpace(s) {
		return bad("%q is not a whole number", s)
	}
	if n < f.lo || n > f.hi {
		return bad("%d is outside %d to %d", n, f.lo, f.hi)
	}
	f.n, f.given = n, given{true, s}
	return nil
}

func addCount(fs *pflag.FlagSet, name string, def, lo, hi int, help string) *countFlag {
	f := &countFlag{lo: lo, hi: hi, n: def, given: given{text: fmt.Sprint(def)}}
	fs.Var(f, name, fmt.Sprintf("%s, %d to %d", help, lo, hi))
	return f
}

// tolFlag is --tol, a relative tolerance in (0, 0.5).
type tolFlag struct {
	given
	x float64
}

func (f *tolFlag) Set(s string) error {
	x, err := units.Parse(s, units.Dimensionless)
	if err != nil {
		return &valueError{err}
	}
	if !(x > 0 && x < 0.5) {
		return bad("%q must lie strictly between 0 and 0.5", s)
	}
	f.x, f.given = x, given{true, s}
	return nil
}

// evolveFlags are the flags of evolve.
type evolveFlags struct {
	mf       *materialFlags
	schedule *scheduleFlag
	curve    *pathFlag
	times    *durationsFlag
	rows     *countFlag
	classes  *countFlag
	tol      *tolFlag
	bins     *countFlag
	plot     *plotFlag
	dist     *plotFlag
	format   *formatFlag
}

func setupEvolve(fs *pflag.FlagSet, e *env) func([]string) error {
	ef := &evolveFlags{mf: addMaterialFlags(fs), schedule: &scheduleFlag{}}
	fs.Var(ef.schedule, "schedule", scheduleHelp)
	ef.curve = addInput(fs, "curve", "measured temperature history FILE.csv (columns time_UNIT and temperature_UNIT, e.g. time_s,temperature_c, time strictly increasing) in place of --schedule")
	ef.times = &durationsFlag{}
	fs.Var(ef.times, "times", "output times from the start of the schedule, comma-separated, s, min, h or d (bare = s), ascending, e.g. 10min,1h,24h; the end of the schedule is always the last row")
	ef.rows = addCount(fs, "rows", answer.DefaultEvolveRows, 2, 1000, "without --times: rows, half spread evenly in time and half evenly in log time over six decades after the alloy or solution first becomes supersaturated, besides the start, that onset, the break points and the end")
	ef.classes = addCount(fs, "classes", population.DefaultMaxClasses, 16, 100000, "most size classes kept at once (past it the two closest are merged)")
	ef.tol = &tolFlag{x: defaultEvolveTol, given: given{text: fmt.Sprint(defaultEvolveTol)}}
	fs.Var(ef.tol, "tol", "relative tolerance of a step on the particle sizes and on the solute balance, in (0, 0.5); 1e-4 puts the number density and mean radius of a day's ageing within 1 % of a run at 1e-5")
	ef.bins = addCount(fs, "bins", answer.DefaultEvolveBins, 1, 1000, "bins of equal width in log size of the final distribution's histogram")
	ef.plot = addPlot(fs, "draw the number density, mean size, volume fraction and supersaturation against log time")
	ef.dist = &plotFlag{}
	fs.Var(ef.dist, "dist-plot", "draw the final size distribution as a histogram in log size to FILE.svg or FILE.png (written whole or not at all)")
	ef.format = addFormat(fs, e)
	return func(args []string) error {
		if err := noArgs("evolve", args); err != nil {
			return err
		}
		switch {
		case ef.schedule.set && ef.curve.set:
			return usagef("--schedule and --curve: give one thermal history")
		case !ef.schedule.set && !ef.curve.set:
			return usagef("evolve: give the thermal history: --schedule 'start at 640C; hold 1h; cool to 20C at 50K/s; jump to 300C; hold 24h' (or @FILE), or --curve FILE.csv")
		case ef.times.set && ef.rows.set:
			return usagef("--times and --rows: give one or the other")
		}
		in, err := ef.input(e)
		if err != nil {
			return err
		}
		ctx, stop := outfile.NotifyContext(baseContext())
		defer stop()
		bar := newProgress(e.stderr)
		bar.label = "evolve"
		in.Progress = bar.update
		e.finish = append(e.finish, bar.finish)
		a, err := answer.Evolves(ctx, in)
		if err != nil {
			return evolveError(err)
		}
		return ef.write(e, a, in.Card.Name)
	}
}

// interrupted is a run stopped by the user (Ctrl-C, SIGTERM): exit
// status 130, as a shell reports an interrupt.
type interrupted struct{ msg string }

func (e *interrupted) Error() string { return e.msg }

// defaultEvolveTol is the step tolerance of evolve: tighter than the
// engine's default, which leaves the state of a day's ageing about 3 %
// from its converged value (population.TestTightToleranceConverges).
const defaultEvolveTol = 1e-4

// baseContext is the context a run starts from; tests replace it to cancel one.
var baseContext = context.Background

// input reads the card, its system and the thermal history.
func (ef *evolveFlags) input(e *env) (answer.EvolveInput, error) {
	in := answer.EvolveInput{Rows: ef.rows.n, Bins: ef.bins.n, Names: flagNames,
		Options: population.Options{MaxClasses: ef.classes.n, RelTol: ef.tol.x, ConcTol: ef.tol.x}}
	if ef.times.set {
		in.Times = ef.times.t
	}
	if ef.curve.set {
		p, d, err := readCurve(ef.curve.text, e)
		if err != nil {
			return in, err
		}
		if in.Schedule, err = kinetics.ScheduleFromCurve(p.Time, p.Temp, d.File); err != nil {
			return in, usagef("--curve: %s: %v", d.File, err)
		}
	} else {
		in.Schedule = ef.schedule.s
	}
	c, err := ef.mf.card()
	if err != nil {
		return in, err
	}
	sys, err := c.Population()
	if err != nil {
		return in, usage(err)
	}
	in.Card, in.System = c, sys
	return in, nil
}

// evolveError gives a failed run its words: an interrupt, or a run that
// could not meet its tolerances, with what to try.
func evolveError(err error) error {
	switch {
	case errors.Is(err, context.Canceled):
		return &interrupted{"evolve: interrupted; nothing written"}
	case errors.Is(err, population.ErrTooManySteps), errors.Is(err, population.ErrStepUnderflow):
		return fmt.Errorf("%w; try a looser --tol, fewer --classes, or for diffusion-limited crystal growth with nucleation (stiff) a growth law --growth-kg with --growth-order", err)
	}
	return err
}

// write renders the answer and draws the figures asked for; files are
// written only when everything is ready, and the answer printed last.
func (ef *evolveFlags) write(e *env, a *answer.Evolve, name string) error {
	var out strings.Builder
	if err := render(&out, ef.format, a); err != nil {
		return err
	}
	type file struct {
		path string
		data []byte
	}
	var files []file
	for _, f := range []struct {
		pf         *plotFlag
		time, dist bool
	}{{ef.plot, true, false}, {ef.dist, false, true}} {
		if !f.pf.set {
			continue
		}
		b, err := evolveFigure(a, name, f.pf.format, f.time, f.dist)
		if err != nil {
			flag := "--plot"
			if f.dist {
				flag = "--dist-plot"
			}
			return placef("%s: %v", flag, strings.TrimPrefix(err.Error(), "--plot: "))
		}
		files = append(files, file{f.pf.path, b})
	}
	for _, f := range files {
		if err := e.files.write(f.path, func(w io.Writer) error { _, err := w.Write(f.data); return err }); err != nil {
			return err
		}
	}
	_, err := io.WriteString(e.stdout, out.String())
	return err
}
