package population

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
)

// Solubility is the equilibrium concentration of the solute in the parent
// at temperature T (K), as its natural logarithm: NaN where the law has no
// value (outside a table). *cnt.SolubilityTable is one (ln c interpolated
// linearly in 1/T); Solvus and VantHoffSolubility are the laws.
type Solubility interface {
	LnSolubility(T float64) float64
}

// Solvus is the solvus of a dilute solid solution written as
//
//	ln c_eq = A − B/T
//
// the form of an ideal dilute solution in equilibrium with a compound of
// fixed composition, with A an excess entropy and B an enthalpy of
// solution over R (Porter D.A., Easterling K.E., Phase Transformations in
// Metals and Alloys, 2nd ed. (1992) §1.5, from memory).
type Solvus struct {
	A float64 // dimensionless
	B float64 // K
}

// LnSolubility is A − B/T; NaN for T ≤ 0.
func (s Solvus) LnSolubility(T float64) float64 {
	if !(T > 0) {
		return math.NaN()
	}
	return s.A - s.B/T
}

// Temperature is the solvus temperature of the mole fraction c, where
// c_eq(T) = c: T = B/(A − ln c). NaN where the law never reaches c (A ≤ ln c
// with B > 0: c lies above the solvus at every temperature).
func (s Solvus) Temperature(c float64) float64 {
	d := s.A - math.Log(c)
	if !(c > 0) || !(d > 0) {
		return math.NaN()
	}
	return s.B / d
}

// SolvusThrough is the solvus law through two measured points (T₁, c₁)
// and (T₂, c₂): B = ln(c₁/c₂)/(1/T₂ − 1/T₁), A = ln c₁ + B/T₁.
func SolvusThrough(T1, c1, T2, c2 float64) Solvus {
	b := math.Log(c1/c2) / (1/T2 - 1/T1)
	return Solvus{A: math.Log(c1) + b/T1, B: b}
}

// VantHoffSolubility is the ideal (van 't Hoff) solubility through a
// reference point, the solution saturated at T_sat holding C_sat:
//
//	ln C(T) = ln C_sat − (ΔH_sol/R)·(1/T − 1/T_sat)
//
// It is cnt.VantHoff's law read as a concentration: ln C(T) = ln C_sat −
// VantHoff{T_sat, ΔH_sol}.LnS(T).
type VantHoffSolubility struct {
	Law  cnt.VantHoff // saturation temperature (K) and enthalpy of dissolution (J/mol)
	Csat float64      // concentration saturated at Law.Tsat, in the units of the run (mol per m³ of solvent)
}

// LnSolubility is ln C(T); NaN for T ≤ 0.
func (v VantHoffSolubility) LnSolubility(T float64) float64 {
	return math.Log(v.Csat) - v.Law.LnS(T)
}

// coversSchedule checks that a solubility law has a value over the whole
// temperature span of a schedule (a table covers a range; the schedule is
// piecewise linear, so its extremes suffice).
func coversSchedule(s Solubility, sch kinetics.Schedule, what string) error {
	lo, hi := sch.Span()
	for _, T := range []float64{lo, hi} {
		if math.IsNaN(s.LnSolubility(T)) {
			return fmt.Errorf("the %s has no value at %g K, within the schedule's %g to %g K", what, T, lo, hi)
		}
	}
	return nil
}
