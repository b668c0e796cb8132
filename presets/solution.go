package presets

import (
	"fmt"
	"math"
	"strings"

	"undercool/cnt"
	"undercool/presets/units"
)

// A card with driving "solution" describes a crystal forming from a
// solution. Its supersaturation S comes from, in this order of precedence:
//
//	supersaturation                 a fixed S (sat_temp, or a table and conc, sets T_sat)
//	solubility_table + conc         S = conc/c_sat(T); T_sat where c_sat = conc
//	solubility_table + sat_temp     a solution saturated at sat_temp: conc = c_sat(sat_temp)
//	sat_temp + dh_sol               ideal van 't Hoff solubility at constant concentration
//
// T_sat takes the place of the equilibrium temperature: S = 1 there, and a
// cooling path starts there.

// solubilityColumns are the columns of a solubility table, one set per
// family of concentration units (concKinds); a file uses one.
func solubilityColumns(k units.Kind) []Column {
	return []Column{
		{Quantity: "temperature", Kind: units.Temperature, Required: true},
		{Quantity: "solubility", Kind: k, Required: true},
	}
}

// solubilityData is a solubility table read from a file.
type solubilityData struct {
	File  string
	T, C  []float64  // K; solubility in the SI unit of Kind
	Kind  units.Kind // the family of its concentration unit
	Lines []int      // file line of every row
}

// readSolubility reads a CSV of temperature and solubility, such as
//
//	temperature_c,solubility_g_per_kg
//	10,9.8
//
// The solubility column may be an amount concentration (solubility_mol_per_l),
// a mass concentration (solubility_g_per_l), a mass ratio
// (solubility_g_per_kg, solubility_g_per_100g) or a plain mole fraction
// (solubility). Errors name the file and line.
func readSolubility(path string) (*solubilityData, error) {
	var first error
	for _, k := range concKinds {
		d, err := ReadDataFile(path, nil, solubilityColumns(k))
		if err == nil {
			return &solubilityData{File: path, T: d.Columns["temperature"], C: d.Columns["solubility"], Kind: k, Lines: d.Lines}, nil
		}
		msg := err.Error()
		headerProblem := strings.Contains(msg, `column "solubility`) && (strings.Contains(msg, "is not a unit of") || strings.Contains(msg, "needs a unit"))
		if !headerProblem {
			return nil, err
		}
		if first == nil {
			first = err
		}
	}
	return nil, fmt.Errorf("%s: the solubility column must be solubility_UNIT with UNIT an amount concentration (mol_per_l), a mass concentration (g_per_l, mg_per_ml), a mass ratio (g_per_kg, g_per_100g), or plain \"solubility\" for a mole fraction", path)
}

// MolarVolume is the card's molar volume of the new phase, m³/mol: vm, or
// molar_mass/density; false when it has neither.
func (c *Card) MolarVolume() (float64, bool) {
	if c.Has("vm") {
		return c.SI("vm"), true
	}
	return c.massVolume()
}

// massVolume is V_m = M/ρ from molar_mass and density, when both are given.
func (c *Card) massVolume() (float64, bool) {
	if c.Has("molar_mass") && c.Has("density") {
		return c.SI("molar_mass") / c.SI("density"), true
	}
	return 0, false
}

// solution is the driving force of a solution card, with its saturation
// temperature.
func (b *builder) solution() (cnt.DrivingForce, error) {
	c := b.c
	var tab *cnt.SolubilityTable
	var sol *solubilityData
	if c.SolubilityFile != "" {
		var err error
		if tab, sol, err = b.solubilityTable(); err != nil {
			return nil, err
		}
	}
	switch {
	case c.Has("supersaturation"):
		s := cnt.Supersaturation{S: b.opt("supersaturation", 0)}
		switch {
		case tab != nil && c.tableBasis() == "conc":
			ts, err := saturation(tab, sol)
			if err != nil {
				return nil, err
			}
			s.Tsat = ts
		case c.Has("sat_temp"):
			s.Tsat = b.opt("sat_temp", 0)
		}
		// Without either, no saturation temperature: the model answers at
		// the temperatures given, and has no default range or undercooling.
		return s, b.err
	case tab != nil:
		if basis := c.tableBasis(); basis != "sat_temp" {
			ts, err := saturation(tab, sol)
			if err != nil {
				return nil, err
			}
			if basis == "both" && math.Abs(ts-c.SI("sat_temp")) > 0.01 {
				return nil, fmt.Errorf("%s: conc %s and sat_temp %s disagree: the solubility table puts the saturation of conc at %.2f K; give one of them", c.File, c.Values["conc"].Text, c.Values["sat_temp"].Text, ts)
			}
		} else {
			tab.Tsat = b.opt("sat_temp", 0)
		}
		return tab, nil
	case c.Has("sat_temp") && c.Has("dh_sol"):
		return cnt.VantHoff{Tsat: b.opt("sat_temp", 0), DHsol: b.opt("dh_sol", 0)}, nil
	}
	return nil, fmt.Errorf("%s: driving \"solution\" needs a supersaturation: supersaturation (with sat_temp), or sat_temp and dh_sol (van 't Hoff), or a solubility table (solubility_table) with conc or sat_temp", c.File)
}

// solubility is the card's solubility table as read, read on first use.
func (c *Card) solubility() (*solubilityData, error) {
	if c.SolubilityFile == "-" {
		return nil, fmt.Errorf("%s: the solubility table must be a file, not stdin", c.File)
	}
	if c.tables == nil {
		c.tables = &tables{}
	}
	t := c.tables
	if t.sol != nil && t.solFile == c.SolubilityFile {
		return t.sol, nil
	}
	sol, err := readSolubility(c.SolubilityFile)
	if err != nil {
		return nil, err
	}
	t.solFile, t.sol = c.SolubilityFile, sol
	return sol, nil
}

