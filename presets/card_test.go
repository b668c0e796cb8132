package presets

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// mustParse is Parse for a card text a test knows to be valid.
func mustParse(t testing.TB, text, file string) *Card {
	t.Helper()
	c, err := Parse([]byte(text), file)
	if err != nil {
		t.Fatalf("Parse %s: %v", file, err)
	}
	return c
}

// goodCard is a complete, valid card; the error cases below break one line of it.
// Its numbers are invented for the tests.
const goodCard = `# invented for the tests
name = "test-card"
kind = "demo"
description = "invented for the tests"
driving = "thompson-spaepen"
mobility = "arrhenius"
prefactor = "attachment"

[values]
te    = { value = "1150 K",      source = "invented for the tests" }
dh    = { value = "14.2 kJ/mol", source = "invented for the tests" }
vm    = { value = "9.8 cm3/mol", source = "invented for the tests" }
gamma = { value = "0.118 J/m2",  source = "invented for the tests" }
d0    = { value = "2.0e-7 m2/s", source = "invented for the tests" }
q     = { value = "62 kJ/mol",   source = "invented for the tests" }
`

// replaceLine swaps the line that starts with prefix for repl ("" deletes it).
func replaceLine(t *testing.T, card, prefix, repl string) string {
	t.Helper()
	lines := strings.Split(card, "\n")
	for i, l := range lines {
		if strings.HasPrefix(l, prefix) {
			if repl == "" {
				return strings.Join(append(lines[:i:i], lines[i+1:]...), "\n")
			}
			lines[i] = repl
			return strings.Join(lines, "\n")
		}
	}
	t.Fatalf("no line starts with %q", prefix)
	return ""
}

func TestParseGoodCard(t *testing.T) {
	c := mustParse(t, goodCard, "good.toml")
	if c.Name != "test-card" || c.Kind != "demo" || c.Driving != "thompson-spaepen" || c.Mobility != "arrhenius" || c.Prefactor != "attachment" {
		t.Errorf("header fields wrong: %+v", c)
	}
	want := map[string]struct {
		si   float64
		line int
	}{
		"te": {1150, 10}, "dh": {14200, 11}, "vm": {9.8e-6, 12}, "gamma": {0.118, 13}, "d0": {2e-7, 14}, "q": {62000, 15},
	}
	for k, w := range want {
		v, ok := c.Values[k]
		if !ok {
			t.Errorf("%s missing", k)
			continue
		}
		if math.Abs(v.SI-w.si) > 1e-12*w.si || v.Line != w.line || v.Source != "invented for the tests" {
			t.Errorf("%s = %+v, want SI %g on line %d", k, v, w.si, w.line)
		}
	}
	if !c.Has("te") || c.Has("theta") || c.SI("theta") != 0 {
		t.Error("Has/SI wrong")
	}
	if _, err := c.Model(); err != nil {
		t.Errorf("Material: %v", err)
	}
}

