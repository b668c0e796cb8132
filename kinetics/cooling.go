package kinetics

import (
	"errors"
	"fmt"
	"math"
	"sync"
)

// EndReason says where a linear cooling stops.
type EndReason int

const (
	// EndGiven: at the temperature the caller gave.
	EndGiven EndReason = iota
	// EndGlass: at the glass transition of the material; below it the
	// parent is frozen.
	EndGlass
	// EndNegligible: where the rest of the path adds less than
	// NegligibleRest of the extended volume at the coldest point
	// considered (AutoFloor·T_e, or just above the temperature where the
	// mobility law diverges).
	EndNegligible
)

var endReasons = [...]string{"given", "glass transition", "rest negligible"}

func (e EndReason) String() string { return endReasons[e] }

// Choices behind an automatic end of the path.
const (
	NegligibleRest = 1e-6 // relative part of the extended volume left out
	AutoFloor      = 0.02 // coldest temperature considered, as a fraction of T_e
)

// Grid resolution: a step is halved where ln J changes by more than
// maxLnStep between its ends in the part of the path that matters most
// (ln J within spanLn of its largest value), by more than farLnStep where
// ln J is within farSpanLn of it (where slow rates reach small fractions
// and small samples see their first nucleus), or where ln u changes by
// more than maxLnStep. The
// exponential-trapezoid rule of the integrator is exact for ln J linear in a
// step, so its error comes only from the curvature of ln J.
// The totals at the end of the path (the critical rate, the fraction at a
// rate) are computed without the farLnStep refinement, which changes them
// by a few parts in 10⁹ (TestCoolingTotalsGrid); the crossings use the grid
// with it. A crossing (a fraction or one nucleus reached) is then found by
// stepping through its grid step again in crossSteps parts.
const (
	baseSteps  = 128
	maxLnStep  = 0.5
	spanLn     = 40
	farLnStep  = 2
	farSpanLn  = 400
	uSpan      = 1e-6
	maxNodes   = 1 << 14
	crossSteps = 32
)

// Cooling is linear cooling from T_e at any rate, computed once for a
// unit rate. With τ = T_e − T, every time is τ/q, the nuclei per volume
// scale as 1/q and the extended volume as 1/q⁴ exactly:
//
//	Xext(T; q) = (4π/(3q⁴))·∫_T^{T_e} J(T')·[∫_T^{T'} u dT'']³ dT'
//
// so one integral answers for every rate. (Uhlmann D.R., J. Non-Cryst.
// Solids 7 (1972) 337 for the use in glass formation; the q⁻⁴ scaling
// follows from the change of variable t = (T_e − T)/q.)
type Cooling struct {
	Te     float64   // K
	End    float64   // K, the end of the path
	Reason EndReason // why it ends there
	// Temp is the grid of the totals, descending from T_e to the coldest
	// point computed, refined where ln J is within spanLn of its largest
	// value and where ln u changes fast (see coolingGrid); Sums are the
	// running integrals on it at q = 1 K/s (time τ = T_e − T).
	Temp   []float64
	Sums   Sums
	endIdx int // index into Temp and Sums of the end
	md     *Model
	lo     float64 // K, the coldest point computed
	// fine is the grid refined in the far part of ln J too, with the
	// accumulator at every point, for the crossings (a small fraction at
	// a slow rate, the first nucleus in a small volume); it is built on
	// the first crossing asked for.
	fine     *crossGrid
	fineOnce sync.Once
}

// crossGrid is a cooling grid with ln J, u and the accumulator at every
// point, for finding crossings.
type crossGrid struct {
	T, lnJ, u []float64
	states    []accum
}

// ErrEndAboveTe is returned when the end of the path is not below T_e.
var ErrEndAboveTe = errors.New("the end temperature must be below the equilibrium temperature")

// ErrNoTe is returned for linear cooling of a model without an equilibrium
// temperature to start from (a fixed supersaturation; see HasTe).
var ErrNoTe = errors.New("linear cooling starts at the equilibrium temperature, and the model has none")

// floor returns the coldest temperature worth computing: AutoFloor·T_e,
// or just above where the mobility law diverges.
func (md *Model) floor() float64 {
	lo := AutoFloor * md.te
	switch m := md.m.Mobility.(type) {
	case VFT:
		lo = math.Max(lo, m.T0+1e-3*(md.te-m.T0))
	case WLF:
		d := m.Tg - m.C2
		lo = math.Max(lo, d+1e-3*(md.te-d))
	}
	return lo
}

