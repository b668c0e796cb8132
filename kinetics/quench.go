package kinetics

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/floats"

	"undercool/cnt"
)

// CCurve is a time-temperature-property curve: the time C(T) a hold at T
// takes to reach a fixed amount of transformation (or loss of property).
// It is given as ln(1/C), 1/s, so that a temperature where nothing happens
// is −Inf rather than an overflow.
type CCurve interface {
	LnInvTime(T float64) float64
}

// EvanchoStaley is the published C-curve form of Evancho and Staley,
//
//	C(T) = −k1·k2·exp(k3·k4²/(R·T·(k4 − T)²))·exp(k5/(R·T))
//
// Evancho J.W., Staley J.T., Kinetics of precipitation in aluminum alloys
// during continuous cooling, Metall. Trans. 5 (1974) 43; Staley J.T.,
// Quench factor analysis of aluminium alloys, Mater. Sci. Technol. 3 (1987) 923.
// k1 = ln(fraction of the property that defines the curve), negative
// (ln 0.995 = −0.00501 for the usual 99.5 % curve); k2 in s, > 0, related to
// the reciprocal of the number of nucleation sites; k3 in J/mol, related to
// the energy to form a nucleus; k4 in K, the solvus; k5 in J/mol, the
// activation energy for diffusion.
// Special case: at or above the solvus k4 nothing precipitates, ln(1/C) = −Inf.
type EvanchoStaley struct {
	K1, K2, K3, K4, K5 float64
}

