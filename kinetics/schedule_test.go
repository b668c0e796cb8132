package kinetics_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"undercool/kinetics"
	"undercool/presets/units"
)

// readUnits is the quantity reader the command line gives ParseSchedule.
func readUnits(word string, q kinetics.Quantity) (float64, error) {
	kind := map[kinetics.Quantity]units.Kind{
		kinetics.QuantityTemperature: units.Temperature,
		kinetics.QuantityDuration:    units.Time,
		kinetics.QuantityRate:        units.CoolingRate,
	}[q]
	return units.Parse(word, kind)
}

func mustSchedule(t testing.TB, text string) kinetics.Schedule {
	t.Helper()
	s, err := kinetics.ParseSchedule(text, readUnits)
	if err != nil {
		t.Fatalf("%q: %v", text, err)
	}
	return s
}

// A solution treatment, quench and age, written both ways (one line and a
// file with comments): the break points follow by arithmetic.
func TestScheduleBreakPoints(t *testing.T) {
	one := "start at 640C; hold 1h; cool to 20C at 50K/s; jump to 300C; hold 24h"
	file := `# invented treatment for the test
start at 640 C
hold 1 h          # solution treatment
cool to 20C at 50 K/s
jump to 300C      # into the ageing furnace
hold 24h`
	wantT := []float64{913.15, 913.15, 293.15, 573.15, 573.15}
	wantTime := []float64{0, 3600, 3600 + 620.0/50, 3600 + 620.0/50, 3600 + 620.0/50 + 86400}
	for _, text := range []string{one, file} {
		s := mustSchedule(t, text)
		if len(s.Time) != len(wantT) || len(s.Steps) != 5 {
			t.Fatalf("%q: %d points, %d steps", text, len(s.Time), len(s.Steps))
		}
		for i := range wantT {
			if math.Abs(s.Temp[i]-wantT[i]) > 1e-9 || math.Abs(s.Time[i]-wantTime[i]) > 1e-9 {
				t.Errorf("point %d: (%g s, %g K), want (%g s, %g K)", i, s.Time[i], s.Temp[i], wantTime[i], wantT[i])
			}
		}
		// Inside the ramp, halfway down; at the jump, the temperature after it.
		if got := s.At(3600 + 6.2); math.Abs(got-603.15) > 1e-9 {
			t.Errorf("At(mid-ramp) = %g K, want 603.15", got)
		}
		if got := s.At(wantTime[2]); got != 573.15 {
			t.Errorf("At(jump) = %g K, want the temperature after it, 573.15", got)
		}
		if got := s.Before(wantTime[2]); got != 293.15 {
			t.Errorf("Before(jump) = %g K, want the temperature before it, 293.15", got)
		}
		if got, want := s.Before(3600+6.2), s.At(3600+6.2); got != want {
			t.Errorf("Before(mid-ramp) = %g K, want At = %g K", got, want)
		}
		if got := s.Duration(); math.Abs(got-wantTime[4]) > 1e-9 {
			t.Errorf("Duration = %g s", got)
		}
		if b := s.Breaks(); len(b) != 4 {
			t.Errorf("Breaks = %v, want 4 distinct times", b)
		}
		if lo, hi := s.Span(); lo != 293.15 || hi != 913.15 {
			t.Errorf("Span = %g, %g", lo, hi)
		}
	}
}

// Ramps given over a time, heating, a first hold with its temperature, and
// rates in other units.
func TestScheduleForms(t *testing.T) {
	s := mustSchedule(t, "hold 100h at 573K")
	if s.Duration() != 360000 || s.At(1e5) != 573 {
		t.Errorf("isothermal: %v %v", s.Time, s.Temp)
	}
	s = mustSchedule(t, "start 300K; heat to 400K in 10min; cool to 350 K at 0.5 K/min; HOLD 2 h AT 350K")
	want := []float64{0, 600, 600 + 50/(0.5/60), 600 + 6000 + 7200}
	for i, w := range want {
		if math.Abs(s.Time[i]-w) > 1e-9 {
			t.Errorf("point %d at %g s, want %g", i, s.Time[i], w)
		}
	}
	if s.Steps[1].Kind != kinetics.StepHeat || s.Steps[2].Kind != kinetics.StepCool {
		t.Errorf("kinds %v %v", s.Steps[1].Kind, s.Steps[2].Kind)
	}
}

