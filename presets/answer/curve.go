package answer

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/floats"

	"undercool/kinetics"
	"undercool/presets"
)

// CurveInput asks what a measured cooling curve did: with a material, the
// fraction along it, the onset in a volume and the additivity sum; and the
// quench factor against a C-curve (the material's TTT curve, or CCurve).
type CurveInput struct {
	Card     *presets.Card   // nil: no material, a quench factor against CCurve alone
	Model    *kinetics.Model // with Card
	Path     kinetics.Path
	Data     *presets.Data // the file the path was read from
	X, V     float64       // the fraction; the sample volume (0: none)
	Band     float64       // K, the width of the quench-factor bands
	CCurve   *kinetics.EvanchoStaley
	Sampling *Sampling
}

// CurveInputs are the inputs of a measured curve.
type CurveInputs struct {
	*Material
	Path   string     `json:"path"` // "curve"
	Curve  string     `json:"curve"`
	Points int        `json:"points"`
	X      Num        `json:"target_fraction"`
	V      Num        `json:"volume_m3,omitempty"`
	CCurve CCurveUsed `json:"c_curve"`
}

// CCurveUsed is the C-curve of a quench factor: the Evancho-Staley
// constants, or (nil) the material's own TTT curve, written "ttt".
type CCurveUsed struct{ *kinetics.EvanchoStaley }

func (c CCurveUsed) MarshalJSON() ([]byte, error) {
	if c.EvanchoStaley == nil {
		return json.Marshal("ttt")
	}
	e := c.EvanchoStaley
	return json.Marshal(struct {
		K1 Num `json:"k1"`
		K2 Num `json:"k2_s"`
		K3 Num `json:"k3_j_per_mol"`
		K4 Num `json:"k4_k"`
		K5 Num `json:"k5_j_per_mol"`
	}{Num(e.K1), Num(e.K2), Num(e.K3), Num(e.K4), Num(e.K5)})
}

// Curve is what a measured cooling curve did.
type Curve struct {
	Inputs CurveInputs `json:"inputs"`
	*AlongCurve
	Q           Num          `json:"quench_factor" result:"quench factor"`
	Retained    Num          `json:"retained_property_fraction" result:"retained property fraction"`
	Band        Num          `json:"band_k"`
	Flags       *Strings     `json:"flags,omitempty"` // with a material
	Uncertainty *Uncertainty `json:"uncertainty,omitempty"`
	Rows        []BandRow    `json:"rows"`

	Analysis *kinetics.CurveAnalysis `json:"-"` // with a material
	Quench   kinetics.QuenchResult   `json:"-"` // against the C-curve used
	about    []string
	summary  []string
	flags    kinetics.Flag
}

// AlongCurve is what the material did along the curve.
type AlongCurve struct {
	Fraction Num     `json:"fraction" result:"fraction at the end of the curve"`
	Reached  *TimeAt `json:"fraction_reached"` // null: not reached
	*Onset
	Additivity        Num     `json:"additivity_sum" result:"additivity sum"`
	AdditivityReached *TimeAt `json:"additivity_reached"` // null: the sum stays below 1
}

// BandRow is one temperature band of the quench factor.
type BandRow struct {
	Band  string `json:"band" col:"band (K),,1"`
	Hi    Num    `json:"band_high_k" col:"from (K),f1"`
	Lo    Num    `json:"band_low_k" col:"to (K),f1"`
	Time  Num    `json:"time_s" col:"time in band,time"`
	Q     Num    `json:"quench_factor_part" col:"part of Q,g4"`
	Share Num    `json:"share_percent" col:"share of Q (%),f2"`
}

// Curves analyses a measured curve. Errors: those of the model
// (kinetics.ErrTooManyBands for a band too narrow for the curve).
func Curves(in CurveInput) (*Curve, error) {
	p, d := in.Path, in.Data
	n := len(p.Time)
	a := &Curve{Inputs: CurveInputs{Path: "curve", Curve: d.File, Points: n, X: Num(in.X), V: Num(in.V), CCurve: CCurveUsed{in.CCurve}}, Band: Num(in.Band)}
	var quench kinetics.QuenchResult
	k1 := 0.0
	if in.Model != nil {
		md := in.Model
		if err := checkGamma(md, p.Temp...); err != nil {
			return nil, err
		}
		m := Describe(in.Card, md)
		a.Inputs.Material, a.about = &m, m.About()
		an, err := md.AnalyzeCurve(p, in.X, in.Band)
		if err != nil {
			return nil, err
		}
		a.Analysis = &an
		a.AlongCurve = a.along(an, md.Te(), in)
		a.flags = md.SpanFlags(floats.Min(p.Temp), floats.Max(p.Temp))
		keys := Strings(a.flags.Keys())
		a.Flags = &keys
		quench, k1 = an.Additivity, math.Log1p(-in.X)
	}
	a.about = append(a.about, fmt.Sprintf("curve: %s, %d points (%s, %s), %s",
		d.File, n, d.Headers["time"], d.Headers["temperature"], CurveSpan(p)))
	if in.Model != nil {
		a.about = append(a.about, transformLine)
	}
	cc := "the material's own TTT curve for X = " + FracLabel(in.X) + " (k1 = ln(1 - X))"
	if es := in.CCurve; es != nil {
		q, err := kinetics.Quench(p, *es, in.Band)
		if err != nil {
			return nil, err
		}
		quench, k1 = q, es.K1
		cc = fmt.Sprintf("Evancho-Staley, k1 = %g, k2 = %g s, k3 = %g J/mol, k4 = %g K, k5 = %g J/mol", es.K1, es.K2, es.K3, es.K4, es.K5)
	}
	a.about = append(a.about, "C-curve: "+cc)
	retained := math.Exp(k1 * quench.Q)
	a.summary = append(a.summary, fmt.Sprintf("quench factor Q = integral of dt/C(T): %.4g; retained property fraction exp(k1 Q) = %.4g", quench.Q, retained))
	a.Q, a.Retained, a.Quench = Num(quench.Q), Num(retained), quench
	a.Rows = []BandRow{} // [] in JSON without bands
	for _, b := range quench.Bands {
		a.Rows = append(a.Rows, BandRow{fmt.Sprintf("%.0f–%.0f", b.Hi, b.Lo), Num(b.Hi), Num(b.Lo), Num(b.Time), Num(b.Q), Num(100 * b.Share)})
	}
	if in.Model != nil {
		heads, eval := curveHeadlines(p, in.X, in.V, in.Band)
		var err error
		if a.Uncertainty, err = sampled(in.Sampling, heads, eval, nil); err != nil {
			return nil, err
		}
	}
	return a, nil
}

