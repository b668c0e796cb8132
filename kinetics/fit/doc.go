// Package fit fits the models of undercool to measurements by (weighted)
// least squares, with standard errors and 95 % intervals: a straight line
// (Line), an Arrhenius law (Arrhenius), the interfacial energy from measured
// nucleation rates (Interface), the Avrami law (Avrami) and the interfacial
// energy and apparent prefactor from induction times in solution
// (Induction).
//
// Failures: a point that cannot be fitted is a *kinetics.PointError naming
// it by its index; too few points is ErrFewPoints; equal abscissae ErrSameX.
package fit
