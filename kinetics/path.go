package kinetics

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// Path is a temperature history T(t): times in s, strictly increasing, and
// temperatures in K, one per time. Steps may be uneven (a thermocouple log).
type Path struct {
	Time []float64 // s
	Temp []float64 // K
}

// NewPath checks a temperature history: at least two points, finite
// values, temperatures positive and time strictly increasing. The error
// names the offending point by its index (from 0); callers that read a file
// translate it to a line.
func NewPath(time, temp []float64) (Path, error) {
	if len(time) != len(temp) {
		panic("kinetics: NewPath: columns differ in length")
	}
	if len(time) < 2 {
		return Path{}, fmt.Errorf("a path needs at least 2 points, got %d", len(time))
	}
	for i := range time {
		if math.IsNaN(time[i]) || math.IsInf(time[i], 0) {
			return Path{}, &PointError{Index: i, Msg: "time is not a finite number"}
		}
		if !(temp[i] > 0) || math.IsInf(temp[i], 0) {
			return Path{}, &PointError{Index: i, Msg: fmt.Sprintf("temperature %g K is not positive and finite", temp[i])}
		}
		if i > 0 && !(time[i] > time[i-1]) {
			return Path{}, &PointError{Index: i, Msg: fmt.Sprintf("time %g s does not increase (previous %g s)", time[i], time[i-1])}
		}
	}
	return Path{Time: time, Temp: temp}, nil
}

// PointError is a bad point of a path, by its index from 0.
type PointError struct {
	Index int
	Msg   string
}

func (e *PointError) Error() string { return fmt.Sprintf("point %d: %s", e.Index+1, e.Msg) }

// LinearPath is cooling from T0 at a constant rate q (K/s, > 0) down to
// T1, sampled at n+1 evenly spaced points.
func LinearPath(T0, T1, q float64, n int) Path {
	if !(q > 0) || !(T0 > T1) || n < 1 {
		panic("kinetics: LinearPath: need q > 0, T0 > T1 and n ≥ 1")
	}
	p := Path{Time: make([]float64, n+1), Temp: make([]float64, n+1)}
	for i := 0; i <= n; i++ {
		T := T0 - (T0-T1)*float64(i)/float64(n)
		p.Temp[i] = T
		p.Time[i] = (T0 - T) / q
	}
	p.Temp[n] = T1
	return p
}

// Sums are the running integrals along a path, at every point i:
//
//	L_i      = ∫₀^{t_i} u dt                              grown length, m
//	ln N_i   = ln ∫₀^{t_i} J dt                            nuclei per m³
//	ln Xext_i = ln (4π/3)·∫₀^{t_i} J(t')·[L_i − L(t')]³ dt'  extended volume fraction
//
// The logarithms are −Inf where nothing has nucleated yet.
type Sums struct {
	L, LnN, LnXext []float64
}

// ErrNoRate is returned when a model can give no nucleation rate.
var ErrNoRate = errors.New("the model has no nucleation rate: give a mobility law or a fixed prefactor j0")

// Along evaluates the model along the path and returns the running
// integrals. A model without growth gives L = 0 and LnXext = −Inf.
// The model is evaluated on a temperature grid over the span of the path
// (refined as for linear cooling, but finer: see tabulate) and ln J and
// ln u are interpolated linearly in T between its points, so that a long
// measured curve costs a few hundred evaluations of the model, not one per
// point. Errors: ErrNoRate.
func (md *Model) Along(p Path) (Sums, error) {
	if !md.HasRate() {
		return Sums{}, ErrNoRate
	}
	return md.tabulate(p).along(p), nil
}

func (tab table) along(p Path) Sums {
	lnJ, u := make([]float64, len(p.Time)), make([]float64, len(p.Time))
	for i, T := range p.Temp {
		lnJ[i], u[i] = tab.at(T)
	}
	return integrate(p.Time, lnJ, u, nil)
}

// alongDirect is Along with the model evaluated at every point, the
// reference for the tabulated version in the tests.
func (md *Model) alongDirect(p Path) Sums {
	lnJ, u := make([]float64, len(p.Time)), make([]float64, len(p.Time))
	for i, T := range p.Temp {
		lnJ[i], u[i] = md.rateAndGrowth(T)
	}
	return integrate(p.Time, lnJ, u, nil)
}

// Grid steps of a tabulated model: ln J and ln u change by at most
// tabNear between points where ln J is within spanLn of its largest value
// on the path, by tabFar within farSpanLn of it. Linear interpolation then
// errs by well under 1 % in J.
const (
	tabNear = 0.1
	tabFar  = 0.5
)

// table is the model tabulated in ascending temperature, with ln J and
// ln u (floored at lnFloor, far below anything that counts, so that
// interpolation never meets −Inf).
type table struct {
	T, lnJ, lnU []float64
	te          float64
}

