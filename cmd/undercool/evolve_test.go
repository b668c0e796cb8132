package main

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// evolveJSON runs evolve in-process with --format json and decodes it.
func evolveJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	return runJSON(t, append([]string{"evolve"}, args...)...)
}

// runJSON runs a command in-process with --format json and decodes it.
func runJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	var stdout, stderr bytes.Buffer
	if code := run(append(args, "--format", "json"), nil, &stdout, &stderr); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr.String())
	}
	var out map[string]any
	if err := json.Unmarshal(stdout.Bytes(), &out); err != nil {
		t.Fatal(err)
	}
	return out
}

func num(t *testing.T, v any) float64 {
	t.Helper()
	x, ok := v.(float64)
	if !ok {
		t.Fatalf("%v is not a number", v)
	}
	return x
}

// The ageing of the alloy card after a solution treatment and a quench,
// against values worked out by hand from the card (solvus ln c_eq =
// 1.2706 − 6900.3 K/T, c0 = 0.0018, cp = 0.25):
//
//   - the schedule as understood: the quench from 640 to 20 °C at 50 K/s
//     takes 620/50 = 12.4 s, so it ends at 3612.4 s, and the ageing ends
//     at 3612.4 + 86400 s;
//   - the alloy becomes supersaturated where the quench crosses the
//     solvus temperature of c0, 6900.3/(1.2706 − ln 0.0018) = 909.0623 K,
//     at 3600 + (913.15 − 909.0623)/50 = 3600.08175 s (to the bisection's
//     1e-9 of the duration);
//   - every row closes the solute balance c·(1 − f_v) + f_v·c_p = c0 to
//     1e-9, and its time since the onset is its time less the onset;
//   - the yield is f_v·c_p/c0 and the equilibrium yield at 300 °C, with
//     c_eq = 2.10490e-5, is (c0 − c_eq)/(c_p − c_eq)·c_p/c0 = 0.988389.
func TestEvolveAlloyByHand(t *testing.T) {
	out := evolveJSON(t, "--material", "al-sc", "--schedule", "start at 640C; hold 1h; cool to 20C at 50K/s; jump to 300C; hold 24h", "--classes", "100")
	steps := out["inputs"].(map[string]any)["schedule"].(map[string]any)["steps"].([]any)
	if len(steps) != 5 {
		t.Fatalf("%d steps, want 5", len(steps))
	}
	cool, last := steps[2].(map[string]any), steps[4].(map[string]any)
	if got := num(t, cool["end_s"]); math.Abs(got-3612.4) > 1e-9 {
		t.Errorf("quench ends at %g s, want 3612.4", got)
	}
	if got := num(t, last["end_s"]); math.Abs(got-(3612.4+86400)) > 1e-6 {
		t.Errorf("ageing ends at %g s", got)
	}
	onset := num(t, out["supersaturated_at_s"])
	if want := 3600 + (913.15-909.0623312725724)/50; math.Abs(onset-want) > 1e-9*90012.4 {
		t.Errorf("onset %.9g s, want %.9g", onset, want)
	}
	for _, r := range out["rows"].([]any) {
		row := r.(map[string]any)
		tm, fv, c := num(t, row["time_s"]), num(t, row["volume_fraction"]), num(t, row["matrix_concentration"])
		if b := c*(1-fv) + fv*0.25; math.Abs(b-0.0018) > 1e-9*0.0018 {
			t.Errorf("t = %g s: balance %.12g, want 0.0018", tm, b)
		}
		since := row["time_supersaturated_s"]
		switch {
		case tm < onset && since != nil:
			t.Errorf("t = %g s before the onset: since %v, want null", tm, since)
		case tm >= onset && math.Abs(num(t, since)-(tm-onset)) > 1e-9*tm:
			t.Errorf("t = %g s: since %v, want %g", tm, since, tm-onset)
		}
	}
	rows := out["rows"].([]any)
	end := rows[len(rows)-1].(map[string]any)
	if got, want := num(t, out["yield"]), num(t, end["volume_fraction"])*0.25/0.0018; math.Abs(got-want) > 1e-12 {
		t.Errorf("yield %g, want f_v cp/c0 = %g", got, want)
	}
	if got := num(t, out["equilibrium_yield"]); math.Abs(got-0.9883893) > 1e-6 {
		t.Errorf("equilibrium yield %.7g, want 0.9883893", got)
	}
	if b := num(t, out["solute_balance_error"]); b > 1e-9 {
		t.Errorf("solute balance error %g", b)
	}
}

