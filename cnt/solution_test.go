package cnt_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"undercool/cnt"
)

// Hand values of Δg = R·T·ln S at 25 °C, with R = N_A·k_B = 8.31446261815324
// J/(mol·K) (exact in the 2019 SI) worked out by hand:
//
//	S = 2:    8.31446261815324·298.15·0.693147180559945 = 1718.28207580 J/mol
//	S = 1.5:  8.31446261815324·298.15·0.405465108108164 = 1005.13058000 J/mol
func TestSupersaturationHandValues(t *testing.T) {
	for _, c := range []struct{ S, want float64 }{
		{2, 1718.28207580},
		{1.5, 1005.13058000},
		{1, 0},
	} {
		m := cnt.Supersaturation{S: c.S}
		got := m.PerMole(298.15)
		if c.want == 0 && got != 0 || c.want != 0 && !close(got, c.want, 1e-10) {
			t.Errorf("S = %g: Δg(298.15 K) = %.12g, want %.12g", c.S, got, c.want)
		}
		// Per molecule, Δμ = k_B·T·ln S (the definition, Kashchiev and van Rosmalen 2003 eq. 2).
		dmu := got / cnt.Avogadro
		if want := cnt.Boltzmann * 298.15 * math.Log(c.S); c.S != 1 && !close(dmu, want, 1e-14) {
			t.Errorf("S = %g: Δμ = %g J, want k_B·T·ln S = %g J", c.S, dmu, want)
		}
	}
	if (cnt.Supersaturation{}).Name() != "supersaturation" {
		t.Errorf("Name() = %q", cnt.Supersaturation{}.Name())
	}
}

// The exact equivalence derived in the doc comment of VantHoff: ideal
// cooling crystallization at constant concentration has
// Δg = R·T·(ΔH_sol/R)(1/T − 1/T_sat) = ΔH_sol·(T_sat − T)/T_sat, which is
// Turnbull's linear law with T_e = T_sat and ΔH = ΔH_sol. Checked to 1e-12
// relative (the two are computed by different operations, so they agree to
// rounding, a few ulp) over a spread of saturation temperatures, enthalpies
// and temperatures on both sides of T_sat.
func TestVantHoffIsLinear(t *testing.T) {
	for _, tsat := range []float64{278.15, 303.15, 323.15, 353.15, 1000} {
		for _, dh := range []float64{5e3, 21.8e3, 40e3, 120e3} {
			vh := cnt.VantHoff{Tsat: tsat, DHsol: dh}
			lin := cnt.Linear{Te: tsat, DH: dh}
			for _, T := range []float64{0.3 * tsat, 0.8 * tsat, tsat - 10, tsat - 1, tsat - 1e-3, tsat, tsat + 1e-3, tsat + 5, 1.3 * tsat} {
				a, b := vh.PerMole(T), lin.PerMole(T)
				if b == 0 {
					if a != 0 {
						t.Errorf("Tsat=%g ΔH=%g T=%g: van 't Hoff %g, linear 0", tsat, dh, T, a)
					}
					continue
				}
				if !close(a, b, 1e-12) {
					t.Errorf("Tsat=%g ΔH=%g T=%.6f: van 't Hoff Δg %.17g, linear %.17g (rel %.2g)", tsat, dh, T, a, b, (a-b)/b)
				}
			}
		}
	}
}

// ln S from the van 't Hoff law against the formula written out with the
// reciprocals, (ΔH_sol/R)(1/T − 1/T_sat), away from T_sat where the
// difference of reciprocals loses nothing that matters.
func TestVantHoffLnS(t *testing.T) {
	vh := cnt.VantHoff{Tsat: 313.15, DHsol: 25e3}
	for _, T := range []float64{273.15, 283.15, 293.15, 303.15, 333.15} {
		want := 25e3 / cnt.Gas * (1/T - 1/313.15)
		if got := vh.LnS(T); !close(got, want, 1e-12) {
			t.Errorf("ln S(%g) = %.15g, want %.15g", T, got, want)
		}
	}
	if ts, ok := vh.Equilibrium(); !ok || ts != 313.15 {
		t.Errorf("Equilibrium() = %g, %v", ts, ok)
	}
	if vh.Name() != "van-t-hoff" {
		t.Errorf("Name() = %q", vh.Name())
	}
}