// TestParseErrors: each broken card is rejected with an error that names the
// file, the key and (where the key is on a line) the line.
func TestParseErrors(t *testing.T) {
	tests := []struct {
		name         string
		prefix, repl string   // line of goodCard to replace ("" repl: delete it)
		append       string   // or text to add at the end
		want         []string // substrings of the error
	}{
		{"unknown top-level key", "description", `colour = "red"`, "", []string{"bad.toml:4:", `unknown key "colour"`, "allowed: name, kind"}},
		{"unknown value key", "q ", `qq    = { value = "62 kJ/mol", source = "x" }`, "", []string{"bad.toml:15:", `key "qq"`, "unknown value", "allowed: te, dh"}},
		{"unknown field in a value", "vm ", `vm    = { value = "9.8 cm3/mol", source = "x", note = "y" }`, "", []string{"bad.toml:12:", "values.vm.note", "allowed: value, source"}},
		{"missing value", "gamma", `gamma = { source = "x" }`, "", []string{"bad.toml:13:", `key "gamma"`, "missing value"}},
		{"empty value", "gamma", `gamma = { value = " ", source = "x" }`, "", []string{"bad.toml:13:", `key "gamma"`, "missing value"}},
		{"missing source", "d0", `d0    = { value = "2.0e-7 m2/s" }`, "", []string{"bad.toml:14:", `key "d0"`, "missing source"}},
		{"blank source", "d0", `d0    = { value = "2.0e-7 m2/s", source = "  " }`, "", []string{"bad.toml:14:", `key "d0"`, "missing source"}},
		{"bad unit", "vm ", `vm    = { value = "6 kg", source = "x" }`, "", []string{"bad.toml:12:", `key "vm"`, "molar volume", "cm3/mol"}},
		{"missing unit", "vm ", `vm    = { value = "6.59", source = "x" }`, "", []string{"bad.toml:12:", `key "vm"`, "needs a unit"}},
		{"bare float without unit", "vm ", `vm    = { value = 6.59, source = "x" }`, "", []string{"bad.toml:12:", `key "vm"`, "needs a unit"}},
		{"wrong kind of energy", "dh ", `dh    = { value = "14.2 kJ", source = "x" }`, "", []string{"bad.toml:11:", `key "dh"`, "molar energy", "energy per volume"}},
		{"nan as text", "te ", `te    = { value = "nan", source = "x" }`, "", []string{"bad.toml:10:", `key "te"`, "not a number"}},
		{"nan with unit", "te ", `te    = { value = "NaN K", source = "x" }`, "", []string{"bad.toml:10:", `key "te"`, "not a number"}},
		{"inf as text", "q ", `q     = { value = "inf kJ/mol", source = "x" }`, "", []string{"bad.toml:15:", `key "q"`, "not a number"}},
		{"TOML nan", "te ", `te    = { value = nan, source = "x" }`, "", []string{"bad.toml:10:", `key "te"`, "not a finite number"}},
		{"TOML inf", "te ", `te    = { value = -inf, source = "x" }`, "", []string{"bad.toml:10:", `key "te"`, "not a finite number"}},
		{"overflow", "q ", `q     = { value = "1e308 kJ/mol", source = "x" }`, "", []string{"bad.toml:15:", `key "q"`, "out of range"}},
		{"value of the wrong type", "te ", `te    = { value = [1150], source = "x" }`, "", []string{"bad.toml:10:", `key "te"`, "as a string"}},
		{"bad kind", "kind", `kind = "alloy"`, "", []string{"bad.toml:3:", `key "kind"`, `"alloy" is not one of metal, glass`}},
		{"bad driving", "driving", `driving = "quadratic"`, "", []string{"bad.toml:5:", `key "driving"`, "linear, hoffman"}},
		{"bad mobility", "mobility", `mobility = "magic"`, "", []string{"bad.toml:6:", `key "mobility"`, "arrhenius, vft, wlf"}},
		{"bad prefactor", "prefactor", `prefactor = "huge"`, "", []string{"bad.toml:7:", `key "prefactor"`, "attachment, turnbull-fisher, fixed"}},
		{"missing kind", "kind", "", "", []string{"bad.toml", `key "kind"`, "missing value"}},
		{"missing driving", "driving", "", "", []string{"bad.toml", `key "driving"`, "missing value"}},
		{"missing name", "name", "", "", []string{"bad.toml", `key "name"`, "missing value"}},
		{"table without file", "driving", `driving = "table"`, "", []string{"bad.toml", "driving_table"}},
		// The TOML parser reports the line where it noticed the missing brace.
		{"TOML syntax", "te ", `te    = { value = "1150 K", source = "x" `, "", []string{"bad.toml:11:", "inline table"}},
		{"negative dh", "dh ", `dh    = { value = "-14.2 kJ/mol", source = "x" }`, "", []string{"bad.toml:11:", `key "dh"`, "must be positive"}},
		{"zero te", "te ", `te    = { value = "0 K", source = "x" }`, "", []string{"bad.toml:10:", `key "te"`, "must be positive"}},
		{"theta out of range", "q ", "q     = { value = \"62 kJ/mol\", source = \"x\" }\ntheta = { value = \"200 deg\", source = \"x\" }", "", []string{"bad.toml:16:", `key "theta"`, "(0, 180]"}},
		{"duplicate key", "", "", `te = { value = "1 K", source = "x" }`, []string{"bad.toml:16:"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			card := goodCard
			if tt.prefix != "" {
				card = replaceLine(t, card, tt.prefix, tt.repl)
			}
			card += tt.append
			c, err := Parse([]byte(card), "bad.toml")
			if err == nil {
				t.Fatalf("no error; card %+v", c)
			}
			for _, w := range tt.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not contain %q", err, w)
				}
			}
			if strings.Contains(err.Error(), "bad.toml:0:") {
				t.Errorf("error %q gives line 0", err)
			}
		})
	}
}

