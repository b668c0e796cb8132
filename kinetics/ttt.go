package kinetics

import (
	"errors"
	"fmt"
	"math"

	"undercool/kinetics/internal/bracket"
)

// NoseTolerance is the accuracy of the nose temperature, K.
const NoseTolerance = 0.01

// noseSearch is the tolerance the search runs to: a hundred times finer
// than NoseTolerance, so that searches over different ranges (a TTT table's,
// a cooling path's) agree far below the 0.01 K the outputs print, and print
// the same nose.
const noseSearch = NoseTolerance / 100

// noseScan is the number of evenly spaced temperatures the nose search
// looks at before refining the lowest; it guards against a curve with more
// than one dip (a tabulated driving force, a mobility law with a kink).
const noseScan = 24

// ErrNoGrowth is returned for a time to transform when the model has no
// growth rate (no mobility law) or, for continuous nucleation, no rate.
var ErrNoGrowth = errors.New("a time to transform needs a growth rate and a nucleation rate: give a mobility law and its values")

// CanTransform reports whether the model can give times to transform for
// the JMAK choice j, and if not, why.
func (md *Model) CanTransform(j JMAK) error {
	if err := j.Check(); err != nil {
		return err
	}
	if !md.HasGrowth() {
		return ErrNoGrowth
	}
	if j.Nuclei == 0 && !md.HasRate() {
		return ErrNoGrowth
	}
	return nil
}

// Nose is the fastest point of a TTT curve: the temperature where the time
// to reach a fraction is shortest.
type Nose struct {
	T      float64 // K; NaN when nothing transforms anywhere in the range
	LnTime float64 // ln t_X, t in s; +Inf when nothing transforms
	// Edge is 0 for a nose inside the searched range, −1 when the time
	// still falls at the low end of the range (the nose lies below it), +1
	// when it falls at the high end.
	Edge int
	// Evaluations counts the temperatures the search evaluated.
	Evaluations int
}

// Inside reports whether a nose was found inside the range.
func (n Nose) Inside() bool { return n.Edge == 0 && !math.IsNaN(n.T) }

// Nose finds the temperature in [lo, hi] (K) where the time to reach the
// fraction X is shortest, to NoseTolerance, with MinimizeScan over
// ln t_X(T) (about 50 evaluations of the model, never more than about 100);
// the answer does not depend on any printed grid.
//
// Without the time lag, ln t_X = [ln(−ln(1−X)) − ln K(T)]/n, so the nose
// is the maximum of ln K(T) = ln(π/3) + ln J + 3·ln u and its temperature
// does not depend on X (exactly; the search runs on ln K alone). With the
// lag it does, slightly.
//
// The error is non-nil when the model cannot give times (see CanTransform)
// or X is outside (0, 1). It panics unless 0 < lo < hi are finite.
func (md *Model) Nose(lo, hi, X float64, j JMAK) (Nose, error) {
	if err := md.CanTransform(j); err != nil {
		return Nose{}, err
	}
	if !(X > 0 && X < 1) {
		return Nose{}, fmt.Errorf("fraction must lie strictly between 0 and 1, got %g", X)
	}
	if !(lo > 0) {
		panic("kinetics: Nose: need lo > 0")
	}
	n := 0
	var f func(T float64) float64
	if j.Lag {
		f = func(T float64) float64 {
			n++
			return md.avrami(md.At(T), j).LnTime(X)
		}
	} else {
		// −ln K; +Inf where nothing transforms.
		f = func(T float64) float64 {
			n++
			a := md.avrami(md.At(T), j)
			if math.IsNaN(a.LnK) {
				return math.Inf(1)
			}
			return -a.LnK
		}
	}
	T, fT, err := bracket.MinimizeScan(f, lo, hi, noseScan, noseSearch)
	if err != nil {
		return Nose{}, fmt.Errorf("nose search: %v", err)
	}
	nose := Nose{T: T, LnTime: math.Inf(1), Evaluations: n}
	if math.IsInf(fT, 1) {
		nose.T = math.NaN()
		return nose, nil
	}
	nose.LnTime = md.avrami(md.At(T), j).LnTime(X)
	switch {
	case T-lo <= 2*NoseTolerance:
		nose.Edge = -1
	case hi-T <= 2*NoseTolerance:
		nose.Edge = 1
	}
	return nose, nil
}

// TTT is a time–temperature–transformation table: for each temperature,
// the time to reach each of the fractions in an isothermal hold.
type TTT struct {
	Fractions []float64
	JMAK      JMAK
	T         []float64   // K, as given
	LnTime    [][]float64 // LnTime[i][k]: ln t (s) at T[i] for Fractions[k]; +Inf: never
	Flags     []Flag      // validity flags of each row
	Noses     []Nose      // one per fraction, searched over [Lo, Hi]
	Lo, Hi    float64     // the range of the nose search, K
}

// TTT computes the times to reach each fraction at each temperature, and
// the nose of each curve searched over [lo, hi] (K), which need not be the
// span of temps. Fractions must lie in (0, 1) and temperatures be positive
// and finite, else an error; the model must be able to give times (see
// CanTransform).
func (md *Model) TTT(temps, fractions []float64, j JMAK, lo, hi float64) (*TTT, error) {
	if err := md.CanTransform(j); err != nil {
		return nil, err
	}
	if len(fractions) == 0 {
		return nil, errors.New("no fraction given")
	}
	for _, X := range fractions {
		if !(X > 0 && X < 1) {
			return nil, fmt.Errorf("fraction must lie strictly between 0 and 1, got %g", X)
		}
	}
	for _, T := range temps {
		if !(T > 0) || math.IsInf(T, 1) {
			return nil, fmt.Errorf("temperature must be positive and finite, got %g K", T)
		}
	}
	if !(lo > 0 && lo < hi) || math.IsInf(hi, 1) {
		return nil, fmt.Errorf("nose range must satisfy 0 < lo < hi, got %g to %g K", lo, hi)
	}
	out := &TTT{
		Fractions: append([]float64(nil), fractions...),
		JMAK:      j,
		T:         append([]float64(nil), temps...),
		LnTime:    make([][]float64, len(temps)),
		Flags:     make([]Flag, len(temps)),
		Lo:        lo, Hi: hi,
	}
	cells := make([]float64, len(temps)*len(fractions))
	for i, T := range temps {
		s := md.At(T)
		a := md.avrami(s, j)
		row := cells[i*len(fractions) : (i+1)*len(fractions)]
		for k, X := range fractions {
			row[k] = a.LnTime(X)
		}
		out.LnTime[i] = row
		out.Flags[i] = s.Flags
	}
	out.Noses = make([]Nose, len(fractions))
	for k, X := range fractions {
		if k > 0 && !j.Lag {
			// Same temperature for every fraction (see Nose): only the time moves.
			n := out.Noses[0]
			if !math.IsNaN(n.T) {
				n.LnTime = md.avrami(md.At(n.T), j).LnTime(X)
			}
			n.Evaluations = 0
			out.Noses[k] = n
			continue
		}
		n, err := md.Nose(lo, hi, X, j)
		if err != nil {
			return nil, err
		}
		out.Noses[k] = n
	}
	return out, nil
}
