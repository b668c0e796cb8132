package presets

import (
	"fmt"
	"math"
	"path/filepath"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"testing"

	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets/units"
)

// The shipped cards against the measured data of testdata/measured (its
// README names the source of every row, and says which are recalled "from
// memory"). Each card names the rows it was calibrated on and the rows it
// is checked against in its [standing]; the tests here recompute every row
// from the shipped card, so a standing cannot drift from the truth, and hold
// the held-out rows to tolerances chosen from the data's scatter before the
// results were seen. A calibration row reproduced is called that, not a check.

const measuredDir = "../testdata/measured"

// measured is how a card predicts the rows of one file, and in what unit
// the difference is counted.
type measured struct {
	cols []Column
	unit string // "decades" or "K"
	// diff is model − measured at one row (decades or kelvin).
	diff func(t *testing.T, md *kinetics.Model, row map[string]float64) float64
}

var (
	colT = Column{Quantity: "temperature", Kind: units.Temperature, Required: true}
	// rate: log10 J of the model against a measured steady-state rate.
	rateFile = measured{[]Column{colT, {Quantity: "rate", Kind: units.RateDensity, Required: true}}, "decades",
		func(t *testing.T, md *kinetics.Model, r map[string]float64) float64 {
			return md.At(r["temperature"]).Log10J() - math.Log10(r["rate"])
		}}
	// growth: log10 u against a measured growth rate.
	growthFile = measured{[]Column{colT, {Quantity: "growth_rate", Kind: units.Velocity, Required: true}}, "decades",
		func(t *testing.T, md *kinetics.Model, r map[string]float64) float64 {
			return math.Log10(md.At(r["temperature"]).Growth) - math.Log10(r["growth_rate"])
		}}
)

// timeFile is log10 of the isothermal time to the fraction X against a
// measured time: X = 0.01 for the first crystals DSC detects in a glass
// (common practice, the assumption stated in testdata/measured/README.md),
// X = 1e-6 for the onset of crystallization in a melt (Uhlmann 1972).
func timeFile(X float64) measured {
	return measured{[]Column{colT, {Quantity: "time", Kind: units.Time, Required: true}}, "decades",
		func(t *testing.T, md *kinetics.Model, r map[string]float64) float64 {
			_, a := md.Isothermal(r["temperature"], kinetics.JMAK{})
			return a.LnTime(X)/math.Ln10 - math.Log10(r["time"])
		}}
}

// measuredFiles are the files of testdata/measured and how each is predicted.
var measuredFiles = map[string]measured{
	"lithium-disilicate-nucleation.csv": rateFile,
	"lithium-disilicate-growth.csv":     growthFile,
	"ice-nucleation.csv":                rateFile,
	"indomethacin-growth.csv":           growthFile,
	"indomethacin-onset.csv":            timeFile(0.01),
	"vit1-ttt.csv":                      timeFile(1e-6),
	// The critical cooling rate to stay below X = 1e-6 on linear cooling
	// from Te to the card's end (Tg), the exact path integral.
	"vit1-critical-cooling.csv": {[]Column{{Quantity: "critical_cooling_rate", Kind: units.CoolingRate, Required: true}}, "decades",
		func(t *testing.T, md *kinetics.Model, r map[string]float64) float64 {
			c, err := md.LinearCooling(0)
			if err != nil {
				t.Fatal(err)
			}
			return math.Log10(c.CriticalRate(1e-6)) - math.Log10(r["critical_cooling_rate"])
		}},
	// The median freezing temperature of droplets of one diameter cooled at
	// a constant rate: half are frozen where the expected number of nuclei
	// V·∫J dt reaches ln 2, which is where it reaches 1 in the volume V/ln 2.
	"ice-droplet-freezing.csv": {[]Column{{Quantity: "diameter", Kind: units.Length, Required: true},
		{Quantity: "cooling_rate", Kind: units.CoolingRate, Required: true}, colT}, "K",
		func(t *testing.T, md *kinetics.Model, r map[string]float64) float64 {
			c, err := md.LinearCooling(0)
			if err != nil {
				t.Fatal(err)
			}
			d := r["diameter"]
			o := c.Onset(math.Pi/6*d*d*d/math.Ln2, r["cooling_rate"])
			if !o.Reached {
				t.Fatalf("droplet of %g m never freezes", d)
			}
			return o.Temp - r["temperature"]
		}},
}