// LinearCooling computes linear cooling from T_e down to end (K). end = 0
// means: the glass transition where the material has one, else where the
// rest of the path is negligible. Errors: ErrNoRate, ErrNoGrowth, ErrNoTe,
// ErrEndAboveTe.
func (md *Model) LinearCooling(end float64) (*Cooling, error) {
	if !md.HasTe() {
		return nil, ErrNoTe
	}
	if !md.HasRate() {
		return nil, ErrNoRate
	}
	if !md.HasGrowth() {
		return nil, ErrNoGrowth
	}
	te := md.te
	c := &Cooling{Te: te, md: md}
	lo := end
	switch {
	case end > 0:
		c.Reason = EndGiven
	case md.m.Tg > 0:
		c.Reason, lo = EndGlass, md.m.Tg
	default:
		c.Reason, lo = EndNegligible, md.floor()
	}
	if !(lo < te) || !(lo > 0) {
		return nil, fmt.Errorf("%w (end %g K, equilibrium %g K)", ErrEndAboveTe, lo, te)
	}
	c.lo = lo
	// The totals (the critical rate, the fraction at the end, and the end
	// where the rest is negligible) need no refinement in the far part of
	// ln J: the nuclei born there add less than e^(−spanLn) of the extended
	// volume, and the critical rate agrees with that on the grid refined
	// there too to a few parts in 10⁹ on the shipped cards
	// (TestCoolingTotalsGrid). The crossings refine it on demand.
	T, lnJ, u := md.coolingGrid(te, lo, gridSpec{near: maxLnStep, far: math.Inf(1), u: maxLnStep})
	tau := make([]float64, len(T))
	for i := range T {
		tau[i] = te - T[i]
	}
	c.Temp = T
	c.Sums = integrate(tau, lnJ, u, nil)
	last := len(T) - 1
	c.End, c.endIdx = T[last], last
	if c.Reason == EndNegligible {
		total := c.Sums.LnXext[last]
		if !math.IsInf(total, -1) {
			if i, f, ok := crossing(c.Sums.LnXext, total+math.Log1p(-NegligibleRest)); ok {
				c.End = at(T, i, f)
			}
		}
	}
	return c, nil
}

// crossGrid returns the grid for crossings, building it on first use:
// the grid of the totals refined also where ln J changes by more than
// farLnStep within farSpanLn of its largest value.
func (c *Cooling) crossGrid() *crossGrid {
	c.fineOnce.Do(c.buildCrossGrid)
	return c.fine
}

func (c *Cooling) buildCrossGrid() {
	T, lnJ, u := c.md.coolingGrid(c.Te, c.lo, gridSpec{near: maxLnStep, far: farLnStep, u: maxLnStep})
	tau := make([]float64, len(T))
	for i := range T {
		tau[i] = c.Te - T[i]
	}
	g := &crossGrid{T: T, lnJ: lnJ, u: u}
	integrate(tau, lnJ, u, &g.states)
	c.fine = g
}

// gridSpec is how finely a cooling grid follows ln J and ln u: a step is
// halved where ln J changes by more than near between its ends within
// spanLn of the largest ln J, by more than far within farSpanLn of it
// (+Inf: not at all), or where ln u changes by more than u.
// At most max nodes (0: maxNodes).
type gridSpec struct {
	near, far, u float64
	max          int
}

