package presets

import (
	"bytes"
	"fmt"
	"path/filepath"
	"strings"
	"unicode"
)

// TOML writes the card in the layout of the shipped cards: the header as
// comment lines, the model choices, then [values] with each value as
// written and its source, in the order of Params. Data files are named by
// their absolute paths, so the card reads from anywhere.
func (c *Card) TOML(header []string) []byte {
	var b bytes.Buffer
	for _, h := range header {
		fmt.Fprintf(&b, "# %s\n", h)
	}
	fmt.Fprintf(&b, "name = %s\n", tomlString(c.Name))
	fmt.Fprintf(&b, "kind = %s\n", tomlString(c.Kind))
	if c.Description != "" {
		fmt.Fprintf(&b, "description = %s\n", tomlString(c.Description))
	}
	fmt.Fprintf(&b, "driving = %s\n", tomlString(c.Driving))
	if c.Driving == "table" && c.DrivingFile != "" {
		fmt.Fprintf(&b, "driving_table = %s\n", tomlString(absolute(c.DrivingFile)))
	}
	if c.SolubilityFile != "" {
		fmt.Fprintf(&b, "solubility_table = %s\n", tomlString(absolute(c.SolubilityFile)))
	}
	if c.Mobility != "" && c.Mobility != "none" {
		fmt.Fprintf(&b, "mobility = %s\n", tomlString(c.Mobility))
	}
	if c.Prefactor != "" {
		fmt.Fprintf(&b, "prefactor = %s\n", tomlString(c.Prefactor))
	}
	if c.GammaLaw != "" {
		fmt.Fprintf(&b, "gamma_law = %s\n", tomlString(c.GammaLaw))
	}
	if c.Growth != "" {
		fmt.Fprintf(&b, "growth = %s\n", tomlString(c.Growth))
	}
	if c.Growth == "table" && c.GrowthFile != "" {
		fmt.Fprintf(&b, "growth_table = %s\n", tomlString(absolute(c.GrowthFile)))
	}
	b.WriteString("\n[values]\n")
	width := 0
	for _, p := range Params {
		if c.Has(p.Key) {
			width = max(width, len(p.Key))
		}
	}
	for _, p := range Params {
		if v, ok := c.Values[p.Key]; ok {
			fmt.Fprintf(&b, "%-*s = { value = %s, source = %s }\n", width, p.Key, tomlString(v.Text), tomlString(v.Source))
		}
	}
	writeStanding(&b, c.Standing)
	return b.Bytes()
}

// writeStanding writes the [standing] table of a card that states one.
func writeStanding(b *bytes.Buffer, s Standing) {
	if len(s.Calibrated) == 0 && len(s.Checked) == 0 && s.Note == "" && !s.Invented {
		return
	}
	list := func(rows []string) string {
		q := make([]string, len(rows))
		for i, r := range rows {
			q[i] = tomlString(r)
		}
		return "[" + strings.Join(q, ", ") + "]"
	}
	b.WriteString("\n[standing]\n")
	if s.Invented {
		b.WriteString("invented = true\n")
	}
	if len(s.Calibrated) > 0 {
		fmt.Fprintf(b, "calibrated = %s\n", list(s.Calibrated))
	}
	if len(s.Checked) > 0 {
		fmt.Fprintf(b, "checked = %s\n", list(s.Checked))
		fmt.Fprintf(b, "error = %s\n", tomlString(s.Error))
	}
	if s.Rough {
		b.WriteString("estimate = true\n")
	}
	if s.Note != "" {
		fmt.Fprintf(b, "note = %s\n", tomlString(s.Note))
	}
}

func absolute(p string) string {
	if abs, err := filepath.Abs(p); err == nil {
		return abs
	}
	return p
}

// tomlString quotes s as a TOML basic string.
func tomlString(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch {
		case r == '"':
			b.WriteString(`\"`)
		case r == '\\':
			b.WriteString(`\\`)
		case r == '\n':
			b.WriteString(`\n`)
		case r == '\t':
			b.WriteString(`\t`)
		case unicode.IsControl(r):
			fmt.Fprintf(&b, `\u%04X`, r)
		default:
			b.WriteRune(r)
		}
	}
	b.WriteByte('"')
	return b.String()
}

// Clone is a copy of the card with a map of values of its own, so that
// setting a value leaves the card as it was.
func (c *Card) Clone() *Card {
	out := *c
	out.Values = make(map[string]Value, len(c.Values))
	for k, v := range c.Values {
		out.Values[k] = v
	}
	return &out
}
