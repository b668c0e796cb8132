package main

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets"
)

// DefaultZoneEnd is where a cooled solution's path ends without --end, as
// a fraction of the saturation temperature (about 60 K below a solution
// saturated at room temperature; common practice for a search range).
const DefaultZoneEnd = 0.8

// solutionCool answers cool --rate for a solution: the metastable zone
// width, the onset of the first nucleus in --volume cooled at each rate
// from the saturation temperature. It reports whether it handled the
// command (false: not a solution, or no --volume for a solution with a
// growth rate: the ordinary cool, the transformed fraction, goes on).
func solutionCool(e *env, cf *coolFlags, pf *plotFlag, c *presets.Card, md *kinetics.Model, V float64, format string) (bool, error) {
	sol, ok := md.Solution()
	if !ok || !cf.set("rate") {
		return false, nil
	}
	if !cf.set("volume") {
		if md.HasGrowth() {
			return false, nil // the transformed fraction on cooling, as for a melt
		}
		return true, usagef("--volume: required for a cooled solution: the metastable zone ends where the expected number of nuclei in the volume, V times the integral of J dt, reaches 1")
	}
	if _, fixed := sol.(cnt.Supersaturation); fixed {
		return true, usagef("cool: a fixed supersaturation does not change on cooling; the metastable zone width needs a solubility law: --sat-temp with --dh-sol, or a solubility table (--solubility FILE.csv with --conc)")
	}
	if !md.HasRate() {
		return true, usagef("the material has no nucleation rate, so no metastable zone: give --prefactor fixed with --j0 (the apparent A that fit induction gives), or a mobility law (--solvent-viscosity, --solute-diffusivity)")
	}
	tsat := md.Te()
	end, endWhy := DefaultZoneEnd*tsat, fmt.Sprintf("default %.2g T_sat; give --end to change it", DefaultZoneEnd)
	if tab, ok := sol.(*cnt.SolubilityTable); ok && tab.T[0] > end {
		end, endWhy = tab.T[0], "the coldest row of the solubility table"
	}
	if cf.set("end") {
		var err error
		if end, err = parseTemp(e, "end", cf.end); err != nil {
			return true, err
		}
		if !(end < tsat) {
			return true, usagef("--end: %s is not below the saturation temperature %.2f K (%.2f °C): the path starts at saturation and cools from there", cf.end, tsat, tsat-273.15)
		}
		endWhy = "--end"
		if tab, ok := sol.(*cnt.SolubilityTable); ok && end < tab.T[0] {
			return true, usagef("--end: %s is below the solubility table %s, which starts at %.2f K", cf.end, tab.Label, tab.T[0])
		}
	}
	rates, err := cf.rates()
	if err != nil {
		return true, err
	}
	about, inputs := describeCard(c, md)
	about = append(about,
		fmt.Sprintf("path: linear cooling from the saturation temperature %.2f K (%.2f °C) to %.2f K (%s)", tsat, tsat-273.15, end, endWhy),
		fmt.Sprintf("onset: the first nucleus expected in %s (%.4g m3), where V times the integral of J dt reaches 1", cf.volume, V))
	inputs = append(inputs, kv{"volume_m3", V}, kv{"end_temperature_k", end})
	r := &result{
		title:  "undercool cool: metastable zone width of a cooled solution",
		about:  about,
		inputs: inputs,
		cols: []column{
			{"rate (K/min)", "cooling_rate_k_per_min", sig(4)},
			{"rate (K/s)", "cooling_rate_k_per_s", sig(4)},
			{"onset T (K)", "onset_temperature_k", fixed(2)},
			{"onset T (°C)", "onset_temperature_c", fixed(2)},
			{"ΔT_max (K)", "onset_undercooling_k", fixed(3)},
			{"S at onset", "supersaturation_at_onset", sig(4)},
			{"time (s)", "onset_time_s", sig(4)},
			{"n* at onset", "critical_size_at_onset", sig(3)},
			{"flags", "flags", nil},
		},
	}
	var all kinetics.Flag
	var lnQ, lnW []float64
	for _, q := range rates {
		o, err := md.MetastableZone(V, q, end)
		if err != nil {
			return true, fmt.Errorf("cool: %v", err)
		}
		if !o.Reached {
			r.rows = append(r.rows, []any{q * 60, q, math.NaN(), math.NaN(), math.NaN(), math.NaN(), math.NaN(), math.NaN(), []string{"not_reached"}})
			r.notes = append(r.notes, fmt.Sprintf("at %.4g K/min fewer than one nucleus is expected by %.2f K (%s expected): no onset on this path", q*60, end, expectedText(o.LnExpected)))
			continue
		}
		s := md.At(o.Temp)
		all |= s.Flags
		w := tsat - o.Temp
		r.rows = append(r.rows, []any{q * 60, q, o.Temp, o.Temp - 273.15, w, math.Exp(sol.LnS(o.Temp)), o.Time, s.Nucleus.Size, s.Flags.Keys()})
		lnQ, lnW = append(lnQ, math.Log(q)), append(lnW, math.Log(w))
	}
	if len(r.rows) == 1 && len(lnW) == 1 {
		row := r.rows[0]
		r.summary = []string{fmt.Sprintf("onset at %.4g K/min: %.2f K (%.2f °C), metastable zone width %.3f K, S = %.4g", row[0], row[2], row[3], row[4], row[5])}
		r.extra = object{{"onset_temperature_k", row[2]}, {"onset_undercooling_k", row[4]}, {"supersaturation_at_onset", row[5]}, {"cooling_rate_k_per_s", row[1]}}
	}
	if len(lnW) >= 2 {
		if l, err := fit.Line(lnW, lnQ, nil); err == nil {
			r.summary = append(r.summary, fmt.Sprintf("rate against width: ln q = %.4g + %.4g ln ΔT_max (the apparent order m of Nyvlt's relation q ∝ ΔT_max^m)", l.Intercept, l.Slope))
			r.extra = append(r.extra, kv{"nyvlt_order", l.Slope})
		}
	}
	r.notes = append(r.notes, flagNotes(all)...)
	if all&kinetics.FlagSmallNucleus != 0 {
		r.notes = append(r.notes, "the critical nucleus at the onset holds fewer than 10 molecules: CNT is outside its range; with an apparent gamma and prefactor the width is a correlation of the measurements they came from")
	}
	r.notes = append(r.notes, "this is the onset of the first nucleus; a measured width also needs the crystals to grow to a detectable amount, so it is wider (Kubota N., J. Cryst. Growth 310 (2008) 629)")
	r.notes = append(r.notes, caution)
	if pf.wanted() {
		var pts plotter.XYs
		for _, row := range r.rows {
			if w, ok := row[4].(float64); ok && !math.IsNaN(w) {
				pts = append(pts, plotter.XY{X: row[0].(float64), Y: w})
			}
		}
		if len(pts) == 0 {
			return true, usagef("--plot: no rate reaches an onset on this path; nothing to draw")
		}
		if err := zonePlot(pf, c.Name, pts); err != nil {
			return true, err
		}
		r.notes = append(r.notes, "plot written: "+pf.path)
	}
	return true, r.render(e.stdout, format)
}