// A table made from the van 't Hoff law is interpolated exactly (ln c is
// linear in 1/T there), so it must give the law's ln S between its rows and
// recover the saturation temperature of a solution saturated at T_sat.
func TestSolubilityTableFromVantHoff(t *testing.T) {
	const dh, t0, c0 = 21.8e3, 298.15, 14.0 // any units for c
	csat := func(T float64) float64 { return c0 * math.Exp(-dh/cnt.Gas*(1/T-1/t0)) }
	var T, c []float64
	for x := 273.15; x <= 333.15; x += 10 {
		T = append(T, x)
		c = append(c, csat(x))
	}
	const tsat = 318.0
	tab, err := cnt.NewSolubilityTable(T, c, csat(tsat), "law")
	if err != nil {
		t.Fatal(err)
	}
	vh := cnt.VantHoff{Tsat: tsat, DHsol: dh}
	for x := 274.0; x < 333; x += 3.7 {
		if got, want := tab.LnS(x), vh.LnS(x); math.Abs(got-want) > 1e-12*math.Max(1, math.Abs(want)) {
			t.Errorf("T = %g: table ln S = %.15g, law %.15g", x, got, want)
		}
	}
	ts, err := tab.SaturationTemperature()
	if err != nil || !close(ts, tsat, 1e-12) {
		t.Errorf("SaturationTemperature() = %.15g, %v; want %g", ts, err, tsat)
	}
	if got := tab.ConcentrationAt(303.15); !close(got, csat(303.15), 1e-12) {
		t.Errorf("ConcentrationAt(303.15) = %g, want %g", got, csat(303.15))
	}
	if tab.Name() != "solubility-table" || tab.Label != "law" {
		t.Errorf("Name, Label = %q, %q", tab.Name(), tab.Label)
	}
}

func TestSolubilityTableHandValues(t *testing.T) {
	// Rows in descending order must give the same table. Between 300 K (c = 10)
	// and 400 K (c = 40): w = (1/350 − 1/300)/(1/400 − 1/300) = 4/7, so
	// ln c = ln 10 + (4/7)·ln 4, c = 10·4^(4/7) = 22.079… (by hand).
	for _, rows := range []struct{ T, c []float64 }{
		{[]float64{300, 400, 500}, []float64{10, 40, 80}},
		{[]float64{500, 400, 300}, []float64{80, 40, 10}},
	} {
		tab, err := cnt.NewSolubilityTable(rows.T, rows.c, 40, "hand")
		if err != nil {
			t.Fatal(err)
		}
		want := 10 * math.Pow(4, 4.0/7)
		if got := tab.ConcentrationAt(350); !close(got, want, 1e-13) {
			t.Errorf("rows %v: c_sat(350) = %.15g, want %.15g", rows.T, got, want)
		}
		for _, c := range []struct{ T, lnS float64 }{
			{400, 0}, {300, math.Log(4)}, {500, math.Log(0.5)},
		} {
			if got := tab.LnS(c.T); math.Abs(got-c.lnS) > 1e-15 {
				t.Errorf("rows %v: ln S(%g) = %g, want %g", rows.T, c.T, got, c.lnS)
			}
		}
		ts, err := tab.SaturationTemperature()
		if err != nil || ts != 400 {
			t.Errorf("rows %v: SaturationTemperature() = %g, %v; want 400", rows.T, ts, err)
		}
	}
}

// Special cases of every solution model, NaN-aware: no driving force at
// S ≤ 1 (0 at S = 1, negative below), NaN for T ≤ 0 or NaN, a table none
// outside its range.
func TestSolutionSpecialCases(t *testing.T) {
	nan := math.NaN()
	tab, err := cnt.NewSolubilityTable([]float64{280, 300, 320}, []float64{5, 10, 20}, 10, "")
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		m    cnt.Solution
		T    float64
		want float64 // sign only when ±1, exact otherwise
	}{
		{cnt.Supersaturation{S: 1}, 300, 0},
		{cnt.Supersaturation{S: 0.5}, 300, -1},
		{cnt.Supersaturation{S: 2}, 0, nan},
		{cnt.Supersaturation{S: 2}, -3, nan},
		{cnt.Supersaturation{S: 2}, nan, nan},
		{cnt.VantHoff{Tsat: 300, DHsol: 2e4}, 300, 0},
		{cnt.VantHoff{Tsat: 300, DHsol: 2e4}, 310, -1},
		{cnt.VantHoff{Tsat: 300, DHsol: 2e4}, 0, nan},
		{cnt.VantHoff{Tsat: 300, DHsol: 2e4}, nan, nan},
		{tab, 300, 0},
		{tab, 310, -1},
		{tab, 290, 1},
		{tab, 279.999, nan},
		{tab, 320.001, nan},
		{tab, math.Inf(1), nan},
		{tab, nan, nan},
	} {
		got := c.m.PerMole(c.T)
		switch {
		case math.IsNaN(c.want):
			if !math.IsNaN(got) {
				t.Errorf("%s: Δg(%g) = %g, want NaN", c.m.Name(), c.T, got)
			}
		case c.want == 0:
			if got != 0 {
				t.Errorf("%s: Δg(%g) = %g, want 0", c.m.Name(), c.T, got)
			}
		case math.Signbit(got) != math.Signbit(c.want) || got == 0:
			t.Errorf("%s: Δg(%g) = %g, want the sign of %g", c.m.Name(), c.T, got, c.want)
		}
	}
}

