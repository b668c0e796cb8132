package kinetics

import (
	"errors"
	"fmt"
	"math"

	"undercool/kinetics/internal/bracket"
)

// Nuclei are crystals present at the start of a path, given by the
// logarithms of the moments of their radii,
//
//	M_k = Σ_i N_i·R_i^k,  k = 0…3
//
// with N_i per m³ and R_i in m: M_0 is their number per volume and
// (4π/3)·M_3 the extended volume fraction they already fill. −Inf: none.
type Nuclei struct {
	LnM [4]float64
}

// NoNuclei is a nucleus-free start.
var NoNuclei = Nuclei{[4]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1), math.Inf(-1)}}

// None reports that there are no nuclei.
func (n Nuclei) None() bool { return math.IsInf(n.LnM[0], -1) }

// MeanRadius is M_1/M_0, m; NaN for none.
func (n Nuclei) MeanRadius() float64 { return n.ratio(1) }

// VolumeRadius is the radius of the mean volume, (M_3/M_0)^(1/3), m; NaN for none.
func (n Nuclei) VolumeRadius() float64 { return n.ratio(3) }

func (n Nuclei) ratio(k int) float64 {
	if n.None() {
		return math.NaN()
	}
	return math.Exp((n.LnM[k] - n.LnM[0]) / float64(k))
}

// LnXext is ln of the extended volume fraction the nuclei fill, (4π/3)·M_3.
func (n Nuclei) LnXext() float64 { return ln4pi3 + n.LnM[3] }

// lnMoments are the logarithms of the SI moments M_k of state a of the
// run (see Nuclei): ln(e^sJ·tS·(e^lnUS·tS)^k·m_k). The moments of grown
// nuclei are NaN where the run lost its growth (see value).
func (r *pathRun) lnMoments(a accum) [4]float64 {
	lt := math.Log(r.tS)
	var out [4]float64
	for k := range 4 {
		out[k] = r.sJ + lt + float64(k)*(r.lnUS+lt) + math.Log(a.m[k])
		if k > 0 && (r.lost || a.m[k] == 0 && a.m[0] > 0 && a.L > 0) {
			out[k] = math.NaN()
		}
	}
	return out
}

// Nuclei are the crystals that cooling at rate q (K/s, > 0) from T_e has
// left by the time it reaches T (K): their number per volume and the
// moments of their radii. At rate q every moment of the unit-rate path
// scales exactly, M_k(q) = M_k(1)/q^(k+1) (a length goes as 1/q, a time
// as 1/q). Below the coldest temperature of the path (where nothing moves
// any more) they are those at its end.
func (c *Cooling) Nuclei(q, T float64) Nuclei {
	if !(q > 0) {
		panic("kinetics: Cooling.Nuclei: the rate must be positive")
	}
	m := c.run.lnMoments(c.run.at(math.Max(c.Te-T, 0)))
	for k := range m {
		m[k] -= float64(k+1) * math.Log(q)
	}
	return Nuclei{m}
}

// Heating is linear heating from From to To (K) at any rate, computed once
// for 1 K/s, with time τ = T − From. From a nucleus-free start every time
// is τ/q, the nuclei per volume scale as 1/q and the extended volume as
// q⁻⁴ exactly,
//
//	Xext(T; q) = (4π/(3q⁴))·∫_From^T J(T′)·[∫_{T′}^T u dT″]³ dT′
//
// so one integral answers for every rate, as for cooling (Cooling). Nuclei
// carried in (Prior: quenched in by the cooling that made the glass) grow
// by G(T)/q, G(T) = ∫_From^T u dT at 1 K/s, and add
//
//	(4π/3)·Σ_i N_i·(R_i + G/q)³ = (4π/3)·Σ_k C(3,k)·M_k·(G/q)^(3−k)
//
// a polynomial in 1/q whose terms are all positive (the binomial shift of
// pathint.go's moments). The integral is the path integral of one straight
// path (pathint.go), to 1e-8 on every piece; TestCriticalHeatingReference
// measures the critical heating rate against nested adaptive quadrature.
type Heating struct {
	From, To float64 // K
	Prior    Nuclei
	md       *Model
	run      *pathRun
}

// ErrHeatingRange is returned when a heating path does not go up from a
// positive temperature.
var ErrHeatingRange = errors.New("heating must start above 0 K and end above its start")

// LinearHeating computes linear heating from from to to (K). prior are
// the nuclei present at the start (NoNuclei: a nucleus-free glass).
// Errors: ErrNoRate, ErrNoGrowth, ErrHeatingRange.
func (md *Model) LinearHeating(from, to float64, prior Nuclei) (*Heating, error) {
	if !md.HasRate() {
		return nil, ErrNoRate
	}
	if !md.HasGrowth() {
		return nil, ErrNoGrowth
	}
	if !(from > 0) || !(to > from) || math.IsInf(to, 1) {
		return nil, fmt.Errorf("%w (from %g K to %g K)", ErrHeatingRange, from, to)
	}
	run := integratePath(md.source(0), []float64{0, to - from}, []float64{from, to}, 0, math.Inf(1))
	return &Heating{From: from, To: to, Prior: prior, md: md, run: run}, nil
}

