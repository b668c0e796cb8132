package kinetics

import (
	"errors"
	"fmt"
	"math"

	"undercool/cnt"
)

// Prefactor names the kinetic prefactor model of the steady-state rate.
type Prefactor int

const (
	// PrefactorAttachment is J = N·Z·β*·exp(−ΔG*/k_BT) with β* from D(T).
	PrefactorAttachment Prefactor = iota
	// PrefactorTurnbullFisher is J = N·(k_BT/h)·exp(−Q/RT)·exp(−ΔG*/k_BT).
	PrefactorTurnbullFisher
	// PrefactorFixed is J = J0·exp(−ΔG*/k_BT).
	PrefactorFixed
	// PrefactorDiffusion is J = N·Z·β*·exp(−ΔG*/k_BT) with β* = 4π·r*·D·c,
	// attachment by volume diffusion of solute at number concentration c (solutions).
	PrefactorDiffusion
)

var prefactorNames = [...]string{"attachment", "turnbull-fisher", "fixed", "diffusion"}

func (p Prefactor) String() string { return prefactorNames[p] }

// ParsePrefactor returns the prefactor model with the given short name.
func ParsePrefactor(s string) (Prefactor, bool) {
	for i, n := range prefactorNames {
		if n == s {
			return Prefactor(i), true
		}
	}
	return 0, false
}

// PrefactorNames lists the accepted prefactor names.
func PrefactorNames() []string { return prefactorNames[:] }

// Material is the description of a transforming material: its driving
// force, interface and mobility. Zero values mean "not given" where the
// field says so. Build a Model from it to evaluate rates.
type Material struct {
	Name      string
	Driving   cnt.DrivingForce // gives the equilibrium temperature T_e too
	Vm        float64          // molar volume of the new phase, m³/mol
	Gamma     float64          // interfacial energy, J/m²
	Theta     float64          // contact angle, degrees; 180 = homogeneous (0: homogeneous)
	Sites     float64          // nucleation sites, m⁻³ (0: 1/v, every molecule)
	Prefactor Prefactor        // kinetic prefactor model
	J0        float64          // prefactor for PrefactorFixed, m⁻³·s⁻¹
	Mobility  Mobility         // nil: no mobility law (nucleus only, or fixed prefactor)
	Jump      float64          // jump distance λ, m (0: v^(1/3))
	Tg        float64          // glass transition, K (0: none), for ranges and flags
	Conc      float64          // solute molecules per m³ in solution, for PrefactorDiffusion
	Growth    float64          // measured growth rate u, m/s, in place of the mobility law's (0: from the mobility law)

	// Temperature-dependent interface, glassy state, growth calibrated on
	// its own, and the range a card was calibrated on.
	GammaLaw     GammaLaw  // how γ depends on T; Gamma is then γ(GammaTRef)
	GammaTRef    float64   // K, the temperature Gamma is given at (linear, negentropic)
	GammaSlope   float64   // dγ/dT, J/(m²·K), for GammaLinear
	GlassQ       float64   // J/mol, activation energy of the viscosity below T_g (0: the equilibrium law extrapolated)
	GrowthLaw    GrowthLaw // nil: normal growth from the mobility law (or Growth)
	CalibratedLo float64   // K, lowest temperature the material was calibrated on (0: no range)
	CalibratedHi float64   // K, highest (0: no range)
}

// MolecularVolume is v = V_m/N_A, m³.
func (m *Material) MolecularVolume() float64 { return m.Vm / cnt.Avogadro }

// JumpDistance is λ, the given one or v^(1/3).
func (m *Material) JumpDistance() float64 {
	if m.Jump > 0 {
		return m.Jump
	}
	return math.Cbrt(m.MolecularVolume())
}

