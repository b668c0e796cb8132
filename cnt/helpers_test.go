package cnt_test

import (
	"math"

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
