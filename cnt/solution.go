package cnt

import (
	"errors"
	"fmt"
	"math"
)

// Solution is a driving force for crystallization from a solution: the
// supersaturation ratio S = c/c_sat(T) and, from it, the free-energy change
// per mole of crystal
//
//	Δg = R·T·ln S,  i.e.  Δμ = k_B·T·ln S per molecule
//
// for an ideal (or activity-corrected) solution. Mullin J.W., Crystallization,
// 4th ed., Butterworth-Heinemann (2001), §5.1 (from memory); Kashchiev D.,
// van Rosmalen G.M., Cryst. Res. Technol. 38 (2003) 555, eq. 2 (from memory).
// S ≤ 1 (saturated or undersaturated) is no driving force: Δg ≤ 0.
type Solution interface {
	DrivingForce
	// LnS is ln S at temperature T (K): NaN where the model has no answer
	// (T ≤ 0, outside a solubility table).
	LnS(T float64) float64
}

// solutionPerMole is R·T·ln S with the special case T ≤ 0 or NaN: NaN.
func solutionPerMole(T, lnS float64) float64 {
	if !(T > 0) {
		return math.NaN()
	}
	return Gas * T * lnS
}

// Supersaturation is a fixed supersaturation ratio S = c/c_sat, the same at
// every temperature (an isothermal experiment, or S set by mixing in an
// antisolvent):
//
//	Δg = R·T·ln S
//
// Special cases: S ≤ 1 gives Δg ≤ 0 (no driving force); T ≤ 0 or NaN gives NaN.
type Supersaturation struct {
	S    float64 // supersaturation ratio, > 0
	Tsat float64 // reference saturation temperature, K, for ranges and undercoolings (0: none)
}

func (m Supersaturation) LnS(T float64) float64 {
	if !(T > 0) {
		return math.NaN()
	}
	return math.Log(m.S)
}
func (m Supersaturation) PerMole(T float64) float64 { return solutionPerMole(T, m.LnS(T)) }
func (Supersaturation) Name() string                { return "supersaturation" }

// Equilibrium is the reference saturation temperature, false without one.
func (m Supersaturation) Equilibrium() (float64, bool) { return m.Tsat, m.Tsat != 0 }

// VantHoff is a solution saturated at T_sat and cooled at constant
// concentration, with the ideal (van 't Hoff) solubility law
//
//	ln c_sat(T) = ln c_sat(T_sat) − (ΔH_sol/R)·(1/T − 1/T_sat)
//
// so that
//
//	ln S(T) = ln c − ln c_sat(T) = (ΔH_sol/R)·(1/T − 1/T_sat)
//
// (Prausnitz J.M., Lichtenthaler R.N., de Azevedo E.G., Molecular
// Thermodynamics of Fluid-Phase Equilibria, 3rd ed. (1999), §11.2, ideal
// solubility of a solid, from memory; Mullin (2001) §3.6.)
//
// The driving force is then exactly Turnbull's linear law with the
// saturation temperature in place of the melting point and the enthalpy of
// dissolution in place of that of fusion:
//
//	Δg = R·T·ln S
//	   = R·T·(ΔH_sol/R)·(1/T − 1/T_sat)
//	   = ΔH_sol·T·(T_sat − T)/(T·T_sat)
//	   = ΔH_sol·(T_sat − T)/T_sat
//
// which is Linear{Te: T_sat, DH: ΔH_sol}.PerMole(T) term for term: the
// factor T of R·T·ln S cancels the 1/T of the van 't Hoff law. (For the ideal
// solubility of a solid whose enthalpy of solution equals its enthalpy of
// fusion, T_sat of the pure solute is its melting point and the two models
// are one.)
//
// ln S is computed as (ΔH_sol/R)·(T_sat − T)/(T·T_sat), so that close to
// T_sat no precision is lost to the difference of two reciprocals.
// Special cases: T ≥ T_sat gives ln S ≤ 0 (no driving force); T ≤ 0 or NaN gives NaN.
type VantHoff struct {
	Tsat  float64 // saturation temperature, K, > 0
	DHsol float64 // enthalpy of dissolution, J/mol, > 0
}

