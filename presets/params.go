package presets

import (
	"fmt"
	"math"
	"strings"

	"undercool/kinetics"
	"undercool/kinetics/sample"
	"undercool/presets/units"
)

// Param is one numeric value of a material, defined once. The card key,
// the command-line flag (Flag), the help text, the parsing and range check
// of cards and flags, the spread a Monte Carlo run draws it from and the
// card printer all come from this entry; Build says what it does in the
// model. A new value is one entry in Params and its use in Build.
type Param struct {
	Key   string       // card key, snake_case
	Kinds []units.Kind // the kinds of quantity it may be written as; the first is its own
	About string       // what it means, lower case, for help, cards and memos
	Range Range        // where a value must lie
	// Spread is how a spread of the value is drawn by default: log-normal
	// for a factor on a rate (its median the value), normal otherwise.
	Spread sample.Distribution
	Group  string // the help group: material, mobility, prefactor, growth, solution, alloy or crystallizer
	// For is the model choice that reads the value; zero for a value more
	// than one model reads. Giving a value of the solution driving force on
	// the command line chooses that driving force, and a card without a
	// mobility law takes the law its values belong to.
	For Choice
}

// Flag is the command-line flag of the value: its key with '_' written '-'.
func (p Param) Flag() string { return strings.ReplaceAll(p.Key, "_", "-") }

// Units names the SI units the value may be given in, for help: "K", or
// "J/mol or J/m3".
func (p Param) Units() string {
	var out []string
	for _, k := range p.Kinds {
		if k.SI != "" {
			out = append(out, k.SI)
		}
	}
	return strings.Join(out, " or ")
}

// Choice is one model choice of a card: its axis and its name.
type Choice struct {
	Axis string // "driving", "mobility", "prefactor", "gamma_law" or "growth"
	Name string // one of the axis's choices, e.g. "vft"
}

// Range is where a value must lie: Lo < x ≤ Hi, or Lo ≤ x ≤ Hi with
// ClosedLo; never NaN or ±Inf.
type Range struct {
	Lo, Hi   float64
	ClosedLo bool
	Text     string // the range for messages: "(0, ∞)"
	Must     string // what a value outside it is told: "must be positive"
}

// The ranges of the values.
var (
	anyFinite   = Range{math.Inf(-1), math.Inf(1), true, "any finite value", "must be finite"}
	positive    = Range{0, math.Inf(1), false, "(0, ∞)", "must be positive"}
	nonNegative = Range{0, math.Inf(1), true, "[0, ∞)", "must not be negative"}
	angle       = Range{0, 180, false, "(0, 180] degrees", "must lie in (0, 180] degrees"}
	fraction    = Range{0, 1, false, "(0, 1]", "must lie in (0, 1] as a mole fraction"}
)

// Contains reports whether x lies in the range.
func (r Range) Contains(x float64) bool {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return false
	}
	if r.ClosedLo {
		return x >= r.Lo && x <= r.Hi
	}
	return x > r.Lo && x <= r.Hi
}

func (r Range) String() string { return r.Text }

// check is nil for a value in the range, else an error on the text as written.
func (r Range) check(x float64, text string) error {
	if r.Contains(x) {
		return nil
	}
	return fmt.Errorf("%s %s", units.Quote(text), r.Must)
}

var (
	normal    = sample.Normal
	logNormal = sample.LogNormal
	mobility  = func(name string) Choice { return Choice{"mobility", name} }
	solution  = Choice{"driving", "solution"}
	dilute    = Choice{"driving", "dilute"}
)

