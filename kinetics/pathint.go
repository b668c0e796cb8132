package kinetics

import (
	"math"
	"sort"

	"gonum.org/v1/gonum/integrate/quad"

	"undercool/kinetics/internal/bracket"
)

// The one adaptive integrator behind every temperature history: linear
// cooling, measured paths, heating, holds and quench factors. A path is a
// chain of straight segments in T(t) (a linear cooling is one segment); on
// each stretch of a segment it collects
//
//	δ   = ∫ u dt                                  growth, m
//	W_k = ∫ J(t)·(L_end − L(t))^k dt,  k = 0…3    nuclei and their moments about the stretch's end
//	R   = ∫ r dt                                  a second rate (1/t_X of the additivity sum)
//
// with L_end − L(t) from the rule's own integration matrix (the exact
// integral of the polynomial through u at the nodes), so that one set of
// evaluations gives every moment. The stretches ("pieces") are chained with
// the binomial shift of the moments (see accum), which adds only
// non-negative terms: a relative error ε on every δ, W_k and R bounds the
// relative error of every running sum (N, L, X_ext, the additivity sum) by
// about 4ε, at every point of the path, however far the crystals have grown.
//
// Two rules, one error control:
//
//   - long segments (a linear cooling, a sparse curve): 20-point
//     Gauss–Legendre on a piece and on its two halves; the halves are kept
//     when every δ, W_k and R of the two agree to pathTol (1e-8) of its value,
//     else both halves are bisected again;
//   - short segments (a densely sampled curve, whose steps change ln J,
//     ln u and ln r by at most smallStep): ln J, ln u and ln r are
//     interpolated by the quartic through five samples and the interpolant
//     integrated by 4-point Gauss–Legendre, 3-point where every logarithm
//     changes by at most flatStep (TestShortRuleError: 2e-12 on e^(x·s),
//     2.4e-8 and 7e-9 on W₃'s e^(x·s)·(1 − s)³); the interpolation is
//     checked by the cubic through four of the samples predicting the
//     fifth to shortTol (1e-7 in the logarithm, i.e. relative), else the
//     segment is bisected. The samples are the path's own points where the
//     path runs monotonically in even steps (neighbours), so a dense curve
//     costs one evaluation of the model per point.
//
// Floors: a quantity may miss its relative tolerance where it lies below
// e^(−Λ) of the path's scale per unit time, so that the far tails where J
// is hundreds of decades below its peak cost nothing. The scales are the
// largest J, u and r on the span of the path (a scan of scanPoints steps);
// Λ starts at lambda0 and the path is integrated again with deeper floors
// whenever a total it reports, or a level a crossing is sought at, lies
// less than lambdaMargin above the floor. All sums are normalized (time by
// the path's duration, J, u and r by their scales) and kept as logarithms
// when reported: rates span hundreds of decades.
//
// Measured against independent adaptive Gauss–Kronrod quadrature
// (reference_test.go): the critical cooling rate of the reference glass and
// of every shipped card to 1e-14 in the extended volume
// (TestCriticalRateReference, TestCriticalRateConverged), running sums of a
// growth-dominated path to 3e-13 (TestRunningSumsReference), a 0.1 s-sampled
// quench factor to 4e-15 (TestQuenchSampledReference).

const (
	pathTol      = 1e-8   // relative tolerance of each piece
	gaussPoints  = 20     // nodes of the rule for long pieces
	lambda0      = 60.0   // initial floor depth, in e-folds below the scale
	lambdaMargin = 12.0   // a total must lie this far above the floor
	lambdaMax    = 640.0  // deepest floor (normalized values stay above the subnormals)
	scanPoints   = 64     // steps of the scan for the scales
	maxDepth     = 48     // bisections of a segment at most
	initSpanK    = 200.0  // a long segment is first cut into pieces of at most this many kelvin
	smallStep    = 0.5    // endpoint change in ln J, ln u or ln r below which a segment takes the short rule
	shortTol     = 1e-7   // interpolation error allowed in ln J, ln u, ln r by the short rule
	shortPoints  = 4      // Gauss nodes of the short rule's interpolant
	flatStep     = 0.03   // change in ln J, ln u and ln r across a segment below which 3 nodes do
	underflowLn  = -700.0 // ln of a normalized rate below which it is zero in every sum
)

// sample is what the integrand gives at one temperature: ln of the rate
// counted (nucleation J, m⁻³·s⁻¹, or 1/C of a C-curve, 1/s), ln of the
// growth speed u (m/s) and u itself in units of the run's scale (u/e^lnUS,
// set by pathRun.sample; 0 from source.at), and ln of the second rate r
// (1/s). −Inf and 0 mean none. The growth speed is carried by its
// logarithm, like the rates: a speed past the float64 range (a mobility
// law far outside its range) stays finite in the normalized sums.
type sample struct{ lnJ, u, lnU, lnR float64 }

// source is an integrand: eval gives ln J and ln u at a temperature (−Inf:
// none); above is a temperature at or above which nothing happens (T_e;
// +Inf when none), where segments are cut so that no rule straddles the
// kink of u there. The second rate, when hasR, is the reciprocal of an
// Avrami-4 time,
//
//	r = e^lnC·J^(1/4)·u^(3/4)
//
// (the additivity sum's 1/t_X; see Model.source).
type source struct {
	eval  func(T float64) (lnJ, lnU float64)
	above float64
	hasU  bool // u may be positive somewhere
	hasR  bool
	lnC   float64
}