const lnFloor = -1e4

func (md *Model) tabulate(p Path) table {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, T := range p.Temp {
		lo, hi = math.Min(lo, T), math.Max(hi, T)
	}
	tab := table{te: md.te}
	if md.te < hi { // NaN: no T_e, nothing to cut
		hi = md.te
	}
	if !(hi > lo) {
		// all at one temperature, or all at or above T_e
		lnJ, u := md.rateAndGrowth(lo)
		tab.T, tab.lnJ, tab.lnU = []float64{lo}, []float64{floorLn(lnJ)}, []float64{floorLn(math.Log(u))}
		return tab
	}
	T, lnJ, u := md.coolingGrid(hi, lo, gridSpec{near: tabNear, far: tabFar, u: tabNear})
	n := len(T)
	tab.T, tab.lnJ, tab.lnU = make([]float64, n), make([]float64, n), make([]float64, n)
	for i := range T {
		k := n - 1 - i
		tab.T[k], tab.lnJ[k], tab.lnU[k] = T[i], floorLn(lnJ[i]), floorLn(math.Log(u[i]))
	}
	return tab
}

func floorLn(x float64) float64 {
	if !(x > lnFloor) {
		return lnFloor
	}
	return x
}

// at interpolates ln J and u at T; at or above T_e there is neither.
func (t table) at(T float64) (lnJ, u float64) {
	lnJ, lnU := t.atLn(T)
	if math.IsInf(lnU, -1) {
		return lnJ, 0
	}
	return lnJ, math.Exp(lnU)
}

// atLn interpolates ln J and ln u at T (−Inf for none).
func (t table) atLn(T float64) (lnJ, lnU float64) {
	if T >= t.te {
		return math.Inf(-1), math.Inf(-1)
	}
	n := len(t.T)
	i := sort.SearchFloat64s(t.T, T) // first index with t.T[i] >= T
	var lj, lu float64
	switch {
	case i == 0:
		lj, lu = t.lnJ[0], t.lnU[0]
	case i >= n:
		lj, lu = t.lnJ[n-1], t.lnU[n-1]
	default:
		f := (T - t.T[i-1]) / (t.T[i] - t.T[i-1])
		lj = t.lnJ[i-1] + f*(t.lnJ[i]-t.lnJ[i-1])
		lu = t.lnU[i-1] + f*(t.lnU[i]-t.lnU[i-1])
	}
	if lj <= lnFloor {
		lj = math.Inf(-1)
	}
	if lu <= lnFloor {
		lu = math.Inf(-1)
	}
	return lj, lu
}

// negligibleDrop stands in for ln J = −Inf at one end of a step: the rate
// there is taken as e^(−700) of the other end (the step holds the onset of
// nucleation or the end of mobility, where J is vanishing).
const negligibleDrop = 700

// accum carries the running integrals of a path from one point to the
// next; see integrate.
type accum struct {
	L              float64 // grown length, m
	m0, m1, m2, m3 float64 // moments about L, scaled by exp(−scale)
	scale          float64
}

func newAccum() accum { return accum{scale: math.Inf(-1)} }

// step advances over a step of length h with ln J and u given at its ends.
func (a *accum) step(h, lnJa, lnJb, ua, ub float64) {
	dL := h * (ua + ub) / 2
	a.L += dL
	// shift the moments to the new centre
	a.m3 += dL * (3*a.m2 + dL*(3*a.m1+dL*a.m0))
	a.m2 += dL * (2*a.m1 + dL*a.m0)
	a.m1 += dL * a.m0
	switch {
	case math.IsInf(lnJa, -1) && math.IsInf(lnJb, -1):
		return
	case math.IsInf(lnJa, -1):
		lnJa = lnJb - negligibleDrop
	case math.IsInf(lnJb, -1):
		lnJb = lnJa - negligibleDrop
	}
	top := math.Max(lnJa, lnJb)
	if top > a.scale {
		if !math.IsInf(a.scale, -1) {
			r := math.Exp(a.scale - top)
			a.m0, a.m1, a.m2, a.m3 = a.m0*r, a.m1*r, a.m2*r, a.m3*r
		}
		a.scale = top
	}
	// ∫J over the step with ln J linear: h·J_top·E(x)/e^(x⁺) with x = b − a,
	// E(x) = (eˣ − 1)/x, and the J-weighted mean position in the step.
	x := lnJb - lnJa
	var w, pos float64
	ax := math.Abs(x)
	if ax < 1e-4 {
		w = h * math.Exp(lnJa-a.scale) * (1 + x/2 + x*x/6)
		pos = 0.5 + x/12
	} else {
		// em = e^(−|x|) − 1, in (−1, 0)
		em := math.Expm1(-ax)
		w = h * math.Exp(top-a.scale) * (-em) / ax
		// mean position of e^(|x| s) on [0, 1] is 1/(1 − e^(−|x|)) − 1/|x|
		pos = -1/em - 1/ax
		if x < 0 {
			pos = 1 - pos
		}
	}
	d := dL * (1 - pos) // L − ℓ of the new nuclei
	a.m0 += w
	a.m1 += w * d
	a.m2 += w * d * d
	a.m3 += w * d * d * d
}

