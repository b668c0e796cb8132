package main

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/answer"
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
	// one way for every decade: no 100 beside 1e6
	for k, want := range map[int]string{-8: "1e-8", -3: "1e-3", 0: "1e0", 2: "1e2", 4: "1e4", 5: "1e5"} {
		if got := decadeLabel(k); got != want {
			t.Errorf("decadeLabel(%d) = %q, want %q", k, got, want)
		}
	}
}

// figureText runs a command that writes an SVG figure and returns its
// text, the figure's words.
func figureText(t *testing.T, args ...string) string {
	t.Helper()
	out := filepath.Join(t.TempDir(), "f.svg")
	var stdout, stderr bytes.Buffer
	if code := run(append(args, "--plot", out), nil, &stdout, &stderr); code != 0 {
		t.Fatalf("%s: exit %d: %s", strings.Join(args, " "), code, stderr.String())
	}
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// TestFigures checks what the figures say: each nose named with several
// fractions, invented materials said to be invented, decades labelled one
// way, a measured curve drawn with where it reaches X (or its additivity
// sum or quench factor reaches 1), in cool and in the memo.
func TestFigures(t *testing.T) {
	curve := filepath.Join(repoRoot(), "testdata", "curves", "demo-quench.csv")
	plate := filepath.Join(repoRoot(), "testdata", "curves", "demo-plate-quench.csv")
	root, _ := caseFiles(t)
	own, linear := filepath.Join(root, "cool_linear_curve", "own.toml"), filepath.Join(root, "cool_linear_curve", "linear.csv")
	for _, c := range []struct {
		args []string
		want []string
	}{
		{[]string{"ttt", "--material", "demo-alloy", "--fraction", "0.01,0.5,0.99"}, []string{"TTT, demo-alloy (invented demo)",
			">nose of X = 0.01: 831.55 K, 1.00 min<", ">nose of X = 0.5: 831.55 K, 2.89 min<", ">nose of X = 0.99: 831.55 K, 4.64 min<", ">1e2<", ">Te = 1150.00 K<"}},
		{[]string{"cool", "--material", "vit1", "--critical"}, []string{"CCT over TTT, vit1:", ">nose: 895.00 K, 1.00 min<", ">critical rate 0.727 K/s<", ">Tg = 625.00 K<"}},
		{[]string{"cool", "--material", "demo-alloy", "--curve", curve}, []string{"measured curve over TTT, demo-alloy (invented demo)",
			">measured curve (X = 1e-06 not reached: 5.37e-08 at its end)<", ">additivity sum reaches 1: 766.68 K, 19.7 s into the curve<"}},
		{[]string{"cool", "--material", own, "--curve", linear}, []string{">measured curve<", ">X = 1e-06 reached: "}},
		{[]string{"cool", "--curve", plate, "--c-curve", "k1=-0.00501,k2=5e-16s,k3=4000,k4=760K,k5=130kJ/mol"}, []string{">C-curve<", ">quench factor reaches 1: 544.58 K, 3.69 s into the curve<"}},
		{[]string{"rate", "--material", "demo-alloy"}, []string{"nucleation and growth rates, demo-alloy (invented demo)"}},
		{[]string{"report", "--material", "demo-alloy", "--curve", curve, "--date", "2026-01-15", "--out", "-"}, []string{">measured curve (X = 1e-06 not reached", ">additivity sum reaches 1: 766.68 K"}},
	} {
		svg := figureText(t, c.args...)
		for _, w := range c.want {
			if !strings.Contains(svg, w) {
				t.Errorf("%s: the figure lacks %q", strings.Join(c.args, " "), w)
			}
		}
		if !strings.Contains(svg, ">1e") {
			t.Errorf("%s: no decade labelled 1e…", strings.Join(c.args, " "))
		}
	}
}

// TestTimeAxisSpan checks that a TTT figure's time axis stops a factor of 3
// beyond 1e4 times the slowest nose (it ran to 1e13 s for lithium
// disilicate, whose nose is at 1.3e8 s), and that a legend sits beside the
// axes, clear of the data and of the T_e and T_g lines.
func TestTimeAxisSpan(t *testing.T) {
	for _, name := range []string{"lithium-disilicate", "demo-alloy", "vit1"} {
		c, err := presets.Open(name)
		if err != nil {
			t.Fatal(err)
		}
		md, err := c.Model()
		if err != nil {
			t.Fatal(err)
		}
		lo, hi := answer.DefaultSpan(md)
		table, err := md.TTT(answer.Spread(hi, lo, 31), []float64{0.01, 0.99}, kinetics.JMAK{}, lo, hi)
		if err != nil {
			t.Fatal(err)
		}
		fig, err := tttFigureOf(md, c, table)
		if err != nil {
			t.Fatal(err)
		}
		p, err := fig.plot()
		if err != nil {
			t.Fatal(err)
		}
		slow := math.Exp(table.Noses[1].LnTime)
		if limit := 3 * slow * 1e4; p.X.Max > limit*(1+1e-9) {
			t.Errorf("%s: time axis to %.3g s, beyond 3 x 1e4 x the nose time (%.3g s)", name, p.X.Max, limit)
		}
		r := figureLayout([]*plot.Plot{p})
		dc := draw.New(vgsvg.New(r.width, r.height))
		plotC, legC := r.panel(dc, 0)
		if data := p.DataCanvas(plotC); legC.Min.X <= data.Max.X {
			t.Errorf("%s: the legend starts at x = %v, inside the axes (to %v)", name, legC.Min.X, data.Max.X)
		}
	}
}
