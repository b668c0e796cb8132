package main

import (
	"encoding/json"
	"errors"
	"math"

	"github.com/spf13/pflag"
	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/plot/plotter"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/answer"
	"undercool/presets/units"
)

func init() {
	commands["cool"] = &command{
		summary: "Cooling paths: the transformed fraction on linear cooling from Te, the critical cooling rate, the onset of nucleation in a sample volume, a measured cooling curve with its additivity sum, and the quench factor against a C-curve.",
		usage: "undercool cool [--material NAME|FILE.toml] [value flags] (--rate Q[,Q...] | --critical | --curve FILE.csv) " +
			"[--fraction X] [--end T] [--volume V] [--c-curve k1=..,k2=..,k3=..,k4=..,k5=..] [--band DT] [--plot FILE.svg|FILE.png] [--format F]",
		example: "undercool cool --material vit1 --critical",
		setup:   setupCool,
	}
}

// coolFlags are the flags of the cool command.
type coolFlags struct {
	mf       *materialFlags
	rate     *ratesFlag
	critical bool
	fraction *fractionFlag
	end      *tempFlag
	volume   *quantityFlag
	curve    *pathFlag
	ccurve   *ccurveFlag
	band     *quantityFlag
	plot     *plotFlag
	format   *formatFlag
	spread   *spreadFlags
}

// The modes of cool: what path, and what is asked of it.
type coolMode int

const (
	coolRates    coolMode = iota // linear cooling at given rates: the CCT table
	coolCritical                 // linear cooling: the critical rate
	coolCurve                    // a measured curve
	coolZone                     // a solution cooled at given rates: the metastable zone
)

func setupCool(fs *pflag.FlagSet, e *env) func([]string) error {
	cf := &coolFlags{mf: addMaterialFlags(fs), rate: &ratesFlag{}}
	fs.Var(cf.rate, "rate", "linear cooling rate from Te, K/s, K/min, K/h or C/s (> 0); several, comma-separated, give a CCT table, e.g. 1,10,100K/s (a bare number takes the unit of the last)")
	fs.BoolVar(&cf.critical, "critical", false, "the critical cooling rate to stay below --fraction, from the exact integral (X_ext scales as rate^-4), with the nose estimate beside it")
	cf.fraction = addFraction(fs, false, "transformed fraction to stay below or to reach, strictly between 0 and 1 (1e-6: the usual detection limit)")
	cf.end = addTemp(fs, e, "end", "end of linear cooling, K, C or F below Te (default: Tg where the card has one, else where the rest of the path adds less than 1e-6 of the extended volume)")
	cf.volume = addVolume(fs, "a sample volume", "sample volume for the onset of nucleation (first nucleus expected), m3, mm3, uL, mL, L or um3 (> 0)")
	cf.curve = addInput(fs, "curve", "measured cooling curve FILE.csv with columns time_UNIT and temperature_UNIT (e.g. time_s,temperature_c), time strictly increasing")
	cf.ccurve = &ccurveFlag{}
	fs.Var(cf.ccurve, "c-curve", "Evancho-Staley C-curve constants k1=..,k2=..,k3=..,k4=..,k5=.. (k1 < 0 dimensionless, k2 s, k3 and k5 J/mol, k4 K) for the quench factor of --curve and its retained property fraction exp(k1 Q); default: none, only the additivity sum against the material's TTT curve")
	cf.band = &quantityFlag{kind: units.TemperatureDifference, what: "a band width, K"}
	if err := cf.band.Set("25K"); err != nil {
		panic(err)
	}
	cf.band.set = false
	fs.Var(cf.band, "band", "width of the temperature bands of the quench-factor table, K (> 0)")
	cf.plot = addPlot(fs, "draw the CCT curve for --fraction over the TTT curve, with the cooling lines of --rate,")
	cf.format = addFormat(fs, e)
	cf.spread = addSpreadFlags(fs)
	return func(args []string) error {
		if err := start("cool", args, cf.spread); err != nil {
			return err
		}
		switch {
		case cf.critical && cf.rate.set:
			return usagef("--critical and --rate: give one or the other (--critical finds the rate; --rate uses the one you give)")
		case cf.curve.set && (cf.critical || cf.rate.set):
			return usagef("--curve and --rate/--critical: give one path, a measured curve or linear cooling")
		case !cf.curve.set && !cf.critical && !cf.rate.set:
			return usagef("cool: give --rate Q, --critical or --curve FILE.csv (see undercool cool --help)")
		case cf.ccurve.set && !cf.curve.set:
			return usagef("--c-curve: the quench factor needs a measured path, give --curve FILE.csv")
		case cf.end.set && cf.curve.set:
			return usagef("--end: applies to linear cooling; a measured curve ends where its file does")
		}
		if cf.curve.set {
			return cf.runCurve(e)
		}
		c, md, err := cf.mf.model()
		if err != nil {
			return err
		}
		mode, err := cf.linearMode(md)
		if err != nil {
			return err
		}
		if mode == coolZone {
			return cf.runZone(e, c, md)
		}
		return cf.runLinear(e, c, md, mode)
	}
}

