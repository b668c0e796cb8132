package answer

import (
	"math"

	"gonum.org/v1/gonum/floats"

	"undercool/kinetics"
)

// DefaultSpan is the temperature range a material's tables cover unless
// told: just below T_e down to the glass transition, the VFT T0 or, for a
// material with neither, half of T_e.
func DefaultSpan(md *kinetics.Model) (lo, hi float64) {
	m := md.Material()
	te := md.Te()
	hi = te * 0.99
	lo = 0.5 * te
	switch mob := m.Mobility.(type) {
	case kinetics.VFT:
		lo = math.Max(lo, mob.T0+0.05*(te-mob.T0))
	case kinetics.WLF:
		lo = mob.Tg
	}
	if m.Tg > 0 && m.Tg < hi {
		lo = m.Tg
	}
	return lo, hi
}

// Spread is n ≥ 2 evenly spaced temperatures from a to b, both included.
func Spread(a, b float64, n int) []float64 { return floats.Span(make([]float64, n), a, b) }
