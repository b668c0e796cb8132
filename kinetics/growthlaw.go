package kinetics

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"undercool/cnt"
)

// GrowthLaw is a law for the crystal growth rate u(T) calibrated on its
// own, in place of normal growth from the nucleation mobility,
// u = (D/λ)·[1 − exp(−Δμ/k_BT)]. Near and below T_g the growth of many
// glass formers is far faster than a Stokes–Einstein diffusivity from the
// viscosity gives, the more so the more fragile the liquid (Ediger M.D.,
// Harrowell P., Yu L., Crystal growth kinetics exhibit a fragility-dependent
// decoupling from viscosity, J. Chem. Phys. 128 (2008) 034709).
type GrowthLaw interface {
	// Name is the law's short name as used on the command line.
	Name() string
	// lnRate is ln u (u in m/s) at T with x = Δμ/k_BT > 0, and the flags
	// the law raises there.
	lnRate(md *Model, T, x float64) (float64, Flag)
}

// lnThermo is ln[1 − exp(−x)], the thermodynamic factor of growth, x > 0.
func lnThermo(x float64) float64 { return math.Log(-math.Expm1(-x)) }

// ViscosityPower is growth whose kinetic coefficient follows a power of
// the inverse viscosity (the decoupling exponent ξ):
//
//	u = u_g·(T/T_g)·[η(T_g)/η(T)]^ξ·[1 − exp(−Δμ/k_BT)]
//
// Ediger, Harrowell and Yu (2008), eq. 2 (u ∝ η^−ξ; from memory). η is the
// model's viscosity law with its glassy branch below T_g. With ξ = 1 and
// u_g = k_B·T_g/(3π·λ²·η(T_g)) it is normal growth with the Stokes–Einstein
// diffusivity exactly; that is the default of a zero Ug (and Xi zero is 1).
type ViscosityPower struct {
	Ug float64 // kinetic coefficient at T_g, m/s (0: the Stokes–Einstein value)
	Xi float64 // decoupling exponent ξ, > 0 (0: 1)
}

func (ViscosityPower) Name() string { return "viscosity-power" }

func (g ViscosityPower) lnRate(md *Model, T, x float64) (float64, Flag) {
	l := md.Log10Viscosity(T)
	if math.IsInf(l, 1) {
		return math.Inf(-1), 0
	}
	return math.Log(g.Ug) + math.Log(T/md.tg) + g.Xi*math.Ln10*(md.Log10Viscosity(md.tg)-l) + lnThermo(x), 0
}

// stokesEinsteinUg is u_g of normal Stokes–Einstein growth at T_g,
// k_B·T_g/(3π·λ²·η(T_g)), λ the viscosity law's.
func stokesEinsteinUg(md *Model, v viscous) float64 {
	j := v.stokesJump()
	return math.Exp(lnStokesEinstein(md.tg, md.Log10Viscosity(md.tg)*math.Ln10, j)) / j
}

// ArrheniusGrowth is growth with a thermally activated kinetic coefficient:
//
//	u = u_0·exp(−Q_u/RT)·[1 − exp(−Δμ/k_BT)]
//
// (common practice: the kinetic coefficient of normal growth with an
// Arrhenius mobility, fitted to measured rates by fit.Growth).
type ArrheniusGrowth struct {
	U0 float64 // m/s, > 0
	Q  float64 // J/mol, ≥ 0
}

func (ArrheniusGrowth) Name() string { return "arrhenius" }

func (g ArrheniusGrowth) lnRate(_ *Model, T, x float64) (float64, Flag) {
	return math.Log(g.U0) - g.Q/(cnt.Gas*T) + lnThermo(x), 0
}

// GrowthTable is a measured growth rate u(T), ln u interpolated linearly
// in 1/T between rows (cnt.LnInverseT). Outside the table the rate is not
// known: it is taken as zero and flagged FlagOutsideGrowthTable.
type GrowthTable struct {
	T, LnU []float64 // ascending temperatures, K; ln u, u in m/s
	Label  string    // where it came from, for output
}

