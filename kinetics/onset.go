package kinetics

import "math"

// Onset is the first nucleation event expected in a sample of volume V:
// the point of the path where the expected number of nuclei
//
//	N(t) = V·∫₀ᵗ J dt
//
// reaches 1 (the undercooling at which a droplet, a levitated melt, a
// calorimeter pan or a vial freezes; Turnbull D., J. Chem. Phys. 20 (1952)
// 411 for the droplet experiments; Kelton and Greer (2010) §4 for the
// treatment). Nucleation is a Poisson process, so the probability that the
// sample is still unfrozen at N is exp(−N): the onset is where that is 1/e.
type Onset struct {
	Reached bool    // false: fewer than one nucleus expected on the whole path
	Temp    float64 // K
	Time    float64 // s
	// LnExpected is ln N at the end of the path (−Inf: none).
	LnExpected float64
}

// Expected is N at the end of the path; +Inf only if it overflows float64 (use LnExpected).
func (o Onset) Expected() float64 { return math.Exp(o.LnExpected) }

// Onset is the first nucleation event in a volume V (m³, > 0) cooled at
// rate q (K/s, > 0) from T_e to the end of the path. Time is from T_e.
func (c *Cooling) Onset(V, q float64) Onset {
	if !(V > 0) || !(q > 0) {
		panic("kinetics: Cooling.Onset: volume and rate must be positive")
	}
	shift := math.Log(V) - math.Log(q)
	o := Onset{LnExpected: c.Sums.LnN[c.endIdx] + shift}
	if T, ok := c.cross(-shift, (*accum).lnN); ok {
		o.Reached, o.Temp, o.Time = true, T, (c.Te-T)/q
	}
	return o
}

// OnsetAlong is the first nucleation event in a volume V (m³, > 0) along a
// path whose running integrals s came from Along.
func OnsetAlong(p Path, s Sums, V float64) Onset {
	if !(V > 0) {
		panic("kinetics: OnsetAlong: volume must be positive")
	}
	n := len(p.Time) - 1
	o := Onset{LnExpected: s.LnN[n] + math.Log(V)}
	if i, f, ok := crossing(s.LnN, -math.Log(V)); ok {
		o.Reached, o.Temp, o.Time = true, at(p.Temp, i, f), at(p.Time, i, f)
	}
	return o
}
