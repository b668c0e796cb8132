package fit

import (
	"errors"
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/kinetics/internal/bracket"
)

// Search range of the interfacial-energy fit, J/m²: from well below any
// solution-crystal value to well above any metal or oxide (common practice).
const (
	GammaFitMin = 1e-4 // J/m²
	GammaFitMax = 10.0 // J/m²
)

// InterfaceFit is the interfacial energy γ (and a prefactor scale A) fitted
// to measured steady-state nucleation rates with the rest of the material
// held fixed, by least squares on
//
//	ln J_measured(T_i) = ln A + ln J_model(T_i; γ) + r_i
//
// so the mobility, Zeldovich and attachment terms of the model are carried
// exactly rather than dropped. For a fixed γ the best ln A is the weighted
// mean of ln J_measured − ln J_model; the residual sum S(γ) that is left is
// minimized over γ by a bracketing search (Minimize). The standard errors
// come from the Jacobian at the minimum (Gauss–Newton, relative weights):
// with g_i = ∂ln J_model(T_i)/∂γ,
//
//	s² = S/(N − 2),  SE(γ)² = s²/Σw_i(g_i − ḡ_w)²,
//	SE(ln A)² = s²·(1/Σw + ḡ_w²/Σw_i(g_i − ḡ_w)²)
//
// Bates D.M., Watts D.G., Nonlinear Regression Analysis and Its
// Applications, Wiley (1988), §2.1 (linear approximation intervals).
//
// Beside it, the classical linear plot: ln J − ln D against 1/(T·Δg_v²),
// Δg_v = Δg/V_m in J/m³, is a straight line of slope −16π·f·γ³/(3k_B) if the
// prefactor's own temperature dependence is neglected (Kelton and Greer
// 2010, §2.1); its γ is reported for comparison, not used.
type InterfaceFit struct {
	Gamma, GammaSE     float64    // J/m²
	GammaCI            [2]float64 // 95 % interval, J/m²
	LnScale, LnScaleSE float64    // ln A and its standard error
	Scale              float64    // A, dimensionless
	ScaleCI            [2]float64 // 95 % interval of A
	N, DoF             int
	T                  float64         // Student t quantile of the intervals; NaN when exact
	Residuals          []float64       // ln J measured − ln J fitted
	ResidualSD         float64         // s, in ln J; NaN when exact
	R2                 float64         // of ln J
	Model              *kinetics.Model // the material with the fitted γ (scale not applied)
	Flags              kinetics.Flag   // validity flags of the fitted model at the data temperatures

	// The law fitted: γ above is γ(TRef) of a linear or negentropic law;
	// Slope is dγ/dT of a linear law fitted with it (InterfaceWith).
	Law       kinetics.GammaLaw
	TRef      float64    // K; 0 for a constant γ
	Slope     float64    // J/(m²·K); 0 unless fitted
	SlopeSE   float64    // NaN when exact or not fitted
	SlopeCI   [2]float64 // 95 % interval of the slope
	KeepScale bool       // the prefactor was held (A = 1), not fitted
	Params    int        // the number of parameters fitted (0: 2, γ and A)

	// The classical plot and the γ from its slope (NaN when the slope is not negative).
	LinearX, LinearY []float64 // 1/(T·Δg_v²) in m⁶/(J²·K); ln J − ln D (ln J without a mobility law)
	Linear           *LineFit
	LinearGamma      float64
}

// Exact reports whether the fit has as many points as parameters (two).
func (f *InterfaceFit) Exact() bool { return f.DoF == 0 }

// Fitted returns the material of the fit with the scale folded in: the
// site density multiplied by A (the rate is proportional to it), or for a
// fixed prefactor J0 multiplied by A.
func (f *InterfaceFit) Fitted() kinetics.Material {
	m := f.Model.Material()
	if f.KeepScale {
		return m
	}
	if m.Prefactor == kinetics.PrefactorFixed {
		m.J0 *= f.Scale
	} else {
		m.Sites = math.Exp(f.Model.LnSites() + f.LnScale)
	}
	return m
}

