package kinetics_test

import (
	"bufio"
	"bytes"
	"fmt"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"undercool/cnt"
	"undercool/kinetics"
)

// same reports whether two results are the same answer, NaN-aware.
func same(a, b float64) bool { return a == b || (math.IsNaN(a) && math.IsNaN(b)) }

// close reports whether got is within relative tolerance tol of want.
func close(got, want, tol float64) bool { return scalar.EqualWithinRel(got, want, tol) }

// refRow is one data line of a reference table under testdata/ref, with
// its position for error messages.
type refRow struct {
	pos    string // file:line
	fields []string
}

func readRef(t *testing.T, name string) []refRow {
	t.Helper()
	path := "../testdata/ref/" + name
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var rows []refRow
	sc := bufio.NewScanner(bytes.NewReader(b))
	for line := 1; sc.Scan(); line++ {
		s := strings.TrimSpace(sc.Text())
		if s == "" || strings.HasPrefix(s, "#") {
			continue
		}
		rows = append(rows, refRow{fmt.Sprintf("testdata/ref/%s:%d", name, line), strings.Fields(s)})
	}
	return rows
}

func (r refRow) float(t *testing.T, i int) float64 {
	t.Helper()
	x, err := strconv.ParseFloat(r.fields[i], 64)
	if err != nil {
		t.Fatalf("%s: field %d: %v", r.pos, i+1, err)
	}
	return x
}

// Arrhenius D = D0·exp(−Qd/RT) against ten rows of the diffusion-data table
// of Callister and Rethwisch, Materials Science and Engineering: An
// Introduction, Table 5.2, whose D0 and Qd come from Smithells Metals
// Reference Book, 7th ed. (1992) (testdata/ref/diffusion-arrhenius.txt, from
// memory; see the file). Tolerance per row: half a unit in the last printed digit (values
// have 2 figures) plus 2 % for the book's R = 8.31 J/(mol·K) and 273-K offset
// against our exact R and the same offset.
func TestArrheniusCallisterTable(t *testing.T) {
	rows := readRef(t, "diffusion-arrhenius.txt")
	if len(rows) < 10 {
		t.Fatalf("only %d rows in the diffusion table", len(rows))
	}
	for _, r := range rows {
		if len(r.fields) != 7 {
			t.Fatalf("%s: want 7 fields, got %d", r.pos, len(r.fields))
		}
		d0, q, tc, want := r.float(t, 2), r.float(t, 3)*1e3, r.float(t, 4), r.float(t, 5)
		mantissa := want / math.Pow(10, math.Floor(math.Log10(want)))
		tol := 0.05/mantissa + 0.02
		got := math.Exp(kinetics.Arrhenius{D0: d0, Q: q}.LnDiffusivity(tc + 273))
		if !close(got, want, tol) {
			t.Errorf("%s: %s in %s at %g °C: D = %.3g m²/s, want %.2g within %.1f %%", r.pos, r.fields[0], r.fields[1], tc, got, want, 100*tol)
		}
	}
}

func TestArrheniusForm(t *testing.T) {
	a := kinetics.Arrhenius{D0: 7.8e-5, Q: 211e3}
	if a.Name() != "arrhenius" {
		t.Errorf("Name() = %q", a.Name())
	}
	// ln D is exactly linear in 1/T with slope −Q/R (the Arrhenius plot).
	t1, t2 := 700.0, 1200.0
	slope := (a.LnDiffusivity(t2) - a.LnDiffusivity(t1)) / (1/t2 - 1/t1)
	if !close(slope, -a.Q/cnt.Gas, 1e-12) {
		t.Errorf("Arrhenius slope = %g, want −Q/R = %g", slope, -a.Q/cnt.Gas)
	}
	// Q = 0: D = D0 at every temperature.
	if got := (kinetics.Arrhenius{D0: 1e-9}).LnDiffusivity(300); !close(got, math.Log(1e-9), 1e-15) {
		t.Errorf("Q = 0: ln D = %g, want ln D0", got)
	}
}

