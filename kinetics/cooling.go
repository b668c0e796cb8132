package kinetics

import (
	"errors"
	"fmt"
	"math"
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
// A crossing (a fraction or one nucleus reached) is then found by stepping
// through its grid step again in crossSteps parts.
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
	Temp   []float64 // the grid, descending from T_e to the coldest point computed
	Sums   Sums      // running integrals at q = 1 K/s (time τ = T_e − T)
	endIdx int       // index into Temp and Sums of the end
	md     *Model
	lnJ, u []float64
	states []accum
}

// ErrEndAboveTe is returned when the end of the path is not below T_e.
var ErrEndAboveTe = errors.New("the end temperature must be below the equilibrium temperature")

// floor returns the coldest temperature worth computing: AutoFloor·T_e,
// or just above where the mobility law diverges.
func (md *Model) floor() float64 {
	lo := AutoFloor * md.m.Te
	switch m := md.m.Mobility.(type) {
	case VFT:
		lo = math.Max(lo, m.T0+1e-3*(md.m.Te-m.T0))
	case WLF:
		d := m.Tg - m.C2
		lo = math.Max(lo, d+1e-3*(md.m.Te-d))
	}
	return lo
}

// LinearCooling computes linear cooling from T_e down to end (K). end = 0
// means: the glass transition where the material has one, else where the
// rest of the path is negligible. Errors: ErrNoRate, ErrNoGrowth,
// ErrEndAboveTe.
func (md *Model) LinearCooling(end float64) (*Cooling, error) {
	if !md.HasRate() {
		return nil, ErrNoRate
	}
	if !md.HasGrowth() {
		return nil, ErrNoGrowth
	}
	te := md.m.Te
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
	T, lnJ, u := md.coolingGrid(te, lo, maxLnStep, farLnStep)
	tau := make([]float64, len(T))
	for i := range T {
		tau[i] = te - T[i]
	}
	c.Temp, c.lnJ, c.u = T, lnJ, u
	c.Sums = integrate(tau, lnJ, u, &c.states)
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

// coolingGrid returns temperatures from hi down to lo with ln J and u,
// on a grid refined where ln J or ln u change fast in the part that
// matters: by more than near within spanLn of the largest ln J, by more
// than far within farSpanLn of it (see baseSteps).
func (md *Model) coolingGrid(hi, lo, near, far float64) (T, lnJ, u []float64) {
	type node struct{ T, lnJ, u, lnU float64 }
	eval := func(t float64) node {
		lnJ, u := md.rateAndGrowth(t)
		return node{t, lnJ, u, math.Log(u)}
	}
	base := make([]node, baseSteps+1)
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
	nodes := make([]node, 0, 4*len(base))
	minStep := 1e-9 * hi
	lnUMin := math.Log(uSpan * maxU)
	// split reports whether the step from a to b needs a point between.
	split := func(a, b node) bool {
		if a.T-b.T <= minStep || len(nodes) >= maxNodes {
			return false
		}
		if top := math.Max(a.lnJ, b.lnJ); top > maxJ-farSpanLn {
			step := near
			if top < maxJ-spanLn {
				step = far
			}
			if math.IsInf(a.lnJ, -1) || math.IsInf(b.lnJ, -1) || math.Abs(b.lnJ-a.lnJ) > step {
				return true
			}
		}
		if maxU > 0 && math.Max(a.lnU, b.lnU) > lnUMin {
			if math.IsInf(a.lnU, -1) || math.IsInf(b.lnU, -1) || math.Abs(b.lnU-a.lnU) > near {
				return true
			}
		}
		return false
	}
	var refine func(a, b node, depth int)
	refine = func(a, b node, depth int) {
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
	T, lnJ, u = make([]float64, len(nodes)), make([]float64, len(nodes)), make([]float64, len(nodes))
	for i, n := range nodes {
		T[i], lnJ[i], u[i] = n.T, n.lnJ, n.u
	}
	return T, lnJ, u
}

// rateAndGrowth is ln J and u ≥ 0 at T.
func (md *Model) rateAndGrowth(T float64) (lnJ, u float64) {
	s := md.At(T)
	u = s.Growth
	if !(u > 0) {
		u = 0
	}
	return s.LnJ, u
}

// refine steps through grid step i again in crossSteps parts and returns
// the temperature where val first reaches level in it (the end of the step
// if the finer sum stays just short of it).
func (c *Cooling) refine(i int, level float64, val func(*accum) float64) float64 {
	a := c.states[i]
	Ta, Tb := c.Temp[i], c.Temp[i+1]
	prevT, prevV, prevJ, prevU := Ta, val(&a), c.lnJ[i], c.u[i]
	for k := 1; k <= crossSteps; k++ {
		T := Ta + (Tb-Ta)*float64(k)/crossSteps
		lnJ, u := c.lnJ[i+1], c.u[i+1]
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

// cross returns the temperature where val (LnN or LnXext of the sums, with
// the same quantity of an accumulator) first reaches level before the end
// of the path, and false if it does not.
func (c *Cooling) cross(y []float64, level float64, val func(*accum) float64) (float64, bool) {
	i, _, ok := crossing(y, level)
	if !ok {
		return 0, false
	}
	T := c.refine(i, level, val)
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
	T, ok := c.cross(c.Sums.LnXext, level, (*accum).lnXext)
	if !ok && c.LnXextUnit() >= level-1e-9 {
		// reached only at the end of the path (q is the critical rate)
		T, ok = c.End, true
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
