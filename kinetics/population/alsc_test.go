package population_test

import "undercool/kinetics/population"

// alsc holds the published values for dilute Al–Sc alloys precipitating
// coherent L1₂ Al3Sc, each with its source (see the table in alscValues).
type alsc struct {
	solvus  population.Solvus
	vm      float64 // m³ per mole of atoms of Al3Sc
	lattice float64 // m
	gamma   float64 // J/m²
	d0, q   float64 // Sc in Al: m²/s, J/mol
}

// alscValues are the sourced values, for the checks here and for the
// alloy card of the command line.
//
//	value             source
//	solvus            two points of the solid solubility of Sc in Al,
//	                  0.186 at.% at 913 K and 0.033 at.% at 743 K, by
//	                  resistivity: Fujikawa S., Sugaya M., Takei H., Hirano K.,
//	                  J. Less-Common Met. 63 (1979) 87 (abstract, checked);
//	                  ln c_eq = A − B/T through them (A = 1.269, B = 6899 K).
//	D0, Q             Sc in Al, all data fitted together: D = 2.34e-4 m²/s
//	                  · exp(−167 kJ/mol / RT), Kerkove M.A., Wood T.D.,
//	                  Sanders P.G., Kampe S.L., Swenson D., Metall. Mater.
//	                  Trans. A 45 (2014) 3800 (abstract, checked).
//	lattice           a = 0.4103 nm for Al3Sc (from memory).
//	vm                a³·N_A/4 (four atoms in the L1₂ cell) = 1.0399e-5 m³/mol.
//	gamma             PROVISIONAL.
func alscValues() alsc {
	const a = 0.4103e-9
	return alsc{
		solvus:  population.SolvusThrough(913, 0.00186, 743, 0.00033),
		vm:      a * a * a * 6.02214076e23 / 4,
		lattice: a,
		gamma:   0.1,
		d0:      2.34e-4,
		q:       167e3,
	}
}