// Stokes–Einstein D = k_BT/(3πηλ) (Einstein A., Ann. Phys. 17 (1905) 549),
// by hand for water at 25 °C: η = 0.890 mPa·s (Engineers Edge water table,
// testdata/ref/water-viscosity.txt), λ = 0.3 nm:
// D = 1.380649e-23·298.15/(3π·0.890e-3·0.3e-9) = 4.11640e-21/2.51642e-12
// = 1.63582e-9 m²/s.
func TestStokesEinsteinWater(t *testing.T) {
	// B = 0 makes the VFT law a constant viscosity, 10^A Pa·s.
	m := kinetics.VFT{A: math.Log10(0.890e-3), Jump: 0.3e-9}
	got := math.Exp(m.LnDiffusivity(298.15))
	if !close(got, 1.63582e-9, 1e-5) {
		t.Errorf("Stokes–Einstein, water 25 °C, λ = 0.3 nm: D = %.6g m²/s, want 1.63582e-9 (hand)", got)
	}
	// With λ = v^(1/3) from the molar volume of water at 25 °C, 18.07 cm³/mol
	// (Chaplin M., Water Structure and Science, lsbu.ac.uk/water/data1.html,
	// 18.048 at 20 °C and 18.094 at 30 °C), the estimate is within a factor 2
	// of the measured self-diffusion coefficient, 2.30e-9 m²/s at 25 °C (Mills
	// R., J. Phys. Chem. 77 (1973) 685; from memory). Stokes–Einstein with a
	// molecular diameter is an order-of-magnitude rule for small molecules
	// (common practice), so this is a sanity bound, not an equality.
	lambda := math.Cbrt(18.07e-6 / cnt.Avogadro)
	m.Jump = lambda
	d := math.Exp(m.LnDiffusivity(298.15))
	if r := d / 2.30e-9; !(r > 0.5 && r < 2) {
		t.Errorf("water, λ = %.3g m: D = %.3g m²/s, ratio to measured %.2f, want within a factor 2", lambda, d, r)
	}
}

// VFT for water: log10 η = log10(2.414e-5 Pa·s) + 247.8 K/(T − 140 K), the fit
// printed with the Engineers Edge water table, against the table itself
// (testdata/ref/water-viscosity.txt). Tolerance 2.5 %: the fit's own
// deviation from the table over 0–100 °C is below 2 % (checked here).
func TestVFTWaterViscosity(t *testing.T) {
	m := kinetics.VFT{A: math.Log10(2.414e-5), B: 247.8, T0: 140, Jump: 0.3e-9}
	if m.Name() != "vft" {
		t.Errorf("Name() = %q", m.Name())
	}
	for _, r := range readRef(t, "water-viscosity.txt") {
		T, want := r.float(t, 0)+273.15, r.float(t, 1)*1e-3
		got := math.Pow(10, m.Log10Viscosity(T))
		if !close(got, want, 0.025) {
			t.Errorf("%s: η(%g K) = %.4g Pa·s, want %.4g within 2.5 %%", r.pos, T, got, want)
		}
		// ln D is Stokes–Einstein with this η.
		wantD := cnt.Boltzmann * T / (3 * math.Pi * got * m.Jump)
		if d := math.Exp(m.LnDiffusivity(T)); !close(d, wantD, 1e-12) {
			t.Errorf("%s: D = %g, want kT/(3πηλ) = %g", r.pos, d, wantD)
		}
	}
}

