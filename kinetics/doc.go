// Package kinetics combines a driving force, an interface and a mobility law
// into a material model that answers, for any temperature, ln J(T) and the
// growth rate u(T); everything that happens in time (TTT curves, cooling
// paths, storage, quench factors) is built on those two functions.
//
// References:
//
//	Kelton K.F., Greer A.L., Nucleation in Condensed Matter, Pergamon (2010).
//	Uhlmann D.R., A kinetic treatment of glass formation, J. Non-Cryst.
//	  Solids 7 (1972) 337.
//	Williams M.L., Landel R.F., Ferry J.D., J. Am. Chem. Soc. 77 (1955) 3701.
package kinetics
