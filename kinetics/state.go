package kinetics

import (
	"math"

	"undercool/cnt"
)

// Flag marks a result that lies outside the range where the model is sound.
type Flag uint

const (
	// FlagNoDrivingForce: at or above T_e (or S ≤ 1) there is no driving
	// force; no nucleus, zero rate.
	FlagNoDrivingForce Flag = 1 << iota
	// FlagSmallNucleus: n* below SmallNucleus molecules; CNT's continuum
	// picture does not hold there.
	FlagSmallNucleus
	// FlagLowBarrier: ΔG* below LowBarrier·k_BT; the steady-state
	// expansion behind Z is poor and the rate is of the order of its prefactor.
	FlagLowBarrier
	// FlagNoMobility: below the VFT T0 (or the WLF divergence) there is no mobility.
	FlagNoMobility
	// FlagWLFFarAboveTg: WLF used more than wlfRange above T_g, outside its fitted range.
	FlagWLFFarAboveTg
	// FlagOutsideTable: the temperature lies outside a tabulated driving force.
	FlagOutsideTable
	// FlagBelowTgLiquid: below T_g with a viscosity law and no glassy
	// branch: the equilibrium (liquid) law is extrapolated into the glass.
	FlagBelowTgLiquid
	// FlagBelowTgGlassy: below T_g with a viscosity law, on the Arrhenius
	// branch of the glass (Material.GlassQ).
	FlagBelowTgGlassy
	// FlagOutsideCalibrated: outside the range of temperatures the material
	// was calibrated on (Material.CalibratedLo, CalibratedHi).
	FlagOutsideCalibrated
	// FlagOutsideGrowthTable: outside a measured growth-rate table; the
	// growth rate is taken as zero there.
	FlagOutsideGrowthTable
	// FlagGammaNotPositive: the interfacial-energy law gives γ(T) ≤ 0; no
	// nucleus and no rate.
	FlagGammaNotPositive
	// FlagDefaultSites: nucleation on a substrate (θ < 180°) with no site
	// density given, so every molecule counts as a site (see DefaultSites).
	FlagDefaultSites
)

// Limits behind the validity flags (common practice).
const (
	SmallNucleus = 10.0  // molecules
	LowBarrier   = 5.0   // k_BT
	wlfRange     = 100.0 // K above T_g
)

var flagNames = []struct {
	f          Flag
	key, about string
}{
	{FlagNoDrivingForce, "no_driving_force", "no driving force at or above the equilibrium temperature"},
	{FlagSmallNucleus, "small_nucleus", "critical nucleus below 10 molecules: outside the range of CNT"},
	{FlagLowBarrier, "low_barrier", "barrier below 5 kT: steady-state CNT is unreliable"},
	{FlagNoMobility, "no_mobility", "below the temperature where the viscosity law diverges: no mobility"},
	{FlagWLFFarAboveTg, "wlf_far_above_tg", "WLF used more than 100 K above Tg"},
	{FlagOutsideTable, "outside_table", "outside the tabulated driving force"},
	{FlagBelowTgLiquid, "below_tg_liquid_law", "below Tg, in the glass: the liquid's viscosity law is extrapolated there (no glass_q on the card), an uncertain branch"},
	{FlagBelowTgGlassy, "below_tg_glassy", "below Tg, in the glass: viscosity from the Arrhenius continuation from Tg with the card's glass_q"},
	{FlagOutsideCalibrated, "outside_calibrated_range", "outside the range the card was calibrated on"},
	{FlagOutsideGrowthTable, "outside_growth_table", "outside the measured growth-rate table: growth taken as zero there"},
	{FlagGammaNotPositive, "gamma_not_positive", "the interfacial-energy law gives gamma <= 0: no nucleus, no rate"},
	{FlagDefaultSites, "default_sites", "heterogeneous nucleation with no site density given: every molecule counted as a site, an upper bound"},
}

// Keys returns the snake_case names of the set flags, in a fixed order.
func (f Flag) Keys() []string {
	var out []string
	for _, n := range flagNames {
		if f&n.f != 0 {
			out = append(out, n.key)
		}
	}
	return out
}

