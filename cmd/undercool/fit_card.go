package main

import (
	"bytes"
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"unicode"

	"undercool/presets"
)

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

// cardTOML renders a card in the layout of the shipped cards: comment
// lines, the model choices, then [values] with each value's source.
func cardTOML(c *presets.Card, header []string) []byte {
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
		p := c.DrivingFile
		if abs, err := filepath.Abs(p); err == nil {
			p = abs
		}
		fmt.Fprintf(&b, "driving_table = %s\n", tomlString(p))
	}
	if c.SolubilityFile != "" {
		p := c.SolubilityFile
		if abs, err := filepath.Abs(p); err == nil {
			p = abs
		}
		fmt.Fprintf(&b, "solubility_table = %s\n", tomlString(p))
	}
	if c.Mobility != "" && c.Mobility != "none" {
		fmt.Fprintf(&b, "mobility = %s\n", tomlString(c.Mobility))
	}
	if c.Prefactor != "" {
		fmt.Fprintf(&b, "prefactor = %s\n", tomlString(c.Prefactor))
	}
	b.WriteString("\n[values]\n")
	width := 0
	for _, p := range presets.Params {
		if c.Has(p.Key) {
			width = max(width, len(p.Key))
		}
	}
	for _, p := range presets.Params {
		v, ok := c.Values[p.Key]
		if !ok {
			continue
		}
		fmt.Fprintf(&b, "%-*s = { value = %s, source = %s }\n", width, p.Key, tomlString(v.Text), tomlString(v.Source))
	}
	return b.Bytes()
}

// writeCard writes a card to path, whole or not at all, after checking that
// it reads back as a card.
func writeCard(path string, c *presets.Card, header []string) error {
	data := cardTOML(c, header)
	if _, err := presets.Parse(data, path); err != nil {
		return fmt.Errorf("--card-out: the card does not read back: %v", err)
	}
	return writeFileAtomic(path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// copyCard is a copy of base with a map of values of its own, so that
// setting a value leaves base as it was.
func copyCard(base *presets.Card) *presets.Card {
	c := *base
	c.Values = map[string]presets.Value{}
	for k, v := range base.Values {
		c.Values[k] = v
	}
	return &c
}

// setValues sets each {key, text, source} on c, in order; an error is the card's.
func setValues(c *presets.Card, values ...[3]string) error {
	for _, v := range values {
		if err := c.Set(v[0], v[1], v[2]); err != nil {
			return fmt.Errorf("card: %v", err)
		}
	}
	return nil
}
