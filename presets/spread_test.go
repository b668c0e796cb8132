package presets

import (
	"math"
	"strings"
	"testing"

	"undercool/kinetics"
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
		form kinetics.SpreadForm
		x    float64
		line int
	}{
		"gamma": {kinetics.Relative, 0.02, 18},
		"q":     {kinetics.Absolute, 3000, 19},
		"te":    {kinetics.Absolute, 5, 20}, // a temperature difference: 5 K, not 5 K absolute
		"d0":    {kinetics.Factor, 3, 21},
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
		form      kinetics.SpreadForm
		x         float64
	}{
		{"gamma", "2%", kinetics.Relative, 0.02},
		{"gamma", " 2.5 % ", kinetics.Relative, 0.025},
		{"gamma", "5 mJ/m2", kinetics.Absolute, 5e-3},
		{"te", "9F", kinetics.Absolute, 5},
		{"te", "3C", kinetics.Absolute, 3},
		{"q", "0.1eV", kinetics.Absolute, 0.1 * 96485.33212},
		{"dh", "1e7 J/m3", kinetics.Absolute, 1e7},
		{"sites", "x10", kinetics.Factor, 10},
		{"sites", "×2", kinetics.Factor, 2},
		{"theta", "5", kinetics.Absolute, 5},
		{"gamma", "0%", kinetics.Relative, 0},
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

// TestSpreadOfMaterial: a per-volume enthalpy spread is converted per mole;
// a relative one needs no conversion.
func TestSpreadOfMaterial(t *testing.T) {
	c := mustParse(t, goodCard, "g.toml")
	md, err := c.Material()
	if err != nil {
		t.Fatal(err)
	}
	m := md.Material()
	s, _ := ParseSpread("dh", "1e7 J/m3")
	sp, err := s.Spread(m)
	if err != nil {
		t.Fatal(err)
	}
	if want := 1e7 * 9.8e-6; math.Abs(sp.SD-want) > 1e-9*want || sp.Dist != kinetics.Normal {
		t.Errorf("dh spread %+v, want normal σ = %v J/mol", sp, want)
	}
	s, _ = ParseSpread("d0", "50%")
	if sp, _ = s.Spread(m); sp.Dist != kinetics.LogNormal || math.Abs(sp.SD-math.Log(1.5)) > 1e-15 {
		t.Errorf("d0 spread %+v, want log-normal σ_ln = ln 1.5", sp)
	}
	s, _ = ParseSpread("vft_a", "0.1")
	if _, err := s.Spread(m); err == nil || !strings.Contains(err.Error(), "vft_a: the material has no such value") {
		t.Errorf("vft_a on an arrhenius card: %v", err)
	}
}