func (s source) at(T float64) sample {
	v := sample{math.Inf(-1), 0, math.Inf(-1), math.Inf(-1)}
	if !(T < s.above) {
		return v
	}
	v.lnJ, v.lnU = s.eval(T)
	if math.IsNaN(v.lnJ) {
		v.lnJ = math.Inf(-1)
	}
	if math.IsNaN(v.lnU) {
		v.lnU = math.Inf(-1)
	}
	if s.hasR {
		if v.lnR = s.lnC + (v.lnJ+3*v.lnU)/4; math.IsNaN(v.lnR) {
			v.lnR = math.Inf(-1)
		}
	}
	return v
}

// rule is an interpolatory rule on [0, 1]: nodes x, weights g and the
// integration matrix s, s[i·n+j] = ∫_{x_i}^1 ℓ_j, ℓ_j the Lagrange
// polynomials of the nodes.
type rule struct {
	x, g, s []float64
}

func newRule(x, g []float64) *rule {
	n := len(x)
	r := &rule{x: x, g: g, s: make([]float64, n*n)}
	// ∫_{x_i}^1 ℓ_j exactly, by Gauss–Legendre with n points (exact to
	// degree 2n−1 ≥ n−1).
	qx, qw := make([]float64, n), make([]float64, n)
	for i := range n {
		if x[i] == 1 {
			continue // ∫ from 1 to 1
		}
		quad.Legendre{}.FixedLocations(qx, qw, x[i], 1)
		for j := range n {
			var sum float64
			for k := range n {
				l := 1.0
				for m := range n {
					if m != j {
						l *= (qx[k] - x[m]) / (x[j] - x[m])
					}
				}
				sum += qw[k] * l
			}
			r.s[i*n+j] = sum
		}
	}
	return r
}

var (
	gaussRule = legendre(gaussPoints)
	// shortRule integrates the interpolant of a short piece (see
	// shortPiece). With a change x ≤ smallStep in a logarithm across the
	// piece, its 4 nodes integrate e^(x·s) to 2e-12 and e^(x·s)·(1 − s)³,
	// the shape of W₃, to 2.4e-8 (TestShortRuleError).
	shortRule = legendre(shortPoints)
	// flatRule is the same with 3 nodes, for the steps of a dense curve
	// that change every logarithm by at most flatStep: e^(x·s)·(1 − s)³ to
	// 7e-9 there (TestShortRuleError).
	flatRule = legendre(shortPoints - 1)

	// quartic[i][j] is the weight of sample j (at 0, 1/4, 1/2, 3/4, 1)
	// in the quartic through them at node i of shortRule.
	quartic = quarticAt(shortRule.x)
)

// quarticAt is the weights of five equally spaced samples of [0, 1] in the
// quartic through them, at each of the nodes x.
func quarticAt(x []float64) *[shortPoints][5]float64 {
	y := [5]float64{0, 0.25, 0.5, 0.75, 1}
	var w [5]float64
	for j := range y {
		w[j] = 1
		for k := range y {
			if k != j {
				w[j] /= y[j] - y[k]
			}
		}
	}
	var q [shortPoints][5]float64
	for i, t := range x {
		q[i] = lagrangeAt(&y, &w, t, -1)
	}
	return &q
}

// legendre is the n-point Gauss–Legendre rule on [0, 1].
func legendre(n int) *rule {
	x, g := make([]float64, n), make([]float64, n)
	quad.Legendre{}.FixedLocations(x, g, 0, 1)
	return newRule(x, g)
}

// Kinds of piece: the rule that integrated it.
const (
	kindGauss = iota
	kindShort
	kindHold // T constant: closed form
	kindNone // at or above the source's limit: nothing
)

// piece is one integrated stretch of a segment, in normalized units
// (time in units of the path's duration, rates and speeds in units of
// their scales; see pathRun).
type piece struct {
	t0, t1 float64 // s
	T0, T1 float64 // K
	kind   int
	dL     float64    // δ
	w      [4]float64 // W_k
	r      float64    // R
}

// then is the piece a followed by b: the moments of a are shifted to the
// end of b (the binomial expansion of (δ_b + d)^k).
func then(a, b piece) piece {
	d := b.dL
	c := piece{t0: a.t0, t1: b.t1, T0: a.T0, T1: b.T1, kind: a.kind, dL: a.dL + d, r: a.r + b.r}
	c.w[0] = b.w[0] + a.w[0]
	c.w[1] = b.w[1] + a.w[1] + d*a.w[0]
	c.w[2] = b.w[2] + a.w[2] + d*(2*a.w[1]+d*a.w[0])
	c.w[3] = b.w[3] + a.w[3] + d*(3*a.w[2]+d*(3*a.w[1]+d*a.w[0]))
	return c
}

// accum is the running state of a path: the grown length and the moments
// about it of all nuclei so far, in the normalized units of the run,
//
//	m_k = Σ_i w_i·(L − ℓ_i)^k,  Xext ∝ m_3
//
// re-centred at every piece by the binomial shift, in which every term is
// non-negative (the moments about a fixed origin, L³M₀ − 3L²M₁ + 3LM₂ − M₃,
// lose every digit when L and the birth lengths ℓ_i are close).
type accum struct {
	L float64
	m [4]float64
	r float64 // the second rate's integral
}

