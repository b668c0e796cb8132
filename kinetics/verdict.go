package kinetics

import "fmt"

// Verdict is the one answer of a measured path for a fraction X: whether
// the path integral reaches X (the answer, for continuous nucleation at
// J(T) and growth at u(T)), and beside it what the additivity sum says.
//
// The two measures may differ. The additivity sum ∫dt/t_X treats the path
// as a chain of isothermal holds, each credited with the fraction of t_X it
// lasts; that is exact only when the transformation rate depends on the
// fraction transformed and the temperature in separable form, an
// isokinetic reaction (Cahn J.W., Acta Metall. 4 (1956) 572). Continuous
// nucleation and growth is not isokinetic: nuclei born at one temperature
// grow at others, which the path integral follows and the sum cannot. The
// quench-factor rule of a published C-curve, exp(k1·Q), assumes first-order
// kinetics on that curve (Evancho and Staley 1974) and applies to no other.
type Verdict struct {
	X        float64 // the fraction asked about
	Fraction float64 // at the end of the path, from the path integral
	Reached  bool    // the path integral reaches X
	Temp     float64 // K, where it does
	Time     float64 // s, from the start of the path
	// Sum is the additivity sum against the isothermal TTT curve for X;
	// SumReached whether it reaches 1, and where.
	Sum        float64
	SumReached bool
	SumTemp    float64 // K
	SumTime    float64 // s
}

// Verdict is the answer of the analysis for its fraction.
func (a CurveAnalysis) Verdict() Verdict {
	p, s := a.Path, a.Additivity
	return Verdict{X: a.X, Fraction: p.Fraction, Reached: p.Reached, Temp: p.TempReached, Time: p.TimeReached,
		Sum: s.Q, SumReached: s.Reached, SumTemp: s.TempReached, SumTime: s.TimeReached}
}

// Agree reports whether the path integral and the additivity sum agree on
// whether X is reached.
func (v Verdict) Agree() bool { return v.Reached == v.SumReached }

// String is the verdict in a line: "stays below X = 1e-06 (fraction at the
// end 3.2e-07)" or "reaches X = 1e-06 at 812.30 K after 3.21 s".
func (v Verdict) String() string {
	if !v.Reached {
		return fmt.Sprintf("stays below X = %g (fraction at the end %.3g)", v.X, v.Fraction)
	}
	return fmt.Sprintf("reaches X = %g at %.2f K after %.4g s", v.X, v.Temp, v.Time)
}

// Why says, when the two measures disagree, why the path integral is the
// answer and the additivity sum is not; it is empty when they agree.
func (v Verdict) Why() string {
	switch {
	case v.Agree():
		return ""
	case v.Reached:
		return fmt.Sprintf("the additivity sum reaches only %.3g, not 1: it restarts the isothermal transformation at every temperature, "+
			"while along the path the nuclei born early keep growing; additivity is exact only for isokinetic reactions (Cahn 1956), "+
			"and nucleation with growth is not one, so the path integral is the answer", v.Sum)
	default:
		return fmt.Sprintf("the additivity sum reaches 1 (at %.2f K) but the path integral stays below X: the sum counts every stretch "+
			"as a share of an isothermal hold, in which nuclei form and grow at one temperature, while along the path the late nuclei "+
			"have little time left to grow; additivity is exact only for isokinetic reactions (Cahn 1956), and nucleation with growth "+
			"is not one, so the path integral is the answer", v.SumTemp)
	}
}

// PropertyQuench is a quench against a published C-curve of the Evancho
// and Staley form: its quench factor and the fraction of the property the
// quench retains, exp(k1·Q). The retained fraction belongs to that curve
// (first-order kinetics) and to no other kinetics.
type PropertyQuench struct {
	QuenchResult
	Curve    EvanchoStaley
	Retained float64 // exp(k1·Q), 0 < Retained ≤ 1
}

// QuenchProperty is the quench factor of a path against an Evancho–Staley
// C-curve, with the retained property fraction. Errors: those of Quench.
func QuenchProperty(p Path, c EvanchoStaley, bandK float64) (PropertyQuench, error) {
	q, err := Quench(p, c, bandK)
	if err != nil {
		return PropertyQuench{}, err
	}
	return PropertyQuench{QuenchResult: q, Curve: c, Retained: c.Retained(q.Q)}, nil
}
