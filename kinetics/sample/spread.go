package sample

import (
	"fmt"
	"math"
)

// Distribution is the law an uncertain input is drawn from.
type Distribution int

const (
	// Normal: x = x0 + σ·z, σ in the input's unit.
	Normal Distribution = iota
	// LogNormal: x = x0·exp(σ·z), σ the standard deviation of ln x; the
	// base value is the median and ±1σ multiplies or divides it by exp(σ).
	LogNormal
)

func (d Distribution) String() string {
	if d == LogNormal {
		return "log-normal"
	}
	return "normal"
}

// Range is where an input may lie; a draw outside it is drawn again.
type Range interface {
	Contains(x float64) bool
	String() string // for messages: "(0, ∞)"
}

// Spread is the uncertainty of one input.
type Spread struct {
	Key   string // the input's name, for labels and errors
	Dist  Distribution
	SD    float64 // σ ≥ 0: in the input's unit for Normal, of ln x for LogNormal
	Base  float64 // the input's value: the mean, or the median of a log-normal
	Range Range   // where the input may lie
}

// Form says how a standard deviation was written.
type Form int

const (
	// Absolute: in the input's unit.
	Absolute Form = iota
	// Relative: as a fraction of the value (0.02 for 2 %).
	Relative
	// Factor: F ≥ 1, ±1σ multiplies or divides by F (log-normal inputs only).
	Factor
)

// NewSpread makes the spread of an input of value base about it, from a
// standard deviation x written in form. A log-normal spread has its median
// at base and
//
//	σ_ln = ln(1 + r)   (relative r, or absolute s with r = s/base)
//	σ_ln = ln F        (factor F)
//
// so that +1σ is base·(1 + r); a normal spread has σ = s or σ = r·|base|.
// Errors name the key: a negative or non-finite deviation, a factor below
// 1 or on a normal input.
func NewSpread(key string, dist Distribution, base float64, r Range, form Form, x float64) (Spread, error) {
	if !(x >= 0) || math.IsInf(x, 1) {
		return Spread{}, fmt.Errorf("%s: the standard deviation must be finite and not negative, got %g", key, x)
	}
	s := Spread{Key: key, Dist: dist, Base: base, Range: r}
	if dist == Normal {
		switch form {
		case Absolute:
			s.SD = x
		case Relative:
			s.SD = x * math.Abs(base)
		default:
			return Spread{}, fmt.Errorf("%s: a factor spread (xF) is only for log-normal inputs; give an absolute value with its unit or a percentage", key)
		}
		return s, nil
	}
	switch form {
	case Absolute:
		s.SD = math.Log1p(x / base)
	case Relative:
		s.SD = math.Log1p(x)
	default:
		if !(x >= 1) {
			return Spread{}, fmt.Errorf("%s: a factor spread must be at least 1, got %g", key, x)
		}
		s.SD = math.Log(x)
	}
	return s, nil
}

// value is the input z standard deviations away from the base.
func (s Spread) value(z float64) float64 {
	if s.Dist == LogNormal {
		return s.Base * math.Exp(s.SD*z)
	}
	return s.Base + s.SD*z
}
