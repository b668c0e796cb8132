package presets

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"undercool/presets/units"
)

// Value is one numeric value of a card.
type Value struct {
	SI     float64 // in the SI unit of its kind
	Text   string  // as written, with its unit
	Kind   units.Kind
	Source string
	Line   int // line in the card file, 0 when set on the command line
}

// Card is a material card: the model choices and the sourced values.
type Card struct {
	Name           string
	Kind           string
	Description    string
	Driving        string // one of DrivingChoices
	DrivingFile    string // CSV of Δg(T) for driving "table", relative to the card
	SolubilityFile string // CSV of the solubility c_sat(T) for driving "solution", relative to the card
	Mobility       string // one of MobilityChoices
	Prefactor      string // one of PrefactorChoices
	GammaLaw       string // one of GammaLawChoices; "": constant, or linear with gamma_slope
	Growth         string // one of GrowthChoices; "": normal, or the law its values belong to
	GrowthFile     string // CSV of the measured growth rate u(T) for growth "table", relative to the card
	Standing       Standing
	Values         map[string]Value
	Spreads        map[string]SpreadSpec // [spread]: standard deviations of values, by key
	File           string                // where it came from: a path, or "preset NAME"

	tables *tables // the files it names, read once (build.go)
}

type rawValue struct {
	Value  any    `toml:"value"`
	Source string `toml:"source"`
}

type rawCard struct {
	Name            string              `toml:"name"`
	Kind            string              `toml:"kind"`
	Description     string              `toml:"description"`
	Driving         string              `toml:"driving"`
	DrivingTable    string              `toml:"driving_table"`
	SolubilityTable string              `toml:"solubility_table"`
	Mobility        string              `toml:"mobility"`
	Prefactor       string              `toml:"prefactor"`
	GammaLaw        string              `toml:"gamma_law"`
	Growth          string              `toml:"growth"`
	GrowthTable     string              `toml:"growth_table"`
	Standing        *rawStanding        `toml:"standing"`
	Values          map[string]rawValue `toml:"values"`
	Spread          map[string]rawValue `toml:"spread"`
}

// lineOf finds the line on which a key is defined (as "key =" or as a
// table header "[values.key]"), 0 if it cannot be found.
func lineOf(data []byte, key string) int {
	for i, l := range bytes.Split(data, []byte("\n")) {
		s := strings.TrimSpace(string(l))
		if s == "[values."+key+"]" {
			return i + 1
		}
		if assigns(s, key) {
			return i + 1
		}
	}
	return 0
}

// assigns reports whether a trimmed TOML line sets key ("key = ...").
func assigns(line, key string) bool {
	rest, ok := strings.CutPrefix(line, key)
	return ok && strings.HasPrefix(strings.TrimSpace(rest), "=")
}

func oneOf(s string, choices []string) bool {
	for _, c := range choices {
		if s == c {
			return true
		}
	}
	return false
}

// Parse reads a card from TOML. file names it in errors ("cards/x.toml" or
// "preset x"). A card larger than MaxCardBytes or nested deeper than
// MaxCardDepth is a *LimitError.
func Parse(data []byte, file string) (*Card, error) {
	if len(data) > MaxCardBytes {
		return nil, tooLarge(file, MaxCardBytes, "a card")
	}
	if err := checkDepth(data, file); err != nil {
		return nil, err
	}
	var raw rawCard
	md, err := toml.Decode(string(data), &raw)
	if err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return nil, fmt.Errorf("%s:%d: %s", file, pe.Position.Line, pe.Message)
		}
		return nil, fmt.Errorf("%s: %v", file, err)
	}
	if und := md.Undecoded(); len(und) > 0 {
		k := und[0]
		line := lineOf(data, k[len(k)-1])
		if line == 0 && len(k) > 2 {
			line = lineOf(data, k[1]) // a field inside an inline table: the value's line
		}
		return nil, fmt.Errorf("%s:%d: unknown key %s (allowed: %s)", file, line, units.Quote(k.String()), allowedKeys(k))
	}
	c := &Card{
		Name: raw.Name, Kind: raw.Kind, Description: raw.Description,
		Driving: raw.Driving, DrivingFile: raw.DrivingTable, Mobility: raw.Mobility, Prefactor: raw.Prefactor,
		SolubilityFile: raw.SolubilityTable, GammaLaw: raw.GammaLaw, Growth: raw.Growth, GrowthFile: raw.GrowthTable,
		Values: map[string]Value{}, File: file,
	}
	topChecks := []struct {
		key, val string
		choices  []string
	}{
		{"kind", c.Kind, KindChoices},
		{"driving", c.Driving, DrivingChoices},
		{"mobility", c.Mobility, MobilityChoices},
		{"prefactor", c.Prefactor, PrefactorChoices},
		{"gamma_law", c.GammaLaw, GammaLawChoices},
		{"growth", c.Growth, GrowthChoices},
	}
	if c.Name == "" {
		return nil, fmt.Errorf("%s: missing value for key \"name\"", file)
	}
	for _, t := range topChecks {
		if t.val == "" && (t.key == "kind" || t.key == "driving") {
			return nil, fmt.Errorf("%s: missing value for key %q (one of %s)", file, t.key, strings.Join(t.choices, ", "))
		}
		if t.val != "" && !oneOf(t.val, t.choices) {
			return nil, fmt.Errorf("%s:%d: key %q: %s is not one of %s", file, lineOf(data, t.key), t.key, units.Quote(t.val), strings.Join(t.choices, ", "))
		}
	}
	if c.Driving == "table" && c.DrivingFile == "" {
		return nil, fmt.Errorf("%s: driving \"table\" needs driving_table = \"FILE.csv\"", file)
	}
	if (c.Growth == "table") != (c.GrowthFile != "") {
		return nil, fmt.Errorf("%s:%d: growth \"table\" and growth_table = \"FILE.csv\" go together", file, lineOf(data, "growth"))
	}
	if c.Standing, err = standingOf(raw.Standing, file); err != nil {
		return nil, err
	}
	for _, key := range sortedKeys(raw.Values) {
		rv := raw.Values[key]
		line := lineOf(data, key)
		where := fmt.Sprintf("%s:%d: key %s", file, line, units.Quote(key))
		p, ok := ParamByKey(key)
		if !ok {
			return nil, fmt.Errorf("%s: unknown value (allowed: %s)", where, strings.Join(paramKeys(), ", "))
		}
		text, err := sourcedText(rv, where)
		if err != nil {
			return nil, err
		}
		v, err := ParseValue(p, text)
		if err != nil {
			return nil, fmt.Errorf("%s: %v", where, err)
		}
		v.Source, v.Line = rv.Source, line
		c.Values[key] = v
	}
	if c.Spreads, err = parseSpreads(data, file, raw.Spread); err != nil {
		return nil, err
	}
	return c, nil
}

