package presets

import (
	"context"
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
	"undercool/kinetics/population"
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
	// diff is model − measured at one row (decades or kelvin), from the
	// card and its model.
	diff func(t *testing.T, c *Card, md *kinetics.Model, row map[string]float64) float64
}

var (
	colT = Column{Quantity: "temperature", Kind: units.Temperature, Required: true}
	// rate: log10 J of the model against a measured steady-state rate.
	rateFile = measured{[]Column{colT, {Quantity: "rate", Kind: units.RateDensity, Required: true}}, "decades",
		func(t *testing.T, _ *Card, md *kinetics.Model, r map[string]float64) float64 {
			return md.At(r["temperature"]).Log10J() - math.Log10(r["rate"])
		}}
	// growth: log10 u against a measured growth rate.
	growthFile = measured{[]Column{colT, {Quantity: "growth_rate", Kind: units.Velocity, Required: true}}, "decades",
		func(t *testing.T, _ *Card, md *kinetics.Model, r map[string]float64) float64 {
			return math.Log10(md.At(r["temperature"]).Growth) - math.Log10(r["growth_rate"])
		}}
)

// timeFile is log10 of the isothermal time to the fraction X against a
// measured time: X = 0.01 for the first crystals DSC detects in a glass
// (common practice, the assumption stated in testdata/measured/README.md),
// X = 1e-6 for the onset of crystallization in a melt (Uhlmann 1972).
func timeFile(X float64) measured {
	return measured{[]Column{colT, {Quantity: "time", Kind: units.Time, Required: true}}, "decades",
		func(t *testing.T, _ *Card, md *kinetics.Model, r map[string]float64) float64 {
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
		func(t *testing.T, _ *Card, md *kinetics.Model, r map[string]float64) float64 {
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
		func(t *testing.T, _ *Card, md *kinetics.Model, r map[string]float64) float64 {
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
	"sucrose-dsc-scan.csv": scanFile,
	"sucrose-onset.csv":    timeFile(0.01),
	"al-sc-ageing-radius.csv": {[]Column{colT, colHeld, {Quantity: "mean_radius", Kind: units.Length, Required: true}}, "decades",
		func(t *testing.T, c *Card, _ *kinetics.Model, r map[string]float64) float64 {
			return math.Log10(aged(t, c, r).MeanRadius) - math.Log10(r["mean_radius"])
		}},
	"al-sc-ageing-density.csv": {[]Column{colT, colHeld, {Quantity: "number_density", Kind: units.NumberDensity, Required: true}}, "decades",
		func(t *testing.T, c *Card, _ *kinetics.Model, r map[string]float64) float64 {
			return math.Log10(aged(t, c, r).NumberDensity) - math.Log10(r["number_density"])
		}},
}

// colHeld is the duration of an isothermal hold.
var colHeld = Column{Quantity: "time", Kind: units.Time, Required: true}

// aged is the last row of the card's ageing alloy (evolve) held at the row's
// temperature for its time, from the as-quenched solid solution, at the
// command line's tolerance.
func aged(t *testing.T, c *Card, r map[string]float64) population.AlloyRow {
	t.Helper()
	p, err := c.Population()
	if err != nil || p.Alloy == nil {
		t.Fatalf("%s is not an ageing alloy: %v", c.Name, err)
	}
	T := r["temperature"]
	s, err := kinetics.ScheduleFromCurve([]float64{0, r["time"]}, []float64{T, T}, "isothermal hold")
	if err != nil {
		t.Fatal(err)
	}
	res, err := p.Alloy.Run(context.Background(), s, population.Options{RelTol: 1e-4, ConcTol: 1e-4})
	if err != nil {
		t.Fatal(err)
	}
	return res.Rows[len(res.Rows)-1]
}

// scanFile is a heating scan of a glass in a calorimeter: the temperature at
// which half of it has crystallized (the middle of the exotherm, common
// practice for a JMAK transformation) on heating at the row's rate from 20 K
// below Tg, against the measured temperature, in kelvin. The scan is the
// path integral of kinetics.Model.Along on a path of 4,000 steps (0.03 K for
// sucrose; the crossing is interpolated in ln Xext, far finer than the
// kelvins of the data).
var scanFile = measured{[]Column{{Quantity: "heating_rate", Kind: units.CoolingRate, Required: true}, colT}, "K",
	func(t *testing.T, _ *Card, md *kinetics.Model, r map[string]float64) float64 {
		return scanCrystallized(t, md, r["heating_rate"], 0.5) - r["temperature"]
	}}

// scanCrystallized is the temperature at which the fraction X has
// crystallized on heating at rate b (K/s) from Tg − 20 K towards Te.
func scanCrystallized(t *testing.T, md *kinetics.Model, b, X float64) float64 {
	t.Helper()
	const n = 4000
	lo, hi := md.Tg()-20, md.Te()-0.5
	tm, tp := make([]float64, n+1), make([]float64, n+1)
	for i := range tp {
		tp[i] = lo + (hi-lo)*float64(i)/n
		tm[i] = (tp[i] - lo) / b
	}
	p, err := kinetics.NewPath(tm, tp)
	if err != nil {
		t.Fatal(err)
	}
	s, err := md.Along(p)
	if err != nil {
		t.Fatal(err)
	}
	target := math.Log(-math.Log(1 - X))
	for i := 1; i <= n; i++ {
		if s.LnXext[i] >= target {
			a, c := s.LnXext[i-1], s.LnXext[i]
			f := 0.0
			if !math.IsInf(a, -1) {
				f = (target - a) / (c - a)
			}
			return tp[i-1] + f*(tp[i]-tp[i-1])
		}
	}
	t.Fatalf("X = %g not reached on heating at %g K/s below %g K", X, b, hi)
	return math.NaN()
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

// diffOf is model − measured at a row, and its unit, for card c and its model md.
func diffOf(t *testing.T, c *Card, md *kinetics.Model, ref string) (float64, string) {
	t.Helper()
	m, row := readMeasuredRow(t, ref)
	return m.diff(t, c, md, row), m.unit
}

// mustCard is a shipped card and its model.
func mustCard(t *testing.T, name string) (*Card, *kinetics.Model) {
	t.Helper()
	c, err := Preset(name)
	if err != nil {
		t.Fatal(err)
	}
	md, err := c.Model()
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return c, md
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
// of it). A card that names no checked row is an estimate and says so, as
// does one that states estimate = true beside its checked rows; a demo
// card, and only a demo card, says it is invented.
func TestStandingRecomputed(t *testing.T) {
	for _, name := range Names() {
		t.Run(name, func(t *testing.T) {
			c, err := Preset(name)
			if err != nil {
				t.Fatal(err)
			}
			st := c.Standing
			if st.Invented != (c.Kind == "demo") {
				t.Errorf("kind %q, standing %q: a demo card, and only a demo card, is invented", c.Kind, st)
			}
			if len(st.Checked) == 0 {
				want := EstimateText
				if st.Invented {
					want = InventedText
				}
				if !strings.HasPrefix(st.String(), want) {
					t.Errorf("standing %q does not begin %q", st, want)
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
				d, unit := diffOf(t, c, md, ref)
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
			if len(st.Calibrated) == 0 {
				want = fmt.Sprintf("calibrated on nothing, checked against %d measured point", len(st.Checked))
			}
			if st.Rough {
				want = RoughPrefix + want
			}
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

func checkHeldOut(t *testing.T, c *Card, md *kinetics.Model, rows []heldOut) {
	t.Helper()
	for _, h := range rows {
		d, unit := diffOf(t, c, md, h.ref)
		t.Logf("%s: model − measured = %+.3f %s (tolerance ±%.3g: %s)", h.ref, d, unit, h.tol, h.why)
		if !(math.Abs(d) <= h.tol) {
			t.Errorf("%s: model − measured = %+.3f %s, outside ±%.3g %s (%s)", h.ref, d, unit, h.tol, unit, h.why)
		}
	}
}

// calibrated is a calibration row reproduced from the shipped card, to the
// rounding of its values.
func calibrated(t *testing.T, c *Card, md *kinetics.Model, ref string, tol float64) {
	t.Helper()
	d, unit := diffOf(t, c, md, ref)
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
	c, md := mustCard(t, "lithium-disilicate")
	const rows = "lithium-disilicate-nucleation.csv"
	checkHeldOut(t, c, md, []heldOut{
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
		d, _ := diffOf(t, c, md, fmt.Sprintf("lithium-disilicate-growth.csv:%d", l))
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
	c, md := mustCard(t, "vit1")
	checkHeldOut(t, c, md, []heldOut{{"vit1-critical-cooling.csv:8", math.Log10(2), "a factor of 2"}})
	n, err := md.Nose(630, md.Te()-1, 1e-6, kinetics.JMAK{})
	if err != nil || !n.Inside() {
		t.Fatalf("no nose: %v %+v", err, n)
	}
	lt := n.LnTime / math.Ln10
	t.Logf("nose (calibration reproduced): %.2f K, %.3g s; measured 895 K, 60 s (recalled)", n.T, math.Exp(n.LnTime))
	if math.Abs(n.T-895) > 30 || math.Abs(lt-math.Log10(60)) > 0.5 {
		t.Errorf("nose %.2f K, %.3g s; calibrated on 895 K, 60 s (within 30 K and 0.5 decade)", n.T, math.Exp(n.LnTime))
	}
	calibrated(t, c, md, "vit1-ttt.csv:9", 0.01)
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
	c, md := mustCard(t, "indomethacin")
	checkHeldOut(t, c, md, []heldOut{{"indomethacin-onset.csv:7", 1, "one decade: sampled ageing times, assumed detected fraction"}})
	calibrated(t, c, md, "indomethacin-onset.csv:9", 0.01)
	calibrated(t, c, md, "indomethacin-growth.csv:8", 0.01)
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
	c, md := mustCard(t, "ice")
	checkHeldOut(t, c, md, []heldOut{
		{"ice-nucleation.csv:10", 1, "inter-laboratory scatter, about 1 decade"},
		{"ice-nucleation.csv:12", 1, "inter-laboratory scatter, about 1 decade"},
		{"ice-droplet-freezing.csv:9", 1, "0.2 K accuracy and 1 decade over 1.5 decades per K"},
	})
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

// TestSucroseMeasured: the sucrose card against the two measurements of dry
// amorphous sucrose found (testdata/measured/README.md). It is calibrated
// on a bound: freeze-dried sucrose heated in a micro-calorimeter
// crystallizes below 100 °C (J. Therm. Anal., abstract, checked; the rate,
// 1.2 K/min, from memory), reproduced here to 0.05 K. It is checked against
// the onset of crystallization of spray-dried sucrose 7 K below Tg, 17 days
// (Bhugra et al. 2007, abstract, checked). The tolerance chosen from the
// scatter is one decade, as for indomethacin (sampled onsets, an assumed
// detected fraction, the sample's Tg placed on the card's): the card misses
// it by about 5 decades, too slow, and says so. This test holds the card to
// saying so: the miss lies outside the tolerance, the row outside the
// calibrated range (flagged), and the standing calls times below Tg not
// credible. A card that reached the row would fail here, to have its
// standing rewritten.
func TestSucroseMeasured(t *testing.T) {
	c, md := mustCard(t, "sucrose")
	calibrated(t, c, md, "sucrose-dsc-scan.csv:10", 0.05)
	const row, tol = "sucrose-onset.csv:10", 1.0
	d, _ := diffOf(t, c, md, row)
	t.Logf("%s: model − measured = %+.2f decades (tolerance ±%g: missed, and stated)", row, d, tol)
	if math.Abs(d) <= tol {
		t.Errorf("%s: model − measured = %+.2f decades, now within ±%g: rewrite the card's standing", row, d, tol)
	}
	_, r := readMeasuredRow(t, row)
	if md.At(r["temperature"]).Flags&kinetics.FlagOutsideCalibrated == 0 {
		t.Errorf("%s lies inside the calibrated range of the card", row)
	}
	if !strings.Contains(c.Standing.Note, "not credible") {
		t.Errorf("standing note %q does not say that times below Tg are not credible", c.Standing.Note)
	}
	// The TTT nose the calibration gives: seconds to minutes above Tg (the
	// card's note: a few decades at best), no longer 1e28 s.
	n, err := md.Nose(md.Tg(), md.Te()-1, 1e-6, kinetics.JMAK{})
	if err != nil || !n.Inside() {
		t.Fatalf("no nose: %v %+v", err, n)
	}
	t.Logf("nose: %.1f K, %.3g s", n.T, math.Exp(n.LnTime))
	if lt := n.LnTime / math.Ln10; !(lt > 0 && lt < 3) {
		t.Errorf("nose at %.1f K, %.3g s; want 1 s to 1000 s", n.T, math.Exp(n.LnTime))
	}
}

// TestAlScMeasured: the Al–Sc card against the ageing of Al–0.18 at.% Sc
// (Al–0.3 wt.% Sc), solution treated, quenched and aged 24 h at 300 °C,
// which holds spherical coherent Al3Sc precipitates of mean radius about 1
// to 2.5 nm at 1e23 to 1e25 per m³ (Marquis E.A., Seidman D.N., Acta Mater.
// 49 (2001) 1909; Seidman D.N., Marquis E.A., Dunand D.C., Acta Mater. 50
// (2002) 4021). The values are FROM MEMORY, not verified against the papers
// (the searches made found their titles, not their figures); the rows are
// the geometric middles of those windows, and the windows, set before the
// run, are the tolerances: ±0.2 decade in radius, ±1 decade in number
// density. Nothing on the card is fitted to them: γ comes from nucleation
// rates (Hyland 1992), the solvus and the diffusivity from their own
// measurements. Run in evolve's size classes at the command line's
// tolerance. The other commands see the alloy with interface-controlled
// growth, far too fast, as the card says: its critical cooling rate lies
// above 1e4 K/s, where a water quench (of order 1e2 to 1e3 K/s, common
// practice) keeps the Sc in solution.
func TestAlScMeasured(t *testing.T) {
	c, md := mustCard(t, "al-sc")
	checkHeldOut(t, c, md, []heldOut{
		{"al-sc-ageing-radius.csv:9", math.Log10(2.5 / 1.581), "the recalled window 1.0 to 2.5 nm"},
		{"al-sc-ageing-density.csv:6", 1, "the recalled window 1e23 to 1e25 per m3"},
	})
	cool, err := md.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	q := cool.CriticalRate(1e-6)
	t.Logf("critical cooling rate (interface-controlled growth): %.3g K/s", q)
	if !(q > 1e4) {
		t.Errorf("critical cooling rate %.3g K/s; the card's standing says it is far too fast (above 1e4 K/s)", q)
	}
}
