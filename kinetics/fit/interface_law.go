package fit

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"undercool/kinetics"
	"undercool/kinetics/internal/bracket"
)

// InterfaceOptions says what an interface fit varies beyond γ at its
// reference temperature.
type InterfaceOptions struct {
	// Slope fits dγ/dT too: the model's interfacial energy becomes the
	// linear law γ(T) = γ(T_ref) + (dγ/dT)·(T − T_ref).
	Slope bool
	// TRef is T_ref of the linear law, K; 0: the model's own, else the
	// (weighted) mean temperature of the data.
	TRef float64
	// KeepScale holds the model's prefactor (A = 1) instead of fitting it.
	KeepScale bool
}

// InterfaceWith fits the interfacial-energy law of a model to measured
// nucleation rates as Interface does, with the choices of opt: the slope
// dγ/dT of a linear law fitted with γ(T_ref), and the prefactor scale A
// fitted or held. It minimizes
//
//	S(θ) = Σ w_i·[ln J_i − ln A − ln J_model(T_i; γ(T_ref), dγ/dT)]²
//
// over the free parameters θ: ln A, when free, is the weighted mean of the
// residuals for the others; γ(T_ref) by the bracketing search over ln γ
// for each slope, and the slope by a fine scan of that profile (the valley
// of S may hold shallow side minima), then Gauss–Newton steps to the minimum. The standard errors come from
// the Jacobian J of the residuals at the minimum, cov(θ) = s²·(JᵀWJ)⁻¹ with
// s² = S/(N − p) (Bates and Watts 1988, §2.1). With opt zero it is
// Interface. The errors are those of Interface, and ErrFewPoints (wrapped)
// for fewer points than parameters.
func InterfaceWith(model *kinetics.Model, T, lnJ, w []float64, opt InterfaceOptions) (*InterfaceFit, error) {
	if opt == (InterfaceOptions{}) {
		return Interface(model, T, lnJ, w)
	}
	np := 1
	if opt.Slope {
		np++
	}
	if !opt.KeepScale {
		np++
	}
	if err := checkRates(model, T, lnJ, w, np); err != nil {
		return nil, err
	}
	p := newLawProblem(model, T, lnJ, w, opt)
	lo, hi := math.Log(GammaFitMin), math.Log(GammaFitMax)
	// bestGamma is ln γ(T_ref) that fits best for a scaled slope x1.
	bestGamma := func(x1 float64) (float64, float64) {
		lg, f, err := bracket.MinimizeScan(func(lg float64) float64 { return p.sse([]float64{lg, x1}) }, lo, hi, 48, 1e-10)
		if err != nil || math.IsNaN(lg) {
			return math.NaN(), math.Inf(1)
		}
		return lg, f
	}
	x := []float64{math.NaN()}
	if opt.Slope {
		// The slope by a fine scan of its profile (γ and ln A at their best
		// for each slope), since the valley of S can hold shallow side
		// minima; dγ/dT·span/γ within ±1: γ changes by less than itself
		// across the data.
		x1, _, err := bracket.MinimizeScan(func(x1 float64) float64 { _, f := bestGamma(x1); return f }, -1, 1, 201, 1e-9)
		if err != nil || math.IsNaN(x1) {
			return nil, fmt.Errorf("fitting gamma(T): no linear law with gamma between %g and %g J/m2 fits these rates", GammaFitMin, GammaFitMax)
		}
		x = append(x, x1)
	}
	x[0], _ = bestGamma(x[len(x)-1])
	if math.IsNaN(x[0]) || x[0]-lo < 1e-3 || hi-x[0] < 1e-3 {
		return nil, fmt.Errorf("fitting gamma: no interfacial energy between %g and %g J/m2 fits these rates", GammaFitMin, GammaFitMax)
	}
	theta := p.theta(x)
	theta = p.polish(theta)
	return p.result(theta)
}