// Model is a validated Material, ready to answer for any temperature.
// It is immutable and safe for concurrent use.
type Model struct {
	m      Material
	te     float64 // equilibrium temperature, K, from the driving force
	v      float64 // molecular volume, m³
	jump   float64 // λ, m
	lnJump float64
	f      float64 // shape factor
	lnN    float64 // ln of site density
	lnJ0   float64
	q      float64 // Arrhenius Q for Turnbull–Fisher, J/mol
	tg     float64 // glass transition, K: the material's or its WLF law's (0: none)
}

// minMolecularVolume is the least volume per molecule accepted, m³.
const minMolecularVolume = 1e-33

// ErrNoEquilibrium is returned for a driving force without an equilibrium
// temperature (a table whose Δg never changes sign).
var ErrNoEquilibrium = errors.New("the driving force has no equilibrium temperature (its Δg never changes sign)")

// ErrNoMobility is returned for a Turnbull–Fisher prefactor without an
// Arrhenius mobility law.
var ErrNoMobility = errors.New("the prefactor turnbull-fisher needs an arrhenius mobility law (D0 and Q)")

func positive(name string, x float64) error {
	if !(x > 0) || math.IsInf(x, 1) {
		return fmt.Errorf("%s must be positive and finite, got %g", name, x)
	}
	return nil
}

// NewModel checks a material and prepares it for evaluation. The errors
// name the offending quantity by its field (Vm, Gamma, …; Te for the
// driving force's equilibrium temperature).
func NewModel(m Material) (*Model, error) {
	if m.Driving == nil {
		return nil, errors.New("no driving-force model")
	}
	te, ok := m.Driving.Equilibrium()
	checks := []struct {
		name string
		x    float64
	}{{"Te", te}, {"Vm", m.Vm}, {"Gamma", m.Gamma}}
	if !ok {
		// A solution at a fixed supersaturation has no saturation
		// temperature, and needs none at a given temperature: Te is NaN.
		if _, sol := m.Driving.(cnt.Solution); !sol {
			return nil, ErrNoEquilibrium
		}
		te, checks = math.NaN(), checks[1:]
	}
	for _, c := range checks {
		if err := positive(c.name, c.x); err != nil {
			return nil, err
		}
	}
	if m.Theta == 0 {
		m.Theta = 180
	}
	if !(m.Theta > 0 && m.Theta <= 180) {
		return nil, fmt.Errorf("Theta must be in (0, 180] degrees, got %g", m.Theta)
	}
	for _, c := range []struct {
		name string
		x    float64
	}{{"Sites", m.Sites}, {"Jump", m.Jump}, {"Tg", m.Tg}, {"J0", m.J0}, {"Growth", m.Growth}, {"CalibratedLo", m.CalibratedLo}, {"CalibratedHi", m.CalibratedHi}} {
		if c.x != 0 {
			if err := positive(c.name, c.x); err != nil {
				return nil, err
			}
		}
	}
	if err := checkGammaLaw(m); err != nil {
		return nil, err
	}
	if (m.CalibratedLo == 0) != (m.CalibratedHi == 0) || m.CalibratedLo > m.CalibratedHi {
		return nil, fmt.Errorf("the calibrated range needs both ends, lowest first: got %g to %g K", m.CalibratedLo, m.CalibratedHi)
	}
	md := &Model{m: m, te: te, v: m.MolecularVolume(), jump: m.JumpDistance(), f: cnt.ShapeFactor(m.Theta)}
	// A molecule smaller than 1e-33 m³ (a thousandth of a nucleon's) is a
	// unit mistake, and would make v, λ and every nucleus underflow.
	if !(md.v > minMolecularVolume) || !(md.jump > 0) || math.IsInf(md.jump, 0) {
		return nil, fmt.Errorf("Vm = %g m3/mol gives a molecular volume of %g m3, not a molecule (check the unit)", m.Vm, md.v)
	}
	md.lnJump = math.Log(md.jump)
	if m.Sites > 0 {
		md.lnN = math.Log(m.Sites)
	} else {
		md.lnN = -math.Log(md.v)
	}
	switch m.Prefactor {
	case PrefactorFixed:
		if !(m.J0 > 0) {
			return nil, errors.New("the fixed prefactor needs J0 (m^-3 s^-1)")
		}
		md.lnJ0 = math.Log(m.J0)
	case PrefactorDiffusion:
		if err := checkDiffusion(m); err != nil {
			return nil, err
		}
	case PrefactorTurnbullFisher:
		a, ok := m.Mobility.(Arrhenius)
		if !ok {
			return nil, ErrNoMobility
		}
		md.q = a.Q
	}
	var err error
	switch mob := m.Mobility.(type) {
	case Arrhenius:
		if err := positive("Arrhenius D0", mob.D0); err != nil {
			return nil, err
		}
		if math.IsNaN(mob.Q) || math.IsInf(mob.Q, 0) {
			return nil, errors.New("Arrhenius Q must be finite")
		}
	case VFT:
		if !(mob.T0 >= 0) || math.IsInf(mob.T0, 1) || math.IsNaN(mob.A) || math.IsInf(mob.A, 0) || !(mob.B > 0) || math.IsInf(mob.B, 1) {
			return nil, errors.New("VFT needs a finite A, a positive finite B and a finite T0 >= 0")
		}
		if mob.Jump, err = jumpOf(mob.Jump, md.jump); err != nil {
			return nil, err
		}
		md.m.Mobility = mob
	case WLF:
		if err := positive("WLF Tg", mob.Tg); err != nil {
			return nil, err
		}
		if err := positive("WLF C2", mob.C2); err != nil {
			return nil, err
		}
		if err := positive("WLF EtaG", mob.EtaG); err != nil {
			return nil, err
		}
		if err := positive("WLF C1", mob.C1); err != nil {
			return nil, err
		}
		if mob.Jump, err = jumpOf(mob.Jump, md.jump); err != nil {
			return nil, err
		}
		md.m.Mobility = mob
	}
	md.tg = glassTransition(md.m)
	if err := checkGlassy(md.m); err != nil {
		return nil, err
	}
	if err := md.prepareGrowth(); err != nil {
		return nil, err
	}
	return md, nil
}