// Params are every numeric value a card may hold, in display order.
var Params = []Param{
	{"te", []units.Kind{units.Temperature}, "equilibrium temperature (melting point, liquidus or solvus)", positive, normal, "material", Choice{}},
	{"dh", []units.Kind{units.MolarEnergy, units.EnergyDensity}, "enthalpy of transformation, positive (per mole of the new phase, or per volume)", positive, normal, "material", Choice{}},
	{"dcp", []units.Kind{units.MolarHeatCapacity}, "heat-capacity difference between parent and new phase (driving cp)", anyFinite, normal, "material", Choice{"driving", "cp"}},
	{"vm", []units.Kind{units.MolarVolume}, "molar volume of the new phase", positive, normal, "material", Choice{}},
	{"gamma", []units.Kind{units.InterfacialEnergy}, "interfacial energy between nucleus and parent", positive, normal, "material", Choice{}},
	{"theta", []units.Kind{units.Angle}, "contact angle on the substrate, 0 < θ ≤ 180 degrees (180 = homogeneous)", angle, normal, "material", Choice{}},
	{"sites", []units.Kind{units.NumberDensity}, "nucleation sites per volume, > 0; default 1/v, every molecule (for theta < 180 an upper bound: give sites, or particle_density and particle_radius)", positive, logNormal, "material", Choice{}},
	{"particle_density", []units.Kind{units.NumberDensity}, "substrate particles per volume, > 0, with particle_radius: sites = particles x 4 pi r^2 / v^(2/3), one per molecule on their surface", positive, logNormal, "material", Choice{}},
	{"particle_radius", []units.Kind{units.Length}, "radius of the substrate particles, > 0, with particle_density", positive, normal, "material", Choice{}},
	{"j0", []units.Kind{units.RateDensity}, "rate prefactor for prefactor fixed", positive, logNormal, "prefactor", Choice{"prefactor", "fixed"}},
	{"d0", []units.Kind{units.Diffusivity}, "Arrhenius pre-exponential diffusivity", positive, logNormal, "mobility", mobility("arrhenius")},
	{"q", []units.Kind{units.MolarEnergy}, "Arrhenius activation energy", nonNegative, normal, "mobility", mobility("arrhenius")},
	{"vft_a", []units.Kind{units.Dimensionless}, "VFT constant A, log10 of Pa s", anyFinite, normal, "mobility", mobility("vft")},
	{"vft_b", []units.Kind{units.TemperatureDifference}, "VFT constant B", positive, normal, "mobility", mobility("vft")},
	{"vft_t0", []units.Kind{units.Temperature}, "VFT temperature T0, where the viscosity diverges", positive, normal, "mobility", mobility("vft")},
	{"tg", []units.Kind{units.Temperature}, "glass transition temperature", positive, normal, "material", Choice{}},
	{"wlf_c1", []units.Kind{units.Dimensionless}, "WLF constant C1, > 0; default 17.44", positive, normal, "mobility", mobility("wlf")},
	{"wlf_c2", []units.Kind{units.TemperatureDifference}, "WLF constant C2, > 0; default 51.6", positive, normal, "mobility", mobility("wlf")},
	{"eta_g", []units.Kind{units.Viscosity}, "viscosity at Tg for WLF, > 0; default 1e12", positive, logNormal, "mobility", mobility("wlf")},
	{"jump", []units.Kind{units.Length}, "jump distance λ, > 0; default v^(1/3)", positive, normal, "material", Choice{}},
	// Crystallization from solution (driving solution).
	{"supersaturation", []units.Kind{units.Dimensionless}, "fixed supersaturation ratio S = c/c_sat, > 0 (S <= 1: no driving force)", positive, normal, "solution", solution},
	{"sat_temp", []units.Kind{units.Temperature}, "saturation temperature of the solution, where S = 1", positive, normal, "solution", solution},
	{"dh_sol", []units.Kind{units.MolarEnergy}, "enthalpy of dissolution, positive, for the ideal (van 't Hoff) solubility law", positive, normal, "solution", solution},
	{"conc", concKinds, "solute concentration, in the units of the solubility table (mol/l, g/l, g/kg or a mole fraction)", positive, normal, "solution", solution},
	{"molar_mass", []units.Kind{units.MolarMass}, "molar mass of the solute, for vm = molar_mass/density", positive, normal, "solution", Choice{}},
	{"density", []units.Kind{units.Density}, "density of the crystal, for vm = molar_mass/density", positive, normal, "solution", Choice{}},
	{"solvent_viscosity", []units.Kind{units.Viscosity}, "solvent viscosity, for the Stokes-Einstein diffusivity of the solute (mobility stokes-einstein)", positive, logNormal, "solution", mobility("stokes-einstein")},
	{"solute_diffusivity", []units.Kind{units.Diffusivity}, "diffusivity of the solute in the solvent (mobility diffusivity)", positive, logNormal, "solution", mobility("diffusivity")},
	{"number_conc", []units.Kind{units.NumberDensity}, "solute molecules per volume, for prefactor diffusion (default from conc)", positive, logNormal, "solution", Choice{"prefactor", "diffusion"}},
	{"growth_rate", []units.Kind{units.Velocity}, "measured crystal growth rate in the solution, for the polynuclear induction time", positive, logNormal, "solution", Choice{}},
	// Precipitation from a dilute solid solution (driving dilute) and the
	// size classes of evolve: an ageing alloy, a batch crystallizer.
	{"c0", []units.Kind{units.MoleFraction}, "solute mole fraction of the alloy, 0 < c0 < cp (e.g. 0.0018 or 0.18 at%)", fraction, normal, "alloy", dilute},
	{"cp", []units.Kind{units.MoleFraction}, "solute mole fraction of the precipitate, c0 < cp <= 1 (0.25 for an A3B phase)", fraction, normal, "alloy", dilute},
	{"solvus_a", []units.Kind{units.Dimensionless}, "solvus constant A of ln c_eq = A - B/T, c_eq the solute mole fraction the matrix holds", anyFinite, normal, "alloy", dilute},
	{"solvus_b", []units.Kind{units.TemperatureDifference}, "solvus constant B of ln c_eq = A - B/T", positive, normal, "alloy", dilute},
	{"lattice", []units.Kind{units.Length}, "lattice parameter a of the precipitate, for the attachment rate 4 pi r*^2 D c/a^4 of evolve; default v^(1/3)", positive, normal, "alloy", Choice{}},
	{"growth_kg", []units.Kind{units.Velocity}, "crystal growth constant k_g of G = k_g (S - 1)^g (evolve; without it growth is diffusion-limited)", positive, logNormal, "crystallizer", Choice{}},
	{"growth_order", []units.Kind{units.Dimensionless}, "growth order g of G = k_g (S - 1)^g, 0 to 10; default 1", nonNegative, normal, "crystallizer", Choice{}},
	{"kv", []units.Kind{units.Dimensionless}, "volume shape factor k_v of a crystal, volume = k_v L^3; default pi/6 (a sphere of diameter L)", positive, normal, "crystallizer", Choice{}},
	{"seed_mass", []units.Kind{units.MassConcentration}, "seed crystals charged, mass per volume of solvent (evolve)", positive, normal, "crystallizer", Choice{}},
	{"seed_size", []units.Kind{units.Length}, "size L of the seed crystals (evolve)", positive, normal, "crystallizer", Choice{}},
	// The interface law, the glassy state, growth calibrated on its own and
	// the range a card was calibrated on.
	{"gamma_t_ref", []units.Kind{units.Temperature}, "temperature at which gamma is given, for gamma_law linear or negentropic", positive, normal, "material", Choice{}},
	{"gamma_slope", []units.Kind{units.InterfacialEnergySlope}, "dgamma/dT of gamma_law linear, gamma(T) = gamma + gamma_slope (T - gamma_t_ref)", anyFinite, normal, "material", Choice{"gamma_law", "linear"}},
	{"glass_q", []units.Kind{units.MolarEnergy}, "activation energy of the viscosity below Tg, the Arrhenius continuation of the viscosity law from Tg in the glass", positive, normal, "mobility", Choice{}},
	{"growth_ug", []units.Kind{units.Velocity}, "kinetic coefficient of growth at Tg, for growth viscosity-power; default the Stokes-Einstein value", positive, logNormal, "growth", Choice{"growth", "viscosity-power"}},
	{"growth_xi", []units.Kind{units.Dimensionless}, "decoupling exponent xi of growth viscosity-power, u ~ (1/eta)^xi, > 0; default 1", positive, normal, "growth", Choice{"growth", "viscosity-power"}},
	{"growth_u0", []units.Kind{units.Velocity}, "pre-exponential of the kinetic coefficient, for growth arrhenius", positive, logNormal, "growth", Choice{"growth", "arrhenius"}},
	{"growth_q", []units.Kind{units.MolarEnergy}, "activation energy of the kinetic coefficient, for growth arrhenius", nonNegative, normal, "growth", Choice{"growth", "arrhenius"}},
	{"calibrated_t_min", []units.Kind{units.Temperature}, "lowest temperature the card was calibrated on; answers below it are flagged", positive, normal, "material", Choice{}},
	{"calibrated_t_max", []units.Kind{units.Temperature}, "highest temperature the card was calibrated on; answers above it are flagged", positive, normal, "material", Choice{}},
}

