package main

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/spf13/pflag"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/answer"
)

func init() {
	commands["heat"] = &command{
		summary: "Heating a glass: the fraction crystallized on linear heating from a start temperature, the critical heating rate beside the critical cooling rate, the forward DSC peaks and onsets at several heating rates, nuclei quenched in by a prior cooling, and schedules of ramps and holds (nucleation hold, then growth hold).",
		usage: "undercool heat [--material NAME|FILE.toml] [value flags] (--rate Q | --critical | --dsc Q,Q,... | --schedule 'STEP; ...'|@FILE) " +
			"[--from T|Tg] [--to T] [--cooled-at Q] [--fraction X] [--plot FILE.svg|FILE.png] [--format F]",
		example: "undercool heat --material lithium-disilicate --dsc 2,5,10,20K/min",
		setup:   setupHeat,
	}
}

// startFlag is --from: a temperature, or Tg (the card's glass transition).
type startFlag struct {
	tempFlag
	tg bool
}

func (f *startFlag) Set(s string) error {
	if strings.EqualFold(strings.TrimSpace(s), "tg") {
		f.tg, f.given, f.bare = true, given{true, s}, nil
		return nil
	}
	f.tg = false
	return f.tempFlag.Set(s)
}

// heatFlags are the flags of the heat command.
type heatFlags struct {
	mf       *materialFlags
	from     *startFlag
	to       *tempFlag
	rate     *ratesFlag
	critical bool
	dsc      *ratesFlag
	schedule *scheduleFlag
	cooledAt *ratesFlag
	fraction *fractionFlag
	plot     *plotFlag
	format   *formatFlag
}

func setupHeat(fs *pflag.FlagSet, e *env) func([]string) error {
	hf := &heatFlags{mf: addMaterialFlags(fs), from: &startFlag{}, rate: &ratesFlag{heating: true}, dsc: &ratesFlag{heating: true},
		schedule: &scheduleFlag{}, cooledAt: &ratesFlag{}}
	fs.Var(hf.from, "from", "start of linear heating, K, C or F (bare = K) below Te, or Tg for the card's glass transition (default: Tg where the card has one)")
	hf.to = addTemp(fs, e, "to", "end of linear heating, K, C or F, above --from (default: Te)")
	fs.Var(hf.rate, "rate", "linear heating rate, K/s, K/min, K/h or C/min (> 0)")
	fs.BoolVar(&hf.critical, "critical", false, "the critical heating rate to stay below --fraction at --to, from a nucleus-free glass (X_ext scales as rate^-4), beside the critical cooling rate and their ratio")
	fs.Var(hf.dsc, "dsc", "forward DSC peaks at these heating rates, comma-separated, e.g. 2,5,10,20K/min (a bare number takes the unit of the last): the peak of dX/dT and the onset at X = 1 %")
	fs.Var(hf.schedule, "schedule", "heat along this "+scheduleHelp+" (e.g. a nucleation hold, then a growth hold); instead of --rate")
	fs.Var(hf.cooledAt, "cooled-at", "carry in the nuclei left by cooling from Te to --from at this rate, K/s or K/min (> 0): how the glass was made; with --rate, --critical or --dsc")
	hf.fraction = addFraction(fs, false, "transformed fraction to stay below or to reach, strictly between 0 and 1 (1e-6: the usual detection limit)")
	hf.plot = addPlot(fs, "draw dX/dT against temperature for each rate of --dsc (or --rate)")
	hf.format = addFormat(fs, e)
	return func(args []string) error {
		if err := noArgs("heat", args); err != nil {
			return err
		}
		in, err := hf.input()
		if err != nil {
			return err
		}
		a, err := answer.Heats(in)
		switch {
		case errors.Is(err, kinetics.ErrScheduleJump):
			return usagef("--schedule: %v", err)
		case err != nil:
			return err
		}
		return renderWithPlot(e, a, hf.format, hf.plot, func() error { return heatPlot(hf.plot, in.Card, a) })
	}
}

