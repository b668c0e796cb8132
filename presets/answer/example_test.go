package answer_test

import (
	"fmt"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/answer"
)

// The answer of a hold: a typed value (its JSON keys are its struct tags:
// time_s, critical_radius_m, ...) and how it reads. The card demo-alloy is
// invented for the demonstrations; its standing says so, and so does every
// line of the summary.
func ExampleHolds() {
	c, _ := presets.Open("demo-alloy")
	md, err := c.Model()
	if err != nil {
		fmt.Println(err)
		return
	}
	a, err := answer.Holds(answer.HoldInput{Card: c, Model: md, T: 800, X: 1e-6, JMAK: kinetics.JMAK{}})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("time_s = %.4g, never = %v, critical_size = %.4g\n", float64(a.Time), a.Never, float64(a.Size))
	for _, l := range a.Doc().Summary {
		fmt.Println(l)
	}
	// Output:
	// time_s = 7.29, never = false, critical_size = 119.3
	// time to X = 1e-06 at 800.00 K (526.85 °C): 7.29 s (invented)
	// undercooling 350.00 K; driving force 3546 J/mol (invented)
	// critical nucleus: radius 0.7738 nm, 119.3 molecules, barrier 3.512e-19 J (31.79 kT) (invented)
	// nucleation rate: log10 J = 17.067 (J in m^-3 s^-1) (invented)
	// growth rate: u = 1.425e-09 m/s (invented)
}
