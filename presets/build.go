package presets

import (
	"errors"
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/presets/units"
)

// drivingColumns are the columns of a tabulated driving force.
var drivingColumns = []Column{
	{Quantity: "temperature", Kind: units.Temperature, Required: true},
	{Quantity: "dg", Kind: units.MolarEnergy, Required: true},
}

// MissingError is a value a card's models need that it does not give.
type MissingError struct {
	File string // the card
	Key  string // the value's card key
	Why  string // what the value is, or what needs it
}

func (e *MissingError) Error() string {
	return fmt.Sprintf("%s: missing value %q (%s)", e.File, e.Key, e.Why)
}

// Model builds the kinetics model the card describes and checks it: the
// one path from values to a model, for a card as read and for every
// Monte Carlo sample of it (Vary). Errors name the card; a value the
// models need and the card lacks is a *MissingError.
func (c *Card) Model() (*kinetics.Model, error) {
	md, _, err := c.build()
	return md, err
}

// builder reads the values of a card and records those it read, with the
// defaults it took for the missing ones: the values a spread may vary.
type builder struct {
	c    *Card
	read map[string]float64 // SI
	err  error
}

// need is the SI value of a required key; a missing one sets the error.
func (b *builder) need(key, why string) float64 {
	v, ok := b.c.Values[key]
	if !ok {
		if b.err == nil {
			b.err = &MissingError{File: b.c.File, Key: key, Why: why}
		}
		return 0
	}
	b.read[key] = v.SI
	return v.SI
}

// opt is the SI value of key, or def when the card leaves it out.
func (b *builder) opt(key string, def float64) float64 {
	x := def
	if v, ok := b.c.Values[key]; ok {
		x = v.SI
	}
	b.read[key] = x
	return x
}

// given is the SI value of key, or 0 (the model's own default) without it.
func (b *builder) given(key string) float64 {
	if !b.c.Has(key) {
		return 0
	}
	return b.opt(key, 0)
}

// build makes the model and returns the values it read.
func (c *Card) build() (*kinetics.Model, map[string]float64, error) {
	b := &builder{c: c, read: map[string]float64{}}
	m := kinetics.Material{Name: c.Name}
	mob, pre := c.mobility(), c.Prefactor
	if pre == "turnbull-fisher" && mob != "arrhenius" {
		return nil, nil, fmt.Errorf("%s: %w", c.File, kinetics.ErrNoMobility)
	}
	if vm, ok := c.massVolume(); ok && !c.Has("vm") {
		m.Vm = vm
		b.read["molar_mass"], b.read["density"] = c.SI("molar_mass"), c.SI("density")
	} else {
		m.Vm = b.need("vm", "molar volume (or molar_mass and density)")
	}
	m.Gamma = b.need("gamma", "interfacial energy")
	if b.err != nil {
		return nil, nil, b.err
	}
	b.gammaLaw(&m)
	var err error
	if m.Driving, err = b.driving(m.Vm); err != nil {
		return nil, nil, err
	}
	m.Theta = b.opt("theta", 180)
	if m.Sites, err = b.sites(m.Vm); err != nil {
		return nil, nil, err
	}
	m.Jump = b.given("jump")
	m.Tg = b.given("tg")
	m.Growth = b.given("growth_rate")
	jump := m.JumpDistance()
	switch mob {
	case "arrhenius":
		m.Mobility = kinetics.Arrhenius{D0: b.need("d0", "Arrhenius pre-exponential"), Q: b.need("q", "Arrhenius activation energy")}
	case "vft":
		m.Mobility = kinetics.VFT{A: b.need("vft_a", "VFT A"), B: b.need("vft_b", "VFT B"), T0: b.need("vft_t0", "VFT T0"), Jump: jump}
	case "stokes-einstein":
		m.Mobility = kinetics.SolventViscosity{Eta: b.need("solvent_viscosity", "solvent viscosity, for Stokes-Einstein"), Jump: jump}
	case "diffusivity":
		m.Mobility = kinetics.SoluteDiffusivity{D: b.need("solute_diffusivity", "diffusivity of the solute")}
	case "wlf":
		m.Mobility = kinetics.WLF{Tg: b.need("tg", "glass transition, for WLF"), C1: b.opt("wlf_c1", kinetics.WLFC1),
			C2: b.opt("wlf_c2", kinetics.WLFC2), EtaG: b.opt("eta_g", kinetics.EtaAtTg), Jump: jump}
	}
	m.GlassQ = b.given("glass_q")
	if m.GrowthLaw, err = b.growth(); err != nil {
		return nil, nil, err
	}
	if b.err != nil {
		return nil, nil, b.err
	}
	// The calibrated range is where the card holds, not a value of the
	// physics: it is not recorded, so no spread may vary it.
	m.CalibratedLo, m.CalibratedHi = c.SI("calibrated_t_min"), c.SI("calibrated_t_max")
	for _, k := range [2]string{"calibrated_t_min", "calibrated_t_max"} {
		if !c.Has(k) && (c.Has("calibrated_t_min") || c.Has("calibrated_t_max")) {
			return nil, nil, &MissingError{File: c.File, Key: k, Why: "the calibrated range needs both ends"}
		}
	}
	if pre != "" {
		m.Prefactor, _ = kinetics.ParsePrefactor(pre)
	}
	switch m.Prefactor {
	case kinetics.PrefactorFixed:
		if m.J0 = b.need("j0", "the rate prefactor, for prefactor fixed"); b.err != nil {
			return nil, nil, b.err
		}
	case kinetics.PrefactorDiffusion:
		if m.Conc, err = b.numberConc(); err != nil {
			return nil, nil, err
		}
	}
	md, err := kinetics.NewModel(m)
	if err != nil {
		return nil, nil, fmt.Errorf("%s: %w", c.File, err)
	}
	// The defaults of the model itself, as the bases of their spreads.
	if !c.Has("sites") && !c.Has("particle_density") {
		b.read["sites"] = 1 / md.MolecularVolume()
	}
	if !c.Has("jump") {
		b.read["jump"] = md.JumpDistance()
	}
	if g, ok := md.Material().GrowthLaw.(kinetics.ViscosityPower); ok && !c.Has("growth_ug") {
		b.read["growth_ug"] = g.Ug
	}
	return md, b.read, nil
}