func (a accum) add(p piece) accum {
	d := p.dL
	a.L += d
	a.m[3] += p.w[3] + d*(3*a.m[2]+d*(3*a.m[1]+d*a.m[0]))
	a.m[2] += p.w[2] + d*(2*a.m[1]+d*a.m[0])
	a.m[1] += p.w[1] + d*a.m[0]
	a.m[0] += p.w[0]
	a.r += p.r
	return a
}

// pathRun is a path integrated: its pieces in order and the scales that
// turn the normalized sums into SI, with the running state at every
// markEvery-th point of the path; the state at any point or piece is the
// state at the mark before it plus the pieces between (see atPoint,
// before), the same additions in the same order as from the start.
type pathRun struct {
	src        source
	time, temp []float64 // the points of the path
	span       float64   // K, the temperature span of the scan
	band       float64   // K, width of the bands the pieces keep within (0: none)
	pieces     []piece
	points     []int   // for each point of the path, the number of pieces up to it
	marks      []accum // the running state at every markEvery-th point of the path
	total      accum   // the state at the end
	// normalization: times over tS (s), speeds over e^lnUS (m/s), J over
	// e^sJ, r over e^sR
	tS, lnUS, sJ, sR float64
	lambda           float64 // floor depth used
	floor            float64 // e^(−λ)
	// lost: somewhere nucleation counts while the growth speed there lies
	// so far below the path's largest (more than e^745) that it underflows
	// in the normalized sums; the extended volume cannot be represented
	// and is reported as NaN (see value).
	lost    bool
	buf     []sample
	offsets [3]float64 // see offset
	rScale  float64    // r/e^sR = rScale·(J/e^sJ·(u/e^lnUS)³)^(1/4)
	lScale  float64    // m per normalized length, e^lnUS·tS (0 or +Inf past the float64 range)
}

// scales is the largest ln J, ln u and ln r of a source on [lo, hi].
func (s source) scales(lo, hi float64) (lnJ, lnU, lnR float64) {
	lnJ, lnU, lnR = math.Inf(-1), math.Inf(-1), math.Inf(-1)
	hi = math.Min(hi, s.above)
	if !(hi >= lo) {
		return lnJ, lnU, lnR
	}
	for i := 0; i <= scanPoints; i++ {
		v := s.at(lo + (hi-lo)*float64(i)/scanPoints)
		lnJ, lnU, lnR = math.Max(lnJ, v.lnJ), math.Max(lnU, v.lnU), math.Max(lnR, v.lnR)
	}
	return lnJ, lnU, lnR
}

// sample is the source at T with u in the run's units.
func (r *pathRun) sample(T float64) sample {
	v := r.src.at(T)
	v.u = math.Exp(v.lnU - r.lnUS)
	return v
}

// integratePath integrates a source along the straight segments between
// the points (time[i], temp[i]) of a path (times strictly increasing),
// deepening the floors until the sums at time tCheck (the end of the path
// for +Inf) lie lambdaMargin above them.
//
// With band > 0 the path is also cut where it crosses a multiple of band
// (kelvin), so that every piece lies within one band.
func integratePath(src source, time, temp []float64, band, tCheck float64) *pathRun {
	r := newRun(src, time, temp, band, lambda0)
	return r.deepen(r.lambdaNeeded(r.at(tCheck)))
}

// deepen returns the run with floors at least lambda deep: r itself if they
// are, else the path integrated again.
func (r *pathRun) deepen(lambda float64) *pathRun {
	if lambda <= r.lambda || r.lambda >= lambdaMax {
		return r
	}
	return newRun(r.src, r.time, r.temp, r.band, math.Min(lambda, lambdaMax))
}

// lambdaNeeded is the floor depth at which the non-zero sums of state a lie
// lambdaMargin above the floor (0 if none is non-zero). A sum already past
// the largest float64 in SI needs no depth: what a deeper floor adds to it
// only adds to an overflow (a mobility law far outside its range gets
// there, and a deep run of it costs seconds).
func (r *pathRun) lambdaNeeded(a accum) float64 {
	need := 0.0
	lnL := r.lnUS + math.Log(r.tS)
	for i, v := range []float64{a.m[0], a.m[3], a.L, a.r} {
		off := [4]float64{r.offset(sumN), r.offset(sumXext), lnL, r.offset(sumR)}[i]
		if v > 0 && off+math.Log(v) <= maxLn {
			need = math.Max(need, lambdaMargin-math.Log(v))
		}
	}
	return need
}

// level turns a level of a running sum, given as ln of its value in the
// normalized units, into the floor depth it needs.
func levelNeeds(lnNormalized float64) float64 { return lambdaMargin - lnNormalized }