// jumpOf is the Stokes–Einstein diameter of a viscosity law: its own, or
// the material's jump distance when the law has none.
func jumpOf(own, material float64) (float64, error) {
	if own == 0 {
		return material, nil
	}
	return own, positive("Jump", own)
}

// Material returns a copy of the material the model was built from, with
// defaults filled in (θ).
func (md *Model) Material() Material { return md.m }

// Te is the equilibrium temperature T_e of the driving force, K.
func (md *Model) Te() float64 { return md.te }

// HasTe reports whether the model has an equilibrium temperature: every
// model but a solution at a fixed supersaturation without a saturation
// temperature (Te is then NaN, and so is every undercooling).
func (md *Model) HasTe() bool { return !math.IsNaN(md.te) }

// MolecularVolume is v, m³.
func (md *Model) MolecularVolume() float64 { return md.v }

// JumpDistance is λ, m.
func (md *Model) JumpDistance() float64 { return md.jump }

// ShapeFactor is f(θ).
func (md *Model) ShapeFactor() float64 { return md.f }

// LnSites is ln N, N in m⁻³.
func (md *Model) LnSites() float64 { return md.lnN }

// HasRate reports whether the model can give a nucleation rate: it has a
// mobility law or a fixed prefactor.
func (md *Model) HasRate() bool {
	return md.m.Mobility != nil || md.m.Prefactor == PrefactorFixed
}

// HasGrowth reports whether the model can give a growth rate (it has a
// mobility law, a growth law or a measured growth rate).
func (md *Model) HasGrowth() bool {
	return md.m.Mobility != nil || md.m.Growth > 0 || md.m.GrowthLaw != nil
}

// Calibrated is the range of temperatures the material was calibrated on,
// K, and whether it has one.
func (md *Model) Calibrated() (lo, hi float64, ok bool) {
	return md.m.CalibratedLo, md.m.CalibratedHi, md.m.CalibratedHi > 0
}
