package population

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sort"

	"undercool/kinetics"
)

// model is the physics the engine integrates: a parent phase (a solid
// solution, a solution) whose solute is shared between the parent and
// particles in size classes.
type model interface {
	// at evaluates the state at temperature T (K) when the particles hold
	// the cube sum m3 = Σ n·x³ (m³ per m³), a time since (s) after the
	// parent became supersaturated.
	at(T, m3, since float64) point
	// growth is dx/dt (m/s) of a particle of size x (m) at p; −Inf: the
	// particle cannot exist there and dissolves at once.
	growth(p *point, x float64) float64
	// supersaturated reports whether the parent, with none of its solute
	// in particles, is supersaturated at T: the clock of the nucleation
	// time lag starts where it becomes so.
	supersaturated(T float64) bool
}

// point is the state of the parent at one time.
type point struct {
	T     float64 // K
	ok    bool    // the state is physical (positive concentration, volume fraction below 1)
	conc  float64 // what is left dissolved: mole fraction (alloy) or mol per m³ of solvent (solution)
	eq    float64 // its equilibrium value at T (solvus, solubility)
	lnJ   float64 // ln J, J in m⁻³·s⁻¹; −Inf: no nucleation
	birth float64 // size of a newly born particle, m; NaN: none
	crit  float64 // critical radius r*, m; +Inf: none

	// growth-law values at this state, set by the model
	diff, alpha, g float64
}

// Options are the numerical settings of a run. The zero value asks for the
// defaults.
type Options struct {
	// MaxClasses bounds the number of size classes (default 500): past it
	// the two closest classes are merged; when dissolution has removed
	// half of the classes there were (and 8 or more remain), every class is
	// split in two.
	MaxClasses int
	// RelTol is the tolerance on the change of a class's size in one step,
	// relative to the larger of its size and the mean size (default 1e-3).
	// The same tolerance applies to the number born in a step.
	RelTol float64
	// ConcTol is the tolerance on the dissolved concentration after a
	// step, relative to its distance from equilibrium (default 1e-3): the
	// mass balance of the step.
	ConcTol float64
	// Times are the times of the output rows (s, within the schedule,
	// ascending); nil: the start, the break points of the schedule and ten
	// times a decade from a millionth of its duration to its end.
	Times []float64
	// Progress, if set, is called after every output row.
	Progress func(Progress)
}

// Progress is how far a run has gone.
type Progress struct {
	Time, Start, End float64 // s
	Steps, Classes   int
}

// Fraction is the part of the schedule done, 0 to 1.
func (p Progress) Fraction() float64 { return (p.Time - p.Start) / (p.End - p.Start) }

// Defaults of Options.
const (
	DefaultMaxClasses = 500
	DefaultRelTol     = 1e-3
	DefaultConcTol    = 1e-3
)

const (
	minSplit      = 8       // fewest classes that are split to restore resolution
	vanishSteps   = 4       // a shrinking class that would vanish within this many steps, or is below half the mean size, is not held to RelTol
	concFloor     = 1e-3    // the distance from equilibrium below which ConcTol is taken of the equilibrium value times this
	numberFloor   = 1.0     // m⁻³: numbers born below this need no accuracy (one particle per cubic metre)
	negligible    = 1e-12   // births below this fraction of the particles present are not made a class
	maxSteps      = 5000000 // a run that needs more steps has failed
	cancelEvery   = 16      // steps between looks at the context
	stepGrowth    = 5       // largest factor by which a step grows
	stepShrinkMin = 0.1     // smallest factor by which a rejected step shrinks
	maxStepDT     = 1.0     // K: the most the temperature changes in one step
)

// ErrStepUnderflow is returned when the step size collapses: the run
// cannot go on at the tolerances asked.
var ErrStepUnderflow = errors.New("the time step collapsed: the run cannot meet its tolerances")

// ErrTooManySteps is returned when a run needs more than five million steps.
var ErrTooManySteps = errors.New("the run needed more than 5000000 steps")