func newRun(src source, time, temp []float64, band, lambda float64) *pathRun {
	n := len(time)
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, T := range temp {
		lo, hi = math.Min(lo, T), math.Max(hi, T)
	}
	lnJ, lnU, lnR := src.scales(lo, hi)
	r := &pathRun{src: src, time: time, temp: temp, band: band, span: hi - lo, tS: time[n-1] - time[0],
		lnUS: lnU, sJ: lnJ, sR: lnR, lambda: lambda, floor: math.Exp(-lambda)}
	if !(r.tS > 0) {
		r.tS = 1
	}
	if math.IsInf(r.lnUS, -1) {
		r.lnUS = 0
	}
	if math.IsInf(r.sJ, -1) {
		r.sJ = 0
	}
	if math.IsInf(r.sR, -1) {
		r.sR = 0
	}
	r.offsets = [3]float64{
		sumN:    r.sJ + math.Log(r.tS),
		sumXext: ln4pi3 + r.sJ + math.Log(r.tS) + 3*(r.lnUS+math.Log(r.tS)),
		sumR:    r.sR + math.Log(r.tS),
	}
	r.rScale = math.Exp(src.lnC + (r.sJ+3*r.lnUS)/4 - r.sR)
	r.lScale = math.Exp(r.lnUS) * r.tS
	r.buf = make([]sample, 3*gaussPoints)
	r.points = make([]int, n)
	r.pieces = make([]piece, 0, n+n/16+64)
	w := window{run: r, temp: temp}
	for k := range w.index {
		w.index[k] = -1
	}
	for i := 0; i+1 < n; i++ {
		if !r.neighbours(i, &w) {
			r.segment(time[i], time[i+1], temp[i], temp[i+1], w.at(i), w.at(i+1))
		}
		r.points[i+1] = len(r.pieces)
	}
	r.marks = make([]accum, 0, (n+markEvery-1)/markEvery)
	r.eachPoint(func(j int, a accum) {
		if j%markEvery == 0 {
			r.marks = append(r.marks, a)
		}
		if j == n-1 {
			r.total = a
		}
	})
	return r
}

// markEvery is how many path points apart the run keeps its state.
const markEvery = 16

// eachPoint calls visit with the running state at every point of the path,
// in order, adding up the pieces between them.
func (r *pathRun) eachPoint(visit func(j int, a accum)) {
	var a accum
	k := 0
	for j, m := range r.points {
		for ; k < m; k++ {
			a = a.add(r.pieces[k])
		}
		visit(j, a)
	}
}

// atPoint is the running state at point j of the path: the state kept at
// the mark before it and the pieces from there.
func (r *pathRun) atPoint(j int) accum {
	a := r.marks[j/markEvery]
	for _, p := range r.pieces[r.points[j/markEvery*markEvery]:r.points[j]] {
		a = a.add(p)
	}
	return a
}

// window holds the samples at the last few points of a path, each
// evaluated once as the integration moves along.
type window struct {
	run   *pathRun
	temp  []float64
	v     [8]sample
	index [8]int
}

// at is the sample at point j, which must lie within 7 points of the
// latest one asked for.
func (w *window) at(j int) sample {
	k := j & 7
	if w.index[k] != j {
		w.v[k], w.index[k] = w.run.sample(w.temp[j]), j
	}
	return w.v[k]
}

// segment integrates one straight segment, cut where it crosses the
// source's limit.
func (r *pathRun) segment(ta, tb, Ta, Tb float64, va, vb sample) {
	lim := r.src.above
	cut := math.NaN()
	if (Ta < lim) != (Tb < lim) && !math.IsInf(lim, 1) {
		cut = lim
	} else if e := r.edge(Ta, Tb); !math.IsNaN(e) {
		cut = e
	}
	if !math.IsNaN(cut) {
		tm := ta + (tb-ta)*(cut-Ta)/(Tb-Ta)
		if tm > ta && tm < tb {
			vm := r.sample(cut)
			r.segment(ta, tm, Ta, cut, va, vm)
			r.segment(tm, tb, cut, Tb, vm, vb)
			return
		}
	}
	switch {
	case !(Ta < lim) && !(Tb < lim):
		r.pieces = append(r.pieces, piece{t0: ta, t1: tb, T0: Ta, T1: Tb, kind: kindNone})
	case Ta == Tb:
		r.pieces = append(r.pieces, r.hold(ta, tb, Ta, va))
	case math.Abs(Tb-Ta) <= r.span/scanPoints && r.short(va, vb):
		r.shortSegment(ta, tb, Ta, Tb, va, r.sample((Ta+Tb)/2), vb, 0)
	default:
		k := math.Ceil(math.Abs(Tb-Ta) / initSpanK)
		for i := 0.0; i < k; i++ {
			a, b := ta+(tb-ta)*i/k, ta+(tb-ta)*(i+1)/k
			Ua, Ub := Ta+(Tb-Ta)*i/k, Ta+(Tb-Ta)*(i+1)/k
			if i+1 == k {
				b, Ub = tb, Tb
			}
			r.gauss(a, b, Ua, Ub, r.gaussPiece(a, b, Ua, Ub), 0)
		}
	}
}

// edge is the first band edge strictly between Ta and Tb, going from Ta,
// or NaN if none (or no bands).
func (r *pathRun) edge(Ta, Tb float64) float64 {
	if !(r.band > 0) {
		return math.NaN()
	}
	if Tb > Ta {
		if e := (math.Floor(Ta/r.band) + 1) * r.band; e > Ta && e < Tb {
			return e
		}
	} else if e := (math.Ceil(Ta/r.band) - 1) * r.band; e < Ta && e > Tb {
		return e
	}
	return math.NaN()
}

