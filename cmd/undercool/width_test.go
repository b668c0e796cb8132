package main

import (
	"bytes"
	"slices"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"
)

// screenCases are terminal runs beside the table goldens, so that every
// command and mode is drawn: the default rows, bands, a card with long
// sources, a quench factor alone, the fits.
var screenCases = [][]string{
	{"rate", "--material", "demo-alloy"},
	{"rate", "--material", "ni", "--spread", "gamma=2%", "--spread", "d0=x2", "--spread", "q=2%", "--samples", "50"},
	{"ttt", "--material", "demo-alloy", "--fraction", "0.01,0.5,0.99", "--spread", "gamma=1%", "--samples", "50"},
	{"hold", "--material", "vit1", "--at", "700K", "--spread", "gamma=2%", "--samples", "50"},
	{"cool", "--material", "vit1", "--critical", "--volume", "1mm3", "--spread", "gamma=2%", "--samples", "50"},
	{"cool", "--material", "demo-alloy", "--rate", "1,10,100K/s", "--volume", "1mm3"},
	{"cool", "--curve", "../../testdata/curves/demo-plate-quench.csv", "--c-curve", "k1=-0.00501,k2=5e-16s,k3=4000,k4=760K,k5=130kJ/mol"},
	{"materials", "ni"},
	{"materials", "paracetamol-acetone-water"},
	{"materials", "../../testdata/solution/demo-solute-a.toml"},
	{"fit", "interface", "../../testdata/fit/nucleation-rates.csv", "--material", "demo-alloy", "--weights=false"},
	{"rate", "--material", "paracetamol-acetone-water", "--temps", "20C,10C"},
}

// TestScreenWidth draws every terminal output, the table goldens (on 80:
// TestGolden checks them on 100) and the cases above, and every command's
// help, on screens of 80 and 100 characters: no line may be wider. The width is given as run gives it
// (screenWidth of the real stdout), so the two screens run in parallel.
func TestScreenWidth(t *testing.T) {
	t.Parallel()
	var runs, goldens [][]string // goldens: TestGolden checks them at 100
	for _, c := range goldenCases {
		if strings.HasSuffix(c.name, ".txt") {
			goldens = append(goldens, c.args)
		}
	}
	runs = append(runs, screenCases...)
	runs = append(runs, []string{"--help"})
	for _, name := range commandNames() {
		runs = append(runs, []string{name, "--help"})
		if name != "materials" {
			runs = append(runs, []string{name, "--material", "ni", "--help"})
		}
	}
	for _, w := range []int{80, 100} {
		t.Run(strconv.Itoa(w), func(t *testing.T) {
			t.Parallel()
			screenRuns(t, w, runs)
			if w < defaultWidth {
				screenRuns(t, w, goldens)
			}
		})
	}
}

// screenRuns runs each of runs fitted to w characters and checks that no
// line of its output is wider.
func screenRuns(t *testing.T, w int, runs [][]string) {
	for _, args := range runs {
		var stdout, stderr bytes.Buffer
		if code := runWidth(w, args, nil, &stdout, &stderr); code != 0 {
			t.Errorf("%s: exit %d: %s", strings.Join(args, " "), code, stderr.String())
			continue
		}
		wideLine(t, w, args, stdout.String())
	}
}

// wideLine reports the first line of out wider than w characters.
func wideLine(t *testing.T, w int, args []string, out string) {
	t.Helper()
	for i, l := range strings.Split(out, "\n") {
		if n := utf8.RuneCountInString(l); n > w {
			t.Errorf("%d columns, %s: line %d is %d characters wide:\n%s", w, strings.Join(args, " "), i+1, n, l)
			return
		}
	}
}

// TestScreenWidthDefault checks the width without $COLUMNS, writing to a
// buffer (no terminal): 100 characters; and with COLUMNS=80.
func TestScreenWidthDefault(t *testing.T) {
	t.Setenv("COLUMNS", "")
	var stdout, stderr bytes.Buffer
	if code := run([]string{"rate", "--material", "demo-alloy"}, nil, &stdout, &stderr); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr.String())
	}
	widths := []int{}
	for _, l := range strings.Split(stdout.String(), "\n") {
		widths = append(widths, utf8.RuneCountInString(l))
	}
	if m := slices.Max(widths); m > defaultWidth || m < defaultWidth-20 {
		t.Errorf("widest line %d characters; want at most %d and near it (the table fills the screen)", m, defaultWidth)
	}
	// $COLUMNS, when set, is the width
	t.Setenv("COLUMNS", "80")
	stdout.Reset()
	if code := run([]string{"rate", "--material", "demo-alloy"}, nil, &stdout, &stderr); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr.String())
	}
	for _, l := range strings.Split(stdout.String(), "\n") {
		if n := utf8.RuneCountInString(l); n > 80 {
			t.Errorf("COLUMNS=80: a line of %d characters:\n%s", n, l)
		}
	}
}

// TestCompleteFormats checks that CSV and Markdown stay whole on a narrow
// screen: every column of the rate table is there.
func TestCompleteFormats(t *testing.T) {
	t.Setenv("COLUMNS", "40")
	heads := []string{"T (K)", "T (°C)", "ΔT (K)", "Δg (J/m3)", "r* (nm)", "n*", "ΔG* (J)", "ΔG*/kT", "Z", "D (m2/s)", "log10 J (m^-3 s^-1) (invented)", "u (m/s) (invented)", "flags"}
	keys := "temperature_k,temperature_c,undercooling_k,driving_force_j_per_m3,critical_radius_m,critical_size,barrier_j,barrier_kt,zeldovich,diffusivity_m2_per_s,log10_rate_per_m3_s,growth_rate_m_per_s,flags"
	for _, format := range []string{"csv", "markdown"} {
		var stdout, stderr bytes.Buffer
		if code := run([]string{"rate", "--material", "demo-alloy", "--temps", "900K", "--format", format}, nil, &stdout, &stderr); code != 0 {
			t.Fatalf("exit %d: %s", code, stderr.String())
		}
		out := stdout.String()
		if format == "csv" && !strings.Contains(out, "\n"+keys+"\n") {
			t.Errorf("csv on a 40-character screen lacks the header %s:\n%s", keys, out)
		}
		if format != "markdown" {
			continue
		}
		var got []string
		for _, l := range strings.Split(out, "\n") {
			if strings.HasPrefix(l, "| T (K)") {
				for _, h := range strings.Split(strings.Trim(l, "|"), "|") {
					got = append(got, strings.TrimSpace(h))
				}
			}
		}
		if !slices.Equal(got, heads) {
			t.Errorf("markdown on a 40-character screen: columns %q, want %q", got, heads)
		}
	}
}
