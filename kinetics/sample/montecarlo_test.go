package sample

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"undercool/cnt"
	"undercool/kinetics"
)

// demoMaterial is an invented alloy for the tests (the first values of
// the invented demo card; not a real material).
func demoMaterial() kinetics.Material {
	return kinetics.Material{
		Name:     "demo",
		Driving:  cnt.ThompsonSpaepen{Te: 1150, DH: 14.2e3},
		Vm:       9.8e-6,
		Gamma:    0.118,
		Mobility: kinetics.Arrhenius{D0: 2e-7, Q: 62e3},
	}
}

// span is a range for the tests: lo < x ≤ hi.
type span struct{ lo, hi float64 }

func (r span) Contains(x float64) bool { return x > r.lo && x <= r.hi }
func (r span) String() string          { return fmt.Sprintf("(%g, %g]", r.lo, r.hi) }

var (
	positive = span{0, math.MaxFloat64}
	angle    = span{0, 180}
)

// input is how a test input sits in the demo material: its value, its
// distribution and range, and how to set it.
type input struct {
	dist Distribution
	r    Range
	get  func(m kinetics.Material) float64
	set  func(m *kinetics.Material, x float64)
}

var inputs = map[string]input{
	"gamma": {Normal, positive, func(m kinetics.Material) float64 { return m.Gamma }, func(m *kinetics.Material, x float64) { m.Gamma = x }},
	"theta": {Normal, angle, func(m kinetics.Material) float64 { return m.Theta }, func(m *kinetics.Material, x float64) { m.Theta = x }},
	"d0": {LogNormal, positive, func(m kinetics.Material) float64 { return m.Mobility.(kinetics.Arrhenius).D0 },
		func(m *kinetics.Material, x float64) { a := m.Mobility.(kinetics.Arrhenius); a.D0 = x; m.Mobility = a }},
	"q": {Normal, span{-1, math.MaxFloat64}, func(m kinetics.Material) float64 { return m.Mobility.(kinetics.Arrhenius).Q },
		func(m *kinetics.Material, x float64) { a := m.Mobility.(kinetics.Arrhenius); a.Q = x; m.Mobility = a }},
}

// build makes the Build of a run over m whose spreads are of the named inputs.
func build(m kinetics.Material, spreads []Spread) func(x []float64) (*kinetics.Model, error) {
	return func(x []float64) (*kinetics.Model, error) {
		v := m
		for k, s := range spreads {
			if x[k] != s.Base {
				inputs[s.Key].set(&v, x[k])
			}
		}
		return kinetics.NewModel(v)
	}
}

// run is a MonteCarlo over m with the spreads and its Build.
func run(m kinetics.Material, spreads []Spread, outs []Output, eval Eval, n int, seed uint64) MonteCarlo {
	return MonteCarlo{Spreads: spreads, Build: build(m, spreads), Outputs: outs, Eval: eval, Samples: n, Seed: seed}
}

// log10JAt is the headline result "log10 J at T" for the tests.
func log10JAt(T float64) Eval {
	return func(md *kinetics.Model) ([]float64, error) { return []float64{md.LnJ(T) / math.Ln10}, nil }
}