// short reports whether a segment may take the short rule: every
// collected quantity finite at both ends and changing by at most smallStep
// in its logarithm (or J negligible at both).
func (r *pathRun) short(a, b sample) bool {
	near := func(x, y, scale float64) bool {
		if x-scale < -r.lambda && y-scale < -r.lambda {
			return true // below the floor at both ends
		}
		return !math.IsInf(x, 0) && !math.IsInf(y, 0) && math.Abs(x-y) <= smallStep
	}
	return near(a.lnJ, b.lnJ, r.sJ) && (!r.src.hasU || near(a.lnU, b.lnU, math.Inf(-1))) &&
		(!r.src.hasR || near(a.lnR, b.lnR, r.sR))
}

// hold is a piece at constant temperature: J, u and r constant,
//
//	δ = u·h,  W_k = J·u^k·h^(k+1)/(k+1),  R = r·h
func (r *pathRun) hold(ta, tb, T float64, v sample) piece {
	p := piece{t0: ta, t1: tb, T0: T, T1: T, kind: kindHold}
	h := (tb - ta) / r.tS
	u := v.u
	J := math.Exp(v.lnJ - r.sJ)
	p.dL = u * h
	f := J * h
	for k := range 4 {
		p.w[k] = f / float64(k+1)
		f *= u * h
	}
	p.r = math.Exp(v.lnR-r.sR) * h
	return p
}

// apply integrates a piece with the rule ru from the samples v at its nodes.
func (r *pathRun) apply(ru *rule, v []sample, ta, tb, Ta, Tb float64, kind int) piece {
	n := len(ru.x)
	h := (tb - ta) / r.tS
	p := piece{t0: ta, t1: tb, T0: Ta, T1: Tb, kind: kind}
	for i := range n {
		p.dL += ru.g[i] * v[i].u
	}
	p.dL *= h
	for i := range n {
		gi := ru.g[i] * h
		lj := v[i].lnJ - r.sJ
		J := 0.0
		if lj > underflowLn {
			J = math.Exp(lj)
			if v[i].u == 0 && lj > -r.lambda && !math.IsInf(v[i].lnU, -1) {
				r.lost = true
			}
			var d float64
			row := ru.s[i*n : (i+1)*n]
			for j := range n {
				d += row[j] * v[j].u
			}
			// ∫ from the node to the end, in [0, δ]
			if d *= h; !(d > 0) {
				d = 0
			} else if d > p.dL {
				d = p.dL
			}
			w := gi * J
			p.w[0] += w
			p.w[1] += w * d
			p.w[2] += w * d * d
			p.w[3] += w * d * d * d
		}
		if v[i].lnR > math.Inf(-1) {
			// r = e^lnC·J^(1/4)·u^(3/4): from J and u by two square roots
			// where both are well inside the float64 range, else by its
			// logarithm
			if un := v[i].u; J > 1e-280 && un > 1e-90 {
				p.r += gi * r.rScale * math.Sqrt(math.Sqrt(J*un*un*un))
			} else {
				p.r += gi * math.Exp(v[i].lnR-r.sR)
			}
		}
	}
	return p
}

// gaussPiece evaluates the source at the Gauss nodes of [ta, tb] and integrates.
func (r *pathRun) gaussPiece(ta, tb, Ta, Tb float64) piece {
	v := r.buf[:gaussPoints]
	for i, x := range gaussRule.x {
		v[i] = r.sample(Ta + (Tb-Ta)*x)
	}
	return r.apply(gaussRule, v, ta, tb, Ta, Tb, kindGauss)
}

// shortPiece integrates a short piece from five samples of it: ln J, ln u
// and ln r are interpolated by the quartic through them and the
// interpolant integrated with shortRule; q[i][j] is the weight of sample j
// at node i. The integrand of W_k holds (L_end − L)^k, a polynomial of
// degree up to 3k that would use up the exactness of a low-order rule on
// the samples themselves; the interpolant carries it exactly.
func (r *pathRun) shortPiece(ta, tb, Ta, Tb float64, v *[5]sample, q *[shortPoints][5]float64) piece {
	nodes := r.buf[:shortPoints]
	withJ := false
	for _, s := range v {
		withJ = withJ || s.lnJ-r.sJ > underflowLn
	}
	for i := range nodes {
		w := &q[i]
		n := sample{lnJ: math.Inf(-1), lnR: math.Inf(-1)}
		var lnJ, lnU, lnR float64
		for j, x := range w {
			lnJ += x * v[j].lnJ
			lnU += x * v[j].lnU
			lnR += x * v[j].lnR
		}
		if withJ {
			n.lnJ = lnJ
		}
		if r.src.hasU {
			n.u, n.lnU = math.Exp(lnU-r.lnUS), lnU
		}
		if r.src.hasR {
			n.lnR = lnR
		}
		nodes[i] = n
	}
	return r.apply(shortRule, nodes, ta, tb, Ta, Tb, kindShort)
}

// shortSegment integrates [ta, tb] by the short rule when the quadratic in
// ln J, ln u and ln r through its ends and middle predicts their values at
// the quarter points to shortTol (the quartic through all five is then
// closer still), and bisects it otherwise.
func (r *pathRun) shortSegment(ta, tb, Ta, Tb float64, va, vm, vb sample, depth int) {
	v := [5]sample{va, r.sample(Ta + (Tb-Ta)/4), vm, r.sample(Ta + 3*(Tb-Ta)/4), vb}
	if depth >= maxDepth || r.smooth(&v) {
		r.pieces = append(r.pieces, r.shortPiece(ta, tb, Ta, Tb, &v, quartic))
		return
	}
	tm, Tm := (ta+tb)/2, (Ta+Tb)/2
	r.shortSegment(ta, tm, Ta, Tm, va, v[1], vm, depth+1)
	r.shortSegment(tm, tb, Tm, Tb, vm, v[3], vb, depth+1)
}