// sites is the density of nucleation sites: sites as given, or from
// particles of a second phase (particle_density and particle_radius, one
// site per molecule of volume v = vm/N_A on their surface,
// cnt.SitesOnParticles), or 0 (the model's default, every molecule).
func (b *builder) sites(vm float64) (float64, error) {
	c := b.c
	n, r := c.Has("particle_density"), c.Has("particle_radius")
	switch {
	case !n && !r:
		return b.given("sites"), nil
	case c.Has("sites"):
		return 0, fmt.Errorf("%s: sites %s and particle_density, particle_radius both give the site density; give one or the other", c.File, c.Values["sites"].Text)
	case !n:
		return 0, &MissingError{File: c.File, Key: "particle_density", Why: "the number of substrate particles per volume, with particle_radius"}
	case !r:
		return 0, &MissingError{File: c.File, Key: "particle_radius", Why: "the radius of the substrate particles, with particle_density"}
	}
	radius := b.opt("particle_radius", 0)
	return cnt.SitesOnParticles(b.opt("particle_density", 0), 4*math.Pi*radius*radius, vm/cnt.Avogadro), nil
}

// gammaLaw reads the interfacial-energy law of the card into m.
func (b *builder) gammaLaw(m *kinetics.Material) {
	switch b.c.Choice("gamma_law") {
	case "linear":
		m.GammaLaw = kinetics.GammaLinear
		m.GammaTRef = b.need("gamma_t_ref", "the temperature gamma is given at, for gamma_law linear")
		m.GammaSlope = b.need("gamma_slope", "dgamma/dT, for gamma_law linear")
	case "negentropic":
		m.GammaLaw = kinetics.GammaNegentropic
		m.GammaTRef = b.need("gamma_t_ref", "the temperature gamma is given at, for gamma_law negentropic")
	}
}

// growth is the growth law of the card; nil for normal growth.
func (b *builder) growth() (kinetics.GrowthLaw, error) {
	switch b.c.Choice("growth") {
	case "viscosity-power":
		return kinetics.ViscosityPower{Ug: b.given("growth_ug"), Xi: b.opt("growth_xi", 1)}, nil
	case "arrhenius":
		return kinetics.ArrheniusGrowth{U0: b.need("growth_u0", "pre-exponential of growth, for growth arrhenius"), Q: b.need("growth_q", "activation energy of growth, for growth arrhenius")}, nil
	case "table":
		return b.c.growthTable()
	}
	return nil, nil
}

