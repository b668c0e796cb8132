package answer

import (
	"math"
	"strings"
	"testing"

	"undercool/kinetics"
	"undercool/kinetics/population"
	"undercool/presets/units"
)

// readTestQuantity reads the quantities of a schedule as the command line does.
func readTestQuantity(word string, q kinetics.Quantity) (float64, error) {
	kind := map[kinetics.Quantity]units.Kind{kinetics.QuantityTemperature: units.Temperature,
		kinetics.QuantityDuration: units.Time, kinetics.QuantityRate: units.CoolingRate}[q]
	return units.Parse(word, kind)
}

// The onset of supersaturation on a ramp is found by bisection: cooling
// from 1000 K at 1 K/s crosses 800 K at 200 s exactly (to 1e-9 of the
// duration); a schedule supersaturated from its start has its start; one
// that never is, NaN.
func TestFirstSupersaturated(t *testing.T) {
	s, err := kinetics.ParseSchedule("start at 1000K; cool to 500K at 1K/s; hold 100s", readTestQuantity)
	if err != nil {
		t.Fatal(err)
	}
	below := func(Tc float64) func(float64) bool { return func(T float64) bool { return T < Tc } }
	if got := firstSupersaturated(s, below(800)); math.Abs(got-200) > 1e-9*s.Duration() {
		t.Errorf("onset %.12g s, want 200", got)
	}
	if got := firstSupersaturated(s, below(2000)); got != 0 {
		t.Errorf("onset %g s, want 0", got)
	}
	if got := firstSupersaturated(s, below(400)); !math.IsNaN(got) {
		t.Errorf("onset %g s, want NaN", got)
	}
}

// The default output times hold the start, the onset, the break points and
// the end, ascending and without repeats; given times are measured from
// the start and must lie within the schedule and increase.
func TestEvolveTimes(t *testing.T) {
	s, err := kinetics.ParseSchedule("start at 640C; hold 1h; cool to 20C at 50K/s; jump to 300C; hold 24h", readTestQuantity)
	if err != nil {
		t.Fatal(err)
	}
	onset := 3600 + (913.15-909.06)/50
	got, err := evolveTimes(s, onset, nil, 25)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []float64{0, 3600, onset, 3600 + 620.0/50, s.End()} {
		found := false
		for _, g := range got {
			found = found || math.Abs(g-want) <= 1e-9*s.End()
		}
		if !found {
			t.Errorf("default times lack %g s: %v", want, got)
		}
	}
	for i := 1; i < len(got); i++ {
		if !(got[i] > got[i-1]) {
			t.Fatalf("times not ascending at %d: %v", i, got)
		}
	}
	if n := len(got); n < 25 || n > 25+5 {
		t.Errorf("%d default times, want 25 and the 5 special ones at most", n)
	}
	given, err := evolveTimes(s, onset, []float64{0, 60, s.Duration()}, 0)
	if err != nil || len(given) != 3 || given[1] != 60 || given[2] != s.End() {
		t.Errorf("given times: %v, %v", given, err)
	}
	if short, err := evolveTimes(s, onset, []float64{60}, 0); err != nil || len(short) != 2 || short[1] != s.End() {
		t.Errorf("times short of the end: %v, %v, want the end added", short, err)
	}
	for _, bad := range [][]float64{{-1}, {1e9}, {60, 60}, {60, 30}} {
		if _, err := evolveTimes(s, onset, bad, 0); err == nil {
			t.Errorf("times %v: no error", bad)
		}
	}
}

// The histogram's volume shares sum to 1 and follow the classes: one class
// of 8 particles of size 2 holds 64/(64 + 1) of the volume beside 1 of size 1.
func TestEvolveHistogram(t *testing.T) {
	h := histogram([]population.Class{{Size: 1, Number: 1}, {Size: 2, Number: 8}}, 4)
	var n, v float64
	for _, b := range h {
		n += float64(b.Number)
		v += float64(b.Volume)
	}
	if n != 9 || math.Abs(v-1) > 1e-15 {
		t.Errorf("number %g, volume %g", n, v)
	}
	if got, want := float64(h[3].Volume), 64.0/65; math.Abs(got-want) > 1e-15 {
		t.Errorf("share of the largest bin %g, want %g", got, want)
	}
	if got := histogram(nil, 4); len(got) != 0 {
		t.Errorf("no classes: %v", got)
	}
	if !strings.Contains(elapsedCell(math.NaN()), Dash) || elapsedCell(90.0) != "1.50 min" {
		t.Errorf("elapsed cells: %q, %q", elapsedCell(math.NaN()), elapsedCell(90.0))
	}
	if log10Cell(-12.345) != "-12.35" || log10Cell(-1.5e19) != "-1.5e+19" || log10Cell(math.Inf(-1)) != Dash {
		t.Errorf("log10 cells: %q %q %q", log10Cell(-12.345), log10Cell(-1.5e19), log10Cell(math.Inf(-1)))
	}
}
