package fit

import (
	"errors"
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
)

// GrowthFit is the kinetic coefficient of crystal growth fitted to
// measured growth rates u(T), with the thermodynamic factor
// 1 − exp(−Δμ/k_BT) of the model divided out. Two laws:
//
// viscosity power (Ediger, Harrowell and Yu, J. Chem. Phys. 128 (2008)
// 034709), a straight line of
//
//	y = log10 u − log10[(T/T_g)·(1 − exp(−Δμ/k_BT))]
//	x = log10 η(T_g) − log10 η(T)
//	y = log10 u_g + ξ·x
//
// with η the model's viscosity law (its glassy branch below T_g); or with
// ξ held (KeepXi) the weighted mean of y − ξ·x, log10 u_g alone;
//
// Arrhenius, a straight line of ln[u/(1 − exp(−Δμ/k_BT))] against 1/T:
// u_0 and Q_u as in Arrhenius.
//
// Standard errors and 95 % intervals are those of the straight line
// (Line); N − 2 degrees of freedom, N − 1 with ξ held.
type GrowthFit struct {
	Law    string // "viscosity-power" or "arrhenius"
	KeepXi bool   // ξ held at the model's value, u_g alone fitted

	// Viscosity power.
	Log10Ug, Log10UgSE float64
	Ug                 float64    // m/s
	UgCI               [2]float64 // m/s
	Xi, XiSE           float64
	XiCI               [2]float64
	// Arrhenius.
	Arrhenius *ArrheniusFit // of u/(1 − exp(−Δμ/k_BT)) against T

	N, DoF     int
	T          float64   // Student t quantile of the intervals; NaN when exact
	X, Y       []float64 // the straight line's points (x and y above; Arrhenius: 1/T and ln)
	Line       *LineFit  // the straight line (nil with ξ held)
	Residuals  []float64 // log10 u measured − log10 u fitted
	ResidualSD float64   // in log10 u; NaN when exact
	Model      *kinetics.Model
	Flags      kinetics.Flag // validity flags of the fitted model at the data temperatures
}

// Exact reports whether the fit has as many points as parameters.
func (f *GrowthFit) Exact() bool { return f.DoF == 0 }

// growthPoints checks measured growth rates against a model: every point
// needs a driving force and a positive finite rate. It returns the
// thermodynamic factor 1 − exp(−Δμ/k_BT) at each point.
func growthPoints(model *kinetics.Model, T, u, w []float64, np int) ([]float64, error) {
	if len(T) != len(u) || (w != nil && len(w) != len(T)) {
		panic("fit: Growth: slices differ in length")
	}
	if len(T) < np {
		return nil, fmt.Errorf("%w: a growth fit of %d parameters needs at least %d points, got %d", ErrFewPoints, np, np, len(T))
	}
	thermo := make([]float64, len(T))
	for i := range T {
		switch {
		case !(T[i] > 0) || math.IsInf(T[i], 1):
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("temperature must be above absolute zero, got %g K", T[i])}
		case !(u[i] > 0) || math.IsInf(u[i], 1):
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("the growth rate must be positive and finite, got %g", u[i])}
		case w != nil && (!(w[i] > 0) || math.IsInf(w[i], 1)):
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("weight must be positive and finite, got %g", w[i])}
		}
		s := model.At(T[i])
		if !(s.Dmu > 0) || math.IsNaN(s.Dmu) {
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("%g K is at or above the equilibrium temperature %g K (or outside a tabulated driving force): no driving force, no growth", T[i], model.Te())}
		}
		thermo[i] = -math.Expm1(-s.Dmu / (cnt.Boltzmann * T[i]))
	}
	return thermo, nil
}

// ErrNoViscosity is returned for a viscosity-power fit of a model without a
// viscosity law or a glass transition.
var ErrNoViscosity = errors.New("the viscosity-power growth law needs a viscosity law (vft or wlf) and a glass transition Tg")