var ln4pi3 = math.Log(4 * math.Pi / 3)

// lnN is ln ∫J dt so far.
func (a *accum) lnN() float64 {
	if math.IsInf(a.scale, -1) {
		return a.scale
	}
	return a.scale + math.Log(a.m0)
}

// lnXext is ln Xext so far.
func (a *accum) lnXext() float64 {
	if math.IsInf(a.scale, -1) {
		return a.scale
	}
	return ln4pi3 + a.scale + math.Log(a.m3)
}

// integrate computes the running integrals of a path given ln J and u at
// each time. Nuclei of each interval are taken at the J-weighted mean
// point of the interval, with ln J linear and L linear within it; growth L
// is the trapezoidal integral of u.
//
// The extended volume at every point would be a double sum, O(N²). It is
// made O(N) by carrying the moments of the nuclei born so far about the
// current grown length,
//
//	m_k(n) = Σ_{i<n} w_i·(L_n − ℓ_i)^k,  k = 0…3,  Xext_n = (4π/3)·m_3(n)
//
// and re-centring them at every step with the binomial shift by
// δ = L_{n+1} − L_n ≥ 0,
//
//	m_3 += 3δ·m_2 + 3δ²·m_1 + δ³·m_0,  m_2 += 2δ·m_1 + δ²·m_0,  m_1 += δ·m_0
//
// Every term is non-negative, so nothing cancels (the moments about a fixed
// origin, L_n³·M_0 − 3L_n²·M_1 + 3L_n·M_2 − M_3, lose every digit when L_n
// and the nucleation-time lengths are close). The moments are kept scaled by
// exp(−s), s the largest ln w_i so far, so that rates hundreds of decades
// apart neither overflow nor underflow. If states is not nil it receives
// the accumulator at every point, for refining a crossing later.
func integrate(t, lnJ, u []float64, states *[]accum) Sums {
	n := len(t)
	buf := make([]float64, 3*n) // one allocation for the three columns
	s := Sums{L: buf[:n:n], LnN: buf[n : 2*n : 2*n], LnXext: buf[2*n:]}
	a := newAccum()
	if states != nil {
		*states = make([]accum, n)
		(*states)[0] = a
	}
	s.LnN[0], s.LnXext[0] = math.Inf(-1), math.Inf(-1)
	for i := 0; i+1 < n; i++ {
		a.step(t[i+1]-t[i], lnJ[i], lnJ[i+1], u[i], u[i+1])
		s.L[i+1], s.LnN[i+1], s.LnXext[i+1] = a.L, a.lnN(), a.lnXext()
		if states != nil {
			(*states)[i+1] = a
		}
	}
	return s
}

// Fraction turns an extended volume fraction, given by its logarithm, into
// the transformed fraction X = 1 − exp(−Xext) (Avrami M., J. Chem. Phys. 7
// (1939) 1103; Johnson W.A., Mehl R.F., Trans. AIME 135 (1939) 416).
func Fraction(lnXext float64) float64 {
	if lnXext > 700 {
		return 1
	}
	return -math.Expm1(-math.Exp(lnXext))
}

// lnXextOf is the extended volume that gives the transformed fraction X,
// ln(−ln(1 − X)), for 0 < X < 1.
func lnXextOf(X float64) float64 { return math.Log(-math.Log1p(-X)) }

// crossing returns the first position where the non-decreasing sequence y
// of logarithms reaches level, as an index plus a fraction of the next
// step found by linear interpolation in y (in exp(y) from zero when the
// step starts at −Inf), and false if it never does.
func crossing(y []float64, level float64) (int, float64, bool) {
	for i := 1; i < len(y); i++ {
		if y[i] >= level {
			a := y[i-1]
			switch {
			case math.IsInf(a, -1):
				return i - 1, math.Exp(level - y[i]), true
			case !(y[i] > a):
				return i - 1, 1, true
			}
			return i - 1, (level - a) / (y[i] - a), true
		}
	}
	return 0, 0, false
}

// at interpolates x linearly at position (i, f).
func at(x []float64, i int, f float64) float64 {
	if f == 0 || i+1 >= len(x) {
		return x[i]
	}
	return x[i] + f*(x[i+1]-x[i])
}