func (o Options) withDefaults() (Options, error) {
	if o.MaxClasses == 0 {
		o.MaxClasses = DefaultMaxClasses
	}
	if o.RelTol == 0 {
		o.RelTol = DefaultRelTol
	}
	if o.ConcTol == 0 {
		o.ConcTol = DefaultConcTol
	}
	if o.MaxClasses < 2*minSplit {
		return o, fmt.Errorf("the class bound must be at least %d, got %d", 2*minSplit, o.MaxClasses)
	}
	if !(o.RelTol > 0 && o.RelTol < 0.5) || !(o.ConcTol > 0 && o.ConcTol < 0.5) {
		return o, fmt.Errorf("the tolerances must lie in (0, 0.5), got %g and %g", o.RelTol, o.ConcTol)
	}
	return o, nil
}

// engine integrates a population of size classes along a schedule.
type engine struct {
	m   model
	s   kinetics.Schedule
	opt Options

	x, n   []float64 // sizes (m, ascending) and numbers (m⁻³) of the classes
	t, dt  float64   // time and proposed step, s
	on     float64   // time the parent last became supersaturated, s
	steps  int
	peak   int       // most classes at once
	high   int       // most classes since the last split
	k1, k2 []float64 // scratch: rates at the start and after the predictor
	xe, xh []float64 // scratch: Euler and Heun sizes
}

// sample is what the engine hands out at an output time.
type sample struct {
	t    float64
	p    point
	x, n []float64 // the classes (not to be kept: copy)
}

func newEngine(m model, s kinetics.Schedule, opt Options, x0, n0 []float64) (*engine, error) {
	opt, err := opt.withDefaults()
	if err != nil {
		return nil, err
	}
	if len(s.Time) < 2 || !(s.Duration() > 0) {
		return nil, kinetics.ErrEmptySchedule
	}
	e := &engine{m: m, s: s, opt: opt, t: s.Start(), on: s.Start()}
	e.x = append(e.x, x0...)
	e.n = append(e.n, n0...)
	sortClasses(e.x, e.n)
	e.dt = s.Duration() * 1e-12
	return e, nil
}

// outputTimes are the times of the rows: the options' or the default set.
func (e *engine) outputTimes() ([]float64, error) {
	t0, t1 := e.s.Start(), e.s.End()
	if e.opt.Times != nil {
		for i, t := range e.opt.Times {
			if !(t >= t0 && t <= t1) || (i > 0 && !(t > e.opt.Times[i-1])) {
				return nil, fmt.Errorf("output time %d (%g s) must lie within the schedule (%g to %g s) and after the one before", i+1, t, t0, t1)
			}
		}
		return e.opt.Times, nil
	}
	d := t1 - t0
	out := append([]float64{t0}, e.s.Breaks()...)
	const perDecade = 10
	for k := -6 * perDecade; k <= 0; k++ {
		out = append(out, t0+d*math.Pow(10, float64(k)/perDecade))
	}
	out = append(out, t1)
	return uniqueSorted(out), nil
}

// uniqueSorted sorts times and drops repeats (within 1e-12 relative).
func uniqueSorted(ts []float64) []float64 {
	sort.Float64s(ts)
	out := ts[:0]
	for _, t := range ts {
		if len(out) == 0 || t-out[len(out)-1] > 1e-12*math.Abs(t) {
			out = append(out, t)
		}
	}
	return out
}

// run integrates from the start of the schedule to its end and calls emit
// at every output time.
func (e *engine) run(ctx context.Context, emit func(sample)) error {
	rows, err := e.outputTimes()
	if err != nil {
		return err
	}
	stops := uniqueSorted(append(append([]float64(nil), rows...), e.s.Breaks()...))
	r := 0
	for _, stop := range stops {
		if err := e.advance(ctx, stop); err != nil {
			return err
		}
		for r < len(rows) && rows[r] <= e.t*(1+1e-12) {
			emit(sample{t: e.t, p: e.state(e.t), x: e.x, n: e.n})
			if e.opt.Progress != nil {
				e.opt.Progress(Progress{Time: e.t, Start: e.s.Start(), End: e.s.End(), Steps: e.steps, Classes: len(e.x)})
			}
			r++
		}
	}
	return nil
}