// zonePlot draws the metastable zone width against the cooling rate, the
// rate on a log axis.
func zonePlot(pf *plotFlag, name string, pts plotter.XYs) error {
	l, s, err := plotter.NewLinePoints(pts)
	if err != nil {
		return fmt.Errorf("--plot: %v", err)
	}
	l.Color, s.Color = curveColor(0), curveColor(0)
	p := plot.New()
	p.Title.Text = "metastable zone width, " + name
	p.X.Label.Text = "cooling rate (K/min), log scale"
	p.Y.Label.Text = "width T_sat - T_onset (K)"
	p.X.Scale = plot.LogScale{}
	p.X.Tick.Marker = plot.LogTicks{}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, q := range pts {
		lo, hi = math.Min(lo, q.X), math.Max(hi, q.X)
	}
	p.X.Min, p.X.Max = lo/1.5, hi*1.5 // room for the decade labels at the ends
	p.Add(plotter.NewGrid(), l, s)
	return savePlots(pf.path, pf.format, p)
}

// expectedText writes a small expected number of nuclei from its logarithm.
func expectedText(lnN float64) string {
	switch {
	case math.IsInf(lnN, -1):
		return "none"
	case lnN > math.Log(1e-3):
		return fmt.Sprintf("%.3g", math.Exp(lnN))
	}
	return fmt.Sprintf("10^%.1f", lnN/math.Ln10)
}