// Williams M.L., Landel R.F., Ferry J.D., J. Am. Chem. Soc. 77 (1955) 3701:
// log10(η/η_g) = −C1(T − Tg)/(C2 + T − Tg) with the universal C1 = 17.44,
// C2 = 51.6 K; η(Tg) = 1e12 Pa·s (Angell C.A., Science 267 (1995) 1924).
// By hand: at Tg + C2, log10 η = 12 − 17.44/2 = 3.28; at Tg + 100 K,
// 12 − 1744/151.6 = 0.49604.
func TestWLFUniversal(t *testing.T) {
	if kinetics.WLFC1 != 17.44 || kinetics.WLFC2 != 51.6 || kinetics.EtaAtTg != 1e12 {
		t.Fatalf("universal WLF constants %g, %g, %g; want 17.44, 51.6 K, 1e12 Pa·s", kinetics.WLFC1, kinetics.WLFC2, kinetics.EtaAtTg)
	}
	const tg, lambda = 300.0, 0.5e-9
	m := kinetics.WLF{Tg: tg, C1: kinetics.WLFC1, C2: kinetics.WLFC2, EtaG: kinetics.EtaAtTg, Jump: lambda}
	if m.Name() != "wlf" {
		t.Errorf("Name() = %q", m.Name())
	}
	for _, c := range []struct{ T, want float64 }{
		{tg, 12},
		{tg + kinetics.WLFC2, 3.28},
		{tg + 100, 12 - 1744/151.6},
		{tg + 100, 0.49604},
	} {
		if got := m.Log10Viscosity(c.T); !(math.Abs(got-c.want) < 1e-5) {
			t.Errorf("log10 η(%g K) = %.8g, want %.8g", c.T, got, c.want)
		}
	}
	// At Tg, D = k_B·Tg/(3π·1e12·λ) = 4.14195e-21/4712.39 = 8.7895e-25 m²/s (hand).
	if d := math.Exp(m.LnDiffusivity(tg)); !close(d, 8.7895e-25, 1e-4) {
		t.Errorf("D(Tg) = %g m²/s, want 8.7895e-25", d)
	}
}

// Where a viscosity law diverges there is no mobility: ln D = −Inf, never
// NaN and never a division by a negative number (DESIGN §3).
func TestMobilitySpecialCases(t *testing.T) {
	vft := kinetics.VFT{A: -4.5, B: 1000, T0: 200, Jump: 3e-10}
	wlf := kinetics.WLF{Tg: 300, C1: 17.44, C2: 51.6, EtaG: 1e12, Jump: 3e-10}
	inf := math.Inf(1)
	for _, c := range []struct {
		name       string
		m          interface{ Log10Viscosity(float64) float64 }
		lnD        func(float64) float64
		T          float64
		wantLog10η float64
	}{
		{"VFT at T0", vft, vft.LnDiffusivity, 200, inf},
		{"VFT below T0", vft, vft.LnDiffusivity, 150, inf},
		{"VFT far below T0", vft, vft.LnDiffusivity, 1, inf},
		{"WLF below Tg − C2", wlf, wlf.LnDiffusivity, 300 - 51.6 - 1, inf},
		{"WLF far below Tg − C2", wlf, wlf.LnDiffusivity, 10, inf},
	} {
		if got := c.m.Log10Viscosity(c.T); !same(got, c.wantLog10η) {
			t.Errorf("%s: log10 η = %g, want %g", c.name, got, c.wantLog10η)
		}
		if got := c.lnD(c.T); !math.IsInf(got, -1) {
			t.Errorf("%s: ln D = %g, want -Inf", c.name, got)
		}
	}
	// NaN in, NaN out: a NaN temperature is not "no mobility".
	for _, m := range []kinetics.Mobility{vft, wlf, kinetics.Arrhenius{D0: 1e-5, Q: 1e5}} {
		if got := m.LnDiffusivity(math.NaN()); !math.IsNaN(got) {
			t.Errorf("%s: ln D(NaN) = %g, want NaN", m.Name(), got)
		}
	}
	// Just above the divergences the laws are finite and the mobility tiny.
	for _, c := range []struct {
		name string
		lnD  float64
	}{
		{"VFT at T0 + 1e-3 K", vft.LnDiffusivity(200.001)},
		{"WLF at Tg − C2 + 1e-3 K", wlf.LnDiffusivity(300 - 51.6 + 1e-3)},
	} {
		if math.IsNaN(c.lnD) || math.IsInf(c.lnD, 0) || c.lnD > -100 {
			t.Errorf("%s: ln D = %g, want finite and very negative", c.name, c.lnD)
		}
	}
	// ln D never increases on cooling towards the divergence.
	prevV, prevW := math.Inf(1), math.Inf(1)
	for T := 600.0; T > 150; T -= 0.5 {
		v, w := vft.LnDiffusivity(T), wlf.LnDiffusivity(T)
		if v > prevV || w > prevW {
			t.Fatalf("T = %g: ln D rose on cooling (VFT %g after %g, WLF %g after %g)", T, v, prevV, w, prevW)
		}
		prevV, prevW = v, w
	}
}