// PathResult is what a temperature history did to the material.
type PathResult struct {
	Fraction float64 // transformed fraction at the end of the path
	LnXext   float64 // ln of the extended volume fraction at the end
	// FractionReached is where the fraction reached the target given to
	// AlongPath (Reached false if it never did).
	Reached         bool
	TimeReached     float64 // s
	TempReached     float64 // K
	NucleiPerVolume float64 // ∫J dt at the end, m⁻³ (may be +Inf only if it overflows float64)
	LnNuclei        float64 // ln ∫J dt at the end, J in m⁻³ s⁻¹
}

// AlongPath integrates a measured path: the transformed fraction at its end
// and where it first reached the fraction target (0 < target < 1).
// Errors: ErrNoRate, ErrNoGrowth.
func (md *Model) AlongPath(p Path, target float64) (PathResult, Sums, error) {
	if !(target > 0 && target < 1) {
		panic("kinetics: AlongPath: target fraction must be in (0, 1)")
	}
	if !md.HasGrowth() {
		if !md.HasRate() {
			return PathResult{}, Sums{}, ErrNoRate
		}
		return PathResult{}, Sums{}, ErrNoGrowth
	}
	s := md.tabulate(p).along(p)
	return pathResult(p, s, target), s, nil
}

func pathResult(p Path, s Sums, target float64) PathResult {
	n := len(p.Time) - 1
	r := PathResult{LnXext: s.LnXext[n], Fraction: Fraction(s.LnXext[n]), LnNuclei: s.LnN[n]}
	r.NucleiPerVolume = math.Exp(s.LnN[n])
	if i, f, ok := crossing(s.LnXext, lnXextOf(target)); ok {
		r.Reached = true
		r.TimeReached = at(p.Time, i, f)
		r.TempReached = at(p.Temp, i, f)
	}
	return r
}

// CurveAnalysis is what a measured path did: the exact path integral, its
// running sums, and the additivity sum against the isothermal TTT curve.
type CurveAnalysis struct {
	Path       PathResult
	Sums       Sums
	Additivity QuenchResult
}

// AnalyzeCurve is AlongPath and Additivity on one tabulation of the model:
// the fraction along the path (target 0 < X < 1), and the additivity sum for
// the same fraction with bands of width bandK. Errors: ErrNoRate,
// ErrNoGrowth, ErrBandWidth, ErrTooManyBands.
func (md *Model) AnalyzeCurve(p Path, X, bandK float64) (CurveAnalysis, error) {
	if !(X > 0 && X < 1) {
		panic("kinetics: AnalyzeCurve: fraction must be in (0, 1)")
	}
	if _, err := md.TTTCurve(X); err != nil {
		return CurveAnalysis{}, err
	}
	tab := md.tabulate(p)
	s := tab.along(p)
	q, err := Quench(p, tableCurve{tab, lnExtent(X)}, bandK)
	if err != nil {
		return CurveAnalysis{}, err
	}
	return CurveAnalysis{Path: pathResult(p, s, X), Sums: s, Additivity: q}, nil
}

// tableCurve is the material's isothermal TTT curve for fraction X, read
// from a table: ln(1/t_X) = [ln K − ln(−ln(1 − X))]/4 with
// ln K = ln(π/3) + ln J + 3·ln u (see Continuous).
type tableCurve struct {
	t      table
	lnExtX float64
}

var lnPi3 = math.Log(math.Pi / 3)

func (c tableCurve) LnInvTime(T float64) float64 {
	lnJ, lnU := c.t.atLn(T)
	if math.IsInf(lnJ, -1) || math.IsInf(lnU, -1) {
		return math.Inf(-1)
	}
	return (lnPi3 + lnJ + 3*lnU - c.lnExtX) / 4 // ln K of Continuous, less ln(−ln(1−X)), over n = 4
}

// stepIntegral is ∫ exp(f) over a step of length h with f linear from a
// to b (the exponential trapezoid rule); −Inf at an end stands for a
// vanishing integrand there (see negligibleDrop).
func stepIntegral(a, b, h float64) float64 {
	switch {
	case math.IsInf(a, -1) && math.IsInf(b, -1):
		return 0
	case math.IsInf(a, -1):
		a = b - negligibleDrop
	case math.IsInf(b, -1):
		b = a - negligibleDrop
	}
	x := b - a
	if math.Abs(x) < 1e-4 {
		return h * math.Exp(a) * (1 + x/2 + x*x/6)
	}
	// h·(eᵇ − eᵃ)/(b − a), written to keep the larger exponent outside
	top := math.Max(a, b)
	return h * math.Exp(top) * -math.Expm1(-math.Abs(x)) / math.Abs(x)
}
