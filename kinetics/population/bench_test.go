package population_test

import (
	"context"
	"testing"

	"undercool/kinetics/population"
)

var sinkRes *population.AlloyResult

// BenchmarkAgeing100h is one isothermal 100 h ageing at 300 °C of the
// Al–Sc-like alloy of the checks, from the supersaturated solid solution
// through nucleation, growth and coarsening, with the default 500 classes
// (target: under 0.3 s on one core). It fails if the run never fills its
// 500 classes, so that it measures what it says.
func BenchmarkAgeing100h(b *testing.B) {
	a := demoScandium()
	s := isothermal(b, 573.15, 100*3600)
	b.ReportAllocs()
	for b.Loop() {
		res, err := a.Run(context.Background(), s, population.Options{})
		if err != nil {
			b.Fatal(err)
		}
		if res.PeakClasses < 500 {
			b.Fatalf("only %d classes", res.PeakClasses)
		}
		sinkRes = res
	}
}
