package kinetics

import (
	"fmt"
	"math"
	"strings"

	"undercool/cnt"
)

// ParamKeys are the inputs of a Material that a spread may vary, by the
// short key the material cards use.
var ParamKeys = []string{
	"te", "dh", "dcp", "vm", "gamma", "theta", "sites", "j0",
	"d0", "q", "vft_a", "vft_b", "vft_t0", "tg", "wlf_c1", "wlf_c2", "eta_g", "jump",
	"supersaturation", "sat_temp", "dh_sol", "solvent_viscosity", "solute_diffusivity", "number_conc",
}

// paramRange is where a parameter may lie: lo < x ≤ hi, or lo ≤ x ≤ hi
// with closedLo.
type paramRange struct {
	lo, hi   float64
	closedLo bool
	text     string
}

func (r paramRange) contains(x float64) bool {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return false
	}
	if r.closedLo {
		return x >= r.lo && x <= r.hi
	}
	return x > r.lo && x <= r.hi
}

var (
	anyRange      = paramRange{math.Inf(-1), math.Inf(1), true, "any finite value"}
	positiveRange = paramRange{0, math.Inf(1), false, "(0, ∞)"}
	nonNegRange   = paramRange{0, math.Inf(1), true, "[0, ∞)"}
	angleRange    = paramRange{0, 180, false, "(0, 180] degrees"}
)

func rangeOf(key string) paramRange {
	switch key {
	case "dcp", "vft_a":
		return anyRange
	case "q":
		return nonNegRange
	case "theta":
		return angleRange
	}
	return positiveRange
}

// IsMultiplicative reports whether a parameter is strictly positive and
// acts as a factor on a rate (d0, j0, sites, eta_g, and for solutions
// solvent_viscosity, solute_diffusivity and number_conc): its spread is
// log-normal. Every other parameter's spread is normal.
func IsMultiplicative(key string) bool {
	for _, k := range LogNormalKeys {
		if k == key {
			return true
		}
	}
	return false
}

// LogNormalKeys are the parameters for which IsMultiplicative holds.
var LogNormalKeys = []string{"d0", "j0", "sites", "eta_g", "solvent_viscosity", "solute_diffusivity", "number_conc"}

func knownParam(key string) bool {
	for _, k := range ParamKeys {
		if k == key {
			return true
		}
	}
	return false
}

// unknownParam is the error for a key that is not one of ParamKeys.
func unknownParam(key string) error {
	return fmt.Errorf("unknown parameter %q (known: %s)", key, strings.Join(ParamKeys, ", "))
}

// Param returns the value of a parameter of the material in SI units (te
// in K, dh in J/mol, gamma in J/m², theta in degrees, …). Where the
// material leaves a value to its default (sites, jump, theta) the default
// in use is returned. A parameter the material does not have (d0 with a
// VFT mobility, dh of a tabulated driving force) is an error naming it.
// An unknown key panics.
func (m Material) Param(key string) (float64, error) {
	if !knownParam(key) {
		panic("kinetics: Param: unknown key " + key)
	}
	missing := func(why string) (float64, error) {
		return math.NaN(), fmt.Errorf("%s: the material has no such value (%s)", key, why)
	}
	switch key {
	case "te", "dh", "dcp":
		var te, dh float64
		dcp := math.NaN()
		switch d := m.Driving.(type) {
		case cnt.Linear:
			te, dh = d.Te, d.DH
		case cnt.Hoffman:
			te, dh = d.Te, d.DH
		case cnt.ThompsonSpaepen:
			te, dh = d.Te, d.DH
		case cnt.ConstantCp:
			te, dh, dcp = d.Te, d.DH, d.DCp
		default:
			return missing("the driving force " + drivingName(m) + " is not written with te and dh")
		}
		switch key {
		case "te":
			return te, nil
		case "dh":
			return dh, nil
		}
		if math.IsNaN(dcp) {
			return missing("driving " + drivingName(m) + " has no heat-capacity term")
		}
		return dcp, nil
	case "vm":
		return m.Vm, nil
	case "gamma":
		return m.Gamma, nil
	case "theta":
		if m.Theta == 0 {
			return 180, nil
		}
		return m.Theta, nil
	case "sites":
		if m.Sites > 0 {
			return m.Sites, nil
		}
		return 1 / m.MolecularVolume(), nil
	case "j0":
		if m.Prefactor != PrefactorFixed {
			return missing("j0 is used only with prefactor fixed")
		}
		return m.J0, nil
	case "jump":
		return m.JumpDistance(), nil
	case "d0", "q":
		a, ok := m.Mobility.(Arrhenius)
		if !ok {
			return missing("mobility " + mobilityName(m) + ", not arrhenius")
		}
		if key == "d0" {
			return a.D0, nil
		}
		return a.Q, nil
	case "vft_a", "vft_b", "vft_t0":
		v, ok := m.Mobility.(VFT)
		if !ok {
			return missing("mobility " + mobilityName(m) + ", not vft")
		}
		switch key {
		case "vft_a":
			return v.A, nil
		case "vft_b":
			return v.B, nil
		}
		return v.T0, nil
	case "tg":
		if w, ok := m.Mobility.(WLF); ok {
			return w.Tg, nil
		}
		if m.Tg > 0 {
			return m.Tg, nil
		}
		return missing("no glass transition given")
	case "supersaturation":
		d, ok := m.Driving.(cnt.Supersaturation)
		if !ok {
			return missing("the driving force " + drivingName(m) + " is not a fixed supersaturation")
		}
		return d.S, nil
	case "sat_temp", "dh_sol":
		d, ok := m.Driving.(cnt.VantHoff)
		if !ok {
			return missing("the driving force " + drivingName(m) + " is not the van 't Hoff solubility law")
		}
		if key == "sat_temp" {
			return d.Tsat, nil
		}
		return d.DHsol, nil
	case "solvent_viscosity":
		v, ok := m.Mobility.(SolventViscosity)
		if !ok {
			return missing("mobility " + mobilityName(m) + ", not stokes-einstein")
		}
		return v.Eta, nil
	case "solute_diffusivity":
		v, ok := m.Mobility.(SoluteDiffusivity)
		if !ok {
			return missing("mobility " + mobilityName(m) + ", not diffusivity")
		}
		return v.D, nil
	case "number_conc":
		if m.Prefactor != PrefactorDiffusion {
			return missing("number_conc is used only with prefactor diffusion")
		}
		return m.Conc, nil
	default: // wlf_c1, wlf_c2, eta_g
		w, ok := m.Mobility.(WLF)
		if !ok {
			return missing("mobility " + mobilityName(m) + ", not wlf")
		}
		switch key {
		case "wlf_c1":
			return w.C1, nil
		case "wlf_c2":
			return w.C2, nil
		}
		return w.EtaG, nil
	}
}

