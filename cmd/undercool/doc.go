/*
Undercool computes how fast a new phase nucleates and grows when a material
is cooled, held, stored or reheated below its equilibrium temperature,
from classical nucleation theory and an Arrhenius or viscosity mobility
law.

Usage:

	undercool COMMAND [flags]

Commands:

	rate       nucleus and steady-state nucleation rate over temperatures
	ttt        TTT curve for a transformed fraction, with its nose
	hold       time to a fraction at one temperature (storage, anneal)
	cool       cooling paths: fraction, critical rate, onset, quench factor
	heat       heating a glass: critical heating rate, DSC peaks, heat treatments
	evolve     particles in size classes over a schedule: ageing, crystallizers
	fit        fit Arrhenius, interface, growth, Avrami, induction, DSC peaks
	materials  list the shipped material cards, or show one
	report     a Markdown memo for a material and a question

Run "undercool COMMAND --help" for the flags of a command, with an example,
and "undercool --version" for the version and commit of this build.

A material comes from --material NAME (a shipped card) or --material
FILE.toml (your own card); any single value can be overridden with a flag
(--te, --dh, --vm, --gamma, ...). Quantities take units: temperatures K, C
or F (a bare number is kelvin), energies J/mol, kJ/mol or eV, interfacial
energies J/m2, mJ/m2 or erg/cm2, molar volumes m3/mol or cm3/mol,
diffusivities m2/s or cm2/s.

Output is a table by default; --format csv, json or markdown give the
same result for a spreadsheet, a program or a report. JSON values are SI
and every key ends in its unit.

Exit status is 0 on success, 1 when a computation fails, 2 for bad usage
or bad input and 130 when a run is interrupted (Ctrl-C); errors are one
line on standard error. A long run shows its progress on standard error
when that is a terminal.

The results are estimates: rates depend on the cube of the interfacial
energy inside an exponential, so a 10 % error in it moves a rate by orders
of magnitude. Heat treatment and quenching (hot metal, quench-oil fires,
steam), reheating glass (furnaces, molten material) and pharmaceutical or
food process decisions must follow local codes, validated procedures and
licensed practice.
*/
package main