// readMeasuredRow reads row "FILE.csv:LINE" of testdata/measured.
func readMeasuredRow(t *testing.T, ref string) (measured, map[string]float64) {
	t.Helper()
	file, line, ok := strings.Cut(ref, ":")
	m, known := measuredFiles[file]
	if !ok || !known {
		t.Fatalf("%s: not a row of a known measured file", ref)
	}
	d, err := ReadDataFile(filepath.Join(measuredDir, file), nil, m.cols)
	if err != nil {
		t.Fatal(err)
	}
	n, _ := strconv.Atoi(line)
	for i, l := range d.Lines {
		if l == n {
			row := map[string]float64{}
			for q, col := range d.Columns {
				row[q] = col[i]
			}
			return m, row
		}
	}
	t.Fatalf("%s: line %d is not a data row of %s", ref, n, file)
	return m, nil
}

// diffOf is model − measured at a row, and its unit.
func diffOf(t *testing.T, md *kinetics.Model, ref string) (float64, string) {
	t.Helper()
	m, row := readMeasuredRow(t, ref)
	return m.diff(t, md, row), m.unit
}

// statedError reads the numbers of a standing's error, by unit:
// "0.09 decades (rates), 0.35 K (droplet median)" → {decades: 0.09, K: 0.35},
// with the number of decimals each was written with.
var errorNumber = regexp.MustCompile(`([0-9]+(?:\.([0-9]+))?) (decades|K)\b`)

func statedError(t *testing.T, s string) map[string][2]float64 {
	t.Helper()
	out := map[string][2]float64{}
	for _, m := range errorNumber.FindAllStringSubmatch(s, -1) {
		x, _ := strconv.ParseFloat(m[1], 64)
		out[m[3]] = [2]float64{x, math.Pow(10, -float64(len(m[2])))}
	}
	if len(out) == 0 {
		t.Fatalf("error %q states no number in decades or K", s)
	}
	return out
}

// TestStandingRecomputed: every shipped card's standing agrees with its
// measured rows recomputed from the card as shipped. Every row it names is
// a data row of testdata/measured, no row is both calibrated on and
// checked against, and the rms of the checked rows, per unit, is the
// number the card states to the last digit it writes (within half a unit
// of it). A card that names no checked row is an estimate and says so.
func TestStandingRecomputed(t *testing.T) {
	for _, name := range Names() {
		t.Run(name, func(t *testing.T) {
			c, err := Preset(name)
			if err != nil {
				t.Fatal(err)
			}
			st := c.Standing
			if st.Estimate() {
				if !strings.HasPrefix(st.String(), EstimateText) {
					t.Errorf("standing %q does not begin %q", st, EstimateText)
				}
				return
			}
			md, err := c.Model()
			if err != nil {
				t.Fatal(err)
			}
			for _, ref := range st.Calibrated {
				readMeasuredRow(t, ref) // it exists
			}
			sum, n := map[string]float64{}, map[string]int{}
			for _, ref := range st.Checked {
				d, unit := diffOf(t, md, ref)
				t.Logf("checked %s: model − measured = %+.3f %s", ref, d, unit)
				sum[unit] += d * d
				n[unit]++
			}
			stated := statedError(t, st.Error)
			var units []string
			for u := range n {
				units = append(units, u)
			}
			sort.Strings(units)
			if len(units) != len(stated) {
				t.Errorf("error %q states %d units, the checked rows have %v", st.Error, len(stated), units)
			}
			for _, u := range units {
				rms := math.Sqrt(sum[u] / float64(n[u]))
				s, ok := stated[u]
				if !ok {
					t.Errorf("error %q states nothing in %s; the checked rows give %.4f %s", st.Error, u, rms, u)
					continue
				}
				if math.Abs(s[0]-rms) > s[1]/2+1e-12 {
					t.Errorf("error %q: the %d checked rows give rms %.4f %s", st.Error, n[u], rms, u)
				}
			}
			want := fmt.Sprintf("calibrated on %d measured point", len(st.Calibrated))
			if !strings.HasPrefix(st.String(), want) {
				t.Errorf("standing %q does not begin %q", st, want)
			}
		})
	}
}