// coolingGrid returns temperatures from hi down to lo with ln J and u,
// on a grid refined where ln J or ln u change fast in the part that
// matters (see gridSpec and baseSteps).
func (md *Model) coolingGrid(hi, lo float64, g gridSpec) (T, lnJ, u []float64) {
	eval := func(t float64) gridNode {
		lnJ, u := md.rateAndGrowth(t)
		return gridNode{t, lnJ, u, math.Log(u)}
	}
	work := gridWork.Get().(*gridBuffers)
	base := work.base
	maxJ, maxU := math.Inf(-1), 0.0
	for i := range base {
		t := hi - (hi-lo)*float64(i)/baseSteps
		if i == baseSteps {
			t = lo
		}
		base[i] = eval(t)
		maxJ = math.Max(maxJ, base[i].lnJ)
		maxU = math.Max(maxU, base[i].u)
	}
	nodes := work.nodes[:0]
	minStep := 1e-9 * hi
	most := g.max
	if most == 0 {
		most = maxNodes
	}
	lnUMin := math.Log(uSpan * maxU)
	// split reports whether the step from a to b needs a point between.
	split := func(a, b gridNode) bool {
		if a.T-b.T <= minStep || len(nodes) >= most {
			return false
		}
		if top := math.Max(a.lnJ, b.lnJ); top > maxJ-farSpanLn {
			step := g.near
			if top < maxJ-spanLn {
				step = g.far
			}
			if math.IsInf(a.lnJ, -1) || math.IsInf(b.lnJ, -1) || math.Abs(b.lnJ-a.lnJ) > step {
				return true
			}
		}
		if maxU > 0 && math.Max(a.lnU, b.lnU) > lnUMin {
			if math.IsInf(a.lnU, -1) || math.IsInf(b.lnU, -1) || math.Abs(b.lnU-a.lnU) > g.u {
				return true
			}
		}
		return false
	}
	var refine func(a, b gridNode, depth int)
	refine = func(a, b gridNode, depth int) {
		if depth < 20 && split(a, b) {
			m := eval((a.T + b.T) / 2)
			refine(a, m, depth+1)
			refine(m, b, depth+1)
			return
		}
		nodes = append(nodes, b)
	}
	nodes = append(nodes, base[0])
	if !(math.IsInf(maxJ, -1) || math.IsNaN(maxJ)) {
		for i := 0; i+1 < len(base); i++ {
			refine(base[i], base[i+1], 0)
		}
	} else {
		nodes = append(nodes, base[1:]...)
	}
	n := len(nodes)
	buf := make([]float64, 3*n) // one allocation for the three columns
	T, lnJ, u = buf[:n:n], buf[n:2*n:2*n], buf[2*n:]
	for i, n := range nodes {
		T[i], lnJ[i], u[i] = n.T, n.lnJ, n.u
	}
	work.nodes = nodes[:0]
	gridWork.Put(work)
	return T, lnJ, u
}

// gridNode is a point of a cooling grid while it is built.
type gridNode struct{ T, lnJ, u, lnU float64 }

// gridBuffers are the working slices of coolingGrid, kept in gridWork
// between calls: a Monte Carlo run builds a grid for every sample.
type gridBuffers struct{ base, nodes []gridNode }

var gridWork = sync.Pool{New: func() any {
	return &gridBuffers{base: make([]gridNode, baseSteps+1), nodes: make([]gridNode, 0, 4*(baseSteps+1))}
}}

// rateAndGrowth is ln J and u ≥ 0 at T.
func (md *Model) rateAndGrowth(T float64) (lnJ, u float64) {
	s := md.state(T)
	u = s.Growth
	if !(u > 0) {
		u = 0
	}
	return s.LnJ, u
}

// refine steps through step i of the crossing grid again in crossSteps
// parts and returns the temperature where val first reaches level in it
// (the end of the step if the finer sum stays just short of it).
func (c *Cooling) refine(g *crossGrid, i int, level float64, val func(*accum) float64) float64 {
	a := g.states[i]
	Ta, Tb := g.T[i], g.T[i+1]
	prevT, prevV, prevJ, prevU := Ta, val(&a), g.lnJ[i], g.u[i]
	for k := 1; k <= crossSteps; k++ {
		T := Ta + (Tb-Ta)*float64(k)/crossSteps
		lnJ, u := g.lnJ[i+1], g.u[i+1]
		if k < crossSteps {
			lnJ, u = c.md.rateAndGrowth(T)
		}
		a.step(prevT-T, prevJ, lnJ, prevU, u)
		v := val(&a)
		if v >= level {
			if math.IsInf(prevV, -1) || !(v > prevV) {
				return T
			}
			return prevT + (T-prevT)*(level-prevV)/(v-prevV)
		}
		prevT, prevV, prevJ, prevU = T, v, lnJ, u
	}
	return Tb
}

