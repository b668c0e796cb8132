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
	{"sites", []units.Kind{units.NumberDensity}, "nucleation sites per volume (default 1/v, every molecule)", positive},
	{"j0", []units.Kind{units.RateDensity}, "rate prefactor for prefactor fixed", positive},
	{"d0", []units.Kind{units.Diffusivity}, "Arrhenius pre-exponential diffusivity", positive},
	{"q", []units.Kind{units.MolarEnergy}, "Arrhenius activation energy", nonNegative},
	{"vft_a", []units.Kind{units.Dimensionless}, "VFT constant A, log10 of Pa s", anyValue},
	{"vft_b", []units.Kind{units.TemperatureDifference}, "VFT constant B", positive},
	{"vft_t0", []units.Kind{units.Temperature}, "VFT temperature T0, where the viscosity diverges", positive},
	{"tg", []units.Kind{units.Temperature}, "glass transition temperature", positive},
	{"wlf_c1", []units.Kind{units.Dimensionless}, "WLF constant C1 (default 17.44)", positive},
	{"wlf_c2", []units.Kind{units.TemperatureDifference}, "WLF constant C2 (default 51.6 K)", positive},
	{"eta_g", []units.Kind{units.Viscosity}, "viscosity at Tg for WLF (default 1e12 Pa s)", positive},
	{"jump", []units.Kind{units.Length}, "jump distance λ (default v^(1/3))", positive},
}

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
	DrivingChoices   = []string{"linear", "hoffman", "thompson-spaepen", "cp", "table"}
	MobilityChoices  = []string{"arrhenius", "vft", "wlf", "none"}
	KindChoices      = []string{"metal", "glass", "molecular", "solution", "demo"}
	PrefactorChoices = []string{"attachment", "turnbull-fisher", "fixed"}
)
