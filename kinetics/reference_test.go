package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/integrate/quad"
)

// The independent references of the path integrals: adaptive
// Gauss–Kronrod (7/15 points) in the variable of each integral, nested for
// the extended volume, written here and nowhere else. They share no code
// with pathint.go (no moments, no integration matrix, no bisection of the
// same rule) and are used only by the tests.

// Kronrod 15-point nodes and weights on [−1, 1] and the weights of the
// embedded 7-point Gauss rule (whose nodes are xk[1], xk[3], xk[5], xk[7]);
// Piessens R. et al., QUADPACK, Springer (1983), routine QK15 (from
// memory; checked by TestKronrodRule against gonum's Gauss–Legendre rule
// and against polynomials of degree up to 22).
var (
	xk = [8]float64{0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
		0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
		0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
		0.207784955007898467600689403773245, 0}
	wk = [8]float64{0.022935322010529224963732008058970, 0.063092092629978553290700663189204,
		0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
		0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
		0.204432940075298892414161999234649, 0.209482141084727828012999174891714}
	wg7 = [4]float64{0.129484966168869693270611432679082, 0.279705391489276667901467771423780,
		0.381830050505118944950369775488975, 0.417959183673469387755102040816327}
)

// kronrod15 is the 15-point Kronrod estimate of ∫_a^b f and its difference
// with the embedded 7-point Gauss estimate.
func kronrod15(f func(float64) float64, a, b float64) (k, diff float64) {
	c, h := (a+b)/2, (b-a)/2
	fc := f(c)
	k, g := wk[7]*fc, wg7[3]*fc
	for j := 0; j < 7; j++ {
		s := f(c-h*xk[j]) + f(c+h*xk[j])
		k += wk[j] * s
		if j%2 == 1 {
			g += wg7[j/2] * s
		}
	}
	return k * h, (k - g) * h
}

// adaptive is ∫_a^b f by bisection until, on every interval, the Kronrod
// and Gauss estimates differ by less than rel of the Kronrod one or by
// less than abs times the interval's share of [a, b]. The difference of the
// two estimates bounds the error of the 15-point one with a wide margin.
func adaptive(f func(float64) float64, a, b, rel, abs float64) float64 {
	var rec func(a, b float64, depth int) float64
	rec = func(lo, hi float64, depth int) float64 {
		k, d := kronrod15(f, lo, hi)
		if depth >= 40 || math.Abs(d) <= math.Max(rel*math.Abs(k), abs*math.Abs((hi-lo)/(b-a))) {
			return k
		}
		m := (lo + hi) / 2
		return rec(lo, m, depth+1) + rec(m, hi, depth+1)
	}
	if a == b {
		return 0
	}
	return rec(a, b, 0)
}

// adaptiveTotal is adaptive with the absolute part of the tolerance set
// from a first estimate of the total on 64 pieces: rel of the total.
func adaptiveTotal(f func(float64) float64, a, b, rel float64) float64 {
	var est float64
	for i := 0; i < 64; i++ {
		k, _ := kronrod15(f, a+(b-a)*float64(i)/64, a+(b-a)*float64(i+1)/64)
		est += math.Abs(k)
	}
	return adaptive(f, a, b, rel, rel*est)
}

func TestKronrodRule(t *testing.T) {
	// The Gauss nodes and weights among the Kronrod ones are gonum's.
	x, w := make([]float64, 7), make([]float64, 7)
	quad.Legendre{}.FixedLocations(x, w, -1, 1)
	for j := 0; j < 4; j++ {
		// gonum lists the nodes from +1 down: node j is ±xk[2j+1]
		if !scalar.EqualWithinAbs(math.Abs(x[j]), xk[2*j+1], 1e-14) || !scalar.EqualWithinAbs(w[j], wg7[j], 1e-14) {
			t.Errorf("Gauss node %d: gonum %.16g, %.16g; table %.16g, %.16g", j, x[j], w[j], xk[2*j+1], wg7[j])
		}
	}
	// The 15-point rule is exact for polynomials of degree up to 22.
	for deg := 0; deg <= 22; deg++ {
		f := func(x float64) float64 { return math.Pow(x, float64(deg)) }
		k, _ := kronrod15(f, 0, 1)
		if want := 1 / float64(deg+1); !scalar.EqualWithinRel(k, want, 1e-14) {
			t.Errorf("∫x^%d on [0, 1] = %.16g, want %.16g", deg, k, want)
		}
	}
}

// rateAndGrowth is ln J and u ≥ 0 at T, for the references: the model's
// own growth rate (State.Growth), not its logarithm.
func (md *Model) rateAndGrowth(T float64) (lnJ, u float64) {
	s := md.state(T, true)
	u = s.Growth
	if !(u > 0) {
		u = 0
	}
	return s.LnJ, u
}

