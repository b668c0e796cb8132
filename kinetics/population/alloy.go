package population

import (
	"context"
	"errors"
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
)

// Alloy is a dilute binary solid solution from which a precipitate of
// fixed composition forms: the supersaturated matrix of an age-hardening
// alloy. Particles are spheres of radius r.
//
// The matrix holds the solute mole fraction c; the precipitate c_p; at
// equilibrium the matrix holds c_eq(T) (the solvus). Matrix and
// precipitate are taken to have the same volume per atom, so that the
// solute balance over a volume fraction f_v of precipitate reads
//
//	c = (c₀ − f_v·c_p)/(1 − f_v),  f_v = (4π/3)·Σ n_i·r_i³
//
// (Myhr O.R., Grong Ø., Acta Mater. 48 (2000) 1605; Perez M., Dumont M.,
// Acevedo-Reyes D., Acta Mater. 56 (2008) 2119; both from memory).
//
// Nucleation (classical, Kampmann R., Wagner R., in Decomposition of Alloys:
// the Early Stages, Pergamon (1984) 91, from memory; Perez et al. 2008):
//
//	J  = N₀·Z·β*·exp(−ΔG*/k_BT)·exp(−τ/t)
//	Δμ = k_BT·[c_p·ln(c/c_eq) + (1 − c_p)·ln((1 − c)/(1 − c_eq))]   per atom (cnt.DiluteDriving)
//	r*, ΔG*, Z from cnt.Critical with v = V_m/N_A, the volume per atom
//	β* = 4π·r*²·D·c/a⁴                                              (cnt.LnAttachmentSolid)
//	τ  = 1/(2π·Z²·β*)                                                (cnt.Incubation)
//
// with t the time since the alloy became supersaturated (c₀ > c_eq(T)).
// New particles are born at r* + ½·sqrt(k_BT/(πγ)), the radius at which
// the free energy of a nucleus has fallen k_BT below the barrier, so that
// they grow (Nicolas M., Deschamps A., Acta Mater. 51 (2003) 6077;
// Perez et al. 2008; from memory).
//
// Growth, by diffusion of solute to a sphere in a dilute matrix with the
// Gibbs–Thomson solubility at its interface:
//
//	dr/dt = (D/r)·(c − c_r)/(c_p − c_r),  c_r = c_eq·exp(2γ·V_p/(r·R·T))
//
// where V_p = V_m/c_p is the precipitate's volume per mole of solute: with
// it, the radius at which a particle neither grows nor shrinks is r* (to
// the small (1 − c_p) term of Δμ). A particle whose c_r reaches c_p is
// unstable and dissolves at once. Coarsening is not added: it emerges
// where the large particles grow at the expense of the small.
type Alloy struct {
	C0       float64           // solute mole fraction of the alloy, (0, 1)
	Cp       float64           // solute mole fraction of the precipitate, (C0, 1] (0.25 for Al3Sc)
	Solvus   Solubility        // c_eq(T) as a mole fraction
	Vm       float64           // molar volume of the precipitate per mole of atoms, m³/mol
	Gamma    float64           // precipitate–matrix interfacial energy, J/m²
	Mobility kinetics.Mobility // diffusivity of the solute in the matrix
	Lattice  float64           // a, the lattice parameter of the precipitate, m (0: (V_m/N_A)^(1/3))
	Sites    float64           // N₀, nucleation sites per m³ (0: 1/v, every atom)
	NoLag    bool              // leave out the time-lag factor exp(−τ/t)
	Initial  []Class           // particles present at the start (radius, number per m³); C0 counts their solute
}

// The errors of Alloy.Check name the value by its key.
var errAlloy = errors.New("alloy")

// Check validates the alloy; errors name the value (c0, cp, vm, gamma, …).
func (a *Alloy) Check() error {
	bad := func(f string, args ...any) error { return fmt.Errorf("%w: "+f, append([]any{errAlloy}, args...)...) }
	switch {
	case !(a.C0 > 0 && a.C0 < 1):
		return bad("c0 must lie in (0, 1) as a mole fraction, got %g", a.C0)
	case !(a.Cp > a.C0 && a.Cp <= 1):
		return bad("cp must lie above c0 and at most 1, got %g", a.Cp)
	case a.Solvus == nil:
		return bad("no solvus")
	case a.Mobility == nil:
		return bad("no diffusivity law")
	}
	for _, v := range []struct {
		key string
		x   float64
		opt bool
	}{{"vm", a.Vm, false}, {"gamma", a.Gamma, false}, {"lattice", a.Lattice, true}, {"sites", a.Sites, true}} {
		if v.opt && v.x == 0 {
			continue
		}
		if !(v.x > 0) || math.IsInf(v.x, 1) {
			return bad("%s must be positive and finite, got %g", v.key, v.x)
		}
	}
	if a.Vm/cnt.Avogadro < 1e-33 {
		return bad("vm %g m3/mol is not a molar volume (check the unit)", a.Vm)
	}
	return checkClasses(a.Initial)
}

