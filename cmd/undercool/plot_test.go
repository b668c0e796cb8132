package main

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// goldenTTT is the golden TTT figure, refreshed with
//
//	go test ./cmd/undercool -run TestTTTPlotGolden -update
const goldenTTT = "../../testdata/plot/ttt-golden.svg"

// TestTTTPlotGolden draws the TTT curves of an invented material given on
// the command line (fixed here, so the figure does not move when a shipped
// card is edited) and compares the SVG byte for byte with the golden file.
func TestTTTPlotGolden(t *testing.T) {
	out := filepath.Join(t.TempDir(), "ttt.svg")
	args := []string{"ttt",
		"--te", "1150K", "--dh", "14.2kJ/mol", "--vm", "9.8cm3/mol", "--gamma", "0.140J/m2",
		"--d0", "1e-5m2/s", "--q", "200kJ/mol", "--tg", "600K",
		"--fraction", "0.01,0.5,0.99", "--plot", out}
	var stdout, stderr bytes.Buffer
	if code := run(args, nil, &stdout, &stderr); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr.String())
	}
	got, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if *update {
		if err := os.MkdirAll(filepath.Dir(goldenTTT), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(goldenTTT, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(goldenTTT)
	if err != nil {
		t.Fatalf("%v (create it with -update)", err)
	}
	if !bytes.Equal(got, want) {
		i := 0
		for i < len(got) && i < len(want) && got[i] == want[i] {
			i++
		}
		lo := max(0, i-80)
		t.Errorf("SVG differs from %s at byte %d:\n got …%s…\nwant …%s…\n(refresh with -update if the change is intended)",
			goldenTTT, i, got[lo:min(len(got), i+80)], want[lo:min(len(want), i+80)])
	}
}

func TestCheckPlotPath(t *testing.T) {
	dir := t.TempDir()
	for _, tc := range []struct {
		path, format, err string
	}{
		{filepath.Join(dir, "a.svg"), "svg", ""},
		{filepath.Join(dir, "a.PNG"), "png", ""},
		{filepath.Join(dir, "a.pdf"), "", "unsupported plot file type"},
		{filepath.Join(dir, "a"), "", "unsupported plot file type"},
		{filepath.Join(dir, ".svg"), "", "has no file name"},
	} {
		f, err := checkPlotPath(tc.path)
		if tc.err == "" {
			if err != nil || f != tc.format {
				t.Errorf("%s: %q, %v; want %q", tc.path, f, err, tc.format)
			}
			continue
		}
		if err == nil || !strings.Contains(err.Error(), tc.err) {
			t.Errorf("%s: err = %v, want %q", tc.path, err, tc.err)
		}
		if _, ok := err.(*valueError); !ok {
			t.Errorf("%s: %T, want a *valueError (bad input, exit 2)", tc.path, err)
		}
	}
}

// TestPlotLeavesNothingOnFailure: a figure that cannot be drawn (nothing
// transforms above T_e) fails with exit 1 and leaves no file and no
// temporary file behind; nothing is printed either.
func TestPlotLeavesNothingOnFailure(t *testing.T) {
	dir := t.TempDir()
	args := []string{"ttt", "--material", "demo-alloy", "--range", "1300:1200", "--plot", filepath.Join(dir, "hot.svg")}
	var stdout, stderr bytes.Buffer
	if code := run(args, nil, &stdout, &stderr); code != 1 {
		t.Fatalf("exit %d, want 1: %s", code, stderr.String())
	}
	if stdout.Len() != 0 {
		t.Errorf("stdout: %q", stdout.String())
	}
	ents, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	if len(ents) != 0 {
		t.Errorf("files left: %v", ents)
	}
	f := &tttFigure{fractions: []float64{0.5}, T: []float64{1000}, times: [][]float64{{math.Inf(1)}}}
	if _, err := f.plot(); err == nil {
		t.Error("no error for a figure without a finite time")
	}
}

func TestDecadeTicks(t *testing.T) {
	ticks := decadeTicks{}.Ticks(3e-9, 2e14)
	labels := 0
	for _, tk := range ticks {
		if tk.Label != "" {
			labels++
		}
	}
	if labels == 0 || labels > 9 {
		t.Errorf("%d labelled ticks over 23 decades, want 1 to 9", labels)
	}
	for k, want := range map[int]string{-8: "1e-8", -3: "0.001", 0: "1", 4: "10000", 5: "1e5"} {
		if got := decadeLabel(k); got != want {
			t.Errorf("decadeLabel(%d) = %q, want %q", k, got, want)
		}
	}
}
