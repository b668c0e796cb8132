package cnt_test

import (
	"math"
	"strings"
	"testing"

	"undercool/cnt"
)

// Hand values at T_e = 1000 K, ΔH = 10 kJ/mol, T = 900 K (ΔT = 100 K),
// worked out on paper from each model's formula:
//
//	linear           10000·100/1000                      = 1000
//	Hoffman          10000·100·900/1000²                 = 900
//	Thompson–Spaepen 1000·2·900/1900                     = 947.368421…
//	constant ΔCp = 5 1000 − 5·(100 − 900·ln(1000/900))   = 974.1223…
func TestDrivingForceHandValues(t *testing.T) {
	const te, dh, T = 1000.0, 1e4, 900.0
	for _, c := range []struct {
		m    cnt.DrivingForce
		want float64
		name string
	}{
		{cnt.Linear{Te: te, DH: dh}, 1000, "linear"},
		{cnt.Hoffman{Te: te, DH: dh}, 900, "hoffman"},
		{cnt.ThompsonSpaepen{Te: te, DH: dh}, 18000.0 / 19, "thompson-spaepen"},
		{cnt.ConstantCp{Te: te, DH: dh, DCp: 5}, 1000 - 5*(100-900*math.Log(1000.0/900)), "cp"},
		{cnt.ConstantCp{Te: te, DH: dh, DCp: 5}, 974.1223, "cp"}, // 7 figures, by hand
	} {
		if got := c.m.PerMole(T); !close(got, c.want, 1e-7) {
			t.Errorf("%s: Δg(%g) = %.10g, want %.10g", c.name, T, got, c.want)
		}
		if c.m.Name() != c.name {
			t.Errorf("Name() = %q, want %q", c.m.Name(), c.name)
		}
	}
}

// Thompson C.V., Spaepen F., On the approximation of the free energy change
// on crystallization, Acta Metall. 27 (1979) 1855: ΔG = 2ΔH_f·T·ΔT/(T_m·(T_m+T))
// (the form as we recall it from the paper, from memory; it is the one quoted by
// later comparisons of such approximations). Written out here independently.
func TestThompsonSpaepenPaperForm(t *testing.T) {
	const tm, dhf = 1337.0, 12550.0
	m := cnt.ThompsonSpaepen{Te: tm, DH: dhf}
	for T := 100.0; T <= 1500; T += 37 {
		want := 2 * dhf * T * (tm - T) / (tm * (tm + T))
		if got := m.PerMole(T); !close(got, want, 1e-13) && math.Abs(got-want) > 1e-9 {
			t.Errorf("T = %g: Δg = %.15g, want %.15g", T, got, want)
		}
	}
}

// All approximations share the first-order term ΔH·ΔT/T_e (Porter &
// Easterling (2009) eq. 1.17, exact as ΔT → 0): each ratio to the linear
// model tends to 1 linearly in x = ΔT/T_e. Expanding by hand (derived here):
//
//	Hoffman/linear          = 1 − x
//	Thompson–Spaepen/linear = 1 − x/2 − x²/4 − …
//	ConstantCp/linear       = 1 − (ΔCp·T_e/ΔH)·(x/2 + x²/6 + …)
//
// so with ΔCp = ΔH/T_e (= ΔS_f) Thompson–Spaepen and constant ΔCp agree to
// second order and differ by x²/12 of the linear value.
func TestDrivingForceNearEquilibrium(t *testing.T) {
	const te, dh = 1000.0, 1e4
	dcp := dh / te
	lin := cnt.Linear{Te: te, DH: dh}
	models := []cnt.DrivingForce{
		cnt.Hoffman{Te: te, DH: dh},
		cnt.ThompsonSpaepen{Te: te, DH: dh},
		cnt.ConstantCp{Te: te, DH: dh, DCp: dcp},
		cnt.ConstantCp{Te: te, DH: dh, DCp: 3 * dcp},
	}
	for _, dT := range []float64{10, 1, 0.1, 1e-2, 1e-3} {
		x := dT / te
		T := te - dT
		l := lin.PerMole(T)
		for _, m := range models {
			r := m.PerMole(T) / l
			// every ratio above has |1 − ratio| ≤ 2x for ΔCp·T_e/ΔH ≤ 3 and small x
			if !(math.Abs(r-1) <= 2*x) {
				t.Errorf("%s, ΔT = %g: ratio to linear %.12g, want within %g of 1", m.Name(), dT, r, 2*x)
			}
		}
		if dT > 0.01 { // below, rounding in the difference dominates x²/12
			ts := cnt.ThompsonSpaepen{Te: te, DH: dh}.PerMole(T)
			cp := cnt.ConstantCp{Te: te, DH: dh, DCp: dcp}.PerMole(T)
			if d := (cp - ts) / l; !close(d, x*x/12, 0.05) {
				t.Errorf("ΔT = %g: (cp − ts)/linear = %g, want x²/12 = %g within 5 %%", dT, d, x*x/12)
			}
		}
		hof := cnt.Hoffman{Te: te, DH: dh}.PerMole(T) / l
		if !close(hof, 1-x, 1e-9) {
			t.Errorf("ΔT = %g: hoffman/linear = %.15g, want 1 − x = %.15g", dT, hof, 1-x)
		}
	}
}