// CurveSpan says where a measured path runs, the same way wherever it is
// named: "1199.75 K to 305.65 K over 2.50 min", with its highest and lowest
// temperatures where they are not its ends.
func CurveSpan(p kinetics.Path) string {
	n := len(p.Time)
	first, last := p.Temp[0], p.Temp[n-1]
	s := fmt.Sprintf("%.2f K to %.2f K over %s", first, last, ReadableTime(p.Time[n-1]-p.Time[0]))
	var extra []string
	if hi := floats.Max(p.Temp); hi > max(first, last) {
		extra = append(extra, fmt.Sprintf("highest %.2f K", hi))
	}
	if lo := floats.Min(p.Temp); lo < min(first, last) {
		extra = append(extra, fmt.Sprintf("lowest %.2f K", lo))
	}
	if len(extra) > 0 {
		s += " (" + strings.Join(extra, ", ") + ")"
	}
	return s
}

// along is the material's part of the answer and its summary lines.
func (a *Curve) along(an kinetics.CurveAnalysis, te float64, in CurveInput) *AlongCurve {
	out := &AlongCurve{Fraction: Num(an.Path.Fraction), Additivity: Num(an.Additivity.Q)}
	line := fmt.Sprintf("fraction at the end of the curve: %.4g (exact path integral)", an.Path.Fraction)
	if an.Path.Reached {
		line += fmt.Sprintf("; X = %s reached at %.2f K, %s into the curve", FracLabel(in.X), an.Path.TempReached, ReadableTime(an.Path.TimeReached))
		out.Reached = &TimeAt{Num(an.Path.TempReached), Num(an.Path.TimeReached)}
	} else {
		line += fmt.Sprintf("; X = %s not reached", FracLabel(in.X))
	}
	a.summary = append(a.summary, line)
	if in.V > 0 {
		out.Onset = onsetOf(kinetics.OnsetAlong(in.Path, an.Sums, in.V), te)
		a.summary = append(a.summary, out.Onset.line(in.V, ""))
	}
	s := an.Additivity
	line = fmt.Sprintf("additivity sum, integral of dt/t_X over the curve (t_X: isothermal time to X = %s): %.4g", FracLabel(in.X), s.Q)
	if s.Reached {
		line += fmt.Sprintf("; reaches 1 at %.2f K, %s into the curve", s.TempReached, ReadableTime(s.TimeReached))
		out.AdditivityReached = &TimeAt{Num(s.TempReached), Num(s.TimeReached)}
	} else {
		line += "; does not reach 1"
	}
	a.summary = append(a.summary, line)
	return out
}

// curveHeadlines are the bands of a measured cooling curve: the fraction
// at its end, the onset undercooling in a volume V > 0 (no answer where no
// nucleus is expected) and the additivity sum.
func curveHeadlines(p kinetics.Path, X, V, band float64) ([]headline, func(*kinetics.Model) ([]float64, error)) {
	heads := []headline{{key: "fraction", label: "fraction at the end of the curve", log: true, text: sig3, row: -1}}
	if V > 0 {
		heads = append(heads, headline{key: "onset_undercooling_k", label: "onset undercooling on the curve", text: kelvin, row: -1})
	}
	heads = append(heads, headline{key: "additivity_sum", label: "additivity sum", log: true, text: sig3, row: -1})
	eval := func(md *kinetics.Model) ([]float64, error) {
		a, err := md.AnalyzeCurve(p, X, band)
		if err != nil {
			return nil, err
		}
		out := []float64{a.Path.Fraction}
		if V > 0 {
			out = append(out, float64(onsetOf(kinetics.OnsetAlong(p, a.Sums, V), md.Te()).Undercooling))
		}
		return append(out, a.Additivity.Q), nil
	}
	return heads, eval
}

// Doc is how the curve reads: the table is where the quench factor was collected.
func (a *Curve) Doc() Doc {
	d := Doc{Title: "undercool cool: measured cooling curve " + a.Inputs.Curve, About: a.about, Summary: a.summary, Table: tableOf(a.Rows)}
	caution := Caution
	if a.AlongCurve == nil {
		caution = QuenchCaution // a C-curve alone: no nucleation rate
	}
	d.Notes = append(d.Notes,
		fmt.Sprintf("the table is where along the curve the quench factor was collected: bands of %g K, hottest first", float64(a.Band)),
		"additivity (Scheil) treats the path as a sequence of isothermal holds; it is exact only for isokinetic transformations (Cahn 1956)",
		caution)
	if a.flags != 0 {
		d.Notes = append(d.Notes, "the curve passes through temperatures where:")
		d.Notes = append(d.Notes, FlagNotes(a.flags)...)
	}
	if a.Inputs.Material != nil {
		a.Inputs.mark(&d)
	}
	a.Uncertainty.addTo(&d)
	return d
}
