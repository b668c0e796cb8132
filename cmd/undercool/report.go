package main

import (
	"bytes"
	"io"
	"path/filepath"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"undercool/cmd/undercool/internal/outfile"
	"undercool/kinetics"
	"undercool/kinetics/population"
	"undercool/presets/answer"
)

func init() {
	commands["report"] = &command{
		summary: "A Markdown memo for a material and a question: the material with every value and its source, the model choices, the TTT nose, the critical cooling rate, a hold time (--at), a measured cooling curve (--curve), heating a glass (--heat-rate, --dsc: the critical heating rate beside the critical cooling rate, the DSC peaks), the onset in a sample (--volume) and the particles in size classes along a thermal schedule (--schedule: the evolve time table, distribution and figure), with uncertainty bands, the sensitivity ranking, the TTT (and CCT) plot beside it as SVG, the validity flags and the cautions. Written whole or not at all.",
		usage:   "undercool report --out FILE.md|- [--material NAME|FILE.toml] [value flags] [--fraction X] [--at T] [--curve FILE.csv] [--volume V] [--heat-rate Q] [--dsc Q,Q,...] [--heat-from T|Tg] [--schedule 'STEP; STEP ...'|@FILE] [--spread NAME=VALUE ...] [--samples N] [--seed S] [--plot FILE.svg] [--date YYYY-MM-DD]",
		example: "undercool report --material demo-alloy --at 900K --spread gamma=2% --spread d0=x2 --out memo.md",
		setup:   setupReport,
	}
}

// outFlag is --out FILE or -, checked before any work (register).
type outFlag struct {
	given
	path string
}

func (f *outFlag) Set(s string) error {
	if s == "" {
		return bad("required: the memo file, e.g. --out memo.md, or --out - to print it")
	}
	f.path, f.given = s, given{true, s}
	return nil
}

func (f *outFlag) register(name string, fl *files) error {
	if !f.set || f.path == "-" {
		return nil
	}
	return fl.output(name, f.path)
}

func setupReport(fs *pflag.FlagSet, e *env) func([]string) error {
	mf := addMaterialFlags(fs)
	out := &outFlag{}
	fs.Var(out, "out", "the memo, FILE.md, or - for standard output; required")
	jf := addJMAKFlags(fs, false)
	at := addTemp(fs, e, "at", "also answer for a hold (storage, anneal) at this temperature, K, C or F (bare = K)")
	curve := addInput(fs, "curve", "also answer for a measured cooling curve FILE.csv with columns time_UNIT and temperature_UNIT (e.g. time_s,temperature_c)")
	volume := addVolume(fs, "a sample volume", "sample volume for the onset of nucleation at the critical rate and on --curve, m3, mm3, uL, mL or L (> 0)")
	pf := &plotFlag{svgOnly: "the memo's plot is an SVG file (FILE.svg)"}
	fs.Var(pf, "plot", "the TTT (and CCT) plot, FILE.svg (default: beside the memo, FILE-ttt.svg; none for --out - unless given)")
	date := &dateFlag{}
	fs.Var(date, "date", "the memo's date, YYYY-MM-DD (default: today, UTC)")
	heatFrom := &startFlag{}
	fs.Var(heatFrom, "heat-from", "heating in the memo starts here, K, C or F, or Tg (default: Tg); with --heat-rate or --dsc")
	heatRate := &ratesFlag{heating: true}
	fs.Var(heatRate, "heat-rate", "also answer for linear heating from --heat-from to Te at this rate, K/s or K/min (> 0), with the critical heating rate beside the critical cooling rate")
	dsc := &ratesFlag{heating: true}
	fs.Var(dsc, "dsc", "also give the forward DSC peaks at these heating rates, e.g. 2,5,10,20K/min, with the critical heating rate beside the critical cooling rate")
	sched := &scheduleFlag{}
	fs.Var(sched, "schedule", "also follow the particles in size classes along this "+scheduleHelp+"; the figure goes beside the memo as FILE-evolve.svg")
	setGroup(fs, groupOutput, "out", "plot", "date")
	format := addText(fs, "format", "not used: the memo is always Markdown")
	_ = fs.MarkHidden("format")
	sf := addSpreadFlags(fs)
	return func(args []string) error {
		if err := noArgs("report", args); err != nil {
			return err
		}
		switch {
		case format.set:
			return usagef("--format: does not apply to report, which always writes Markdown (use --out FILE.md or --out -)")
		case !out.set:
			return usagef("--out: required: the memo file, e.g. --out memo.md, or --out - to print it")
		}
		if err := sf.check(); err != nil {
			return err
		}
		j, err := jf.jmak()
		if err != nil {
			return err
		}
		in := answer.MemoInput{X: jf.fraction.X[0], JMAK: j, At: at.x, V: volume.x, Date: date.date, Version: buildVersion(), Names: flagNames}
		if !date.set {
			in.Date = time.Now().UTC().Format("2006-01-02")
		}
		plot := memoPlot(out.path, pf)
		if plot != "" && !pf.set {
			// The plot beside the memo: checked with it, before any work.
			if err := e.files.output("out", plot); err != nil {
				return err
			}
		}
		if plot != "" {
			in.Plot = plot
			if out.path != "-" {
				if rel, err := filepath.Rel(filepath.Dir(out.path), plot); err == nil {
					in.Plot = rel
				}
			}
			in.Plot = filepath.ToSlash(in.Plot)
		}
		if curve.set {
			p, d, err := readCurve(curve.text, e)
			if err != nil {
				return err
			}
			in.Path, in.Data = &p, d
		}
		if in.Card, in.Model, err = mf.model(); err != nil {
			return err
		}
		if err := canTransform(in.Model, j); err != nil {
			return err
		}
		if !in.Model.HasTe() {
			return noTe("report", "no temperature range for the memo's TTT table")
		}
		if in.Heat, err = memoHeat(in.Model, heatFrom, heatRate, dsc); err != nil {
			return err
		}
		if in.Sampling, err = sf.sampling(e, in.Card); err != nil {
			return err
		}
		var evolvePlot string
		if sched.set {
			sys, err := in.Card.Population()
			if err != nil {
				return usage(err)
			}
			in.Evolve = &answer.EvolveInput{Card: in.Card, System: sys, Schedule: sched.s, Names: flagNames,
				Options: population.Options{RelTol: defaultEvolveTol, ConcTol: defaultEvolveTol}}
			ctx, stop := outfile.NotifyContext(baseContext())
			defer stop()
			in.Context = ctx
			if out.path != "-" {
				evolvePlot = strings.TrimSuffix(out.path, filepath.Ext(out.path)) + "-evolve.svg"
				in.EvolvePlot = filepath.ToSlash(filepath.Base(evolvePlot))
				if err := e.files.output("out", evolvePlot); err != nil {
					return err
				}
			}
		}
		in.Command = regenerate(fs, sf, in.Date)
		m, err := answer.Memos(in)
		if err != nil {
			return evolveError(err)
		}
		if err := answer.Check(m); err != nil {
			return err
		}
		var b bytes.Buffer
		if err := writeBlocks(&b, m.Blocks()); err != nil {
			return err
		}
		// The memo and its plot are one set: written together or not at all.
		if plot != "" {
			if err := writeMemoPlot(&e.files, plot, m, in); err != nil {
				return err
			}
		}
		if evolvePlot != "" {
			fig, err := evolveFigure(m.Evolve, in.Card.Name, "svg", true, len(m.Evolve.Histogram) > 0)
			if err == nil {
				err = e.files.write(evolvePlot, func(w io.Writer) error { _, err := w.Write(fig); return err })
			}
			if err != nil {
				return err
			}
		}
		if out.path == "-" {
			_, err := e.stdout.Write(b.Bytes())
			return err
		}
		return e.files.write(out.path, func(w io.Writer) error { _, err := w.Write(b.Bytes()); return err })
	}
}

