package answer

import (
	"errors"
	"fmt"
	"math"
	"strconv"

	"undercool/kinetics"
	"undercool/presets"
)

// LinearInput asks what linear cooling from T_e does: at given rates (a
// CCT table), or the critical rate (Critical), and where a first nucleus
// appears in a sample volume.
type LinearInput struct {
	Card     *presets.Card
	Model    *kinetics.Model
	End      float64   // K, where the path ends; 0: the glass transition, or where the rest is negligible
	X        float64   // the fraction to stay below or to reach
	V        float64   // m³, the sample volume for the onset; 0: none
	Rates    []float64 // K/s, given rates
	Critical bool      // find the critical rate (Rates are then ignored)
	Sampling *Sampling
	Names    Names
}

// LinearInputs are the inputs of linear cooling: the material and the path.
type LinearInputs struct {
	Material
	Path      string `json:"path"` // "linear"
	End       Num    `json:"end_temperature_k"`
	EndReason string `json:"end_reason"`
	X         Num    `json:"target_fraction"`
	V         Num    `json:"volume_m3,omitempty"`
}

// CoolRow is where cooling at one rate reaches the fraction (the CCT table).
type CoolRow struct {
	Rate     Num  `json:"cooling_rate_k_per_s" col:"rate (K/s),g4"`
	Fraction Num  `json:"fraction" col:"fraction at end,g4" result:"fraction at the end of the path"`
	T        Num  `json:"temperature_k" col:"X reached at T (K),f2"`
	Time     Num  `json:"time_s" col:"after,time"`
	OnsetT   *Num `json:"onset_temperature_k,omitempty" col:"onset T (K),f2"`
	OnsetDT  *Num `json:"onset_undercooling_k,omitempty" col:"onset ΔT (K),f2"`
	Expected *Num `json:"expected_nuclei,omitempty" col:"nuclei expected,g4,1"`
}

// Critical is the critical cooling rate to stay below a fraction, with the
// nose estimate beside it and a CCT table about it.
type Critical struct {
	Inputs       LinearInputs `json:"inputs"`
	Rate         Num          `json:"critical_cooling_rate_k_per_s" result:"critical cooling rate"` // 0: none needed
	NoseEstimate Num          `json:"nose_estimate_k_per_s"`
	Nose         TimeAt       `json:"nose"`
	*Onset
	// NucleiAtX is the number of nuclei expected in the sample volume
	// where, at the critical rate, the fraction reaches X.
	NucleiAtX   *Num         `json:"expected_nuclei_at_fraction,omitempty"`
	Flags       Strings      `json:"flags"`
	Uncertainty *Uncertainty `json:"uncertainty,omitempty"`
	Rows        []CoolRow    `json:"rows"`

	linear
	nose kinetics.Nose
}

// CCT is what cooling at given rates does: the CCT table and, for one
// rate, the fraction at the end of the path.
type CCT struct {
	Inputs LinearInputs `json:"inputs"`
	*AtRate
	Critical    Num          `json:"critical_cooling_rate_k_per_s" result:"critical cooling rate"`
	Flags       Strings      `json:"flags"`
	Uncertainty *Uncertainty `json:"uncertainty,omitempty"`
	Rows        []CoolRow    `json:"rows"`

	linear
}

// AtRate is what cooling at one rate does: with a sample volume, the
// first nucleus first.
type AtRate struct {
	Rate Num `json:"cooling_rate_k_per_s"`
	*Onset
	Fraction Num     `json:"fraction" result:"fraction at the end of the path"`
	Reached  *TimeAt `json:"fraction_reached"` // null: not reached
	// NucleiAtX is the number of nuclei expected in the sample volume
	// where the fraction reaches X (with a volume, and X reached).
	NucleiAtX *Num `json:"expected_nuclei_at_fraction,omitempty"`
}

// linear is what both answers of linear cooling hold.
type linear struct {
	Path    *kinetics.Cooling `json:"-"` // the path, at every rate
	Model   *kinetics.Model   `json:"-"`
	Name    string            `json:"-"` // of the material
	X, V    float64           `json:"-"`
	Rates   []float64         `json:"-"` // as given (Critical: none)
	Qc      float64           `json:"-"` // the critical rate
	Flags   kinetics.Flag     `json:"-"` // of the path's span of temperatures
	summary []string
}

// cctFactors are the rates of the CCT table about the critical rate, as
// multiples of it.
var cctFactors = []float64{0.01, 0.1, 0.3, 1, 3, 10}

// Cool answers linear cooling: a *Critical or a *CCT.
func Cool(in LinearInput) (Answer, error) {
	md := in.Model
	cl, err := md.LinearCooling(in.End)
	if err != nil {
		return nil, err
	}
	if err := checkGamma(md, cl.End, cl.Te); err != nil {
		return nil, err
	}
	l := linear{Path: cl, Model: md, Name: in.Card.Name, X: in.X, V: in.V, Qc: cl.CriticalRate(in.X), Flags: md.SpanFlags(cl.End, cl.Te)}
	inputs := LinearInputs{Describe(in.Card, md), "linear", Num(cl.End), cl.Reason.String(), Num(in.X), Num(in.V)}
	inputs.about = append(inputs.about, endLine(cl, in.Names), transformLine)
	heads, eval := coolHeadlines(in.End, in.X, in.V, in.Rates, in.Critical)
	if !in.Critical {
		l.Rates = in.Rates
	}
	u, err := sampled(in.Sampling, heads, eval, nil)
	if err != nil {
		return nil, err
	}
	if in.Critical {
		return l.critical(inputs, u)
	}
	return l.cct(inputs, u), nil
}