// TestParseValuesTableForm: a value may also be written as its own table.
func TestParseValuesTableForm(t *testing.T) {
	card := strings.Replace(goodCard, `te    = { value = "1150 K",      source = "invented for the tests" }`, "", 1) +
		"\n[values.te]\nvalue = \"877 C\"\nsource = \"invented for the tests\"\n"
	c := mustParse(t, card, "t.toml")
	if v := c.Values["te"]; math.Abs(v.SI-1150.15) > 1e-9 || v.Line != 17 {
		t.Errorf("te = %+v, want 1150.15 K with the line of [values.te], 17", v)
	}
	bad := strings.Replace(card, "value = \"877 C\"", "value = \"877 kg\"", 1)
	if _, err := Parse([]byte(bad), "t.toml"); err == nil || !strings.Contains(err.Error(), "t.toml:17:") {
		t.Errorf("error %v should name t.toml:17", err)
	}
}

// TestMaterialErrors: a card that parses but cannot build a model.
func TestMaterialErrors(t *testing.T) {
	tests := []struct {
		name         string
		prefix, repl string
		want         []string
	}{
		{"no gamma", "gamma", "", []string{"bad.toml", `"gamma"`}},
		{"no vm", "vm ", "", []string{"bad.toml", `"vm"`}},
		{"no te", "te ", "", []string{"bad.toml", `"te"`}},
		{"no d0", "d0", "", []string{"bad.toml", `"d0"`}},
		{"cp without dcp", "driving", `driving = "cp"`, []string{"bad.toml", `"dcp"`}},
		{"vft without constants", "mobility", `mobility = "vft"`, []string{"bad.toml", `"vft_a"`}},
		{"wlf without tg", "mobility", `mobility = "wlf"`, []string{"bad.toml", `"tg"`}},
		{"turnbull-fisher without arrhenius", "mobility", "mobility = \"none\"\nprefactor = \"turnbull-fisher\"", []string{"bad.toml", "turnbull-fisher"}},
		{"fixed without j0", "prefactor", `prefactor = "fixed"`, []string{"bad.toml", "j0"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			card := replaceLine(t, goodCard, tt.prefix, tt.repl)
			if tt.name == "turnbull-fisher without arrhenius" {
				card = replaceLine(t, card, `prefactor = "attachment"`, "")
			}
			c := mustParse(t, card, "bad.toml")
			_, err := c.Model()
			if err == nil {
				t.Fatal("Material gave no error")
			}
			for _, w := range tt.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not contain %q", err, w)
				}
			}
			// A missing value is a *MissingError naming its key, and no flag.
			var me *MissingError
			if errors.As(err, &me) && (!strings.Contains(tt.want[1], me.Key) || strings.Contains(err.Error(), "--")) {
				t.Errorf("missing %q: error %q", me.Key, err)
			}
		})
	}
}

// TestMobilityNone: a card without a mobility law gives the nucleus but no rate.
func TestMobilityNone(t *testing.T) {
	card := replaceLine(t, goodCard, "mobility", `mobility = "none"`)
	c := mustParse(t, card, "t.toml")
	m, err := c.Model()
	if err != nil {
		t.Fatal(err)
	}
	if m.HasRate() || m.HasGrowth() {
		t.Error("model without mobility claims a rate")
	}
	s := m.At(1000)
	if !(s.Nucleus.Radius > 0) || math.IsInf(s.Nucleus.Radius, 0) || !math.IsNaN(s.LnJ) {
		t.Errorf("state %+v", s)
	}
}

func TestSet(t *testing.T) {
	c := mustParse(t, goodCard, "t.toml")
	if err := c.Set("gamma", "132 erg/cm2", "command line"); err != nil {
		t.Fatal(err)
	}
	if v := c.Values["gamma"]; math.Abs(v.SI-0.132) > 1e-15 || v.Source != "command line" || v.Line != 0 {
		t.Errorf("gamma after Set = %+v", v)
	}
	if err := c.Set("vm", "6 kg", "command line"); err == nil || !strings.Contains(err.Error(), "molar volume") {
		t.Errorf("Set bad unit: %v", err)
	}
	if err := c.Set("te", "inf", "command line"); err == nil {
		t.Error("Set inf: no error")
	}
	defer func() {
		if recover() == nil {
			t.Error("Set of an unknown key did not panic")
		}
	}()
	c.Set("nonsense", "1", "x")
}

