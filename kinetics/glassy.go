package kinetics

import (
	"errors"
	"math"

	"undercool/cnt"
)

// viscous is a mobility law that comes from a viscosity through
// Stokes–Einstein (VFT, WLF).
type viscous interface {
	Mobility
	Log10Viscosity(T float64) float64
	stokesJump() float64
}

func (m VFT) stokesJump() float64 { return m.Jump }
func (m WLF) stokesJump() float64 { return m.Jump }

// glassTransition is T_g of a material: its own, else its WLF law's; 0 for none.
func glassTransition(m Material) float64 {
	if m.Tg > 0 {
		return m.Tg
	}
	if w, ok := m.Mobility.(WLF); ok {
		return w.Tg
	}
	return 0
}

// Tg is the glass transition of the model, K: the material's, else its
// WLF law's; 0 for none.
func (md *Model) Tg() float64 { return md.tg }

// HasViscosity reports whether the mobility law comes from a viscosity (VFT, WLF).
func (md *Model) HasViscosity() bool { _, ok := md.m.Mobility.(viscous); return ok }

// Glassy reports whether the model continues its viscosity below T_g
// along the Arrhenius line of the glass (Material.GlassQ > 0).
func (md *Model) Glassy() bool { return md.m.GlassQ > 0 }

// Log10Viscosity is log10 η(T), η in Pa·s, of the model's viscosity law:
// NaN without one. Below T_g with Material.GlassQ = E_g > 0 it is the
// Arrhenius continuation of the glass, continuous at T_g,
//
//	log10 η(T) = log10 η_liquid(T_g) + E_g/(R·ln 10)·(1/T − 1/T_g),   T < T_g
//
// the usual treatment of a glass of frozen structure, whose viscosity is
// isostructural and Arrhenius below T_g (common practice; Mauro J.C.,
// Allan D.C., Potuzak M., Nonequilibrium viscosity of glass, Phys. Rev. B 80
// (2009) 094204, from memory). Without E_g the equilibrium law is
// extrapolated into the glass, as the flags say.
func (md *Model) Log10Viscosity(T float64) float64 {
	v, ok := md.m.Mobility.(viscous)
	if !ok {
		return math.NaN()
	}
	if md.m.GlassQ > 0 && T < md.tg {
		return v.Log10Viscosity(md.tg) + md.m.GlassQ/(cnt.Gas*math.Ln10)*(1/T-1/md.tg)
	}
	return v.Log10Viscosity(T)
}

// lnDiffusivity is ln D(T) of the mobility law, with the glassy branch
// of a viscosity law below T_g (Log10Viscosity).
func (md *Model) lnDiffusivity(T float64) float64 {
	if v, ok := md.m.Mobility.(viscous); ok && md.m.GlassQ > 0 && T < md.tg {
		return lnStokesEinstein(T, md.Log10Viscosity(T)*math.Ln10, v.stokesJump())
	}
	return md.m.Mobility.LnDiffusivity(T)
}

// errGlassQ is the error of a glass activation energy the model cannot use.
var errGlassQ = errors.New("GlassQ, the activation energy of the glass below Tg, needs a viscosity law (vft or wlf) and a glass transition Tg")

// checkGlassy is the check NewModel makes of the glassy branch.
func checkGlassy(m Material) error {
	if m.GlassQ == 0 {
		return nil
	}
	if err := positive("GlassQ", m.GlassQ); err != nil {
		return err
	}
	if _, ok := m.Mobility.(viscous); !ok || glassTransition(m) == 0 {
		return errGlassQ
	}
	return nil
}
