package presets

import (
	"math"
	"strings"
	"testing"

	"undercool/kinetics/sample"
)

// spreadCard is goodCard with a [spread] table (invented for the tests).
const spreadCard = goodCard + `
[spread]
gamma = { value = "2%",       source = "invented for the tests" }
q     = { value = "3 kJ/mol", source = "invented for the tests" }
te    = { value = "5 K",      source = "invented for the tests" }
d0    = { value = "x3",       source = "invented for the tests" }
`

func TestParseSpreadTable(t *testing.T) {
	c := mustParse(t, spreadCard, "s.toml")
	want := map[string]struct {
		form sample.Form
		x    float64
		line int
	}{
		"gamma": {sample.Relative, 0.02, 18},
		"q":     {sample.Absolute, 3000, 19},
		"te":    {sample.Absolute, 5, 20}, // a temperature difference: 5 K, not 5 K absolute
		"d0":    {sample.Factor, 3, 21},
	}
	if len(c.Spreads) != len(want) {
		t.Fatalf("spreads %v, want %d", c.Spreads, len(want))
	}
	for k, w := range want {
		s := c.Spreads[k]
		if s.Form != w.form || math.Abs(s.X-w.x) > 1e-12*w.x || s.Line != w.line || s.Source != "invented for the tests" {
			t.Errorf("%s: %+v, want form %v x %v line %d", k, s, w.form, w.x, w.line)
		}
	}
	// Without a [spread] table a card has none, and is otherwise the same.
	c0, err := Parse([]byte(goodCard), "g.toml")
	if err != nil || len(c0.Spreads) != 0 {
		t.Errorf("plain card: spreads %v, %v", c0.Spreads, err)
	}
}

func TestParseSpreadTableErrors(t *testing.T) {
	cases := []struct{ line, want string }{
		{`colour = { value = "2%", source = "x" }`, `s.toml:18: [spread] key "colour": unknown parameter (allowed: te, dh,`},
		{`gamma = { value = "-2%", source = "x" }`, `s.toml:18: [spread] key "gamma": "-2%": a standard deviation must not be negative`},
		{`gamma = { value = "abc", source = "x" }`, `s.toml:18: [spread] key "gamma": "abc" is not a number`},
		{`gamma = { value = "nan%", source = "x" }`, `s.toml:18: [spread] key "gamma": "nan%" is not a finite number`},
		{`gamma = { value = "2 kJ/mol", source = "x" }`, `s.toml:18: [spread] key "gamma": unit "kJ/mol" in "2 kJ/mol" is not a unit of interfacial energy`},
		{`gamma = { value = "2%" }`, `s.toml:18: [spread] key "gamma": missing source`},
		{`gamma = { value = "x2", source = "x" }`, `s.toml:18: [spread] key "gamma": a factor spread (x2) is only for the log-normal parameters`},
		{`gamma = { value = "2%", sauce = "x" }`, `unknown key "spread.gamma.sauce" (allowed: value, source)`},
		{`gamma = { source = "x" }`, `s.toml:18: [spread] key "gamma": missing value`},
	}
	for _, c := range cases {
		card := replaceLine(t, spreadCard, "gamma = { value = \"2%\"", c.line)
		_, err := Parse([]byte(card), "s.toml")
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s:\n got  %v\n want %s", c.line, err, c.want)
		}
	}
}

func TestParseSpread(t *testing.T) {
	cases := []struct {
		key, text string
		form      sample.Form
		x         float64
	}{
		{"gamma", "2%", sample.Relative, 0.02},
		{"gamma", " 2.5 % ", sample.Relative, 0.025},
		{"gamma", "5 mJ/m2", sample.Absolute, 5e-3},
		{"te", "9F", sample.Absolute, 5},
		{"te", "3C", sample.Absolute, 3},
		{"q", "0.1eV", sample.Absolute, 0.1 * 96485.33212},
		{"dh", "1e7 J/m3", sample.Absolute, 1e7},
		{"sites", "x10", sample.Factor, 10},
		{"sites", "×2", sample.Factor, 2},
		{"theta", "5", sample.Absolute, 5},
		{"gamma", "0%", sample.Relative, 0},
	}
	for _, c := range cases {
		s, err := ParseSpread(c.key, c.text)
		if err != nil {
			t.Errorf("%s=%s: %v", c.key, c.text, err)
			continue
		}
		if s.Form != c.form || math.Abs(s.X-c.x) > 1e-9*math.Max(c.x, 1e-300) {
			t.Errorf("%s=%s: form %v x %v, want %v %v", c.key, c.text, s.Form, s.X, c.form, c.x)
		}
	}
	bad := []struct{ key, text, want string }{
		{"colour", "2%", `unknown parameter "colour" (known: te, dh, dcp, vm, gamma`},
		{"gamma", "", "gamma: missing standard deviation"},
		{"gamma", "inf%", `gamma: "inf%" is not a finite number`},
		{"gamma", "0.002", `gamma: "0.002" needs a unit of interfacial energy`},
		{"q", "-3kJ/mol", `q: "-3kJ/mol": a standard deviation must not be negative`},
		{"d0", "x0.5", `d0: a factor spread must be at least 1`},
	}
	for _, c := range bad {
		_, err := ParseSpread(c.key, c.text)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s=%s: error %v, want %q", c.key, c.text, err, c.want)
		}
	}
}

