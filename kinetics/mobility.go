package kinetics

import (
	"math"

	"undercool/cnt"
)

// Mobility is a law for the diffusivity D(T) that carries molecules across
// the interface. It is returned as ln D (D in m²/s) so that a vanishing
// mobility is −Inf rather than an underflow.
type Mobility interface {
	LnDiffusivity(T float64) float64
	// Name is the law's short name as used on the command line.
	Name() string
}

// Arrhenius is a thermally activated diffusivity,
//
//	D = D0·exp(−Q/RT)
//
// Arrhenius S., Z. Phys. Chem. 4 (1889) 226; Callister, Materials Science and
// Engineering, eq. 5.8.
type Arrhenius struct {
	D0 float64 // pre-exponential, m²/s, > 0
	Q  float64 // activation energy, J/mol
}

func (a Arrhenius) LnDiffusivity(T float64) float64 { return math.Log(a.D0) - a.Q/(cnt.Gas*T) }
func (Arrhenius) Name() string                      { return "arrhenius" }

// lnStokesEinstein gives ln D from ln η (η in Pa·s) for a molecule of
// diameter λ:
//
//	D = k_BT/(3πηλ)
//
// Einstein A., Ann. Phys. 17 (1905) 549.
func lnStokesEinstein(T, lnEta, jump float64) float64 {
	return math.Log(cnt.Boltzmann*T/(3*math.Pi*jump)) - lnEta
}

// VFT is the Vogel–Fulcher–Tammann viscosity law with Stokes–Einstein,
//
//	log10 η = A + B/(T − T0),  η in Pa·s
//
// Vogel H., Phys. Z. 22 (1921) 645; Fulcher G.S., J. Am. Ceram. Soc. 8
// (1925) 339. Special case: at or below T0 the law has no mobility, ln D = −Inf.
type VFT struct {
	A, B, T0 float64 // A in log10(Pa·s), B in K, T0 in K
	Jump     float64 // λ, m
}

// Log10Viscosity is log10 η (Pa·s); +Inf at or below T0.
func (m VFT) Log10Viscosity(T float64) float64 {
	if !(T > m.T0) {
		return math.Inf(1)
	}
	return m.A + m.B/(T-m.T0)
}

func (m VFT) LnDiffusivity(T float64) float64 {
	return lnStokesEinstein(T, m.Log10Viscosity(T)*math.Ln10, m.Jump)
}
func (VFT) Name() string { return "vft" }

// Universal WLF constants and the viscosity at the glass transition,
// Williams, Landel and Ferry, J. Am. Chem. Soc. 77 (1955) 3701; Angell C.A.,
// Science 267 (1995) 1924 for η(T_g) = 10^12 Pa·s.
const (
	WLFC1   = 17.44 // dimensionless
	WLFC2   = 51.6  // K
	EtaAtTg = 1e12  // Pa·s
)

// WLF is the Williams–Landel–Ferry viscosity law about the glass transition,
// with Stokes–Einstein:
//
//	log10(η/η_g) = −C1·(T − T_g)/(C2 + T − T_g)
//
// Special case: at or below T_g − C2 the law diverges, ln D = −Inf.
type WLF struct {
	Tg, C1, C2 float64 // K, dimensionless, K
	EtaG       float64 // η at T_g, Pa·s
	Jump       float64 // λ, m
}

// Log10Viscosity is log10 η (Pa·s); +Inf at or below T_g − C2.
func (m WLF) Log10Viscosity(T float64) float64 {
	d := T - m.Tg
	if !(m.C2+d > 0) {
		return math.Inf(1)
	}
	return math.Log10(m.EtaG) - m.C1*d/(m.C2+d)
}

func (m WLF) LnDiffusivity(T float64) float64 {
	return lnStokesEinstein(T, m.Log10Viscosity(T)*math.Ln10, m.Jump)
}
func (WLF) Name() string { return "wlf" }