// Bad schedules: each error names the step and says what is allowed.
func TestScheduleErrors(t *testing.T) {
	cases := []struct {
		text, step, want string
	}{
		{"hold 1h", `step 1 "hold 1h"`, "must first say where it starts"},
		{"start at 600K; warm to 700K in 1h", `step 2`, "a step is one of"},
		{"start at 600K; cool to 700K at 1K/s", `step 2`, "must lie below"},
		{"start at 600K; heat to 500K at 1K/s", `step 2`, "must lie above"},
		{"start at 600K; hold 1h at 500K", `step 2`, "write 'jump to 500K'"},
		{"start at 600K; cool to 500K at 1K", `step 2`, "not a unit of cooling rate"},
		{"start at 600K; cool to 500K at -1K/s", `step 2`, "must be positive"},
		{"start at 600K; hold -1h", `step 2`, "must be positive"},
		{"start at 600K; hold 1h; start at 500K", `step 3`, "only be the first step"},
		{"start at 600K; jump to 600K; hold 1h", `step 2`, "already at"},
		{"start at 600K; cool to 500K", `step 2`, "a step is one of"},
		{"start at 600K; cool to 500K at 1K/s in 1h", `step 2`, "a step is one of"},
		{"start at 600K; hold 1h at", `step 2`, `"at" needs a value`},
		{"start at -5K; hold 1h", `step 1`, "must be positive"},
	}
	for _, c := range cases {
		_, err := kinetics.ParseSchedule(c.text, readUnits)
		var se *kinetics.ScheduleError
		if !errors.As(err, &se) {
			t.Errorf("%q: error %v, want a *ScheduleError", c.text, err)
			continue
		}
		if msg := err.Error(); !strings.Contains(msg, c.step) || !strings.Contains(msg, c.want) {
			t.Errorf("%q: %q, want it to name %s and say %q", c.text, msg, c.step, c.want)
		}
	}
	for _, text := range []string{"", "# nothing\n", "start at 600K"} {
		if _, err := kinetics.ParseSchedule(text, readUnits); !errors.Is(err, kinetics.ErrEmptySchedule) {
			t.Errorf("%q: %v, want ErrEmptySchedule", text, err)
		}
	}
}

// A measured curve keeps its points; Sample cuts ramps to the asked step
// and refuses a jump.
func TestScheduleCurveAndSample(t *testing.T) {
	s, err := kinetics.ScheduleFromCurve([]float64{0, 10, 30}, []float64{800, 600, 600}, "demo.csv")
	if err != nil {
		t.Fatal(err)
	}
	if s.At(5) != 700 || s.Steps[0].Kind != kinetics.StepCurve || s.String() != "demo.csv" {
		t.Errorf("curve: At(5)=%g, steps %v", s.At(5), s.Steps)
	}
	if _, err := kinetics.ScheduleFromCurve([]float64{0, 0}, []float64{800, 600}, "x"); err == nil {
		t.Error("a curve whose time does not increase was accepted")
	}
	p, err := s.Sample(30)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Time) != 1+7+1 { // 200 K in 7 pieces of ≤ 30 K, then the hold
		t.Errorf("Sample: %d points: %v", len(p.Time), p.Temp)
	}
	for i := 1; i < len(p.Temp); i++ {
		if math.Abs(p.Temp[i]-p.Temp[i-1]) > 30+1e-9 {
			t.Errorf("Sample: step %d of %g K", i, p.Temp[i]-p.Temp[i-1])
		}
	}
	j := mustSchedule(t, "start at 600K; hold 1h; jump to 500K; hold 1h")
	if _, err := j.Sample(5); !errors.Is(err, kinetics.ErrScheduleJump) {
		t.Errorf("Sample of a jump: %v", err)
	}
}

// TestSchedulePathSample: a schedule that cools, holds and heats again,
// given to the path integral as its break points (Path) and cut into 1 K
// pieces (Sample): the same fraction, nuclei and crossing of X, to 1e-6
// relative (the integrator's tolerance on a piece is 1e-8, about 4e-8 on a
// sum) and 1e-3 K. A ramp needs no points inside it.
func TestSchedulePathSample(t *testing.T) {
	md := shippedModel(t, "demo-alloy")
	s := mustSchedule(t, "start at 1000K; cool to 820K at 2K/s; hold 40s; cool to 760K at 1K/s; heat to 860K at 5K/s; hold 10s")
	bare, err := s.Path()
	if err != nil {
		t.Fatal(err)
	}
	if len(bare.Time) != len(s.Time) {
		t.Errorf("Path: %d points, the schedule has %d break points", len(bare.Time), len(s.Time))
	}
	fine, err := s.Sample(1)
	if err != nil {
		t.Fatal(err)
	}
	const X = 1e-3
	a, _, err := md.AlongPath(bare, X)
	if err != nil {
		t.Fatal(err)
	}
	b, _, err := md.AlongPath(fine, X)
	if err != nil {
		t.Fatal(err)
	}
	if d := a.LnXext - b.LnXext; !(math.Abs(d) <= 1e-6) {
		t.Errorf("ln Xext: %.12g on the break points, %.12g on 1 K pieces", a.LnXext, b.LnXext)
	}
	if d := a.LnNuclei - b.LnNuclei; !(math.Abs(d) <= 1e-6) {
		t.Errorf("ln N: %.12g on the break points, %.12g on 1 K pieces", a.LnNuclei, b.LnNuclei)
	}
	if a.Reached != b.Reached || math.Abs(a.TempReached-b.TempReached) > 1e-3 || math.Abs(a.TimeReached-b.TimeReached) > 1e-3 {
		t.Errorf("X = %g: reached %v at %.5f K, %.5f s on the break points; %v at %.5f K, %.5f s on 1 K pieces",
			X, a.Reached, a.TempReached, a.TimeReached, b.Reached, b.TempReached, b.TimeReached)
	}
	t.Logf("%d and %d points: fraction %.10g and %.10g; X reached at %.5f K and %.5f K", len(bare.Time), len(fine.Time), a.Fraction, b.Fraction, a.TempReached, b.TempReached)
	j := mustSchedule(t, "start at 600K; hold 1h; jump to 500K; hold 1h")
	if _, err := j.Path(); !errors.Is(err, kinetics.ErrScheduleJump) {
		t.Errorf("Path of a jump: %v", err)
	}
}