// heldOut is one measured row a card is checked against: the tolerance on
// model − measured, chosen from the scatter of the data before the result
// was seen, and why.
type heldOut struct {
	ref string
	tol float64
	why string
}

func checkHeldOut(t *testing.T, md *kinetics.Model, rows []heldOut) {
	t.Helper()
	for _, h := range rows {
		d, unit := diffOf(t, md, h.ref)
		t.Logf("%s: model − measured = %+.3f %s (tolerance ±%g: %s)", h.ref, d, unit, h.tol, h.why)
		if !(math.Abs(d) <= h.tol) {
			t.Errorf("%s: model − measured = %+.3f %s, outside ±%g %s (%s)", h.ref, d, unit, h.tol, unit, h.why)
		}
	}
}

// calibrated is a calibration row reproduced from the shipped card, to the
// rounding of its values.
func calibrated(t *testing.T, md *kinetics.Model, ref string, tol float64) {
	t.Helper()
	d, unit := diffOf(t, md, ref)
	if !(math.Abs(d) <= tol) {
		t.Errorf("calibration row %s not reproduced: model − measured = %+.4f %s (the card drifted from its calibration)", ref, d, unit)
	}
}

// The rows of a measured file as temperatures and values, for a refit.
func measuredColumns(t *testing.T, file, q string, lines ...int) (T, y []float64) {
	t.Helper()
	for _, l := range lines {
		_, row := readMeasuredRow(t, fmt.Sprintf("%s:%d", file, l))
		T = append(T, row["temperature"])
		y = append(y, row[q])
	}
	return T, y
}