// Descriptions returns one sentence for each set flag, in a fixed order.
func (f Flag) Descriptions() []string {
	var out []string
	for _, n := range flagNames {
		if f&n.f != 0 {
			out = append(out, n.about)
		}
	}
	return out
}

// State is everything the model says at one temperature.
type State struct {
	T            float64     // K
	Undercooling float64     // T_e − T, K
	DrivingMole  float64     // Δg, J/mol (≤ 0: none)
	Dmu          float64     // Δμ per molecule, J
	Nucleus      cnt.Nucleus // critical nucleus (+Inf sizes when none)
	LnD          float64     // ln D, D in m²/s (NaN: no mobility law)
	LnBeta       float64     // ln β*, 1/s (NaN: not defined)
	LnJ          float64     // ln J, J in m⁻³·s⁻¹ (−Inf: no nucleation; NaN: no rate model, or outside a tabulated driving force)
	Growth       float64     // u, m/s (NaN: no mobility law)
	Flags        Flag

	lnU float64 // ln u, computed in logs (see Model.lnGrowth)
}

// DrivingVolume is Δg per unit volume of the new phase, J/m³.
func (s State) DrivingVolume(vm float64) float64 { return s.DrivingMole / vm }

// Log10J is log10 of the rate.
func (s State) Log10J() float64 { return s.LnJ / math.Ln10 }

// TimeLag is the time lag of nucleation θ = 2/(3π·Z²·β*), s (see
// cnt.LnTimeLag): NaN without a mobility law or outside a tabulated driving
// force, +Inf where there is no driving force (nothing nucleates).
func (s State) TimeLag() float64 {
	if math.IsNaN(s.Growth) {
		return math.NaN()
	}
	if !(s.Dmu > 0) {
		return math.Inf(1)
	}
	return cnt.TimeLag(s.Nucleus.Zeldovich, s.LnBeta)
}

// At evaluates the model at temperature T (K, > 0).
func (md *Model) At(T float64) State {
	s := md.state(T, true)
	s.Flags |= md.flags(s)
	return s
}

// state is At without the validity flags, for the paths that need only
// ln J and ln u (see lnRateAndGrowth); without growth it leaves the growth
// rate u itself NaN where it would be computed from ln u's parts (the path
// integral reads ln u).
func (md *Model) state(T float64, growth bool) State {
	s := State{T: T, Undercooling: md.te - T, LnD: math.NaN(), LnBeta: math.NaN(), LnJ: math.NaN(), Growth: math.NaN(), lnU: math.NaN()}
	kT := cnt.Boltzmann * T
	s.DrivingMole = md.m.Driving.PerMole(T)
	if math.IsNaN(s.DrivingMole) {
		s.Nucleus = cnt.Critical(0, 0, 0, 0, T)
		return s
	}
	s.Dmu = s.DrivingMole / cnt.Avogadro
	gamma := md.m.GammaAt(T)
	if gamma > 0 {
		s.Nucleus = cnt.Critical(s.Dmu, gamma, md.v, md.f, T)
	} else {
		s.Nucleus = cnt.Critical(0, 0, 0, 0, T)
	}
	x := s.Dmu / kT
	if md.m.Mobility != nil {
		s.LnD = md.lnDiffusivity(T)
		if growth {
			s.Growth = GrowthRate(s.LnD, md.jump, x)
		}
		s.lnU = math.Inf(-1)
		if x > 0 {
			s.lnU = s.LnD - md.lnJump + lnThermo(x)
			s.LnBeta = cnt.LnAttachmentCap(s.LnD, s.Nucleus.Size, md.f, md.m.Theta, md.jump)
			if md.m.Prefactor == PrefactorDiffusion {
				s.LnBeta = cnt.LnAttachmentDiffusion(s.LnD, s.Nucleus.Radius, md.m.Conc)
			}
		}
	}
	switch {
	case md.m.GrowthLaw != nil:
		s.lnU = math.Inf(-1)
		if x > 0 {
			var f Flag
			s.lnU, f = md.m.GrowthLaw.lnRate(md, T, x)
			s.Flags |= f
		}
		s.Growth = math.Exp(s.lnU)
	case md.m.Growth > 0:
		s.Growth = measuredGrowth(md.m.Growth, s.Dmu) // solution.go
		s.lnU = math.Log(s.Growth)
	}
	s.LnJ = md.lnRate(s, T)
	if !(gamma > 0) {
		s.LnJ = math.NaN()
	}
	return s
}