// The crystallizer card cooled from 30 to −10 °C: the yield at the end is
// (C0 − C)/C0 of the last row, and the equilibrium yield is the solubility
// drop of the van 't Hoff law of the card, 1 − exp(−(11700/8.314462618)·
// (1/263.15 − 1/298.15)) = 0.466203 (by hand); D10 ≤ D50 ≤ D90; the
// histogram holds every crystal.
func TestEvolveCrystallizerByHand(t *testing.T) {
	out := evolveJSON(t, "--material", "paracetamol-ethanol", "--growth-kg", "0.1um/s", "--growth-order", "1.5",
		"--schedule", "start at 30C; cool to -10C at 1K/min; hold 1h")
	rows := out["rows"].([]any)
	end := rows[len(rows)-1].(map[string]any)
	c0 := 143 / 0.15116
	if got, want := num(t, out["yield"]), (c0-num(t, end["concentration_mol_per_m3"]))/c0; math.Abs(got-want) > 1e-9 {
		t.Errorf("yield %g, want %g", got, want)
	}
	if got := num(t, out["equilibrium_yield"]); math.Abs(got-0.466203) > 2e-6 {
		t.Errorf("equilibrium yield %.7g, want 0.466203", got)
	}
	d10, d50, d90 := num(t, out["d10_m"]), num(t, out["d50_m"]), num(t, out["d90_m"])
	if !(d10 > 0 && d10 <= d50 && d50 <= d90) {
		t.Errorf("D10, D50, D90 = %g, %g, %g", d10, d50, d90)
	}
	var inBins float64
	for _, b := range out["histogram"].([]any) {
		inBins += num(t, b.(map[string]any)["number_per_m3"])
	}
	if n := num(t, end["number_density_per_m3"]); math.Abs(inBins-n) > 1e-9*n {
		t.Errorf("histogram holds %g crystals per m3, the last row %g", inBins, n)
	}
}

// Ctrl-C cancels the run through its context: exit status 130, one line
// on stderr, nothing on stdout and no figure written.
func TestEvolveInterrupted(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	baseContext = func() context.Context { return ctx }
	t.Cleanup(func() { baseContext = context.Background })
	dir := t.TempDir()
	plot := filepath.Join(dir, "e.svg")
	var stdout, stderr bytes.Buffer
	code := run([]string{"evolve", "--material", "al-sc", "--schedule", "hold 24h at 300C", "--plot", plot}, nil, &stdout, &stderr)
	if code != 130 || stderr.String() != "undercool: evolve: interrupted; nothing written\n" || stdout.Len() != 0 {
		t.Errorf("exit %d, stderr %q, stdout %q", code, stderr.String(), stdout.String())
	}
	if _, err := os.Stat(plot); !os.IsNotExist(err) {
		t.Errorf("the figure was written: %v", err)
	}
}

// --plot and --dist-plot write both figures, in the format of their
// extension, only after the run.
func TestEvolvePlots(t *testing.T) {
	dir := t.TempDir()
	svg, png := filepath.Join(dir, "e.svg"), filepath.Join(dir, "d.png")
	var stdout, stderr bytes.Buffer
	if code := run([]string{"evolve", "--material", "al-sc", "--schedule", "hold 24h at 300C", "--plot", svg, "--dist-plot", png}, nil, &stdout, &stderr); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr.String())
	}
	b, err := os.ReadFile(svg)
	if err != nil || !bytes.Contains(b, []byte("<svg")) || !bytes.Contains(b, []byte("number density, al-sc")) || !bytes.Contains(b, []byte("time since S &gt; 1 (s)")) {
		t.Errorf("%s: %v, %d bytes", svg, err, len(b))
	}
	if b, err := os.ReadFile(png); err != nil || !bytes.HasPrefix(b, []byte("\x89PNG")) {
		t.Errorf("%s: %v", png, err)
	}
	if !strings.Contains(stdout.String(), "final distribution, radius in 20 bins") {
		t.Errorf("stdout lacks the distribution table")
	}
}

// BenchmarkEvolveCommand is the whole command path of a 100 h ageing of
// the alloy card at 300 °C: the card, the run at the command line's
// tolerance (1e-4, tighter than the engine benchmark's 1e-3), the answer
// and its JSON.
func BenchmarkEvolveCommand(b *testing.B) {
	args := []string{"evolve", "--material", "al-sc", "--schedule", "hold 100h at 300C", "--format", "json"}
	for b.Loop() {
		var stdout, stderr bytes.Buffer
		if code := run(args, nil, &stdout, &stderr); code != 0 {
			b.Fatalf("exit %d: %s", code, stderr.String())
		}
	}
}