func (l linear) critical(inputs LinearInputs, u *Uncertainty) (*Critical, error) {
	cl := l.Path
	noseRate, n, err := cl.NoseRate(l.X)
	if err != nil {
		return nil, fmt.Errorf("nose: %w", err)
	}
	a := &Critical{Inputs: inputs, Rate: Num(l.Qc), NoseEstimate: Num(math.NaN()), Nose: TimeAt{Num(math.NaN()), Num(math.NaN())}, Flags: l.Flags.Keys(), Uncertainty: u, linear: l, nose: n}
	if l.Qc > 0 {
		a.summary = append(a.summary, fmt.Sprintf("critical cooling rate to stay below X = %s at %.2f K: %s (exact path integral; Xext scales as rate^-4)", FracLabel(l.X), cl.End, RateText(l.Qc)))
	} else {
		a.summary = append(a.summary, "critical cooling rate: none needed, nothing nucleates on the path")
	}
	if noseRate > 0 && n.Inside() {
		t := math.Exp(n.LnTime)
		a.summary = append(a.summary, fmt.Sprintf("nose estimate (Te - T_nose)/t_nose: %s (nose %.2f K, %s); it overstates the rate, since a cooling path spends only part of its time near the nose", RateText(noseRate), n.T, ReadableTime(t)))
		a.Nose, a.NoseEstimate = TimeAt{Num(n.T), Num(t)}, Num(noseRate)
	} else {
		a.summary = append(a.summary, "nose estimate: no nose of the TTT curve inside the path")
	}
	if l.V > 0 && l.Qc > 0 {
		var line string
		a.Onset, line = l.onset(l.Qc)
		a.summary = append(a.summary, line)
		a.NucleiAtX = l.sample(l.Qc, &a.summary)
	}
	var rates []float64
	if l.Qc > 0 {
		for _, f := range cctFactors {
			rates = append(rates, f*l.Qc)
		}
	}
	a.Rows = l.rows(rates)
	return a, nil
}

func (l linear) cct(inputs LinearInputs, u *Uncertainty) *CCT {
	cl := l.Path
	a := &CCT{Inputs: inputs, Critical: Num(l.Qc), Flags: l.Flags.Keys(), Uncertainty: u, linear: l}
	if len(l.Rates) == 1 {
		q := l.Rates[0]
		X := cl.Fraction(q)
		p := cl.Reach(q, l.X)
		a.AtRate = &AtRate{Rate: Num(q), Fraction: Num(X)}
		if l.V > 0 {
			var line string
			a.AtRate.Onset, line = l.onset(q)
			a.summary = append(a.summary, line)
		}
		line := fmt.Sprintf("fraction at %.2f K after cooling at %s: %.4g", cl.End, RateText(q), X)
		if p.Reached {
			line += fmt.Sprintf("; X = %s reached at %.2f K after %s", FracLabel(l.X), p.Temp, ReadableTime(p.Time))
			a.AtRate.Reached = &TimeAt{Num(p.Temp), Num(p.Time)}
		} else {
			line += fmt.Sprintf("; X = %s not reached", FracLabel(l.X))
		}
		a.summary = append(a.summary, line)
		if l.V > 0 {
			a.AtRate.NucleiAtX = l.sample(q, &a.summary)
		}
	}
	a.summary = append(a.summary, fmt.Sprintf("critical cooling rate to stay below X = %s: %s", FracLabel(l.X), RateText(l.Qc)))
	a.Rows = l.rows(l.Rates)
	return a
}

// onset is the first nucleus in the volume at rate q, and its summary line.
func (l linear) onset(q float64) (*Onset, string) {
	o := onsetOf(l.Path.Onset(l.V, q), l.Path.Te)
	return o, o.line(l.V, RateText(q))
}

// sample is the number of nuclei expected in the volume where cooling at
// rate q reaches X (nil where it does not), and adds the line that says
// so to summary when it is below one.
func (l linear) sample(q float64, summary *[]string) *Num {
	s := l.Path.Sample(l.V, q, l.X)
	if !s.Reached {
		return nil
	}
	if s.FewNuclei() {
		*summary = append(*summary, fewNucleiLine(s, l.V))
	}
	n := Num(math.Exp(s.LnNuclei))
	return &n
}

