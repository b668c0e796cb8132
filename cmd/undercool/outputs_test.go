package main

import (
	"regexp"
	"strings"
	"testing"
)

// check is one assertion on an output: that stdout or stderr has a line
// matching the expression, or with not, that none does.
type check struct {
	stream string // "stdout" or "stderr"
	not    bool
	re     string
}

// outputCases are runs that succeed, run in-process in the folder of their
// group in testdata/cases/files.txtar ($WORK): each must exit 0 and pass
// its checks. The values they check were worked out by hand or against
// another model where their comments in the scripts they came from said
// so; the scripts in testdata/script keep the runs that make files, read
// standard input or set the environment.
var outputCases = []struct {
	dir    string
	args   []string
	checks []check
}{
	// A measured cooling curve: the onset first, the fraction along it (the path
	// integral), the additivity sum and the verdict; the quench factor and the
	// retained property fraction only with an Evancho-Staley C-curve.
	{"cool_curve", []string{"cool", "--material", "demo-alloy", "--curve", "$REPO/testdata/curves/demo-quench.csv", "--volume", "1mm3"}, []check{{"stdout", false, `curve: .*demo-quench.csv, 403 points \(time_s, temperature_c\)`}, {"stdout", false, `fraction at the end of the curve: `}, {"stdout", false, `onset in 1e-09 m3: first nucleus expected at `}, {"stdout", false, `additivity sum, integral of dt/t_X over the curve`}, {"stdout", false, `share of the sum \(%\)`}, {"stdout", true, `retained property|exp\(k1 Q\)`}, {"stdout", false, `^verdict: stays below X = 1e-06 \(fraction at the end 5\.37e-08\)`}, {"stdout", false, `^why the two measures differ: the additivity sum reaches 1`}, {"stdout", true, `NaN|Inf`}}},
	{"cool_curve", []string{"cool", "--material", "demo-alloy", "--curve", "$REPO/testdata/curves/demo-quench.csv", "--format", "json"}, []check{{"stdout", false, `"fraction": [0-9.e+-]+,`}, {"stdout", false, `"additivity_sum": [0-9.e+-]+,`}, {"stdout", true, `"quench_factor"`}, {"stdout", true, `"retained_property_fraction"`}, {"stdout", false, `"c_curve": "ttt"`}, {"stdout", false, `"measures_agree": false`}, {"stdout", true, `NaN|Inf`}}},

	{"cool_curve", []string{"cool", "--material", "demo-alloy", "--curve", "$REPO/testdata/curves/demo-quench.csv", "--volume", "1mm3"}, []check{{"stdout", false, `(?s)^onset in 1e-09 m3: first nucleus .*^fraction at the end of the curve: 5\.371e-08`}}},
	// With a material and a C-curve: the path integral's verdict, and the retained property of the C-curve.
	{"cool_curve", []string{"cool", "--material", "demo-alloy", "--curve", "$REPO/testdata/curves/demo-quench.csv", "--c-curve", "k1=-0.00501,k2=5e-16s,k3=4000,k4=760K,k5=130kJ/mol", "--format", "json"}, []check{{"stdout", false, `"fraction": 5\.37`}, {"stdout", false, `"quench_factor": [0-9.e+-]+,`}, {"stdout", false, `"retained_property_fraction": 0\.`}, {"stdout", false, `"text": "stays below X = 1e-06`}}},
	// A small sample: the mean-field fraction reaches X before one nucleus is expected.
	{"cool_curve", []string{"cool", "--material", "demo-alloy", "--curve", "$REPO/testdata/curves/demo-quench.csv", "--volume", "1e-15m3", "--fraction", "1e-9"}, []check{{"stdout", false, `^onset in 1e-15 m3: first nucleus expected at `}, {"stdout", false, `^fewer than one nucleus: where the fraction reaches X = 1e-09 \([0-9.]+ K\) only 0\.[0-9]+ nuclei are expected in the 1e-15 m3 sample`}}},
	// Celsius numbers under a kelvin header: the curve starts far below T_e;
	// all below 250 K, the warning of fit arrhenius.
	{"cool_curve", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/celsius-as-kelvin.csv"}, []check{{"stdout", false, `^warning: the curve starts at 926\.00 K, 224\.00 K below T_e = 1150\.00 K: nothing that happened between T_e and its first point is counted`}, {"stdout", true, `below 250 K`}}},
	{"cool_curve", []string{"cool", "--material", "ice", "--curve", "$WORK/cold-as-kelvin.csv", "--format", "json"}, []check{{"stdout", false, `"key": "all_below_250_k"`}, {"stdout", false, `"key": "starts_below_te"`}, {"stdout", false, `every temperature is below 250 K; if they are degrees Celsius, name the column temperature_c`}}},
	{"cool_curve", []string{"cool", "--material", "demo-alloy", "--curve", "$REPO/testdata/curves/demo-quench.csv", "--format", "json"}, []check{{"stdout", false, `"warnings": \[\]`}}},

	// Heterogeneous nucleation: without a site density the screen says every
	// molecule is used, an upper bound, and how to give one; sites from particles.
	{"cool_curve", []string{"rate", "--material", "demo-alloy", "--theta", "60", "--temps", "900"}, []check{{"stdout", false, `heterogeneous, contact angle 60 deg, every molecule a site \(no site density given: an upper bound, by many orders of magnitude for particles or walls; give sites, or particle_density with particle_radius\)`}, {"stdout", false, `^flag default_sites: `}}},
	{"cool_curve", []string{"rate", "--material", "demo-alloy", "--theta", "60", "--particle-density", "1e18", "--particle-radius", "1um", "--temps", "900"}, []check{{"stdout", false, `heterogeneous, contact angle 60 deg, 1\.96e\+26 sites/m3 on 1e18 particles/m3 of radius 1um`}, {"stdout", true, `default_sites`}}},
	{"cool_curve", []string{"cool", "--material", "demo-alloy", "--theta", "60", "--critical", "--format", "json"}, []check{{"stdout", false, `"default_sites"`}}},

	// The quench factor alone, no material: Evancho-Staley constants.
	{"cool_curve", []string{"cool", "--curve", "$WORK/hold.csv", "--c-curve", "k1=-0.00501,k2=1e-10s,k3=4000,k4=760K,k5=130kJ/mol", "--format", "json"}, []check{{"stdout", false, `"quench_factor": 2\.00000`}, {"stdout", false, `"retained_property_fraction": 0\.99003`}, {"stdout", false, `"share_percent": 100`}, {"stdout", false, `"k4_k": 760`}}},
	{"cool_curve", []string{"cool", "--curve", "$REPO/testdata/curves/demo-plate-quench.csv", "--c-curve", "k1=-0.00501,k2=5e-16s,k3=4000,k4=760K,k5=130kJ/mol", "--band", "50K"}, []check{{"stdout", false, `quench factor Q = integral of dt/C\(T\) against the C-curve: 7\.5`}, {"stdout", false, `^verdict: retains 0\.96`}, {"stdout", false, `retained property fraction exp\(k1 Q\) = 0\.96`}, {"stdout", false, `550–500`}}},

	// The memo's heating: the critical heating rate beside the critical cooling
	// rate, the fraction at a rate, the DSC peaks and what their energy is.
	{"cool_linear", []string{"report", "--material", "lithium-disilicate", "--heat-rate", "10K/min", "--dsc", "2,10K/min", "--out", "-", "--date", "2026-12-02"}, []check{{"stdout", false, `^## Heating$`}, {"stdout", false, `^- critical heating rate to stay below X = 1e-06 at 1307\.00 K: 152 K/s`}, {"stdout", false, `^- heating/cooling ratio: `}, {"stdout", false, `^- fraction at 1307\.00 K after heating at 0\.167 K/s: `}, {"stdout", false, `^\|  *10 \|  *0\.1667 \|  *912\.88 \|  *962\.58 \|`}, {"stdout", false, `it is not the activation energy of diffusion`}, {"stdout", false, `Hot glass, furnaces`}, {"stdout", false, `--dsc 2,10K/min`}}},
	// a glass cooled slower than its critical cooling rate: no heating rate is fast enough, an answer, not a failure
	{"cool_linear", []string{"heat", "--material", "demo-alloy", "--from", "300K", "--rate", "10K/min", "--cooled-at", "1e-3K/s"}, []check{{"stdout", false, `^critical heating rate: none; the quenched-in nuclei already fill X = 1e-06 \(the cooling that made`}}},
	{"cool_linear", []string{"heat", "--material", "demo-alloy", "--from", "300K", "--critical", "--cooled-at", "1e-3K/s", "--format", "json"}, []check{{"stdout", false, `"critical_heating_rate_k_per_s": null,`}, {"stdout", false, `"critical_cooling_rate_k_per_s": 8\.18`}}},
	{"cool_linear", []string{"heat", "--material", "lithium-disilicate", "--from", "Tg", "--rate", "10K/min", "--cooled-at", "1K/s"}, []check{{"stdout", false, `^quenched in by cooling at 1\.00 K/s: 3\.368e\+10 nuclei per m3, mean radius `}, {"stdout", false, `^path: linear heating from 727\.00 K to 1307\.00 K, with the nuclei left by cooling from Te`}}},

	// The critical cooling rate and the nose estimate beside it.
	{"cool_linear", []string{"cool", "--material", "demo-alloy", "--critical"}, []check{{"stdout", false, `critical cooling rate to stay below X = 1e-06`}, {"stdout", false, `nose estimate \(Te - T_nose\)/t_nose: .* it overstates the rate`}, {"stdout", false, `rate \(K/s\)`}, {"stdout", true, `NaN|Inf`}}},
	{"cool_linear", []string{"cool", "--material", "demo-alloy", "--critical", "--format", "json"}, []check{{"stdout", false, `"critical_cooling_rate_k_per_s": [0-9.e+-]+,`}, {"stdout", false, `"nose_estimate_k_per_s": [0-9.e+-]+,`}, {"stdout", false, `"end_reason": "rest negligible"`}, {"stdout", true, `NaN|Inf`}}},

	// A glass former stops at Tg.
	{"cool_linear", []string{"cool", "--material", "vit1", "--critical", "--format", "json"}, []check{{"stdout", false, `"end_reason": "glass transition"`}, {"stdout", false, `"end_temperature_k": 625,`}}},

	// One rate: the fraction, where X is reached, the onset in 1 mm3.
	{"cool_linear", []string{"cool", "--material", "$WORK/own.toml", "--rate", "1K/s", "--volume", "1mm3", "--format", "json"}, []check{{"stdout", false, `"cooling_rate_k_per_s": 1,`}, {"stdout", false, `"fraction": 1,`}, {"stdout", false, `"fraction_reached": \{\n +"temperature_k": 1060\.037`}, {"stdout", false, `"onset_temperature_k": 1063\.9899`}, {"stdout", false, `"onset_undercooling_k": 136\.01`}, {"stdout", false, `"volume_m3": 1e-9`}}},

	// The critical rate, and the q^-4 law end to end: at the critical rate the
	// CCT row shows exactly the target fraction; at 10 times it the extended
	// volume is 1e-4 of -ln(1 - 1e-6) = 1.0000005e-6.
	{"cool_linear", []string{"cool", "--material", "$WORK/own.toml", "--critical", "--format", "csv"}, []check{{"stdout", false, `^# critical cooling rate to stay below X = 1e-06 at [0-9.]+ K: 2\.07e\+04 K/s`}, {"stdout", false, `^20730\.6[0-9]*,1e-06,`}, {"stdout", false, `^207306\.[0-9]*,1\.000000[0-9]*e-10,`}}},

	// A small sample cooled slowly: the first nucleus first, and X reached by the
	// mean field with fewer than one nucleus expected in it (issue's example form:
	// q = 0.1 K/s, V = 1e-12 m3).
	{"cool_linear", []string{"cool", "--material", "demo-alloy", "--rate", "0.1K/s", "--volume", "1e-12m3"}, []check{{"stdout", false, `(?s)^onset in 1e-12 m3 at 0\.100 K/s: first nucleus expected at 907\.5. K.*^fraction at 548\.53 K after cooling at 0\.100 K/s: 1; X = 1e-06 reached at 922\.2. K`}, {"stdout", false, `^fewer than one nucleus: where the fraction reaches X = 1e-06 \(922\.2. K\) only 0\.01 nuclei are expected in the 1e-12 m3 sample`}}},
	{"cool_linear", []string{"cool", "--material", "demo-alloy", "--rate", "0.1K/s", "--volume", "1e-12m3", "--format", "json"}, []check{{"stdout", false, `"expected_nuclei_at_fraction": 0\.01`}}},

	// Never nucleates in a tiny volume at a huge rate: the onset is null.
	{"cool_linear", []string{"cool", "--material", "$WORK/own.toml", "--rate", "1e12K/s", "--volume", "1um3", "--format", "json"}, []check{{"stdout", false, `"onset_temperature_k": null`}, {"stdout", false, `"onset_undercooling_k": null`}, {"stdout", false, `"fraction_reached": null`}}},

	// Several rates: the CCT table; a bare number takes the last unit.
	{"cool_linear", []string{"cool", "--material", "$WORK/own.toml", "--rate", "1,10,100K/min", "--format", "csv"}, []check{{"stdout", false, `^cooling_rate_k_per_s,fraction,temperature_k,time_s$`}, {"stdout", false, `^0\.016666667,`}, {"stdout", false, `^1\.6666667,`}}},
	{"cool_linear", []string{"cool", "--material", "$WORK/own.toml", "--rate", "10C/s", "--format", "markdown"}, []check{{"stdout", false, `^\| +10 \|`}}},

	// --end cuts the path.
	{"cool_linear", []string{"cool", "--material", "$WORK/own.toml", "--critical", "--end", "900K", "--format", "json"}, []check{{"stdout", false, `"end_temperature_k": 900,`}, {"stdout", false, `"end_reason": "given"`}}},

	// A linear curve read from a CSV file (time in ms, temperature in C) gives
	// the fraction of --rate: the same path, straight between its points, so
	// the same integral: 1.846918257e-5 both ways (they agree to 1e-14; the
	// grid of the earlier integrator gave 1.8498e-5 by the rate and 1.8468e-5
	// by the 401-point path, 0.2 % apart). Both match 0.00001846918257.
	{"cool_linear_curve", []string{"cool", "--material", "$WORK/own.toml", "--rate", "1e4K/s", "--end", "585K", "--format", "json"}, []check{{"stdout", false, `^  "fraction": 0\.00001846918257`}}},
	{"cool_linear_curve", []string{"cool", "--material", "$WORK/own.toml", "--curve", "$WORK/linear.csv", "--format", "json"}, []check{{"stdout", false, `^  "fraction": 0\.00001846918257`}, {"stdout", false, `"points": 401`}}},

	// fit arrhenius on the invented diffusivities shipped for the README.
	{"fit_arrhenius", []string{"fit", "arrhenius", "$REPO/testdata/fit/diffusion.csv"}, []check{{"stdout", false, `data: .*diffusion.csv, 7 points; columns temperature_c, diffusivity_m2_per_s`}, {"stdout", false, `^Q = 142\.4 kJ/mol \(142378 J/mol, 1\.476 eV\), SE 0\.9199 kJ/mol, 95 % \[140, 144\.7\] kJ/mol`}, {"stdout", false, `^pre-exponential = 3\.237e-05 m2/s, 95 % \[2\.441e-05, 4\.291e-05\]`}, {"stdout", false, `R2 = 0\.99979`}, {"stdout", false, `Student t = 2\.5706 \(5 degrees of freedom\)`}, {"stdout", true, `warning`}, {"stdout", true, `NaN|Inf`}}},
	{"fit_arrhenius", []string{"fit", "arrhenius", "$REPO/testdata/fit/diffusion.csv", "--format", "json"}, []check{{"stdout", false, `"activation_energy_j_per_mol": 142378\.40`}, {"stdout", false, `"activation_energy_ci95_j_per_mol": \[\s+140013\.70`}, {"stdout", false, `"pre_exponential": 0\.00003236`}, {"stdout", false, `"pre_exponential_ci95": \[`}, {"stdout", false, `"r2": 0\.99979`}, {"stdout", false, `"warnings": \[\]`}, {"stdout", true, `NaN|Inf`}}},
	{"fit_arrhenius", []string{"fit", "arrhenius", "$REPO/testdata/fit/diffusion.csv", "--format", "csv"}, []check{{"stdout", false, `^line,temperature_k,temperature_c,inverse_temperature_per_k,value,fitted_value,residual_ln$`}, {"stdout", false, `^4,873\.15,600,`}}},

	// Two points: the exact line, no interval (the two points read off the
	// log D against 1/T line in Callister's copper-in-gold example).
	{"fit_arrhenius", []string{"fit", "arrhenius", "$WORK/two.csv"}, []check{{"stdout", false, `^Q = 194\.6 kJ/mol \(19463. J/mol, 2\.017 eV\) \(two points: exact, no interval\)`}, {"stdout", false, `pre-exponential = 5\.41.e-05 m2/s`}}},
	{"fit_arrhenius", []string{"fit", "arrhenius", "$WORK/two.csv", "--format", "json"}, []check{{"stdout", false, `"activation_energy_ci95_j_per_mol": null`}, {"stdout", false, `"pre_exponential_ci95": null`}, {"stdout", true, `NaN|Inf`}}},

	// Celsius numbers in a kelvin column are flagged.
	{"fit_arrhenius", []string{"fit", "arrhenius", "$WORK/celsius-as-kelvin.csv"}, []check{{"stdout", false, `^warning: the temperatures look like degrees Celsius read as kelvin`}}},
	{"fit_arrhenius", []string{"fit", "arrhenius", "$WORK/celsius-as-kelvin.csv", "--format", "json"}, []check{{"stdout", false, `"key": "straighter_if_celsius"`}}},
	{"fit_arrhenius", []string{"fit", "arrhenius", "$WORK/weighted.csv", "--weights"}, []check{{"stdout", false, `weight \(relative weights on ln y\)`}}},
	{"fit_arrhenius", []string{"fit", "arrhenius", "$WORK/weighted.csv"}, []check{{"stdout", false, `the weight column is ignored; give --weights to use it`}}},

	// fit avrami on the invented isothermal fractions shipped for the README.
	{"fit_avrami", []string{"fit", "avrami", "$REPO/testdata/fit/crystallized-fraction.csv"}, []check{{"stdout", false, `data: .*crystallized-fraction.csv, 11 rows, 9 used; columns time_min, fraction`}, {"stdout", false, `^n = 2\.612, SE 0\.01691, 95 % \[2\.572, 2\.652\]`}, {"stdout", false, `^k = 2\.353e-08 s\^-2\.612`}, {"stdout", false, `^k = 0\.001038 min\^-2\.612 with t in min`}, {"stdout", false, `^half time = 723\.5 s \(12\.06 min\), 95 % \[717\.6, 729\.5\] s`}, {"stdout", false, `^t\(X = 0\.95\) = 1267 s \(21\.12 min\)`}, {"stdout", false, `^left out: 2 rows with X = 0 or 1 \(lines 4, 14\)`}, {"stdout", false, `left out`}, {"stdout", true, `NaN|Inf`}}},
	{"fit_avrami", []string{"fit", "avrami", "$REPO/testdata/fit/crystallized-fraction.csv", "--format", "json"}, []check{{"stdout", false, `"avrami_exponent": 2\.61`}, {"stdout", false, `"rate_constant": 2\.35`}, {"stdout", false, `"half_time_s": 723\.5`}, {"stdout", false, `"left_out_lines": \[\s+4,\s+14\s+\]`}, {"stdout", true, `NaN|Inf`}}},

	// Two points give the exact answer: the fractions 0.2 at 12.6 s and 0.8 at
	// 28.2 s of Callister's austenite-to-pearlite problem, n = 2.453, k = 4.46e-4.
	{"fit_avrami", []string{"fit", "avrami", "$WORK/two.csv"}, []check{{"stdout", false, `^n = 2\.453 \(two points: exact, no interval\)`}, {"stdout", false, `^k = 0\.000446`}, {"stdout", false, `^t\(X = 0\.95\) = 36\.3. s \(two points: exact, no interval\)`}}},
	{"fit_avrami", []string{"fit", "avrami", "$WORK/two.csv", "--format", "json"}, []check{{"stdout", false, `"avrami_exponent_ci95": null`}, {"stdout", false, `"half_time_ci95_s": null`}, {"stdout", true, `NaN|Inf`}}},

	// fit kissinger and fit ozawa. Two peaks (5 K/min at 500 K, 20 K/min at
	// 515 K) by hand: Kissinger E = R ln[(20/515^2)/(5/500^2)]/(1/500 - 1/515)
	// = 189430.07 J/mol and A = (E/R) exp(ln(beta1/T1^2) + E/(R T1)), beta in
	// K/s, = 4.6744e17 /s; Ozawa E = R ln 4/(1/500 - 1/515)/(0.4567 ln 10)
	// = 188160.7 J/mol.
	{"fit_peaks", []string{"fit", "kissinger", "$WORK/two.csv"}, []check{{"stdout", false, `^apparent E = 189\.4 kJ/mol \(189430 J/mol, 1\.963 eV\) \(two points: exact, no interval\)$`}, {"stdout", false, `^pre-exponential A = 4\.674e\+17 1/s \(two points: exact, no interval\); ln A = 40\.686$`}, {"stdout", false, `^E/\(R Tp\) = 44\.24 to 45\.57 over the peaks$`}, {"stdout", false, `^points: 2 \(exact fit`}}},
	{"fit_peaks", []string{"fit", "kissinger", "$WORK/two.csv", "--format", "json"}, []check{{"stdout", false, `"activation_energy_j_per_mol": 189430\.07`}, {"stdout", false, `"activation_energy_ci95_j_per_mol": null`}, {"stdout", false, `"pre_exponential_per_s": 46744490`}, {"stdout", false, `"pre_exponential_ci95_per_s": null`}, {"stdout", false, `"method": "kissinger"`}, {"stdout", true, `doyle|NaN|Inf`}}},
	{"fit_peaks", []string{"fit", "ozawa", "$WORK/two.csv"}, []check{{"stdout", false, `^apparent E = 188\.2 kJ/mol \(188161 J/mol`}, {"stdout", true, `pre-exponential|warning`}}},
	{"fit_peaks", []string{"fit", "ozawa", "$WORK/two.csv", "--format", "json"}, []check{{"stdout", false, `"activation_energy_j_per_mol": 188160\.(69|70)`}, {"stdout", false, `"doyle_slope": 1\.0515`}, {"stdout", false, `"method": "ozawa-flynn-wall"`}, {"stdout", true, `pre_exponential|NaN|Inf`}}},
	// 5 K/min at 500 K, 20 K/min at 600 K: Ozawa E = R ln 4/(1/500 - 1/600)/1.0516
	// = 32882 J/mol, E/(R Tp) = 6.59 at 600 K and 7.91 at 500 K.
	{"fit_peaks", []string{"fit", "ozawa", "$WORK/low.csv"}, []check{{"stdout", false, `^warning: E/\(R Tp\) runs from 6\.59 to 7\.91, outside 20 to 60 where Doyle's approximation holds`}}},
	{"fit_peaks", []string{"fit", "ozawa", "$WORK/low.csv", "--format", "json"}, []check{{"stdout", false, `"key": "outside_doyle_range"`}}},
	{"fit_peaks", []string{"fit", "kissinger", "$WORK/celsius.csv"}, []check{{"stdout", false, `^warning: every temperature is below 250 K; if they are degrees Celsius, name the column peak_temperature_c$`}}},
	// Ozawa's exponent from two scans at 500 K (the column in Celsius): by
	// hand m = -[ln(-ln 0.9) - ln(-ln 0.4)]/ln 4 = 1.56024.
	{"fit_peaks", []string{"fit", "ozawa", "$WORK/fractions-two.csv"}, []check{{"stdout", false, `^at 500 K: m = 1\.56 \(two points: exact, no interval\) \(2 points, exact\)$`}}},
	{"fit_peaks", []string{"fit", "ozawa", "$WORK/fractions-two.csv", "--format", "json"}, []check{{"stdout", false, `"avrami_exponent": 1\.56023`}, {"stdout", false, `"avrami_exponent_ci95": null`}, {"stdout", false, `"not_fitted": \[\]`}}},
	// The invented demo glass of the README.
	{"fit_peaks", []string{"fit", "kissinger", "$REPO/testdata/fit/glass-peaks.csv"}, []check{{"stdout", false, `data: .*glass-peaks.csv, 5 points; columns heating_rate_k_per_min, peak_temperature_c`}, {"stdout", false, `^E is apparent: .*it is not the activation energy of diffusion or of viscous flow`}, {"stdout", false, `^estimates only: a fitted law describes`}, {"stdout", true, `gamma cubed|warning|NaN|Inf`}}},
	{"fit_peaks", []string{"fit", "kissinger", "$REPO/testdata/fit/glass-peaks.csv", "--format", "csv"}, []check{{"stdout", false, `^line,heating_rate_k_per_min,heating_rate_k_per_s,peak_temperature_k,peak_temperature_c,inverse_temperature_per_k,ordinate,fitted_ordinate,residual$`}, {"stdout", false, `^5,2,0\.033333333,500\.15,227,`}}},
	{"fit_peaks", []string{"fit", "ozawa", "$REPO/testdata/fit/glass-fractions.csv"}, []check{{"stdout", false, `^at 505 K: m = 3\.102, SE`}, {"stdout", false, `^at 515 K: m = 2\.771`}, {"stdout", false, `│ 16 +│ 515\.00 │ +1 │ 1\.0000 │ .*│ left out │`}}},

	// fit interface on the invented nucleation rates of the invented demo alloy.
	{"fit_interface", []string{"fit", "interface", "$REPO/testdata/fit/nucleation-rates.csv", "--material", "demo-alloy"}, []check{{"stdout", false, `material: demo-alloy`}, {"stdout", false, `data: .*nucleation-rates.csv, 8 points; columns temperature_k, rate_per_m3_s`}, {"stdout", false, `^gamma = 0\.14266 J/m2 \(142\.66 mJ/m2\), SE 0\.27665 mJ/m2, 95 % \[141\.99, 143\.34\] mJ/m2`}, {"stdout", false, `^prefactor scale A = 19\.86`}, {"stdout", false, `classical plot \(ln J - ln D against 1/\(T dg_v\^2\)\): slope -3\.5289e\+21 K J2/m6, gamma = 0\.1427 J/m2`}, {"stdout", true, `NaN|Inf`}}},
	{"fit_interface", []string{"fit", "interface", "$REPO/testdata/fit/nucleation-rates.csv", "--material", "demo-alloy", "--format", "json"}, []check{{"stdout", false, `"gamma_j_per_m2": 0\.14266`}, {"stdout", false, `"gamma_ci95_j_per_m2": \[\s+0\.14198`}, {"stdout", false, `"prefactor_scale": 19\.85`}, {"stdout", false, `"classical_gamma_j_per_m2": 0\.1427`}, {"stdout", true, `NaN|Inf`}}},

	// A card of one's own with a fixed prefactor, where the classical plot is
	// exact: both ways give back the gamma the rates were made with.
	{"fit_interface", []string{"fit", "interface", "$WORK/fixed.csv", "--material", "$WORK/own.toml"}, []check{{"stdout", false, `^gamma = 0\.118 J/m2`}, {"stdout", false, `classical plot \(ln J against 1/\(T dg_v\^2\)\): slope .*, gamma = 0\.118 J/m2`}, {"stdout", false, `^prefactor scale A = 1 `}}},

	// The time to a fraction at one temperature, on an invented card written for
	// this test (values invented; not a real material).
	{"hold_basic", []string{"hold", "--material", "$WORK/alloy.toml", "--at", "800K"}, []check{{"stdout", false, `^undercool hold: time to transform at one temperature`}, {"stdout", false, `^time to X = 1e-06 at 800\.00 K \(526\.85 °C\): 7\.29 s \(estimate\)$`}, {"stdout", false, `^undercooling 350\.00 K; driving force 3546 J/mol \(estimate\)$`}, {"stdout", false, `^critical nucleus: radius 0\.7738 nm, 119\.3 molecules`}, {"stdout", false, `^nucleation rate: log10 J = 17\.067`}, {"stdout", false, `^growth rate: u = 1\.425e-09 m/s \(estimate\)$`}, {"stdout", true, `NaN|Inf`}}},

	// Celsius; a longer time in readable units with the seconds beside it.
	{"hold_basic", []string{"hold", "--material", "$WORK/alloy.toml", "--at", "726.85C", "--fraction", "0.5"}, []check{{"stdout", false, `at 1000\.00 K \(726\.85 °C\): 5\.34 years \(1\.685e\+08 s\) \(estimate\)$`}}},
	{"hold_basic", []string{"hold", "--material", "$WORK/alloy.toml", "--at", "1000", "--fraction", "0.5", "--format", "json"}, []check{{"stdout", false, `"temperature_k": 1000,`}, {"stdout", false, `"fraction": 0\.5,`}, {"stdout", false, `"time_s": 1685149`}, {"stdout", false, `"never": false`}, {"stdout", false, `"log10_rate_per_m3_s": `}, {"stdout", false, `"growth_rate_m_per_s": `}, {"stdout", false, `"critical_radius_m": `}}},

	// Above T_e it never happens: say so, exit 0, time_s null.
	{"hold_basic", []string{"hold", "--material", "$WORK/alloy.toml", "--at", "1200K"}, []check{{"stdout", false, `never: no driving force at or above the equilibrium temperature \(T_e = 1150\.00 K\)`}, {"stdout", false, `no driving force, no nucleus`}}},
	{"hold_basic", []string{"hold", "--material", "$WORK/alloy.toml", "--at", "1200K", "--format", "json"}, []check{{"stdout", false, `"time_s": null`}, {"stdout", false, `"never": true`}, {"stdout", false, `"critical_radius_m": null`}, {"stdout", true, `NaN|Inf`}}},

	// Below the VFT T0 of a glass: no mobility, never.
	{"hold_basic", []string{"hold", "--te", "1300K", "--dh", "55kJ/mol", "--vm", "60cm3/mol", "--gamma", "0.18J/m2", "--mobility", "vft", "--vft-a", "-3", "--vft-b", "4500K", "--vft-t0", "500K", "--at", "450K"}, []check{{"stdout", false, `never: no mobility`}}},

	// The time lag, site saturation, CSV, markdown.
	{"hold_basic", []string{"hold", "--material", "$WORK/alloy.toml", "--at", "800K", "--lag"}, []check{{"stdout", false, `^time lag: .* \(included in the time\) \(estimate\)$`}}},
	{"hold_basic", []string{"hold", "--material", "$WORK/alloy.toml", "--at", "800K", "--nuclei", "1e18"}, []check{{"stdout", false, `^nuclei: 1e\+18 per m3, present from the start \(estimate\)$`}}},
	{"hold_basic", []string{"hold", "--material", "$WORK/alloy.toml", "--at", "800K", "--format", "csv"}, []check{{"stdout", false, `^temperature_k,fraction,time_s,log10_rate_per_m3_s,growth_rate_m_per_s,critical_radius_m,critical_size,barrier_j,time_lag_s,flags$`}, {"stdout", false, `^800,1e-06,7\.289`}}},
	{"hold_basic", []string{"hold", "--material", "$WORK/alloy.toml", "--at", "800K", "--format", "markdown"}, []check{{"stdout", false, `^- time to X = 1e-06 at 800\.00 K`}}},

	// The rate table for the invented demo card, in every format.
	{"rate_basic", []string{"rate", "--material", "demo-alloy", "--temps", "1160,1000,900"}, []check{{"stdout", false, `material: demo-alloy`}, {"stdout", false, `log10 J \(m\^-3 s\^-1\)`}, {"stdout", false, `no_driving_force`}, {"stdout", true, `NaN|Inf`}}},
	{"rate_basic", []string{"rate", "--material", "demo-alloy", "--temps", "1000", "--format", "json"}, []check{{"stdout", false, `"log10_rate_per_m3_s": -13\.35`}, {"stdout", false, `"critical_radius_m": 1\.592`}, {"stdout", true, `NaN|Inf`}}},
	{"rate_basic", []string{"rate", "--material", "demo-alloy", "--temps", "1160", "--format", "json"}, []check{{"stdout", false, `"critical_radius_m": null`}, {"stdout", false, `"log10_rate_per_m3_s": null`}}},
	{"rate_basic", []string{"rate", "--material", "demo-alloy", "--range", "1000:900:50", "--format", "csv"}, []check{{"stdout", false, `^temperature_k,temperature_c,undercooling_k`}, {"stdout", false, `^1000,726\.85,150,`}, {"stdout", false, `^900,`}}},
	{"rate_basic", []string{"rate", "--material", "demo-alloy", "--temps", "726.85C", "--format", "markdown"}, []check{{"stdout", false, `^\| +1000\.00 \|`}}},

	// Overrides from flags, a card of one's own, heterogeneous nucleation.
	{"rate_basic", []string{"rate", "--material", "demo-alloy", "--gamma", "118mJ/m2", "--theta", "90", "--sites", "1e20", "--temps", "1000"}, []check{{"stdout", false, `heterogeneous, contact angle 90 deg`}}},
	{"rate_basic", []string{"rate", "--material", "$WORK/own.toml", "--temps", "900"}, []check{{"stdout", false, `material: own-metal`}}},

	// No mobility: nucleus only.
	{"rate_basic", []string{"rate", "--te", "1000", "--dh", "10kJ/mol", "--vm", "7cm3/mol", "--gamma", "0.1J/m2", "--temps", "900"}, []check{{"stdout", false, `no rate: the material has no mobility law`}}},

	// Fixed prefactor.
	{"rate_basic", []string{"rate", "--te", "1000", "--dh", "10kJ/mol", "--vm", "7cm3/mol", "--gamma", "0.1J/m2", "--prefactor", "fixed", "--j0", "1e40", "--temps", "900", "--format", "json"}, []check{{"stdout", false, `"prefactor": "fixed"`}}},

	// A tabulated driving force: the demo card's linear law written as a table
	// (exact under linear interpolation) gives the same rate as the law itself.
	{"rate_table", []string{"rate", "--material", "demo-alloy", "--driving", "linear", "--temps", "950", "--format", "json"}, []check{{"stdout", false, `"log10_rate_per_m3_s": 8\.926126703020`}}},
	{"rate_table", []string{"rate", "--material", "demo-alloy", "--driving", "$WORK/dg.csv", "--temps", "950", "--format", "json"}, []check{{"stdout", false, `"driving": "table .*dg.csv"`}, {"stdout", false, `"log10_rate_per_m3_s": 8\.926126703020`}}},

	// The equilibrium temperature comes from where the table changes sign.
	{"rate_table", []string{"rate", "--vm", "9.8cm3/mol", "--gamma", "0.14J/m2", "--d0", "1e-5m2/s", "--q", "200kJ/mol", "--driving", "$WORK/dg.csv", "--temps", "950", "--format", "json"}, []check{{"stdout", false, `"equilibrium_temperature_k": 1150`}, {"stdout", false, `"log10_rate_per_m3_s": 8\.926126703020`}}},

	// Outside the table there is no answer, and the row says why.
	{"rate_table", []string{"rate", "--material", "demo-alloy", "--driving", "$WORK/dg.csv", "--temps", "750"}, []check{{"stdout", false, `outside_table`}}},

	// The metastable zone width of an invented solute cooled from saturation
	// (values invented; not a real system). The onset is where the expected
	// number of nuclei in the vessel, V·∫J dt, reaches 1; kinetics checks it
	// against an independent integral. Here: the widths for a list of rates
	// widen with the rate, and the JSON keys.
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "0.1,0.5,2,10K/min", "--volume", "100mL"}, []check{{"stdout", false, `^undercool cool: metastable zone width of a cooled solution`}, {"stdout", false, `^path: linear cooling from the saturation temperature 313\.15 K \(40\.00 °C\) to 250\.52 K \(default 0\.8 T_sat`}, {"stdout", false, `^│ +0\.1 │ +0\.001667 │ +294\.45 │ +21\.30 │ +18\.701 │`}, {"stdout", false, `^│ +0\.5 │ +0\.008333 │ +291\.24 │ +18\.09 │ +21\.912 │`}, {"stdout", false, `^│ +2 │ +0\.03333 │ +287\.06 │ +13\.91 │ +26\.095 │`}, {"stdout", false, `^│ +10 │ +0\.1667 │ +278\.81 │ +5\.66 │ +34\.340 │`}, {"stdout", false, `apparent order m of Nyvlt`}, {"stdout", false, `flag small_nucleus`}, {"stdout", true, `NaN|Inf`}}},
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "0.5K/min", "--volume", "100mL", "--format", "json"}, []check{{"stdout", false, `"onset_temperature_k": 291\.237`}, {"stdout", false, `"onset_undercooling_k": 21\.912`}, {"stdout", false, `"supersaturation_at_onset": 2\.24`}, {"stdout", true, `NaN|Inf`}}},

	// A solubility table: the path starts where the table reaches conc.
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "0.5K/min", "--volume", "100mL", "--solubility", "$WORK/sol.csv", "--conc", "22g/kg"}, []check{{"stdout", false, `path: linear cooling from the saturation temperature 303\.15 K \(30\.00 °C\) to 283\.15 K \(the coldest row of the solubility table\)`}}},

	// Too fast for the path: no onset, said, exit 0.
	{"solution_cool", []string{"cool", "--material", "$WORK/demo-solute-a.toml", "--rate", "1000K/s", "--volume", "1uL", "--end", "39C"}, []check{{"stdout", false, `fewer than one nucleus is expected by 312\.15 K \(10\^-.* expected\): no onset on this path`}}},

	// fit induction: gamma and the apparent prefactor A from induction times.
	// Round trip on data made by the model itself for an invented solute
	// (gamma = 6 mJ/m2, A = 1e3 m^-3 s^-1, 100 mL, v = 0.168/1400/N_A m3; the
	// times are printed to 6 figures, so the fit returns them to about 1e-6).
	{"solution_fit", []string{"fit", "induction", "$WORK/exact.csv", "--molar-mass", "168g/mol", "--density", "1.4g/cm3", "--volume", "100mL"}, []check{{"stdout", false, `^undercool fit induction: interfacial energy and prefactor from induction times`}, {"stdout", false, `^gamma = 0\.006 J/m2 \(6 mJ/m2\)`}, {"stdout", false, `^A = 1000 m\^-3 s\^-1`}, {"stdout", false, `^points: 12, 10 degrees of freedom; R2 = 1\.00000`}, {"stdout", false, `critical nucleus over the data with the fitted gamma: 4\.85 to 68\.5 molecules`}, {"stdout", false, `flag small_nucleus`}}},
	{"solution_fit", []string{"fit", "induction", "$WORK/exact.csv", "--vm", "120cm3/mol", "--volume", "100mL", "--format", "json"}, []check{{"stdout", false, `"gamma_j_per_m2": 0\.0059999(8|9)`}, {"stdout", false, `"pre_exponential": 999\.99`}, {"stdout", false, `"gamma_ci95_j_per_m2": \[`}, {"stdout", true, `NaN|Inf`}}},

	// Without a volume only A·V is known.
	{"solution_fit", []string{"fit", "induction", "$WORK/exact.csv", "--vm", "120cm3/mol"}, []check{{"stdout", false, `^A·V = 0\.1 s\^-1 \(give --volume for A itself\)`}}},
	{"solution_fit", []string{"fit", "induction", "$WORK/exact.csv", "--vm", "120cm3/mol", "--format", "json"}, []check{{"stdout", false, `"pre_exponential": null`}}},

	// Induction time of a held solution, on an invented solute written for this
	// test (values invented; not a real system). Hand values, worked out from
	// ΔG*/kT = 16π γ³ v² / (3 (kT)³ ln²S),  J = A exp(−ΔG*/kT),  t = 1/(J V),
	// t_poly = [3 (−ln(1−X)) / (π J u³)]^(1/4)
	// with γ = 6 mJ/m², v = 0.168/1400/N_A = 1.99265e-28 m³, T = 298.15 K, S = 2,
	// A = 1e3 m⁻³ s⁻¹, u = 1e-8 m/s, X = 1e-6:
	// ΔG*/kT = 4.28803, log10 J = 1.13773, n* = 12.373,
	// t_mono = 728.23 s in 100 mL and 72823 s in 1 mL, t_poly = 16239 s.
	{"solution_hold", []string{"hold", "--material", "$WORK/demo-solute-a.toml", "--at", "25C", "--supersaturation", "2", "--volume", "100mL"}, []check{{"stdout", false, `^undercool hold: induction time of a held volume`}, {"stdout", false, `^solution: fixed supersaturation S = 2 \(ln S = 0\.6931\)`}, {"stdout", false, `^induction time, mononuclear \(first nucleus, 1/\(J V\)\) at 298\.15 K \(25\.00 °C\): 12\.1 min \(728\.2 s\) \(estimate\)$`}, {"stdout", false, `^polynuclear time to X = 1e-06 \(many nuclei growing, JMAK\): 4\.51 h \(1\.624e\+04 s\) \(estimate\)$`}, {"stdout", false, `^dominates: polynuclear`}, {"stdout", false, `^critical nucleus: radius 0\.838 nm, 12\.37 molecules, barrier 1\.765e-20 J \(4\.288 kT\) \(estimate\)$`}, {"stdout", false, `^nucleation rate: log10 J = 1\.138 `}, {"stdout", false, `flag low_barrier`}, {"stdout", true, `NaN|Inf`}}},

	// A small vessel: the wait for the first nucleus dominates.
	{"solution_hold", []string{"hold", "--material", "$WORK/demo-solute-a.toml", "--at", "25C", "--supersaturation", "2", "--volume", "1mL", "--format", "json"}, []check{{"stdout", false, `"induction_time_s": 72822\.8`}, {"stdout", false, `"polynuclear_time_s": 16239\.0`}, {"stdout", false, `"dominant": "mononuclear"`}, {"stdout", false, `"supersaturation": 2,`}, {"stdout", false, `"volume_m3": 0\.000001,`}, {"stdout", true, `NaN|Inf`}}},

	// Cooled from saturation (van 't Hoff): S = 1 at and above 40 C is no
	// driving force: never, exit 0.
	{"solution_hold", []string{"hold", "--material", "$WORK/demo-solute-a.toml", "--at", "45C", "--volume", "100mL"}, []check{{"stdout", false, `induction time at 318\.15 K \(45\.00 °C\): never: S = 0\.8.* <= 1: the solution is not supersaturated`}}},
	{"solution_hold", []string{"hold", "--material", "$WORK/demo-solute-a.toml", "--at", "40C", "--volume", "100mL", "--format", "json"}, []check{{"stdout", false, `"induction_time_s": null`}, {"stdout", false, `"never": true`}, {"stdout", true, `NaN|Inf`}}},

	// Without a growth rate the polynuclear time is not known; say so.
	{"solution_hold", []string{"hold", "--driving", "solution", "--supersaturation", "2", "--sat-temp", "40C", "--molar-mass", "168g/mol", "--density", "1.4g/cm3", "--gamma", "6mJ/m2", "--prefactor", "fixed", "--j0", "1e3", "--at", "25C", "--volume", "100mL"}, []check{{"stdout", false, `not known \(no growth rate: give --growth-rate`}, {"stdout", false, `^dominates: not known without a growth rate`}}},

	// The shipped paracetamol card: nucleus only, and the small nucleus said plainly.
	{"solution_hold", []string{"hold", "--material", "paracetamol-acetone-water", "--at", "20C", "--volume", "100mL", "--prefactor", "fixed", "--j0", "1e5"}, []check{{"stdout", false, `critical nucleus: .* 5\.933 molecules`}, {"stdout", false, `flag small_nucleus: critical nucleus below 10 molecules`}, {"stdout", false, `the critical nucleus holds 5\.9 molecules: CNT is outside its range`}}},

	// The exact equivalence: ideal cooling crystallization at constant
	// concentration has Δg = R·T·ln S = ΔH_sol·(T_sat − T)/T_sat, Turnbull's
	// linear law with T_e = T_sat and ΔH = ΔH_sol. The same invented solute
	// written both ways gives the same table (values invented; not a real system).
	// The solution's table has S beside ΔT (S = exp((ΔH_sol/R)(T_sat − T)/(T·T_sat)):
	// 1.4258 at 30 °C by hand); every other column is the melt's.
	{"solution_rate", []string{"rate", "--material", "$WORK/sol.toml", "--temps", "30C,20C,10C", "--format", "csv"}, []check{{"stdout", false, `^303\.15,30,10,1\.4258142,7451168\.2,1\.6104857e-09,87\.806951,6\.5185892e-20,15\.574451,0\.014640028,,-3\.7638983,,$`}, {"stdout", false, `^293\.15,20,20,2\.082748,14902336,8\.0524286e-10,10\.975869,1\.6296473e-20,4\.0264327,0\.059550546,,1\.2513425,,low_barrier$`}, {"stdout", false, `^283\.15,10,30,3\.1248921,22353505,5\.3682857e-10,3\.2521093,7\.2428769e-21,1\.8527263,0\.13633424,,2\.1953712,,small_nucleus;low_barrier$`}}},
	{"solution_rate", []string{"rate", "--material", "$WORK/melt.toml", "--temps", "30C,20C,10C", "--format", "csv"}, []check{{"stdout", false, `^303\.15,30,10,7451168\.2,1\.6104857e-09,87\.806951,6\.5185892e-20,15\.574451,0\.014640028,,-3\.7638983,,$`}, {"stdout", false, `^293\.15,20,20,14902336,8\.0524286e-10,10\.975869,1\.6296473e-20,4\.0264327,0\.059550546,,1\.2513425,,low_barrier$`}, {"stdout", false, `^283\.15,10,30,22353505,5\.3682857e-10,3\.2521093,7\.2428769e-21,1\.8527263,0\.13633424,,2\.1953712,,small_nucleus;low_barrier$`}}},
	{"solution_rate", []string{"rate", "--material", "$WORK/sol.toml", "--temps", "30C"}, []check{{"stdout", false, `^solution: saturated at 313\.15 K \(40\.00 °C\) and cooled at constant concentration; ideal \(van .t Hoff\) solubility, dh_sol = 28 kJ/mol`}, {"stdout", false, `^models: driving force van-t-hoff; mobility none; prefactor fixed`}}},

	// A solubility table in g/kg with a concentration in g/kg: the saturation
	// temperature is where the table reaches conc (22 g/kg at 30 °C).
	{"solution_rate", []string{"rate", "--material", "$WORK/sol.toml", "--solubility", "$WORK/solubility.csv", "--conc", "22g/kg", "--temps", "20C", "--format", "json"}, []check{{"stdout", false, `"model": "solubility-table"`}, {"stdout", false, `"saturation_temperature_k": 303\.15`}, {"stdout", false, `"undercooling_k": 10,`}}},

	// A fixed S overrides the law; the reference T_sat stays.
	{"solution_rate", []string{"rate", "--material", "$WORK/sol.toml", "--supersaturation", "1.5", "--temps", "25C"}, []check{{"stdout", false, `^solution: fixed supersaturation S = 1\.5 \(ln S = 0\.4055\) at every temperature; reference saturation temperature 313\.15 K`}}},

	// S <= 1 is no driving force, not an error.
	{"solution_rate", []string{"rate", "--material", "$WORK/sol.toml", "--supersaturation", "0.8", "--temps", "25C"}, []check{{"stdout", false, `no_driving_force`}}},

	// The shipped paracetamol card: a nucleus of a few molecules, flagged.
	{"solution_rate", []string{"rate", "--material", "paracetamol-acetone-water", "--temps", "20C"}, []check{{"stdout", false, `small_nucleus`}, {"stdout", false, `flag small_nucleus: critical nucleus below 10 molecules: outside the range of CNT`}}},

	// Bands on linear cooling and on a measured curve (invented demo card and curve).
	{"spread_cool", []string{"cool", "--material", "demo-alloy", "--critical", "--volume", "1mm3", "--spread", "gamma=2%", "--spread", "d0=x2", "--samples", "200"}, []check{{"stdout", false, `^uncertainty \(200 samples, seed 1\): P5 / P50 / P95$`}, {"stdout", false, `^  critical cooling rate: [0-9.]+ K/s / [0-9.]+ K/s / [0-9.]+ K/s$`}, {"stdout", false, `^  onset undercooling at the critical rate: [0-9.]+ K / [0-9.]+ K / [0-9.]+ K$`}, {"stdout", false, `│ critical cooling rate +│ decades │`}, {"stdout", true, `NaN|Inf`}}},
	{"spread_cool", []string{"cool", "--material", "demo-alloy", "--critical", "--spread", "gamma=2%", "--samples", "200", "--format", "json"}, []check{{"stdout", false, `"critical_cooling_rate_k_per_s": \{`}, {"stdout", false, `"p95": `}}},
	{"spread_cool", []string{"cool", "--material", "demo-alloy", "--rate", "1,100K/s", "--spread", "gamma=2%", "--samples", "100", "--format", "json"}, []check{{"stdout", false, `"fraction_at_1_k_per_s": \{`}, {"stdout", false, `"fraction_at_100_k_per_s": \{`}}},

	// Uncertainty bands on the rate table of the invented demo card.
	{"spread_rate", []string{"rate", "--material", "demo-alloy", "--temps", "1000K,900K", "--spread", "gamma=2%", "--spread", "q=3kJ/mol", "--spread", "d0=x2", "--samples", "500"}, []check{{"stdout", false, `^uncertainty \(500 samples, seed 1\): P5 / P50 / P95$`}, {"stdout", false, `P5 log10 J`}, {"stdout", false, `P95 log10 J`}, {"stdout", false, `^sensitivity: change of each result`}, {"stdout", false, `log10 J at 1000\.00 K .* gamma > d0 > q`}, {"stdout", false, `gamma 2% \(normal, σ = 0\.0028 J/m2; command line\)`}, {"stdout", false, `d0 x2 \(log-normal, σ\(ln\) = 0\.693, ±1σ = ×/÷ 2; command line\)`}, {"stdout", false, `quantiles: empirical quantile`}, {"stdout", true, `NaN|Inf`}, {"stderr", true, `.`}}},

	// JSON: the uncertainty block, the bands per row, the spreads and the ranking.
	{"spread_rate", []string{"rate", "--material", "demo-alloy", "--temps", "1000", "--spread", "gamma=2%", "--spread", "d0=x2", "--samples", "500", "--format", "json"}, []check{{"stdout", false, `"uncertainty": \{`}, {"stdout", false, `"samples": 500,`}, {"stdout", false, `"seed": 1,`}, {"stdout", false, `"distribution": "log-normal"`}, {"stdout", false, `"sd_ln": 0\.693147`}, {"stdout", false, `"p5": -1[0-9]\.`}, {"stdout", false, `"p5_log10_rate_per_m3_s": -1[0-9]\.`}, {"stdout", false, `"minus_1sd": -0\.30102999`}, {"stdout", true, `NaN|Inf`}}},

	// Bands on the nose of the TTT curve and on a hold time (invented demo card).
	{"spread_ttt", []string{"ttt", "--material", "demo-alloy", "--range", "1100:700:50", "--spread", "gamma=2%", "--spread", "d0=x2", "--samples", "400"}, []check{{"stdout", false, `^uncertainty \(400 samples, seed 1\): P5 / P50 / P95$`}, {"stdout", false, `^  nose temperature: [0-9.]+ K / [0-9.]+ K / [0-9.]+ K$`}, {"stdout", false, `^  nose time: .* / .* / .*$`}, {"stdout", false, `│ nose time +│ decades │`}, {"stdout", true, `NaN|Inf`}}},
	{"spread_ttt", []string{"ttt", "--material", "demo-alloy", "--range", "1100:700:50", "--spread", "gamma=2%", "--samples", "400", "--format", "json"}, []check{{"stdout", false, `"nose_temperature_k": \{`}, {"stdout", false, `"nose_time_s": \{`}, {"stdout", false, `"sensitivity": \{`}, {"stdout", true, `NaN|Inf`}}},

	// Several fractions: one band per fraction.
	{"spread_ttt", []string{"ttt", "--material", "demo-alloy", "--range", "1100:700:50", "--fraction", "0.01,0.5", "--spread", "gamma=1%", "--samples", "200", "--format", "json"}, []check{{"stdout", false, `"nose_time_s_x_0.01": \{`}, {"stdout", false, `"nose_time_s_x_0.5": \{`}}},

	// The TTT table and its nose, on an invented card written for this test
	// (values invented; not a real material).
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--range", "1100:700:100"}, []check{{"stdout", false, `^undercool ttt: time to transform in an isothermal hold`}, {"stdout", false, `transformation: JMAK 3-D, continuous nucleation \(Avrami exponent 4\), no time lag`}, {"stdout", false, `^nose: 831\.55 K \(558\.40 °C\), 6\.01 s \(estimate\)$`}, {"stdout", false, `time to X = 1e-06`}, {"stdout", false, `1100\.00 .* 3\.97e\+73 years`}, {"stdout", false, `900\.00 .* 20\.8 s`}, {"stdout", false, `nose searched between 700\.00 and 1100\.00 K to 0\.01 K`}, {"stdout", true, `NaN|Inf`}}},

	// JSON: seconds, the nose, null for never.
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--temps", "1200,900,700", "--format", "json"}, []check{{"stdout", false, `"fraction": 0\.000001,`}, {"stdout", false, `"nose": \{`}, {"stdout", false, `"inside_range": true`}, {"stdout", false, `"temperature_k": 831\.5[4-6]`}, {"stdout", false, `"time_s": 6\.014`}, {"stdout", false, `"time_s": null`}, {"stdout", false, `"time_s": 20\.79`}, {"stdout", true, `NaN|Inf`}}},

	// Several fractions: start, middle and finish; the nose temperature is the same.
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--fraction", "0.01,0.5,0.99", "--temps", "900,800"}, []check{{"stdout", false, `^nose \(X = 0\.01\): 831\.55 K \(558\.40 °C\), 1\.00 min \(estimate\)$`}, {"stdout", false, `^nose \(X = 0\.5\): 831\.55 K \(558\.40 °C\), 2\.89 min \(estimate\)$`}, {"stdout", false, `^nose \(X = 0\.99\): 831\.55 K \(558\.40 °C\), 4\.64 min \(estimate\)$`}, {"stdout", false, `time to X = 0\.01 .* time to X = 0\.5 .* time to X = 0\.99`}}},
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--fraction", "0.01,0.5", "--temps", "900", "--format", "json"}, []check{{"stdout", false, `"fraction": \[`}, {"stdout", false, `"time_s": \[`}}},
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--fraction", "0.01,0.5", "--temps", "900", "--format", "csv"}, []check{{"stdout", false, `^temperature_k,temperature_c,time_s_x_0\.01,time_s_x_0\.5,flags$`}, {"stdout", false, `^900,626\.85,`}}},

	// Markdown.
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--temps", "900", "--format", "markdown"}, []check{{"stdout", false, `^### undercool ttt`}, {"stdout", false, `^- nose: 831\.55 K`}}},

	// The time lag, stated; site saturation, stated.
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--temps", "900", "--lag"}, []check{{"stdout", false, `time lag added`}, {"stdout", false, `time lag: nucleation taken to start after Kashchiev's intercept lag theta = 2/\(3 pi Z\^2 beta\*\)`}}},
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--temps", "900", "--nuclei", "1e15"}, []check{{"stdout", false, `site saturation with 1e\+15 nuclei per m\^3 \(Avrami exponent 3\)`}}},
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--temps", "900", "--nuclei", "1e9/cm3", "--format", "json"}, []check{{"stdout", false, `"nuclei_per_m3": 1000000000000000`}}},

	// A range that stops above the nose: no nose inside, say so.
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--range", "1000:900:50"}, []check{{"stdout", false, `nose: not inside 900\.00–1000\.00 K; the time still falls at the lower end`}}},
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--range", "1000:900:50", "--format", "json"}, []check{{"stdout", false, `"inside_range": false`}, {"stdout", false, `"fastest_in_range": \{`}}},

	// Entirely above T_e: nothing transforms; an answer, exit 0.
	{"ttt_basic", []string{"ttt", "--material", "$WORK/alloy.toml", "--range", "1300:1200:50"}, []check{{"stdout", false, `nose: none, nothing transforms between 1200\.00 and 1300\.00 K`}, {"stdout", false, `never`}}},

	// The shipped demo card works end to end.
	{"ttt_basic", []string{"ttt", "--material", "demo-alloy"}, []check{{"stdout", false, `^nose: `}, {"stdout", true, `NaN|Inf`}}},

	// Spreadsheet CSV: a byte-order mark, semicolons with decimal commas,
	// percentages for fractions. Each file holds the numbers of another in
	// another spelling and gives its answer: the Avrami fit of
	// testdata/fit/crystallized-fraction.csv (n = 2.612, SE 0.01691), the
	// quench factor of cool_curve/hold.csv (2.00000).
	{"csv", []string{"fit", "avrami", "$WORK/bom.csv"}, []check{{"stdout", false, `^n = 2\.612, SE 0\.01691, 95 % \[2\.572, 2\.652\]$`}}},
	{"csv", []string{"fit", "avrami", "$WORK/semicolon.csv"}, []check{{"stdout", false, `^n = 2\.612, SE 0\.01691, 95 % \[2\.572, 2\.652\]$`}, {"stdout", false, `columns time_min, fraction_percent`}}},
	{"csv", []string{"fit", "avrami", "$REPO/testdata/fit/crystallized-fraction.csv"}, []check{{"stdout", false, `^n = 2\.612, SE 0\.01691, 95 % \[2\.572, 2\.652\]$`}}},
	{"csv", []string{"cool", "--curve", "$WORK/curve-bom.csv", "--c-curve", "k1=-0.00501,k2=1e-10s,k3=4000,k4=760K,k5=130kJ/mol", "--format", "json"}, []check{{"stdout", false, `"quench_factor": 2\.00000`}}},
	{"csv", []string{"cool", "--curve", "$WORK/curve-semicolon.csv", "--c-curve", "k1=-0.00501,k2=1e-10s,k3=4000,k4=760K,k5=130kJ/mol", "--format", "json"}, []check{{"stdout", false, `"quench_factor": 2\.00000`}}},

	// A percentage for --fraction: 0.0001% is the default 1e-6.
	{"cool_linear", []string{"cool", "--material", "$WORK/own.toml", "--critical", "--fraction", "0.0001%", "--format", "csv"}, []check{{"stdout", false, `^# critical cooling rate to stay below X = 1e-06 at [0-9.]+ K: 2\.07e\+04 K/s`}}},

	// Every bare temperature is kelvin, and says how it was read.
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "650"}, []check{{"stderr", false, `^undercool: note: --at: read as 650 K \(376\.85 °C\); write 650C for Celsius$`}}},
	{"hold", []string{"rate", "--material", "demo-alloy", "--temps", "900,1000C,950", "--te", "1150"}, []check{{"stderr", false, `^undercool: note: --temps: read as 900 K \(626\.85 °C\), 950 K \(676\.85 °C\); write 900C for Celsius$`}, {"stderr", false, `^undercool: note: --te: read as 1150 K \(876\.85 °C\); write 1150C for Celsius$`}}},
	{"hold", []string{"ttt", "--material", "demo-alloy", "--range", "1000:800C:50"}, []check{{"stderr", false, `^undercool: note: --range: read as 1000 K \(726\.85 °C\); write 1000C for Celsius$`}}},
	{"hold", []string{"rate", "--material", "demo-alloy", "--temps", "900K"}, []check{{"stderr", true, `note`}}},

	// fit interface finds gamma without being given one: from the flags of
	// the invented demo card less its gamma, the fit gives the gamma it
	// gives with the card's own (the golden fit-interface.txt, 0.14266 J/m2);
	// the start comes from the classical plot.
	{"fit_interface", []string{"fit", "interface", "$REPO/testdata/fit/nucleation-rates.csv", "--te", "1150K", "--dh", "14.2kJ/mol", "--vm", "9.8cm3/mol",
		"--d0", "1e-5m2/s", "--q", "200kJ/mol", "--driving", "thompson-spaepen"}, []check{{"stdout", false, `^gamma = 0\.14266 J/m2 \(142\.66 mJ/m2\)`}}},
	{"fit_interface", []string{"fit", "interface", "$REPO/testdata/fit/nucleation-rates.csv", "--te", "1150K", "--dh", "14.2kJ/mol", "--vm", "9.8cm3/mol",
		"--d0", "1e-5m2/s", "--q", "200kJ/mol", "--driving", "thompson-spaepen", "--format", "json"}, []check{{"stdout", false, `"source": "start of the fit, from the classical plot of nucleation-rates.csv; the fit replaces it"`}, {"stdout", false, `"gamma_j_per_m2": 0\.14266`}}},

	// A fixed supersaturation at given temperatures needs no saturation
	// temperature; the undercooling, which does, is the dash (empty in CSV).
	{"solution", []string{"rate", "--supersaturation", "2", "--vm", "120cm3/mol", "--gamma", "5mJ/m2", "--prefactor", "fixed", "--j0", "1e20", "--temps", "20C,30C", "--format", "csv"}, []check{{"stdout", false, `^293\.15,20,,2,`}, {"stdout", false, `no saturation temperature given, so no undercooling`}}},
	{"solution", []string{"rate", "--supersaturation", "2", "--vm", "120cm3/mol", "--gamma", "5mJ/m2", "--prefactor", "fixed", "--j0", "1e20", "--temps", "20C", "--format", "json"}, []check{{"stdout", false, `"undercooling_k": null`}, {"stdout", false, `"saturation_temperature_k": null`}}},
	{"solution", []string{"hold", "--supersaturation", "2", "--vm", "120cm3/mol", "--gamma", "5mJ/m2", "--prefactor", "fixed", "--j0", "1e20", "--at", "20C", "--volume", "1mL"}, []check{{"stdout", false, `^induction time, mononuclear \(first nucleus, 1/\(J V\)\) at 293\.15 K`}}},
	{"solution", []string{"ttt", "--supersaturation", "2", "--vm", "120cm3/mol", "--gamma", "5mJ/m2", "--prefactor", "fixed", "--j0", "1e20", "--growth-rate", "1um/s", "--temps", "20C,30C", "--format", "json"}, []check{{"stdout", false, `"inside_range": false`}}},

	// --columns chooses columns by their JSON keys, in the order given, in
	// the table, CSV and Markdown (a hold's CSV is its one record).
	{"hold", []string{"rate", "--material", "demo-alloy", "--temps", "900K", "--columns", "temperature_k,log10_rate_per_m3_s"}, []check{{"stdout", false, `^│ +T \(K\) +│ log10 J \(m\^-3 s\^-1\) \(invented\) │$`}, {"stdout", false, `^│ +900\.00 │ +11\.294 │$`}, {"stdout", true, `not shown`}}},
	{"hold", []string{"rate", "--material", "demo-alloy", "--temps", "900K", "--columns", "log10_rate_per_m3_s,temperature_k", "--format", "csv"}, []check{{"stdout", false, `^log10_rate_per_m3_s,temperature_k$`}, {"stdout", false, `^11\.29[0-9]*,900$`}}},
	{"hold", []string{"rate", "--material", "demo-alloy", "--temps", "900K", "--columns", "temperature_k,critical_size", "--format", "markdown"}, []check{{"stdout", false, `^\| +T \(K\) +\| +n\* +\|$`}}},
	{"hold", []string{"hold", "--material", "demo-alloy", "--at", "900K", "--columns", "time_s,temperature_k", "--format", "csv"}, []check{{"stdout", false, `^time_s,temperature_k$`}}},

	// Markdown: the material's values are one item, sub-lines nested items.
	{"hold", []string{"rate", "--material", "demo-alloy", "--temps", "900K", "--format", "markdown"}, []check{{"stdout", false, `^- values: te = 1150 K, .*, q = 200 kJ/mol$`}, {"stdout", true, `^-\s{2,}`}}},
	{"hold", []string{"ttt", "--material", "demo-alloy", "--temps", "900K", "--spread", "gamma=2%", "--samples", "20", "--format", "markdown"}, []check{{"stdout", false, `^  - nose temperature: `}, {"stdout", true, `^-\s{2,}`}}},

	// Each closing caution fits what was computed: no interfacial energy in
	// an Arrhenius or Avrami fit, or in a quench factor from a C-curve alone.
	{"fit_arrhenius", []string{"fit", "arrhenius", "$REPO/testdata/fit/diffusion.csv"}, []check{{"stdout", false, `^estimates only: a fitted law describes its data within their scatter and range`}, {"stdout", true, `gamma cubed`}}},
	{"fit_arrhenius", []string{"fit", "avrami", "$REPO/testdata/fit/crystallized-fraction.csv", "--format", "csv"}, []check{{"stdout", false, `^# estimates only: a fitted law describes`}, {"stdout", true, `gamma cubed`}}},
	{"cool_curve", []string{"cool", "--curve", "$WORK/hold.csv", "--c-curve", "k1=-0.00501,k2=1e-10s,k3=4000,k4=760K,k5=130kJ/mol"}, []check{{"stdout", false, `^estimates only: a quench factor holds for the alloy, temper and property`}, {"stdout", true, `gamma cubed`}}},
	{"cool_curve", []string{"cool", "--material", "demo-alloy", "--curve", "$WORK/hold.csv"}, []check{{"stdout", false, `gamma cubed`}}},
	{"fit_interface", []string{"fit", "interface", "$REPO/testdata/fit/nucleation-rates.csv", "--material", "demo-alloy"}, []check{{"stdout", false, `gamma cubed`}}},

	// The same quantity prints the same everywhere: the nose of vit1 in
	// ttt, cool and the memo; a cooling rate with three digits; a measured
	// curve's span in cool and the memo.
	{"hold", []string{"ttt", "--material", "vit1"}, []check{{"stdout", false, `^nose: 895\.00 K \(621\.85 °C\), 1\.00 min$`}}},
	{"hold", []string{"cool", "--material", "vit1", "--critical"}, []check{{"stdout", false, `^critical cooling rate to stay below X = 1e-06 at 625\.00 K: 0\.727 K/s `}, {"stdout", false, `^nose estimate \(Te - T_nose\)/t_nose: 1\.63 K/s \(nose 895\.00 K, 1\.00 min\)`}}},
	{"hold", []string{"report", "--material", "vit1", "--date", "2026-01-15", "--out", "-"}, []check{{"stdout", false, `^\| nose temperature +\| 895\.00 K \(621\.85 °C\) +\|`}, {"stdout", false, `^\| critical cooling rate +\| 0\.727 K/s +\|`}, {"stdout", false, `^\| nose estimate .*\| 1\.63 K/s +\|`}}},
	{"hold", []string{"cool", "--material", "demo-alloy", "--curve", "$REPO/testdata/curves/demo-quench.csv"}, []check{{"stdout", false, `, 1199\.75 K to 305\.65 K over 2\.50 min \(lowest 303\.95 K\)$`}}},
	{"hold", []string{"report", "--material", "demo-alloy", "--curve", "$REPO/testdata/curves/demo-quench.csv", "--date", "2026-01-15", "--out", "-"}, []check{{"stdout", false, `\(403 points, 1199\.75 K to 305\.65 K over 2\.50 min \(lowest 303\.95 K\)\)`}}},

	// --help in groups, each shown where it applies.
	{"hold", []string{"rate", "--help"}, []check{{"stdout", false, `(?s)^What to compute:$.*^The material:$.*^Solution values:$.*^Uncertainty:$.*^Output:$`}, {"stdout", false, `^      --supersaturation string`}}},
	{"hold", []string{"rate", "--material", "ni", "--help"}, []check{{"stdout", false, `^Solution values: not shown \(ni is not a solution; undercool rate --help without --material`}, {"stdout", true, `--supersaturation`}}},
	{"solution", []string{"rate", "--material", "$WORK/demo-solute-a.toml", "--help"}, []check{{"stdout", false, `^      --supersaturation string`}}},
	{"hold", []string{"materials", "--help"}, []check{{"stdout", false, `^Output:$`}, {"stdout", true, `^The material:$|^What to compute:$|^Uncertainty:$`}}},
	{"hold", []string{"fit", "--help"}, []check{{"stdout", false, `(?s)^Output:$.*--card-out`}}},

	// --version, and the version in the memo.
	{"hold", []string{"--version"}, []check{{"stdout", false, `^undercool \(devel\)$`}}},
	{"hold", []string{"report", "--material", "demo-alloy", "--out", "-"}, []check{{"stdout", false, `^Date: [0-9]{4}-[0-9]{2}-[0-9]{2}\. Written by undercool report \(undercool \(devel\)\)\.`}, {"stdout", false, `^undercool report --material demo-alloy --out - --date [0-9]{4}-[0-9]{2}-[0-9]{2}$`}}},
}

func TestOutputs(t *testing.T) {
	// The checks read values, not layout (TestScreenWidth and the goldens
	// pin that): a screen wide enough that no line wraps.
	t.Setenv("COLUMNS", "1000")
	root, repo := caseFiles(t)
	for _, c := range outputCases {
		code, stdout, stderr := runCase(t, root, repo, c.dir, c.args)
		name := strings.Join(c.args, " ")
		if code != 0 {
			t.Errorf("%s: exit %d: %s", name, code, stderr)
			continue
		}
		for _, k := range c.checks {
			out := stdout
			if k.stream == "stderr" {
				out = stderr
			}
			if regexp.MustCompile("(?m)"+k.re).MatchString(out) == k.not {
				t.Errorf("%s: %s %s %q:\n%s", name, k.stream, map[bool]string{true: "has", false: "lacks"}[k.not], k.re, out)
			}
		}
	}
}
