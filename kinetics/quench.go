package kinetics

import (
	"errors"
	"fmt"
	"math"

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

// Retained is the fraction of the property that a quench of quench factor
// Q (against this curve) retains,
//
//	exp(k1·Q)
//
// Evancho and Staley (1974). It holds for first-order precipitation
// kinetics described by this C-curve, not for other kinetics: with the
// material's own Avrami-4 TTT curve the path integral, not this, is the
// answer (see Verdict).
func (c EvanchoStaley) Retained(Q float64) float64 { return math.Exp(c.K1 * Q) }

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
// 565) as used for quench factors by Evancho and Staley (1974). The path is
// straight in T(t) between its points and is integrated as such, to the
// tolerance of pathint.go (1e-8 relative on every piece; the test
// TestQuenchSampledReference measures it). The bands are of width bandK
// kelvin (> 0), aligned on multiples of it; the path is cut at their edges,
// so each band holds exactly the integral over the time spent in it.
// Errors: ErrBandWidth, ErrTooManyBands, ErrQuenchOverflow.
func Quench(p Path, c CCurve, bandK float64) (QuenchResult, error) {
	src := source{above: math.Inf(1), eval: func(T float64) (float64, float64) { return c.LnInvTime(T), math.Inf(-1) }}
	q, _, err := quench(p, src, sumN, bandK)
	return q, err
}

// quench integrates src along p cut at the band edges and returns the
// quench factor (the running sum k) with its bands and its running values
// at the points of p, the run, and the piece counts of the run at the
// points of p.
func quench(p Path, src source, k sum, bandK float64) (QuenchResult, *pathRun, error) {
	if err := checkBands(p, bandK); err != nil {
		return QuenchResult{}, nil, err
	}
	r := integratePath(src, p.Time, p.Temp, bandK, math.Inf(1))
	lnQ := r.value(k, r.total)
	if lnQ > maxLn {
		return QuenchResult{}, nil, ErrQuenchOverflow
	}
	// the running sum in SI: by its scale where that is a float64, else
	// through the logarithm
	scale := math.Exp(r.offset(k))
	si := func(raw float64) float64 {
		if scale > 0 && !math.IsInf(scale, 1) {
			return raw * scale
		}
		return math.Exp(r.offset(k) + math.Log(raw))
	}
	res := QuenchResult{Q: si(r.total.raw(k)), LnQ: lnQ, Running: make([]float64, len(r.points))}
	r.eachPoint(func(i int, a accum) { res.Running[i] = si(a.raw(k)) })
	if t, T, ok := r.cross(k, 0, math.Inf(1)); ok {
		res.Reached, res.TimeReached, res.TempReached = true, t, T
	}
	// bands by number, from the coldest band of the path up
	first := int(math.Floor(floats.Min(p.Temp) / bandK))
	byNum := make([]Band, int(math.Floor(floats.Max(p.Temp)/bandK))-first+1)
	for _, pc := range r.pieces {
		b := int(math.Floor((pc.T0+pc.T1)/2/bandK)) - first
		v := pc.w[0]
		if k == sumR {
			v = pc.r
		}
		byNum[b].Q += si(v)
		byNum[b].Time += pc.t1 - pc.t0
	}
	for b := len(byNum) - 1; b >= 0; b-- {
		band := byNum[b]
		if band.Time == 0 {
			continue // the path does not pass through it
		}
		band.Lo, band.Hi = float64(b+first)*bandK, float64(b+first+1)*bandK
		if res.Q > 0 {
			band.Share = band.Q / res.Q
		}
		res.Bands = append(res.Bands, band)
	}
	return res, r, nil
}

// maxLn is the largest logarithm whose exponential is a float64.
const maxLn = 709.78

// checkBands checks a band width for a path. Errors: ErrBandWidth,
// ErrTooManyBands (more than MaxBands bands over the path, band numbers
// past 2^53, or more than MaxBands band edges crossed in all).
func checkBands(p Path, bandK float64) error {
	if !(bandK > 0) || math.IsInf(bandK, 0) {
		return ErrBandWidth
	}
	lo, hi := floats.Min(p.Temp), floats.Max(p.Temp)
	if (hi-lo)/bandK+2 > MaxBands || math.Max(math.Abs(lo), math.Abs(hi))/bandK >= 1<<53 {
		return ErrTooManyBands
	}
	var crossed float64
	for i := 1; i < len(p.Temp); i++ {
		crossed += math.Abs(math.Floor(p.Temp[i]/bandK) - math.Floor(p.Temp[i-1]/bandK))
	}
	if crossed > MaxBands {
		return ErrTooManyBands
	}
	return nil
}

// Additivity is the additivity sum ∫dt/t_X(T(t)) of a path against the
// material's own isothermal TTT curve for fraction X (continuous
// nucleation, no time lag), and where it reaches 1: by the additivity rule
// (Scheil 1935) the path has then reached X. It is exact only for
// isokinetic reactions (Cahn J.W., Acta Metall. 4 (1956) 572); for
// continuous nucleation and growth the path integral (AlongPath) is the
// answer and the sum an estimate (see Verdict). Bands are of width bandK.
// Errors: ErrNoRate, ErrNoGrowth, ErrBandWidth, ErrTooManyBands.
func (md *Model) Additivity(p Path, X, bandK float64) (QuenchResult, error) {
	if _, err := md.TTTCurve(X); err != nil {
		return QuenchResult{}, err
	}
	q, _, err := quench(p, md.source(X), sumR, bandK)
	return q, err
}