// alloyModel is a checked alloy with its constants.
type alloyModel struct {
	a     Alloy
	v     float64 // volume per atom, m³
	lnA   float64 // ln a
	lnN0  float64
	vp    float64 // V_p = V_m/c_p, m³ per mole of solute
	cpVol float64 // c_p/(volume per atom): solute atoms per m³ of precipitate
}

func newAlloyModel(a Alloy) (*alloyModel, error) {
	if err := a.Check(); err != nil {
		return nil, err
	}
	m := &alloyModel{a: a, v: a.Vm / cnt.Avogadro, vp: a.Vm / a.Cp}
	lat := a.Lattice
	if lat == 0 {
		lat = math.Cbrt(m.v)
	}
	m.lnA = math.Log(lat)
	if a.Sites > 0 {
		m.lnN0 = math.Log(a.Sites)
	} else {
		m.lnN0 = -math.Log(m.v)
	}
	return m, nil
}

// Supersaturated reports whether the alloy, with all its solute in the
// matrix, is supersaturated at temperature T (K): below the solvus
// temperature of c₀. The clock of the nucleation time lag starts there.
func (a *Alloy) Supersaturated(T float64) bool {
	return math.Log(a.C0) > a.Solvus.LnSolubility(T)
}

func (m *alloyModel) supersaturated(T float64) bool { return m.a.Supersaturated(T) }

func (m *alloyModel) at(T, m3, since float64) point {
	a := &m.a
	fv := 4 * math.Pi / 3 * m3
	c := (a.C0 - fv*a.Cp) / (1 - fv)
	p := point{T: T, conc: c, eq: math.Exp(a.Solvus.LnSolubility(T)), lnJ: math.Inf(-1), birth: math.NaN(), crit: math.Inf(1)}
	p.ok = c > 0 && fv < 1 && p.eq > 0 && p.eq < a.Cp
	if !p.ok {
		return p
	}
	lnD := a.Mobility.LnDiffusivity(T)
	p.diff = math.Exp(lnD)
	p.alpha = 2 * a.Gamma * m.vp / (cnt.Gas * T)
	kT := cnt.Boltzmann * T
	dmu := kT * cnt.DiluteDriving(c, p.eq, a.Cp)
	if !(dmu > 0) {
		return p
	}
	nuc := cnt.Critical(dmu, a.Gamma, m.v, 1, T)
	lnBeta := cnt.LnAttachmentSolid(lnD, nuc.Radius, c, math.Exp(m.lnA))
	p.lnJ = cnt.LnRate(m.lnN0, nuc.Zeldovich, lnBeta, nuc.Barrier, T)
	if !a.NoLag {
		tau := cnt.Incubation(nuc.Zeldovich, lnBeta)
		if since > 0 {
			p.lnJ -= tau / since
		} else {
			p.lnJ = math.Inf(-1)
		}
	}
	p.crit = nuc.Radius
	p.birth = nuc.Radius + 0.5*math.Sqrt(kT/(math.Pi*a.Gamma))
	return p
}

// growth is dr/dt = (D/r)·(c − c_r)/(c_p − c_r) with the Gibbs–Thomson c_r.
func (m *alloyModel) growth(p *point, r float64) float64 {
	cr := p.eq * math.Exp(p.alpha/r)
	if !(cr < m.a.Cp) {
		return math.Inf(-1)
	}
	return p.diff / r * (p.conc - cr) / (m.a.Cp - cr)
}

// AlloyRow is the state of an ageing alloy at one time (the common
// values of Row, and the mean radius and matrix concentration).
type AlloyRow struct {
	Row
	MeanRadius float64 `json:"mean_radius_m"`        // NaN: no particles
	Matrix     float64 `json:"matrix_concentration"` // solute mole fraction left in the matrix
}

// AlloyResult is a run of an alloy through a schedule; the sizes of Final
// are radii, its numbers per m³ of alloy.
type AlloyResult struct {
	Summary
	Rows []AlloyRow `json:"rows"`
}

// Run ages the alloy along the schedule. Errors: a bad alloy (naming the
// value), a solvus that has no value within the schedule's temperatures,
// a run that cannot meet its tolerances, or the context's error.
func (a *Alloy) Run(ctx context.Context, s kinetics.Schedule, opt Options) (*AlloyResult, error) {
	m, err := newAlloyModel(*a)
	if err != nil {
		return nil, err
	}
	x0, n0 := splitClasses(a.Initial)
	rows, last, e, err := runRows(ctx, m, a.Solvus, "solvus", s, opt, x0, n0, m.row)
	if err != nil {
		return nil, err
	}
	fv := 4 * math.Pi / 3 * cubeSum(last.x, last.n)
	balance := math.Abs(last.p.conc*(1-fv)+fv*a.Cp-a.C0) / a.C0
	return &AlloyResult{Summary: summarize(s, last, e, balance), Rows: rows}, nil
}

func (m *alloyModel) row(sm sample) AlloyRow {
	r, mean := commonRow(sm, 4*math.Pi/3)
	return AlloyRow{Row: r, MeanRadius: mean, Matrix: sm.p.conc}
}
