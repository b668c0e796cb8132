package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestIntegrationMatrix: the integration matrix of a rule integrates the
// polynomials it interpolates exactly, Σ_j s_ij·x_j^m = (1 − x_i^(m+1))/(m+1)
// for m < n (to rounding).
func TestIntegrationMatrix(t *testing.T) {
	for name, ru := range map[string]*rule{"gauss": gaussRule, "short": shortRule} {
		n := len(ru.x)
		for m := 0; m < n; m++ {
			for i := range n {
				var got float64
				for j := range n {
					got += ru.s[i*n+j] * math.Pow(ru.x[j], float64(m))
				}
				want := (1 - math.Pow(ru.x[i], float64(m+1))) / float64(m+1)
				if !scalar.EqualWithinAbs(got, want, 1e-13) {
					t.Errorf("%s rule, node %d, x^%d: %.16g, want %.16g", name, i, m, got, want)
				}
			}
		}
	}
}

// TestShortRuleError: the short rules on the two shapes they meet, e^(x·s)
// (δ, W₀, R) and e^(x·s)·(1 − s)³ (W₃), against the 20-point rule: the
// 4-node rule for a change x of smallStep = 0.5 in the logarithm across a
// piece, the 3-node one for flatStep = 0.03. Stated in pathint.go (the
// tolerances here): 2e-12 and 2.4e-8 for 4 nodes (measured 2.2e-12,
// 2.4e-8), 1e-15 and 7e-9 for 3 (measured 6.5e-9 for W₃).
func TestShortRuleError(t *testing.T) {
	for _, c := range []struct {
		ru   *rule
		x, k float64
		tol  float64
		name string
	}{{shortRule, smallStep, 0, 2.5e-12, "4 nodes"}, {shortRule, smallStep, 3, 2.5e-8, "4 nodes"},
		{flatRule, flatStep, 0, 1e-15, "3 nodes"}, {flatRule, flatStep, 3, 7e-9, "3 nodes"}} {
		f := func(s float64) float64 { return math.Exp(c.x*s) * math.Pow(1-s, c.k) }
		var exact, short float64
		for i, x := range gaussRule.x {
			exact += gaussRule.g[i] * f(x)
		}
		for i, x := range c.ru.x {
			short += c.ru.g[i] * f(x)
		}
		d := math.Abs(short/exact - 1)
		if !(d <= c.tol) {
			t.Errorf("%s, (1 − s)^%g·e^(%g s): off by %.3g, stated %.3g", c.name, c.k, c.x, d, c.tol)
		}
		t.Logf("%s, (1 − s)^%g·e^(%g s): %.2g", c.name, c.k, c.x, d)
	}
}

// burst is an integrand of our own in which growth dominates: nucleation
// in a burst near 1100 K early on a cooling path, then long, fast growth
// near 800 K, and a second, weak nucleation near 550 K where growth has
// almost stopped (nuclei born after the crystals have grown 10⁴ times
// further than they will grow now: the case where moments about a fixed
// origin lose every digit).
func burst() source {
	return source{above: 1200, hasU: true, eval: func(T float64) (float64, float64) {
		lnJ := math.Max(40-((T-1100)/20)*((T-1100)/20), 10-((T-550)/20)*((T-550)/20))
		return lnJ, math.Log(1e-5) - ((T-800)/100)*((T-800)/100)
	}}
}

// coolingCurve is a Newtonian cooling from 1250 K (above the limit of
// burst, 1200 K) towards 480 K in n+1 unevenly spaced points over 100 s.
func coolingCurve(n int) (time, temp []float64) {
	for i := 0; i <= n; i++ {
		x := float64(i) / float64(n)
		t := 100 * (x + 0.3*x*(1-x)*math.Sin(7*x)) // uneven steps
		time = append(time, t)
		temp = append(temp, 480+770*math.Exp(-t/25))
	}
	return time, temp
}