// ConstantCp with ΔCp = 0 is Turnbull's linear law, exactly (the formula
// has no other term), above and below T_e.
func TestConstantCpZeroIsLinear(t *testing.T) {
	for _, te := range []float64{273.15, 933.47, 1337} {
		for _, dh := range []float64{6010, 10710, 12550} {
			lin := cnt.Linear{Te: te, DH: dh}
			cp := cnt.ConstantCp{Te: te, DH: dh}
			for T := 1.0; T < 2*te; T *= 1.07 {
				if a, b := cp.PerMole(T), lin.PerMole(T); a != b {
					t.Fatalf("Te=%g ΔH=%g T=%g: cp %.17g != linear %.17g", te, dh, T, a, b)
				}
			}
		}
	}
}

// Special cases for every driving model, compared NaN-aware: no driving
// force at and above T_e (0 exactly at T_e, negative above), NaN in gives
// NaN out, ConstantCp has no answer at T ≤ 0, a table none outside its range.
func TestDrivingForceSpecialCases(t *testing.T) {
	const te, dh = 1000.0, 1e4
	nan := math.NaN()
	tab, err := cnt.NewTable([]float64{500, 800, 1000, 1100}, []float64{4000, 2000, 0, -1000}, "test")
	if err != nil {
		t.Fatal(err)
	}
	models := []cnt.DrivingForce{
		cnt.Linear{Te: te, DH: dh},
		cnt.Hoffman{Te: te, DH: dh},
		cnt.ThompsonSpaepen{Te: te, DH: dh},
		cnt.ConstantCp{Te: te, DH: dh, DCp: 7},
		cnt.ConstantCp{Te: te, DH: dh, DCp: -3},
		tab,
	}
	for _, m := range models {
		if got := m.PerMole(te); got != 0 {
			t.Errorf("%s: Δg(Te) = %g, want 0", m.Name(), got)
		}
		for _, T := range []float64{te + 1e-6, te + 1, te + 100} {
			if got := m.PerMole(T); !(got < 0) {
				t.Errorf("%s: Δg(%g) = %g, want < 0 above Te", m.Name(), T, got)
			}
		}
		if got := m.PerMole(nan); !same(got, nan) {
			t.Errorf("%s: Δg(NaN) = %g, want NaN", m.Name(), got)
		}
	}
	for _, c := range []struct {
		m    cnt.DrivingForce
		T    float64
		want float64
	}{
		{cnt.ConstantCp{Te: te, DH: dh, DCp: 7}, 0, nan},
		{cnt.ConstantCp{Te: te, DH: dh, DCp: 7}, -5, nan},
		{cnt.ConstantCp{Te: te, DH: dh, DCp: 0}, 0, nan},
		{tab, 499.999, nan},
		{tab, 1100.001, nan},
		{tab, math.Inf(1), nan},
		{tab, math.Inf(-1), nan},
		{tab, 500, 4000},
		{tab, 1100, -1000},
	} {
		if got := c.m.PerMole(c.T); !same(got, c.want) {
			t.Errorf("%s: Δg(%g) = %g, want %g", c.m.Name(), c.T, got, c.want)
		}
	}
}

func TestTableInterpolation(t *testing.T) {
	// Rows given in descending order must give the same table.
	for _, rows := range []struct{ T, g []float64 }{
		{[]float64{300, 400, 500}, []float64{2000, 1000, -500}},
		{[]float64{500, 400, 300}, []float64{-500, 1000, 2000}},
	} {
		tab, err := cnt.NewTable(rows.T, rows.g, "hand")
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range []struct{ T, want float64 }{
			{300, 2000}, {350, 1500}, {400, 1000}, {450, 250}, {500, -500}, {325, 1750},
		} {
			if got := tab.PerMole(c.T); !close(got, c.want, 1e-14) {
				t.Errorf("rows %v: Δg(%g) = %g, want %g", rows.T, c.T, got, c.want)
			}
		}
		// Crossing between 400 K (+1000) and 500 K (−500): 400 + 100·1000/1500.
		te, ok := tab.Equilibrium()
		if !ok || !close(te, 400+100*1000.0/1500, 1e-14) {
			t.Errorf("rows %v: Equilibrium() = %g, %v, want 466.667, true", rows.T, te, ok)
		}
		if tab.Name() != "table" || tab.Label != "hand" {
			t.Errorf("Name, Label = %q, %q", tab.Name(), tab.Label)
		}
	}
	// Input slices are not aliased.
	T, g := []float64{300, 400}, []float64{1, -1}
	tab, _ := cnt.NewTable(T, g, "")
	T[0], g[0] = 1, 99
	if tab.T[0] != 300 || tab.G[0] != 1 {
		t.Errorf("NewTable keeps the caller's slices")
	}
}