// TestLithiumDisilicateMeasured: the lithium-disilicate card against the
// measured nucleation and growth rates of testdata/measured (James 1974 and
// Fokin et al. 2006 for the rates, recalled; Ray and Day 1990 for the
// temperature of the maximum, checked; Nascimento et al. 2011 for growth,
// recalled; all in testdata/measured/README.md).
//
// Tolerances, chosen from the data's scatter: a recalled rate is uncertain
// by 0.5 decade, two such rows are compared, so a held-out nucleation rate
// must lie within 1 decade; the maximum within 1 decade and 15 K of the
// measured 10^9 m^-3 s^-1 at 726 K, and the held-out growth rates within
// half a decade rms (the targets of the card's calibration).
func TestLithiumDisilicateMeasured(t *testing.T) {
	md := mustModel(t, "lithium-disilicate", nil)
	const rows = "lithium-disilicate-nucleation.csv"
	checkHeldOut(t, md, []heldOut{
		{rows + ":11", 1, "recalled rate, 0.5 decade each side"},
		{rows + ":13", 1, "height recalled, 0.5 decade each side"},
		{rows + ":15", 1, "recalled rate, 0.5 decade each side"},
		{rows + ":17", 1, "recalled rate, 0.5 decade each side"},
	})
	// The maximum, on a 0.05 K scan (far finer than the 15 K tolerance).
	best, at := math.Inf(-1), 0.0
	for T := 650.0; T <= 900; T += 0.05 {
		if l := md.At(T).Log10J(); l > best {
			best, at = l, T
		}
	}
	t.Logf("maximum: log10 J = %.2f at %.1f K; measured 9.0 (recalled) at 726 K (Ray and Day 1990, checked)", best, at)
	if math.Abs(best-9) > 1 || math.Abs(at-726) > 15 {
		t.Errorf("maximum log10 J = %.2f at %.1f K; measured 9.0 at 726 K (tolerance 1 decade, 15 K)", best, at)
	}
	var ss float64
	growth := []int{10, 12, 13, 15}
	for _, l := range growth {
		d, _ := diffOf(t, md, fmt.Sprintf("lithium-disilicate-growth.csv:%d", l))
		ss += d * d
	}
	rms := math.Sqrt(ss / float64(len(growth)))
	t.Logf("growth, held-out lines %v: rms %.3f decades (tolerance 0.5)", growth, rms)
	if !(rms <= 0.5) {
		t.Errorf("held-out growth rates: rms %.3f decades, want at most 0.5", rms)
	}

	// Calibration reproduced: gamma(T) refitted on lines 10 and 16 with the
	// prefactor held, and growth on lines 9, 11 and 14, give the card's
	// values (to their seven written digits).
	c, _ := Preset("lithium-disilicate")
	T, J := measuredColumns(t, rows, "rate", 10, 16)
	lnJ := []float64{math.Log(J[0]), math.Log(J[1])}
	g, err := fit.InterfaceWith(md, T, lnJ, nil, fit.InterfaceOptions{Slope: true, KeepScale: true})
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(g.Gamma, c.SI("gamma"), 1e-5) || !relClose(g.Slope, c.SI("gamma_slope"), 1e-5) || g.TRef != c.SI("gamma_t_ref") {
		t.Errorf("gamma(T) refitted: %.7g J/m2 %+.7g J/m2/K about %g K; the card has %v, %v", g.Gamma, g.Slope, g.TRef, c.Values["gamma"].Text, c.Values["gamma_slope"].Text)
	}
	T, u := measuredColumns(t, "lithium-disilicate-growth.csv", "growth_rate", 9, 11, 14)
	gf, err := fit.GrowthViscosityPower(md, T, u, nil, false)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(gf.Ug, c.SI("growth_ug"), 1e-5) || !relClose(gf.Xi, c.SI("growth_xi"), 1e-5) {
		t.Errorf("growth refitted: u_g = %.7g m/s, xi = %.7g; the card has %v, %v", gf.Ug, gf.Xi, c.Values["growth_ug"].Text, c.Values["growth_xi"].Text)
	}
}

// TestVit1Measured: the vit1 card against the measured critical cooling
// rate, 0.9–1.2 K/s (Kim et al., Appl. Phys. Lett. 65 (1994) 2136,
// abstract, checked), held out: within a factor of 2 of the middle,
// 1.04 K/s (the target; the range itself is ±0.06 decade). The TTT
// nose for X = 1e-6 at 895 K, 60 s (recalled, Masuhr et al. 1999) is what
// gamma(T) was calibrated on: reproduced within 30 K and half a decade,
// which only says the card still carries its calibration.
func TestVit1Measured(t *testing.T) {
	md := mustModel(t, "vit1", nil)
	checkHeldOut(t, md, []heldOut{{"vit1-critical-cooling.csv:8", math.Log10(2), "a factor of 2"}})
	n, err := md.Nose(630, md.Te()-1, 1e-6, kinetics.JMAK{})
	if err != nil || !n.Inside() {
		t.Fatalf("no nose: %v %+v", err, n)
	}
	lt := n.LnTime / math.Ln10
	t.Logf("nose (calibration reproduced): %.2f K, %.3g s; measured 895 K, 60 s (recalled)", n.T, math.Exp(n.LnTime))
	if math.Abs(n.T-895) > 30 || math.Abs(lt-math.Log10(60)) > 0.5 {
		t.Errorf("nose %.2f K, %.3g s; calibrated on 895 K, 60 s (within 30 K and 0.5 decade)", n.T, math.Exp(n.LnTime))
	}
	calibrated(t, md, "vit1-ttt.csv:9", 0.01)
	// Outside 800–993 K the calibrated gamma(T) is not to be trusted: flagged.
	if md.At(700).Flags&kinetics.FlagOutsideCalibrated == 0 || md.At(895).Flags&kinetics.FlagOutsideCalibrated != 0 {
		t.Error("the calibrated range of vit1 is not flagged as it should be")
	}
}