// TestResolve: spreads about the card's values and its defaults, a
// per-volume enthalpy spread converted per mole, a relative one as it is,
// and a value the card's models do not read refused with the reason.
func TestResolve(t *testing.T) {
	c := mustParse(t, goodCard, "g.toml")
	spec := func(key, text string) SpreadSpec {
		s, err := ParseSpread(key, text)
		if err != nil {
			t.Fatal(err)
		}
		return s
	}
	got, err := c.Resolve(map[string]SpreadSpec{
		"d0": spec("d0", "50%"), "dh": spec("dh", "1e7 J/m3"), "theta": spec("theta", "10"),
	})
	if err != nil {
		t.Fatal(err)
	}
	// In the order of Params: dh, theta, d0.
	if len(got) != 3 || got[0].Key != "dh" || got[1].Key != "theta" || got[2].Key != "d0" {
		t.Fatalf("spreads %+v, want dh, theta, d0", got)
	}
	if want := 1e7 * 9.8e-6; math.Abs(got[0].SD-want) > 1e-9*want || got[0].Dist != sample.Normal || got[0].Base != 14200 {
		t.Errorf("dh spread %+v, want normal σ = %v J/mol about 14200", got[0], want)
	}
	if got[1].Base != 180 || got[1].SD != 10 || !got[1].Range.Contains(180) || got[1].Range.Contains(180.1) {
		t.Errorf("theta spread %+v, want σ = 10 about the default 180 within (0, 180]", got[1])
	}
	if d := got[2]; d.Dist != sample.LogNormal || math.Abs(d.SD-math.Log(1.5)) > 1e-15 || d.Base != 2e-7 {
		t.Errorf("d0 spread %+v, want log-normal σ_ln = ln 1.5 about 2e-7", d)
	}
	for key, want := range map[string]string{
		"vft_a": "vft_a: the material has no such value (mobility arrhenius, not vft)",
		"j0":    "j0: the material has no such value (prefactor attachment, not fixed)",
		"tg":    "tg: the material has no such value (not given)",
	} {
		if _, err := c.Resolve(map[string]SpreadSpec{key: spec(key, "1%")}); err == nil || err.Error() != want {
			t.Errorf("%s: %v, want %q", key, err, want)
		}
	}
	if _, err := c.Resolve(map[string]SpreadSpec{"q": spec("q", "1 J/mol")}); err != nil {
		t.Errorf("q: %v", err)
	}
}

// TestVary: the model of a sample is the card's with the drawn values, by
// the same path as the card's own; values at their bases change nothing.
func TestVary(t *testing.T) {
	c := mustParse(t, goodCard, "g.toml")
	spreads, err := c.Resolve(map[string]SpreadSpec{"gamma": {Key: "gamma", Form: sample.Relative, X: 0.02}, "sites": {Key: "sites", Form: sample.Relative, X: 0.1}})
	if err != nil {
		t.Fatal(err)
	}
	build := c.Vary(spreads)
	base, _ := c.Model()
	same, err := build([]float64{spreads[0].Base, spreads[1].Base})
	if err != nil || same.Material() != base.Material() {
		t.Errorf("at the bases: %+v (%v), want the card's %+v", same.Material(), err, base.Material())
	}
	md, err := build([]float64{0.12, 2e28})
	if err != nil {
		t.Fatal(err)
	}
	if m := md.Material(); m.Gamma != 0.12 || m.Sites != 2e28 {
		t.Errorf("varied: gamma %v sites %v, want 0.12 and 2e28", m.Gamma, m.Sites)
	}
	if c.Values["gamma"].SI != 0.118 || c.Has("sites") {
		t.Error("Vary changed the card")
	}
}

// BenchmarkVary is the build of one Monte Carlo sample from a card: a copy
// of its values with two set, and the model built from them.
func BenchmarkVary(b *testing.B) {
	c := mustParse(b, goodCard, "g.toml")
	spreads, err := c.Resolve(map[string]SpreadSpec{"gamma": {Key: "gamma", Form: sample.Relative, X: 0.02}, "d0": {Key: "d0", Form: sample.Factor, X: 2}})
	if err != nil {
		b.Fatal(err)
	}
	build := c.Vary(spreads)
	x := []float64{0.12, 3e-7}
	for b.Loop() {
		if _, err := build(x); err != nil {
			b.Fatal(err)
		}
	}
}