func drivingName(m Material) string {
	if m.Driving == nil {
		return "none"
	}
	return m.Driving.Name()
}

func mobilityName(m Material) string {
	if m.Mobility == nil {
		return "none"
	}
	return m.Mobility.Name()
}

// WithParam returns a copy of the material with one parameter set to x
// (SI units, as Param gives them). The driving force and the mobility law
// are rebuilt around the new value; a viscosity law's jump distance
// follows a change of vm or jump when it was the material's own. The
// material must have the parameter (Param gives no error for it): it is a
// programming mistake otherwise, and panics.
func (m Material) WithParam(key string, x float64) Material {
	if _, err := m.Param(key); err != nil {
		panic("kinetics: WithParam: " + err.Error())
	}
	switch key {
	case "te", "dh", "dcp":
		set := func(te, dh *float64) {
			switch key {
			case "te":
				*te = x
			case "dh":
				*dh = x
			}
		}
		switch d := m.Driving.(type) {
		case cnt.Linear:
			set(&d.Te, &d.DH)
			m.Driving = d
		case cnt.Hoffman:
			set(&d.Te, &d.DH)
			m.Driving = d
		case cnt.ThompsonSpaepen:
			set(&d.Te, &d.DH)
			m.Driving = d
		case cnt.ConstantCp:
			set(&d.Te, &d.DH)
			if key == "dcp" {
				d.DCp = x
			}
			m.Driving = d
		}
	case "vm", "jump":
		old := m.JumpDistance()
		if key == "vm" {
			m.Vm = x
		} else {
			m.Jump = x
		}
		switch mob := m.Mobility.(type) {
		case VFT:
			if mob.Jump == old {
				mob.Jump = m.JumpDistance()
			}
			m.Mobility = mob
		case WLF:
			if mob.Jump == old {
				mob.Jump = m.JumpDistance()
			}
			m.Mobility = mob
		case SolventViscosity:
			if mob.Jump == old {
				mob.Jump = m.JumpDistance()
			}
			m.Mobility = mob
		}
	case "supersaturation":
		d := m.Driving.(cnt.Supersaturation)
		d.S = x
		m.Driving = d
	case "sat_temp", "dh_sol":
		d := m.Driving.(cnt.VantHoff)
		if key == "sat_temp" {
			d.Tsat = x
		} else {
			d.DHsol = x
		}
		m.Driving = d
	case "solvent_viscosity":
		v := m.Mobility.(SolventViscosity)
		v.Eta = x
		m.Mobility = v
	case "solute_diffusivity":
		m.Mobility = SoluteDiffusivity{D: x}
	case "number_conc":
		m.Conc = x
	case "gamma":
		m.Gamma = x
	case "theta":
		m.Theta = x
	case "sites":
		m.Sites = x
	case "j0":
		m.J0 = x
	case "d0", "q":
		a := m.Mobility.(Arrhenius)
		if key == "d0" {
			a.D0 = x
		} else {
			a.Q = x
		}
		m.Mobility = a
	case "vft_a", "vft_b", "vft_t0":
		v := m.Mobility.(VFT)
		switch key {
		case "vft_a":
			v.A = x
		case "vft_b":
			v.B = x
		default:
			v.T0 = x
		}
		m.Mobility = v
	case "tg":
		if w, ok := m.Mobility.(WLF); ok {
			w.Tg = x
			m.Mobility = w
		}
		if m.Tg > 0 {
			m.Tg = x
		}
	default: // wlf_c1, wlf_c2, eta_g
		w := m.Mobility.(WLF)
		switch key {
		case "wlf_c1":
			w.C1 = x
		case "wlf_c2":
			w.C2 = x
		default:
			w.EtaG = x
		}
		m.Mobility = w
	}
	return m
}

// ParamRangeText says where a parameter's values must lie, for messages.
func ParamRangeText(key string) string { return rangeOf(key).text }
