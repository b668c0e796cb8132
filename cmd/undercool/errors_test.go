package main

import (
	"bytes"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"

	"github.com/rogpeppe/go-internal/txtar"
)

// errorCases are bad inputs, run in-process: each must exit with its
// status (2 for bad usage or input, 1 for a failed computation), print one
// line on stderr that matches want and nothing on stdout, and leave no
// file behind. A case runs in the folder of its group in
// testdata/cases/files.txtar, which holds the files the cases read;
// $WORK is that folder.
var errorCases = []struct {
	dir  string
	args []string
	want string
	code int
}{
	{"cool", []string{"cool", "--material", "demo-alloy"}, `^undercool: cool: give --rate Q, --critical or --curve FILE.csv`, 2},
	// heat
	{"cool", []string{"report", "--material", "lithium-disilicate", "--heat-from", "25C", "--out", "$WORK/memo.md"}, `^undercool: --heat-from: says where the memo's heating starts; give --heat-rate or --dsc with it`, 2},
	{"cool", []string{"report", "--material", "demo-alloy", "--dsc", "2,5K/min", "--out", "$WORK/memo.md"}, `^undercool: --heat-from: the card has no glass transition Tg`, 2},
	{"cool", []string{"report", "--material", "lithium-disilicate", "--dsc", "2,5K/min", "--heat-from", "1400K", "--out", "$WORK/memo.md"}, `^undercool: --heat-from: 1400K is not below the equilibrium temperature`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--plot", "$WORK/heat.svg"}, `^undercool: heat: give --rate Q, --critical, --dsc Q,Q,... or --schedule`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "0K/min", "--plot", "$WORK/heat.svg"}, `^undercool: --rate: "0K/min" must be positive \(a heating rate, K/s\)`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "-2K/min"}, `^undercool: --rate: "-2K/min" must be positive`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "10K/fortnight"}, `^undercool: --rate: unit "K/fortnight" in "10K/fortnight" is not a unit of heating rate`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "10"}, `^undercool: --rate: "10" needs a unit of heating rate`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "10K/min", "--from", "900K", "--to", "800K", "--plot", "$WORK/heat.svg"}, `^undercool: --to: 800.00 K is not above the start of heating, 900.00 K \(--from\)`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "10K/min", "--from", "1400K"}, `^undercool: --from: 1400K is not below the equilibrium temperature 1307.00 K`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "10K/min", "--from", "-300C"}, `^undercool: --from: "-300C" is at or below absolute zero`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "10K/min", "--from", "25Q"}, `^undercool: --from: .*25Q`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "10K/min", "--schedule", "start at 700K; heat to 900K at 10K/min"}, `^undercool: --rate and --schedule: give one path`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--dsc", "", "--plot", "$WORK/dsc.svg"}, `^undercool: --dsc: give one or more rates, comma-separated`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--dsc", "2,0,10K/min"}, `^undercool: --dsc: "0" must be positive \(a heating rate, K/s\)`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--dsc", "2,5K/min", "--critical"}, `^undercool: --rate, --critical, --dsc and --schedule: give one of them`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--rate", "1,2K/min"}, `^undercool: --rate: give one heating rate \(for several, --dsc\)`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--critical", "--cooled-at", "0K/s"}, `^undercool: --cooled-at: "0K/s" must be positive \(a cooling rate, K/s\)`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--schedule", "start at 700K; heat to 900K at 10K/min", "--from", "700K"}, `^undercool: --from, --to and --cooled-at: apply to linear heating`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--schedule", "start at 700K; jump to 900K; hold 1h"}, `^undercool: --schedule: the schedule has an instant jump`, 2},
	{"cool", []string{"heat", "--material", "lithium-disilicate", "--critical", "--plot", "$WORK/heat.svg"}, `^undercool: --plot: draws the dX/dT curves of --dsc or --rate`, 2},
	{"cool", []string{"heat", "--material", "demo-alloy", "--critical"}, `^undercool: --from: the card has no glass transition Tg; give the start of heating`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--critical", "--rate", "10K/s"}, `^undercool: --critical and --rate: give one or the other`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--rate", "-5K/s"}, `^undercool: --rate: "-5K/s" must be positive`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--rate", "0K/s"}, `^undercool: --rate: "0K/s" must be positive`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--rate", "5"}, `^undercool: --rate: "5" needs a unit of cooling rate`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--rate", "nanK/s"}, `^undercool: --rate: "nanK/s" is not a number`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--rate", "5kg/s"}, `^undercool: --rate: unit "kg/s" in "5kg/s" is not a unit of cooling rate`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--rate", "5K/s", "--volume", "0mm3"}, `^undercool: --volume: "0mm3" must be positive`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--rate", "5K/s", "--volume", "-1mL"}, `^undercool: --volume: "-1mL" must be positive`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--rate", "5K/s", "--volume", "3"}, `^undercool: --volume: "3" needs a unit of volume`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--critical", "--fraction", "1"}, `^undercool: --fraction: "1" is not a number strictly between 0 and 1`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--critical", "--fraction", "0.5x"}, `^undercool: --fraction: "0.5x" is not a number`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--critical", "--end", "1200K"}, `^undercool: --end: 1200K is not below the equilibrium temperature 1150.00 K`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--critical", "--band", "0K"}, `^undercool: --band: "0K" must be positive`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--critical", "--plot", "$WORK/cct.pdf"}, `^undercool: --plot: .*unsupported plot file type ".pdf"`, 2},
	{"cool", []string{"cool", "--te", "1000", "--dh", "10kJ/mol", "--vm", "7cm3/mol", "--gamma", "0.1J/m2", "--critical"}, `^undercool: the material has no mobility law`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/nosuch.csv"}, `^undercool: --curve: cannot read .*nosuch.csv: no such file or directory`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/nounit.csv"}, `^undercool: --curve: .*nounit.csv:2: column "temperature" needs a unit, e.g. temperature_k`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/badrow.csv"}, `^undercool: --curve: .*badrow.csv:4: column "temperature_k": "abc" is not a finite number`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/back.csv"}, `^undercool: --curve: .*back.csv:5: time 1 s does not increase \(previous 1 s\)`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/short.csv"}, `^undercool: --curve: .*short.csv: a path needs at least 2 points`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/nocol.csv"}, `^undercool: --curve: .*nocol.csv:1: missing column for time`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/back.csv"}, `^undercool: --curve: needs --material .* or --c-curve`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/ok.csv", "--rate", "1K/s"}, `^undercool: --curve and --rate/--critical: give one path`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/ok.csv", "--end", "500K"}, `^undercool: --end: applies to linear cooling`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/ok.csv", "--c-curve", "k1=-0.005,k2=1,k3=1,k4=700,k5=1", "--volume", "1mL"}, `^undercool: --volume: the onset of nucleation needs --material`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/ok.csv", "--c-curve", "k1=-0.005,k2=1,k4=700,k5=1"}, `^undercool: --c-curve: missing constant k3`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/ok.csv", "--c-curve", "k1=-0.005,k2=abc,k3=1,k4=700,k5=1"}, `^undercool: --c-curve: k2: "abc" is not a number`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/ok.csv", "--c-curve", "k1=0.1,k2=1,k3=1,k4=700,k5=1"}, `^undercool: --c-curve: k1 must be negative`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/ok.csv", "--c-curve", "k1=-0.005,k2=1,k3=1,k4=-7,k5=1"}, `^undercool: --c-curve: k4 must be positive`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/ok.csv", "--c-curve", "k1=-0.005,k2=1,k3=1,k4=700,k5=inf"}, `^undercool: --c-curve: k5: "inf" is not a finite number`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/ok.csv", "--c-curve", "k1=-0.005,k2=1,k3=1,k4=700,k5=1,k6=3"}, `^undercool: --c-curve: unknown constant "k6"`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/ok.csv", "--c-curve", "k1=-0.005,k1=-0.004,k2=1,k3=1,k4=700,k5=1"}, `^undercool: --c-curve: k1 given twice`, 2},
	{"cool", []string{"cool", "--curve", "$WORK/ok.csv", "--c-curve", "junk"}, `^undercool: --c-curve: "junk" is not NAME=VALUE`, 2},
	{"cool", []string{"cool", "--material", "demo-alloy", "--critical", "--c-curve", "k1=-0.005,k2=1,k3=1,k4=700,k5=1"}, `^undercool: --c-curve: the quench factor needs a measured path`, 2},
	{"fit", []string{"fit"}, `^undercool: fit: give the kind of fit \(arrhenius, interface, growth, avrami, induction, kissinger, ozawa\) and a data file$`, 2},
	{"fit", []string{"fit", "wiggle", "data.csv"}, `^undercool: fit: "wiggle" is not a kind of fit \(arrhenius, interface, growth, avrami, induction, kissinger, ozawa\)$`, 2},
	{"fit", []string{"fit", "arrhenius"}, `^undercool: fit arrhenius: give one data file \(or - for standard input\), got 0 arguments$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/nosuch.csv"}, `^undercool: cannot read .*nosuch.csv`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/unknown-column.csv"}, `^undercool: .*unknown-column.csv:2: unknown column "temp"; accepted: temperature_UNIT`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/no-rate.csv"}, `^undercool: .*no-rate.csv: no rate-like column; accepted: diffusivity, rate_constant, rate, time, viscosity, value`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/two-rates.csv"}, `two rate-like columns \(diffusivity_m2_per_s and time_s\)`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/zero.csv"}, `^undercool: .*zero.csv:4: column "diffusivity_m2_per_s": 0 must be positive to take its logarithm$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/one-row.csv"}, `^undercool: .*one-row.csv: 1 data rows; a fit of 2 parameters needs at least 2$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/same-t.csv"}, `^undercool: .*same-t.csv: all temperatures are the same`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/not-csv.csv"}, `^undercool: .*not-csv.csv:3: not valid CSV`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/text-value.csv"}, `^undercool: .*text-value.csv:2: column "diffusivity_m2_per_s": "fast" is not a finite number$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/absolute-zero.csv"}, `^undercool: .*absolute-zero.csv:2: column "temperature_c": 0 K is at or below absolute zero$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/weights.csv", "--weights"}, `^undercool: .*weights.csv:3: column "weight": -1 must be positive$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/zero.csv", "--weights"}, `^undercool: --weights: .*zero.csv has no weight column$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/times.csv", "--card-out", "$WORK/x.toml"}, `^undercool: --card-out: a card holds an Arrhenius diffusivity \(d0, q\); .*times.csv has a time_s column$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/zero.csv", "--card-out", "$WORK/x.txt"}, `^undercool: --card-out: ".*x.txt" must end in .toml$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/zero.csv", "--kind", "rock"}, `^undercool: --kind: "rock" is not one of metal, glass, molecular, solution, demo$`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/zero.csv", "--format", "yaml"}, `^undercool: --format: "yaml" is not one of`, 2},
	{"fit", []string{"fit", "avrami", "$WORK/fraction-high.csv"}, `^undercool: .*fraction-high.csv:3: column "fraction": 1.2 lies outside \[0, 1\]`, 2},
	{"fit", []string{"fit", "avrami", "$WORK/fraction-edges.csv"}, `^undercool: .*fraction-edges.csv: an Avrami fit needs at least 2 points with 0 < fraction < 1, got 1$`, 2},
	{"fit", []string{"fit", "avrami", "$WORK/fraction-edges.csv", "--material", "demo-alloy"}, `^undercool: --material: fit avrami uses no material; give only the data file$`, 2},
	{"fit", []string{"fit", "avrami", "$WORK/fraction-edges.csv", "--card-out", "$WORK/x.toml"}, `^undercool: --card-out: a material card has no place for the Avrami n and k`, 2},
	// fit kissinger and fit ozawa: peaks of heating scans, fractions at a temperature.
	{"fit", []string{"fit", "kissinger", "$WORK/peaks-negative-rate.csv"}, `^undercool: .*peaks-negative-rate.csv:3: column "heating_rate_k_per_min": -0.166667 must be positive \(a heating rate\)$`, 2},
	{"fit", []string{"fit", "kissinger", "$WORK/peaks-same-t.csv"}, `^undercool: .*peaks-same-t.csv: every peak lies at the same temperature: no energy can be fitted$`, 2},
	{"fit", []string{"fit", "kissinger", "$WORK/peaks-falling.csv"}, `^undercool: .*peaks-falling.csv: the peaks do not move to higher temperatures at faster heating \(fitted energy -\d.*kJ/mol\): no activation energy fits$`, 2},
	{"fit", []string{"fit", "ozawa", "$WORK/peaks-falling.csv"}, `^undercool: .*peaks-falling.csv: the peaks do not move to higher temperatures at faster heating`, 2},
	{"fit", []string{"fit", "kissinger", "$WORK/peaks-zero-t.csv"}, `^undercool: .*peaks-zero-t.csv:3: column "peak_temperature_c": 0 K is at or below absolute zero$`, 2},
	{"fit", []string{"fit", "kissinger", "$WORK/peaks-no-peak.csv"}, `^undercool: .*peaks-no-peak.csv:1: unknown column "temperature_k"; accepted: heating_rate_UNIT`, 2},
	{"fit", []string{"fit", "kissinger", "$WORK/peaks-bad-unit.csv"}, `^undercool: .*peaks-bad-unit.csv:1: column "heating_rate_k_per_kg": unit "k/kg" is not a unit of heating rate`, 2},
	{"fit", []string{"fit", "kissinger", "$WORK/peaks-same-t.csv", "--material", "demo-alloy"}, `^undercool: --material: fit kissinger uses no material; give only the data file$`, 2},
	{"fit", []string{"fit", "ozawa", "$WORK/peaks-same-t.csv", "--card-out", "$WORK/x.toml"}, `^undercool: --card-out: a material card has no place for an apparent activation energy of DSC peaks or Ozawa's exponent`, 2},
	{"fit", []string{"fit", "ozawa", "$WORK/ozawa-both.csv"}, `^undercool: .*ozawa-both.csv: a peak_temperature column with temperature or fraction columns; give the peaks`, 2},
	{"fit", []string{"fit", "ozawa", "$WORK/ozawa-nothing.csv"}, `^undercool: .*ozawa-nothing.csv: give peak_temperature_UNIT \(for the activation energy\) or temperature_UNIT and fraction \(for the exponent\) beside heating_rate_k_per_min$`, 2},
	{"fit", []string{"fit", "ozawa", "$WORK/ozawa-edges.csv"}, `^undercool: .*ozawa-edges.csv: no temperature has two heating rates with 0 < fraction < 1 to fit \(500 K: an Ozawa fit needs at least 2 points with 0 < fraction < 1, got 1; 510 K: .*got 0\)$`, 2},
	{"fit", []string{"fit", "ozawa", "$WORK/ozawa-high.csv"}, `^undercool: .*ozawa-high.csv:3: column "fraction": 1.5 lies outside \[0, 1\]`, 2},
	{"fit", []string{"fit", "avrami", "$WORK/negative-time.csv"}, `^undercool: .*negative-time.csv:2: time must be positive and finite`, 2},
	{"fit", []string{"fit", "interface", "$WORK/rates.csv"}, `^undercool: fit interface: give the material with --material`, 2},
	{"fit", []string{"fit", "interface", "$WORK/rates.csv", "--material", "demo-alloy", "--mobility", "none"}, `^undercool: fit interface: the material has no rate`, 2},
	{"fit", []string{"fit", "interface", "$WORK/rates-above-te.csv", "--material", "demo-alloy", "--card-out", "$WORK/x.toml"}, `^undercool: .*rates-above-te.csv:3: 1200 K is at or above the equilibrium temperature 1150 K: no driving force, no nucleation$`, 2},
	{"fit", []string{"fit", "interface", "$WORK/rates.csv", "--material", "demo-alloy", "--gamma", "nan"}, `^undercool: --gamma: "nan" is not a number`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy"}, `^undercool: --at: required: the hold temperature`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "-5K"}, `^undercool: --at: "-5K" is at or below absolute zero$`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "0"}, `^undercool: --at: "0" is at or below absolute zero \(a bare number is kelvin; write 0C for Celsius\)$`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "-300C"}, `^undercool: --at: "-300C" is at or below absolute zero$`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "warm"}, `^undercool: --at: `, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "nan"}, `^undercool: --at: `, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "inf"}, `^undercool: --at: `, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "800K", "--fraction", "0"}, `^undercool: --fraction: "0" is not a number strictly between 0 and 1$`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "800K", "--fraction", "1e3"}, `^undercool: --fraction: "1e3"`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "800K", "--fraction", "0.1,0.5"}, `^undercool: --fraction: give one fraction strictly between 0 and 1`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "800K", "--nuclei", "1e15", "--lag"}, `^undercool: --lag and --nuclei: `, 2},
	{"hold", []string{"hold", "--te", "1000", "--dh", "10kJ/mol", "--vm", "7cm3/mol", "--gamma", "0.1J/m2", "--at", "900"}, `^undercool: the material has no mobility law`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "800K", "extra"}, `^undercool: hold: unexpected argument "extra"$`, 2},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "25"}, `^undercool: note: --at: read as 25 K \(-248\.15 °C\); write 25C for Celsius$`, 0},
	{"rate", []string{"frobnicate"}, `^undercool: unknown command "frobnicate"`, 2},
	{"rate", []string{"rate", "--bogus"}, `^undercool: rate: unknown flag: --bogus`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--gamma", "abc"}, `^undercool: --gamma: "abc" is not a number`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--gamma", "nan"}, `^undercool: --gamma: "nan" is not a number`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--te", "Inf"}, `^undercool: --te: "Inf" is not a number`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--vm", "6kg"}, `^undercool: --vm: unit "kg" in "6kg" is not a unit of molar volume`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--vm", "6"}, `^undercool: --vm: "6" needs a unit of molar volume`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--te", "-5"}, `^undercool: --te: "-5" must be positive`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--gamma", "0J/m2"}, `^undercool: --gamma: "0J/m2" must be positive`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--d0", "-1m2/s"}, `^undercool: --d0: "-1m2/s" must be positive`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--theta", "190"}, `^undercool: --theta: "190" must lie in \(0, 180\] degrees`, 2},
	{"rate", []string{"rate", "--material", "nosuch"}, `^undercool: --material: unknown material "nosuch"`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--prefactor", "turnbull-fisher", "--mobility", "vft"}, `turnbull-fisher needs an arrhenius mobility law`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--temps", "0K"}, `^undercool: --temps: "0K" is at or below absolute zero`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--format", "yaml"}, `^undercool: --format: "yaml" is not one of table, csv, json, markdown`, 2},
	{"rate", []string{"rate", "--te", "1000", "--vm", "7cm3/mol", "--gamma", "0.1J/m2"}, `missing value "dh"`, 2},
	{"rate", []string{"rate", "--material", "$WORK/standing-no-error.toml"}, `^undercool: --material: .*standing-no-error.toml: \[standing\] checked rows need error, the rms error of the checked rows`, 2},
	{"rate", []string{"rate", "--material", "$WORK/standing-bad-row.toml"}, `^undercool: --material: .*standing-bad-row.toml: \[standing\] calibrated: "rows.csv" is not a measured row FILE:LINE$`, 2},
	{"rate", []string{"rate", "--material", "$WORK/growth-table-missing.toml"}, `^undercool: --material: .*growth-table-missing.toml:4: growth "table" and growth_table = "FILE.csv" go together$`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--theta", "60", "--particle-density", "1e18", "--temps", "900K"}, `^undercool: preset demo-alloy: missing value "particle_radius" \(the radius of the substrate particles, with particle_density\); give it in the card or with --particle-radius$`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--theta", "60", "--particle-density", "1e18", "--particle-radius", "1um", "--sites", "1e20", "--temps", "900K"}, `^undercool: preset demo-alloy: sites 1e20 and particle_density, particle_radius both give the site density; give one or the other$`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--particle-radius", "-1um"}, `^undercool: --particle-radius: "-1um" must be positive$`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--gamma-law", "linear"}, `^undercool: preset demo-alloy: missing value "gamma_t_ref" \(the temperature gamma is given at, for gamma_law linear\); give it in the card or with --gamma-t-ref$`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--gamma-law", "wavy"}, `^undercool: --gamma-law: "wavy" is not one of constant, linear, negentropic$`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--growth", "fast"}, `^undercool: --growth: "fast" is not one of normal, viscosity-power, arrhenius, or a FILE.csv$`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--growth", "viscosity-power"}, `^undercool: preset demo-alloy: the viscosity-power growth law needs a viscosity law \(vft or wlf\) and a glass transition Tg$`, 2},
	{"rate", []string{"rate", "--material", "demo-alloy", "--glass-q", "100kJ/mol"}, `^undercool: preset demo-alloy: GlassQ, the activation energy of the glass below Tg, needs a viscosity law`, 2},
	{"rate", []string{"rate", "--material", "lithium-disilicate", "--temps", "40K"}, `^undercool: --gamma-slope: the interfacial energy .* is zero at 51\.87 K and not positive on that side of it, at the temperature asked for \(40 K\)$`, 2},
	{"fit", []string{"fit", "growth", "$WORK/zero.csv"}, `^undercool: fit growth: give the material with --material`, 2},
	{"fit", []string{"fit", "arrhenius", "$WORK/zero.csv", "--keep-prefactor"}, `^undercool: --keep-prefactor: only fit interface holds a prefactor$`, 2},
	{"rate", []string{"rate", "--material", "$WORK/unknown-key.toml"}, `unknown-key.toml:6: key "colour": unknown value \(allowed: te, dh`, 2},
	{"rate", []string{"rate", "--material", "$WORK/bad-unit.toml"}, `bad-unit.toml:6: key "vm": unit "kg"`, 2},
	{"rate", []string{"rate", "--material", "$WORK/no-source.toml"}, `no-source.toml:6: key "te": missing source`, 2},
	{"rate", []string{"rate", "--material", "$WORK/not-finite.toml"}, `not-finite.toml:6: key "gamma": .*not a number`, 2},
	{"rate", []string{"rate", "--material", "$WORK/missing.toml"}, `cannot read material card`, 2},
	{"report", []string{"report", "--material", "demo-alloy"}, `^undercool: --out: required: the memo file`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "nosuchdir/memo.md"}, `^undercool: --out: cannot write nosuchdir/memo.md: directory nosuchdir: no such file or directory$`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "adir"}, `^undercool: --out: cannot write adir: it is a directory$`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--format", "json"}, `^undercool: --format: does not apply to report`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--date", "15/01/2026"}, `^undercool: --date: "15/01/2026" is not a date YYYY-MM-DD$`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--spread", "colour=2%"}, `^undercool: --spread: unknown parameter "colour" \(known: te, dh,`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--spread", "gamma=-1%"}, `^undercool: --spread: gamma: "-1%": a standard deviation must not be negative$`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--spread", "gamma=1%", "--samples", "0"}, `^undercool: --samples: 0: give at least 1 sample`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--plot", "p.png"}, `^undercool: --plot: "p.png": the memo's plot is an SVG file`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--at", "-5K"}, `^undercool: --at: "-5K" is at or below absolute zero`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--fraction", "2"}, `^undercool: --fraction: "2" is not a number strictly between 0 and 1`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--spread", "vft_b=1%"}, `^undercool: --spread: vft_b: the material has no such value`, 2},
	{"report", []string{"report", "--te", "1000", "--dh", "10kJ/mol", "--vm", "7cm3/mol", "--gamma", "0.1J/m2", "--out", "memo.md"}, `no mobility law`, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--curve", "nosuch.csv"}, `^undercool: --curve: `, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "--volume", "-1mm3"}, `^undercool: --volume: `, 2},
	{"report", []string{"report", "--material", "demo-alloy", "--out", "memo.md", "extra"}, `^undercool: report: unexpected argument "extra"$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--supersaturation", "-2"}, `^undercool: --supersaturation: "-2" must be positive$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--supersaturation", "two"}, `^undercool: --supersaturation: "two" is not a number$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--supersaturation", "NaN"}, `^undercool: --supersaturation: "NaN" is not a number$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/sol.csv", "--conc", "-5g/kg"}, `^undercool: --conc: "-5g/kg" must be positive$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/sol.csv", "--conc", "five"}, `^undercool: --conc: "five" is not a number$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--dh-sol", "-3kJ/mol"}, `^undercool: --dh-sol: "-3kJ/mol" must be positive$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/nonnum.csv", "--conc", "12g/kg"}, `nonnum.csv:3: column "solubility_g_per_kg": "abc" is not a finite number$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/neg.csv", "--conc", "12g/kg"}, `neg.csv:3: the solubility must be positive$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/nonmono.csv", "--conc", "12g/kg"}, `nonmono.csv:4: the solubility does not rise with temperature here`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/backwards.csv", "--conc", "12g/kg"}, `backwards.csv:4: temperatures must be strictly monotonic$`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/sol.csv", "--conc", "0.1mol/l"}, `conc 0.1mol/l is a molar concentration but the solubility table .*sol.csv is a mass ratio`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/sol.csv", "--conc", "30g/kg"}, `conc 30g/kg lies outside the solubilities of .*sol.csv \(0.01 to 0.022 kg/kg\)`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/badunit.csv", "--conc", "12g/kg"}, `badunit.csv: the solubility column must be solubility_UNIT`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--solubility", "$WORK/missing.csv", "--conc", "12g/kg"}, `^undercool: cannot read .*missing.csv`, 2},
	{"solution", []string{"rate", "--driving", "solution", "--gamma", "5mJ/m2", "--vm", "100cm3/mol", "--temps", "20C"}, `driving "solution" needs a supersaturation`, 2},
	{"solution", []string{"rate", "--gamma", "5mJ/m2", "--molar-mass", "168g/mol", "--sat-temp", "40C", "--dh-sol", "28kJ/mol", "--temps", "20C"}, `missing value "vm" \(molar volume \(or molar_mass and density\)\)`, 2},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--temps", "20C", "--prefactor", "diffusion", "--solute-diffusivity", "1e-9m2/s"}, `the diffusion prefactor needs the number of solute molecules per volume`, 2},
	{"solution", []string{"hold", "--material", "$WORK/demo-solute-a.toml", "--at", "20C", "--volume", "0mL"}, `^undercool: --volume: "0mL" must be positive$`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "colour=2%"}, `^undercool: --spread: unknown parameter "colour" \(known: te, dh, dcp, vm, gamma, theta, sites, particle_density, particle_radius, j0, d0, q,`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=-2%"}, `^undercool: --spread: gamma: "-2%": a standard deviation must not be negative$`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "q=-3kJ/mol"}, `^undercool: --spread: q: "-3kJ/mol": a standard deviation must not be negative$`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=abc"}, `^undercool: --spread: gamma: "abc" is not a number`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=nan%"}, `^undercool: --spread: gamma: "nan%" is not a finite number$`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=0.002"}, `^undercool: --spread: gamma: "0.002" needs a unit of interfacial energy`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma"}, `^undercool: --spread: "gamma" is not NAME=VALUE`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=x2"}, `^undercool: --spread: gamma: a factor spread \(x2\) is only for the log-normal parameters`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=2%", "--spread", "gamma=3%"}, `^undercool: --spread: gamma is given twice$`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "vft-a=0.1"}, `^undercool: --spread: vft_a: the material has no such value \(mobility arrhenius, not vft\)$`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=2%", "--samples", "0"}, `^undercool: --samples: 0: give at least 1 sample`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=2%", "--samples", "-5"}, `^undercool: --samples: -5: give at least 1 sample`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=2%", "--samples", "5000000"}, `^undercool: --samples: 5000000 is more than the 1000000 allowed`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=2%", "--samples", "many"}, `^undercool: rate: invalid argument "many" for "--samples"`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=2%", "--seed", "-1"}, `^undercool: rate: invalid argument "-1" for "--seed"`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--samples", "100"}, `^undercool: --samples and --seed need a spread`, 2},
	{"spread", []string{"rate", "--material", "demo-alloy", "--spread", "gamma=2%", "--samples", "1000000", "--range", "1100:700:1"}, `^undercool: --samples: 1000000 samples of 401 results is more than 50000000 evaluations`, 2},
	{"spread", []string{"rate", "--material", "$WORK/bad-spread.toml"}, `bad-spread.toml:8: \[spread\] key "gamma": "-1%": a standard deviation must not be negative`, 2},
	{"spread", []string{"rate", "--material", "$WORK/unknown-spread.toml"}, `unknown-spread.toml:8: \[spread\] key "colour": unknown parameter \(allowed: te, dh,`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--fraction", "0"}, `^undercool: --fraction: "0" is not a number strictly between 0 and 1$`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--fraction", "1"}, `^undercool: --fraction: "1" is not a number strictly between 0 and 1$`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--fraction", "1.5"}, `^undercool: --fraction: "1.5"`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--fraction", "-0.1"}, `^undercool: --fraction: "-0.1"`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--fraction", "half"}, `^undercool: --fraction: "half" is not a number`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--fraction", "nan"}, `^undercool: --fraction: "nan"`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--fraction", "0.01,,0.5"}, `^undercool: --fraction: "" is not a number`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--fraction", "0.01,2"}, `^undercool: --fraction: "2"`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--nuclei", "-5"}, `^undercool: --nuclei: `, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--nuclei", "lots"}, `^undercool: --nuclei: "lots" is not a number`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--nuclei", "1e15", "--lag"}, `^undercool: --lag and --nuclei: `, 2},
	{"ttt", []string{"ttt", "--te", "1000", "--dh", "10kJ/mol", "--vm", "7cm3/mol", "--gamma", "0.1J/m2"}, `^undercool: the material has no mobility law`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--plot", "out.pdf"}, `^undercool: --plot: "out.pdf": unsupported plot file type ".pdf" \(use .svg or .png\)$`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--plot", "out"}, `unsupported plot file type`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--plot", "nodir/out.svg"}, `^undercool: --plot: cannot write nodir/out.svg: directory nodir`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--plot", "sub.svg"}, `^undercool: --plot: cannot write sub.svg: it is a directory$`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--plot", ".svg"}, `has no file name`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--range", "1300:1200", "--plot", "hot.svg"}, `^undercool: --plot: nothing to draw`, 1},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "extra"}, `^undercool: ttt: unexpected argument "extra"$`, 2},
	{"ttt", []string{"ttt", "--material", "demo-alloy", "--range", "900"}, `^undercool: --range: `, 2},
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "0.5K/min", "--volume", "100mL", "--end", "50C"}, `^undercool: --end: 50C is not below the saturation temperature 313\.15 K \(40\.00 °C\)`, 2},
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "0.5K/min", "--volume", "100mL", "--sat-temp", "10C", "--end", "20C"}, `^undercool: --end: 20C is not below the saturation temperature 283\.15 K`, 2},
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "0.5K/min"}, `^undercool: --volume: required for a cooled solution`, 2},
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "0.5K/min", "--volume", "1mL", "--supersaturation", "2"}, `^undercool: cool: a fixed supersaturation does not change on cooling`, 2},
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "0.5K/min", "--volume", "100mL", "--solubility", "$WORK/sol.csv", "--conc", "22g/kg", "--end", "0C"}, `^undercool: --end: 0C is below the solubility table .*sol.csv, which starts at 283\.15 K$`, 2},
	{"solution_cool", []string{"cool", "--material", "paracetamol-acetone-water", "--rate", "0.5K/min", "--volume", "100mL"}, `^undercool: the material has no nucleation rate, so no metastable zone`, 2},
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "-1K/min", "--volume", "100mL"}, `^undercool: --rate: "-1K/min" must be positive`, 2},
	{"solution_fit", []string{"fit", "induction", "$WORK/s-one.csv", "--vm", "120cm3/mol"}, `^undercool: .*s-one.csv:3: supersaturation must be above 1`, 2},
	{"solution_fit", []string{"fit", "induction", "$WORK/negtime.csv", "--vm", "120cm3/mol"}, `^undercool: .*negtime.csv:2: induction time must be positive`, 2},
	{"solution_fit", []string{"fit", "induction", "$WORK/badS.csv", "--vm", "120cm3/mol"}, `^undercool: .*badS.csv:2: column "supersaturation": "high" is not a finite number`, 2},
	{"solution_fit", []string{"fit", "induction", "$WORK/exact.csv"}, `^undercool: fit induction: give the molar volume of the crystal`, 2},
	{"solution_fit", []string{"fit", "induction", "$WORK/exact.csv", "--vm", "120cm3/mol", "--volume", "-1mL"}, `^undercool: --volume: "-1mL" must be positive$`, 2},
	{"solution_fit", []string{"fit", "induction", "$WORK/exact.csv", "--vm", "120cm3/mol", "--card-out", "$WORK/x.toml"}, `^undercool: --card-out: the card needs the prefactor A, so give --volume$`, 2},
	{"solution_fit", []string{"fit", "induction", "$WORK/wrongway.csv", "--vm", "120cm3/mol"}, `do not grow as the supersaturation falls`, 2},
	{"solution_hold", []string{"hold", "--material", "paracetamol-acetone-water", "--at", "20C", "--volume", "100mL"}, `^undercool: the material has no nucleation rate, so no induction time`, 2},
	{"solution_hold", []string{"hold", "--material", "$WORK/demo-solute-a.toml", "--at", "25C", "--volume", "-5mL"}, `^undercool: --volume: "-5mL" must be positive$`, 2},
	{"solution_hold", []string{"hold", "--material", "$WORK/demo-solute-a.toml", "--at", "25C", "--volume", "1mL", "--lag"}, `^undercool: --lag and --volume: `, 2},
	{"solution_hold", []string{"hold", "--material", "$WORK/demo-solute-a.toml", "--at", "25C", "--volume", "lots"}, `^undercool: --volume: "lots" is not a number`, 2},
	{"spread_cool", []string{"cool", "--material", "demo-alloy", "--critical", "--spread", "colour=1%"}, `^undercool: --spread: unknown parameter "colour"`, 2},
	{"spread_cool", []string{"cool", "--material", "demo-alloy", "--critical", "--spread", "gamma=2%", "--samples", "2000000"}, `^undercool: --samples: 2000000 is more than the 1000000 allowed`, 2},
	{"spread_ttt", []string{"ttt", "--material", "demo-alloy", "--spread", "gamma=2%", "--samples", "0"}, `^undercool: --samples: 0: give at least 1 sample`, 2},
	{"spread_ttt", []string{"hold", "--material", "demo-alloy", "--at", "900K", "--spread", "wlf_c1=1"}, `^undercool: --spread: wlf_c1: the material has no such value \(mobility arrhenius, not wlf\)$`, 2},
	{"rate_table", []string{"rate", "--material", "demo-alloy", "--driving", "$WORK/bad.csv", "--temps", "950K"}, `^undercool: .*bad.csv:3: column "dg_j_per_mol": "x" is not a finite number$`, 2},
	{"rate_table", []string{"rate", "--material", "demo-alloy", "--driving", "$WORK/none.csv", "--temps", "950"}, `^undercool: .*cannot read .*none.csv`, 2},
	{"fit_plot", []string{"fit", "arrhenius", "$REPO/testdata/fit/diffusion.csv", "--plot", "$WORK/arrhenius.pdf"}, `^undercool: --plot: ".*arrhenius.pdf": unsupported plot file type ".pdf" \(use .svg or .png\)$`, 2},
	{"fit_plot", []string{"fit", "arrhenius", "$WORK/bad.csv", "--plot", "$WORK/bad.svg"}, `bad.csv:2: column "diffusivity_m2_per_s": -1 must be positive`, 2},
	{"ttt_plot", []string{"rate", "--material", "demo-alloy", "--plot", "rate.jpg"}, `^undercool: --plot: "rate.jpg": unsupported plot file type ".jpg" \(use .svg or .png\)$`, 2},
	{"ttt_plot", []string{"rate", "--material", "demo-alloy", "--temps", "900", "--plot", "one.svg"}, `^undercool: --plot: a rate plot needs more than one temperature`, 2},
	// A mobility far outside its range: with wlf_c1 = 1000 the growth rate
	// passes 1e300 m/s and the sums leave the float64 range. (With 200 the
	// path integral, which carries its sums scaled, now gives finite answers
	// where the earlier one overflowed to NaN.)
	{"cool", []string{"cool", "--material", "sucrose", "--wlf-c1", "1000", "--curve", "$REPO/testdata/curves/demo-quench.csv"}, `^undercool: cool: the quench factor overflows`, 1},
	// a bare temperature that causes an error is named inside it
	{"heat", []string{"heat", "--material", "lithium-disilicate", "--from", "20", "--rate", "1K/s"}, `^undercool: --gamma-slope: .* \(note: --from: read as 20 K \(-253\.15 °C\); write 20C for Celsius\)$`, 2},
	{"cool", []string{"cool", "--material", "sucrose", "--wlf-c1", "1000", "--curve", "$REPO/testdata/curves/demo-plate-quench.csv"}, `^undercool: cool: the quench factor overflows`, 1},
	{"cool", []string{"cool", "--material", "sucrose", "--wlf-c1", "1000", "--rate", "1K/s", "--format", "json"}, `^undercool: cool: the critical cooling rate came out \+Inf: the computation left the range of floating-point numbers`, 1},
	{"cool", []string{"cool", "--material", "sucrose", "--wlf-c1", "1000", "--critical"}, `^undercool: cool: the critical cooling rate came out \+Inf`, 1},
	{"report", []string{"report", "--material", "sucrose", "--wlf-c1", "1000", "--out", "memo.md"}, `^undercool: report: the critical cooling rate came out \+Inf`, 1},
	{"fit", []string{"fit", "arrhenius", "$WORK/extreme-t.csv"}, `^undercool: fit: the activation energy Q came out NaN`, 1},
	{"fit", []string{"fit", "arrhenius", "$WORK/extreme-t.csv", "--format", "json"}, `^undercool: fit: the activation energy Q came out NaN`, 1},
	{"limits", []string{"hold", "--material", "/dev/zero", "--at", "300K"}, `^undercool: --material: /dev/zero: larger than the 4 MiB a card may be$`, 2},
	{"limits", []string{"cool", "--material", "demo-alloy", "--curve", "/dev/zero"}, `^undercool: --curve: /dev/zero:1: a line longer than the 64 KiB a line of a data file may be$`, 2},
	{"limits", []string{"fit", "avrami", "/dev/zero"}, `^undercool: /dev/zero:1: a line longer than the 64 KiB a line of a data file may be$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc"}, `^undercool: evolve: give the thermal history: --schedule `, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--curve", "$WORK/age.csv"}, `^undercool: --schedule and --curve: give one thermal history$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "start at 640C; hold 1x"}, `^undercool: --schedule: schedule step 2 "hold 1x": unit "x" in "1x" is not a unit of time`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "start at 640C; soak 1h"}, `^undercool: --schedule: schedule step 2 "soak 1h": unknown step "soak"; a step is one of: start at TEMP; hold DURATION \[at TEMP\]; cool to TEMP at RATE\|in DURATION; heat to TEMP at RATE\|in DURATION; jump to TEMP$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "start at 20C; cool to 300C at 1K/s"}, `^undercool: --schedule: schedule step 2 "cool to 300C at 1K/s": cool to 573.15 K: the target must lie below the current 293.15 K$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h"}, `^undercool: --schedule: schedule step 1 "hold 1h": the schedule must first say where it starts`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "start at 640C; cool to 20C at 50"}, `^undercool: --schedule: schedule step 2 "cool to 20C at 50": "50" needs a unit of cooling rate`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "start at 300C; hold 1h at 400C"}, `^undercool: --schedule: schedule step 2 "hold 1h at 400C": the schedule is at 573.15 K here, not 673.15 K: write 'jump to 400C'`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "# nothing"}, `^undercool: --schedule: the schedule has no duration`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "@$WORK/bad.sched"}, `^undercool: --schedule: .*bad.sched:3: step 2 "hold 1x": unit "x" in "1x" is not a unit of time`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "@$WORK/nosuch.sched"}, `^undercool: --schedule: cannot read the schedule file .*nosuch.sched: no such file or directory$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--curve", "$WORK/nosuch.csv"}, `^undercool: --curve: cannot read .*nosuch.csv`, 2},
	{"evolve", []string{"evolve", "--material", "demo-alloy", "--schedule", "hold 1h at 500C"}, `^undercool: preset demo-alloy: evolve follows a precipitating alloy \(driving dilute, with c0, cp, solvus_a and solvus_b\) or a crystallizing solution`, 2},
	{"evolve", []string{"evolve", "--driving", "dilute", "--cp", "0.25", "--solvus-a", "1", "--solvus-b", "7000K", "--vm", "10cm3/mol", "--gamma", "0.1J/m2",
		"--d0", "1e-4m2/s", "--q", "150kJ/mol", "--schedule", "hold 1h at 500C"}, `^undercool: command line: missing value "c0" \(solute mole fraction of the alloy, for driving dilute\); give it in the card or with --c0$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--c0", "0.5", "--schedule", "hold 1h at 300C"}, `^undercool: preset al-sc: c0 0.5 must lie below cp 0.25`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--c0", "2", "--schedule", "hold 1h at 300C"}, `^undercool: --c0: "2" must lie in \(0, 1\] as a mole fraction$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--c0", "0.2wt%", "--schedule", "hold 1h at 300C"}, `^undercool: --c0: unit "wt%" in "0.2wt%" is not a unit of mole fraction \(use at%, mol%, ppm\)$`, 2},
	{"evolve", []string{"evolve", "--material", "paracetamol-acetone-water", "--schedule", "start at 30C; cool to 5C at 1K/min"}, `^undercool: preset paracetamol-acetone-water: missing value "conc" .*; give it in the card or with --conc$`, 2},
	{"evolve", []string{"evolve", "--material", "paracetamol-ethanol", "--seed-mass", "5g/L", "--schedule", "start at 30C; cool to 5C at 1K/min"}, `^undercool: preset paracetamol-ethanol: missing value "seed_size" .*; give it in the card or with --seed-size$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--times", "2h"}, `^undercool: --times: 2.00 h is outside the schedule, which lasts 1.00 h$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--times", "10min,5min"}, `^undercool: --times: the times must increase: 5.00 min comes after 10.0 min$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--times", "-5min"}, `^undercool: --times: "-5min": a time must not be negative$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--times", "1h", "--rows", "5"}, `^undercool: --times and --rows: give one or the other$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--classes", "5"}, `^undercool: --classes: 5 is outside 16 to 100000$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--rows", "many"}, `^undercool: --rows: "many" is not a whole number$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--tol", "0.7"}, `^undercool: --tol: "0.7" must lie strictly between 0 and 0.5$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--tol", "nan"}, `^undercool: --tol: "nan" is not a number$`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--plot", "$WORK/e.pdf"}, `^undercool: --plot: ".*e.pdf": unsupported plot file type ".pdf"`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "--plot", "$WORK/e.svg", "--dist-plot", "$WORK/e.svg"}, `^undercool: --dist-plot: cannot write .*e.svg: the same file is already an output`, 2},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 700C", "--plot", "$WORK/t.svg", "--dist-plot", "$WORK/d.svg"}, `^undercool: --dist-plot: no particles at the end of the schedule: no distribution to draw$`, 1},
	{"evolve", []string{"evolve", "--material", "al-sc", "--schedule", "hold 1h at 300C", "extra"}, `^undercool: evolve: unexpected argument "extra"$`, 2},
	// --columns names columns by their keys, for a table.
	{"rate_table", []string{"rate", "--material", "demo-alloy", "--temps", "900K", "--columns", "temperature_k,rate"}, `^undercool: --columns: "rate" is not a column of this table; its columns are temperature_k, temperature_c, undercooling_k, `, 2},
	{"rate_table", []string{"rate", "--material", "demo-alloy", "--temps", "900K", "--columns", "temperature_k", "--format", "json"}, `^undercool: --columns: JSON holds every value; choose columns for --format table, csv or markdown$`, 2},
	{"rate_table", []string{"rate", "--material", "demo-alloy", "--temps", "900K", "--columns", "temperature_k,,x"}, `^undercool: --columns: "temperature_k,,x": give column keys separated by commas`, 2},
	{"rate_table", []string{"hold", "--material", "demo-alloy", "--at", "900K", "--columns", "time_s"}, `^undercool: --columns: this answer has no table to choose columns of$`, 2},
	{"fit_plot", []string{"fit", "arrhenius", "$REPO/testdata/fit/diffusion.csv", "--columns", "nope", "--plot", "$WORK/a.svg", "--card-out", "$WORK/a.toml"}, `^undercool: --columns: "nope" is not a column of this table`, 2},
	// Spreadsheet CSV: a decimal comma in a comma-separated file is named;
	// a plain number with a unit says it takes none.
	{"csv", []string{"fit", "avrami", "$WORK/decimal-comma.csv"}, `^undercool: .*decimal-comma.csv:3: 3 fields, header has 2 \(a decimal comma\? write 1\.5, not 1,5, or separate the columns with semicolons\)$`, 2},
	{"csv", []string{"fit", "avrami", "$WORK/weight-unit.csv"}, `^undercool: .*weight-unit.csv:1: column "weight_kg": unit "kg" is not a unit of number \(it is a plain number: name the column weight, without a unit\)$`, 2},
	// A fixed supersaturation without a saturation temperature: only what needs one asks for it.
	{"solution", []string{"rate", "--supersaturation", "2", "--vm", "120cm3/mol", "--gamma", "5mJ/m2", "--prefactor", "fixed", "--j0", "1e20"}, `^undercool: --temps: a fixed supersaturation without a saturation temperature has no default temperatures: give them with --temps or --range \(or give --sat-temp\)$`, 2},
	{"solution", []string{"cool", "--supersaturation", "2", "--vm", "120cm3/mol", "--gamma", "5mJ/m2", "--prefactor", "fixed", "--j0", "1e20", "--growth-rate", "1um/s", "--rate", "1K/s"}, `^undercool: cool: a fixed supersaturation without a saturation temperature has no temperature for linear cooling`, 2},
	{"solution", []string{"cool", "--supersaturation", "2", "--vm", "120cm3/mol", "--gamma", "5mJ/m2", "--prefactor", "fixed", "--j0", "1e20", "--growth-rate", "1um/s", "--curve", "$REPO/testdata/curves/demo-quench.csv"}, `^undercool: --curve: a fixed supersaturation without a saturation temperature has no TTT curve`, 2},
	{"solution", []string{"report", "--supersaturation", "2", "--vm", "120cm3/mol", "--gamma", "5mJ/m2", "--prefactor", "fixed", "--j0", "1e20", "--growth-rate", "1um/s", "--out", "-"}, `^undercool: report: a fixed supersaturation without a saturation temperature has no temperature range`, 2},
}

