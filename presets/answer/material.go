package answer

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/floats"

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
	GammaLaw        string    `json:"gamma_law"`
	Growth          string    `json:"growth"`
	Glassy          string    `json:"below_tg,omitempty"`
	Calibrated      *Range    `json:"calibrated_range_k,omitempty"`
	Standing        Standing  `json:"standing"`
	Te              Num       `json:"equilibrium_temperature_k"`
	MolecularVolume Num       `json:"molecular_volume_m3"`
	JumpDistance    Num       `json:"jump_distance_m"`
	ShapeFactor     Num       `json:"shape_factor"`
	Values          Values    `json:"values"`
	Solution        *Solution `json:"solution,omitempty"`

	about []string // the header lines
}

// Range is a span of temperatures, K.
type Range struct {
	Lo Num `json:"low"`
	Hi Num `json:"high"`
}

// Standing is how far the card has been held against measurements (see
// presets.Standing).
type Standing struct {
	Text       string  `json:"text"`
	Estimate   bool    `json:"estimate"`
	Calibrated Strings `json:"calibrated_on"`
	Checked    Strings `json:"checked_against"`
	Error      string  `json:"rms_error,omitempty"`
	Note       string  `json:"note,omitempty"`
	Invented   bool    `json:"invented,omitempty"`
}

func standingOf(s presets.Standing) Standing {
	return Standing{Text: s.String(), Estimate: s.Estimate(), Calibrated: s.Calibrated, Checked: s.Checked, Error: s.Error, Note: s.Note, Invented: s.Invented}
}

// Mark is what stands beside every headline number of the card: InventedWord
// for an invented material, EstimateWord for an estimate, else nothing.
func (s Standing) Mark() string {
	switch {
	case s.Invented:
		return InventedWord
	case s.Estimate:
		return EstimateWord
	}
	return ""
}

// StandingLine is the header line of a card's standing.
func StandingLine(c *presets.Card) string { return "standing: " + c.Standing.String() }

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
		GammaLaw: m.GammaLaw.String(), Growth: md.GrowthName(), Glassy: glassyText(md), Standing: standingOf(c.Standing),
		Te: Num(md.Te()), MolecularVolume: Num(md.MolecularVolume()), JumpDistance: Num(md.JumpDistance()),
		ShapeFactor: Num(md.ShapeFactor()), Values: cardValues(c),
	}
	if c.Growth == "table" {
		d.Growth = "table " + c.GrowthFile
	}
	d.about = []string{
		MaterialLine(c),
		StandingLine(c),
		fmt.Sprintf("models: driving force %s; mobility %s; prefactor %s; %s", driving, mob, d.Prefactor, nucleationSite(m, c)),
	}
	if m.GammaLaw != kinetics.GammaConstant || m.GrowthLaw != nil || d.Glassy != "" {
		d.about = append(d.about, lawsLine(md, d.Growth))
	}
	if lo, hi, ok := md.Calibrated(); ok {
		d.Calibrated = &Range{Num(lo), Num(hi)}
		d.about = append(d.about, fmt.Sprintf("calibrated range: %.2f to %.2f K; answers outside it are flagged", lo, hi))
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

// glassyText says what the model does below T_g with a viscosity law; ""
// for a model without a glass transition or a viscosity law.
func glassyText(md *kinetics.Model) string {
	switch {
	case md.Tg() == 0 || !md.HasViscosity():
		return ""
	case md.Glassy():
		return fmt.Sprintf("arrhenius continuation of the viscosity from Tg = %.2f K with glass_q = %.4g kJ/mol", md.Tg(), md.Material().GlassQ/1e3)
	}
	return fmt.Sprintf("the liquid's viscosity law extrapolated below Tg = %.2f K (no glass_q)", md.Tg())
}

// lawsLine is the header line of the interface law, the growth law and
// the glassy branch.
func lawsLine(md *kinetics.Model, growth string) string {
	m := md.Material()
	parts := []string{"gamma(T) = " + m.GammaText()}
	switch g := m.GrowthLaw.(type) {
	case kinetics.ViscosityPower:
		parts = append(parts, fmt.Sprintf("growth viscosity-power u = u_g (T/Tg) (eta(Tg)/eta)^xi [1 - exp(-dmu/kT)], u_g = %.4g m/s, xi = %.4g", g.Ug, g.Xi))
	case kinetics.ArrheniusGrowth:
		parts = append(parts, fmt.Sprintf("growth arrhenius u = u_0 exp(-Q_u/RT) [1 - exp(-dmu/kT)], u_0 = %.4g m/s, Q_u = %.4g kJ/mol", g.U0, g.Q/1e3))
	case *kinetics.GrowthTable:
		parts = append(parts, fmt.Sprintf("growth %s, ln u interpolated in 1/T, %.2f to %.2f K, zero outside", growth, g.T[0], g.T[len(g.T)-1]))
	default:
		parts = append(parts, "growth "+growth)
	}
	if t := glassyText(md); t != "" {
		parts = append(parts, "below Tg: "+t)
	}
	return "laws: " + strings.Join(parts, "; ")
}

// MaterialLine names the material and where its card came from.
func MaterialLine(c *presets.Card) string {
	if c.File == c.Name {
		return "material: " + c.Name
	}
	return fmt.Sprintf("material: %s (%s)", c.Name, c.File)
}

func nucleationSite(m kinetics.Material, c *presets.Card) string {
	if m.Theta >= 180 {
		if m.Sites > 0 {
			return fmt.Sprintf("homogeneous, %.3g sites/m3", m.Sites)
		}
		return "homogeneous, every molecule a site"
	}
	sites := "every molecule a site (no site density given: an upper bound, by many orders of magnitude for particles or walls; give sites, or particle_density with particle_radius)"
	switch {
	case c.Has("particle_density"):
		sites = fmt.Sprintf("%.3g sites/m3 on %s particles/m3 of radius %s", m.Sites, c.Values["particle_density"].Text, c.Values["particle_radius"].Text)
	case m.Sites > 0:
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

// EstimateWord is what stands beside every headline number of a material
// whose standing is an estimate.
const EstimateWord = "(estimate)"

// InventedWord stands beside every headline number of an invented material.
const InventedWord = "(invented)"

// mark puts the card's mark (Standing.Mark) beside every headline number of
// a doc on a material whose standing is an estimate or invented: after each
// summary line, and in the heads of the columns whose keys begin with one of
// cols.
func (m Material) mark(d *Doc, cols ...string) {
	word := m.Standing.Mark()
	if word == "" {
		return
	}
	for i := range d.Summary {
		d.Summary[i] += " " + word
	}
	if d.Table == nil {
		return
	}
	for i, c := range d.Table.Cols {
		for _, k := range cols {
			if strings.HasPrefix(c.Key, k) {
				d.Table.Cols[i].Head += " " + word
				break
			}
		}
	}
}

// checkGamma is an *InputError when the interfacial-energy law of the
// model is not positive somewhere in the temperatures asked for (K).
// Temperatures that are not positive (unset) are left out.
func checkGamma(md *kinetics.Model, temps ...float64) error {
	var asked []float64
	for _, T := range temps {
		if T > 0 {
			asked = append(asked, T)
		}
	}
	if len(asked) == 0 {
		return nil
	}
	lo, hi := floats.Min(asked), floats.Max(asked)
	if err := md.CheckGamma(lo, hi); err != nil {
		return &InputError{"gamma_slope", err}
	}
	return nil
}