// linearMode chooses between linear cooling and a metastable zone: a
// solution cooled at given rates into a volume has a zone; a solution
// without --volume has the transformed fraction of a melt when it has a
// growth rate.
func (cf *coolFlags) linearMode(md *kinetics.Model) (coolMode, error) {
	sol, isSol := md.Solution()
	switch {
	case cf.critical:
		return coolCritical, nil
	case !isSol:
		return coolRates, nil
	case !cf.volume.set && md.HasGrowth():
		return coolRates, nil // the transformed fraction on cooling, as for a melt
	case !cf.volume.set:
		return 0, usagef("--volume: required for a cooled solution: the metastable zone ends where the expected number of nuclei in the volume, V times the integral of J dt, reaches 1")
	}
	if _, fixed := sol.(cnt.Supersaturation); fixed {
		return 0, usagef("cool: a fixed supersaturation does not change on cooling; the metastable zone width needs a solubility law: --sat-temp with --dh-sol, or a solubility table (--solubility FILE.csv with --conc)")
	}
	if !md.HasRate() {
		return 0, usagef("the material has no nucleation rate, so no metastable zone: give --prefactor fixed with --j0 (the apparent A that fit induction gives), or a mobility law (--solvent-viscosity, --solute-diffusivity)")
	}
	return coolZone, nil
}

// runLinear answers linear cooling from T_e: at given rates, or the critical rate.
func (cf *coolFlags) runLinear(e *env, c *presets.Card, md *kinetics.Model, mode coolMode) error {
	switch {
	case !md.HasTe():
		return noTe("cool", "no temperature for linear cooling to start from: give --curve FILE.csv for a measured path")
	case !md.HasGrowth():
		return noMobility("transformed fraction")
	case !md.HasRate():
		return usage(kinetics.ErrNoRate)
	case cf.end.set && !(cf.end.x < md.Te()):
		return usagef("--end: %s is not below the equilibrium temperature %.2f K", cf.end.text, md.Te())
	}
	smp, err := cf.spread.sampling(e, c)
	if err != nil {
		return err
	}
	a, err := answer.Cool(answer.LinearInput{Card: c, Model: md, End: cf.end.x, X: cf.fraction.X[0], V: cf.volume.x,
		Rates: cf.rate.q, Critical: mode == coolCritical, Sampling: smp, Names: flagNames})
	if err != nil {
		return err
	}
	return renderWithPlot(e, a, cf.format, cf.plot, func() error {
		if cr, ok := a.(*answer.Critical); ok {
			fig, err := cctFigure(cr.Path, md, c, cr.X, []float64{cr.Qc}, true, cr.Qc)
			if err != nil {
				return err
			}
			return saveFigure(cf.plot, fig)
		}
		cct := a.(*answer.CCT)
		fig, err := cctFigure(cct.Path, md, c, cct.X, cct.Rates, false, cct.Qc)
		if err != nil {
			return err
		}
		return saveFigure(cf.plot, fig)
	})
}

// curveColumns are the columns of a measured cooling curve.
var curveColumns = []presets.Column{
	{Quantity: "time", Kind: units.Time, Required: true},
	{Quantity: "temperature", Kind: units.Temperature, Required: true},
}

