package kinetics_test

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate"

	"undercool/cnt"
	"undercool/kinetics"
)

// zoneModel is an invented solute (γ = 2.5 mJ/m², apparent A = 1e6
// m⁻³ s⁻¹) saturated at 40 °C with the van 't Hoff law, ΔH_sol = 25 kJ/mol.
func zoneModel(t testing.TB) *kinetics.Model {
	m := testSolute(cnt.VantHoff{Tsat: 313.15, DHsol: 25e3})
	m.Gamma, m.Prefactor, m.J0 = 2.5e-3, kinetics.PrefactorFixed, 1e6
	md, err := kinetics.NewModel(m)
	if err != nil {
		t.Fatal(err)
	}
	return md
}

// The onset against an independent computation: the expected number of
// nuclei in V cooled at q from T_sat is N(T) = (V/q)·∫_T^{T_sat} J dT'
// (time t = (T_sat − T)/q); integrated here with gonum's Simpson rule on a
// fine grid and solved for N = 1 by bisection. Tolerance 5 mK: the grid of
// MetastableZone is (T_sat − end)/20000 = 2.5 mK.
func TestMetastableZoneIndependent(t *testing.T) {
	md := zoneModel(t)
	const tsat, end, V = 313.15, 263.15, 1e-4
	N := func(T, q float64) float64 {
		const n = 4001
		xs := make([]float64, n)
		ys := make([]float64, n)
		for i := range xs {
			xs[i] = T + (tsat-T)*float64(i)/(n-1)
			ys[i] = math.Exp(md.LnJ(xs[i]))
		}
		return V / q * integrate.Simpsons(xs, ys)
	}
	prev := 0.0
	for _, perMin := range []float64{0.1, 0.5, 2, 10} {
		q := perMin / 60
		o, err := md.MetastableZone(V, q, end)
		if err != nil {
			t.Fatal(err)
		}
		if !o.Reached {
			t.Fatalf("q = %g K/min: onset not reached by %g K", perMin, end)
		}
		lo, hi := end, tsat-1e-6
		for hi-lo > 1e-4 {
			mid := (lo + hi) / 2
			if N(mid, q) >= 1 {
				lo = mid
			} else {
				hi = mid
			}
		}
		if math.Abs(o.Temp-lo) > 5e-3 {
			t.Errorf("q = %g K/min: onset %.4f K, independent %.4f K", perMin, o.Temp, lo)
		}
		// The zone widens with the cooling rate (Mullin (2001) §5.4, from memory).
		w := tsat - o.Temp
		if !(w > prev) {
			t.Errorf("q = %g K/min: width %g K not wider than %g K at the slower rate", perMin, w, prev)
		}
		t.Logf("q = %g K/min: onset %.4f K, width %.3f K", perMin, o.Temp, w)
		prev = w
	}
}

func TestMetastableZoneEdges(t *testing.T) {
	md := zoneModel(t)
	if _, err := md.MetastableZone(1e-4, 0.01, 313.15); !errors.Is(err, kinetics.ErrEndAboveSat) {
		t.Errorf("end at T_sat: %v", err)
	}
	if _, err := md.MetastableZone(1e-4, 0.01, 320); !errors.Is(err, kinetics.ErrEndAboveSat) {
		t.Errorf("end above T_sat: %v", err)
	}
	// Far too fast for a tiny volume over 1 K: fewer than one nucleus.
	o, err := md.MetastableZone(1e-12, 1e3, 312.15)
	if err != nil || o.Reached || !(o.LnExpected < 0) {
		t.Errorf("fast cooling: %+v, %v; want not reached", o, err)
	}
}

// BenchmarkMetastableZone is one onset: the path integral of a linear
// cooling and the crossing of one nucleus.
func BenchmarkMetastableZone(b *testing.B) {
	md := zoneModel(b)
	for b.Loop() {
		if _, err := md.MetastableZone(1e-4, 0.5/60, 263.15); err != nil {
			b.Fatal(err)
		}
	}
}