// TestLoadDrivingTable: a card on disk with a tabulated driving force found
// beside it. The table is invented for the test: Δg = 12 J/(mol K)·(1000 K − T).
func TestLoadDrivingTable(t *testing.T) {
	dir := t.TempDir()
	card := replaceLine(t, goodCard, "driving", "driving = \"table\"\ndriving_table = \"dg.csv\"")
	card = replaceLine(t, card, "te ", "")
	card = replaceLine(t, card, "dh ", "")
	write := func(name, text string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	path := write("t.toml", card)
	write("dg.csv", "# invented for the test\ntemperature_k,dg_j_per_mol\n600,4800\n800,2400\n1000,0\n1100,-1200\n")
	c, err := load(path)
	if err != nil {
		t.Fatal(err)
	}
	if c.DrivingFile != filepath.Join(dir, "dg.csv") {
		t.Errorf("DrivingFile = %q", c.DrivingFile)
	}
	m, err := c.Model()
	if err != nil {
		t.Fatal(err)
	}
	if te := m.Te(); math.Abs(te-1000) > 1e-9 {
		t.Errorf("Te from the table = %g, want 1000", te)
	}
	if g := m.At(700).DrivingMole; math.Abs(g-3600) > 1e-9 {
		t.Errorf("Δg(700 K) = %g, want 3600", g)
	}
	// Outside the table: flagged, no rate, no panic.
	if s := m.At(500); !math.IsNaN(s.DrivingMole) {
		t.Errorf("Δg(500 K) = %g, want NaN outside the table", s.DrivingMole)
	}
	// A broken table names its file and line.
	write("dg.csv", "temperature_k,dg_j_per_mol\n600,4800\n800,lots\n")
	c, _ = load(path) // a card reads its table once
	if _, err := c.Model(); err == nil || !strings.Contains(err.Error(), "dg.csv:3") {
		t.Errorf("broken table error %v should name dg.csv:3", err)
	}
	os.Remove(filepath.Join(dir, "dg.csv"))
	c, _ = load(path)
	if _, err := c.Model(); err == nil || !strings.Contains(err.Error(), "dg.csv") {
		t.Errorf("missing table error %v should name dg.csv", err)
	}
}

func TestLoadErrors(t *testing.T) {
	missing := filepath.Join(t.TempDir(), "nothere.toml")
	_, err := load(missing)
	if err == nil || !strings.Contains(err.Error(), missing) {
		t.Errorf("Load of a missing file: %v should name the file", err)
	}
	bad := filepath.Join(t.TempDir(), "bad.toml")
	os.WriteFile(bad, []byte(replaceLine(t, goodCard, "vm ", `vm = { value = "6 kg", source = "x" }`)), 0o644)
	_, err = load(bad)
	if err == nil || !strings.Contains(err.Error(), bad+":12:") {
		t.Errorf("Load of a bad card: %v should name %s:12", err, bad)
	}
}

func TestOpen(t *testing.T) {
	c, err := Open("ni")
	if err != nil || c.Name != "ni" || c.File != "preset ni" {
		t.Errorf("Open(ni) = %v, %v", c, err)
	}
	_, err = Open("unobtainium")
	if err == nil || !strings.Contains(err.Error(), "unobtainium") || !strings.Contains(err.Error(), "ni, ") {
		t.Errorf("Open of an unknown preset: %v should list the shipped ones", err)
	}
	p := filepath.Join(t.TempDir(), "mine.toml")
	os.WriteFile(p, []byte(goodCard), 0o644)
	if c, err := Open(p); err != nil || c.File != p {
		t.Errorf("Open(path) = %v, %v", c, err)
	}
}

func ExampleParse() {
	c, err := Parse([]byte(goodCard), "example.toml")
	if err != nil {
		fmt.Println(err)
		return
	}
	v := c.Values["vm"]
	fmt.Printf("%s = %s = %.3g %s (line %d)\n", "vm", v.Text, v.SI, v.Kind.SI, v.Line)
	_, err = Parse([]byte(strings.Replace(goodCard, "9.8 cm3/mol", "9.8 kg", 1)), "example.toml")
	fmt.Println(err != nil)
	// Output:
	// vm = 9.8 cm3/mol = 9.8e-06 m3/mol (line 12)
	// true
}

// TestStandingForms: the standing a card states reads as one clause; a
// rough check stays an estimate, an invented card names no rows, and the
// card printer writes back what was read. The rows are invented for the
// test.
func TestStandingForms(t *testing.T) {
	tests := []struct {
		table, want, err string
		estimate         bool
	}{
		{"", EstimateText, "", true},
		{"calibrated = [\"r.csv:2\"]\n", EstimateText + "; calibrated on 1 measured point", "", true},
		{"calibrated = [\"r.csv:2\"]\nchecked = [\"r.csv:3\", \"r.csv:4\"]\nerror = \"0.3 decades\"\n", "calibrated on 1 measured point, checked against 2, rms error 0.3 decades", "", false},
		{"checked = [\"r.csv:3\", \"r.csv:4\"]\nerror = \"0.3 decades\"\n", "calibrated on nothing, checked against 2 measured points, rms error 0.3 decades", "", false},
		{"checked = [\"r.csv:3\"]\nerror = \"5 decades\"\nestimate = true\n", "estimate: calibrated on nothing, checked against 1 measured point, rms error 5 decades", "", true},
		{"invented = true\n", InventedText, "", true},
		{"invented = true\ncalibrated = [\"r.csv:2\"]\n", "", "an invented card is calibrated on and checked against nothing", false},
		{"estimate = true\n", "", "estimate = true without checked rows", false},
	}
	for _, tc := range tests {
		text := goodCard
		if tc.table != "" {
			text += "\n[standing]\n" + tc.table
		}
		c, err := Parse([]byte(text), "s.toml")
		if tc.err != "" {
			if err == nil || !strings.Contains(err.Error(), tc.err) {
				t.Errorf("%q: error %v, want %q", tc.table, err, tc.err)
			}
			continue
		}
		if err != nil {
			t.Fatalf("%q: %v", tc.table, err)
		}
		if got := c.Standing.String(); got != tc.want || c.Standing.Estimate() != tc.estimate {
			t.Errorf("%q: standing %q (estimate %v), want %q (%v)", tc.table, got, c.Standing.Estimate(), tc.want, tc.estimate)
		}
		back, err := Parse(c.TOML(nil), "back.toml")
		if err != nil {
			t.Fatalf("%q printed: %v", tc.table, err)
		}
		if back.Standing.String() != c.Standing.String() {
			t.Errorf("%q printed and read back: %q, want %q", tc.table, back.Standing, c.Standing)
		}
	}
}

// TestSitesFromParticles: heterogeneous nucleation on particles of a
// second phase. 1e18 particles per m³ of radius 1 µm carry 4π(1e-6)² m²
// each; with v = 9.8e-6/N_A m³ per molecule the sites are
// 1e18·1.2566e-11/v^(2/3) (by hand, cnt.SitesOnParticles). Sites and
// particles together, or one particle value alone, are errors naming the
// values (a missing one as a *MissingError). And J at a fixed site density rises as θ falls (the cap's own
// attachment, cnt.LnAttachmentCap): at 900 K, θ = 120°, 90°, 60°.
func TestSitesFromParticles(t *testing.T) {
	const parts = "\ntheta = { value = \"90\", source = \"invented for the tests\" }\n" +
		"particle_density = { value = \"1e18 m-3\", source = \"invented for the tests\" }\n" +
		"particle_radius = { value = \"1 um\", source = \"invented for the tests\" }\n"
	md, err := mustParse(t, goodCard+parts, "p.toml").Model()
	if err != nil {
		t.Fatal(err)
	}
	v := 9.8e-6 / 6.02214076e23
	want := 1e18 * 4 * math.Pi * 1e-12 / math.Pow(v, 2.0/3)
	if got := md.Material().Sites; math.Abs(got/want-1) > 1e-12 {
		t.Errorf("sites %g, want %g", got, want)
	}
	if md.DefaultSites() {
		t.Error("sites from particles reported as the default")
	}
	both := mustParse(t, goodCard+parts+"sites = { value = \"1e20 m-3\", source = \"invented for the tests\" }\n", "b.toml")
	if _, err := both.Model(); err == nil || !strings.Contains(err.Error(), "give one or the other") {
		t.Errorf("sites and particles: %v, want an error naming both", err)
	}
	for _, drop := range []string{"particle_density", "particle_radius"} {
		c := mustParse(t, replaceLine(t, goodCard+parts, drop, ""), "one.toml")
		var me *MissingError
		if _, err := c.Model(); !errors.As(err, &me) || me.Key != drop {
			t.Errorf("without %s: %v, want it missing (the other is given)", drop, err)
		}
	}
	var prev float64 = math.Inf(-1)
	for _, theta := range []string{"120", "90", "60"} {
		c := mustParse(t, replaceLine(t, goodCard+parts, "theta", "theta = { value = \""+theta+"\", source = \"invented for the tests\" }"), "t.toml")
		m, err := c.Model()
		if err != nil {
			t.Fatal(err)
		}
		lnJ := m.At(900).LnJ
		if !(lnJ > prev) {
			t.Errorf("θ = %s°: ln J = %g, not above %g at the larger angle", theta, lnJ, prev)
		}
		prev = lnJ
	}
}