// readCurve reads a measured curve and checks it as a path; errors name the
// file and line.
func readCurve(path string, e *env) (kinetics.Path, *presets.Data, error) {
	d, err := presets.ReadDataFile(path, e.stdin, curveColumns)
	if err != nil {
		return kinetics.Path{}, nil, usagef("--curve: %v", err)
	}
	p, err := kinetics.NewPath(d.Columns["time"], d.Columns["temperature"])
	if err != nil {
		var pe *kinetics.PointError
		if errors.As(err, &pe) {
			return kinetics.Path{}, nil, usagef("--curve: %s:%d: %s (time must increase strictly from row to row)", d.File, d.Lines[pe.Index], pe.Msg)
		}
		return kinetics.Path{}, nil, usagef("--curve: %s: %v", d.File, err)
	}
	return p, d, nil
}

// runCurve answers a measured curve.
func (cf *coolFlags) runCurve(e *env) error {
	withMaterial := cf.mf.given() != ""
	switch {
	case !withMaterial && !cf.ccurve.set:
		return usagef("--curve: needs --material (for the fraction and the additivity sum) or --c-curve (for a quench factor alone)")
	case !withMaterial && cf.volume.set:
		return usagef("--volume: the onset of nucleation needs --material")
	}
	p, d, err := readCurve(cf.curve.text, e)
	if err != nil {
		return err
	}
	in := answer.CurveInput{Path: p, Data: d, X: cf.fraction.X[0], V: cf.volume.x, Band: cf.band.x, CCurve: cf.ccurve.c}
	if withMaterial {
		if in.Card, in.Model, err = cf.mf.model(); err != nil {
			return err
		}
		switch md := in.Model; {
		case !md.HasTe():
			return noTe("--curve", "no TTT curve to take the additivity sum against")
		case !md.HasGrowth():
			return noMobility("transformed fraction")
		case !md.HasRate():
			return usage(kinetics.ErrNoRate)
		}
		if in.Sampling, err = cf.spread.sampling(e, in.Card); err != nil {
			return err
		}
	}
	a, err := answer.Curves(in)
	if errors.Is(err, kinetics.ErrTooManyBands) {
		return usagef("--band: %g K over a curve spanning %.2f K gives more than %d bands; use a wider band", cf.band.x, floats.Max(p.Temp)-floats.Min(p.Temp), kinetics.MaxBands)
	}
	if err != nil {
		return err
	}
	return renderWithPlot(e, a, cf.format, cf.plot, func() error { return curvePlot(cf.plot, in, a) })
}

// runZone answers the metastable zone of a cooled solution.
func (cf *coolFlags) runZone(e *env, c *presets.Card, md *kinetics.Model) error {
	a, err := answer.Zones(answer.ZoneInput{Card: c, Model: md, V: cf.volume.x, VolumeText: cf.volume.text, Rates: cf.rate.q,
		End: cf.end.x, EndText: cf.end.text, Names: flagNames})
	if err != nil {
		return err
	}
	if err := cf.format.check(a); err != nil { // before the plot is written
		return err
	}
	var notes []string
	if cf.plot.set {
		var pts plotter.XYs
		for _, r := range a.Rows {
			if w := float64(r.Width); !math.IsNaN(w) {
				pts = append(pts, plotter.XY{X: float64(r.RateMin), Y: w})
			}
		}
		if len(pts) == 0 {
			return usagef("--plot: no rate reaches an onset on this path; nothing to draw")
		}
		if err := zonePlot(cf.plot, figureName(c), pts); err != nil {
			return err
		}
		notes = append(notes, "plot written: "+cf.plot.path)
	}
	return render(e.stdout, cf.format, annotated{a, notes})
}

// annotated is an answer with notes of the command's own (files written).
type annotated struct {
	answer.Answer
	notes []string
}

func (a annotated) Doc() answer.Doc {
	d := a.Answer.Doc()
	d.Notes = append(d.Notes, a.notes...)
	return d
}

func (a annotated) MarshalJSON() ([]byte, error) { return json.Marshal(a.Answer) }
