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

// Cooling is linear cooling from T_e at any rate, computed once for a
// unit rate. With τ = T_e − T, every time is τ/q, the nuclei per volume
// scale as 1/q and the extended volume as 1/q⁴ exactly:
//
//	Xext(T; q) = (4π/(3q⁴))·∫_T^{T_e} J(T')·[∫_T^{T'} u dT'']³ dT'
//
// so one integral answers for every rate. (Uhlmann D.R., J. Non-Cryst.
// Solids 7 (1972) 337 for the use in glass formation; the q⁻⁴ scaling
// follows from the change of variable t = (T_e − T)/q.)
//
// The integral is the path integral of a straight path (see pathint.go),
// to a relative tolerance of 1e-8 on every piece: the extended volume is
// right to better than 1e-7 and the critical rate to better than 1e-7
// (TestCriticalRateReference). The path is always integrated down to the
// coldest temperature worth computing (see floor) or the end, whichever is
// colder, and read at the end, so that a later end never gives less.
type Cooling struct {
	Te     float64   // K
	End    float64   // K, the end of the path
	Reason EndReason // why it ends there
	md     *Model
	run    *pathRun // at 1 K/s: time τ = T_e − T
	end    accum    // the running sums at the end
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
	cold := math.Min(lo, md.floor())
	tau := []float64{0, te - cold}
	temp := []float64{te, cold}
	src := md.source(0)
	c.End = lo
	c.run = integratePath(src, tau, temp, 0, te-lo)
	if c.Reason == EndNegligible {
		total := c.run.value(sumXext, c.run.at(math.Inf(1)))
		if !math.IsInf(total, -1) {
			if t, _, ok := c.run.cross(sumXext, total+math.Log1p(-NegligibleRest), math.Inf(1)); ok {
				c.End = te - t
			}
		}
	}
	c.end = c.run.at(te - c.End)
	return c, nil
}

// LnXextUnit is ln of the extended volume fraction at the end of the path
// for a rate of 1 K/s; at rate q it is this minus 4·ln q.
func (c *Cooling) LnXextUnit() float64 { return c.run.value(sumXext, c.end) }

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

// cross returns the temperature where sum k at unit rate first reaches
// level before the end of the path, and false if it does not.
func (c *Cooling) cross(k sum, level float64) (float64, bool) {
	t, _, ok := c.run.cross(k, level, c.Te-c.End)
	return c.Te - t, ok
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
		T, ok = c.cross(sumXext, level)
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