// sortedKeys are the keys of a table of values in order, so that the first
// error found is always the same.
func sortedKeys(raw map[string]rawValue) []string {
	keys := make([]string, 0, len(raw))
	for k := range raw {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

// sourcedText is the text of a value that must carry a source; where (file,
// line and key) begins its errors.
func sourcedText(rv rawValue, where string) (string, error) {
	text, err := valueText(rv.Value)
	if err != nil {
		return "", fmt.Errorf("%s: %v", where, err)
	}
	if strings.TrimSpace(rv.Source) == "" {
		return "", fmt.Errorf("%s: missing source (a publication, \"common practice\", \"from memory\" or \"invented for the demo\")", where)
	}
	return text, nil
}

// valueText turns a TOML value (string with unit, or bare number) into text.
func valueText(v any) (string, error) {
	switch x := v.(type) {
	case nil:
		return "", errors.New("missing value")
	case string:
		if strings.TrimSpace(x) == "" {
			return "", errors.New("missing value")
		}
		return x, nil
	case int64:
		return strconv.FormatInt(x, 10), nil
	case float64:
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return "", fmt.Errorf("value %v is not a finite number", x)
		}
		return strconv.FormatFloat(x, 'g', -1, 64), nil
	default:
		return "", fmt.Errorf("value must be a number with its unit, as a string such as \"1.2 kJ/mol\"")
	}
}

// ParseValue reads the text of a parameter in any of its kinds.
func ParseValue(p Param, text string) (Value, error) {
	si, i, err := units.ParseAny(text, p.Kinds...)
	if err != nil {
		return Value{}, err
	}
	if err := p.Range.check(si, text); err != nil {
		return Value{}, err
	}
	return Value{SI: si, Text: strings.TrimSpace(text), Kind: p.Kinds[i]}, nil
}

func allowedKeys(k toml.Key) string {
	if len(k) > 1 && k[0] == "spread" {
		if len(k) > 2 {
			return "value, source"
		}
		return strings.Join(paramKeys(), ", ")
	}
	if len(k) > 1 && k[0] == "values" {
		if len(k) > 2 {
			return "value, source"
		}
		return strings.Join(paramKeys(), ", ")
	}
	if len(k) > 1 && k[0] == "standing" {
		return "calibrated, checked, error, note"
	}
	return "name, kind, description, driving, driving_table, solubility_table, mobility, prefactor, gamma_law, growth, growth_table, [values], [spread], [standing]"
}

// load reads a card from a file, at most MaxCardBytes of it.
func load(path string) (*Card, error) {
	data, err := ReadFile(path, MaxCardBytes, "a card")
	if err != nil {
		var le *LimitError
		if errors.As(err, &le) {
			return nil, err
		}
		return nil, fmt.Errorf("cannot read material card %s: %v", path, errors.Unwrap(err))
	}
	c, err := Parse(data, path)
	if err != nil {
		return nil, err
	}
	if c.DrivingFile != "" && !filepath.IsAbs(c.DrivingFile) {
		c.DrivingFile = filepath.Join(filepath.Dir(path), c.DrivingFile)
	}
	if c.SolubilityFile != "" && !filepath.IsAbs(c.SolubilityFile) {
		c.SolubilityFile = filepath.Join(filepath.Dir(path), c.SolubilityFile)
	}
	if c.GrowthFile != "" && !filepath.IsAbs(c.GrowthFile) {
		c.GrowthFile = filepath.Join(filepath.Dir(path), c.GrowthFile)
	}
	return c, nil
}

// Set puts a value given as text (with its unit) on the card, as the
// command line does to override a card; source says where it came from.
func (c *Card) Set(key, text, source string) error {
	p, ok := ParamByKey(key)
	if !ok {
		panic("presets: Set: unknown key " + key)
	}
	v, err := ParseValue(p, text)
	if err != nil {
		return err
	}
	v.Source = source
	c.Values[key] = v
	return nil
}

// Has reports whether the card has a value for key.
func (c *Card) Has(key string) bool { _, ok := c.Values[key]; return ok }

// SI returns the SI value of key, 0 when absent.
func (c *Card) SI(key string) float64 { return c.Values[key].SI }