// heatState is the unit-rate path at one temperature: the moments of the
// nuclei born on it, the length grown, ln u.
type heatState struct {
	lnM      [4]float64
	lnG, lnU float64
}

func (h *Heating) state(T float64) heatState {
	a := h.run.at(T - h.From)
	_, lnU := h.md.lnRateAndGrowth(T)
	if !(T < h.md.te) {
		lnU = math.Inf(-1)
	}
	return heatState{lnM: h.run.lnMoments(a), lnG: math.Log(h.run.length(a)), lnU: lnU}
}

// binomial coefficients of (R + G)³ and (R + G)², by their logarithms.
var (
	lnBinom3 = [4]float64{0, math.Log(3), math.Log(3), 0}
	lnBinom2 = [3]float64{0, math.Log(2), 0}
)

// lnXext is ln of the extended volume fraction at state s for rate q.
func (h *Heating) lnXext(s heatState, q float64) float64 {
	lq := math.Log(q)
	terms := []float64{ln4pi3 + s.lnM[3] - 4*lq, h.Prior.LnXext()}
	for k := range 3 {
		terms = append(terms, ln4pi3+lnBinom3[k]+h.Prior.LnM[k]+float64(3-k)*(s.lnG-lq))
	}
	return logSum(terms)
}

// lnXextRate is ln dXext/dT at state s for rate q, 1/K:
//
//	4π·u·[m_2/q⁴ + (M_2 + 2M_1·G/q + M_0·(G/q)²)/q]
//
// (dm_3/dτ = 3u·m_2 for the nuclei born on the path; dR/dT = u/q for every
// crystal).
func (h *Heating) lnXextRate(s heatState, q float64) float64 {
	lq := math.Log(q)
	terms := []float64{s.lnM[2] - 4*lq, h.Prior.LnM[2] - lq}
	for k := range 2 {
		terms = append(terms, lnBinom2[k]+h.Prior.LnM[k]+float64(2-k)*(s.lnG-lq)-lq)
	}
	return math.Log(4*math.Pi) + s.lnU + logSum(terms)
}

// logSum is ln Σ e^x over the terms (logAddExp in turn), −Inf for none;
// NaN if any is NaN.
func logSum(x []float64) float64 {
	s := math.Inf(-1)
	for _, v := range x {
		s = logAddExp(s, v)
	}
	return s
}

// HeatPoint is the state of heating at rate q when it passes T.
type HeatPoint struct {
	T        float64 // K
	Time     float64 // s from the start
	Fraction float64 // X
	LnXext   float64
	LnNuclei float64 // ln of the crystals per m³, those carried in and those born on the path
	// LnRate is ln dX/dT, 1/K: the DSC signal divided by the heat of
	// crystallization and the heating rate.
	LnRate float64
}

// At is the state of heating at rate q (K/s, > 0) at T (From ≤ T ≤ To).
func (h *Heating) At(T, q float64) HeatPoint {
	if !(q > 0) {
		panic("kinetics: Heating.At: the rate must be positive")
	}
	s := h.state(T)
	lx := h.lnXext(s, q)
	return HeatPoint{T: T, Time: (T - h.From) / q, Fraction: Fraction(lx), LnXext: lx,
		LnNuclei: logSum([]float64{h.Prior.LnM[0], s.lnM[0] - math.Log(q)}),
		LnRate:   h.lnXextRate(s, q) - math.Exp(lx)}
}

// LnXextEnd is ln of the extended volume at To for rate q.
func (h *Heating) LnXextEnd(q float64) float64 { return h.lnXext(h.state(h.To), q) }

// CriticalRate is the slowest heating rate (K/s) that keeps the fraction
// at To below X (0 < X < 1). From a nucleus-free start, with Xext ∝ q⁻⁴,
//
//	q_c = [Xext(To; 1 K/s)/(−ln(1 − X))]^(1/4)
//
// with no root search; with nuclei carried in, the root in ln q of the
// polynomial in 1/q (Brent, to 1e-13 in ln q). Special cases: nothing
// transforms on the path gives 0; nuclei that already fill X give +Inf
// (no rate is fast enough).
func (h *Heating) CriticalRate(X float64) float64 {
	if !(X > 0 && X < 1) {
		panic("kinetics: Heating.CriticalRate: fraction must be in (0, 1)")
	}
	level := lnXextOf(X)
	s := h.state(h.To)
	if h.Prior.None() {
		return math.Exp((ln4pi3 + s.lnM[3] - level) / 4)
	}
	c0 := h.Prior.LnXext()
	if c0 >= level {
		return math.Inf(1)
	}
	// The coefficients of q^−p, p = 1…4, and the level they must reach.
	c := [5]float64{c0, ln4pi3 + lnBinom3[2] + h.Prior.LnM[2] + s.lnG, ln4pi3 + lnBinom3[1] + h.Prior.LnM[1] + 2*s.lnG,
		ln4pi3 + h.Prior.LnM[0] + 3*s.lnG, ln4pi3 + s.lnM[3]}
	rest := level + math.Log(-math.Expm1(c0-level))
	lo, hi := math.Inf(-1), math.Inf(-1)
	for p := 1; p <= 4; p++ {
		if math.IsInf(c[p], -1) {
			continue
		}
		if math.IsNaN(c[p]) {
			return math.NaN()
		}
		// at lo the largest term alone reaches the rest; at hi every
		// term is below a fifth of it
		lo = math.Max(lo, (c[p]-rest)/float64(p))
		hi = math.Max(hi, (c[p]-rest+math.Log(5))/float64(p))
	}
	if math.IsInf(lo, -1) {
		return 0
	}
	g := func(lq float64) float64 { return h.lnXext(s, math.Exp(lq)) - level }
	lq, err := bracket.Root(g, lo, hi, 1e-13)
	if err != nil {
		return math.NaN()
	}
	return math.Exp(lq)
}

