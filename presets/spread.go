package presets

import (
	"bytes"
	"fmt"
	"math"
	"strconv"
	"strings"

	"undercool/kinetics"
	"undercool/presets/units"
)

// SpreadSpec is the uncertainty of one value as written on a card or the
// command line: a standard deviation relative to the value ("2%"),
// absolute with its unit ("3 kJ/mol", "5 K" — a temperature spread is a
// temperature difference) or, for the log-normal parameters, a factor
// ("x3": ±1σ multiplies or divides by 3).
//
// On a card the spreads sit in their own table, each with its source:
//
//	[spread]
//	gamma = { value = "2%", source = "scatter of the fitted values, from memory" }
//	d0    = { value = "x3", source = "common practice" }
type SpreadSpec struct {
	Key    string
	Text   string              // as written
	Form   kinetics.SpreadForm // relative, absolute or factor
	X      float64             // fraction (relative), SI value of Kind (absolute) or factor
	Kind   units.Kind          // the kind an absolute spread was written in
	Source string
	Line   int // line in the card file, 0 when given on the command line
}

// SpreadKeys are the parameters a spread may be given for.
func SpreadKeys() []string {
	var out []string
	for _, k := range kinetics.ParamKeys {
		if _, ok := ParamByKey(k); ok {
			out = append(out, k)
		}
	}
	return out
}

func spreadKnown(key string) bool {
	for _, k := range SpreadKeys() {
		if k == key {
			return true
		}
	}
	return false
}

// ParseSpread reads the standard deviation of parameter key. Errors: an
// unknown parameter (listing the known ones), text that is not a number,
// a negative or non-finite deviation, a wrong unit, a factor below 1 or
// for a parameter whose spread is normal.
func ParseSpread(key, text string) (SpreadSpec, error) {
	if !spreadKnown(key) {
		return SpreadSpec{}, fmt.Errorf("unknown parameter %q (known: %s)", key, strings.Join(SpreadKeys(), ", "))
	}
	p, _ := ParamByKey(key)
	t := strings.TrimSpace(text)
	s := SpreadSpec{Key: key, Text: t}
	if t == "" {
		return s, fmt.Errorf("%s: missing standard deviation (e.g. 2%% or a value with its unit)", key)
	}
	number := func(num string) (float64, error) {
		x, err := strconv.ParseFloat(strings.TrimSpace(num), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return 0, fmt.Errorf("%s: %q is not a finite number", key, t)
		}
		if x < 0 {
			return 0, fmt.Errorf("%s: %q: a standard deviation must not be negative", key, t)
		}
		return x, nil
	}
	switch {
	case strings.HasSuffix(t, "%"):
		x, err := number(strings.TrimSuffix(t, "%"))
		if err != nil {
			return s, err
		}
		s.Form, s.X = kinetics.Relative, x/100
		return s, nil
	case strings.HasPrefix(t, "x") || strings.HasPrefix(t, "×"):
		if !kinetics.IsMultiplicative(key) {
			return s, fmt.Errorf("%s: a factor spread (%s) is only for the log-normal parameters %s; give a percentage or a value with its unit", key, t, strings.Join(kinetics.LogNormalKeys, ", "))
		}
		x, err := number(strings.TrimPrefix(strings.TrimPrefix(t, "x"), "×"))
		if err != nil {
			return s, err
		}
		if x < 1 {
			return s, fmt.Errorf("%s: a factor spread must be at least 1, got %q", key, t)
		}
		s.Form, s.X = kinetics.Factor, x
		return s, nil
	}
	kinds := make([]units.Kind, len(p.Kinds))
	for i, k := range p.Kinds {
		if k.Name == units.Temperature.Name {
			k = units.TemperatureDifference
		}
		kinds[i] = k
	}
	x, i, err := units.ParseAny(t, kinds...)
	if err != nil {
		return s, fmt.Errorf("%s: %v (or give a percentage such as 2%%)", key, err)
	}
	if x < 0 {
		return s, fmt.Errorf("%s: %q: a standard deviation must not be negative", key, t)
	}
	s.Form, s.X, s.Kind = kinetics.Absolute, x, kinds[i]
	return s, nil
}

// Spread turns the written deviation into the spread of material m, whose
// value it is relative to (an enthalpy spread per volume is converted per
// mole with the material's molar volume).
func (s SpreadSpec) Spread(m kinetics.Material) (kinetics.Spread, error) {
	x := s.X
	if s.Form == kinetics.Absolute && s.Kind.Name == units.EnergyDensity.Name {
		x *= m.Vm
	}
	return kinetics.NewSpread(m, s.Key, s.Form, x)
}

// spreadLine finds the line of key inside the [spread] table (or the
// header [spread.key]), 0 if it cannot be found.
func spreadLine(data []byte, key string) int {
	section := ""
	for i, l := range bytes.Split(data, []byte("\n")) {
		s := strings.TrimSpace(string(l))
		if strings.HasPrefix(s, "[") {
			section = strings.Trim(s, "[] ")
			if section == "spread."+key {
				return i + 1
			}
			continue
		}
		if section != "spread" {
			continue
		}
		if assigns(s, key) {
			return i + 1
		}
	}
	return 0
}

// parseSpreads reads the [spread] table of a card.
func parseSpreads(data []byte, file string, raw map[string]rawValue) (map[string]SpreadSpec, error) {
	out := map[string]SpreadSpec{}
	for _, key := range sortedKeys(raw) {
		rv := raw[key]
		line := spreadLine(data, key)
		where := fmt.Sprintf("%s:%d: [spread] key %q", file, line, key)
		if !spreadKnown(key) {
			return nil, fmt.Errorf("%s: unknown parameter (allowed: %s)", where, strings.Join(SpreadKeys(), ", "))
		}
		text, err := sourcedText(rv, where)
		if err != nil {
			return nil, err
		}
		s, err := ParseSpread(key, text)
		if err != nil {
			return nil, fmt.Errorf("%s: %v", where, strings.TrimPrefix(err.Error(), key+": "))
		}
		s.Source, s.Line = rv.Source, line
		out[key] = s
	}
	return out, nil
}