func (m VantHoff) LnS(T float64) float64 {
	if !(T > 0) {
		return math.NaN()
	}
	return m.DHsol / Gas * (m.Tsat - T) / (T * m.Tsat)
}
func (m VantHoff) PerMole(T float64) float64 { return solutionPerMole(T, m.LnS(T)) }
func (VantHoff) Name() string                { return "van-t-hoff" }

// Equilibrium is the saturation temperature, where S = 1.
func (m VantHoff) Equilibrium() (float64, bool) { return m.Tsat, true }

// SolubilityTable is a measured solubility c_sat(T) and a solution of fixed
// concentration c in the same units, so that S = c/c_sat(T). Between rows
// ln c_sat is interpolated linearly in 1/T, which is exact for a solubility
// that follows the van 't Hoff law and close for any measured curve at the
// usual spacing of a few kelvin. Outside the table it returns NaN: no
// extrapolation.
type SolubilityTable struct {
	T, C  []float64 // ascending temperatures, K; solubilities, > 0
	Conc  float64   // concentration of the solution, same units as C, > 0
	Label string    // where the table came from, for output
	// Tsat is the saturation temperature the concentration was read at, K
	// (Conc = c_sat(Tsat)); 0: where c_sat = Conc, by SaturationTemperature.
	Tsat float64

	lnC []float64
}

// NewSolubilityTable checks and keeps a solubility table and a
// concentration. Temperatures must be finite, positive and strictly
// monotonic (rows may come in either order); solubilities and the
// concentration must be positive and finite; at least two rows are needed.
// The solubility need not be monotonic here; SaturationTemperature needs it.
// Row numbers in errors are the caller's.
func NewSolubilityTable(T, c []float64, conc float64, label string) (*SolubilityTable, error) {
	if len(T) != len(c) {
		panic("cnt: NewSolubilityTable: columns differ in length")
	}
	if len(T) < 2 {
		return nil, fmt.Errorf("a solubility table needs at least 2 rows, got %d", len(T))
	}
	if !(conc > 0) || math.IsInf(conc, 1) {
		return nil, fmt.Errorf("the concentration must be positive and finite, got %g", conc)
	}
	n := len(T)
	for i := range T {
		if !(T[i] > 0) || math.IsInf(T[i], 1) {
			return nil, fmt.Errorf("row %d: temperature must be positive and finite", i+1)
		}
		if !(c[i] > 0) || math.IsInf(c[i], 1) {
			return nil, fmt.Errorf("row %d: solubility must be positive and finite, got %g", i+1, c[i])
		}
	}
	desc := T[0] > T[n-1]
	for i := 1; i < n; i++ {
		if desc && !(T[i] < T[i-1]) || !desc && !(T[i] > T[i-1]) {
			return nil, fmt.Errorf("row %d: temperatures must be strictly monotonic", i+1)
		}
	}
	ts, cs := ascending(T, c)
	lnC := make([]float64, n)
	for i := range cs {
		lnC[i] = math.Log(cs[i])
	}
	return &SolubilityTable{T: ts, C: cs, Conc: conc, Label: label, lnC: lnC}, nil
}

// LnSolubility is ln c_sat(T), interpolated linearly in 1/T; NaN outside the table.
func (t *SolubilityTable) LnSolubility(T float64) float64 { return LnInverseT(t.T, t.lnC, T) }

// LnInverseT interpolates a logarithm ln y tabulated at ascending
// temperatures ts linearly in 1/T, which is exact for an Arrhenius (or van 't
// Hoff) quantity y = A·exp(−B/T) and close for any measured curve at the
// usual spacing; NaN outside the table (no extrapolation) or for NaN T.
func LnInverseT(ts, lnY []float64, T float64) float64 {
	lo, hi, ok := bracket(ts, T)
	if !ok {
		return math.NaN()
	}
	if T == ts[lo] {
		return lnY[lo]
	}
	if T == ts[hi] {
		return lnY[hi]
	}
	w := (1/T - 1/ts[lo]) / (1/ts[hi] - 1/ts[lo])
	return lnY[lo] + w*(lnY[hi]-lnY[lo])
}

