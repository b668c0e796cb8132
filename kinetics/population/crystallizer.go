package population

import (
	"context"
	"errors"
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
)

// GrowthLaw names the growth law of crystals in a solution.
type GrowthLaw int

const (
	// GrowthPower is the size-independent power law of the supersaturation,
	//
	//	G = dL/dt = k_g·(S − 1)^g            for S > 1
	//	G = −k_g·(1 − S)^g                   for S < 1 (dissolution, mirrored)
	//
	// the usual empirical law of crystallization kinetics (Mullin J.W.,
	// Crystallization, 4th ed. (2001) §6.3; Randolph A.D., Larson M.A.,
	// Theory of Particulate Processes, 2nd ed. (1988) ch. 3; from memory).
	GrowthPower GrowthLaw = iota
	// GrowthDiffusion is growth limited by diffusion of the solute to a
	// sphere of the crystal's volume, r_v = L·(3k_v/4π)^(1/3), through
	// still solution:
	//
	//	dV/dt = 4π·r_v·D·V_m·(C − C_sat),  so  dL/dt = 4π·r_v·D·V_m·(C − C_sat)/(3·k_v·L²)
	//
	// (for a sphere, L = 2r: dL/dt = 4·D·V_m·(C − C_sat)/L), with D from
	// the nucleus material's mobility law (Mullin (2001) §6.1, from memory).
	GrowthDiffusion
)

// Growth is the growth law of a crystallizer.
type Growth struct {
	Law   GrowthLaw
	Kg    float64 // k_g, m/s (GrowthPower)
	Order float64 // g, dimensionless, ≥ 0 (GrowthPower; 1 to 2 is usual)
}

// Seed is a charge of seed crystals of one size.
type Seed struct {
	Mass float64 `json:"mass_kg_per_m3"` // per m³ of solvent
	Size float64 `json:"size_m"`         // characteristic length L
}

// Crystallizer is a batch of solution cooled (or held) along a schedule,
// in which crystals are born by primary nucleation and grow, with the
// solute balance per volume of solvent (the solvent neither evaporates nor
// crystallizes):
//
//	C = C₀ + Σ_seeds m_s/M − (k_v/V_m)·Σ n_i·L_i³
//
// C in mol per m³ of solvent, n_i per m³ of solvent, V_m the molar volume
// of the crystal and k_v its volume shape factor (volume = k_v·L³).
// Nucleation is the project's solution model: Δμ = k_BT·ln S with
// S = C/C_sat(T), the nucleus, barrier and Zeldovich factor of cnt, and the
// rate of kinetics.Model with the nucleus material's prefactor (the
// diffusion prefactor takes the number concentration C·N_A; a volume of
// solution is taken as its volume of solvent). A crystal is born with the
// volume of a sphere of radius r* + ½·sqrt(k_BT/(πγ)), as for an alloy.
// Randolph and Larson (1988) ch. 2–3 for the population balance.
type Crystallizer struct {
	// Nucleus is the crystal's material: V_m, γ, θ, sites, prefactor, j0,
	// mobility (the solute's diffusivity) and jump. Its driving force,
	// T_e and concentration are set by the run from the solution's state.
	Nucleus      kinetics.Material
	NoNucleation bool       // seeded run without primary nucleation (Nucleus then needs no rate model)
	Solubility   Solubility // C_sat(T), mol per m³ of solvent
	C0           float64    // dissolved solute at the start, mol per m³ of solvent
	Growth       Growth
	ShapeFactor  float64 // k_v (0: π/6, a sphere with L its diameter)
	MolarMass    float64 // kg/mol of the crystal (needed for seeds)
	Seeds        []Seed
}

var errCrystallizer = errors.New("crystallizer")

// crystalModel is a checked crystallizer with its constants.
type crystalModel struct {
	c      Crystallizer
	kv     float64
	total  float64 // C₀ plus the seeds, mol per m³ of solvent
	sphere float64 // (4π/(3k_v))^(1/3): L of the crystal with the volume of a sphere of radius 1
	diffK  float64 // 4π·(3k_v/4π)^(1/3)·V_m/(3k_v), for GrowthDiffusion
	seedX  []float64
	seedN  []float64
}

