package kinetics_test

import (
	"testing"

	"undercool/kinetics"
	"undercool/presets"
)

// shippedModel returns the model of a shipped card.
func shippedModel(t testing.TB, name string) *kinetics.Model {
	t.Helper()
	c, err := presets.Preset(name)
	if err != nil {
		t.Fatalf("card %s: %v", name, err)
	}
	md, err := c.Model()
	if err != nil {
		t.Fatalf("card %s: %v", name, err)
	}
	return md
}
