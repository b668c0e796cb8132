package kinetics

// RefCoolingLnXext is the reference of linear cooling (reference_test.go),
// for the tests of the shipped cards.
var RefCoolingLnXext = refCoolingLnXext
