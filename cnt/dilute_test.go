package cnt

import (
	"math"
	"testing"
)

// lnLaw is a solvus ln c_eq = a − b/T for the tests.
type lnLaw struct{ a, b float64 }

func (l lnLaw) LnSolubility(T float64) float64 { return l.a - l.b/T }

// The driving force of a dilute solid solution at its nominal composition:
// R·T times DiluteDriving, worked by hand at one temperature; zero at the
// solvus temperature of c₀; positive below it and negative above.
// Checked to 1e-12 (rounding).
func TestDiluteSolid(t *testing.T) {
	law := lnLaw{1.269, 6899} // the shape of the Sc-in-Al solvus
	c0 := 1.8e-3
	te := law.b / (law.a - math.Log(c0))
	d := DiluteSolid{C0: c0, Cp: 0.25, Solvus: law, Te: te}
	T := 573.15
	ceq := math.Exp(law.a - law.b/T)
	want := Gas * T * (0.25*math.Log(c0/ceq) + 0.75*math.Log((1-c0)/(1-ceq)))
	if got := d.PerMole(T); math.Abs(got-want) > 1e-12*math.Abs(want) {
		t.Errorf("Δg(%g K) = %.15g J/mol, want %.15g", T, got, want)
	}
	if got, ok := d.Equilibrium(); !ok || got != te {
		t.Errorf("Equilibrium = %g, %v; want %g", got, ok, te)
	}
	if got := d.PerMole(te); math.Abs(got) > 1e-9 {
		t.Errorf("Δg at T_e = %g J/mol, want 0", got)
	}
	if !(d.PerMole(te-10) > 0) || !(d.PerMole(te+10) < 0) {
		t.Errorf("Δg must be positive below T_e and negative above: %g, %g", d.PerMole(te-10), d.PerMole(te+10))
	}
	for _, T := range []float64{0, -1, math.NaN()} {
		if got := d.PerMole(T); !math.IsNaN(got) {
			t.Errorf("Δg(%g) = %g, want NaN", T, got)
		}
	}
	if got := (DiluteSolid{C0: c0, Cp: 0.25, Solvus: lnLaw{1, 0}}).PerMole(500); got != 0 {
		t.Errorf("a solvus above 1: Δg = %g, want 0", got)
	}
}