// lawProblem is an interface fit with its law and free parameters; the
// parameters θ are γ(T_ref) (J/m²), dγ/dT (J/(m²·K), with Slope) and ln A
// (unless KeepScale), in that order.
type lawProblem struct {
	opt        InterfaceOptions
	base       kinetics.Material
	T, lnJ, w  []float64
	sumW, span float64
	np         int
	model      *kinetics.Model // the model as given, for the classical plot
}

func newLawProblem(model *kinetics.Model, T, lnJ, w []float64, opt InterfaceOptions) *lawProblem {
	p := &lawProblem{opt: opt, base: model.Material(), T: T, lnJ: lnJ, w: w, model: model}
	lo, hi := math.Inf(1), math.Inf(-1)
	var mean float64
	for i, t := range T {
		p.sumW += p.weight(i)
		mean += p.weight(i) * t
		lo, hi = math.Min(lo, t), math.Max(hi, t)
	}
	mean /= p.sumW
	p.span = math.Max(hi-lo, 1)
	if opt.Slope {
		ref := opt.TRef
		switch {
		case ref > 0:
		case p.base.GammaLaw != kinetics.GammaConstant:
			ref = p.base.GammaTRef
		default:
			ref = math.Round(mean*10) / 10
		}
		g := p.base.GammaAt(ref)
		if p.base.GammaLaw != kinetics.GammaLinear {
			p.base.GammaSlope = 0
		}
		p.base.GammaLaw, p.base.Gamma, p.base.GammaTRef = kinetics.GammaLinear, g, ref
	}
	p.np = 1
	if opt.Slope {
		p.np++
	}
	if !opt.KeepScale {
		p.np++
	}
	return p
}

func (p *lawProblem) weight(i int) float64 {
	if p.w == nil {
		return 1
	}
	return p.w[i]
}

// with is the model with γ(T_ref) = g and slope s (ignored without Slope);
// nil when the law is not positive at a data temperature.
func (p *lawProblem) with(g, s float64) *kinetics.Model {
	m := p.base
	m.Gamma = g
	if p.opt.Slope {
		m.GammaSlope = s
	}
	md, err := kinetics.NewModel(m)
	if err != nil {
		return nil
	}
	for _, t := range p.T {
		if !(md.GammaAt(t) > 0) {
			return nil
		}
	}
	return md
}

// theta turns the search variables (ln γ, slope·span/γ) into θ, with ln A
// the weighted mean residual when it is free.
func (p *lawProblem) theta(x []float64) []float64 {
	g := math.Exp(x[0])
	th := []float64{g}
	s := 0.0
	if p.opt.Slope {
		s = x[1] * g / p.span
		th = append(th, s)
	}
	if !p.opt.KeepScale {
		md := p.with(g, s)
		var m float64
		for i, t := range p.T {
			m += p.weight(i) * (p.lnJ[i] - md.LnJ(t))
		}
		th = append(th, m/p.sumW)
	}
	return th
}

// residuals are ln J_i − ln J_model(T_i; θ) − ln A; nil where the law fails.
func (p *lawProblem) residuals(th []float64) []float64 {
	s := 0.0
	if p.opt.Slope {
		s = th[1]
	}
	md := p.with(th[0], s)
	if md == nil {
		return nil
	}
	lnA := 0.0
	if !p.opt.KeepScale {
		lnA = th[len(th)-1]
	}
	r := make([]float64, len(p.T))
	for i, t := range p.T {
		r[i] = p.lnJ[i] - md.LnJ(t) - lnA
	}
	return r
}

func (p *lawProblem) ssr(r []float64) float64 {
	var s float64
	for i, x := range r {
		s += p.weight(i) * x * x
	}
	return s
}

// sse is the objective of the search: S at the search variables x, +Inf
// where the law fails.
func (p *lawProblem) sse(x []float64) float64 {
	r := p.residuals(p.theta(x))
	if r == nil {
		return math.Inf(1)
	}
	if s := p.ssr(r); !math.IsNaN(s) {
		return s
	}
	return math.Inf(1)
}

