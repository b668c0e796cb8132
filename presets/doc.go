// Package presets holds the material cards shipped with undercool, the
// loader and validator for a user's own cards, and the readers for the data
// files a user brings (CSV with units in the header).
//
// A card is TOML. Every numeric value is written with its unit and carries
// its source:
//
//	name = "nickel"
//	kind = "metal"
//	description = "pure nickel melt, homogeneous nucleation"
//	driving = "thompson-spaepen"
//	mobility = "arrhenius"
//
//	[values]
//	te = { value = "1728 K", source = "CRC Handbook, 97th ed., melting points" }
//
// The loader rejects unknown keys, empty values, missing sources, wrong
// units and non-finite numbers, naming the file, the key and the line.
package presets