// Reach returns where heating at rate q (K/s, > 0) first reaches the
// fraction X (0 < X < 1), to 1e-6 K; Reached false if not by To. Within
// 1e-9 of the level at To (the critical rate) it is reached at To.
func (h *Heating) Reach(q, X float64) CCTPoint {
	if !(q > 0) || !(X > 0 && X < 1) {
		panic("kinetics: Heating.Reach: need q > 0 and 0 < X < 1")
	}
	level := lnXextOf(X)
	f := func(T float64) float64 { return h.lnXext(h.state(T), q) - level }
	p := CCTPoint{Rate: q}
	switch end := f(h.To); {
	case math.Abs(end) <= 1e-9:
		// At the critical rate X is reached at the end of the path: near
		// T_e the growth stops and the extended volume stays within parts
		// in 10⁹ of its total over kelvins, so a crossing found on that
		// plateau would be rounding noise (as for Cooling.Reach).
		p.Reached, p.Temp = true, h.To
	case !(end >= 0):
		return p
	case f(h.From) >= 0:
		p.Reached, p.Temp = true, h.From
	default:
		T, err := bracket.Root(f, h.From, h.To, 1e-6)
		if err != nil {
			return p
		}
		p.Reached, p.Temp = true, T
	}
	p.Time = (p.Temp - h.From) / q
	return p
}

// DSCPeak is the largest transformation rate dX/dT of heating at one rate:
// the peak of a DSC exotherm (the heat flow is ΔH·q·dX/dT), and its onset.
type DSCPeak struct {
	Rate     float64 // K/s
	T        float64 // K, the peak
	Interior bool    // false: the rate is largest at an end of the path, no peak inside it
	LnRate   float64 // ln dX/dT at the peak, 1/K
	Fraction float64 // X at the peak
	Onset    CCTPoint
}

// OnsetFraction is the fraction that marks the onset of a DSC exotherm.
const OnsetFraction = 0.01

// Peak is the DSC peak of heating at rate q (K/s, > 0): where dX/dT is
// largest on the path (peakOf), and the onset where X reaches
// OnsetFraction.
func (h *Heating) Peak(q float64) DSCPeak {
	T, interior := peakOf(func(T float64) float64 { return h.At(T, q).LnRate }, h.From, math.Min(h.To, h.md.te))
	pt := h.At(T, q)
	return DSCPeak{Rate: q, T: T, Interior: interior, LnRate: pt.LnRate, Fraction: pt.Fraction, Onset: h.Reach(q, OnsetFraction)}
}

// Peak search: the scan, and the polish of the peak.
const (
	peakScan = 240 // points of the scan over the path
)

// peakOf is the temperature of the largest value of lnRate on [lo, hi]
// (a DSC peak: lnRate = ln dX/dT), with interior false when it lies at an
// end. A scan of peakScan points finds the highest, Brent's minimizer
// refines it (bracket.MinimizeScan), and the peak is polished as the zero
// of the symmetric difference lnRate(T+h) − lnRate(T−h), h a thousandth of
// the scan's step, between the scan's neighbours: the minimizer alone
// stops at about 1.5e-8 of T, where a smooth maximum is too flat to
// resolve, the zero of the difference at rounding. Special case: no finite
// value on the path gives NaN.
func peakOf(lnRate func(T float64) float64, lo, hi float64) (T float64, interior bool) {
	neg := func(T float64) float64 { return -lnRate(T) }
	step := (hi - lo) / (peakScan - 1)
	x, fx, err := bracket.MinimizeScan(neg, lo, hi, peakScan, 1e-9*(hi-lo))
	if err != nil || math.IsInf(fx, 1) || math.IsNaN(x) {
		return math.NaN(), false
	}
	if x-lo < step/2 || hi-x < step/2 {
		return x, false
	}
	h := step * 1e-3
	d := func(T float64) float64 { return lnRate(T+h) - lnRate(T-h) }
	a, b := math.Max(x-step, lo+h), math.Min(x+step, hi-h)
	if da, db := d(a), d(b); da > 0 && db < 0 {
		if t, err := bracket.Root(d, a, b, 1e-12*x); err == nil {
			return t, true
		}
	}
	return x, true
}
