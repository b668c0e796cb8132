package kinetics

import "math"

// CoolingRateOnGrid is, for the tests, the critical cooling rate for
// fraction X of linear cooling to the automatic end (as LinearCooling(0)),
// integrated on a grid that halves a step where ln J changes by more than
// near (within spanLn of its largest value) or far (within farSpanLn), or
// ln u by more than u, with no limit on the number of nodes; and the
// number of nodes.
func CoolingRateOnGrid(md *Model, X, near, far, u float64) (float64, int, error) {
	c, err := md.LinearCooling(0)
	if err != nil {
		return 0, 0, err
	}
	T, lnJ, gu := md.coolingGrid(c.Te, c.lo, gridSpec{near: near, far: far, u: u, max: 1 << 24})
	tau := make([]float64, len(T))
	for i := range T {
		tau[i] = c.Te - T[i]
	}
	s := integrate(tau, lnJ, gu, nil)
	return math.Exp((s.LnXext[len(T)-1] - lnXextOf(X)) / 4), len(T), nil
}

// Grid steps of LinearCooling, for the tests.
const (
	MaxLnStep = maxLnStep
	FarLnStep = farLnStep
)

// CoolingNodes is the number of nodes of the grid of the totals.
func CoolingNodes(c *Cooling) int { return len(c.Temp) }