// Interface fits γ and a prefactor scale to measured nucleation rates,
// given as ln J (J in m⁻³·s⁻¹) at temperatures T (K), with optional relative
// weights w on ln J (nil: equal). The model supplies everything but γ; it
// must have a rate (a mobility law or a fixed prefactor). It returns a
// *kinetics.PointError for a temperature at which the model has no driving force or
// no mobility, or a non-finite input, ErrFewPoints for fewer than two points,
// and an error when all temperatures are equal or no γ in
// [GammaFitMin, GammaFitMax] J/m² fits.
func Interface(model *kinetics.Model, T, lnJ, w []float64) (*InterfaceFit, error) {
	if err := checkRates(model, T, lnJ, w, 2); err != nil {
		return nil, err
	}
	n := len(T)
	weight := func(i int) float64 {
		if w == nil {
			return 1
		}
		return w[i]
	}
	var sumW float64
	for i := range T {
		sumW += weight(i)
	}
	base := model.Material()
	with := func(g float64) *kinetics.Model {
		m := base
		m.Gamma = g
		md, err := kinetics.NewModel(m)
		if err != nil {
			panic("fit: Interface: " + err.Error()) // only γ changed, and it is positive
		}
		return md
	}
	r := make([]float64, n)
	// residuals fills r with ln J − ln J_model(γ) and returns their weighted mean.
	residuals := func(md *kinetics.Model) float64 {
		var m float64
		for i, t := range T {
			r[i] = lnJ[i] - md.LnJ(t)
			m += weight(i) * r[i]
		}
		return m / sumW
	}
	// centred is the weighted mean of x and the weighted sum of squares about it.
	centred := func(x []float64) (mean, ss float64) {
		for i := range x {
			mean += weight(i) * x[i]
		}
		mean /= sumW
		for i := range x {
			d := x[i] - mean
			ss += weight(i) * d * d
		}
		return mean, ss
	}
	sse := func(lg float64) float64 {
		residuals(with(math.Exp(lg)))
		_, s := centred(r)
		return s
	}
	lo, hi := math.Log(GammaFitMin), math.Log(GammaFitMax)
	lg, _, err := bracket.MinimizeScan(sse, lo, hi, 48, 1e-9)
	if err != nil {
		return nil, fmt.Errorf("fitting gamma: %v", err)
	}
	if math.IsNaN(lg) || lg-lo < 1e-3 || hi-lg < 1e-3 {
		return nil, fmt.Errorf("no interfacial energy between %g and %g J/m2 fits these rates", GammaFitMin, GammaFitMax)
	}
	f := &InterfaceFit{N: n, DoF: n - 2, Gamma: math.Exp(lg), Law: base.GammaLaw, TRef: base.GammaTRef, Slope: base.GammaSlope, SlopeSE: math.NaN(), SlopeCI: [2]float64{math.NaN(), math.NaN()}, Params: 2}
	f.Model = with(f.Gamma)
	f.LnScale = residuals(f.Model)
	f.Scale = math.Exp(f.LnScale)
	f.Residuals = make([]float64, n)
	var ssr float64
	for i := range r {
		f.Residuals[i] = r[i] - f.LnScale
		ssr += weight(i) * f.Residuals[i] * f.Residuals[i]
	}
	_, sst := centred(lnJ)
	f.R2 = 1
	if ssr > 0 && sst > 0 {
		f.R2 = 1 - ssr/sst
	}
	for _, t := range T {
		f.Flags |= f.Model.At(t).Flags
	}
	nan := math.NaN()
	f.GammaSE, f.LnScaleSE, f.ResidualSD, f.T = nan, nan, nan, nan
	f.GammaCI, f.ScaleCI = [2]float64{nan, nan}, [2]float64{nan, nan}
	if !f.Exact() {
		const h = 1e-4
		up, down := with(f.Gamma*(1+h)), with(f.Gamma*(1-h))
		g := make([]float64, n)
		for i, t := range T {
			g[i] = (up.LnJ(t) - down.LnJ(t)) / (2 * h * f.Gamma)
		}
		gm, sgg := centred(g)
		s2 := ssr / float64(f.DoF)
		f.ResidualSD = math.Sqrt(s2)
		f.GammaSE = math.Sqrt(s2 / sgg)
		f.LnScaleSE = math.Sqrt(s2 * (1/sumW + gm*gm/sgg))
		f.T = StudentT95(f.DoF)
		f.GammaCI = ci95(f.Gamma, f.GammaSE, f.T)
		ci := ci95(f.LnScale, f.LnScaleSE, f.T)
		f.ScaleCI = [2]float64{math.Exp(ci[0]), math.Exp(ci[1])}
	}
	f.classical(model, T, lnJ, w)
	return f, nil
}

