package population_test

import "undercool/kinetics/population"

// alsc holds the published values for dilute Al–Sc alloys precipitating
// coherent L1₂ Al3Sc, each with its source (the table at alscValues).
type alsc struct {
	solvus  population.Solvus
	vm      float64 // m³ per mole of atoms of Al3Sc
	lattice float64 // m
	gamma   float64 // J/m²
	d0, q   float64 // Sc in Al: m²/s, J/mol
}

// alscValues are the sourced values, for the bookkeeping checks here; the
// card al-sc of the command line holds the same values, and its check
// against a published ageing experiment is presets.TestAlScMeasured. "Checked" means the abstract or page was
// read; "from memory" means recalled and not verified against the page.
//
//	value    value used                      source
//	solvus   ln c_eq = 1.269 − 6899 K/T      through two measured points of the solid
//	                                         solubility of Sc in Al, 0.186 at.% at 913 K and
//	                                         0.033 at.% at 743 K (resistivity): Fujikawa S.,
//	                                         Sugaya M., Takei H., Hirano K., J. Less-Common
//	                                         Met. 63 (1979) 87 (abstract, checked; the same
//	                                         abstract gives Δh = 59 kJ/mol, Δs = 6.0 R).
//	D0, Q    2.34e-4 m²/s, 167 kJ/mol     Sc in Al, all data fitted together (±0.84e-4,
//	                                         ±2 kJ/mol, one standard error): Kerkove M.A.,
//	                                         Wood T.D., Sanders P.G., Kampe S.L., Swenson D.,
//	                                         Metall. Mater. Trans. A 45 (2014) 3800
//	                                         (abstract, checked).
//	lattice  a = 0.4103 nm                   Al3Sc, L1₂ (from memory).
//	vm       a³·N_A/4 = 1.0399e-5 m³/mol     four atoms in the cell; derived.
//	cp       0.25                            Al3Sc stoichiometry; AP-FIM finds 25 at.% Sc
//	                                         in over-aged particles, less early on: Sano N.,
//	                                         Jo H.-H., Hirano K., Sakurai T., J. Jpn. Inst.
//	                                         Light Met. 39 (1989) 444 (abstract, checked).
//	gamma    0.094 J/m²                      coherent Al/Al3Sc, from homogeneous nucleation
//	                                         rates measured in Al–0.18 at.% Sc: Hyland R.W.,
//	                                         Metall. Trans. A 23 (1992) 1947 (from memory).
func alscValues() alsc {
	const a = 0.4103e-9
	return alsc{
		solvus:  population.SolvusThrough(913, 0.00186, 743, 0.00033),
		vm:      a * a * a * 6.02214076e23 / 4,
		lattice: a,
		gamma:   0.094,
		d0:      2.34e-4,
		q:       167e3,
	}
}