// solubilityTable reads the card's solubility table and pairs it with the
// concentration: conc (same family of units) or, without it, the solubility
// at sat_temp.
func (b *builder) solubilityTable() (*cnt.SolubilityTable, *solubilityData, error) {
	c := b.c
	sol, err := c.solubility()
	if err != nil {
		return nil, nil, err
	}
	row := func(err error) error {
		// cnt reports rows from 1 in file order; give the file line.
		var n int
		if _, e := fmt.Sscanf(err.Error(), "row %d:", &n); e == nil && n >= 1 && n <= len(sol.Lines) {
			return fmt.Errorf("%s:%d: %s", sol.File, sol.Lines[n-1], strings.TrimSpace(strings.SplitN(err.Error(), ":", 2)[1]))
		}
		return fmt.Errorf("%s: %v", sol.File, err)
	}
	for i, x := range sol.C {
		if !(x > 0) {
			return nil, nil, fmt.Errorf("%s:%d: the solubility must be positive", sol.File, sol.Lines[i])
		}
	}
	// Check the rows with a placeholder concentration first.
	probe, err := cnt.NewSolubilityTable(sol.T, sol.C, 1, sol.File)
	if err != nil {
		return nil, nil, row(err)
	}
	var conc float64
	switch c.tableBasis() {
	case "conc", "both":
		v := c.Values["conc"]
		b.read["conc"] = v.SI
		if v.Kind.Name != sol.Kind.Name {
			return nil, nil, fmt.Errorf("%s: conc %s is a %s but the solubility table %s is a %s: give both in the same family of units", c.File, v.Text, familyName(v.Kind), sol.File, familyName(sol.Kind))
		}
		conc = v.SI
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, x := range sol.C {
			lo, hi = math.Min(lo, x), math.Max(hi, x)
		}
		if !(conc >= lo && conc <= hi) {
			return nil, nil, fmt.Errorf("%s: conc %s lies outside the solubilities of %s (%.4g to %.4g %s): no saturation temperature in the table", c.File, v.Text, sol.File, lo, hi, sol.Kind.SI)
		}
	case "sat_temp":
		ts := b.opt("sat_temp", 0)
		conc = probe.ConcentrationAt(ts)
		if math.IsNaN(conc) {
			return nil, nil, fmt.Errorf("%s: sat_temp %s lies outside the solubility table %s (%.2f to %.2f K)", c.File, c.Values["sat_temp"].Text, sol.File, probe.T[0], probe.T[len(probe.T)-1])
		}
	default:
		return nil, nil, fmt.Errorf("%s: the solubility table %s needs the solution's concentration: conc (in the table's units) or sat_temp", c.File, sol.File)
	}
	tab, err := cnt.NewSolubilityTable(sol.T, sol.C, conc, sol.File)
	if err != nil {
		return nil, nil, row(err)
	}
	return tab, sol, nil
}

// tableBasis says which value fixes the solution of a solubility table:
// "conc", "sat_temp", "both" (given alike: they must agree) or "" (neither).
// A value from the command line wins over the other one from the card.
func (c *Card) tableBasis() string {
	hc, hs := c.Has("conc"), c.Has("sat_temp")
	switch {
	case hc && hs:
		lc, ls := c.Values["conc"].Line, c.Values["sat_temp"].Line
		switch {
		case lc == 0 && ls > 0:
			return "conc"
		case ls == 0 && lc > 0:
			return "sat_temp"
		}
		return "both"
	case hc:
		return "conc"
	case hs:
		return "sat_temp"
	}
	return ""
}

// saturation is the saturation temperature of a table's concentration; a
// solubility that does not rise with temperature is named by its file line.
func saturation(tab *cnt.SolubilityTable, sol *solubilityData) (float64, error) {
	if ok, r := tab.Increasing(); !ok {
		n := len(sol.Lines)
		i := r - 1 // index in ascending temperature
		if sol.T[0] > sol.T[n-1] {
			i = n - r
		}
		return 0, fmt.Errorf("%s:%d: the solubility does not rise with temperature here (it must, to give one saturation temperature for conc)", sol.File, sol.Lines[i])
	}
	ts, err := tab.SaturationTemperature()
	if err != nil {
		return 0, fmt.Errorf("%s: %v", sol.File, err)
	}
	return ts, nil
}

func familyName(k units.Kind) string {
	if k.Name == units.Dimensionless.Name {
		return "mole fraction"
	}
	return k.Name
}

// numberConc is the number concentration of solute molecules, m⁻³: given,
// or from conc when it is an amount or (with molar_mass) a mass concentration.
func (b *builder) numberConc() (float64, error) {
	c := b.c
	if c.Has("number_conc") {
		return b.opt("number_conc", 0), nil
	}
	if !c.Has("conc") {
		return 0, fmt.Errorf("%s: %v", c.File, errNoNumberConc)
	}
	v := c.Values["conc"]
	switch v.Kind.Name {
	case units.AmountConcentration.Name:
		return b.opt("conc", 0) * cnt.Avogadro, nil
	case units.MassConcentration.Name:
		if c.Has("molar_mass") {
			return b.opt("conc", 0) / b.opt("molar_mass", 0) * cnt.Avogadro, nil
		}
	}
	return 0, fmt.Errorf("%s: %v", c.File, errNoNumberConc)
}
