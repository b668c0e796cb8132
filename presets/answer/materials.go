package answer

import (
	"math"

	"undercool/presets"
)

// Shipped is the list of the shipped material cards.
type Shipped struct {
	Inputs struct{}      `json:"inputs"`
	Rows   []ShippedCard `json:"rows"`

	names Names
}

// ShippedCard is one shipped card.
type ShippedCard struct {
	Name        string `json:"name" col:"name"`
	Kind        string `json:"kind" col:"kind"`
	Te          Num    `json:"equilibrium_temperature_k" col:"T_e (K),f2"`
	Standing    string `json:"standing" col:"standing"`
	Description string `json:"description" col:"description"`
}

// ListShipped lists the shipped cards with their equilibrium (or saturation)
// temperatures. A shipped card that does not load is an error (a bug the
// tests catch).
func ListShipped(names Names) (*Shipped, error) {
	a := &Shipped{names: names}
	for _, n := range presets.Names() {
		c, err := presets.Preset(n)
		if err != nil {
			return nil, err
		}
		te := math.NaN()
		if c.Has("te") {
			te = c.SI("te")
		} else if c.Driving == "solution" && c.Has("sat_temp") {
			te = c.SI("sat_temp") // a solution's equilibrium is its saturation temperature
		} else if md, err := c.Model(); err == nil {
			te = md.Te() // the solvus temperature of a dilute alloy
		}
		a.Rows = append(a.Rows, ShippedCard{c.Name, c.Kind, Num(te), c.Standing.Short(), c.Description})
	}
	return a, nil
}

// Doc is how the list reads.
func (a *Shipped) Doc() Doc {
	return Doc{
		Title: "undercool materials: shipped material cards",
		About: []string{"show one with: undercool materials NAME; use one with: " + a.names.of("material") + " NAME"},
		Table: tableOf(a.Rows),
	}
}

// CardShown is one card with every value, its unit and its source.
type CardShown struct {
	Inputs CardInputs  `json:"inputs"`
	Rows   []CardValue `json:"rows"`
}

// CardInputs are a card's names and model choices, as written.
type CardInputs struct {
	Name        string   `json:"material"`
	Card        string   `json:"card"`
	Kind        string   `json:"kind"`
	Description string   `json:"description"`
	Driving     string   `json:"driving"`
	Mobility    string   `json:"mobility"`
	Prefactor   string   `json:"prefactor"`
	GammaLaw    string   `json:"gamma_law"`
	Growth      string   `json:"growth"`
	Standing    Standing `json:"standing"`
}

// CardValue is one value of a card.
type CardValue struct {
	Key     string `json:"key" col:"key"`
	Text    string `json:"text" col:"value"`
	SI      Num    `json:"value_si" col:"SI value,g6,2"`
	Unit    string `json:"unit_si" col:"SI unit,,2"`
	Meaning string `json:"meaning" col:"meaning,,1"`
	Source  string `json:"source" col:"source"`
}

// Show is a card as written, every value with its meaning and source.
func Show(c *presets.Card) *CardShown {
	driving := c.Driving
	if c.Driving == "table" {
		driving += " " + c.DrivingFile
	}
	mob, pre := c.Mobility, c.Prefactor
	if mob == "" {
		mob = "none"
	}
	if pre == "" {
		pre = "attachment"
	}
	law, growth := c.Choice("gamma_law"), c.Choice("growth")
	if growth == "table" {
		growth += " " + c.GrowthFile
	}
	a := &CardShown{Inputs: CardInputs{c.Name, c.File, c.Kind, c.Description, driving, mob, pre, law, growth, standingOf(c.Standing)}}
	for _, p := range presets.Params {
		if v, ok := c.Values[p.Key]; ok {
			a.Rows = append(a.Rows, CardValue{p.Key, v.Text, Num(v.SI), v.Kind.SI, p.About, v.Source})
		}
	}
	return a
}

// Doc is how the card reads.
func (a *CardShown) Doc() Doc {
	in := a.Inputs
	return Doc{
		Title: "undercool materials: " + in.Name,
		About: []string{
			"card: " + in.Card, "kind: " + in.Kind, "description: " + in.Description,
			"standing: " + in.Standing.Text,
			"models: driving force " + in.Driving + "; mobility " + in.Mobility + "; prefactor " + in.Prefactor + "; interfacial energy " + in.GammaLaw + "; growth " + in.Growth,
		},
		Table: tableOf(a.Rows),
	}
}
