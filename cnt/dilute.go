package cnt

import "math"

// Solvus is a solubility law of a solid solution: ln c_eq(T), c_eq the
// equilibrium mole fraction of solute in the matrix at temperature T (K);
// NaN where the law has no value.
type Solvus interface {
	LnSolubility(T float64) float64
}

// DiluteSolid is the driving force for a precipitate of fixed composition
// c_p forming from a dilute binary solid solution held at its nominal
// composition c₀ (no depletion: the start of precipitation, or a TTT
// curve), per mole of atoms of the precipitate:
//
//	Δg = R·T·[c_p·ln(c₀/c_eq) + (1 − c_p)·ln((1 − c₀)/(1 − c_eq))]
//
// (DiluteDriving times R·T), with c_eq(T) from the solvus. The
// equilibrium temperature is the solvus temperature of c₀, where
// c_eq(T_e) = c₀. The molar volume that goes with it is per mole of atoms.
//
// Special cases: at or above T_e there is no driving force (Δg ≤ 0, 0
// where the solvus passes c_p); T ≤ 0, or a solvus with no value at T,
// gives NaN.
type DiluteSolid struct {
	C0, Cp float64 // solute mole fractions of the alloy and of the precipitate, 0 < C0 < Cp ≤ 1
	Solvus Solvus
	Te     float64 // the solvus temperature of C0, K
}

func (d DiluteSolid) PerMole(T float64) float64 {
	if !(T > 0) {
		return math.NaN()
	}
	lnCeq := d.Solvus.LnSolubility(T)
	if math.IsNaN(lnCeq) {
		return math.NaN()
	}
	if x := DiluteDriving(d.C0, math.Exp(lnCeq), d.Cp); !math.IsNaN(x) {
		return Gas * T * x
	}
	// c_eq at or above 1: everything dissolves.
	return 0
}

func (DiluteSolid) Name() string { return "dilute" }

// Equilibrium is the solvus temperature of C0; false without one.
func (d DiluteSolid) Equilibrium() (float64, bool) { return d.Te, d.Te > 0 }