// TestIndomethacinMeasured: the indomethacin card against the first
// crystals seen after 69 days at 0 °C (Vyazovkin and Dranca, J. Phys.
// Chem. B 111 (2007) 7283, abstract, checked), held out: within one decade
// (the ageing times were sampled, a factor 1.5; the fraction at detection is
// assumed; the target). It was calibrated on 147 days at −10 °C
// (same paper) and on a surface growth rate at 10 °C (Svoboda et al.,
// Molecules 28 (2023) 1568, abstract, checked): both reproduced to 0.01
// decade. Below Tg, so every one of these answers carries the glassy flag.
// No room-temperature figure could be verified: none is checked.
func TestIndomethacinMeasured(t *testing.T) {
	md := mustModel(t, "indomethacin", nil)
	checkHeldOut(t, md, []heldOut{{"indomethacin-onset.csv:7", 1, "one decade: sampled ageing times, assumed detected fraction"}})
	calibrated(t, md, "indomethacin-onset.csv:9", 0.01)
	calibrated(t, md, "indomethacin-growth.csv:8", 0.01)
	for _, T := range []float64{263.15, 273.15, 298.15} {
		if md.At(T).Flags&kinetics.FlagBelowTgGlassy == 0 {
			t.Errorf("at %.2f K, below Tg: no below_tg_glassy flag", T)
		}
	}
}

// TestIceMeasured: the ice card against the homogeneous rates of the
// Koop–Murray (2016) fit to many groups' measurements at 235 and 237 K and
// the median freezing of 75 µm droplets at 1 K/min, 237.3 K (Isenrich et
// al., Atmos. Meas. Tech. 15 (2022) 5367, abstract, checked), all held
// out. Tolerances from the scatter: the rates of different instruments
// spread over about ±1 decade (Shardt et al. 2022); the median within
// ±1 K (0.2 K accuracy, plus that decade over a slope of about 1.5 decades
// per kelvin). Calibration on 234, 236 and 238 K reproduced by a refit.
func TestIceMeasured(t *testing.T) {
	md := mustModel(t, "ice", nil)
	checkHeldOut(t, md, []heldOut{
		{"ice-nucleation.csv:10", 1, "inter-laboratory scatter, about 1 decade"},
		{"ice-nucleation.csv:12", 1, "inter-laboratory scatter, about 1 decade"},
		{"ice-droplet-freezing.csv:9", 1, "0.2 K accuracy and 1 decade over 1.5 decades per K"},
	})
	c, _ := Preset("ice")
	T, J := measuredColumns(t, "ice-nucleation.csv", "rate", 9, 11, 13)
	lnJ := make([]float64, len(J))
	for i := range J {
		lnJ[i] = math.Log(J[i])
	}
	g, err := fit.InterfaceWith(md, T, lnJ, nil, fit.InterfaceOptions{KeepScale: true})
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(g.Gamma, c.SI("gamma"), 1e-5) || g.Law != kinetics.GammaNegentropic {
		t.Errorf("gamma refitted: %.7g J/m2 (%v); the card has %v", g.Gamma, g.Law, c.Values["gamma"].Text)
	}
}

func relClose(a, b, tol float64) bool { return math.Abs(a-b) <= tol*math.Max(math.Abs(a), math.Abs(b)) }
