// Package population follows particles in size classes through a thermal
// schedule: precipitates in an ageing solid solution (Alloy) and crystals
// in a batch cooling crystallizer (Crystallizer). Particles are born by
// classical nucleation, grow by a size-dependent law, and share the solute
// with the parent, so that nucleation stops as the parent is depleted,
// growth slows, and coarsening follows by itself.
//
// # Numerics
//
// The classes are Lagrangian: each class is a number of particles per m³
// that share one size, and the size moves with the growth law; a class is
// born in every step in which particles nucleate, and a class that
// dissolves is removed, its solute returned to the parent. The parent's
// concentration is never integrated: it follows at every evaluation from
// the solute balance over the particles present, so that the solute is
// conserved to rounding by construction.
//
// The step is Heun's (the explicit trapezoid rule) on all sizes at once,
// with the Euler predictor as the error estimate and the step adapted to
// keep, in every step,
//
//   - the change of each size within RelTol of the larger of the size and
//     the mean size (shrinking classes below half the mean size, or about
//     to vanish, are held only by the next condition: their sizes carry
//     little of the solute, and the rate of a particle near the end of its
//     dissolution grows without bound);
//   - the dissolved concentration (the mass balance of the step) within
//     ConcTol of its distance from equilibrium;
//   - the number born within RelTol of the number of particles (plus one
//     particle per m³);
//   - the spread in size of the particles born in the step, which one
//     class stands for, (|dx/dt|·h/x̄)²/4 within RelTol, x̄ the mean size;
//   - along a ramp, the change of temperature within 1 K: the error
//     estimate sees only the ends of a step, and a burst of nucleation in
//     the middle of a quench would otherwise fall between them.
//
// The births of a step are counted by the trapezoid rule and placed at
// their mean time of birth within the step, grown from there to its end.
// Steps end on every break point of the schedule and every output time.
// The class count is bounded: past MaxClasses the two classes closest in
// log size are merged (number and volume kept); when dissolution has
// removed half of the classes there were, each class is split in two
// within its cell (number and volume kept). Rates are carried as ln J.
//
// References:
//
//	Kampmann R., Wagner R., Kinetics of precipitation in metastable binary
//	  alloys — theory and application to Cu-1.9 at% Ti and Ni-14 at% Al, in
//	  Decomposition of Alloys: the Early Stages, Pergamon (1984) 91 (from memory).
//	Myhr O.R., Grong Ø., Modelling of non-isothermal transformations in
//	  alloys containing a particle distribution, Acta Mater. 48 (2000) 1605
//	  (from memory).
//	Perez M., Dumont M., Acevedo-Reyes D., Implementation of classical
//	  nucleation and growth theories for precipitation, Acta Mater. 56
//	  (2008) 2119 (from memory).
//	Lifshitz I.M., Slyozov V.V., J. Phys. Chem. Solids 19 (1961) 35;
//	  Wagner C., Z. Elektrochem. 65 (1961) 581 (coarsening).
//	Randolph A.D., Larson M.A., Theory of Particulate Processes, 2nd ed.,
//	  Academic Press (1988) (population balances, the method of moments).
package population