// runRows checks that the solubility law covers the schedule, runs the
// engine from the classes x0, n0 and makes one row of every output
// sample; it returns the rows, the last sample and the engine.
func runRows[R any](ctx context.Context, m model, sol Solubility, what string, s kinetics.Schedule, opt Options, x0, n0 []float64, row func(sample) R) ([]R, sample, *engine, error) {
	if err := coversSchedule(sol, s, what); err != nil {
		return nil, sample{}, nil, err
	}
	e, err := newEngine(m, s, opt, x0, n0)
	if err != nil {
		return nil, sample{}, nil, err
	}
	var rows []R
	var last sample
	err = e.run(ctx, func(sm sample) {
		rows = append(rows, row(sm))
		// The engine goes on after the last output time (to the end of
		// the schedule): keep the classes of this one.
		last = sm
		last.x, last.n = append([]float64(nil), sm.x...), append([]float64(nil), sm.n...)
	})
	if err != nil {
		return nil, sample{}, nil, err
	}
	return rows, last, e, nil
}

// state is the parent's state at time t with the present classes.
func (e *engine) state(t float64) point {
	return e.m.at(e.s.At(t), cubeSum(e.x, e.n), t-e.on)
}

func cubeSum(x, n []float64) float64 {
	var m3 float64
	for i := range x {
		m3 += n[i] * x[i] * x[i] * x[i]
	}
	return m3
}

// advance steps until time stop.
func (e *engine) advance(ctx context.Context, stop float64) error {
	for e.t < stop {
		if e.steps%cancelEvery == 0 {
			if err := ctx.Err(); err != nil {
				return err
			}
		}
		if e.steps >= maxSteps {
			return fmt.Errorf("%w (at %g s)", ErrTooManySteps, e.t)
		}
		if err := e.step(stop); err != nil {
			return err
		}
		e.steps++
	}
	e.t = stop
	return nil
}