// Check validates the crystallizer; errors name the value.
func (c *Crystallizer) Check() error {
	_, err := newCrystalModel(*c)
	return err
}

func newCrystalModel(c Crystallizer) (*crystalModel, error) {
	bad := func(f string, args ...any) error {
		return fmt.Errorf("%w: "+f, append([]any{errCrystallizer}, args...)...)
	}
	if c.Solubility == nil {
		return nil, bad("no solubility law")
	}
	if !(c.C0 > 0) || math.IsInf(c.C0, 1) {
		return nil, bad("c0 must be positive and finite, got %g mol/m3", c.C0)
	}
	m := &crystalModel{c: c, kv: c.ShapeFactor}
	if m.kv == 0 {
		m.kv = math.Pi / 6
	}
	if !(m.kv > 0) || m.kv > 1e3 {
		return nil, bad("the shape factor must be positive, got %g", c.ShapeFactor)
	}
	// The material, checked as a solution at some supersaturation.
	probe := c.Nucleus
	probe.Driving, probe.Conc = cnt.Supersaturation{S: 2, Tsat: 300}, 1
	md, err := kinetics.NewModel(probe)
	if err != nil {
		return nil, bad("%v", err)
	}
	if !c.NoNucleation && !md.HasRate() {
		return nil, bad("primary nucleation needs a rate model (a mobility law or a fixed prefactor j0); or ask for a seeded run without nucleation")
	}
	switch c.Growth.Law {
	case GrowthPower:
		if !(c.Growth.Kg > 0) || math.IsInf(c.Growth.Kg, 1) || !(c.Growth.Order >= 0) || c.Growth.Order > 10 {
			return nil, bad("the power growth law needs kg > 0 (m/s) and an order g in [0, 10], got %g and %g", c.Growth.Kg, c.Growth.Order)
		}
	case GrowthDiffusion:
		if c.Nucleus.Mobility == nil {
			return nil, bad("diffusion-limited growth needs the solute's diffusivity (a mobility law)")
		}
	default:
		return nil, bad("unknown growth law %d", c.Growth.Law)
	}
	m.sphere = math.Cbrt(4 * math.Pi / (3 * m.kv))
	m.diffK = 4 * math.Pi * math.Cbrt(3*m.kv/(4*math.Pi)) * c.Nucleus.Vm / (3 * m.kv)
	m.total = c.C0
	for i, s := range c.Seeds {
		if !(s.Mass > 0) || math.IsInf(s.Mass, 1) || !(s.Size > 0) || math.IsInf(s.Size, 1) {
			return nil, bad("seed %d: mass and size must be positive and finite, got %g kg/m3 and %g m", i+1, s.Mass, s.Size)
		}
		if !(c.MolarMass > 0) || math.IsInf(c.MolarMass, 1) {
			return nil, bad("seeds given by mass need the crystal's molar mass")
		}
		// N = m_s/(ρ·k_v·L³) with ρ = M/V_m; their moles m_s/M.
		m.seedX = append(m.seedX, s.Size)
		m.seedN = append(m.seedN, s.Mass*c.Nucleus.Vm/(c.MolarMass*m.kv*s.Size*s.Size*s.Size))
		m.total += s.Mass / c.MolarMass
	}
	return m, nil
}

// Supersaturated reports whether the solution as charged (C₀, without
// the seeds) is above its solubility at temperature T (K).
func (c *Crystallizer) Supersaturated(T float64) bool {
	return math.Log(c.C0) > c.Solubility.LnSolubility(T)
}

func (m *crystalModel) supersaturated(T float64) bool { return m.c.Supersaturated(T) }