// caseFiles writes the files of the in-process cases (testdata/cases) to
// a temporary folder and returns it with the repository's root.
func caseFiles(t *testing.T) (root, repo string) {
	t.Helper()
	root = t.TempDir()
	a, err := txtar.ParseFile("../../testdata/cases/files.txtar")
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range a.Files {
		p := filepath.Join(root, f.Name)
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, f.Data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	if repo, err = filepath.Abs(repoRoot()); err != nil {
		t.Fatal(err)
	}
	return root, repo
}

// runCase runs a case in-process in the folder dir of root, with $WORK
// (that folder) and $REPO in its arguments.
func runCase(t *testing.T, root, repo, dir string, args []string) (code int, stdout, stderr string) {
	t.Helper()
	d := filepath.Join(root, dir)
	if err := os.MkdirAll(d, 0o755); err != nil {
		t.Fatal(err)
	}
	t.Chdir(d)
	r := strings.NewReplacer("$WORK", d, "$REPO", repo)
	full := make([]string, len(args))
	for i, a := range args {
		full[i] = r.Replace(a)
	}
	var out, errOut bytes.Buffer
	code = run(full, strings.NewReader(""), &out, &errOut)
	return code, out.String(), errOut.String()
}

func TestErrors(t *testing.T) {
	root, repo := caseFiles(t)
	for _, c := range errorCases {
		dir := filepath.Join(root, c.dir)
		if err := os.MkdirAll(dir, 0o755); err != nil {
			t.Fatal(err)
		}
		before := listDir(t, dir)
		code, stdout, stderr := runCase(t, root, repo, c.dir, c.args)
		name := strings.Join(c.args, " ")
		if code != c.code {
			t.Errorf("%s: exit %d, want %d (stderr %q)", name, code, c.code, stderr)
		}
		if !regexp.MustCompile("(?m)" + c.want).MatchString(stderr) {
			t.Errorf("%s: stderr %q does not match %q", name, stderr, c.want)
		}
		if strings.Contains(stderr, "(use )") {
			t.Errorf("%s: stderr %q offers an empty list of units", name, stderr)
		}
		if c.code == 0 {
			continue
		}
		if strings.Count(stderr, "\n") != 1 || stdout != "" {
			t.Errorf("%s: not one line on stderr and nothing on stdout: stderr %q, stdout %q", name, stderr, stdout)
		}
		if after := listDir(t, dir); !slices.Equal(before, after) {
			t.Errorf("%s: files left behind: %v, before %v", name, after, before)
		}
	}
}

// listDir lists the files below dir.
func listDir(t *testing.T, dir string) []string {
	t.Helper()
	var out []string
	err := filepath.WalkDir(dir, func(p string, d os.DirEntry, err error) error {
		if err != nil {
			return err
		}
		out = append(out, p)
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}