func mustSpread(t testing.TB, m kinetics.Material, key string, form Form, x float64) Spread {
	t.Helper()
	in := inputs[key]
	s, err := NewSpread(key, in.dist, in.get(m), in.r, form, x)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// quantileSE is the large-sample standard error of the p-quantile of a
// standard normal variable estimated from n samples,
// sqrt(p(1−p)/n)/φ(z_p) (Stuart and Ord, Kendall's Advanced Theory of
// Statistics, vol. 1, §10.10, from memory for the section).
func quantileSE(p float64, n int) float64 {
	z := distuv.UnitNormal.Quantile(p)
	return math.Sqrt(p*(1-p)/float64(n)) / distuv.UnitNormal.Prob(z)
}

// TestQuantilesMonotonicNormal: log10 J at a fixed temperature falls
// monotonically with γ, so its p-quantile is f(γ0 + σ·z_{1−p}) exactly,
// z the standard normal quantile. The sample quantile must lie within five
// standard errors (in z) of it.
func TestQuantilesMonotonicNormal(t *testing.T) {
	m := demoMaterial()
	const n, T = 20000, 1000.0
	s := mustSpread(t, m, "gamma", Relative, 0.02)
	if s.Dist != Normal || math.Abs(s.SD-0.02*0.118) > 1e-15 {
		t.Fatalf("spread %+v, want normal with σ = 2.36e-3 J/m2", s)
	}
	mc := run(m, []Spread{s}, []Output{{"log10_rate_per_m3_s", false}}, log10JAt(T), n, 7)
	u, err := mc.Run()
	if err != nil {
		t.Fatal(err)
	}
	f := func(z float64) float64 {
		g := m
		g.Gamma = 0.118 + s.SD*z
		md, err := kinetics.NewModel(g)
		if err != nil {
			t.Fatal(err)
		}
		return md.LnJ(T) / math.Ln10
	}
	b := u.Bands[0]
	for _, c := range []struct {
		p, got float64
	}{{0.05, b.P5}, {0.5, b.P50}, {0.95, b.P95}} {
		z := distuv.UnitNormal.Quantile(1 - c.p) // decreasing in γ
		se := quantileSE(c.p, n)
		hi, lo := f(z-5*se), f(z+5*se)
		if !(c.got >= lo && c.got <= hi) {
			t.Errorf("P%g = %.6f, want within [%.6f, %.6f] (exact %.6f)", 100*c.p, c.got, lo, hi, f(z))
		}
	}
	if b.Missing != 0 {
		t.Errorf("%d samples without an answer", b.Missing)
	}
}

// TestQuantilesLogNormal: with the attachment prefactor ln J is linear in
// ln D0, so log10 J = log10 J0 + σ_ln·z/ln 10 for a log-normal D0 and the
// quantiles follow exactly from the normal ones.
func TestQuantilesLogNormal(t *testing.T) {
	m := demoMaterial()
	const n, T = 20000, 900.0
	s := mustSpread(t, m, "d0", Factor, 3)
	if s.Dist != LogNormal || math.Abs(s.SD-math.Log(3)) > 1e-15 {
		t.Fatalf("spread %+v, want log-normal with σ_ln = ln 3", s)
	}
	mc := run(m, []Spread{s}, []Output{{"log10_rate_per_m3_s", false}}, log10JAt(T), n, 11)
	u, err := mc.Run()
	if err != nil {
		t.Fatal(err)
	}
	f0 := u.Base[0]
	b := u.Bands[0]
	for _, c := range []struct {
		p, got float64
	}{{0.05, b.P5}, {0.5, b.P50}, {0.95, b.P95}} {
		z := distuv.UnitNormal.Quantile(c.p)
		want := f0 + s.SD*z/math.Ln10
		tol := 5 * quantileSE(c.p, n) * s.SD / math.Ln10
		if math.Abs(c.got-want) > tol {
			t.Errorf("P%g = %.6f, want %.6f ± %.2g", 100*c.p, c.got, want, tol)
		}
	}
}

// TestSameSeedAnyCores: the same seed gives the same bits on 1 and 2
// cores (and on 3 goroutines).
func TestSameSeedAnyCores(t *testing.T) {
	m := demoMaterial()
	spreads := []Spread{
		mustSpread(t, m, "gamma", Relative, 0.02),
		mustSpread(t, m, "q", Absolute, 3e3),
		mustSpread(t, m, "d0", Relative, 0.5),
	}
	eval := func(md *kinetics.Model) ([]float64, error) {
		return []float64{md.LnJ(1000) / math.Ln10, md.LnJ(800) / math.Ln10}, nil
	}
	outs := []Output{{"a", false}, {"b", false}}
	sampled := func(procs, workers int) *Uncertainty {
		old := runtime.GOMAXPROCS(procs)
		defer runtime.GOMAXPROCS(old)
		mc := run(m, spreads, outs, eval, 1000, 42)
		mc.Workers = workers
		u, err := mc.Run()
		if err != nil {
			t.Fatal(err)
		}
		return u
	}
	ref := sampled(1, 0)
	for _, c := range []struct{ procs, workers int }{{2, 0}, {2, 3}, {1, 5}} {
		u := sampled(c.procs, c.workers)
		for i := range ref.Values {
			for k := range ref.Values[i] {
				if math.Float64bits(ref.Values[i][k]) != math.Float64bits(u.Values[i][k]) {
					t.Fatalf("GOMAXPROCS %d, %d workers: sample %d output %d differs: %v vs %v", c.procs, c.workers, i, k, u.Values[i][k], ref.Values[i][k])
				}
			}
		}
		for k := range ref.Bands {
			if ref.Bands[k] != u.Bands[k] {
				t.Errorf("bands differ: %+v vs %+v", u.Bands[k], ref.Bands[k])
			}
		}
	}
	other := run(m, spreads, outs, eval, 1000, 43)
	u, _ := other.Run()
	if u.Values[0][0] == ref.Values[0][0] {
		t.Error("another seed gives the same first sample")
	}
}

// TestZeroSpread: a spread of zero gives the deterministic value, exactly.
func TestZeroSpread(t *testing.T) {
	m := demoMaterial()
	spreads := []Spread{mustSpread(t, m, "gamma", Relative, 0), mustSpread(t, m, "d0", Relative, 0)}
	mc := run(m, spreads, []Output{{"log10_rate_per_m3_s", false}}, log10JAt(950), 300, 1)
	u, err := mc.Run()
	if err != nil {
		t.Fatal(err)
	}
	md, _ := kinetics.NewModel(m)
	want := md.LnJ(950) / math.Ln10
	for i, v := range u.Values {
		if v[0] != want {
			t.Fatalf("sample %d = %v, want %v", i, v[0], want)
		}
	}
	if b := u.Bands[0]; b.P5 != want || b.P50 != want || b.P95 != want {
		t.Errorf("bands %+v, want all %v", b, want)
	}
	for _, e := range u.Sensitivity[0] {
		if e.Minus != 0 || e.Plus != 0 {
			t.Errorf("effect %+v, want 0", e)
		}
	}
}

// TestSensitivity: the effect of ±1σ of D0 on log10 J is ∓log10(1 + r)
// exactly (ln J is linear in ln D0), γ's is negative for +1σ, and the
// table is ranked.
func TestSensitivity(t *testing.T) {
	m := demoMaterial()
	spreads := []Spread{mustSpread(t, m, "d0", Relative, 0.1), mustSpread(t, m, "gamma", Relative, 0.02)}
	mc := run(m, spreads, []Output{{"log10_rate_per_m3_s", false}}, log10JAt(1000), 64, 1)
	u, err := mc.Run()
	if err != nil {
		t.Fatal(err)
	}
	eff := u.Sensitivity[0]
	if eff[0].Key != "gamma" || eff[1].Key != "d0" {
		t.Fatalf("ranking %v, want gamma before d0", eff)
	}
	if !(eff[0].Plus < 0 && eff[0].Minus > 0) {
		t.Errorf("gamma effect %+v: +1σ must lower the rate", eff[0])
	}
	want := math.Log10(1.1)
	if math.Abs(eff[1].Plus-want) > 1e-9 || math.Abs(eff[1].Minus+want) > 1e-9 {
		t.Errorf("d0 effect %+v, want ±%.9f", eff[1], want)
	}
	// A time-like output in decades: the JMAK-like t ∝ J^(-1/4) changes by
	// −1/4 of log10 J's change.
	mc.Outputs = []Output{{"time_s", true}}
	mc.Eval = func(md *kinetics.Model) ([]float64, error) { return []float64{math.Exp(-md.LnJ(1000) / 4)}, nil }
	u, err = mc.Run()
	if err != nil {
		t.Fatal(err)
	}
	if got := u.Sensitivity[0][1]; math.Abs(got.Plus+want/4) > 1e-9 {
		t.Errorf("time effect of d0 %+v, want %.9f decades", got, -want/4)
	}
}

// TestNeverAndMissing: +Inf ("never") takes part in the quantiles, NaN
// (no answer) is counted and left out.
func TestNeverAndMissing(t *testing.T) {
	m := demoMaterial()
	s := mustSpread(t, m, "gamma", Relative, 0.05)
	eval := func(md *kinetics.Model) ([]float64, error) {
		g := md.Material().Gamma
		switch {
		case g > 0.118*1.05:
			return []float64{math.Inf(1)}, nil
		case g < 0.118*0.95:
			return []float64{math.NaN()}, nil
		}
		return []float64{g}, nil
	}
	mc := run(m, []Spread{s}, []Output{{"x", false}}, eval, 4000, 3)
	u, err := mc.Run()
	if err != nil {
		t.Fatal(err)
	}
	b := u.Bands[0]
	if !math.IsInf(b.P95, 1) {
		t.Errorf("P95 = %v, want +Inf (about 16 %% of samples never)", b.P95)
	}
	if b.Missing < 400 || b.Missing > 900 {
		t.Errorf("missing %d of 4000, want about 16 %%", b.Missing)
	}
}

// TestTruncation: draws outside an input's range are drawn again and
// counted; a spread that keeps leaving it is an error.
func TestTruncation(t *testing.T) {
	m := demoMaterial()
	m.Theta = 150
	m.Sites = 1e20
	s := mustSpread(t, m, "theta", Absolute, 20)
	mc := run(m, []Spread{s}, []Output{{"log10_rate_per_m3_s", false}}, log10JAt(1000), 2000, 5)
	u, err := mc.Run()
	if err != nil {
		t.Fatal(err)
	}
	// P(θ > 180) = P(z > 1.5) ≈ 6.7 %.
	if r := u.Spreads[0].Redrawn; r < 80 || r > 200 {
		t.Errorf("redrawn %d of 2000, want about 134", r)
	}
	for i, v := range u.Values {
		if math.IsNaN(v[0]) {
			t.Fatalf("sample %d has no answer", i)
		}
	}
	mc.Spreads = []Spread{{Key: "theta", SD: 1e6, Base: 150, Range: angle}}
	if _, err := mc.Run(); err == nil || !strings.Contains(err.Error(), "theta: the spread is too wide") {
		t.Errorf("error %v, want theta: the spread is too wide", err)
	}
}

func TestSpreadErrors(t *testing.T) {
	cases := []struct {
		dist Distribution
		form Form
		x    float64
		want string
	}{
		{Normal, Relative, -0.1, "gamma: the standard deviation must be finite and not negative"},
		{Normal, Absolute, math.NaN(), "gamma: the standard deviation must be finite"},
		{Normal, Absolute, math.Inf(1), "gamma: the standard deviation must be finite"},
		{Normal, Factor, 2, "gamma: a factor spread (xF) is only for log-normal inputs"},
		{LogNormal, Factor, 0.5, "gamma: a factor spread must be at least 1"},
	}
	for _, c := range cases {
		_, err := NewSpread("gamma", c.dist, 0.1, positive, c.form, c.x)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("NewSpread(%v, %v, %v): error %v, want %q", c.dist, c.form, c.x, err, c.want)
		}
	}
	// The three forms of a log-normal spread, and a normal one.
	for _, c := range []struct {
		dist     Distribution
		form     Form
		x, sd    float64
		describe string
	}{
		{LogNormal, Relative, 0.5, math.Log(1.5), "relative 50 %: σ_ln = ln 1.5"},
		{LogNormal, Absolute, 0.05, math.Log(1.5), "absolute 0.05 about 0.1: σ_ln = ln 1.5"},
		{LogNormal, Factor, 3, math.Log(3), "factor 3: σ_ln = ln 3"},
		{Normal, Relative, 0.02, 0.002, "relative 2 % of 0.1"},
	} {
		s, err := NewSpread("x", c.dist, 0.1, positive, c.form, c.x)
		if err != nil || math.Abs(s.SD-c.sd) > 1e-15 {
			t.Errorf("%s: σ = %v (%v)", c.describe, s.SD, err)
		}
	}
	mc := run(demoMaterial(), []Spread{{Key: "q", SD: -1, Base: 62e3, Range: positive}}, []Output{{"x", false}}, log10JAt(900), 10, 0)
	if _, err := mc.Run(); err == nil || !strings.HasPrefix(err.Error(), "q: the standard deviation must be finite") {
		t.Errorf("Run with a negative σ: %v", err)
	}
}