// step makes one accepted step of Heun's method (the explicit trapezoid
// rule) towards stop, with the Euler predictor as the error estimate.
func (e *engine) step(stop float64) error {
	T0 := e.s.At(e.t)
	if !e.m.supersaturated(T0) {
		e.on = e.t
	}
	since := e.t - e.on
	m3 := cubeSum(e.x, e.n)
	p0 := e.m.at(T0, m3, since)
	if !p0.ok {
		return fmt.Errorf("population: state out of range at %g s", e.t)
	}
	nc := len(e.x)
	e.k1, e.k2, e.xe, e.xh = grow(e.k1, nc), grow(e.k2, nc), grow(e.xe, nc), grow(e.xh, nc)
	var total, mean float64
	for i, x := range e.x {
		e.k1[i] = e.m.growth(&p0, x)
		total += e.n[i]
		mean += e.n[i] * x
	}
	xref := 0.0
	if total > 0 {
		xref = mean / total
	}
	if b := p0.birth; b > xref {
		xref = b
	}
	J0 := rate(p0.lnJ)
	// Along a ramp the step holds the temperature within maxStepDT: the
	// error estimate sees only the ends of a step, and a burst of
	// nucleation in the middle of a fast quench would fall between them.
	hT := math.Inf(1)
	if slope := math.Abs(e.s.Before(stop)-T0) / (stop - e.t); slope > 0 {
		hT = maxStepDT / slope
	}
	for {
		h := math.Min(math.Min(e.dt, hT), stop-e.t)
		if !(h > 0) || e.t+h == e.t {
			if stop-e.t <= 1e-12*math.Abs(stop) {
				e.t = stop
				return nil
			}
			return fmt.Errorf("%w (at %g s)", ErrStepUnderflow, e.t)
		}
		T1 := e.s.Before(e.t + h)
		// Predictor (Euler), with the births of the step at their size at birth.
		var m3e float64
		for i, x := range e.x {
			xe := x + h*e.k1[i]
			if !(xe > 0) {
				xe = 0
			}
			e.xe[i] = xe
			m3e += e.n[i] * xe * xe * xe
		}
		if J0 > 0 && p0.birth > 0 {
			m3e += J0 * h * p0.birth * p0.birth * p0.birth
		}
		pe := e.m.at(T1, m3e, since+h)
		if !pe.ok {
			e.dt = h / 4
			continue
		}
		// Corrector (trapezoid rule). A class the predictor leaves at a
		// size where it cannot exist (growth −Inf) dissolves at once: its
		// volume, lost, leaves the predictor's state too, so that the two
		// states differ by the error of the step and not by that release.
		var m3h, eSize, lost float64
		for i, x := range e.x {
			xe, xh := e.xe[i], 0.0
			if xe > 0 {
				k2 := e.m.growth(&pe, xe)
				if math.IsInf(k2, -1) {
					lost += e.n[i] * xe * xe * xe
				}
				if xh = x + h*(e.k1[i]+k2)/2; !(xh > 0) {
					xh = 0
				}
			}
			e.xh[i] = xh
			m3h += e.n[i] * xh * xh * xh
			vanishing := e.k1[i] < 0 && (x < xref/2 || x+vanishSteps*h*e.k1[i] <= 0)
			if xe > 0 && xh > 0 && !vanishing {
				eSize = max(eSize, math.Abs(xh-xe)/(e.opt.RelTol*max(x, xref))) // builtin max: the loop is hot
			}
		}
		// Births: the trapezoid rule for their number; they are placed at
		// their mean time of birth within the step (exact for a rate linear
		// in time) and grown from there to its end.
		J1 := rate(pe.lnJ)
		born, xb, eBirth := 0.0, 0.0, 0.0
		if J0+J1 > 0 {
			born = h * (J0 + J1) / 2
			w1 := J1 / (J0 + J1) // the weight of the step's end
			b := (1-w1)*finite(p0.birth) + w1*finite(pe.birth)
			mid := h * (1 + w1) / 3
			g := e.m.growth(&pe, b)
			xb = b + (h-mid)*g
			if !(xb > 0) || math.IsInf(g, 0) || born < negligible*total || born < negligible*numberFloor {
				born, xb = 0, 0
			} else {
				// The particles of the new class were born over the step
				// and are spread over |g|·h in size; one class stands for them.
				spread := math.Abs(g) * h / math.Max(xref, xb)
				eBirth = spread * spread / (4 * e.opt.RelTol)
			}
		}
		m3h += born * xb * xb * xb
		ph := e.m.at(T1, m3h, since+h)
		if !ph.ok {
			e.dt = h / 4
			continue
		}
		pc := pe.conc
		if lost > 0 {
			pc = e.m.at(T1, m3e-lost, since+h).conc
		}
		scale := math.Max(math.Abs(ph.conc-ph.eq), concFloor*math.Abs(ph.eq))
		eConc := math.Abs(ph.conc-pc) / (e.opt.ConcTol * scale)
		eNum := math.Abs(J1-J0) * h / 2 / (e.opt.RelTol*(total+born) + numberFloor)
		err := max(eSize, eConc, eNum, eBirth)
		if math.IsNaN(err) {
			err = math.Inf(1)
		}
		if err > 1 {
			e.dt = h * math.Max(stepShrinkMin, 0.9/math.Sqrt(err))
			continue
		}
		// Accept.
		grown := math.Min(stepGrowth, 0.9/math.Sqrt(math.Max(err, 1e-12)))
		if h == e.dt || h*grown > e.dt {
			e.dt = h * grown
		}
		e.t += h
		e.accept(born, xb)
		return nil
	}
}

func grow(s []float64, n int) []float64 {
	if cap(s) < n {
		return make([]float64, n)
	}
	return s[:n]
}

// rate is J from ln J (0 for −Inf or NaN).
func rate(lnJ float64) float64 {
	if !(lnJ > math.Inf(-1)) {
		return 0
	}
	return math.Exp(lnJ)
}

// finite is x, or 0 where x is NaN or infinite (no nucleus: its rate is 0 anyway).
func finite(x float64) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0
	}
	return x
}