// neighbours integrates segment i of a densely sampled path by the short
// rule from samples the path already has: ln J, ln u and ln r depend on T
// alone, and along a monotone stretch the temperatures of five consecutive
// points (the segment's ends, the points before and after, and one more)
// are distinct and close. The quartic through them, in Newton's form,
// interpolates the segment; it is used when the cubic through the four
// nearest predicts the fifth to shortTol (an extrapolation, so the check is
// stricter than the interpolation it guards). That difference is the last
// divided difference times Π(x_far − x_k) over the four near points. It
// costs no evaluation of the integrand. It reports false, and does
// nothing, where it does not apply: near the ends of the path, where the
// path turns or holds, where a neighbouring step is more than four times as
// long, or where the check fails.
func (r *pathRun) neighbours(i int, vs *window) bool {
	n := len(r.temp)
	first := i - 1 // the stencil is points first … first+4
	far := 4       // the point checked: the one farthest from the segment
	if i+3 >= n {
		first, far = i-2, 0
	}
	if first < 0 || first+4 >= n {
		return false
	}
	T := r.temp
	h := T[i+1] - T[i]
	x := (*[5]float64)(T[first : first+5])
	for j := range x {
		if j > 0 {
			step := x[j] - x[j-1]
			if !(step*h > 0) || math.Abs(step) > 4*math.Abs(h) {
				return false
			}
		}
		if !(x[j] < r.src.above) {
			return false
		}
	}
	if math.Abs(h) > r.span/scanPoints || !r.short(vs.at(i), vs.at(i+1)) {
		return false
	}
	// Newton's divided differences in place, one row per channel (ln J,
	// ln u): after step k, c[j] = f[x_{j−k} … x_j] for j ≥ k, so that at
	// the end c[k] = f[x_0 … x_k]. ln r is lnC + (ln J + 3·ln u)/4, and so
	// are its divided differences and its interpolant.
	var y [2][5]float64
	for j := range x {
		v := vs.at(first + j)
		y[0][j], y[1][j] = v.lnJ, v.lnU
	}
	c := y
	for k := 1; k < 5; k++ {
		for j := 4; j >= k; j-- {
			inv := 1 / (x[j] - x[j-k])
			c[0][j] = (c[0][j] - c[0][j-1]) * inv
			c[1][j] = (c[1][j] - c[1][j-1]) * inv
		}
	}
	span := 1.0 // Π over the near points of (x_far − x_k)
	for k := range x {
		if k != far {
			span *= x[far] - x[k]
		}
	}
	// the check, for each quantity that counts somewhere in the stencil
	low := r.sJ - r.lambda
	countsJ, countsR := false, false
	for j := range x {
		countsJ = countsJ || y[0][j] >= low
		countsR = countsR || r.src.lnC+(y[0][j]+3*y[1][j])/4 >= r.sR-r.lambda
	}
	ok := func(d float64) bool { return math.Abs(d*span) <= shortTol } // NaN (from −Inf) fails
	if (countsJ && !ok(c[0][4])) || (r.src.hasU && !ok(c[1][4])) || (r.src.hasR && countsR && !ok((c[0][4]+3*c[1][4])/4)) {
		return false
	}
	// the quartic at the nodes of shortRule on the segment, by Horner's
	// scheme in Newton's form
	withJ := false
	for j := range x {
		withJ = withJ || y[0][j]-r.sJ > underflowLn
	}
	// 3 nodes where the segment is nearly flat in every logarithm (NaN, from
	// a quantity not collected, compares false: the 4 nodes)
	ru := shortRule
	a, b := vs.at(i), vs.at(i+1)
	if math.Abs(b.lnJ-a.lnJ) <= flatStep && (!r.src.hasU || math.Abs(b.lnU-a.lnU) <= flatStep) &&
		(!r.src.hasR || math.Abs(b.lnR-a.lnR) <= flatStep) {
		ru = flatRule
	}
	// one piece per stretch between band edges
	Ta, ta := T[i], r.time[i]
	for {
		Tb, tb := T[i+1], r.time[i+1]
		if e := r.edge(Ta, Tb); !math.IsNaN(e) {
			Tb, tb = e, r.time[i]+(r.time[i+1]-r.time[i])*(e-T[i])/h
		}
		r.pieces = append(r.pieces, r.quarticPiece(ru, &c, x, withJ, ta, tb, Ta, Tb))
		if Tb == T[i+1] {
			return true
		}
		Ta, ta = Tb, tb
	}
}

