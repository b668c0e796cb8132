package main

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/plot/plotter"
)

// TestHeatThenCoolCurve: a path that heats a glass and cools it again,
// given as a schedule (heat --schedule: two straight ramps) and as a
// measured curve of the same T(t) sampled every second (cool --curve),
// gives the same fraction and crystals per volume. The two go through the
// integrator by different routes (two long segments; 2,317 short ones on
// the five-sample rule), each to 1e-8 per piece; tolerance chosen
// beforehand: 1e-4 (the task's).
func TestHeatThenCoolCurve(t *testing.T) {
	const lo, hi, rate = 727.0, 920.0, 10.0 / 60 // K, K, K/s
	sched := runJSON(t, "heat", "--material", "lithium-disilicate", "--schedule",
		fmt.Sprintf("start at %gK; heat to %gK at 10K/min; cool to %gK at 10K/min", lo, hi, lo))
	ramp := (hi - lo) / rate
	var b strings.Builder
	b.WriteString("time_s,temperature_k\n")
	n := int(math.Round(2 * ramp))
	for i := 0; i <= n; i++ {
		tm := 2 * ramp * float64(i) / float64(n)
		T := lo + rate*tm
		if tm > ramp {
			T = hi - rate*(tm-ramp)
		}
		fmt.Fprintf(&b, "%.10g,%.10g\n", tm, T)
	}
	file := filepath.Join(t.TempDir(), "heat-cool.csv")
	if err := os.WriteFile(file, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	curve := runJSON(t, "cool", "--material", "lithium-disilicate", "--curve", file)
	xs, xc := num(t, sched["fraction"]), num(t, curve["fraction"])
	ns := num(t, sched["crystals_per_m3"])
	nc := num(t, sched["rows"].([]any)[1].(map[string]any)["crystals_per_m3"])
	if !(xs > 1e-6 && xs < 0.9) {
		t.Fatalf("fraction %g: the path must transform part of the glass to test anything", xs)
	}
	if d := xs/xc - 1; !(math.Abs(d) <= 1e-4) {
		t.Errorf("fraction: schedule %.10g, curve %.10g (%+.2g)", xs, xc, d)
	}
	if ns != nc {
		t.Errorf("crystals: at the end %g, the last step's row %g", ns, nc)
	}
	t.Logf("fraction: schedule %.10g, curve of %d points %.10g (%+.2g)", xs, n+1, xc, xs/xc-1)
}

// TestHeatDSCFitKissinger: the forward DSC peaks of a glass card, written
// as a peaks file and fed to fit kissinger, give the apparent energy the
// heat screen states (the same line, to rounding of the printed digits:
// 1e-6), and that energy lies within [0.5, 1.25] of the growth speed's own
// activation energy at the middle peak. The range was set beforehand from
// the form of the extended volume on heating: X_ext ∝ q⁻⁴·∫J(∫u)³, so the
// peaks move with about (3·E_u + E_N)/4, E_N the apparent energy of the
// nuclei counted so far (between 0, nucleation done, and about E_u, both
// following the viscosity), where the peaks lie far below the growth
// maximum; the margin covers the Tp² of Kissinger's ordinate and the
// driving force's share of u.
func TestHeatDSCFitKissinger(t *testing.T) {
	dsc := runJSON(t, "heat", "--material", "lithium-disilicate", "--dsc", "2,5,10,20K/min")
	var b strings.Builder
	b.WriteString("heating_rate_k_per_min,peak_temperature_k\n")
	for _, r := range dsc["rows"].([]any) {
		row := r.(map[string]any)
		fmt.Fprintf(&b, "%.12g,%.12g\n", num(t, row["heating_rate_k_per_min"]), num(t, row["peak_temperature_k"]))
	}
	file := filepath.Join(t.TempDir(), "peaks.csv")
	if err := os.WriteFile(file, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	fit := runJSON(t, "fit", "kissinger", file)
	E, stated, Eu := num(t, fit["activation_energy_j_per_mol"]), num(t, dsc["kissinger_apparent_energy_j_per_mol"]), num(t, dsc["growth_activation_energy_j_per_mol"])
	if d := E/stated - 1; !(math.Abs(d) <= 1e-6) {
		t.Errorf("fit kissinger E = %.8g J/mol, the heat screen states %.8g (%+.2g)", E, stated, d)
	}
	if !(E >= 0.5*Eu && E <= 1.25*Eu) {
		t.Errorf("apparent E = %.4g kJ/mol outside [0.5, 1.25] of the growth energy %.4g kJ/mol", E/1e3, Eu/1e3)
	}
	t.Logf("apparent E = %.4g kJ/mol, growth energy at the middle peak %.4g kJ/mol: ratio %.3f", E/1e3, Eu/1e3, E/Eu)
}

// TestHeatCriticalEndToEnd: the critical heating rate through the CLI.
// Heating at it gives the target fraction at the end of the path (the
// q⁻⁴ closed form against the same path read at that rate, to 1e-9 in X),
// the critical cooling rate beside it is cool --critical's, and the ratio
// is theirs.
func TestHeatCriticalEndToEnd(t *testing.T) {
	crit := runJSON(t, "heat", "--material", "lithium-disilicate", "--critical")
	qh, qc, ratio := num(t, crit["critical_heating_rate_k_per_s"]), num(t, crit["critical_cooling_rate_k_per_s"]), num(t, crit["heating_to_cooling_ratio"])
	cool := runJSON(t, "cool", "--material", "lithium-disilicate", "--critical")
	if want := num(t, cool["critical_cooling_rate_k_per_s"]); qc != want {
		t.Errorf("critical cooling rate %.10g beside the heating one, cool --critical %.10g", qc, want)
	}
	if ratio != qh/qc {
		t.Errorf("ratio %.10g, want %.10g", ratio, qh/qc)
	}
	at := runJSON(t, "heat", "--material", "lithium-disilicate", "--rate", fmt.Sprintf("%.17gK/s", qh))
	if X := num(t, at["fraction"]); !(math.Abs(X/1e-6-1) <= 1e-9) {
		t.Errorf("heating at the critical rate %.10g K/s: fraction %.12g, want 1e-6", qh, X)
	}
}

// TestHeatPlot: --dsc --plot writes the dX/dT curves, one per rate, named
// in the legend.
func TestHeatPlot(t *testing.T) {
	dir := t.TempDir()
	code, _, stderr := runIn(t, dir, "heat", "--material", "lithium-disilicate", "--dsc", "2,10K/min", "--plot", "dsc.svg")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	svg, err := os.ReadFile(filepath.Join(dir, "dsc.svg"))
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"2 K/min", "10 K/min", "dX/dT (1/K)"} {
		if !strings.Contains(string(svg), want) {
			t.Errorf("the figure has no %q", want)
		}
	}
}

// TestPeakSpan: the plot spans where a curve is above a thousandth of its
// own peak, a tenth more on each side; a flat curve gives no span.
func TestPeakSpan(t *testing.T) {
	peak := func(at, w float64) plotter.XYs {
		var c plotter.XYs
		for x := 700.0; x <= 1300; x++ {
			c = append(c, plotter.XY{X: x, Y: math.Exp(-(x - at) * (x - at) / (2 * w * w))})
		}
		return c
	}
	// exp(−d²/2w²) > 1e-3 for |d| < w·√(2 ln 1000) = 3.717w: with w = 10,
	// 900 ± 37 and 1000 ± 37 on the integer grid
	lo, hi, ok := peakSpan([]plotter.XYs{peak(900, 10), peak(1000, 10)})
	if !ok || math.Abs(lo-(863-17.4)) > 1e-9 || math.Abs(hi-(1037+17.4)) > 1e-9 {
		t.Errorf("span [%g, %g] %v, want [845.6, 1054.4]", lo, hi, ok)
	}
	if _, _, ok := peakSpan([]plotter.XYs{{{X: 1, Y: 0}, {X: 2, Y: 0}}}); ok {
		t.Error("a flat curve gave a span")
	}
}