// driving is the driving force of the card, for a molar volume vm.
func (b *builder) driving(vm float64) (cnt.DrivingForce, error) {
	c := b.c
	switch c.Driving {
	case "solution":
		return b.solution()
	case "dilute":
		return b.dilute()
	case "table":
		t, err := c.drivingTable()
		if err != nil {
			return nil, err
		}
		tab := *t // the card's copy is shared by its samples
		tab.Te = b.given("te")
		if _, ok := tab.Equilibrium(); !ok {
			b.need("te", "the driving-force table never changes sign")
			return nil, b.err
		}
		return &tab, nil
	}
	te, dh := b.need("te", "equilibrium temperature"), b.need("dh", "enthalpy of transformation")
	var dcp float64
	if c.Driving == "cp" {
		dcp = b.need("dcp", "heat-capacity difference, for driving cp")
	}
	if b.err != nil {
		return nil, b.err
	}
	if c.Values["dh"].Kind.Name == units.EnergyDensity.Name {
		dh *= vm
	}
	if !(dh > 0) {
		return nil, fmt.Errorf("%s: dh must be positive (the enthalpy released on transformation), got %s", c.File, c.Values["dh"].Text)
	}
	switch c.Driving {
	case "linear":
		return cnt.Linear{Te: te, DH: dh}, nil
	case "hoffman":
		return cnt.Hoffman{Te: te, DH: dh}, nil
	case "thompson-spaepen":
		return cnt.ThompsonSpaepen{Te: te, DH: dh}, nil
	case "cp":
		return cnt.ConstantCp{Te: te, DH: dh, DCp: dcp}, nil
	}
	panic("presets: unknown driving " + c.Driving)
}

// mobility is the card's mobility law, or for a card without one the law
// its values belong to (the first value in Params order that only one law
// reads), "none" without any.
func (c *Card) mobility() string { return c.Choice("mobility") }

// Choice is the card's choice on a model axis (mobility, gamma_law,
// growth): as written, or for a card without one the choice its values
// belong to (the first value in Params order that only one choice reads),
// or the axis's default (none, constant, normal).
func (c *Card) Choice(axis string) string {
	var given, none string
	switch axis {
	case "mobility":
		given, none = c.Mobility, "none"
	case "gamma_law":
		given, none = c.GammaLaw, "constant"
	case "growth":
		given, none = c.Growth, "normal"
	default:
		panic("presets: no model axis " + axis)
	}
	if given != "" {
		return given
	}
	for _, p := range Params {
		if p.For.Axis == axis && c.Has(p.Key) {
			return p.For.Name
		}
	}
	return none
}

// tables are the data files a card names, read once: every sample of a
// Monte Carlo run builds its model from the same card.
type tables struct {
	drivingFile string
	driving     *cnt.Table
	solFile     string
	sol         *solubilityData
	growthFile  string
	growth      *kinetics.GrowthTable
}

// growthColumns are the columns of a measured growth-rate table.
var growthColumns = []Column{
	{Quantity: "temperature", Kind: units.Temperature, Required: true},
	{Quantity: "growth_rate", Kind: units.Velocity, Required: true},
}

// growthTable is the card's measured growth rate, read on first use.
func (c *Card) growthTable() (*kinetics.GrowthTable, error) {
	if c.tables == nil {
		c.tables = &tables{}
	}
	t := c.tables
	if t.growth != nil && t.growthFile == c.GrowthFile {
		return t.growth, nil
	}
	d, err := ReadDataFile(c.GrowthFile, nil, growthColumns)
	if err != nil {
		return nil, err
	}
	g, err := kinetics.NewGrowthTable(d.Columns["temperature"], d.Columns["growth_rate"], c.GrowthFile)
	if err != nil {
		var pe *kinetics.PointError
		if errors.As(err, &pe) && pe.Index < len(d.Lines) {
			return nil, fmt.Errorf("%s:%d: %s", c.GrowthFile, d.Lines[pe.Index], pe.Msg)
		}
		return nil, fmt.Errorf("%s: %v", c.GrowthFile, err)
	}
	t.growthFile, t.growth = c.GrowthFile, g
	return g, nil
}

// drivingTable is the card's tabulated driving force, read on first use.
func (c *Card) drivingTable() (*cnt.Table, error) {
	if c.tables == nil {
		c.tables = &tables{}
	}
	t := c.tables
	if t.driving != nil && t.drivingFile == c.DrivingFile {
		return t.driving, nil
	}
	d, err := ReadDataFile(c.DrivingFile, nil, drivingColumns)
	if err != nil {
		return nil, err
	}
	tab, err := cnt.NewTable(d.Columns["temperature"], d.Columns["dg"], c.DrivingFile)
	if err != nil {
		return nil, fmt.Errorf("%s: %v", c.DrivingFile, err)
	}
	t.drivingFile, t.driving = c.DrivingFile, tab
	return tab, nil
}

// errNoNumberConc is the error of a diffusion prefactor without a way to
// count the solute molecules per volume.
var errNoNumberConc = errors.New("the diffusion prefactor needs the number of solute molecules per volume: number_conc, or conc as an amount concentration (mol/l), or as a mass concentration (g/l) with molar_mass")