// quarticPiece integrates [ta, tb] (temperatures Ta, Tb) with the rule ru
// from the Newton coefficients c of the quartic in ln J and ln u through
// the points x (see neighbours).
func (r *pathRun) quarticPiece(ru *rule, c *[2][5]float64, x *[5]float64, withJ bool, ta, tb, Ta, Tb float64) piece {
	nodes := r.buf[:len(ru.x)]
	for m, z := range ru.x {
		t := Ta + (Tb-Ta)*z
		pJ, pU := c[0][4], c[1][4]
		for k := 3; k >= 0; k-- {
			f := t - x[k]
			pJ, pU = c[0][k]+f*pJ, c[1][k]+f*pU
		}
		v := sample{lnJ: math.Inf(-1), lnR: math.Inf(-1)}
		if withJ {
			v.lnJ = pJ
		}
		if r.src.hasU {
			v.u, v.lnU = math.Exp(pU-r.lnUS), pU
		}
		if r.src.hasR {
			v.lnR = r.src.lnC + (pJ+3*pU)/4
		}
		nodes[m] = v
	}
	return r.apply(ru, nodes, ta, tb, Ta, Tb, kindShort)
}

// lagrangeAt is the Lagrange weights at t of the points x with
// barycentric weights w, leaving out point skip (−1: none):
// l_j = w_j·Π_{k≠j, k≠skip} (t − x_k).
func lagrangeAt(x, w *[5]float64, t float64, skip int) [5]float64 {
	var e [5]float64
	for k := range e {
		e[k] = t - x[k]
	}
	if skip >= 0 {
		e[skip] = 1
	}
	// prefix and suffix products: l_j = w_j·(e_0…e_{j−1})·(e_{j+1}…e_4)
	var l [5]float64
	pre := 1.0
	for j := range l {
		l[j] = w[j] * pre
		pre *= e[j]
	}
	suf := 1.0
	for j := 4; j >= 0; j-- {
		l[j] *= suf
		suf *= e[j]
	}
	if skip >= 0 {
		l[skip] = 0
	}
	return l
}

// smooth reports whether the quadratic through samples 0, 2 and 4 gives
// samples 1 and 3 to shortTol in every logarithm that counts (ln J above
// the floor, ln u where there is growth, ln r).
func (r *pathRun) smooth(v *[5]sample) bool {
	ok := func(f func(sample) float64, floor float64) bool {
		a, b, c, d, e := f(v[0]), f(v[1]), f(v[2]), f(v[3]), f(v[4])
		if a < floor && b < floor && c < floor && d < floor && e < floor {
			return true // nothing that counts
		}
		if math.IsInf(a+b+c+d+e, 0) || math.IsNaN(a+b+c+d+e) {
			return false
		}
		return math.Abs(b-(3*a+6*c-e)/8) <= shortTol && math.Abs(d-(3*e+6*c-a)/8) <= shortTol
	}
	return ok(func(s sample) float64 { return s.lnJ }, r.sJ-r.lambda) &&
		(!r.src.hasU || ok(func(s sample) float64 { return s.lnU }, math.Inf(-1))) &&
		(!r.src.hasR || ok(func(s sample) float64 { return s.lnR }, r.sR-r.lambda))
}

// close reports whether the rule on a whole piece and on its halves agree
// to the tolerance: pathTol of the value, or the floor.
func (r *pathRun) close(whole, halves piece) bool {
	tol := pathTol
	floor := r.floor * (halves.t1 - halves.t0) / r.tS
	ok := func(a, b float64) bool { return math.Abs(a-b) <= tol*(b+floor) }
	return ok(whole.dL, halves.dL) && ok(whole.w[0], halves.w[0]) && ok(whole.w[1], halves.w[1]) &&
		ok(whole.w[2], halves.w[2]) && ok(whole.w[3], halves.w[3]) && ok(whole.r, halves.r)
}

// gauss bisects [ta, tb] until the Gauss rule on a piece agrees with the
// rule on its halves, and keeps the halves.
func (r *pathRun) gauss(ta, tb, Ta, Tb float64, whole piece, depth int) {
	tm, Tm := (ta+tb)/2, (Ta+Tb)/2
	a := r.gaussPiece(ta, tm, Ta, Tm)
	b := r.gaussPiece(tm, tb, Tm, Tb)
	if depth >= maxDepth || r.close(whole, then(a, b)) {
		r.pieces = append(r.pieces, a, b)
		return
	}
	r.gauss(ta, tm, Ta, Tm, a, depth+1)
	r.gauss(tm, tb, Tm, Tb, b, depth+1)
}

// part integrates the first fraction f (0 < f ≤ 1) of piece p with the
// piece's own rule (a short piece from five fresh samples): at f = 1 it is
// p itself, to rounding.
func (r *pathRun) part(p piece, f float64) piece {
	tb := p.t0 + (p.t1-p.t0)*f
	Tb := p.T0 + (p.T1-p.T0)*f
	if f == 1 {
		tb, Tb = p.t1, p.T1
	}
	switch p.kind {
	case kindNone:
		return piece{t0: p.t0, t1: tb, T0: p.T0, T1: Tb, kind: kindNone}
	case kindHold:
		return r.hold(p.t0, tb, p.T0, r.sample(p.T0))
	case kindShort:
		// the samples of shortSegment, at the same temperatures when f = 1
		v := [5]sample{r.sample(p.T0), r.sample(p.T0 + (Tb-p.T0)/4), r.sample((p.T0 + Tb) / 2), r.sample(p.T0 + 3*(Tb-p.T0)/4), r.sample(Tb)}
		return r.shortPiece(p.t0, tb, p.T0, Tb, &v, quartic)
	}
	return r.gaussPiece(p.t0, tb, p.T0, Tb)
}

