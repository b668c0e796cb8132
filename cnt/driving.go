package cnt

import (
	"fmt"
	"math"
)

// DrivingForce gives the free-energy change per mole of the new phase,
// Δg(T) in J/mol, positive where the new phase is stable. At or above the
// equilibrium temperature the value is zero or negative: no driving force.
// A model returns NaN where it has no answer (outside a tabulated range).
type DrivingForce interface {
	PerMole(T float64) float64
	// Name is the model's short name as used on the command line.
	Name() string
	// Equilibrium is the equilibrium temperature T_e (K) of the model,
	// where the driving force vanishes (a saturation temperature for a
	// solution), and false when the model has none.
	Equilibrium() (float64, bool)
}

// Linear is Turnbull's approximation, exact to first order in ΔT:
//
//	Δg = ΔH·ΔT/T_e,  ΔT = T_e − T
//
// Turnbull D., J. Appl. Phys. 21 (1950) 1022.
type Linear struct {
	Te float64 // equilibrium (melting) temperature, K
	DH float64 // enthalpy of transformation, J/mol, > 0
}

func (m Linear) PerMole(T float64) float64 { return m.DH * (m.Te - T) / m.Te }
func (Linear) Name() string                { return "linear" }

// Equilibrium is T_e.
func (m Linear) Equilibrium() (float64, bool) { return m.Te, true }

// Hoffman is the approximation for polymers and molecular liquids,
//
//	Δg = ΔH·ΔT·T/T_e²
//
// Hoffman J.D., J. Chem. Phys. 29 (1958) 1192.
type Hoffman struct {
	Te, DH float64
}

func (m Hoffman) PerMole(T float64) float64 { return m.DH * (m.Te - T) * T / (m.Te * m.Te) }
func (Hoffman) Name() string                { return "hoffman" }

// Equilibrium is T_e.
func (m Hoffman) Equilibrium() (float64, bool) { return m.Te, true }

// ThompsonSpaepen is the approximation for metallic melts,
//
//	Δg = ΔH·(ΔT/T_e)·2T/(T_e + T)
//
// Thompson C.V., Spaepen F., Acta Metall. 27 (1979) 1855.
type ThompsonSpaepen struct {
	Te, DH float64
}

func (m ThompsonSpaepen) PerMole(T float64) float64 {
	return m.DH * (m.Te - T) / m.Te * 2 * T / (m.Te + T)
}
func (ThompsonSpaepen) Name() string { return "thompson-spaepen" }

// Equilibrium is T_e.
func (m ThompsonSpaepen) Equilibrium() (float64, bool) { return m.Te, true }

// ConstantCp is exact for a constant heat-capacity difference ΔCp = Cp,liquid − Cp,crystal:
//
//	Δg = ΔH·ΔT/T_e − ΔCp·[ΔT − T·ln(T_e/T)]
//
// Hoffman J.D., J. Chem. Phys. 29 (1958) 1192, eq. 2; Kelton and Greer,
// Nucleation in Condensed Matter (2010), eq. 2.7.
// Special case: T ≤ 0 gives NaN.
type ConstantCp struct {
	Te, DH float64
	DCp    float64 // J/(mol·K)
}

func (m ConstantCp) PerMole(T float64) float64 {
	if !(T > 0) {
		return math.NaN()
	}
	dT := m.Te - T
	return m.DH*dT/m.Te - m.DCp*(dT-T*math.Log(m.Te/T))
}
func (ConstantCp) Name() string { return "cp" }

// Equilibrium is T_e.
func (m ConstantCp) Equilibrium() (float64, bool) { return m.Te, true }

// Table is a tabulated Δg(T), linear between points, the bridge to a
// thermodynamic calculation made elsewhere. Outside the tabulated range it
// returns NaN: no extrapolation.
type Table struct {
	T, G  []float64 // ascending temperatures, K; Δg, J/mol
	Label string    // where the table came from, for output
	// Te is an equilibrium temperature given with the table, K; 0: where
	// the tabulated Δg changes sign.
	Te float64
}

// NewTable checks and keeps a tabulated driving force. Temperatures must be
// finite, positive and strictly ascending (rows may come in either order);
// at least two rows are needed.
func NewTable(T, g []float64, label string) (*Table, error) {
	if len(T) != len(g) {
		panic("cnt: NewTable: columns differ in length")
	}
	if len(T) < 2 {
		return nil, fmt.Errorf("a driving-force table needs at least 2 rows, got %d", len(T))
	}
	for i := range T {
		if !(T[i] > 0) || math.IsInf(T[i], 0) || math.IsNaN(g[i]) || math.IsInf(g[i], 0) {
			return nil, fmt.Errorf("row %d: temperature must be positive and finite and Δg finite", i+1)
		}
		if i == 0 {
			continue
		}
		if d := T[i] - T[i-1]; d == 0 || (d > 0) != (T[1] > T[0]) {
			return nil, fmt.Errorf("temperatures must be strictly monotonic (row %d)", i+1)
		}
	}
	ts, gs := ascending(T, g)
	return &Table{T: ts, G: gs, Label: label}, nil
}

// ascending returns copies of a table's strictly monotonic temperatures and
// its values, in ascending temperature.
func ascending(T, y []float64) (ts, ys []float64) {
	ts = append([]float64(nil), T...)
	ys = append([]float64(nil), y...)
	if ts[0] > ts[len(ts)-1] {
		for i, j := 0, len(ts)-1; i < j; i, j = i+1, j-1 {
			ts[i], ts[j] = ts[j], ts[i]
			ys[i], ys[j] = ys[j], ys[i]
		}
	}
	return ts, ys
}

// bracket finds the rows lo and hi = lo+1 of ascending temperatures ts that
// hold T, by bisection; false when T lies outside the table or is NaN.
func bracket(ts []float64, T float64) (lo, hi int, ok bool) {
	n := len(ts)
	if !(T >= ts[0] && T <= ts[n-1]) {
		return 0, 0, false
	}
	lo, hi = 0, n-1
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if ts[mid] <= T {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo, hi, true
}

func (t *Table) PerMole(T float64) float64 {
	lo, hi, ok := bracket(t.T, T)
	if !ok {
		return math.NaN()
	}
	w := (T - t.T[lo]) / (t.T[hi] - t.T[lo])
	return t.G[lo] + w*(t.G[hi]-t.G[lo])
}

func (t *Table) Name() string { return "table" }

// Equilibrium returns Te when the table was given one, else the highest
// temperature where the tabulated Δg changes sign from positive (below) to
// non-positive (above), by linear interpolation, and false if the table
// has no such crossing.
func (t *Table) Equilibrium() (float64, bool) {
	if t.Te != 0 {
		return t.Te, true
	}
	for i := len(t.T) - 1; i > 0; i-- {
		if t.G[i-1] > 0 && t.G[i] <= 0 {
			return t.T[i-1] + (t.T[i]-t.T[i-1])*t.G[i-1]/(t.G[i-1]-t.G[i]), true
		}
	}
	return 0, false
}