// memoHeat is what the memo asks of heating (nil: nothing): from
// --heat-from (default Tg), at --heat-rate, with the DSC peaks of --dsc.
func memoHeat(md *kinetics.Model, from *startFlag, rate, dsc *ratesFlag) (*answer.MemoHeat, error) {
	switch {
	case !rate.set && !dsc.set:
		if from.set {
			return nil, usagef("--heat-from: says where the memo's heating starts; give --heat-rate or --dsc with it")
		}
		return nil, nil
	case rate.set && len(rate.q) > 1:
		return nil, usagef("--heat-rate: give one heating rate (for several, --dsc)")
	}
	hf := heatFlags{from: from}
	T, err := hf.start(md, "heat-from")
	if err != nil {
		return nil, err
	}
	h := &answer.MemoHeat{From: T, DSC: dsc.q}
	if rate.set {
		h.Rate = rate.q[0]
	}
	return h, nil
}

// memoPlot is where the memo's SVG goes: --plot, or beside the memo
// file; none for a memo on standard output without --plot.
func memoPlot(out string, pf *plotFlag) string {
	switch {
	case pf.set:
		return pf.path
	case out == "-":
		return ""
	}
	return strings.TrimSuffix(out, filepath.Ext(out)) + "-ttt.svg"
}

// writeMemoPlot draws the TTT curve beside the memo, with the CCT curve and
// the cooling line at the critical rate over it where there is one (the
// figure of undercool cool --critical --plot), and the measured cooling
// curve where there is one (as cool --curve --plot draws it).
func writeMemoPlot(fl *files, path string, m *answer.Memo, in answer.MemoInput) error {
	pf := &plotFlag{path: path, format: "svg", files: fl}
	var fig *tttFigure
	var err error
	if m.WithCCT() {
		cr := m.Cool
		fig, err = cctFigure(cr.Path, in.Model, in.Card, cr.X, []float64{cr.Qc}, true, cr.Qc)
	} else {
		fig, err = tttFigureOf(in.Model, in.Card, m.TTT.Curves)
	}
	if err != nil {
		return err
	}
	if m.Curve != nil {
		curveOver(fig, *in.Path, in.X, m.Curve)
	}
	return saveFigure(pf, fig)
}

// regenerate is the command line that makes the same memo: the flags
// given, and the memo's date when it was today's.
func regenerate(fs *pflag.FlagSet, sf *spreadFlags, date string) string {
	parts := []string{"undercool", "report"}
	fs.VisitAll(func(f *pflag.Flag) {
		if f.Name == "date" {
			parts = append(parts, "--date", date)
			return
		}
		if !f.Changed {
			return
		}
		if f.Name == "spread" {
			for _, s := range sf.raw {
				parts = append(parts, "--spread", shellQuote(s))
			}
			return
		}
		parts = append(parts, "--"+f.Name, shellQuote(f.Value.String()))
	})
	return strings.Join(parts, " ")
}

// shellQuote quotes a word for a POSIX shell when it needs it.
func shellQuote(s string) string {
	if s != "" && strings.Trim(s, "abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789-_=.,:/%+") == "" {
		return s
	}
	return "'" + strings.ReplaceAll(s, "'", `'\''`) + "'"
}