// TestRunningSumsReference: the running N and Xext of the integrator at
// every point of a sparse (12 points) and a dense (300 points) sampling of
// the same curve, against the direct reference (refPathSums, relative
// tolerance 1e-10). Tolerance 1e-7 relative, from the integrator's 1e-8 on
// every piece (at most about 4e-8 on a sum).
func TestRunningSumsReference(t *testing.T) {
	src := burst()
	for _, n := range []int{11, 299} {
		time, temp := coolingCurve(n)
		r := integratePath(src, time, temp, 0, math.Inf(1))
		s := r.sums()
		step := 1
		if n > 50 {
			step = 23 // the reference is O(N) per point
		}
		worst := 0.0
		for k := 1; k <= n; k += step {
			lnN, lnX := refPathSums(src, time, temp, k, 1e-10)
			if math.IsInf(lnN, -1) {
				if !math.IsInf(s.LnN[k], -1) && s.LnN[k] > -700 {
					t.Errorf("%d points, point %d: ln N = %g, reference none", n+1, k, s.LnN[k])
				}
				continue
			}
			if !scalar.EqualWithinAbs(s.LnN[k], lnN, 1e-7) || !scalar.EqualWithinAbs(s.LnXext[k], lnX, 1e-7) {
				t.Errorf("%d points, point %d (%.1f K): ln N %.10f, ln Xext %.10f; reference %.10f, %.10f",
					n+1, k, temp[k], s.LnN[k], s.LnXext[k], lnN, lnX)
			}
			worst = math.Max(worst, math.Max(math.Abs(s.LnN[k]-lnN), math.Abs(s.LnXext[k]-lnX)))
		}
		t.Logf("%d points: largest difference in ln N, ln Xext %.2g", n+1, worst)
	}
}

// TestHeatingHoldsReference: a path that cools, holds, heats through the
// limit of the integrand (1200 K, where growth stops) and holds above it,
// then cools again: the same reference and tolerance as
// TestRunningSumsReference, and the running sums never fall.
func TestHeatingHoldsReference(t *testing.T) {
	src := burst()
	time := []float64{0, 10, 30, 35, 45, 60, 80, 81, 100}
	temp := []float64{1190, 1050, 1050, 1150, 1250, 1250, 900, 900, 560}
	r := integratePath(src, time, temp, 0, math.Inf(1))
	s := r.sums()
	for k := 1; k < len(time); k++ {
		lnN, lnX := refPathSums(src, time, temp, k, 1e-10)
		if !scalar.EqualWithinAbs(s.LnN[k], lnN, 1e-7) || !scalar.EqualWithinAbs(s.LnXext[k], lnX, 1e-7) {
			t.Errorf("point %d (%g K): ln N %.10f, ln Xext %.10f; reference %.10f, %.10f", k, temp[k], s.LnN[k], s.LnXext[k], lnN, lnX)
		}
		if s.LnN[k] < s.LnN[k-1] || s.LnXext[k] < s.LnXext[k-1] || s.L[k] < s.L[k-1] {
			t.Errorf("point %d: a running sum fell (%v)", k, s)
		}
	}
}

// TestCrossingReference: where the integrator says the extended volume
// reaches a level, the reference on the same path with a point added there
// (the path unchanged: the point lies on its straight segment) gives that
// level. Tolerance 1e-7 in the logarithm, as for the sums.
func TestCrossingReference(t *testing.T) {
	src := burst()
	time, temp := coolingCurve(11)
	r := integratePath(src, time, temp, 0, math.Inf(1))
	total := r.value(sumXext, r.at(math.Inf(1)))
	for _, below := range []float64{0.5, 3, 10} {
		level := total - below
		tc, Tc, ok := r.cross(sumXext, level, math.Inf(1))
		if !ok {
			t.Fatalf("level %g below the total not reached", below)
		}
		// insert the crossing as a point
		var tm, tp []float64
		k := 0
		for i := range time {
			if k == 0 && time[i] > tc {
				tm, tp = append(tm, tc), append(tp, Tc)
				k = len(tm) - 1
			}
			tm, tp = append(tm, time[i]), append(tp, temp[i])
		}
		if k == 0 {
			t.Fatalf("crossing at %g s not inside the path", tc)
		}
		_, lnX := refPathSums(src, tm, tp, k, 1e-10)
		if !scalar.EqualWithinAbs(lnX, level, 1e-7) {
			t.Errorf("level %.6f reached at %.9f s (%.6f K) by the integrator; the reference there gives %.9f", level, tc, Tc, lnX)
		}
		t.Logf("ln Xext = total − %g at %.6f s (%.4f K, before point %d): reference %+.2g", below, tc, Tc, k, lnX-level)
	}
}

// TestOverflowNeedsNoDepth: a sum already past the largest float64 in SI
// asks for no deeper floor (deepening only adds to it); a representable
// sum asks for lambdaMargin e-folds below its normalized value.
func TestOverflowNeedsNoDepth(t *testing.T) {
	small := accum{r: math.Exp(-437)}
	r := &pathRun{tS: 1}
	r.offsets[sumR] = 1200 // SI: 1200 − 437 = 763 > maxLn
	if got := r.lambdaNeeded(small); got != 0 {
		t.Errorf("overflowing sum: needs depth %g, want 0", got)
	}
	r.offsets[sumR] = 1000 // SI: 563, representable
	if got, want := r.lambdaNeeded(small), lambdaMargin+437; math.Abs(got-want) > 1e-9 {
		t.Errorf("representable sum: needs depth %g, want %g", got, want)
	}
}