// classical fills the linear plot of ln J − ln D against 1/(T·Δg_v²).
func (f *InterfaceFit) classical(model *kinetics.Model, T, lnJ, w []float64) {
	f.LinearX, f.LinearY, f.Linear, f.LinearGamma = Classical(model, T, lnJ, w)
}

// Classical is the classical plot of measured rates (ln J in m⁻³·s⁻¹ at T
// in K, relative weights w or nil): x = 1/(T·Δg_v²) in m⁶/(J²·K), y = ln J
// − ln D (ln J without a mobility law), the straight line through them
// (nil for fewer than two distinct x) and the γ of its slope,
//
//	γ = (−3·k_B·slope/(16π·f(θ)))^(1/3)
//
// NaN when the slope is not negative. None of it depends on the model's γ,
// so it gives a fit its starting value.
func Classical(model *kinetics.Model, T, lnJ, w []float64) (x, y []float64, line *LineFit, gamma float64) {
	gamma = math.NaN()
	x, y = make([]float64, len(T)), make([]float64, len(T))
	for i, t := range T {
		s := model.At(t)
		dgv := s.DrivingVolume(model.Material().Vm)
		x[i] = 1 / (t * dgv * dgv)
		y[i] = lnJ[i]
		if model.Material().Mobility != nil {
			y[i] -= s.LnD
		}
	}
	l, err := Line(x, y, w)
	if err != nil {
		return x, y, nil, gamma
	}
	if l.Slope < 0 {
		gamma = math.Cbrt(-3 * cnt.Boltzmann * l.Slope / (16 * math.Pi * model.ShapeFactor()))
	}
	return x, y, l, gamma
}

// checkRates checks the data of an interface fit of np parameters: a
// *kinetics.PointError for a point the model cannot fit (no driving force,
// no mobility, a non-finite value), an error for too few points, for all
// temperatures equal, or for a model without a rate.
func checkRates(model *kinetics.Model, T, lnJ, w []float64, np int) error {
	if len(T) != len(lnJ) || (w != nil && len(w) != len(T)) {
		panic("fit: Interface: slices differ in length")
	}
	if !model.HasRate() {
		return errors.New("the material has no rate: give a mobility law or a fixed prefactor")
	}
	if n := len(T); n < np {
		return fmt.Errorf("%w: an interface fit of %d parameters needs at least %d points, got %d", ErrFewPoints, np, np, n)
	}
	same := true
	for i := range T {
		if !(T[i] > 0) || math.IsInf(T[i], 1) {
			return &kinetics.PointError{Index: i, Msg: fmt.Sprintf("temperature must be above absolute zero, got %g K", T[i])}
		}
		if math.IsNaN(lnJ[i]) || math.IsInf(lnJ[i], 0) {
			return &kinetics.PointError{Index: i, Msg: "the rate must be positive and finite"}
		}
		if w != nil && (!(w[i] > 0) || math.IsInf(w[i], 1)) {
			return &kinetics.PointError{Index: i, Msg: fmt.Sprintf("weight must be positive and finite, got %g", w[i])}
		}
		s := model.At(T[i])
		switch {
		case s.Flags&kinetics.FlagOutsideTable != 0:
			return &kinetics.PointError{Index: i, Msg: fmt.Sprintf("%g K is outside the tabulated driving force", T[i])}
		case !(s.Dmu > 0) && !model.HasTe():
			return &kinetics.PointError{Index: i, Msg: fmt.Sprintf("no driving force at %g K: no nucleation", T[i])}
		case !(s.Dmu > 0):
			return &kinetics.PointError{Index: i, Msg: fmt.Sprintf("%g K is at or above the equilibrium temperature %g K: no driving force, no nucleation", T[i], model.Te())}
		case math.IsInf(s.LnJ, -1):
			return &kinetics.PointError{Index: i, Msg: fmt.Sprintf("the model has no mobility at %g K", T[i])}
		}
		same = same && T[i] == T[0]
	}
	if same {
		return errors.New("all temperatures are the same: fitting gamma needs at least two different temperatures")
	}
	return nil
}
