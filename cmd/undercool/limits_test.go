package main

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"undercool/presets/answer"
)

// A fit of more points than it lists gives its estimates without a table
// of every point (JSON rows []), and says so; one point fewer lists them.
func TestFitListsItsPoints(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	// the paths are absolute: no folder to change to, so it runs in parallel
	fit := func(args ...string) (int, string, string) {
		var out, errOut bytes.Buffer
		code := run(append([]string{"fit", "arrhenius"}, args...), strings.NewReader(""), &out, &errOut)
		return code, out.String(), errOut.String()
	}
	for _, n := range []int{answer.MaxListed, answer.MaxListed + 1} {
		var b strings.Builder
		b.WriteString("temperature_k,diffusivity_m2_per_s\n")
		for i := range n {
			T := 600 + 500*float64(i)/float64(n)
			fmt.Fprintf(&b, "%.6f,%.6e\n", T, 2e-7*math.Exp(-62e3/(8.314462618*T)))
		}
		path := filepath.Join(dir, fmt.Sprintf("d%d.csv", n))
		if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
			t.Fatal(err)
		}
		listed := n <= answer.MaxListed
		code, stdout, stderr := fit(path)
		note := fmt.Sprintf("the %d rows are not listed one by one", n)
		if code != 0 || strings.Contains(stdout, note) == listed || strings.Contains(stdout, "1000/T (1/K)") != listed {
			t.Errorf("%d points: exit %d, listed %v: %.300s %s", n, code, strings.Contains(stdout, "1000/T (1/K)"), stdout, stderr)
		}
		code, stdout, _ = fit(path, "--format", "json")
		if code != 0 || strings.Contains(stdout, `"rows": []`) == listed || !strings.Contains(stdout, fmt.Sprintf(`"points": %d,`, n)) {
			t.Errorf("%d points, JSON: exit %d, rows listed %v", n, code, !strings.Contains(stdout, `"rows": []`))
		}
	}
}

// Too few samples for a band: every format says the band is meaningless,
// rather than printing P5 = P50 = P95 as if it were one; enough samples
// say nothing.
func TestFewSamplesWarn(t *testing.T) {
	dir := t.TempDir()
	for _, c := range []struct {
		args []string
		warn bool
	}{
		{[]string{"hold", "--material", "demo-alloy", "--at", "900K", "--spread", "gamma=2%", "--samples", "1"}, true},
		{[]string{"hold", "--material", "demo-alloy", "--at", "900K", "--spread", "gamma=2%", "--samples", "1", "--format", "json"}, true},
		{[]string{"ttt", "--material", "demo-alloy", "--spread", "gamma=2%", "--samples", "20", "--format", "csv"}, true},
		{[]string{"report", "--material", "demo-alloy", "--spread", "gamma=2%", "--samples", "5", "--out", "-"}, true},
		{[]string{"hold", "--material", "demo-alloy", "--at", "900K", "--spread", "gamma=2%", "--samples", "21"}, false},
	} {
		code, stdout, stderr := runIn(t, dir, c.args...)
		if code != 0 || strings.Contains(stdout, "the bands are meaningless") != c.warn {
			t.Errorf("%q: exit %d, warning %v, want %v: %s", c.args, code, !c.warn, c.warn, stderr)
		}
	}
}