// cross returns the temperature where val (the lnN or lnXext of an
// accumulator) first reaches level before the end of the path, and false
// if it does not. It searches the crossing grid (see crossGrid).
func (c *Cooling) cross(level float64, val func(*accum) float64) (float64, bool) {
	g := c.crossGrid()
	i := -1
	for k := 1; k < len(g.states); k++ {
		if val(&g.states[k]) >= level {
			i = k - 1
			break
		}
	}
	if i < 0 {
		return 0, false
	}
	T := c.refine(g, i, level, val)
	if T < c.End {
		return 0, false
	}
	return T, true
}

// LnXextUnit is ln of the extended volume fraction at the end of the path
// for a rate of 1 K/s; at rate q it is this minus 4·ln q.
func (c *Cooling) LnXextUnit() float64 { return c.Sums.LnXext[c.endIdx] }

// Fraction is the transformed fraction at the end of the path for cooling
// rate q (K/s, > 0).
func (c *Cooling) Fraction(q float64) float64 { return Fraction(c.LnXextUnit() - 4*math.Log(q)) }

// CriticalRate is the cooling rate (K/s) that keeps the transformed
// fraction at the end of the path at X (0 < X < 1): from Xext ∝ q⁻⁴,
//
//	q_c = [Xext(1 K/s)/(−ln(1 − X))]^(1/4)
//
// with no root search. Special case: nothing nucleates on the path gives 0.
func (c *Cooling) CriticalRate(X float64) float64 {
	if !(X > 0 && X < 1) {
		panic("kinetics: CriticalRate: fraction must be in (0, 1)")
	}
	return math.Exp((c.LnXextUnit() - lnXextOf(X)) / 4)
}

// CCTPoint is where linear cooling at one rate reaches a fraction.
type CCTPoint struct {
	Rate    float64 // K/s
	Reached bool    // false: the fraction is not reached before the end of the path
	Temp    float64 // K
	Time    float64 // s from the start of cooling at T_e
}

// Reach returns where cooling at rate q (K/s, > 0) first reaches fraction X.
func (c *Cooling) Reach(q, X float64) CCTPoint {
	if !(q > 0) || !(X > 0 && X < 1) {
		panic("kinetics: Cooling.Reach: need q > 0 and 0 < X < 1")
	}
	p := CCTPoint{Rate: q}
	level := lnXextOf(X) + 4*math.Log(q)
	// At the critical rate (level within 1e-9 of the total) X is reached
	// at the end of the path: near the end the extended volume can stay
	// within parts in 10¹⁴ of its total over kelvins, so a crossing found
	// on that plateau would be rounding noise.
	T, ok := c.End, true
	if total := c.LnXextUnit(); math.Abs(level-total) > 1e-9 {
		T, ok = c.cross(level, (*accum).lnXext)
		if !ok && total >= level-1e-9 {
			// reached only at the end of the path
			T, ok = c.End, true
		}
	}
	if ok {
		p.Reached, p.Temp, p.Time = true, T, (c.Te-T)/q
	}
	return p
}

// CCT is the continuous-cooling-transformation table for fraction X: for
// each rate (K/s), where linear cooling from T_e reaches X.
func (c *Cooling) CCT(rates []float64, X float64) []CCTPoint {
	out := make([]CCTPoint, len(rates))
	for i, q := range rates {
		out[i] = c.Reach(q, X)
	}
	return out
}

// NoseEstimate is the classical estimate of the critical cooling rate from
// the nose (T_n, t_n) of the isothermal TTT curve,
//
//	q ≈ (T_e − T_n)/t_n
//
// which overstates the rate the exact integral gives, since a cooling path
// spends only part of its time near the nose (Uhlmann 1972; Kelton and
// Greer (2010) §14.3, from memory for the section).
func NoseEstimate(te, tNose, timeNose float64) float64 { return (te - tNose) / timeNose }

// NoseRate is the nose estimate for fraction X: the nose of the isothermal
// TTT curve (continuous nucleation, no time lag) searched between the end
// of the path and T_e, and (T_e − T_n)/t_n. Special case: nothing
// transforms anywhere in the range gives a rate of 0 and a nose with T NaN.
func (c *Cooling) NoseRate(X float64) (float64, Nose, error) {
	n, err := c.md.Nose(c.End, c.Te, X, JMAK{})
	if err != nil {
		return 0, n, err
	}
	if math.IsNaN(n.T) || math.IsInf(n.LnTime, 1) {
		return 0, n, nil
	}
	return NoseEstimate(c.Te, n.T, math.Exp(n.LnTime)), n, nil
}
