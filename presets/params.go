package presets

import "undercool/presets/units"

// Param is one numeric input of a material: its card key, the kinds of
// quantity it may be written as, and what it means. The same list gives the
// card keys and the command-line flags (key with '_' written '-').
type Param struct {
	Key   string
	Kinds []units.Kind
	About string
	Check check // the range a value must lie in
}

// check is the allowed range of a parameter.
type check int

const (
	anyValue    check = iota // any finite number
	positive                 // > 0
	nonNegative              // ≥ 0
	angle                    // 0 < θ ≤ 180 degrees
)

// Params are every numeric value a card may hold, in display order.
var Params = []Param{
	{"te", []units.Kind{units.Temperature}, "equilibrium temperature (melting point, liquidus or solvus)", positive},
	{"dh", []units.Kind{units.MolarEnergy, units.EnergyDensity}, "enthalpy of transformation, positive (per mole of the new phase, or per volume)", positive},
	{"dcp", []units.Kind{units.MolarHeatCapacity}, "heat-capacity difference between parent and new phase (driving cp)", anyValue},
	{"vm", []units.Kind{units.MolarVolume}, "molar volume of the new phase", positive},
	{"gamma", []units.Kind{units.InterfacialEnergy}, "interfacial energy between nucleus and parent", positive},
	{"theta", []units.Kind{units.Angle}, "contact angle on the substrate, 0 < θ ≤ 180 degrees (180 = homogeneous)", angle},
	{"sites", []units.Kind{units.NumberDensity}, "nucleation sites per volume, > 0; default 1/v, every molecule", positive},
	{"j0", []units.Kind{units.RateDensity}, "rate prefactor for prefactor fixed", positive},
	{"d0", []units.Kind{units.Diffusivity}, "Arrhenius pre-exponential diffusivity", positive},
	{"q", []units.Kind{units.MolarEnergy}, "Arrhenius activation energy", nonNegative},
	{"vft_a", []units.Kind{units.Dimensionless}, "VFT constant A, log10 of Pa s", anyValue},
	{"vft_b", []units.Kind{units.TemperatureDifference}, "VFT constant B", positive},
	{"vft_t0", []units.Kind{units.Temperature}, "VFT temperature T0, where the viscosity diverges", positive},
	{"tg", []units.Kind{units.Temperature}, "glass transition temperature", positive},
	{"wlf_c1", []units.Kind{units.Dimensionless}, "WLF constant C1, > 0; default 17.44", positive},
	{"wlf_c2", []units.Kind{units.TemperatureDifference}, "WLF constant C2, > 0; default 51.6", positive},
	{"eta_g", []units.Kind{units.Viscosity}, "viscosity at Tg for WLF, > 0; default 1e12", positive},
	{"jump", []units.Kind{units.Length}, "jump distance λ, > 0; default v^(1/3)", positive},
	// Crystallization from solution (driving solution).
	{"supersaturation", []units.Kind{units.Dimensionless}, "fixed supersaturation ratio S = c/c_sat, > 0 (S <= 1: no driving force)", positive},
	{"sat_temp", []units.Kind{units.Temperature}, "saturation temperature of the solution, where S = 1", positive},
	{"dh_sol", []units.Kind{units.MolarEnergy}, "enthalpy of dissolution, positive, for the ideal (van 't Hoff) solubility law", positive},
	{"conc", SolutionConcKinds, "solute concentration, in the units of the solubility table (mol/l, g/l, g/kg or a mole fraction)", positive},
	{"molar_mass", []units.Kind{units.MolarMass}, "molar mass of the solute, for vm = molar_mass/density", positive},
	{"density", []units.Kind{units.Density}, "density of the crystal, for vm = molar_mass/density", positive},
	{"solvent_viscosity", []units.Kind{units.Viscosity}, "solvent viscosity, for the Stokes-Einstein diffusivity of the solute (mobility stokes-einstein)", positive},
	{"solute_diffusivity", []units.Kind{units.Diffusivity}, "diffusivity of the solute in the solvent (mobility diffusivity)", positive},
	{"number_conc", []units.Kind{units.NumberDensity}, "solute molecules per volume, for prefactor diffusion (default from conc)", positive},
	{"growth_rate", []units.Kind{units.Velocity}, "measured crystal growth rate in the solution, for the polynuclear induction time", positive},
}

// SolutionConcKinds are the families a concentration or a solubility may be
// given in; a concentration and its solubility table must share one.
var SolutionConcKinds = []units.Kind{units.AmountConcentration, units.MassConcentration, units.MassRatio, units.Dimensionless}

// ParamByKey returns the parameter with a card key, and whether it exists.
func ParamByKey(key string) (Param, bool) {
	for _, p := range Params {
		if p.Key == key {
			return p, true
		}
	}
	return Param{}, false
}

// Choices are the model names a card or the command line may pick.
var (
	DrivingChoices   = []string{"linear", "hoffman", "thompson-spaepen", "cp", "table", "solution"}
	MobilityChoices  = []string{"arrhenius", "vft", "wlf", "none", "stokes-einstein", "diffusivity"}
	KindChoices      = []string{"metal", "glass", "molecular", "solution", "demo"}
	PrefactorChoices = []string{"attachment", "turnbull-fisher", "fixed", "diffusion"}
)
