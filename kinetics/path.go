package kinetics

import (
	"errors"
	"fmt"
	"math"
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
// The logarithms are −Inf where nothing has nucleated yet. Between the
// points the path is straight in T(t), and the integration behind the sums
// (kept with them) finds crossings between points exactly.
type Sums struct {
	L, LnN, LnXext []float64
	run            *pathRun
}

// ErrNoRate is returned when a model can give no nucleation rate.
var ErrNoRate = errors.New("the model has no nucleation rate: give a mobility law or a fixed prefactor j0")

// source is the model as an integrand along a path: ln J and u at T, and,
// for X > 0, the rate of the additivity sum for fraction X,
//
//	1/t_X = [(π/3)·J·u³/(−ln(1 − X))]^(1/4)
//
// the reciprocal of the isothermal JMAK time (see Continuous).
func (md *Model) source(X float64) source {
	above := md.te
	if math.IsNaN(above) {
		above = math.Inf(1) // a fixed supersaturation: no T_e, the rate holds at every temperature
	}
	s := source{above: above, hasU: md.HasGrowth(), eval: md.lnRateAndGrowth}
	if X > 0 {
		lnExtX := lnExtent(X)
		s.hasR, s.lnC = true, (lnPi3-lnExtX)/4
	}
	return s
}

var lnPi3 = math.Log(math.Pi / 3)

// lnRateAndGrowth is ln J and ln u at T (−Inf: none; NaN: the model
// cannot say).
func (md *Model) lnRateAndGrowth(T float64) (lnJ, lnU float64) {
	s := md.state(T, false)
	return s.LnJ, s.lnU
}

// Along integrates the model along the path (straight in T(t) between its
// points, to the tolerance of pathint.go) and returns the running
// integrals at its points. A model without growth gives L = 0 and
// LnXext = −Inf. Errors: ErrNoRate.
func (md *Model) Along(p Path) (Sums, error) {
	if !md.HasRate() {
		return Sums{}, ErrNoRate
	}
	r := integratePath(md.source(0), p.Time, p.Temp, 0, math.Inf(1))
	return r.sums(), nil
}

// sums are the running integrals at the points of the path.
func (r *pathRun) sums() Sums {
	n := len(r.points)
	buf := make([]float64, 3*n) // one allocation for the three columns
	s := Sums{L: buf[:n:n], LnN: buf[n : 2*n : 2*n], LnXext: buf[2*n:], run: r}
	r.eachPoint(func(j int, a accum) {
		s.L[j], s.LnN[j], s.LnXext[j] = r.length(a), r.value(sumN, a), r.value(sumXext, a)
	})
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

var ln4pi3 = math.Log(4 * math.Pi / 3)

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
	r := integratePath(md.source(0), p.Time, p.Temp, 0, math.Inf(1))
	s := r.sums()
	return s.result(target), s, nil
}

// result is the path result of the sums for a fraction target.
func (s Sums) result(target float64) PathResult {
	n := len(s.LnXext) - 1
	r := PathResult{LnXext: s.LnXext[n], Fraction: Fraction(s.LnXext[n]), LnNuclei: s.LnN[n]}
	r.NucleiPerVolume = math.Exp(s.LnN[n])
	if t, T, ok := s.run.cross(sumXext, lnXextOf(target), math.Inf(1)); ok {
		r.Reached, r.TimeReached, r.TempReached = true, t, T
	}
	return r
}

// CurveAnalysis is what a measured path did: the exact path integral, its
// running sums, and the additivity sum against the isothermal TTT curve,
// for the fraction X. The two answer different questions and may differ
// (see Verdict).
type CurveAnalysis struct {
	X          float64 // the fraction asked about
	Path       PathResult
	Sums       Sums
	Additivity QuenchResult
}

// AnalyzeCurve is AlongPath and Additivity in one integration: the
// fraction along the path (target 0 < X < 1), and the additivity sum for
// the same fraction with bands of width bandK. Errors: ErrNoRate,
// ErrNoGrowth, ErrBandWidth, ErrTooManyBands.
func (md *Model) AnalyzeCurve(p Path, X, bandK float64) (CurveAnalysis, error) {
	if !(X > 0 && X < 1) {
		panic("kinetics: AnalyzeCurve: fraction must be in (0, 1)")
	}
	if _, err := md.TTTCurve(X); err != nil {
		return CurveAnalysis{}, err
	}
	q, r, err := quench(p, md.source(X), sumR, bandK)
	if err != nil {
		return CurveAnalysis{}, err
	}
	s := r.sums()
	return CurveAnalysis{X: X, Path: s.result(X), Sums: s, Additivity: q}, nil
}
