package population

import (
	"math"
	"testing"

	"undercool/cnt"
	"undercool/internal/beckerdoring"
	"undercool/kinetics"
	"undercool/kinetics/internal/bracket"
)

// TestIncubationMasterEquation: the engine's transient nucleation, the
// factor exp(−τ/t) with τ = 1/(2πZ²β*) (cnt.Incubation), against the
// Becker–Döring master equation of the same nucleus, solved in time
// (internal/beckerdoring): the alloy's own clusters, ΔG(n)/k_BT = −n·x +
// a·n^(2/3) with x = Δμ/k_BT from cnt.DiluteDriving at c₀ and a = (36π)^(1/3)
// v^(2/3) γ/k_BT, attaching in proportion to their surface, k⁺(n) =
// β*·(n/n*)^(2/3), β* the engine's (cnt.LnAttachmentSolid), from no clusters
// at t = 0 (the alloy quenched into the supersaturated state). Compared:
// the time at which the rate past the size where the engine gives birth to
// particles (r* + ½·sqrt(k_BT/(πγ)), where ΔG has fallen k_BT below the
// barrier) reaches half its steady value, against the engine's own, read
// from its rate (τ/ln 2).
//
// The Al–Sc test alloy at 573.15 K (n* = 12, ΔG* = 6.8 k_BT), 700 K (n* = 51,
// 14 k_BT) and 743 K (n* = 102, 21 k_BT): small test systems.
//
// The check chosen before the run was 25 % at each temperature (the best
// analytic lag, Kashchiev's, lies within 0.72 to 1.6 of the master equation
// over 10 to 160 k_BT, cnt.TestTimeLagMasterEquation; a one-parameter
// incubation form good to 25 % here would be as good as that). It failed:
// the master equation reaches half its steady rate 1.25, 1.48 and 1.61
// times later than exp(−τ/t) says, the ratio growing with the barrier as
// that of the time lag does (the clusters below the critical region relax
// more slowly the higher the barrier; the form, like Kashchiev's solution,
// leaves that out). The engine keeps its published form, and this test holds
// the statement of its accuracy (cnt.Incubation, the README) to 0.01 in the
// ratio: a measurement, not a validation. It checks as well that the
// transient is no faster than the form says (ratio at least 1), and that the
// ratios are converged in the step (0.05/β*, the same to 1e-4 as 0.01/β*).
func TestIncubationMasterEquation(t *testing.T) {
	const lattice = 0.4103e-9
	al := Alloy{C0: 0.0018, Cp: 0.25, Solvus: SolvusThrough(913, 0.00186, 743, 0.00033),
		Vm: lattice * lattice * lattice * cnt.Avogadro / 4, Gamma: 0.094,
		Mobility: kinetics.Arrhenius{D0: 2.34e-4, Q: 167e3}, Lattice: lattice}
	m, err := newAlloyModel(al)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ T, ratio float64 }{{573.15, 1.25}, {700, 1.48}, {743, 1.61}} {
		// the engine: ln J(t) less its steady value, −τ/t
		steady := m.at(c.T, 0, math.Inf(1))
		lnRel := func(t float64) float64 { return m.at(c.T, 0, t).lnJ - steady.lnJ }
		kT := cnt.Boltzmann * c.T
		x := cnt.DiluteDriving(al.C0, steady.eq, al.Cp)
		nuc := cnt.Critical(x*kT, al.Gamma, m.v, 1, c.T)
		beta := math.Exp(cnt.LnAttachmentSolid(al.Mobility.LnDiffusivity(c.T), nuc.Radius, al.C0, lattice))
		tau := cnt.Incubation(nuc.Zeldovich, math.Log(beta))
		half, err := bracket.Root(func(t float64) float64 { return lnRel(t) + math.Ln2 }, tau/100, 100*tau, 1e-9*tau)
		if err != nil {
			t.Fatal(err)
		}
		// the master equation of the same nucleus
		a := math.Cbrt(36*math.Pi) * math.Pow(m.v, 2.0/3) * al.Gamma / kT
		N := int(math.Max(3*nuc.Size, 60))
		s, err := beckerdoring.New(func(n int) float64 { return beta * math.Pow(float64(n)/nuc.Size, 2.0/3) },
			func(n int) float64 { return -float64(n)*x + a*math.Pow(float64(n), 2.0/3) }, N)
		if err != nil {
			t.Fatal(err)
		}
		nb := int(math.Ceil(4 * math.Pi / 3 * math.Pow(steady.birth, 3) / m.v))
		times, flux, err := s.Trace(nb, 5*tau, 0.05/beta)
		if err != nil {
			t.Fatal(err)
		}
		js := s.Steady()
		bd := math.NaN()
		for i := 1; i < len(flux); i++ {
			if flux[i] >= js/2 {
				f := (js/2 - flux[i-1]) / (flux[i] - flux[i-1])
				bd = times[i-1] + f*(times[i]-times[i-1])
				break
			}
		}
		r := bd / half
		if !(math.Abs(r-c.ratio) <= 0.01) || !(r >= 1) {
			t.Errorf("%.2f K (n* = %.1f, ΔG* = %.1f kT): half rate after %.4g s by the master equation (past %d molecules), %.4g s by exp(−τ/t): ratio %.3f, stated %.2f",
				c.T, nuc.Size, nuc.Barrier/kT, bd, nb, half, r, c.ratio)
		}
		t.Logf("%.2f K (n* = %.1f, ΔG* = %.1f kT, Z = %.3g, β* = %.3g/s, born at %d): half rate after %.5g s (master equation), %.5g s = τ/ln 2 (engine): ratio %.4f",
			c.T, nuc.Size, nuc.Barrier/kT, nuc.Zeldovich, beta, nb, bd, half, r)
	}
}
