package main

import (
	"fmt"
	"math"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/presets"
)

// solutionKeys are the card values that only a solution uses: giving one on
// the command line turns the driving force to "solution" unless --driving
// says otherwise.
var solutionKeys = []string{"supersaturation", "sat_temp", "dh_sol", "conc"}

// applySolution puts --solubility on the card and switches the driving
// force to a solution when a solution value is given.
func (mf *materialFlags) applySolution(c *presets.Card) {
	given := mf.set("solubility")
	if given {
		c.SolubilityFile = mf.solubility
	}
	for _, k := range solutionKeys {
		given = given || mf.set(flagName(k))
	}
	if given && !mf.set("driving") && c.Driving != "solution" {
		c.Driving = "solution"
		if c.Kind == "demo" && c.File == "command line" {
			c.Kind = "solution"
		}
	}
}

// describeSolution adds the solution's line to the header and its entry
// to the JSON inputs, for a model with a solution driving force.
func describeSolution(c *presets.Card, md *kinetics.Model, lines []string, inputs object) ([]string, object) {
	sol, ok := md.Solution()
	if !ok {
		return lines, inputs
	}
	te := md.Te()
	sat := fmt.Sprintf("saturated at %.2f K (%.2f °C)", te, te-273.15)
	var line string
	in := object{{"model", sol.Name()}, {"saturation_temperature_k", te}}
	switch d := sol.(type) {
	case cnt.Supersaturation:
		line = fmt.Sprintf("solution: fixed supersaturation S = %.4g (ln S = %.4g) at every temperature; reference saturation temperature %.2f K", d.S, math.Log(d.S), te)
		in = append(in, kv{"supersaturation", d.S})
	case cnt.VantHoff:
		line = fmt.Sprintf("solution: %s and cooled at constant concentration; ideal (van 't Hoff) solubility, dh_sol = %.4g kJ/mol; S = 1 at and above T_sat", sat, d.DHsol/1e3)
		in = append(in, kv{"dh_sol_j_per_mol", d.DHsol})
	case *cnt.SolubilityTable:
		conc := fmt.Sprintf("%.4g (SI)", d.Conc)
		if v, ok := c.Values["conc"]; ok {
			conc = v.Text
		}
		line = fmt.Sprintf("solution: solubility table %s (%.2f to %.2f K), concentration %s, %s; ln c_sat interpolated linearly in 1/T, none outside the table",
			d.Label, d.T[0], d.T[len(d.T)-1], conc, sat)
		in = append(in, kv{"solubility_table", d.Label}, kv{"concentration_si", d.Conc})
	}
	// Before the "derived:" line, which is last.
	n := len(lines)
	lines = append(lines[:n-1:n-1], line, lines[n-1])
	inputs = append(inputs, kv{"solution", in})
	return lines, inputs
}

// addSupersaturationColumn puts the supersaturation S(T) beside the
// undercooling in a rate table of a solution (T_sat − T alone does not say
// how supersaturated the solution is). The rows must be rateRow's.
func addSupersaturationColumn(r *result, md *kinetics.Model, temps []float64) {
	sol, ok := md.Solution()
	if !ok || len(r.cols) < 3 {
		return
	}
	const at = 3 // after T (K), T (°C), ΔT (K)
	cols := make([]column, 0, len(r.cols)+1)
	cols = append(cols, r.cols[:at]...)
	cols = append(cols, column{"S", "supersaturation", sig(4)})
	r.cols = append(cols, r.cols[at:]...)
	for i, row := range r.rows {
		out := make([]any, 0, len(row)+1)
		out = append(out, row[:at]...)
		out = append(out, math.Exp(sol.LnS(temps[i])))
		r.rows[i] = append(out, row[at:]...)
	}
}
