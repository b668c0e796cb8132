package cnt_test

import (
	"fmt"
	"math"

	"undercool/cnt"
)

// The critical nucleus of solid gold in its melt 230 K below the melting
// point, with the inputs of Callister, Materials Science and Engineering: An
// Introduction, Example Problem 10.1 (ΔHf = −1.16e9 J/m³, γ = 0.132 J/m²,
// Tm = 1337 K, a = 0.413 nm, 4 atoms per cubic cell). The driving force per
// unit volume, ΔHf·ΔT/Tm, times the volume of one atom is Δμ per atom.
func ExampleCritical() {
	const (
		dHv   = 1.16e9   // J/m³
		gamma = 0.132    // J/m²
		tm    = 1337.0   // K
		dT    = 230.0    // K
		a     = 0.413e-9 // m
	)
	v := a * a * a / 4 // m³ per atom
	dmu := dHv * dT / tm * v
	n := cnt.Critical(dmu, gamma, v, cnt.ShapeFactor(180), tm-dT)
	fmt.Printf("r*  = %.3f nm\n", n.Radius*1e9)
	fmt.Printf("ΔG* = %.3e J = %.1f kT\n", n.Barrier, n.Barrier/(cnt.Boltzmann*(tm-dT)))
	fmt.Printf("n*  = %.0f atoms (%.1f unit cells)\n", n.Size, n.Size/4)
	fmt.Printf("Z   = %.4f\n", n.Zeldovich)

	// On a substrate wetted at 60°, the barrier and size shrink by f(60°); r* does not.
	h := cnt.Critical(dmu, gamma, v, cnt.ShapeFactor(60), tm-dT)
	fmt.Printf("θ = 60°: f = %.5f, r* = %.3f nm, ΔG* = %.3e J\n", cnt.ShapeFactor(60), h.Radius*1e9, h.Barrier)
	fmt.Println("ln J with no driving force:", cnt.LnRate(math.Log(1/v), 0, 0, math.Inf(1), tm))
	// Output:
	// r*  = 1.323 nm
	// ΔG* = 9.677e-19 J = 63.3 kT
	// n*  = 551 atoms (137.7 unit cells)
	// Z   = 0.0047
	// θ = 60°: f = 0.15625, r* = 1.323 nm, ΔG* = 1.512e-19 J
	// ln J with no driving force: -Inf
}
