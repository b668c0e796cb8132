package kinetics_test

import (
	"math"
	"testing"

	"undercool/kinetics"
)

// TestCriticalRateBMG: the Zr-based bulk metallic glass Vit1 forms a glass
// at 0.9–1.2 K/s: Kim Y.J., Busch R., Johnson W.L., Rulison A.J., Rhim W.K.,
// Appl. Phys. Lett. 65 (1994) 2136 (electrostatic levitation; abstract,
// checked). Within a factor of 2 of the middle of that range, 1.04 K/s
// (the target of the card's calibration; it was calibrated on the TTT
// nose, not on this rate, which is held out). The path ends at Tg, and the
// classical nose estimate overstates the rate (Uhlmann 1972).
func TestCriticalRateBMG(t *testing.T) {
	md := shippedModel(t, "vit1")
	c, err := md.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	if c.Reason != kinetics.EndGlass {
		t.Errorf("path ends for %v, want the glass transition", c.Reason)
	}
	qc := c.CriticalRate(1e-6)
	if !(qc > 1.04/2 && qc < 1.04*2) {
		t.Errorf("Vit1 critical cooling rate %.3g K/s, measured 0.9–1.2 K/s: want within a factor 2 of 1.04", qc)
	}
	nose, _, err := c.NoseRate(1e-6)
	if err != nil {
		t.Fatal(err)
	}
	if !(nose > qc) {
		t.Errorf("nose estimate %.3g K/s not above the integral %.3g K/s", nose, qc)
	}
	t.Logf("Vit1: critical rate %.3g K/s, nose estimate %.3g K/s", qc, nose)
}

// TestCriticalRateMetals: pure metals cannot be made glassy below about
// 10^12–10^14 K/s (common practice; splat and melt-spinning experience).
// Ni, Cu, Al and Fe come out inside that range. Ag and Au come out at about
// 4·10^11 K/s, below it, with Turnbull's interfacial energies: a known miss
// the README states; their test pins it (between 10^11 and 10^12), so that
// a change of the physics that moves them is seen and the README updated.
func TestCriticalRateMetals(t *testing.T) {
	for _, c := range []struct {
		name   string
		lo, hi float64 // log10 K/s
	}{
		{"ni", 12, 14}, {"cu", 12, 14}, {"al", 12, 14}, {"fe", 12, 14},
		{"ag", 11, 12}, {"au", 11, 12}, // known miss, below the range
	} {
		md := shippedModel(t, c.name)
		cl, err := md.LinearCooling(0)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		qc := cl.CriticalRate(1e-6)
		if lg := math.Log10(qc); !(lg > c.lo && lg < c.hi) {
			t.Errorf("%s: critical cooling rate %.3g K/s, want 10^%g–10^%g", c.name, qc, c.lo, c.hi)
		}
		t.Logf("%s: critical rate %.3g K/s", c.name, qc)
	}
}

// TestMaxUndercoolingMetals is a calibration reproduction, not a check:
// the cards' interfacial energies are Turnbull's (J. Appl. Phys. 21 (1950)
// 1022), which he derived from the maximum undercoolings of his metal
// droplets (values from memory: Ni 319 K, Cu 236 K, Fe 295 K, Al 130 K,
// Au 230 K, Ag 227 K). A 50 µm droplet cooled at 1 K/s must nucleate within
// 10 % of his undercooling: Turnbull assumed a nucleation frequency, and
// 1 % in γ moves the onset by about 1.5 % of ΔT (ΔT ∝ γ^(3/2) at a fixed
// rate), so a card that still carries his γ lands within a few per cent
// and one whose γ drifted does not.
func TestMaxUndercoolingMetals(t *testing.T) {
	V := 4.0 / 3 * math.Pi * math.Pow(25e-6, 3)
	turnbull := map[string]float64{"ni": 319, "cu": 236, "fe": 295, "al": 130, "au": 230, "ag": 227}
	for _, name := range []string{"ni", "cu", "al", "fe", "ag", "au"} {
		md := shippedModel(t, name)
		c, err := md.LinearCooling(0)
		if err != nil {
			t.Fatal(err)
		}
		o := c.Onset(V, 1)
		if !o.Reached {
			t.Errorf("%s: droplet never nucleates", name)
			continue
		}
		dT := c.Te - o.Temp
		t.Logf("%s: onset undercooling %.1f K (%.3f T_e); Turnbull %.0f K", name, dT, dT/c.Te, turnbull[name])
		if math.Abs(dT-turnbull[name]) > 0.1*turnbull[name] {
			t.Errorf("%s: onset undercooling %.1f K, Turnbull's %.0f K: more than 10 %% apart", name, dT, turnbull[name])
		}
	}
}

// TestWaterDroplets: the median freezing temperature of 75 µm water
// droplets cooled at 1 K/min is 237.3 K (Isenrich F.N. et al., The
// Microfluidic Ice Nuclei Counter Zürich (MINCZ), Atmos. Meas. Tech. 15
// (2022) 5367, abstract: standard deviation 0.1 K, accuracy 0.2 K; the
// cooling rate from memory). Half the droplets are frozen where the
// expected number of nuclei V·∫J dt is ln 2, that is where it is 1 in V/ln 2.
// The ice card was calibrated on rates, not on this median: within ±1 K
// (the 0.2 K accuracy, plus the ±1 decade between instruments over the
// slope of about 1.5 decades per kelvin; presets/measured_test.go holds the
// same row in its standing).
func TestWaterDroplets(t *testing.T) {
	md := shippedModel(t, "ice")
	c, err := md.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	V := 4.0 / 3 * math.Pi * math.Pow(37.5e-6, 3)
	o := c.Onset(V/math.Ln2, 1.0/60)
	if !o.Reached || math.Abs(o.Temp-237.3) > 1 {
		t.Errorf("75 µm droplet at 1 K/min: median %.2f K (reached %v), measured 237.3 K (±1 K)", o.Temp, o.Reached)
	}
	t.Logf("ice: median freezing %.2f K", o.Temp)
}

// BenchmarkCritical is the work of `cool --critical`: the path integral and
// the nose estimate, for the Vit1 card.
func BenchmarkCritical(b *testing.B) {
	md := shippedModel(b, "vit1")
	for b.Loop() {
		c, err := md.LinearCooling(0)
		if err != nil {
			b.Fatal(err)
		}
		_ = c.CriticalRate(1e-6)
		if _, _, err := c.NoseRate(1e-6); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkCurve10k is the work of `cool --curve` on a 10,000-point
// measured curve: fraction, onset and additivity sum.
func BenchmarkCurve10k(b *testing.B) {
	md := shippedModel(b, "demo-alloy")
	const n = 10000
	tm, tp := make([]float64, n), make([]float64, n)
	var t float64
	for i := range tm {
		t += 0.01 * (1 + 0.5*math.Sin(float64(i))) // uneven steps
		tm[i] = t
		tp[i] = 300 + 850*math.Exp(-t/20) // Newtonian cooling from 1150 K
	}
	p, err := kinetics.NewPath(tm, tp)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		a, err := md.AnalyzeCurve(p, 1e-6, 25)
		if err != nil {
			b.Fatal(err)
		}
		_ = kinetics.OnsetAlong(p, a.Sums, 1e-9)
	}
}