// before is the state before piece i (the state at the end for i =
// len(pieces)): the state at the last path point at or before the piece,
// and the pieces from there.
func (r *pathRun) before(i int) accum {
	j := sort.Search(len(r.points), func(j int) bool { return r.points[j] > i }) - 1
	a := r.atPoint(j)
	for _, p := range r.pieces[r.points[j]:i] {
		a = a.add(p)
	}
	return a
}

// at is the state at time t (s, within the path).
func (r *pathRun) at(t float64) accum {
	i := r.pieceAt(t)
	if i < 0 {
		return accum{}
	}
	p := r.pieces[i]
	if t >= p.t1 {
		if i == len(r.pieces)-1 {
			return r.total
		}
		return r.before(i + 1)
	}
	return r.before(i).add(r.part(p, (t-p.t0)/(p.t1-p.t0)))
}

// pieceAt is the index of the piece holding time t (the last one at or
// past the end), −1 before the path.
func (r *pathRun) pieceAt(t float64) int {
	lo, hi := 0, len(r.pieces)
	for lo < hi {
		m := (lo + hi) / 2
		if r.pieces[m].t1 < t {
			lo = m + 1
		} else {
			hi = m
		}
	}
	if lo >= len(r.pieces) {
		return len(r.pieces) - 1
	}
	return lo
}

// crossTol is the tolerance of a crossing in a piece, as a fraction of
// it: 1e-6 K in temperature, or 1e-9 of the piece at constant temperature.
func crossTol(p piece) float64 {
	if dT := math.Abs(p.T1 - p.T0); dT > 0 {
		return math.Max(1e-6/dT, 1e-12)
	}
	return 1e-9
}

// A running sum of a path.
type sum int

const (
	sumN    sum = iota // ln ∫J dt, J in m⁻³·s⁻¹ (or ln ∫dt/C for a C-curve)
	sumXext            // ln of the extended volume fraction
	sumR               // ln ∫r dt, the second rate (the additivity sum)
)

// offset is ln of the SI value of a sum less ln of its normalized value.
func (r *pathRun) offset(k sum) float64 { return r.offsets[k] }

// raw is the normalized value of sum k of state a.
func (a accum) raw(k sum) float64 {
	switch k {
	case sumXext:
		return a.m[3]
	case sumR:
		return a.r
	}
	return a.m[0]
}

// value is ln of a sum of state a, SI; −Inf for none.
//
// The extended volume is NaN where the normalized sums cannot represent it:
// growth that underflows where nucleation counts (lost), or moments m1, m2
// of grown nuclei with m3 underflowed to zero. Only a growth speed spanning
// hundreds of decades along the path (a mobility law far outside its
// range) gets there.
func (r *pathRun) value(k sum, a accum) float64 {
	if k == sumXext && (r.lost || a.m[3] == 0 && (a.m[1] > 0 || a.m[2] > 0)) {
		return math.NaN()
	}
	return r.offset(k) + math.Log(a.raw(k))
}

// length is ∫u dt of state a, m.
func (r *pathRun) length(a accum) float64 {
	if r.lScale > 0 && !math.IsInf(r.lScale, 1) {
		return a.L * r.lScale
	}
	return math.Exp(r.lnUS + math.Log(a.L*r.tS))
}

// cross returns the first time (s) and temperature (K) where sum k reaches
// level (ln, SI), at or before time tEnd, and false if it does not. The
// crossing is solved within its piece to 1e-6 K (crossTol), integrating
// the piece's first part with its own rule; a level too close to the
// floors of the run is sought on a run with deeper floors.
func (r *pathRun) cross(k sum, level, tEnd float64) (t, T float64, ok bool) {
	r = r.deepen(levelNeeds(level - r.offset(k)))
	lvl := level - r.offset(k) // normalized
	thr := math.Exp(lvl)
	reaches := func(a accum) bool {
		if thr > 0 && !math.IsInf(thr, 1) {
			return a.raw(k) >= thr // no logarithm in the scan
		}
		return math.Log(a.raw(k)) >= lvl
	}
	// The sums never fall: the first path point where the sum has reached
	// the level, by bisection, and the first piece before it that reaches
	// it.
	n := len(r.points)
	j := sort.Search(n, func(j int) bool { return reaches(r.atPoint(j)) })
	if j == n {
		return 0, 0, false
	}
	from := 0
	if j > 0 {
		from = r.points[j-1]
	}
	i := -1
	start := r.atPoint(max(j-1, 0))
	for m := from; m < len(r.pieces); m++ {
		p := &r.pieces[m]
		if p.t0 >= tEnd {
			break
		}
		if next := start.add(*p); !reaches(next) {
			start = next
			continue
		}
		i = m
		break
	}
	if i < 0 {
		return 0, 0, false
	}
	p := r.pieces[i]
	if r.value(k, start) >= level {
		return p.t0, p.T0, true
	}
	f := 1.0
	if p.kind != kindNone {
		g := func(f float64) float64 { return r.value(k, start.add(r.part(p, f))) - level }
		if s, err := bracket.Root(g, 0, 1, crossTol(p)); err == nil {
			f = s
		}
	}
	t = p.t0 + (p.t1-p.t0)*f
	if t > tEnd {
		return 0, 0, false
	}
	return t, p.T0 + (p.T1-p.T0)*f, true
}