// rows are the CCT rows of the rates.
func (l linear) rows(rates []float64) []CoolRow {
	out := []CoolRow{} // [] in JSON without rates
	for _, q := range rates {
		p := l.Path.Reach(q, l.X)
		nan := Num(math.NaN())
		r := CoolRow{Rate: Num(q), Fraction: Num(l.Path.Fraction(q)), T: nan, Time: nan}
		if p.Reached {
			r.T, r.Time = Num(p.Temp), Num(p.Time)
		}
		if l.V > 0 {
			o := onsetOf(l.Path.Onset(l.V, q), l.Path.Te)
			r.OnsetT, r.OnsetDT, r.Expected = &o.T, &o.Undercooling, &o.Expected
		}
		out = append(out, r)
	}
	return out
}

// endLine says where and why the linear path ends.
func endLine(cl *kinetics.Cooling, names Names) string {
	switch cl.Reason {
	case kinetics.EndGlass:
		return fmt.Sprintf("path: linear cooling from Te = %.2f K to Tg = %.2f K (below the glass transition the melt is frozen)", cl.Te, cl.End)
	case kinetics.EndGiven:
		return fmt.Sprintf("path: linear cooling from Te = %.2f K to %.2f K (%s)", cl.Te, cl.End, names.of("end"))
	default:
		return fmt.Sprintf("path: linear cooling from Te = %.2f K to %.2f K, where the rest of the path adds less than %.0e of the extended volume", cl.Te, cl.End, kinetics.NegligibleRest)
	}
}

// transformLine names the transformation model of every cooling answer.
const transformLine = "transformation: extended volume Xext = (4 pi/3) integral J(t') [integral u ds]^3 dt' (continuous nucleation at J(T), spherical growth at u(T)), X = 1 - exp(-Xext)"

// doc is how both answers read.
func (l linear) doc(inputs LinearInputs, rows []CoolRow, u *Uncertainty, critical bool) Doc {
	d := Doc{Title: "undercool cool: linear cooling from Te", About: inputs.About(), Summary: l.summary, Table: tableOf(rows)}
	d.Notes = append(d.Notes,
		"the table is the CCT table: for each rate, where linear cooling from Te first reaches X; — where it does not before the end of the path")
	if l.V > 0 {
		d.Notes = append(d.Notes, onsetNote)
	}
	d.Notes = append(d.Notes, "no time lag of nucleation and no athermal (pre-existing) nuclei")
	if critical {
		d.Notes = append(d.Notes, "the nose estimate uses the isothermal TTT curve of the same model (continuous nucleation, JMAK)")
	}
	if l.Flags != 0 {
		d.Notes = append(d.Notes, "the path passes through temperatures where:")
		d.Notes = append(d.Notes, FlagNotes(l.Flags)...)
	}
	d.Notes = append(d.Notes, Caution)
	inputs.mark(&d, "fraction")
	u.addTo(&d)
	return d
}

// Doc is how the critical rate reads.
func (a *Critical) Doc() Doc { return a.linear.doc(a.Inputs, a.Rows, a.Uncertainty, true) }

// Doc is how the CCT table reads.
func (a *CCT) Doc() Doc { return a.linear.doc(a.Inputs, a.Rows, a.Uncertainty, false) }

// coolHeadlines are the bands of linear cooling to end (0: automatic):
// the critical cooling rate for X (with critical), the fraction at the end
// for each rate, and with a volume V > 0 the onset undercooling at the
// critical rate or at each rate (no answer where no nucleus is expected).
func coolHeadlines(end, X, V float64, rates []float64, critical bool) ([]headline, func(*kinetics.Model) ([]float64, error)) {
	var heads []headline
	if critical {
		rates = nil
		heads = append(heads, headline{key: "critical_cooling_rate_k_per_s", label: "critical cooling rate", log: true, text: RateText, row: -1})
		if V > 0 {
			heads = append(heads, headline{key: "onset_undercooling_k", label: "onset undercooling at the critical rate", text: kelvin, row: -1})
		}
	}
	for _, q := range rates {
		suffix, label := "", " at "+RateText(q)
		if len(rates) > 1 {
			suffix = "_at_" + strconv.FormatFloat(q, 'g', 4, 64) + "_k_per_s"
		}
		heads = append(heads, headline{key: "fraction" + suffix, label: "fraction" + label, log: true, text: sig3, row: -1})
		if V > 0 {
			heads = append(heads, headline{key: "onset_undercooling_k" + suffix, label: "onset undercooling" + label, text: kelvin, row: -1})
		}
	}
	eval := func(md *kinetics.Model) ([]float64, error) {
		out := make([]float64, 0, len(heads))
		c, err := md.LinearCooling(end)
		if err != nil {
			if errors.Is(err, kinetics.ErrEndAboveTe) {
				// This sample's T_e lies below the end: no path, no answer.
				for range heads {
					out = append(out, math.NaN())
				}
				return out, nil
			}
			return nil, err
		}
		onset := func(q float64) float64 { return float64(onsetOf(c.Onset(V, q), c.Te).Undercooling) }
		if critical {
			qc := c.CriticalRate(X)
			out = append(out, qc)
			if V > 0 {
				if qc > 0 {
					out = append(out, onset(qc))
				} else {
					out = append(out, math.NaN())
				}
			}
		}
		for _, q := range rates {
			out = append(out, c.Fraction(q))
			if V > 0 {
				out = append(out, onset(q))
			}
		}
		return out, nil
	}
	return heads, eval
}