// jacobian is ∂r_i/∂θ_j by central differences (the ln A column is −1).
func (p *lawProblem) jacobian(th []float64) *mat.Dense {
	n := len(p.T)
	J := mat.NewDense(n, len(th), nil)
	steps := []float64{1e-6 * th[0]}
	if p.opt.Slope {
		steps = append(steps, 1e-6*th[0]/p.span)
	}
	for j, h := range steps {
		up, down := append([]float64(nil), th...), append([]float64(nil), th...)
		up[j] += h
		down[j] -= h
		ru, rd := p.residuals(up), p.residuals(down)
		for i := 0; i < n; i++ {
			v := math.NaN()
			if ru != nil && rd != nil {
				v = (ru[i] - rd[i]) / (2 * h)
			}
			J.Set(i, j, v)
		}
	}
	if !p.opt.KeepScale {
		for i := 0; i < n; i++ {
			J.Set(i, len(th)-1, -1)
		}
	}
	return J
}

// normal is JᵀWJ and JᵀWr.
func (p *lawProblem) normal(J *mat.Dense, r []float64) (*mat.SymDense, *mat.VecDense) {
	n, k := J.Dims()
	jtj := mat.NewSymDense(k, nil)
	jtr := mat.NewVecDense(k, nil)
	for a := 0; a < k; a++ {
		for b := a; b < k; b++ {
			var s float64
			for i := 0; i < n; i++ {
				s += p.weight(i) * J.At(i, a) * J.At(i, b)
			}
			jtj.SetSym(a, b, s)
		}
		var s float64
		for i := 0; i < n; i++ {
			s += p.weight(i) * J.At(i, a) * r[i]
		}
		jtr.SetVec(a, s)
	}
	return jtj, jtr
}

// polish takes Gauss–Newton steps from θ, each halved until it lowers S,
// while they do. The steps are solved on columns scaled to unit length, so
// that γ (J/m²), its slope and ln A, of very different sizes, meet on
// equal terms.
func (p *lawProblem) polish(th []float64) []float64 {
	r := p.residuals(th)
	if r == nil {
		return th
	}
	best := p.ssr(r)
	for range 30 {
		d, ok := p.step(p.jacobian(th), r)
		if !ok {
			return th
		}
		improved := false
		for f := 1.0; f > 1e-3; f /= 2 {
			next := append([]float64(nil), th...)
			for j := range next {
				next[j] -= f * d[j] // r = data − model: the step is −(JᵀWJ)⁻¹JᵀWr
			}
			if rn := p.residuals(next); rn != nil && p.ssr(rn) < best {
				th, r, best, improved = next, rn, p.ssr(rn), true
				break
			}
		}
		if !improved || best == 0 {
			return th
		}
	}
	return th
}

// scaled is J with its columns scaled to unit length, and the scales;
// false for a column of zeros or NaN.
func scaled(J *mat.Dense) (*mat.Dense, []float64, bool) {
	n, k := J.Dims()
	scale := make([]float64, k)
	for j := 0; j < k; j++ {
		scale[j] = 1 / mat.Norm(J.ColView(j), 2)
		if math.IsInf(scale[j], 0) || math.IsNaN(scale[j]) {
			return nil, nil, false
		}
	}
	Js := mat.NewDense(n, k, nil)
	Js.Apply(func(i, j int, v float64) float64 { return v * scale[j] }, J)
	return Js, scale, true
}

// step is the Gauss–Newton step (JᵀWJ)⁻¹JᵀWr, solved with the columns of
// J scaled to unit length, so that γ (J/m²), its slope and ln A, of very
// different sizes, meet on equal terms; false when JᵀWJ is singular.
func (p *lawProblem) step(J *mat.Dense, r []float64) ([]float64, bool) {
	Js, scale, ok := scaled(J)
	if !ok {
		return nil, false
	}
	jtj, jtr := p.normal(Js, r)
	var ch mat.Cholesky
	if !ch.Factorize(jtj) {
		return nil, false
	}
	var y mat.VecDense
	if err := ch.SolveVecTo(&y, jtr); err != nil {
		return nil, false
	}
	d := make([]float64, len(scale))
	for j := range d {
		d[j] = y.AtVec(j) * scale[j]
	}
	return d, true
}

