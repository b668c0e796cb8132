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
	o := Onset{LnExpected: c.run.value(sumN, c.end) + shift}
	if T, ok := c.cross(sumN, -shift); ok {
		o.Reached, o.Temp, o.Time = true, T, (c.Te-T)/q
	}
	return o
}

// OnsetAlong is the first nucleation event in a volume V (m³, > 0) along a
// path p whose running integrals s came from Along, AlongPath or
// AnalyzeCurve (s carries the integration; the crossing is solved within
// the path's steps).
func OnsetAlong(p Path, s Sums, V float64) Onset {
	if !(V > 0) {
		panic("kinetics: OnsetAlong: volume must be positive")
	}
	if s.run == nil {
		panic("kinetics: OnsetAlong: sums not from a path integral")
	}
	n := len(s.LnN) - 1
	o := Onset{LnExpected: s.LnN[n] + math.Log(V)}
	if t, T, ok := s.run.cross(sumN, -math.Log(V), math.Inf(1)); ok {
		o.Reached, o.Temp, o.Time = true, T, t
	}
	return o
}

// Sample compares, for one sample of volume V, the first nucleus expected
// with the point where the mean-field (JMAK, extended volume) fraction
// reaches X. The fraction is an average over many samples, or over a
// sample holding many nuclei: where X is reached with fewer than one
// nucleus expected in V, it says nothing about this sample, which is still
// untransformed with probability exp(−N) and transforms, if at all, from
// its first nucleus on (at Onset).
type Sample struct {
	Onset Onset
	// Reached is whether the mean-field fraction reaches X, and where.
	Reached  bool
	Temp     float64 // K
	Time     float64 // s
	X        float64
	LnNuclei float64 // ln of the expected number of nuclei in V when X is reached (−Inf if never)
}

// FewNuclei reports that the fraction X is reached with fewer than one
// nucleus expected in the sample.
func (s Sample) FewNuclei() bool { return s.Reached && s.LnNuclei < 0 }

// Sample is the onset and the fraction X (0 < X < 1) for a volume V (m³,
// > 0) cooled at rate q (K/s, > 0).
func (c *Cooling) Sample(V, q, X float64) Sample {
	s := Sample{Onset: c.Onset(V, q), X: X, LnNuclei: math.Inf(-1)}
	if p := c.Reach(q, X); p.Reached {
		s.Reached, s.Temp, s.Time = true, p.Temp, p.Time
		s.LnNuclei = c.run.value(sumN, c.run.at(c.Te-p.Temp)) + math.Log(V) - math.Log(q)
	}
	return s
}

// Sample is the onset and the fraction of the analysis for a volume V (m³, > 0).
func (a CurveAnalysis) Sample(V float64) Sample {
	s := Sample{Onset: OnsetAlong(Path{Time: a.Sums.run.time, Temp: a.Sums.run.temp}, a.Sums, V), X: a.X, LnNuclei: math.Inf(-1)}
	if a.Path.Reached {
		s.Reached, s.Temp, s.Time = true, a.Path.TempReached, a.Path.TimeReached
		s.LnNuclei = a.Sums.run.value(sumN, a.Sums.run.at(s.Time)) + math.Log(V)
	}
	return s
}