// GrowthViscosityPower fits log10 u_g and ξ (or u_g alone with keepXi, ξ
// then the model's, 1 by default) to growth rates u (m/s) at temperatures
// T (K), with optional relative weights w on log10 u. Errors: ErrNoViscosity,
// a *kinetics.PointError for a point without driving force or with the
// viscosity law infinite there, ErrFewPoints (wrapped), ErrSameX.
func GrowthViscosityPower(model *kinetics.Model, T, u, w []float64, keepXi bool) (*GrowthFit, error) {
	tg := model.Tg()
	if !model.HasViscosity() || tg == 0 {
		return nil, ErrNoViscosity
	}
	np := 2
	if keepXi {
		np = 1
	}
	thermo, err := growthPoints(model, T, u, w, np)
	if err != nil {
		return nil, err
	}
	etaG := model.Log10Viscosity(tg)
	f := &GrowthFit{Law: "viscosity-power", KeepXi: keepXi, N: len(T), DoF: len(T) - np}
	f.X, f.Y = make([]float64, len(T)), make([]float64, len(T))
	for i, t := range T {
		l := model.Log10Viscosity(t)
		if math.IsInf(l, 0) || math.IsNaN(l) {
			return nil, &kinetics.PointError{Index: i, Msg: fmt.Sprintf("the viscosity law gives no viscosity at %g K", t)}
		}
		f.X[i] = etaG - l
		f.Y[i] = math.Log10(u[i]) - math.Log10(t/tg*thermo[i])
	}
	nan := math.NaN()
	if keepXi {
		xi := 1.0
		if g, ok := model.Material().GrowthLaw.(kinetics.ViscosityPower); ok {
			xi = g.Xi
		}
		f.Xi, f.XiSE, f.XiCI = xi, nan, [2]float64{nan, nan}
		var sw, m float64
		for i := range T {
			wi := weightOf(w, i)
			sw += wi
			m += wi * (f.Y[i] - xi*f.X[i])
		}
		f.Log10Ug = m / sw
		f.Log10UgSE, f.T, f.ResidualSD = nan, nan, nan
		if f.DoF > 0 {
			var ss float64
			for i := range T {
				d := f.Y[i] - xi*f.X[i] - f.Log10Ug
				ss += weightOf(w, i) * d * d
			}
			f.ResidualSD = math.Sqrt(ss / float64(f.DoF))
			f.Log10UgSE = f.ResidualSD / math.Sqrt(sw)
			f.T = StudentT95(f.DoF)
		}
	} else {
		l, err := Line(f.X, f.Y, w)
		if err != nil {
			if errors.Is(err, ErrSameX) {
				return nil, fmt.Errorf("%w: all points have the same viscosity, so xi cannot be fitted (hold it with the material's growth_xi)", ErrSameX)
			}
			return nil, err
		}
		f.Line = l
		f.Log10Ug, f.Log10UgSE, f.Xi, f.XiSE, f.T, f.ResidualSD = l.Intercept, l.InterceptSE, l.Slope, l.SlopeSE, l.T, l.ResidualSD
		f.XiCI = l.SlopeCI()
	}
	f.Ug = math.Pow(10, f.Log10Ug)
	ci := ci95(f.Log10Ug, f.Log10UgSE, f.T)
	f.UgCI = [2]float64{math.Pow(10, ci[0]), math.Pow(10, ci[1])}
	m := model.Material()
	m.GrowthLaw = kinetics.ViscosityPower{Ug: f.Ug, Xi: f.Xi}
	return f.finish(m, T, u)
}

// GrowthArrhenius fits u_0 and Q_u of u = u_0·exp(−Q_u/RT)·[1 −
// exp(−Δμ/k_BT)] to growth rates u (m/s) at temperatures T (K), with
// optional relative weights w on ln u. Errors as GrowthViscosityPower's.
func GrowthArrhenius(model *kinetics.Model, T, u, w []float64) (*GrowthFit, error) {
	thermo, err := growthPoints(model, T, u, w, 2)
	if err != nil {
		return nil, err
	}
	k := make([]float64, len(T))
	for i := range T {
		k[i] = u[i] / thermo[i]
	}
	a, err := Arrhenius(T, k, w)
	if err != nil {
		return nil, err
	}
	f := &GrowthFit{Law: "arrhenius", Arrhenius: a, Line: a.Line, N: len(T), DoF: len(T) - 2, T: a.Line.T}
	f.X, f.Y = make([]float64, len(T)), make([]float64, len(T))
	for i := range T {
		f.X[i], f.Y[i] = 1/T[i], math.Log(k[i])
	}
	f.ResidualSD = a.Line.ResidualSD / math.Ln10
	if !(a.Q >= 0) {
		return nil, fmt.Errorf("the growth rates fall with temperature on the Arrhenius line (Q = %.4g kJ/mol): the Arrhenius growth law needs Q >= 0", a.Q/1e3)
	}
	m := model.Material()
	m.GrowthLaw = kinetics.ArrheniusGrowth{U0: a.A, Q: a.Q}
	return f.finish(m, T, u)
}

// finish builds the fitted model and the residuals in log10 u.
func (f *GrowthFit) finish(m kinetics.Material, T, u []float64) (*GrowthFit, error) {
	md, err := kinetics.NewModel(m)
	if err != nil {
		return nil, fmt.Errorf("the fitted growth law: %v", err)
	}
	f.Model = md
	f.Residuals = make([]float64, len(T))
	for i, t := range T {
		s := md.At(t)
		f.Residuals[i] = math.Log10(u[i]) - math.Log10(s.Growth)
		f.Flags |= s.Flags
	}
	return f, nil
}

func weightOf(w []float64, i int) float64 {
	if w == nil {
		return 1
	}
	return w[i]
}
