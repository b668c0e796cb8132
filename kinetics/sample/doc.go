// Package sample carries the uncertainty of a material's inputs through to
// any result: each uncertain input is a Spread (normal, or log-normal for a
// factor on a rate) about its value, a MonteCarlo run draws the inputs,
// builds the model of every sample and evaluates the headline results, and
// the Uncertainty it returns holds their P5, P50 and P95 and the
// sensitivity of each result to each input alone.
//
// The package knows nothing of material cards: the caller names each input
// (Spread.Key, for labels) and says how a model is built from drawn values
// (MonteCarlo.Build).
package sample
