package presets

import (
	"bytes"
	"fmt"
	"math"
	"strconv"
	"strings"

	"undercool/kinetics"
	"undercool/kinetics/sample"
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
	Text   string      // as written
	Form   sample.Form // relative, absolute or factor
	X      float64     // fraction (relative), SI value of Kind (absolute) or factor
	Kind   units.Kind  // the kind an absolute spread was written in
	Source string
	Line   int // line in the card file, 0 when given on the command line
}

// ParseSpread reads the standard deviation of parameter key. Errors: an
// unknown parameter (listing the known ones), text that is not a number,
// a negative or non-finite deviation, a wrong unit, a factor below 1 or
// for a parameter whose spread is normal.
func ParseSpread(key, text string) (SpreadSpec, error) {
	p, ok := ParamByKey(key)
	if !ok {
		return SpreadSpec{}, fmt.Errorf("unknown parameter %s (known: %s)", units.Quote(key), strings.Join(paramKeys(), ", "))
	}
	t := strings.TrimSpace(text)
	s := SpreadSpec{Key: key, Text: t}
	if t == "" {
		return s, fmt.Errorf("%s: missing standard deviation (e.g. 2%% or a value with its unit)", key)
	}
	number := func(num string) (float64, error) {
		x, err := strconv.ParseFloat(strings.TrimSpace(num), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return 0, fmt.Errorf("%s: %s is not a finite number", key, units.Quote(t))
		}
		if x < 0 {
			return 0, fmt.Errorf("%s: %s: a standard deviation must not be negative", key, units.Quote(t))
		}
		return x, nil
	}
	switch {
	case strings.HasSuffix(t, "%"):
		x, err := number(strings.TrimSuffix(t, "%"))
		if err != nil {
			return s, err
		}
		s.Form, s.X = sample.Relative, x/100
		return s, nil
	case strings.HasPrefix(t, "x") || strings.HasPrefix(t, "×"):
		if p.Spread != sample.LogNormal {
			return s, fmt.Errorf("%s: a factor spread (%s) is only for the log-normal parameters %s; give a percentage or a value with its unit", key, t, strings.Join(LogNormalKeys(), ", "))
		}
		x, err := number(strings.TrimPrefix(strings.TrimPrefix(t, "x"), "×"))
		if err != nil {
			return s, err
		}
		if x < 1 {
			return s, fmt.Errorf("%s: a factor spread must be at least 1, got %s", key, units.Quote(t))
		}
		s.Form, s.X = sample.Factor, x
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
		return s, fmt.Errorf("%s: %s: a standard deviation must not be negative", key, units.Quote(t))
	}
	s.Form, s.X, s.Kind = sample.Absolute, x, kinds[i]
	return s, nil
}

// Resolve turns written spreads into those of the card, in the order of
// Params: each becomes a spread about the value the card's models read
// (its default where the card leaves it out: theta 180, sites 1/v, jump
// v^(1/3), the universal WLF constants), drawn as the parameter says
// (Param.Spread) and kept within its range. An absolute enthalpy spread
// per mole on a value per volume, or the other way round, is converted
// with the molar volume. Errors, each a *SpreadError: a value the card's
// models do not read, a spread the sample package rejects (see
// sample.NewSpread).
func (c *Card) Resolve(specs map[string]SpreadSpec) ([]sample.Spread, error) {
	md, read, err := c.build()
	if err != nil {
		return nil, err
	}
	var out []sample.Spread
	for _, p := range Params {
		s, ok := specs[p.Key]
		if !ok {
			continue
		}
		base, ok := read[p.Key]
		if !ok {
			return nil, &SpreadError{p.Key, fmt.Errorf("%s: the material has no such value (%s)", p.Key, c.unused(p))}
		}
		x := s.X
		if s.Form == sample.Absolute {
			if x, err = c.convert(p, s, md); err != nil {
				return nil, &SpreadError{p.Key, err}
			}
		}
		sp, err := sample.NewSpread(p.Key, p.Spread, base, p.Range, s.Form, x)
		if err != nil {
			return nil, &SpreadError{p.Key, err}
		}
		out = append(out, sp)
	}
	return out, nil
}

// SpreadError is a spread that cannot be drawn for a card, by its key.
type SpreadError struct {
	Key string
	Err error
}

func (e *SpreadError) Error() string { return e.Err.Error() }
func (e *SpreadError) Unwrap() error { return e.Err }

// unused says why the card's models do not read a value.
func (c *Card) unused(p Param) string {
	if p.For.Axis != "" {
		var now string
		switch p.For.Axis {
		case "driving":
			now = c.Driving
		case "mobility", "gamma_law", "growth":
			now = c.Choice(p.For.Axis)
		default:
			now = c.Prefactor
			if now == "" {
				now = "attachment"
			}
		}
		if now != p.For.Name {
			return fmt.Sprintf("%s %s, not %s", p.For.Axis, now, p.For.Name)
		}
	}
	if !c.Has(p.Key) {
		return "not given"
	}
	return "not used by the models of " + c.Name
}

// convert is an absolute spread in the kind of the card's value: an
// enthalpy per mole on a value per volume, or the other way round, goes
// through the molar volume; any other mismatch of kinds is an error.
func (c *Card) convert(p Param, s SpreadSpec, md *kinetics.Model) (float64, error) {
	own := p.Kinds[0]
	if v, ok := c.Values[p.Key]; ok {
		own = v.Kind
	}
	if s.Kind.Name == own.Name || (s.Kind.Name == units.TemperatureDifference.Name && own.Name == units.Temperature.Name) {
		return s.X, nil
	}
	vm := md.Material().Vm
	switch {
	case s.Kind.Name == units.EnergyDensity.Name && own.Name == units.MolarEnergy.Name:
		return s.X * vm, nil
	case s.Kind.Name == units.MolarEnergy.Name && own.Name == units.EnergyDensity.Name:
		return s.X / vm, nil
	}
	return 0, fmt.Errorf("%s: the spread %s is a %s but the value is a %s: give it in the same kind, or as a percentage", p.Key, s.Text, s.Kind.Name, own.Name)
}

// Vary returns the model of the card with the values of the spreads set
// to x (SI, one per spread in order), for the Build of a Monte Carlo run:
// a value equal to its spread's base is left as the card has it, so all at
// their bases is the card's own model. The card's data files are read
// once, by Resolve; the function is safe for concurrent use.
func (c *Card) Vary(spreads []sample.Spread) func(x []float64) (*kinetics.Model, error) {
	return func(x []float64) (*kinetics.Model, error) {
		v := c.Clone()
		for k, s := range spreads {
			if x[k] == s.Base {
				continue
			}
			val, ok := v.Values[s.Key]
			if !ok {
				p, _ := ParamByKey(s.Key)
				val = Value{Kind: p.Kinds[0], Source: "default"}
			}
			val.SI = x[k]
			v.Values[s.Key] = val
		}
		md, _, err := v.build()
		return md, err
	}
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
		where := fmt.Sprintf("%s:%d: [spread] key %s", file, line, units.Quote(key))
		if _, ok := ParamByKey(key); !ok {
			return nil, fmt.Errorf("%s: unknown parameter (allowed: %s)", where, strings.Join(paramKeys(), ", "))
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