// DefaultSites reports whether the model nucleates on a substrate
// (θ < 180°) with no site density given (Material.Sites = 0), so that every
// molecule of the parent counts as a site: an upper bound on the sites by
// many orders of magnitude for particles or walls, which a result must
// state or a command refuse. cnt.SitesOnParticles gives a density from a
// number of particles per volume and their area.
func (md *Model) DefaultSites() bool { return md.f < 1 && md.m.Sites == 0 }

// flags are the validity flags of an evaluated state.
func (md *Model) flags(s State) Flag {
	var f Flag
	if md.DefaultSites() {
		f |= FlagDefaultSites
	}
	if math.IsNaN(s.DrivingMole) {
		return f | FlagOutsideTable
	}
	if !(s.Dmu > 0) {
		f |= FlagNoDrivingForce
	} else {
		if s.Nucleus.Size < SmallNucleus {
			f |= FlagSmallNucleus
		}
		if s.Nucleus.Barrier < LowBarrier*(cnt.Boltzmann*s.T) {
			f |= FlagLowBarrier
		}
	}
	if md.m.Mobility != nil {
		if math.IsInf(s.LnD, -1) {
			f |= FlagNoMobility
		}
		if w, ok := md.m.Mobility.(WLF); ok && s.T > w.Tg+wlfRange {
			f |= FlagWLFFarAboveTg
		}
	}
	if !(md.m.GammaAt(s.T) > 0) {
		f |= FlagGammaNotPositive
	}
	return f | md.SpanFlags(s.T, s.T)
}

// SpanFlags are the flags a span of temperatures [lo, hi] (K) raises by
// where it lies, whatever the model gives there: below T_g with a viscosity
// law (naming the branch used), and outside the calibrated range; and the
// default site density of heterogeneous nucleation, which holds everywhere.
// A path answer (linear cooling, a measured curve) carries those of its
// span.
func (md *Model) SpanFlags(lo, hi float64) Flag {
	var f Flag
	if md.DefaultSites() {
		f |= FlagDefaultSites
	}
	if md.tg > 0 && lo < md.tg && md.HasViscosity() {
		if md.Glassy() {
			f |= FlagBelowTgGlassy
		} else {
			f |= FlagBelowTgLiquid
		}
	}
	if clo, chi, ok := md.Calibrated(); ok && (lo < clo || hi > chi) {
		f |= FlagOutsideCalibrated
	}
	return f
}

// lnRate applies the prefactor model to an evaluated state.
func (md *Model) lnRate(s State, T float64) float64 {
	if !md.HasRate() {
		return math.NaN()
	}
	if !(s.Dmu > 0) {
		return math.Inf(-1)
	}
	switch md.m.Prefactor {
	case PrefactorFixed:
		return cnt.LnRateFixed(md.lnJ0, s.Nucleus.Barrier, T)
	case PrefactorTurnbullFisher:
		return cnt.LnRateTurnbullFisher(md.lnN, md.q, s.Nucleus.Barrier, T)
	default:
		return cnt.LnRate(md.lnN, s.Nucleus.Zeldovich, s.LnBeta, s.Nucleus.Barrier, T)
	}
}

// LnJ is ln J(T), J in m⁻³·s⁻¹: −Inf where nothing nucleates, NaN where
// the model has no rate (no mobility law and no fixed prefactor).
func (md *Model) LnJ(T float64) float64 { return md.At(T).LnJ }

// GrowthRate is u(T), m/s: 0 without driving force or mobility, NaN without a mobility law.
func (md *Model) GrowthRate(T float64) float64 { return md.At(T).Growth }
