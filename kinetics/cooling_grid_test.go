package kinetics_test

import (
	"errors"
	"math"
	"testing"

	"undercool/kinetics"
	"undercool/presets"
)

type namedModel struct {
	name string
	md   *kinetics.Model
}

// coolingCards are the shipped cards with a nucleation and a growth rate,
// the ones linear cooling applies to, in the order of presets.Names.
func coolingCards(t *testing.T) []namedModel {
	t.Helper()
	var out []namedModel
	for _, name := range presets.Names() {
		md := shippedModel(t, name)
		if _, err := md.LinearCooling(0); err != nil {
			if errors.Is(err, kinetics.ErrNoRate) || errors.Is(err, kinetics.ErrNoGrowth) {
				continue
			}
			t.Fatalf("%s: %v", name, err)
		}
		out = append(out, namedModel{name, md})
	}
	if len(out) == 0 {
		t.Fatal("no shipped card can be cooled")
	}
	return out
}

// TestCriticalRateConverged: the extended volume at the end of linear
// cooling of every shipped card against the independent reference, nested
// adaptive Gauss–Kronrod quadrature in temperature at a relative tolerance
// of 1e-10 (reference_test.go). Tolerance 1e-6 on the extended volume, the
// integrator's stated accuracy (2.5e-7 on the critical rate).
func TestCriticalRateConverged(t *testing.T) {
	const X = 1e-6
	for _, card := range coolingCards(t) {
		name, md := card.name, card.md
		c, err := md.LinearCooling(0)
		if err != nil {
			t.Fatal(err)
		}
		ref := kinetics.RefCoolingLnXext(md, c.End, 1e-10)
		d := math.Expm1(c.LnXextUnit() - ref)
		if !(math.Abs(d) <= 1e-6) {
			t.Errorf("%s: extended volume at 1 K/s off the reference by %.3g (critical rate %.10g K/s)", name, d, c.CriticalRate(X))
		}
		t.Logf("%-20s end %.3f K, critical rate %.10g K/s, extended volume %+.2g of the reference", name, c.End, c.CriticalRate(X), d)
	}
}

// TestReachAtCriticalRate: cooled at the critical rate the fraction is
// reached at the end of the path and nowhere before; the extended volume
// is flat there to some parts in 10¹⁴, so a crossing on that plateau would
// be noise.
func TestReachAtCriticalRate(t *testing.T) {
	const X = 1e-6
	for _, card := range coolingCards(t) {
		name, md := card.name, card.md
		c, err := md.LinearCooling(0)
		if err != nil {
			t.Fatal(err)
		}
		qc := c.CriticalRate(X)
		if !(qc > 0) {
			continue
		}
		p := c.Reach(qc, X)
		if !p.Reached || p.Temp != c.End {
			t.Errorf("%s: at the critical rate X reached %v at %.6f K, want at the end %.6f K", name, p.Reached, p.Temp, c.End)
		}
		// Ten per cent slower, X is reached before the end.
		if p := c.Reach(qc/1.1, X); !p.Reached || !(p.Temp > c.End) {
			t.Errorf("%s: at 0.9 of the critical rate X reached %v at %.6f K, want above the end %.6f K", name, p.Reached, p.Temp, c.End)
		}
	}
}

// BenchmarkLinearCooling is the work of one Monte Carlo sample of the
// critical cooling rate: the path integral and the rate, for a glass
// former (Vit1, to T_g) and a metal-like card (demo-alloy, to where the
// rest is negligible).
func BenchmarkLinearCooling(b *testing.B) {
	for _, name := range []string{"vit1", "demo-alloy"} {
		md := shippedModel(b, name)
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				c, err := md.LinearCooling(0)
				if err != nil {
					b.Fatal(err)
				}
				sinkF += c.CriticalRate(1e-6)
			}
		})
	}
}