// input checks the flags against each other and the material, and says
// what to compute.
func (hf *heatFlags) input() (answer.HeatInput, error) {
	modes := 0
	for _, on := range []bool{hf.rate.set, hf.critical, hf.dsc.set, hf.schedule.set} {
		if on {
			modes++
		}
	}
	switch {
	case modes == 0:
		return answer.HeatInput{}, usagef("heat: give --rate Q, --critical, --dsc Q,Q,... or --schedule (see undercool heat --help)")
	case hf.schedule.set && hf.rate.set:
		return answer.HeatInput{}, usagef("--rate and --schedule: give one path, linear heating at a rate or a schedule")
	case modes > 1:
		return answer.HeatInput{}, usagef("--rate, --critical, --dsc and --schedule: give one of them")
	case hf.rate.set && len(hf.rate.q) > 1:
		return answer.HeatInput{}, usagef("--rate: give one heating rate (for several, --dsc)")
	case hf.schedule.set && (hf.from.set || hf.to.set || hf.cooledAt.set):
		return answer.HeatInput{}, usagef("--from, --to and --cooled-at: apply to linear heating; a schedule says where it starts and ends (to carry the nuclei of the cooling that made the glass, start the schedule at Te and write that cooling as its first step)")
	case hf.cooledAt.set && len(hf.cooledAt.q) > 1:
		return answer.HeatInput{}, usagef("--cooled-at: give one cooling rate")
	case hf.plot.set && !(hf.dsc.set || hf.rate.set):
		return answer.HeatInput{}, usagef("--plot: draws the dX/dT curves of --dsc or --rate")
	}
	c, md, err := hf.mf.model()
	if err != nil {
		return answer.HeatInput{}, err
	}
	switch {
	case !md.HasTe():
		return answer.HeatInput{}, noTe("heat", "no temperature for heating to end at")
	case !md.HasGrowth():
		return answer.HeatInput{}, noMobility("transformed fraction")
	case !md.HasRate():
		return answer.HeatInput{}, usage(kinetics.ErrNoRate)
	}
	in := answer.HeatInput{Card: c, Model: md, X: hf.fraction.X[0], Critical: hf.critical, DSC: hf.dsc.q, Names: flagNames}
	if hf.schedule.set {
		in.Schedule = &hf.schedule.s
		return in, nil
	}
	if hf.rate.set {
		in.Rate = hf.rate.q[0]
	}
	if hf.cooledAt.set {
		in.CooledAt = hf.cooledAt.q[0]
	}
	if in.From, err = hf.start(md, "from"); err != nil {
		return in, err
	}
	in.To = md.Te()
	if hf.to.set {
		in.To = hf.to.x
	}
	if !(in.To > in.From) {
		return in, usagef("--to: %.2f K is not above the start of heating, %.2f K (--from)", in.To, in.From)
	}
	return in, nil
}

// start is where linear heating starts: the flag (--from, or report's
// --heat-from), or the card's Tg.
func (hf *heatFlags) start(md *kinetics.Model, name string) (float64, error) {
	te, tg := md.Te(), md.Tg()
	switch {
	case (!hf.from.set || hf.from.tg) && !(tg > 0):
		return 0, usagef("--%s: the card has no glass transition Tg; give the start of heating, e.g. --%s 25C", name, name)
	case !hf.from.set || hf.from.tg:
		return tg, nil
	case !(hf.from.x < te):
		return 0, usagef("--%s: %s is not below the equilibrium temperature %.2f K: nothing crystallizes above it", name, hf.from.text, te)
	}
	return hf.from.x, nil
}

// heatPlotPoints is the number of temperatures of each dX/dT curve.
const heatPlotPoints = 400

// heatPlot draws dX/dT against temperature for each heating rate: the
// forward DSC curves (the heat flow over the heat of crystallization and
// the rate), with the peaks marked.
func heatPlot(pf *plotFlag, c *presets.Card, a answer.Answer) error {
	var h *kinetics.Heating
	var md *kinetics.Model
	var rates []float64
	switch a := a.(type) {
	case *answer.DSC:
		h, md = a.Path, a.Model
		for _, r := range a.Rows {
			rates = append(rates, float64(r.Rate))
		}
	case *answer.Heat:
		h, md, rates = a.Path, a.Model, []float64{float64(a.Rate)}
	default:
		return usagef("--plot: draws the dX/dT curves of --dsc or --rate")
	}
	p := plot.New()
	p.Title.Text = "forward DSC, " + figureName(c)
	p.X.Label.Text = "temperature (K)"
	p.Y.Label.Text = "dX/dT (1/K)"
	hi := math.Min(h.To, md.Te())
	drawn := 0
	var curves []plotter.XYs
	for i, q := range rates {
		var pts plotter.XYs
		for _, T := range answer.Spread(h.From, hi, heatPlotPoints) {
			if y := math.Exp(h.At(T, q).LnRate); finitePositive(y) || y == 0 {
				pts = append(pts, plotter.XY{X: T, Y: y})
			}
		}
		if len(pts) < 2 {
			continue
		}
		curves = append(curves, pts)
		if err := linePlot(p, pts, curveColor(i), 1.5, nil, fmt.Sprintf("%.4g K/min", 60*q)); err != nil {
			return err
		}
		if pk := h.Peak(q); pk.Interior {
			s, err := plotter.NewScatter(plotter.XYs{{X: pk.T, Y: math.Exp(pk.LnRate)}})
			if err != nil {
				return placef("--plot: %v", err)
			}
			s.GlyphStyle = draw.GlyphStyle{Color: curveColor(i), Radius: vg.Points(3), Shape: draw.CircleGlyph{}}
			p.Add(s)
		}
		drawn++
	}
	if drawn == 0 {
		return usagef("--plot: nothing to draw: nothing crystallizes on the path")
	}
	if lo, up, ok := peakSpan(curves); ok {
		p.X.Min, p.X.Max = math.Max(h.From, lo), math.Min(hi, up)
	}
	p.Add(plotter.NewGrid())
	p.Legend.Top = true
	return savePlots(pf, p)
}

// peakSpan is the span of x where some curve lies above a thousandth of
// its own largest y, widened by a tenth of itself on each side: where DSC
// curves are not flat. ok is false when no curve rises above zero.
func peakSpan(curves []plotter.XYs) (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, c := range curves {
		top := 0.0
		for _, pt := range c {
			top = math.Max(top, pt.Y)
		}
		for _, pt := range c {
			if top > 0 && pt.Y > 1e-3*top {
				lo, hi = math.Min(lo, pt.X), math.Max(hi, pt.X)
			}
		}
	}
	if !(hi >= lo) {
		return 0, 0, false
	}
	pad := (hi - lo) / 10
	return lo - pad, hi + pad, true
}
