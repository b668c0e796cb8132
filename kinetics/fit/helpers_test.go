package fit

import (
	"math"
	"testing"

	"undercool/kinetics"
)

// sameFloat compares two floats to a relative tolerance, NaN equal to NaN
// and an infinity only to itself.
func sameFloat(a, b, rel float64) bool {
	switch {
	case math.IsNaN(a) || math.IsNaN(b):
		return math.IsNaN(a) && math.IsNaN(b)
	case math.IsInf(a, 0) || math.IsInf(b, 0):
		return a == b
	}
	return math.Abs(a-b) <= rel*math.Max(math.Abs(a), math.Abs(b))
}

func mustModel(t testing.TB, m kinetics.Material) *kinetics.Model {
	t.Helper()
	md, err := kinetics.NewModel(m)
	if err != nil {
		t.Fatal(err)
	}
	return md
}
