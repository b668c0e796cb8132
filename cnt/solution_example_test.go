package cnt_test

import (
	"fmt"

	"undercool/cnt"
)

// A solution saturated at 40 °C and cooled to 25 °C at constant
// concentration, with an ideal solubility law (ΔH_sol = 28 kJ/mol, invented
// values): the supersaturation and the driving force, which is Turnbull's
// linear law with T_e = T_sat.
func ExampleVantHoff() {
	sol := cnt.VantHoff{Tsat: 313.15, DHsol: 28e3}
	lin := cnt.Linear{Te: 313.15, DH: 28e3}
	T := 298.15
	fmt.Printf("ln S = %.4f\n", sol.LnS(T))
	fmt.Printf("Δg = %.2f J/mol (linear law: %.2f J/mol)\n", sol.PerMole(T), lin.PerMole(T))
	// Output:
	// ln S = 0.5410
	// Δg = 1341.21 J/mol (linear law: 1341.21 J/mol)
}
