package presets

import (
	"fmt"
	"strings"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/presets/units"
)

// DrivingColumns are the columns of a tabulated driving force.
var DrivingColumns = []Column{
	{Quantity: "temperature", Kind: units.Temperature, Required: true},
	{Quantity: "dg", Kind: units.MolarEnergy, Required: true},
}

// need returns the SI value of a required key or an error naming it.
func (c *Card) need(key, why string) (float64, error) {
	v, ok := c.Values[key]
	if !ok {
		return 0, fmt.Errorf("%s: missing value %q (%s); give it in the card or with --%s", c.File, key, why, strings.ReplaceAll(key, "_", "-"))
	}
	return v.SI, nil
}

// orDefault returns the SI value of key, or def when absent.
func (c *Card) orDefault(key string, def float64) float64 {
	if v, ok := c.Values[key]; ok {
		return v.SI
	}
	return def
}

// Material builds the kinetics material the card describes and checks it.
func (c *Card) Material() (*kinetics.Model, error) {
	m := kinetics.Material{Name: c.Name}
	var err error
	get := func(key, why string) float64 {
		if err != nil {
			return 0
		}
		var v float64
		v, err = c.need(key, why)
		return v
	}
	if vm, ok := c.massVolume(); ok && !c.Has("vm") {
		m.Vm = vm
	} else {
		m.Vm = get("vm", "molar volume (or molar_mass and density)")
	}
	m.Gamma = get("gamma", "interfacial energy")
	if err != nil {
		return nil, err
	}
	if c.Driving == "solution" {
		if err := c.solution(&m); err != nil {
			return nil, err
		}
	} else if c.Driving == "table" {
		d, err := ReadDataFile(c.DrivingFile, nil, DrivingColumns)
		if err != nil {
			return nil, err
		}
		tab, err := cnt.NewTable(d.Columns["temperature"], d.Columns["dg"], c.DrivingFile)
		if err != nil {
			return nil, fmt.Errorf("%s: %v", c.DrivingFile, err)
		}
		tab.Te = c.orDefault("te", 0)
		if _, ok := tab.Equilibrium(); !ok {
			if _, err := c.need("te", "the driving-force table never changes sign"); err != nil {
				return nil, err
			}
		}
		m.Driving = tab
	} else {
		te, dh := get("te", "equilibrium temperature"), get("dh", "enthalpy of transformation")
		if err != nil {
			return nil, err
		}
		if c.Values["dh"].Kind.Name == units.EnergyDensity.Name {
			dh *= m.Vm
		}
		switch c.Driving {
		case "linear":
			m.Driving = cnt.Linear{Te: te, DH: dh}
		case "hoffman":
			m.Driving = cnt.Hoffman{Te: te, DH: dh}
		case "thompson-spaepen":
			m.Driving = cnt.ThompsonSpaepen{Te: te, DH: dh}
		case "cp":
			m.Driving = cnt.ConstantCp{Te: te, DH: dh, DCp: get("dcp", "heat-capacity difference, for driving cp")}
		default:
			panic("presets: unknown driving " + c.Driving)
		}
		if !(dh > 0) {
			return nil, fmt.Errorf("%s: dh must be positive (the enthalpy released on transformation), got %s", c.File, c.Values["dh"].Text)
		}
	}
	m.Theta = c.orDefault("theta", 180)
	m.Sites = c.orDefault("sites", 0)
	m.J0 = c.orDefault("j0", 0)
	m.Jump = c.orDefault("jump", 0)
	m.Tg = c.orDefault("tg", 0)
	m.Growth = c.orDefault("growth_rate", 0)
	jump := m.JumpDistance()
	switch c.Mobility {
	case "arrhenius":
		m.Mobility = kinetics.Arrhenius{D0: get("d0", "Arrhenius pre-exponential"), Q: get("q", "Arrhenius activation energy")}
	case "vft":
		m.Mobility = kinetics.VFT{A: get("vft_a", "VFT A"), B: get("vft_b", "VFT B"), T0: get("vft_t0", "VFT T0"), Jump: jump}
	case "stokes-einstein":
		m.Mobility = kinetics.SolventViscosity{Eta: get("solvent_viscosity", "solvent viscosity, for Stokes-Einstein"), Jump: jump}
	case "diffusivity":
		m.Mobility = kinetics.SoluteDiffusivity{D: get("solute_diffusivity", "diffusivity of the solute")}
	case "wlf":
		m.Mobility = kinetics.WLF{Tg: get("tg", "glass transition, for WLF"), C1: c.orDefault("wlf_c1", kinetics.WLFC1),
			C2: c.orDefault("wlf_c2", kinetics.WLFC2), EtaG: c.orDefault("eta_g", kinetics.EtaAtTg), Jump: jump}
	}
	if err != nil {
		return nil, err
	}
	if c.Prefactor != "" {
		m.Prefactor, _ = kinetics.ParsePrefactor(c.Prefactor)
	}
	if m.Prefactor == kinetics.PrefactorDiffusion {
		if m.Conc, err = c.numberConc(); err != nil {
			return nil, err
		}
	}
	md, err := kinetics.NewModel(m)
	if err != nil {
		return nil, fmt.Errorf("%s: %v", c.File, err)
	}
	return md, nil
}
