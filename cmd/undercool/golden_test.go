package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// goldenDir holds the pinned outputs of every command and mode, refreshed with
//
//	go test ./cmd/undercool -run TestGolden -update
//
// A change to one of them is a change of behaviour: it must be meant, and
// said so in the commit that makes it.
const goldenDir = "../../testdata/golden"

// goldenCases are the pinned runs: name (the file, whose extension is the
// output's format) and arguments. Paths are relative to this directory, so
// the outputs that name a file are the same in every checkout. Every
// material is shipped or in testdata, and invented where it says so.
var goldenCases = []struct {
	name string
	args []string
}{
	// rate
	{"rate-demo.json", []string{"rate", "--material", "demo-alloy", "--format", "json"}},
	{"rate-demo.txt", []string{"rate", "--material", "demo-alloy", "--range", "1100:700:100"}},
	{"rate-demo.csv", []string{"rate", "--material", "demo-alloy", "--range", "1100:700:100", "--format", "csv"}},
	{"rate-demo.md", []string{"rate", "--material", "demo-alloy", "--range", "1100:700:100", "--format", "markdown"}},
	{"rate-ice.json", []string{"rate", "--material", "ice", "--range", "273:200:10", "--format", "json"}},
	{"rate-fixed.json", []string{"rate", "--te", "1000", "--dh", "10kJ/mol", "--vm", "7cm3/mol", "--gamma", "0.1J/m2",
		"--prefactor", "fixed", "--j0", "1e40", "--temps", "900,1000,1100", "--format", "json"}},
	{"rate-nomobility.txt", []string{"rate", "--te", "1000", "--dh", "10kJ/mol", "--vm", "7cm3/mol", "--gamma", "0.1J/m2", "--temps", "900"}},
	{"rate-hetero.json", []string{"rate", "--material", "demo-alloy", "--gamma", "118mJ/m2", "--theta", "90", "--sites", "1e20",
		"--temps", "1000", "--format", "json"}},
	{"rate-spread.json", []string{"rate", "--material", "demo-alloy", "--temps", "1000,900", "--spread", "gamma=2%",
		"--spread", "q=3kJ/mol", "--spread", "d0=x2", "--samples", "200", "--format", "json"}},
	{"rate-spread.txt", []string{"rate", "--material", "demo-alloy", "--temps", "1000,900", "--spread", "gamma=2%",
		"--spread", "q=3kJ/mol", "--spread", "d0=x2", "--samples", "200"}},
	// ttt
	{"ttt-demo.json", []string{"ttt", "--material", "demo-alloy", "--format", "json"}},
	{"ttt-demo.txt", []string{"ttt", "--material", "demo-alloy", "--range", "1100:700:50"}},
	{"ttt-fractions.json", []string{"ttt", "--material", "demo-alloy", "--fraction", "0.01,0.5,0.99", "--range", "1100:700:50", "--format", "json"}},
	{"ttt-fractions.txt", []string{"ttt", "--material", "demo-alloy", "--fraction", "0.01,0.5,0.99", "--range", "1100:700:50"}},
	{"ttt-fractions.csv", []string{"ttt", "--material", "demo-alloy", "--fraction", "0.01,0.5,0.99", "--range", "1100:700:50", "--format", "csv"}},
	{"ttt-lag.json", []string{"ttt", "--material", "demo-alloy", "--lag", "--format", "json"}},
	{"ttt-nuclei.json", []string{"ttt", "--material", "demo-alloy", "--nuclei", "1e14", "--format", "json"}},
	{"ttt-outside.json", []string{"ttt", "--material", "demo-alloy", "--range", "1100:1000:50", "--format", "json"}},
	{"ttt-glass.json", []string{"ttt", "--material", "lithium-disilicate", "--format", "json"}},
	{"ttt-spread.json", []string{"ttt", "--material", "demo-alloy", "--range", "1100:700:50", "--fraction", "0.01,0.5",
		"--spread", "gamma=1%", "--spread", "d0=x2", "--samples", "100", "--format", "json"}},
	// hold
	{"hold-demo.json", []string{"hold", "--material", "demo-alloy", "--at", "800K", "--format", "json"}},
	{"hold-demo.txt", []string{"hold", "--material", "demo-alloy", "--at", "800K"}},
	{"hold-demo.csv", []string{"hold", "--material", "demo-alloy", "--at", "800K", "--format", "csv"}},
	{"hold-lag.json", []string{"hold", "--material", "demo-alloy", "--at", "800K", "--lag", "--format", "json"}},
	{"hold-nuclei.json", []string{"hold", "--material", "demo-alloy", "--at", "800K", "--nuclei", "1e18", "--format", "json"}},
	{"hold-never.json", []string{"hold", "--material", "demo-alloy", "--at", "1200K", "--format", "json"}},
	{"hold-never.txt", []string{"hold", "--material", "demo-alloy", "--at", "1200K"}},
	{"hold-spread.json", []string{"hold", "--material", "demo-alloy", "--at", "900", "--spread", "gamma=2%", "--spread", "q=2%",
		"--samples", "200", "--seed", "5", "--format", "json"}},
	// hold of a solution: the induction time of a volume
	{"hold-induction.json", []string{"hold", "--material", "../../testdata/solution/demo-solute-a.toml", "--at", "25C",
		"--supersaturation", "2", "--volume", "100mL", "--format", "json"}},
	{"hold-induction.txt", []string{"hold", "--material", "../../testdata/solution/demo-solute-a.toml", "--at", "25C",
		"--supersaturation", "2", "--volume", "100mL"}},
	{"hold-induction.csv", []string{"hold", "--material", "../../testdata/solution/demo-solute-a.toml", "--at", "25C",
		"--supersaturation", "2", "--volume", "100mL", "--format", "csv"}},
	{"hold-induction-spread.json", []string{"hold", "--material", "paracetamol-acetone-water", "--at", "285", "--volume", "1mL",
		"--prefactor", "fixed", "--j0", "1e20", "--spread", "gamma=5%", "--spread", "sat_temp=1K", "--samples", "100", "--format", "json"}},
	// cool: linear cooling from Te
	{"cool-rates.json", []string{"cool", "--material", "demo-alloy", "--rate", "1,10,100K/s", "--format", "json"}},
	{"cool-rates.txt", []string{"cool", "--material", "demo-alloy", "--rate", "1,10,100K/s"}},
	{"cool-rate-volume.json", []string{"cool", "--material", "demo-alloy", "--rate", "1K/s", "--volume", "1mm3", "--format", "json"}},
	{"cool-rate-volume.txt", []string{"cool", "--material", "demo-alloy", "--rate", "1K/s", "--volume", "1mm3"}},
	{"cool-rate-end.json", []string{"cool", "--material", "demo-alloy", "--rate", "1e4K/s", "--end", "585K", "--format", "json"}},
	// heat: a glass heated from Tg
	{"heat-dsc.txt", []string{"heat", "--material", "lithium-disilicate", "--dsc", "2,5,10,20K/min"}},
	{"heat-dsc.json", []string{"heat", "--material", "lithium-disilicate", "--dsc", "2,5,10,20K/min", "--format", "json"}},
	{"heat-dsc.csv", []string{"heat", "--material", "lithium-disilicate", "--dsc", "2,5,10,20K/min", "--format", "csv"}},
	{"heat-critical.txt", []string{"heat", "--material", "lithium-disilicate", "--critical"}},
	{"heat-critical.json", []string{"heat", "--material", "lithium-disilicate", "--critical", "--format", "json"}},
	{"heat-critical-sucrose.txt", []string{"heat", "--material", "sucrose", "--critical"}},
	{"heat-critical-cooled.json", []string{"heat", "--material", "lithium-disilicate", "--critical", "--cooled-at", "1K/s", "--format", "json"}},
	{"heat-rate.txt", []string{"heat", "--material", "lithium-disilicate", "--rate", "10K/min", "--from", "25C", "--to", "1000K", "--fraction", "0.01"}},
	{"heat-rate-cooled.json", []string{"heat", "--material", "lithium-disilicate", "--rate", "10K/min", "--cooled-at", "1K/s", "--format", "json"}},
	{"heat-schedule.txt", []string{"heat", "--material", "lithium-disilicate", "--schedule",
		"start at 1307K; cool to 727K at 1K/s; heat to 740K at 10K/min; hold 2h; heat to 900K at 10K/min; hold 30min"}},
	{"heat-schedule.json", []string{"heat", "--material", "lithium-disilicate", "--schedule",
		"start at 1307K; cool to 727K at 1K/s; heat to 740K at 10K/min; hold 2h; heat to 900K at 10K/min; hold 30min", "--format", "json"}},
	{"heat-dsc.md", []string{"heat", "--material", "vit1", "--dsc", "1,2,5,20K/min", "--format", "markdown"}},
	{"cool-critical.json", []string{"cool", "--material", "demo-alloy", "--critical", "--format", "json"}},
	{"cool-critical.txt", []string{"cool", "--material", "demo-alloy", "--critical"}},
	{"cool-critical.csv", []string{"cool", "--material", "demo-alloy", "--critical", "--format", "csv"}},
	{"cool-critical-volume.json", []string{"cool", "--material", "demo-alloy", "--critical", "--volume", "1mm3", "--format", "json"}},
	{"cool-critical-vit1.json", []string{"cool", "--material", "vit1", "--critical", "--format", "json"}},
	{"cool-critical-spread.json", []string{"cool", "--material", "demo-alloy", "--critical", "--volume", "1mm3", "--spread", "gamma=2%",
		"--spread", "d0=x2", "--samples", "100", "--format", "json"}},
	{"cool-rates-spread.json", []string{"cool", "--material", "demo-alloy", "--rate", "1,100K/s", "--spread", "gamma=2%",
		"--samples", "100", "--format", "json"}},
	// cool: a measured curve
	{"cool-curve.json", []string{"cool", "--material", "demo-alloy", "--curve", "../../testdata/curves/demo-quench.csv", "--format", "json"}},
	{"cool-curve.txt", []string{"cool", "--material", "demo-alloy", "--curve", "../../testdata/curves/demo-quench.csv", "--volume", "1mm3"}},
	{"cool-curve-volume.json", []string{"cool", "--material", "demo-alloy", "--curve", "../../testdata/curves/demo-quench.csv",
		"--volume", "1mm3", "--format", "json"}},
	{"cool-curve-ccurve.json", []string{"cool", "--curve", "../../testdata/curves/demo-plate-quench.csv",
		"--c-curve", "k1=-0.00501,k2=5e-16s,k3=4000,k4=760K,k5=130kJ/mol", "--band", "50K", "--format", "json"}},
	{"cool-curve-ccurve.csv", []string{"cool", "--curve", "../../testdata/curves/demo-plate-quench.csv",
		"--c-curve", "k1=-0.00501,k2=5e-16s,k3=4000,k4=760K,k5=130kJ/mol", "--band", "50K", "--format", "csv"}},
	{"cool-curve-spread.json", []string{"cool", "--material", "demo-alloy", "--curve", "../../testdata/curves/demo-quench.csv",
		"--volume", "1mm3", "--spread", "gamma=2%", "--samples", "50", "--format", "json"}},
	// cool: the metastable zone of a cooled solution
	{"cool-zone.json", []string{"cool", "--material", "../../testdata/solution/demo-solute-a.toml", "--rate", "0.1,0.5,2,10K/min",
		"--volume", "100mL", "--format", "json"}},
	{"cool-zone.txt", []string{"cool", "--material", "../../testdata/solution/demo-solute-a.toml", "--rate", "0.1,0.5,2,10K/min",
		"--volume", "100mL"}},
	{"cool-zone-one.json", []string{"cool", "--material", "../../testdata/solution/demo-solute-a.toml", "--rate", "0.5K/min",
		"--volume", "100mL", "--format", "json"}},
	{"cool-zone-table.json", []string{"cool", "--material", "../../testdata/solution/demo-solute-a.toml", "--rate", "0.5K/min",
		"--volume", "100mL", "--solubility", "../../testdata/solution/demo-solute-a-solubility.csv", "--conc", "22g/kg", "--format", "json"}},
	// solution rates
	{"rate-solution.json", []string{"rate", "--material", "../../testdata/solution/demo-solute-a.toml", "--temps", "30C,20C,10C", "--format", "json"}},
	{"rate-solution.txt", []string{"rate", "--material", "../../testdata/solution/demo-solute-a.toml", "--temps", "30C,20C,10C"}},
	{"rate-solution-fixed.json", []string{"rate", "--material", "../../testdata/solution/demo-solute-a.toml", "--supersaturation", "1.5",
		"--temps", "25C", "--format", "json"}},
	{"rate-paracetamol.json", []string{"rate", "--material", "paracetamol-acetone-water", "--temps", "20C,10C", "--format", "json"}},
	// fit
	{"fit-arrhenius.json", []string{"fit", "arrhenius", "../../testdata/fit/diffusion.csv", "--format", "json"}},
	{"fit-arrhenius.txt", []string{"fit", "arrhenius", "../../testdata/fit/diffusion.csv"}},
	{"fit-arrhenius.csv", []string{"fit", "arrhenius", "../../testdata/fit/diffusion.csv", "--format", "csv"}},
	{"fit-interface.json", []string{"fit", "interface", "../../testdata/fit/nucleation-rates.csv", "--material", "demo-alloy", "--format", "json"}},
	{"fit-interface.txt", []string{"fit", "interface", "../../testdata/fit/nucleation-rates.csv", "--material", "demo-alloy"}},
	{"fit-avrami.json", []string{"fit", "avrami", "../../testdata/fit/crystallized-fraction.csv", "--format", "json"}},
	{"fit-avrami.txt", []string{"fit", "avrami", "../../testdata/fit/crystallized-fraction.csv"}},
	{"fit-induction.json", []string{"fit", "induction", "../../testdata/solution/demo-solute-a-induction.csv",
		"--material", "../../testdata/solution/demo-solute-a.toml", "--volume", "100mL", "--format", "json"}},
	{"fit-induction.txt", []string{"fit", "induction", "../../testdata/solution/demo-solute-a-induction.csv",
		"--material", "../../testdata/solution/demo-solute-a.toml", "--volume", "100mL"}},
	{"fit-induction-novolume.json", []string{"fit", "induction", "../../testdata/solution/demo-solute-a-induction.csv",
		"--vm", "120cm3/mol", "--format", "json"}},
	{"fit-growth.json", []string{"fit", "growth", "../../testdata/measured/lithium-disilicate-growth.csv", "--material", "lithium-disilicate", "--format", "json"}},
	{"fit-growth.txt", []string{"fit", "growth", "../../testdata/measured/lithium-disilicate-growth.csv", "--material", "lithium-disilicate"}},
	{"fit-interface-linear.txt", []string{"fit", "interface", "../../testdata/measured/lithium-disilicate-nucleation.csv", "--material", "lithium-disilicate", "--keep-prefactor"}},
	{"fit-interface-linear.json", []string{"fit", "interface", "../../testdata/measured/lithium-disilicate-nucleation.csv", "--material", "lithium-disilicate", "--format", "json"}},
	{"fit-kissinger.txt", []string{"fit", "kissinger", "../../testdata/fit/glass-peaks.csv"}},
	{"fit-kissinger.json", []string{"fit", "kissinger", "../../testdata/fit/glass-peaks.csv", "--format", "json"}},
	{"fit-kissinger.csv", []string{"fit", "kissinger", "../../testdata/fit/glass-peaks.csv", "--format", "csv"}},
	{"fit-ozawa.txt", []string{"fit", "ozawa", "../../testdata/fit/glass-peaks.csv"}},
	{"fit-ozawa.json", []string{"fit", "ozawa", "../../testdata/fit/glass-peaks.csv", "--format", "json"}},
	{"fit-ozawa-exponent.txt", []string{"fit", "ozawa", "../../testdata/fit/glass-fractions.csv"}},
	{"fit-ozawa-exponent.json", []string{"fit", "ozawa", "../../testdata/fit/glass-fractions.csv", "--format", "json"}},
	{"fit-ozawa-exponent.md", []string{"fit", "ozawa", "../../testdata/fit/glass-fractions.csv", "--format", "markdown"}},
	// calibrated cards: the glassy branch, the calibrated range
	{"hold-indomethacin.txt", []string{"hold", "--material", "indomethacin", "--at", "25C", "--fraction", "0.01"}},
	{"hold-indomethacin.json", []string{"hold", "--material", "indomethacin", "--at", "0C", "--fraction", "0.01", "--format", "json"}},
	{"ttt-vit1.txt", []string{"ttt", "--material", "vit1", "--range", "990:650:20"}},
	// materials
	{"materials-lithium-disilicate.txt", []string{"materials", "lithium-disilicate"}},
	{"materials.json", []string{"materials", "--format", "json"}},
	{"materials.txt", []string{"materials"}},
	{"materials-demo.json", []string{"materials", "demo-alloy", "--format", "json"}},
	{"materials-demo.txt", []string{"materials", "demo-alloy"}},
	{"materials-paracetamol.json", []string{"materials", "paracetamol-acetone-water", "--format", "json"}},
	// evolve: particles in size classes along a schedule
	{"evolve-alsc.txt", []string{"evolve", "--material", "al-sc", "--schedule", "start at 640C; hold 1h; cool to 20C at 50K/s; jump to 300C; hold 24h"}},
	{"evolve-alsc.json", []string{"evolve", "--material", "al-sc", "--schedule", "hold 24h at 300C", "--rows", "6", "--classes", "40", "--bins", "8", "--format", "json"}},
	{"evolve-alsc.csv", []string{"evolve", "--material", "al-sc", "--schedule", "hold 24h at 350C", "--times", "1min,10min,1h,6h,24h", "--format", "csv"}},
	{"evolve-alsc.md", []string{"evolve", "--material", "al-sc", "--schedule", "hold 2h at 300C", "--rows", "8", "--format", "markdown"}},
	{"evolve-demo-curve.txt", []string{"evolve", "--material", "demo-precipitation-DA-2", "--curve", "../../testdata/curves/demo-age-furnace.csv", "--rows", "12"}},
	{"evolve-paracetamol.txt", []string{"evolve", "--material", "paracetamol-ethanol", "--growth-kg", "0.1um/s", "--growth-order", "1.5",
		"--schedule", "start at 30C; cool to -10C at 1K/min; hold 1h", "--rows", "10"}},
	{"evolve-paracetamol-seeded.json", []string{"evolve", "--material", "paracetamol-ethanol", "--growth-kg", "0.1um/s", "--growth-order", "1.5",
		"--seed-mass", "10g/L", "--seed-size", "100um", "--schedule", "start at 30C; cool to 0C at 0.2K/min; hold 1h", "--rows", "6", "--classes", "30", "--bins", "6", "--format", "json"}},
	{"evolve-nothing.txt", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 700C", "--rows", "4"}},
	// report: the memo
	{"report-demo.md", []string{"report", "--material", "demo-alloy", "--date", "2026-01-15", "--out", "-"}},
	{"report-full.md", []string{"report", "--material", "demo-alloy", "--at", "900K", "--curve", "../../testdata/curves/demo-quench.csv",
		"--volume", "1mm3", "--spread", "gamma=2%", "--spread", "d0=x2", "--samples", "100", "--date", "2026-01-15", "--out", "-"}},
	{"report-glass.md", []string{"report", "--material", "lithium-disilicate", "--at", "750K", "--date", "2026-01-15", "--out", "-"}},
	{"report-nuclei.md", []string{"report", "--material", "demo-alloy", "--nuclei", "1e12", "--date", "2026-01-15", "--out", "-"}},
	{"report-evolve.md", []string{"report", "--material", "al-sc", "--schedule", "start at 640C; hold 1h; cool to 20C at 50K/s; jump to 300C; hold 24h",
		"--date", "2026-01-15", "--out", "-"}},
}

// TestGolden runs every pinned case in-process, on a screen of the default
// width whatever $COLUMNS says, and compares its standard output with the
// golden file byte for byte; no line of a screen output is wider than the
// screen (TestScreenWidth draws them on 80 columns). The cases run in parallel, with
// the scripts, once the tests that change the environment or the working
// folder are done.
func TestGolden(t *testing.T) {
	t.Parallel()
	for _, c := range goldenCases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			var stdout, stderr bytes.Buffer
			if code := runWidth(defaultWidth, c.args, nil, &stdout, &stderr); code != 0 {
				t.Fatalf("exit %d: %s", code, stderr.String())
			}
			if strings.HasSuffix(c.name, ".txt") {
				wideLine(t, defaultWidth, c.args, stdout.String())
			}
			path := filepath.Join(goldenDir, c.name)
			if *update {
				if err := os.MkdirAll(goldenDir, 0o755); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(path, stdout.Bytes(), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (create it with -update)", err)
			}
			if got := stdout.String(); got != string(want) {
				t.Errorf("%s differs from %s:\n%s(refresh with -update only if the change is meant)", strings.Join(c.args, " "), path, firstDiff(got, string(want)))
			}
		})
	}
}

// firstDiff shows the first line where got and want part.
func firstDiff(got, want string) string {
	g, w := strings.Split(got, "\n"), strings.Split(want, "\n")
	for i := 0; i < len(g) || i < len(w); i++ {
		var a, b string
		if i < len(g) {
			a = g[i]
		}
		if i < len(w) {
			b = w[i]
		}
		if a != b {
			return "line " + strconv.Itoa(i+1) + ":\n got: " + a + "\nwant: " + b + "\n"
		}
	}
	return ""
}
