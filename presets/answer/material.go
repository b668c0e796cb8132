package answer

import (
	"fmt"
	"math"
	"strings"

	"undercool/cnt"
	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/units"
)

// Material names the material an answer is for, the model choices and
// every value with its source, so that any output describes itself.
type Material struct {
	Name            string    `json:"material"`
	Card            string    `json:"card"`
	Driving         string    `json:"driving"`
	Mobility        string    `json:"mobility"`
	Prefactor       string    `json:"prefactor"`
	Te              Num       `json:"equilibrium_temperature_k"`
	MolecularVolume Num       `json:"molecular_volume_m3"`
	JumpDistance    Num       `json:"jump_distance_m"`
	ShapeFactor     Num       `json:"shape_factor"`
	Values          Values    `json:"values"`
	Solution        *Solution `json:"solution,omitempty"`

	about []string // the header lines
}

// Values are the values of a card, in the order of presets.Params; JSON
// writes them as one object keyed by the card keys.
type Values []Value

// Value is one value of a card.
type Value struct {
	Key    string `json:"-"`
	SI     Num    `json:"value_si"`
	Unit   string `json:"unit_si"`
	Text   string `json:"text"`
	Source string `json:"source"`
}

func (vs Values) MarshalJSON() ([]byte, error) {
	o := make(Object, len(vs))
	for i, v := range vs {
		o[i] = Field{v.Key, v}
	}
	return o.MarshalJSON()
}

// cardValues are the values of a card in the order of presets.Params.
func cardValues(c *presets.Card) Values {
	var out Values
	for _, p := range presets.Params {
		if v, ok := c.Values[p.Key]; ok {
			out = append(out, Value{Key: p.Key, SI: Num(v.SI), Unit: v.Kind.SI, Text: v.Text, Source: v.Source})
		}
	}
	return out
}

// Solution describes a solution's driving force.
type Solution struct {
	Model           string `json:"model"`
	SatTemp         Num    `json:"saturation_temperature_k"`
	Supersaturation Num    `json:"supersaturation,omitempty"`
	DHsol           Num    `json:"dh_sol_j_per_mol,omitempty"`
	Table           string `json:"solubility_table,omitempty"`
	Conc            Num    `json:"concentration_si,omitempty"`
}

// About are the header lines of the material.
func (m Material) About() []string { return m.about }

// Describe names the material of a card and its model.
func Describe(c *presets.Card, md *kinetics.Model) Material {
	m := md.Material()
	mob := "none"
	if m.Mobility != nil {
		mob = m.Mobility.Name()
	}
	driving := m.Driving.Name()
	if c.Driving == "table" {
		driving = "table " + c.DrivingFile
	}
	d := Material{
		Name: c.Name, Card: c.File, Driving: driving, Mobility: mob, Prefactor: m.Prefactor.String(),
		Te: Num(md.Te()), MolecularVolume: Num(md.MolecularVolume()), JumpDistance: Num(md.JumpDistance()),
		ShapeFactor: Num(md.ShapeFactor()), Values: cardValues(c),
	}
	d.about = []string{
		MaterialLine(c),
		fmt.Sprintf("models: driving force %s; mobility %s; prefactor %s; %s", driving, mob, d.Prefactor, nucleationSite(m)),
	}
	var vals []string
	for _, v := range d.Values {
		vals = append(vals, fmt.Sprintf("%s = %s", v.Key, v.Text))
	}
	if len(vals) > 0 {
		// one line, which a terminal wraps to its width and Markdown keeps as one item
		d.about = append(d.about, "values: "+strings.Join(vals, ", "))
	}
	if sol, ok := md.Solution(); ok {
		var line string
		d.Solution, line = describeSolution(c, sol, md.Te())
		d.about = append(d.about, line)
	}
	d.about = append(d.about, fmt.Sprintf("derived: v = %.4g m3 per molecule, jump distance = %.4g m, f(theta) = %.4g", md.MolecularVolume(), md.JumpDistance(), md.ShapeFactor()))
	return d
}

// MaterialLine names the material and where its card came from.
func MaterialLine(c *presets.Card) string {
	if c.File == c.Name {
		return "material: " + c.Name
	}
	return fmt.Sprintf("material: %s (%s)", c.Name, c.File)
}

func nucleationSite(m kinetics.Material) string {
	if m.Theta >= 180 {
		if m.Sites > 0 {
			return fmt.Sprintf("homogeneous, %.3g sites/m3", m.Sites)
		}
		return "homogeneous, every molecule a site"
	}
	sites := "every molecule a site"
	if m.Sites > 0 {
		sites = fmt.Sprintf("%.3g sites/m3", m.Sites)
	}
	return fmt.Sprintf("heterogeneous, contact angle %.4g deg, %s", m.Theta, sites)
}

// describeSolution is the JSON entry and the header line of a solution's
// driving force, saturated at te.
func describeSolution(c *presets.Card, sol cnt.Solution, te float64) (*Solution, string) {
	sat := fmt.Sprintf("saturated at %s", KelvinCelsius(te))
	s := &Solution{Model: sol.Name(), SatTemp: Num(te)}
	var line string
	switch d := sol.(type) {
	case cnt.Supersaturation:
		line = fmt.Sprintf("solution: fixed supersaturation S = %.4g (ln S = %.4g) at every temperature; reference saturation temperature %.2f K", d.S, math.Log(d.S), te)
		if math.IsNaN(te) {
			line = fmt.Sprintf("solution: fixed supersaturation S = %.4g (ln S = %.4g) at every temperature; no saturation temperature given, so no undercooling (—)", d.S, math.Log(d.S))
		}
		s.Supersaturation = Num(d.S)
	case cnt.VantHoff:
		line = fmt.Sprintf("solution: %s and cooled at constant concentration; ideal (van 't Hoff) solubility, dh_sol = %.4g kJ/mol; S = 1 at and above T_sat", sat, d.DHsol/1e3)
		s.DHsol = Num(d.DHsol)
	case *cnt.SolubilityTable:
		conc := fmt.Sprintf("%.4g (SI)", d.Conc)
		if v, ok := c.Values["conc"]; ok {
			conc = v.Text
		}
		line = fmt.Sprintf("solution: solubility table %s (%.2f to %.2f K), concentration %s, %s; ln c_sat interpolated linearly in 1/T, none outside the table",
			d.Label, d.T[0], d.T[len(d.T)-1], conc, sat)
		s.Table, s.Conc = d.Label, Num(d.Conc)
	}
	return s, line
}

// KelvinCelsius writes a temperature in both scales: "900.00 K (626.85 °C)".
func KelvinCelsius(T float64) string {
	return fmt.Sprintf("%.2f K (%.2f °C)", T, units.Celsius(T))
}

// Transformation is the isothermal transformation law of an answer.
type Transformation struct {
	Law    string `json:"transformation"`
	Lag    bool   `json:"time_lag"`
	Nuclei Num    `json:"nuclei_per_m3,omitempty"`
}

func describeJMAK(j kinetics.JMAK) Transformation {
	return Transformation{Law: j.Describe(), Lag: j.Lag, Nuclei: Num(j.Nuclei)}
}

// line is the header line of the transformation law.
func (t Transformation) line() string { return "transformation: " + t.Law }