// accept takes the corrected sizes, drops the classes that dissolved, adds
// the births and keeps the class count within its bounds.
func (e *engine) accept(born, xb float64) {
	k := 0
	for i := range e.x {
		if e.xh[i] > 0 {
			e.x[k], e.n[k] = e.xh[i], e.n[i]
			k++
		}
	}
	e.x, e.n = e.x[:k], e.n[:k]
	if !sort.Float64sAreSorted(e.x) {
		sortClasses(e.x, e.n)
	}
	if born > 0 {
		i := sort.SearchFloat64s(e.x, xb)
		e.x = append(e.x, 0)
		e.n = append(e.n, 0)
		copy(e.x[i+1:], e.x[i:])
		copy(e.n[i+1:], e.n[i:])
		e.x[i], e.n[i] = xb, born
	}
	e.peak = max(e.peak, len(e.x))
	for len(e.x) > e.opt.MaxClasses {
		e.mergeClosest()
	}
	e.high = max(e.high, len(e.x))
	if len(e.x) >= minSplit && 2*len(e.x) < e.high {
		e.splitAll()
		e.high = len(e.x)
	}
}

// sortClasses sorts the classes by size (insertion sort: they are nearly
// in order).
func sortClasses(x, n []float64) {
	for i := 1; i < len(x); i++ {
		for j := i; j > 0 && x[j] < x[j-1]; j-- {
			x[j], x[j-1] = x[j-1], x[j]
			n[j], n[j-1] = n[j-1], n[j]
		}
	}
}

// mergeClosest merges the two neighbouring classes closest in log size
// into one, keeping their number and their volume:
//
//	n = n1 + n2,  x = ((n1·x1³ + n2·x2³)/n)^(1/3)
func (e *engine) mergeClosest() {
	best, at := math.Inf(1), -1
	for i := 1; i < len(e.x); i++ {
		if g := e.x[i] / e.x[i-1]; g < best {
			best, at = g, i
		}
	}
	i := at
	n := e.n[i-1] + e.n[i]
	v := e.n[i-1]*e.x[i-1]*e.x[i-1]*e.x[i-1] + e.n[i]*e.x[i]*e.x[i]*e.x[i]
	e.x[i-1], e.n[i-1] = math.Cbrt(v/n), n
	e.x = append(e.x[:i], e.x[i+1:]...)
	e.n = append(e.n[:i], e.n[i+1:]...)
}

// splitAll restores resolution when dissolution has thinned the classes:
// a class stands for the particles between the geometric midpoints to its
// neighbours (its cell; mirrored at the two ends), and each is replaced by
// two classes at the quarter points of its cell in log size, sharing its
// number so that number and volume are kept:
//
//	n_b = n·(x³ − x_a³)/(x_b³ − x_a³),  n_a = n − n_b
func (e *engine) splitAll() {
	m := len(e.x)
	x := make([]float64, 0, 2*m)
	n := make([]float64, 0, 2*m)
	for i := range m {
		var lo, hi float64 // cell edges
		switch {
		case i == 0:
			hi = math.Sqrt(e.x[0] * e.x[1])
			lo = e.x[0] * e.x[0] / hi
		case i == m-1:
			lo = math.Sqrt(e.x[m-2] * e.x[m-1])
			hi = e.x[m-1] * e.x[m-1] / lo
		default:
			lo, hi = math.Sqrt(e.x[i-1]*e.x[i]), math.Sqrt(e.x[i]*e.x[i+1])
		}
		xi := e.x[i]
		xa, xb := math.Sqrt(lo*xi), math.Sqrt(xi*hi)
		if !(xa < xi && xi < xb) {
			x, n = append(x, xi), append(n, e.n[i])
			continue
		}
		c, ca, cb := xi*xi*xi, xa*xa*xa, xb*xb*xb
		nb := e.n[i] * (c - ca) / (cb - ca)
		x, n = append(x, xa, xb), append(n, e.n[i]-nb, nb)
	}
	e.x, e.n = x, n
}