// Check reports the first constant that is out of range, by its name.
func (c EvanchoStaley) Check() error {
	finite := func(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
	switch {
	case !(c.K1 < 0) || !finite(c.K1):
		return fmt.Errorf("k1 must be negative and finite (ln of the property fraction, e.g. -0.00501), got %g", c.K1)
	case !(c.K2 > 0) || !finite(c.K2):
		return fmt.Errorf("k2 must be positive and finite (s), got %g", c.K2)
	case !(c.K3 >= 0) || !finite(c.K3):
		return fmt.Errorf("k3 must be non-negative and finite (J/mol), got %g", c.K3)
	case !(c.K4 > 0) || !finite(c.K4):
		return fmt.Errorf("k4 must be positive and finite (the solvus, K), got %g", c.K4)
	case !finite(c.K5):
		return fmt.Errorf("k5 must be finite (J/mol), got %g", c.K5)
	}
	return nil
}

// LnInvTime is ln(1/C(T)), C in s.
func (c EvanchoStaley) LnInvTime(T float64) float64 {
	if !(T > 0 && T < c.K4) {
		return math.Inf(-1)
	}
	d := c.K4 - T
	rt := cnt.Gas * T
	return -math.Log(-c.K1*c.K2) - c.K3*c.K4*c.K4/(rt*d*d) - c.K5/rt
}

// Time is C(T), s; +Inf at or above the solvus.
func (c EvanchoStaley) Time(T float64) float64 { return math.Exp(-c.LnInvTime(T)) }

// tttCurve is the material's own isothermal TTT curve for a fraction X as
// a C-curve: C(T) = t_X(T) from JMAK.
type tttCurve struct {
	md *Model
	X  float64
}

func (c tttCurve) LnInvTime(T float64) float64 {
	_, a := c.md.Isothermal(T, JMAK{})
	return -a.LnTime(c.X)
}

// TTTCurve is the material's isothermal TTT curve for fraction X (0 < X < 1)
// used as a C-curve. Errors: ErrNoRate, ErrNoGrowth.
func (md *Model) TTTCurve(X float64) (CCurve, error) {
	if !(X > 0 && X < 1) {
		panic("kinetics: TTTCurve: fraction must be in (0, 1)")
	}
	if !md.HasRate() {
		return nil, ErrNoRate
	}
	if !md.HasGrowth() {
		return nil, ErrNoGrowth
	}
	return tttCurve{md, X}, nil
}

// Band is one temperature band of a quench and its share of the quench factor.
type Band struct {
	Hi, Lo float64 // K, Hi > Lo
	Q      float64 // the part of the quench factor collected in the band
	Share  float64 // Q/total, 0 when the total is 0
	Time   float64 // s spent in the band
}

// QuenchResult is the quench factor of a path against a C-curve.
type QuenchResult struct {
	Q     float64 // quench factor ∫dt/C(T)
	LnQ   float64 // ln Q (−Inf when nothing happened)
	Bands []Band  // hottest first
	// Running is the quench factor up to each point of the path.
	Running []float64
	// Reached is whether Q reached 1 (the additivity rule's end of the
	// incubation: the path did what a hold of C(T) does), and where.
	Reached     bool
	TimeReached float64 // s
	TempReached float64 // K
}

// Retained is the retained property fraction exp(k1·Q) for the k1 of the
// C-curve (Evancho and Staley 1974).
func (r QuenchResult) Retained(k1 float64) float64 { return math.Exp(k1 * r.Q) }

// ErrQuenchOverflow is returned when the quench factor exceeds the float64
// range (a C-curve of times below 1e-300 s).
var ErrQuenchOverflow = errors.New("the quench factor overflows: the C-curve gives times far too short")

// ErrBandWidth is returned for a non-positive or non-finite band width.
var ErrBandWidth = errors.New("band width must be positive and finite")

// MaxBands is the most bands a quench is split into: a band width far
// narrower than the path's span would exhaust memory.
const MaxBands = 100000

// ErrTooManyBands is returned for a band width that would give more than
// MaxBands bands over the path, or band numbers past the exact integers of
// a float64.
var ErrTooManyBands = fmt.Errorf("band width too narrow for the path: more than %d bands", MaxBands)

// Quench computes the quench factor of a path against a C-curve,
//
//	Q = ∫ dt/C(T(t))
//
// the additivity rule of Scheil (Scheil E., Arch. Eisenhüttenwes. 8 (1935)
// 565) as used for quench factors by Evancho and Staley (1974). ln(1/C) is
// taken linear in time between points. The bands are of width bandK
// kelvin (> 0), aligned on multiples of it; each step's share is split
// between the bands it crosses in proportion to the temperature it spends
// in each. Errors: ErrBandWidth, ErrTooManyBands, ErrQuenchOverflow.
func Quench(p Path, c CCurve, bandK float64) (QuenchResult, error) {
	if !(bandK > 0) || math.IsInf(bandK, 0) {
		return QuenchResult{}, ErrBandWidth
	}
	if len(p.Temp) > 0 {
		lo, hi := floats.Min(p.Temp), floats.Max(p.Temp)
		if (hi-lo)/bandK+2 > MaxBands || math.Max(math.Abs(lo), math.Abs(hi))/bandK >= 1<<53 {
			return QuenchResult{}, ErrTooManyBands
		}
	}
	n := len(p.Time)
	lnf := make([]float64, n)
	for i, T := range p.Temp {
		lnf[i] = c.LnInvTime(T)
	}
	r := QuenchResult{Running: make([]float64, n)}
	bands := map[int]*Band{}
	band := func(k int) *Band {
		b, ok := bands[k]
		if !ok {
			b = &Band{Lo: float64(k) * bandK, Hi: float64(k+1) * bandK}
			bands[k] = b
		}
		return b
	}
	var sum float64
	for i := 0; i+1 < n; i++ {
		h := p.Time[i+1] - p.Time[i]
		w := stepIntegral(lnf[i], lnf[i+1], h)
		sum += w
		r.Running[i+1] = sum
		// split the step between bands by the temperature range it covers
		Ta, Tb := p.Temp[i], p.Temp[i+1]
		lo, hi := math.Min(Ta, Tb), math.Max(Ta, Tb)
		klo, khi := int(math.Floor(lo/bandK)), int(math.Floor(hi/bandK))
		if hi == float64(khi)*bandK && khi > klo {
			khi--
		}
		if klo == khi {
			b := band(klo)
			b.Q += w
			b.Time += h
			continue
		}
		for k := klo; k <= khi; k++ {
			bl, bh := math.Max(lo, float64(k)*bandK), math.Min(hi, float64(k+1)*bandK)
			if bh <= bl {
				continue
			}
			part := (bh - bl) / (hi - lo)
			b := band(k)
			b.Q += w * part
			b.Time += h * part
		}
	}
	if math.IsInf(sum, 1) {
		return QuenchResult{}, ErrQuenchOverflow
	}
	r.Q = sum
	r.LnQ = math.Log(sum)
	for i := 1; i < n; i++ {
		if r.Running[i] >= 1 {
			a, b := r.Running[i-1], r.Running[i]
			f := 1.0
			if b > a {
				f = (1 - a) / (b - a)
			}
			r.Reached = true
			r.TimeReached = at(p.Time, i-1, f)
			r.TempReached = at(p.Temp, i-1, f)
			break
		}
	}
	keys := make([]int, 0, len(bands))
	for k := range bands {
		keys = append(keys, k)
	}
	sort.Sort(sort.Reverse(sort.IntSlice(keys)))
	for _, k := range keys {
		b := *bands[k]
		if sum > 0 {
			b.Share = b.Q / sum
		}
		r.Bands = append(r.Bands, b)
	}
	return r, nil
}

// Additivity is the additivity sum ∫dt/t_X(T(t)) of a path against the
// material's own isothermal TTT curve for fraction X (continuous
// nucleation, no time lag), and where it reaches 1: by the additivity rule
// (Scheil 1935; Cahn J.W., Acta Metall. 4 (1956) 572 for when it holds)
// the path has then reached X. The model is tabulated over the span of the
// path as in Along. Bands are of width bandK. Errors: ErrNoRate, ErrNoGrowth.
func (md *Model) Additivity(p Path, X, bandK float64) (QuenchResult, error) {
	if _, err := md.TTTCurve(X); err != nil {
		return QuenchResult{}, err
	}
	return Quench(p, tableCurve{md.tabulate(p), lnExtent(X)}, bandK)
}
