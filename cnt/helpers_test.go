package cnt_test

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// same reports whether two results are the same answer, NaN-aware: equal
// values (including equal infinities), or both NaN.
func same(a, b float64) bool {
	return a == b || (math.IsNaN(a) && math.IsNaN(b))
}

// close reports whether got is within relative tolerance tol of want.
func close(got, want, tol float64) bool {
	return scalar.EqualWithinRel(got, want, tol)
}

// errorWith reports whether err is an error whose text contains msg.
func errorWith(err error, msg string) bool {
	return err != nil && strings.Contains(err.Error(), msg)
}

// mustPanic reports a test error, naming what was called, unless f panics.
func mustPanic(t *testing.T, what string, f func()) {
	t.Helper()
	defer func() {
		if recover() == nil {
			t.Errorf("%s did not panic", what)
		}
	}()
	f()
}