func (m *crystalModel) at(T, m3, since float64) point {
	c := &m.c
	conc := m.total - m.kv*m3/c.Nucleus.Vm
	p := point{T: T, conc: conc, eq: math.Exp(c.Solubility.LnSolubility(T)), lnJ: math.Inf(-1), birth: math.NaN(), crit: math.Inf(1)}
	p.ok = conc > 0 && p.eq > 0
	if !p.ok {
		return p
	}
	S := conc / p.eq
	switch c.Growth.Law {
	case GrowthPower:
		if S >= 1 {
			p.g = c.Growth.Kg * math.Pow(S-1, c.Growth.Order)
		} else {
			p.g = -c.Growth.Kg * math.Pow(1-S, c.Growth.Order)
		}
	case GrowthDiffusion:
		p.g = m.diffK * math.Exp(c.Nucleus.Mobility.LnDiffusivity(T)) * (conc - p.eq)
	}
	if c.NoNucleation || !(S > 1) {
		return p
	}
	mat := c.Nucleus
	mat.Driving, mat.Conc = cnt.Supersaturation{S: S, Tsat: T}, conc*cnt.Avogadro
	md, err := kinetics.NewModel(mat)
	if err != nil {
		panic("population: a checked crystallizer failed: " + err.Error())
	}
	st := md.At(T)
	p.lnJ = st.LnJ
	if r := st.Nucleus.Radius; r > 0 && !math.IsInf(r, 1) {
		p.crit = r
		p.birth = (r + 0.5*math.Sqrt(cnt.Boltzmann*T/(math.Pi*c.Nucleus.Gamma))) * m.sphere
	}
	return p
}

// Nucleation is the primary nucleation rate (ln J, J per m³·s) and the
// size L at which crystals are born (m) in the solution at temperature T
// (K) holding conc (mol per m³ of solvent): −Inf and NaN where nothing
// nucleates. Errors: a crystallizer that does not check.
func (c *Crystallizer) Nucleation(T, conc float64) (lnJ, size float64, err error) {
	m, err := newCrystalModel(*c)
	if err != nil {
		return 0, 0, err
	}
	kv := m.kv
	p := m.at(T, (m.total-conc)*c.Nucleus.Vm/kv, 0)
	return p.lnJ, p.birth, nil
}

func (m *crystalModel) growth(p *point, L float64) float64 {
	if m.c.Growth.Law == GrowthDiffusion {
		return p.g / L
	}
	return p.g
}

// CrystalRow is the state of a crystallizer at one time (the common
// values of Row, numbers and volumes per m³ of solvent, and the mean size,
// concentration, solubility and yield).
type CrystalRow struct {
	Row
	MeanSize      float64 `json:"mean_size_m"` // NaN: no crystals
	Concentration float64 `json:"concentration_mol_per_m3"`
	Solubility    float64 `json:"solubility_mol_per_m3"`
	Yield         float64 `json:"yield"` // fraction of the solute dissolved at the start now in crystals
}

// CrystalResult is a run of a crystallizer through a schedule; the sizes
// of Final are lengths L, its numbers per m³ of solvent.
type CrystalResult struct {
	Summary
	Rows  []CrystalRow `json:"rows"`
	D10   float64      `json:"d10_m"` // volume-weighted (VolumeQuantile)
	D50   float64      `json:"d50_m"`
	D90   float64      `json:"d90_m"`
	Yield float64      `json:"yield"`
}

// Run takes the crystallizer along the schedule. Errors as for Alloy.Run.
func (c *Crystallizer) Run(ctx context.Context, s kinetics.Schedule, opt Options) (*CrystalResult, error) {
	m, err := newCrystalModel(*c)
	if err != nil {
		return nil, err
	}
	rows, last, e, err := runRows(ctx, m, c.Solubility, "solubility", s, opt, m.seedX, m.seedN, m.row)
	if err != nil {
		return nil, err
	}
	balance := math.Abs(last.p.conc+m.kv*cubeSum(last.x, last.n)/c.Nucleus.Vm-m.total) / m.total
	res := &CrystalResult{Summary: summarize(s, last, e, balance), Rows: rows}
	res.D10, res.D50, res.D90 = VolumeQuantile(res.Final, 0.1), VolumeQuantile(res.Final, 0.5), VolumeQuantile(res.Final, 0.9)
	res.Yield = rows[len(rows)-1].Yield
	return res, nil
}

func (m *crystalModel) row(sm sample) CrystalRow {
	r, mean := commonRow(sm, m.kv)
	c := sm.p.conc
	return CrystalRow{Row: r, MeanSize: mean, Concentration: c, Solubility: sm.p.eq, Yield: (m.c.C0 - c) / m.c.C0}
}