// NewGrowthTable checks and keeps a measured growth-rate table: at least
// two rows, temperatures positive, finite and all different (rows in any
// order), rates positive and finite. Row numbers in errors count from 1 in
// the order given.
func NewGrowthTable(T, u []float64, label string) (*GrowthTable, error) {
	if len(T) != len(u) {
		panic("kinetics: NewGrowthTable: columns differ in length")
	}
	if len(T) < 2 {
		return nil, fmt.Errorf("a growth-rate table needs at least 2 rows, got %d", len(T))
	}
	idx := make([]int, len(T))
	for i := range T {
		if !(T[i] > 0) || math.IsInf(T[i], 1) {
			return nil, &PointError{Index: i, Msg: fmt.Sprintf("temperature must be positive and finite, got %g", T[i])}
		}
		if !(u[i] > 0) || math.IsInf(u[i], 1) {
			return nil, &PointError{Index: i, Msg: fmt.Sprintf("growth rate must be positive and finite, got %g", u[i])}
		}
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return T[idx[a]] < T[idx[b]] })
	g := &GrowthTable{T: make([]float64, len(T)), LnU: make([]float64, len(T)), Label: label}
	for k, i := range idx {
		if k > 0 && T[i] == g.T[k-1] {
			return nil, &PointError{Index: i, Msg: fmt.Sprintf("temperature %g K appears twice", T[i])}
		}
		g.T[k], g.LnU[k] = T[i], math.Log(u[i])
	}
	return g, nil
}

func (*GrowthTable) Name() string { return "table" }

func (g *GrowthTable) lnRate(_ *Model, T, _ float64) (float64, Flag) {
	l := cnt.LnInverseT(g.T, g.LnU, T)
	if math.IsNaN(l) {
		return math.Inf(-1), FlagOutsideGrowthTable
	}
	return l, 0
}

// errGrowthViscosity is the error of viscosity-power growth without a
// viscosity law or a glass transition.
var errGrowthViscosity = errors.New("the viscosity-power growth law needs a viscosity law (vft or wlf) and a glass transition Tg")

// prepareGrowth checks the growth law of a model and fills its defaults.
func (md *Model) prepareGrowth() error {
	switch g := md.m.GrowthLaw.(type) {
	case nil:
		return nil
	case ViscosityPower:
		v, ok := md.m.Mobility.(viscous)
		if !ok || md.tg == 0 {
			return errGrowthViscosity
		}
		if g.Xi == 0 {
			g.Xi = 1
		}
		if !(g.Xi > 0) || math.IsInf(g.Xi, 1) {
			return fmt.Errorf("the decoupling exponent Xi must be positive and finite, got %g", g.Xi)
		}
		if g.Ug == 0 {
			g.Ug = stokesEinsteinUg(md, v)
		}
		if err := positive("growth Ug", g.Ug); err != nil {
			return err
		}
		if math.IsInf(md.Log10Viscosity(md.tg), 0) {
			return errors.New("the viscosity law has no finite viscosity at Tg, which the viscosity-power growth law is scaled to")
		}
		md.m.GrowthLaw = g
	case ArrheniusGrowth:
		if err := positive("growth U0", g.U0); err != nil {
			return err
		}
		if !(g.Q >= 0) || math.IsInf(g.Q, 1) {
			return fmt.Errorf("the growth activation energy must be finite and not negative, got %g", g.Q)
		}
	case *GrowthTable:
		if g == nil || len(g.T) < 2 {
			return errors.New("an empty growth-rate table")
		}
	}
	return nil
}

// GrowthName is the name of the model's growth law: "normal" for growth
// from the mobility law, "measured" for a measured constant rate (solutions).
func (md *Model) GrowthName() string {
	switch {
	case md.m.GrowthLaw != nil:
		return md.m.GrowthLaw.Name()
	case md.m.Growth > 0:
		return "measured"
	}
	return "normal"
}