// TestEvalError: the error of the lowest failing sample is returned,
// whatever the number of goroutines.
func TestEvalError(t *testing.T) {
	m := demoMaterial()
	s := mustSpread(t, m, "gamma", Relative, 0.02)
	bad := errors.New("no nose")
	eval := func(md *kinetics.Model) ([]float64, error) {
		if md.Material().Gamma > 0.118*1.04 {
			return nil, bad
		}
		return []float64{1}, nil
	}
	var msgs []string
	for _, w := range []int{1, 2, 4} {
		mc := run(m, []Spread{s}, []Output{{"x", false}}, eval, 5000, 9)
		mc.Workers = w
		_, err := mc.Run()
		if !errors.Is(err, bad) {
			t.Fatalf("error %v, want %v", err, bad)
		}
		msgs = append(msgs, err.Error())
	}
	if msgs[0] != msgs[1] || msgs[1] != msgs[2] {
		t.Errorf("errors differ with the number of workers: %q", msgs)
	}
}

// BenchmarkMonteCarloLog10J: 10,000 samples of log10 J at one temperature
// with three spreads, on all cores.
func BenchmarkMonteCarloLog10J(b *testing.B) {
	m := demoMaterial()
	spreads := []Spread{mustSpread(b, m, "gamma", Absolute, 0.002), mustSpread(b, m, "q", Absolute, 3e3), mustSpread(b, m, "d0", Relative, 0.5)}
	mc := run(m, spreads, []Output{{"log10_rate_per_m3_s", false}}, log10JAt(1000), 10000, 1)
	for b.Loop() {
		if _, err := mc.Run(); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkMonteCarloNoseCritical is the issue's speed case: 10,000
// samples of the TTT nose (temperature and time) and the critical cooling
// rate, with spreads on γ, Q and D0, on all cores; and each part alone.
func BenchmarkMonteCarloNoseCritical(b *testing.B) {
	m := demoMaterial()
	spreads := []Spread{mustSpread(b, m, "gamma", Absolute, 0.002), mustSpread(b, m, "q", Absolute, 3e3), mustSpread(b, m, "d0", Factor, 2)}
	const X = 1e-6
	nose := func(md *kinetics.Model) (float64, float64, error) {
		te := md.Te()
		n, err := md.Nose(0.5*te, 0.99*te, X, kinetics.JMAK{})
		return n.T, math.Exp(n.LnTime), err
	}
	critical := func(md *kinetics.Model) (float64, error) {
		c, err := md.LinearCooling(0)
		if err != nil {
			return 0, err
		}
		return c.CriticalRate(X), nil
	}
	cases := []struct {
		name string
		outs []Output
		eval Eval
	}{
		{"nose", []Output{{"nose_temperature_k", false}, {"nose_time_s", true}}, func(md *kinetics.Model) ([]float64, error) {
			T, t, err := nose(md)
			return []float64{T, t}, err
		}},
		{"critical", []Output{{"critical_cooling_rate_k_per_s", true}}, func(md *kinetics.Model) ([]float64, error) {
			q, err := critical(md)
			return []float64{q}, err
		}},
		{"nose+critical", []Output{{"nose_temperature_k", false}, {"nose_time_s", true}, {"critical_cooling_rate_k_per_s", true}}, func(md *kinetics.Model) ([]float64, error) {
			T, t, err := nose(md)
			if err != nil {
				return nil, err
			}
			q, err := critical(md)
			return []float64{T, t, q}, err
		}},
	}
	for _, c := range cases {
		b.Run(c.name, func(b *testing.B) {
			mc := run(m, spreads, c.outs, c.eval, 10000, 1)
			for b.Loop() {
				if _, err := mc.Run(); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// The band of log10 J at 1000 K of an invented alloy when its interfacial
// energy is known to 2 % and its D0 to a factor of two, and what drives it.
func ExampleMonteCarlo() {
	m := kinetics.Material{
		Driving: cnt.ThompsonSpaepen{Te: 1150, DH: 14.2e3},
		Vm:      9.8e-6, Gamma: 0.118, Mobility: kinetics.Arrhenius{D0: 2e-7, Q: 62e3},
	}
	positive := span{0, math.MaxFloat64}
	gamma, _ := NewSpread("gamma", Normal, m.Gamma, positive, Relative, 0.02)
	d0, _ := NewSpread("d0", LogNormal, 2e-7, positive, Factor, 2)
	mc := MonteCarlo{
		Spreads: []Spread{gamma, d0},
		Build: func(x []float64) (*kinetics.Model, error) {
			v := m
			v.Gamma = x[0]
			v.Mobility = kinetics.Arrhenius{D0: x[1], Q: 62e3}
			return kinetics.NewModel(v)
		},
		Outputs: []Output{{Key: "log10_rate_per_m3_s"}},
		Eval: func(md *kinetics.Model) ([]float64, error) {
			return []float64{md.LnJ(1000) / math.Ln10}, nil
		},
		Samples: 10000, Seed: 1,
	}
	u, err := mc.Run()
	if err != nil {
		fmt.Println(err)
		return
	}
	b := u.Bands[0]
	fmt.Printf("log10 J: P5 %.1f, P50 %.1f, P95 %.1f\n", b.P5, b.P50, b.P95)
	for _, e := range u.Sensitivity[0] {
		fmt.Printf("%-5s %s: %+.2f / %+.2f decades\n", e.Key, u.Spreads[indexOf(u.Spreads, e.Key)].Dist, e.Minus, e.Plus)
	}
	// Output:
	// log10 J: P5 8.0, P50 10.9, P95 13.7
	// gamma normal: +1.64 / -1.71 decades
	// d0    log-normal: -0.30 / +0.30 decades
}

func indexOf(s []SpreadUse, key string) int {
	for i, x := range s {
		if x.Key == key {
			return i
		}
	}
	return -1
}
