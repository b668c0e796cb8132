// Package cnt is classical nucleation theory at one temperature.
//
// It turns numbers into numbers: a driving force per mole Δg(T) from one of
// several published approximations, the critical nucleus of a spherical or
// spherical-cap embryo (radius r*, size n*, barrier ΔG*, Zeldovich factor Z),
// the attachment frequency β*, and the natural logarithm of the steady-state
// nucleation rate J. It knows nothing of time or of mobility laws: the
// diffusivity D enters as a number.
//
// All quantities are SI. Rates span hundreds of decades, so the rate is
// carried as ln J and never exponentiated here.
//
// References:
//
//	Turnbull D., Fisher J.C., Rate of nucleation in condensed systems,
//	  J. Chem. Phys. 17 (1949) 71.
//	Kelton K.F., Greer A.L., Nucleation in Condensed Matter, Pergamon (2010), ch. 2.
//	Christian J.W., The Theory of Transformations in Metals and Alloys, 3rd ed.,
//	  Pergamon (2002), ch. 10.
package cnt