// covariance is (JᵀWJ)⁻¹, inverted on scaled columns; false when singular.
func (p *lawProblem) covariance(J *mat.Dense) (*mat.SymDense, bool) {
	Js, scale, ok := scaled(J)
	if !ok {
		return nil, false
	}
	jtj, _ := p.normal(Js, make([]float64, len(p.T)))
	var ch mat.Cholesky
	if !ch.Factorize(jtj) {
		return nil, false
	}
	var inv mat.SymDense
	if err := ch.InverseTo(&inv); err != nil {
		return nil, false
	}
	k := len(scale)
	cov := mat.NewSymDense(k, nil)
	for a := 0; a < k; a++ {
		for b := a; b < k; b++ {
			cov.SetSym(a, b, inv.At(a, b)*scale[a]*scale[b])
		}
	}
	return cov, true
}

// result is the fit at θ with its standard errors and intervals.
func (p *lawProblem) result(th []float64) (*InterfaceFit, error) {
	r := p.residuals(th)
	if r == nil {
		return nil, errors.New("fitting gamma(T): the fitted law is not positive at every data temperature")
	}
	n := len(p.T)
	s := p.base.GammaSlope // held, unless fitted
	if p.opt.Slope {
		s = th[1]
	}
	f := &InterfaceFit{N: n, DoF: n - p.np, Gamma: th[0], Law: p.base.GammaLaw, TRef: p.base.GammaTRef, KeepScale: p.opt.KeepScale, Params: p.np}
	f.Slope = s
	f.Model = p.with(th[0], s)
	if !p.opt.KeepScale {
		f.LnScale = th[len(th)-1]
	}
	f.Scale = math.Exp(f.LnScale)
	f.Residuals = r
	ssr := p.ssr(r)
	var mean, sst float64
	for i, x := range p.lnJ {
		mean += p.weight(i) * x
	}
	mean /= p.sumW
	for i, x := range p.lnJ {
		sst += p.weight(i) * (x - mean) * (x - mean)
	}
	f.R2 = 1
	if ssr > 0 && sst > 0 {
		f.R2 = 1 - ssr/sst
	}
	for _, t := range p.T {
		f.Flags |= f.Model.At(t).Flags
	}
	nan := math.NaN()
	f.GammaSE, f.SlopeSE, f.LnScaleSE, f.ResidualSD, f.T = nan, nan, nan, nan, nan
	f.GammaCI, f.SlopeCI, f.ScaleCI = [2]float64{nan, nan}, [2]float64{nan, nan}, [2]float64{nan, nan}
	if p.opt.KeepScale {
		f.ScaleCI = [2]float64{1, 1}
		f.LnScaleSE = 0
	}
	if !f.Exact() {
		if cov, ok := p.covariance(p.jacobian(th)); ok {
			s2 := ssr / float64(f.DoF)
			f.ResidualSD = math.Sqrt(s2)
			f.T = StudentT95(f.DoF)
			se := func(j int) float64 { return math.Sqrt(s2 * cov.At(j, j)) }
			f.GammaSE = se(0)
			f.GammaCI = ci95(f.Gamma, f.GammaSE, f.T)
			if p.opt.Slope {
				f.SlopeSE = se(1)
				f.SlopeCI = ci95(f.Slope, f.SlopeSE, f.T)
			}
			if !p.opt.KeepScale {
				f.LnScaleSE = se(len(th) - 1)
				ci := ci95(f.LnScale, f.LnScaleSE, f.T)
				f.ScaleCI = [2]float64{math.Exp(ci[0]), math.Exp(ci[1])}
			}
		}
	}
	f.classical(p.model, p.T, p.lnJ, p.w)
	return f, nil
}