// concKinds are the families a concentration or a solubility may be
// given in; a concentration and its solubility table must share one.
var concKinds = []units.Kind{units.AmountConcentration, units.MassConcentration, units.MassRatio, units.Dimensionless}

// ParamByKey returns the parameter with a card key, and whether it exists.
func ParamByKey(key string) (Param, bool) {
	for _, p := range Params {
		if p.Key == key {
			return p, true
		}
	}
	return Param{}, false
}

// paramKeys are the keys of Params, in order.
func paramKeys() []string {
	out := make([]string, len(Params))
	for i, p := range Params {
		out[i] = p.Key
	}
	return out
}

// LogNormalKeys are the keys of the values whose spread is log-normal, in order.
func LogNormalKeys() []string {
	var out []string
	for _, p := range Params {
		if p.Spread == sample.LogNormal {
			out = append(out, p.Key)
		}
	}
	return out
}

// Choices are the model names a card or the command line may pick.
var (
	DrivingChoices   = []string{"linear", "hoffman", "thompson-spaepen", "cp", "table", "solution", "dilute"}
	MobilityChoices  = []string{"arrhenius", "vft", "wlf", "none", "stokes-einstein", "diffusivity"}
	KindChoices      = []string{"metal", "glass", "molecular", "solution", "demo"}
	PrefactorChoices = []string{"attachment", "turnbull-fisher", "fixed", "diffusion"}
	GammaLawChoices  = kinetics.GammaLawNames()
	// GrowthChoices are the growth laws: normal (from the mobility law),
	// viscosity-power, arrhenius, or a measured table (a file).
	GrowthChoices = []string{"normal", "viscosity-power", "arrhenius", "table"}
)
