package kinetics

// RefCoolingLnXext is the reference of linear cooling (reference_test.go),
// for the tests of the shipped cards.
var RefCoolingLnXext = refCoolingLnXext

// RefLinearLnXext is the reference of a linear path, cooling or heating
// (reference_test.go).
var RefLinearLnXext = refLinearLnXext