func TestTableEquilibrium(t *testing.T) {
	for _, c := range []struct {
		name string
		T, g []float64
		want float64
		ok   bool
	}{
		{"crossing on a row", []float64{300, 400, 500}, []float64{10, 0, -10}, 400, true},
		{"two crossings: the highest", []float64{100, 200, 300, 400}, []float64{5, -5, 5, -15}, 325, true},
		{"all positive", []float64{100, 200}, []float64{5, 1}, 0, false},
		{"all negative", []float64{100, 200}, []float64{-5, -1}, 0, false},
		{"wrong way (rises with T)", []float64{100, 200}, []float64{-5, 5}, 0, false},
	} {
		tab, err := cnt.NewTable(c.T, c.g, "")
		if err != nil {
			t.Fatal(err)
		}
		te, ok := tab.Equilibrium()
		if ok != c.ok || ok && !close(te, c.want, 1e-14) {
			t.Errorf("%s: Equilibrium() = %g, %v, want %g, %v", c.name, te, ok, c.want, c.ok)
		}
	}
}

func TestNewTableErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, c := range []struct {
		name string
		T, g []float64
		msg  string
	}{
		{"no rows", nil, nil, "at least 2 rows"},
		{"one row", []float64{300}, []float64{1}, "at least 2 rows"},
		{"zero temperature", []float64{0, 300}, []float64{1, 2}, "row 1"},
		{"negative temperature", []float64{-10, 300}, []float64{1, 2}, "row 1"},
		{"NaN temperature", []float64{300, nan, 500}, []float64{1, 2, 3}, "row 2"},
		{"infinite temperature", []float64{300, inf}, []float64{1, 2}, "row 2"},
		{"NaN Δg", []float64{300, 400}, []float64{1, nan}, "row 2"},
		{"infinite Δg", []float64{300, 400}, []float64{-inf, 1}, "row 1"},
		{"repeated temperature", []float64{300, 300, 400}, []float64{1, 2, 3}, "row 2"},
		{"not monotonic", []float64{300, 500, 400}, []float64{1, 2, 3}, "row 3"},
	} {
		_, err := cnt.NewTable(c.T, c.g, "")
		if !errorWith(err, c.msg) {
			t.Errorf("%s: NewTable error %v, want one containing %q", c.name, err, c.msg)
		}
	}
	mustPanic(t, "NewTable with columns of different length", func() { cnt.NewTable([]float64{1, 2}, []float64{1}, "") })
}

// A table given hottest row first is reversed before it is checked; the row
// number in the error should still be the caller's.
func TestNewTableErrorRowDescending(t *testing.T) {
	_, err := cnt.NewTable([]float64{500, 400, 300}, []float64{math.NaN(), 1000, 2000}, "")
	if err == nil {
		t.Fatal("NaN Δg accepted")
	}
	if !strings.Contains(err.Error(), "row 1") {
		t.Errorf("bug: cnt/driving.go NewTable reports rows of the reversed table for descending input: got %q, the bad row is row 1", err)
	}
}

// Every driving force answers for its own equilibrium temperature: the
// laws written with T_e, a table (given T_e or its sign change), a fixed
// supersaturation (its reference T_sat, or none) and the solubility laws.
func TestEquilibrium(t *testing.T) {
	tab, err := cnt.NewTable([]float64{300, 400, 500}, []float64{2000, 1000, -500}, "hand")
	if err != nil {
		t.Fatal(err)
	}
	given := *tab
	given.Te = 450
	sol, err := cnt.NewSolubilityTable([]float64{280, 300, 320}, []float64{1, 2, 4}, 2, "hand")
	if err != nil {
		t.Fatal(err)
	}
	read := *sol
	read.Tsat = 301
	for _, c := range []struct {
		d    cnt.DrivingForce
		want float64
		ok   bool
	}{
		{cnt.Linear{Te: 1000, DH: 1}, 1000, true},
		{cnt.Hoffman{Te: 900, DH: 1}, 900, true},
		{cnt.ThompsonSpaepen{Te: 800, DH: 1}, 800, true},
		{cnt.ConstantCp{Te: 700, DH: 1, DCp: 2}, 700, true},
		{tab, 400 + 100*1000.0/1500, true}, // where Δg = 0 between 400 and 500 K, by hand
		{&given, 450, true},
		{cnt.Supersaturation{S: 2, Tsat: 310}, 310, true},
		{cnt.Supersaturation{S: 2}, 0, false},
		{cnt.VantHoff{Tsat: 313.15, DHsol: 2e4}, 313.15, true},
		{sol, 300, true}, // c_sat = 2 at the 300 K row
		{&read, 301, true},
	} {
		got, ok := c.d.Equilibrium()
		if ok != c.ok || math.Abs(got-c.want) > 1e-12*c.want {
			t.Errorf("%s: Equilibrium() = %g, %v; want %g, %v", c.d.Name(), got, ok, c.want, c.ok)
		}
	}
}
