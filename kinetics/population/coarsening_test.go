package population_test

import (
	"context"
	"math"
	"sort"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/stat"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/kinetics/population"
)

// lswDensity is the scaled size distribution of Lifshitz–Slyozov–Wagner
// coarsening, in u = r/r̄ (Lifshitz I.M., Slyozov V.V., J. Phys. Chem.
// Solids 19 (1961) 35; Wagner C., Z. Elektrochem. 65 (1961) 581):
//
//	h(u) = (4/9)·u²·(3/(3 + u))^(7/3)·(3/2/(3/2 − u))^(11/3)·exp(−u/(3/2 − u)),  0 ≤ u < 3/2
func lswDensity(u float64) float64 {
	if !(u > 0 && u < 1.5) {
		return 0
	}
	return 4.0 / 9 * u * u * math.Pow(3/(3+u), 7.0/3) * math.Pow(1.5/(1.5-u), 11.0/3) * math.Exp(-u/(1.5-u))
}

// lswCDF is the cumulative LSW distribution, normalised numerically
// (Gauss–Legendre, 200 points: converged far below the test's metric).
func lswCDF(u float64) float64 {
	const n = 200
	total := quad.Fixed(lswDensity, 0, 1.5, n, nil, 0)
	if u >= 1.5 {
		return 1
	}
	if u <= 0 {
		return 0
	}
	return quad.Fixed(lswDensity, 0, u, n, nil, 0) / total
}

// Late-stage coarsening emerges from nucleation and growth with the
// Gibbs–Thomson solubility, and follows the Lifshitz–Slyozov–Wagner law
//
//	r̄³ − r̄₀³ = K·t,  K = 8γ·D·c_eq·V_p/(9·R·T·(c_p − c_eq))
//
// (the slope of r̄³ over the last decade of a 10⁸ s hold, by least
// squares) within 10 %, and its scaled size distribution is close to the
// LSW shape: Kolmogorov–Smirnov distance of the number distribution in
// u = r/r̄ at most 0.10, and standard deviation of u within 20 % of LSW's.
// Both windows were fixed before the run. The alloy is invented for the
// test, chosen so that 2γV_p/(RT) (0.6 nm) is small against the final mean
// radius (about 40 nm), where the law holds, and the volume fraction small
// (1.6 %), the limit of the theory.
func TestCoarseningLSW(t *testing.T) {
	const (
		T     = 800.0
		D     = 1e-18
		ceq   = 1e-3
		cp    = 0.25
		gamma = 0.05
		vm    = 1e-5
		end   = 1e8
	)
	a := population.Alloy{
		C0: 5e-3, Cp: cp, Solvus: population.Solvus{A: math.Log(ceq)}, Vm: vm, Gamma: gamma,
		Mobility: kinetics.SoluteDiffusivity{D: D},
	}
	var times []float64
	for k := 0; k <= 80; k++ {
		times = append(times, end*math.Pow(10, float64(k-80)/10))
	}
	res, err := a.Run(context.Background(), isothermal(t, T, end), population.Options{Times: times})
	if err != nil {
		t.Fatal(err)
	}
	vp := vm / cp
	K := 8 * gamma * D * ceq * vp / (9 * cnt.Gas * T * (cp - ceq))
	var ts, r3 []float64
	for _, r := range res.Rows {
		if r.Time >= end/10 {
			ts, r3 = append(ts, r.Time), append(r3, r.MeanRadius*r.MeanRadius*r.MeanRadius)
		}
	}
	_, slope := stat.LinearRegression(ts, r3, nil, false)
	if rel := math.Abs(slope-K) / K; rel > 0.10 {
		t.Errorf("d(r̄³)/dt = %.4g m³/s, LSW K = %.4g: off by %.1f %%, want ≤ 10 %%", slope, K, 100*rel)
	} else {
		t.Logf("d(r̄³)/dt = %.4g m³/s, LSW K = %.4g: off by %.1f %%", slope, K, 100*rel)
	}
	// The scaled distribution at the end.
	last := res.Rows[len(res.Rows)-1]
	cs := append([]population.Class(nil), res.Final...)
	sort.Slice(cs, func(i, j int) bool { return cs[i].Size < cs[j].Size })
	var us, ws []float64
	for _, c := range cs {
		us, ws = append(us, c.Size/last.MeanRadius), append(ws, c.Number)
	}
	var run, ks float64
	for i, u := range us {
		f := lswCDF(u)
		ks = math.Max(ks, math.Abs(run/last.NumberDensity-f)) // just below the class
		run += ws[i]
		ks = math.Max(ks, math.Abs(run/last.NumberDensity-f)) // just above
	}
	_, sd := stat.PopMeanStdDev(us, ws)
	lswMean := quad.Fixed(func(u float64) float64 { return u * lswDensity(u) }, 0, 1.5, 200, nil, 0) / quad.Fixed(lswDensity, 0, 1.5, 200, nil, 0)
	lswSD := math.Sqrt(quad.Fixed(func(u float64) float64 { return (u - lswMean) * (u - lswMean) * lswDensity(u) }, 0, 1.5, 200, nil, 0) / quad.Fixed(lswDensity, 0, 1.5, 200, nil, 0))
	if ks > 0.10 {
		t.Errorf("Kolmogorov–Smirnov distance to the LSW distribution %.3g, want ≤ 0.10", ks)
	}
	if rel := math.Abs(sd-lswSD) / lswSD; rel > 0.20 {
		t.Errorf("standard deviation of r/r̄ %.4g, LSW %.4g: off by %.0f %%, want ≤ 20 %%", sd, lswSD, 100*rel)
	}
	t.Logf("KS %.3g, sd %.4g (LSW %.4g), max u %.3g, %d classes, %d steps, r̄ %.3g m, N %.3g m^-3", ks, sd, lswSD, us[len(us)-1], len(cs), res.Steps, last.MeanRadius, last.NumberDensity)
}