func (t *SolubilityTable) LnS(T float64) float64 { return math.Log(t.Conc) - t.LnSolubility(T) }
func (t *SolubilityTable) PerMole(T float64) float64 {
	return solutionPerMole(T, t.LnS(T))
}
func (t *SolubilityTable) Name() string { return "solubility-table" }

// ErrNotMonotonic is returned where a saturation temperature is asked of a
// solubility table whose solubility does not rise strictly with temperature.
var ErrNotMonotonic = errors.New("the solubility must rise strictly with temperature to give one saturation temperature")

// Increasing reports whether the solubility rises strictly with
// temperature, and if not, the first row (1-based, in ascending
// temperature) where it fails.
func (t *SolubilityTable) Increasing() (bool, int) {
	for i := 1; i < len(t.C); i++ {
		if !(t.C[i] > t.C[i-1]) {
			return false, i + 1
		}
	}
	return true, 0
}

// SaturationTemperature is the temperature at which the solution is just
// saturated, c_sat(T_sat) = c, found by the same interpolation. It needs a
// solubility that rises strictly with temperature (ErrNotMonotonic
// otherwise, wrapped with the row) and a concentration within the table.
func (t *SolubilityTable) SaturationTemperature() (float64, error) {
	if ok, row := t.Increasing(); !ok {
		return 0, fmt.Errorf("%w (row %d in ascending temperature)", ErrNotMonotonic, row)
	}
	lc := math.Log(t.Conc)
	n := len(t.T)
	if lc < t.lnC[0] || lc > t.lnC[n-1] {
		return 0, fmt.Errorf("the concentration %g lies outside the tabulated solubilities %g to %g", t.Conc, t.C[0], t.C[n-1])
	}
	for i := 1; i < n; i++ {
		if lc <= t.lnC[i] {
			w := (lc - t.lnC[i-1]) / (t.lnC[i] - t.lnC[i-1])
			inv := 1/t.T[i-1] + w*(1/t.T[i]-1/t.T[i-1])
			return 1 / inv, nil
		}
	}
	return t.T[n-1], nil
}

// Equilibrium is Tsat when the table was given one, else
// SaturationTemperature without the reason.
func (t *SolubilityTable) Equilibrium() (float64, bool) {
	if t.Tsat != 0 {
		return t.Tsat, true
	}
	ts, err := t.SaturationTemperature()
	return ts, err == nil
}

// ConcentrationAt returns the solubility c_sat(T) itself (the concentration
// of a solution saturated at T), NaN outside the table.
func (t *SolubilityTable) ConcentrationAt(T float64) float64 { return math.Exp(t.LnSolubility(T)) }

// LnAttachmentDiffusion is the logarithm of the frequency at which solute
// molecules reach the critical nucleus of radius r* (m) by volume diffusion
// through the solution, for ln D (D in m²/s) and a number concentration c of
// solute molecules (m⁻³):
//
//	β* = 4π·r*·D·c
//
// the steady diffusion flux onto a sphere. Kashchiev D., van Rosmalen G.M.,
// Review: Nucleation in solutions revisited, Cryst. Res. Technol. 38 (2003)
// 555, eq. 20, written there as (48π²v)^(1/3)·D·C·n*^(1/3), which is the same
// since r* = (3v·n*/4π)^(1/3) (from memory).
// Special cases: r* = +Inf (no nucleus) gives NaN; ln D = −Inf gives −Inf.
func LnAttachmentDiffusion(lnD, radius, conc float64) float64 {
	if math.IsInf(radius, 1) {
		return math.NaN()
	}
	return math.Log(4*math.Pi*radius*conc) + lnD
}