func TestNewSolubilityTableErrors(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, c := range []struct {
		name string
		T, c []float64
		conc float64
		msg  string
	}{
		{"no rows", nil, nil, 1, "at least 2 rows"},
		{"one row", []float64{300}, []float64{1}, 1, "at least 2 rows"},
		{"zero concentration", []float64{300, 310}, []float64{1, 2}, 0, "concentration must be positive"},
		{"negative concentration", []float64{300, 310}, []float64{1, 2}, -1, "concentration must be positive"},
		{"NaN concentration", []float64{300, 310}, []float64{1, 2}, nan, "concentration must be positive"},
		{"infinite concentration", []float64{300, 310}, []float64{1, 2}, inf, "concentration must be positive"},
		{"zero temperature", []float64{0, 300}, []float64{1, 2}, 1, "row 1: temperature"},
		{"NaN temperature", []float64{300, nan}, []float64{1, 2}, 1, "row 2: temperature"},
		{"negative solubility", []float64{300, 310}, []float64{1, -2}, 1, "row 2: solubility must be positive"},
		{"zero solubility", []float64{300, 310}, []float64{0, 2}, 1, "row 1: solubility must be positive"},
		{"NaN solubility", []float64{300, 310}, []float64{1, nan}, 1, "row 2: solubility"},
		{"repeated temperature", []float64{300, 300, 310}, []float64{1, 2, 3}, 1, "row 2: temperatures must be strictly monotonic"},
		{"not monotonic", []float64{300, 320, 310}, []float64{1, 2, 3}, 1, "row 3: temperatures must be strictly monotonic"},
		{"not monotonic, descending", []float64{320, 310, 315}, []float64{1, 2, 3}, 1, "row 3: temperatures must be strictly monotonic"},
	} {
		_, err := cnt.NewSolubilityTable(c.T, c.c, c.conc, "")
		if !errorWith(err, c.msg) {
			t.Errorf("%s: error %v, want one containing %q", c.name, err, c.msg)
		}
	}
	mustPanic(t, "columns of different length", func() { cnt.NewSolubilityTable([]float64{1, 2}, []float64{1}, 1, "") })
}

func TestSaturationTemperatureErrors(t *testing.T) {
	// A solubility with a maximum has no single saturation temperature.
	tab, err := cnt.NewSolubilityTable([]float64{280, 300, 320}, []float64{5, 10, 8}, 7, "")
	if err != nil {
		t.Fatal(err)
	}
	_, err = tab.SaturationTemperature()
	if !errors.Is(err, cnt.ErrNotMonotonic) || !strings.Contains(err.Error(), "row 3") {
		t.Errorf("non-monotonic solubility: error %v, want ErrNotMonotonic at row 3", err)
	}
	if _, ok := tab.Equilibrium(); ok {
		t.Errorf("Equilibrium() found a saturation temperature in a non-monotonic table")
	}
	// But it still gives S at a temperature.
	if got := tab.LnS(300); !close(got, math.Log(0.7), 1e-14) {
		t.Errorf("ln S(300) = %g, want ln 0.7", got)
	}
	for _, conc := range []float64{4.9, 20.1} {
		tab, _ := cnt.NewSolubilityTable([]float64{280, 300, 320}, []float64{5, 10, 20}, conc, "")
		if _, err := tab.SaturationTemperature(); !errorWith(err, "outside the tabulated solubilities") {
			t.Errorf("conc %g: error %v, want outside the table", conc, err)
		}
	}
}

// β* = 4π·r*·D·c against the volume-diffusion form of Kashchiev and van
// Rosmalen (2003), (48π²v)^(1/3)·D·C·n*^(1/3), evaluated at a critical
// nucleus from Critical (the two are the same expression; r* and n* come
// from the one nucleus).
func TestLnAttachmentDiffusion(t *testing.T) {
	const gamma, v, T, D, c = 2e-3, 1.94e-28, 298.15, 1e-9, 5e26
	dmu := cnt.Boltzmann * T * math.Log(3)
	n := cnt.Critical(dmu, gamma, v, 1, T)
	got := cnt.LnAttachmentDiffusion(math.Log(D), n.Radius, c)
	want := math.Log(math.Cbrt(48*math.Pi*math.Pi*v) * D * c * math.Cbrt(n.Size))
	if !close(got, want, 1e-13) {
		t.Errorf("ln β* = %.15g, want %.15g", got, want)
	}
	if got := cnt.LnAttachmentDiffusion(math.Log(D), math.Inf(1), c); !math.IsNaN(got) {
		t.Errorf("no nucleus: ln β* = %g, want NaN", got)
	}
	if got := cnt.LnAttachmentDiffusion(math.Inf(-1), n.Radius, c); !math.IsInf(got, -1) {
		t.Errorf("no mobility: ln β* = %g, want −Inf", got)
	}
}