// refCoolingLnXext is ln of the extended volume at 1 K/s of linear cooling
// from T_e down to lo (refLinearLnXext).
func refCoolingLnXext(md *Model, lo, rel float64) float64 { return refLinearLnXext(md, md.te, lo, rel) }

// refLinearLnXext is ln of the extended volume at 1 K/s at the end of a
// linear path from start to end (K; cooling for end < start, heating for
// end > start), by nested adaptive quadrature in temperature:
//
//	Xext = (4π/3)·∫ J(T')·G(T')³ dT',  G(T') = |∫_{T'}^{end} u dT''|
//
// over the path (a nucleus born at T' grows until the path ends), with J
// scaled by the largest J on a scan so that nothing overflows, to relative
// tolerance rel on the outer integral and rel/10 on the inner one; u is
// scaled by its largest value on the scan too, so that a growth speed of
// 1e120 m/s does not overflow the cube. G is integrated from the end of
// the path towards T' for every T', so no length is a difference of two
// large ones.
func refLinearLnXext(md *Model, start, end, rel float64) float64 {
	lo, hi := math.Min(start, end), math.Max(start, end)
	top, uTop := math.Inf(-1), 0.0
	for i := 0; i <= 4000; i++ {
		lnJ, u := md.rateAndGrowth(lo + (hi-lo)*float64(i)/4000)
		top, uTop = math.Max(top, lnJ), math.Max(uTop, u)
	}
	if !(uTop > 0) {
		uTop = 1
	}
	u := func(T float64) float64 { _, u := md.rateAndGrowth(T); return u / uTop }
	G := func(T float64) float64 { // u ≥ 0: relative tolerance suffices
		return adaptive(u, math.Min(T, end), math.Max(T, end), rel/10, 0)
	}
	outer := func(T float64) float64 {
		lnJ, _ := md.rateAndGrowth(T)
		if math.IsInf(lnJ, -1) || math.IsNaN(lnJ) {
			return 0
		}
		g := G(T)
		return math.Exp(lnJ-top) * g * g * g
	}
	return ln4pi3 + top + 3*math.Log(uTop) + math.Log(adaptiveTotal(outer, lo, hi, rel))
}

// refPathSums is the reference for the running sums at point k of a path
// (straight in T(t) between points) for the integrand src: ln N = ln ∫J dt
// and ln Xext = ln (4π/3)·∫ J(t')·G(t')³ dt' with G(t') = ∫_{t'}^{t_k} u,
// by adaptive quadrature in time on every segment. G is the growth from
// t' to the end of its own segment plus the growth of every later segment,
// each integrated on its own: a sum of positive terms, never a difference
// of two long lengths (the direct O(N²) sum, done once per point).
func refPathSums(src source, time, temp []float64, k int, rel float64) (lnN, lnXext float64) {
	top := math.Inf(-1)
	for i := 0; i < k; i++ {
		for j := 0; j <= 50; j++ {
			top = math.Max(top, src.at(temp[i]+(temp[i+1]-temp[i])*float64(j)/50).lnJ)
		}
	}
	if math.IsInf(top, -1) {
		return math.Inf(-1), math.Inf(-1)
	}
	T := func(i int, t float64) float64 { // temperature at time t in segment i
		return temp[i] + (temp[i+1]-temp[i])*(t-time[i])/(time[i+1]-time[i])
	}
	u := func(i int) func(float64) float64 {
		return func(t float64) float64 { return math.Exp(src.at(T(i, t)).lnU) }
	}
	J := func(i int, t float64) float64 {
		lnJ := src.at(T(i, t)).lnJ
		if math.IsInf(lnJ, -1) {
			return 0
		}
		return math.Exp(lnJ - top)
	}
	// later[i]: growth over segments i+1 … k−1
	later := make([]float64, k)
	for i := k - 2; i >= 0; i-- {
		later[i] = later[i+1] + adaptive(u(i+1), time[i+1], time[i+2], rel/10, 0) // u ≥ 0
	}
	var n, x float64
	for i := 0; i < k; i++ {
		n += adaptiveTotal(func(t float64) float64 { return J(i, t) }, time[i], time[i+1], rel)
		x += adaptiveTotal(func(t float64) float64 {
			j := J(i, t)
			if j == 0 {
				return 0
			}
			g := adaptive(u(i), t, time[i+1], rel/10, 0) + later[i]
			return j * g * g * g
		}, time[i], time[i+1], rel)
	}
	return top + math.Log(n), ln4pi3 + top + math.Log(x)
}
