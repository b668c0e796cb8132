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

// Curve is what a measured cooling curve did. The bands (Rows) are those
// of the quench factor against the Evancho–Staley C-curve when one is
// given, else of the additivity sum (the quench factor against the
// material's own TTT curve).
type Curve struct {
	Inputs CurveInputs `json:"inputs"`
	*AlongCurve
	*Property
	Band        Num          `json:"band_k"`
	Warnings    []Warning    `json:"warnings"`
	Flags       *Strings     `json:"flags,omitempty"` // with a material
	Uncertainty *Uncertainty `json:"uncertainty,omitempty"`
	Rows        []BandRow    `json:"rows"`
	Verdict     Verdict      `json:"verdict"`

	Analysis *kinetics.CurveAnalysis `json:"-"` // with a material
	Quench   kinetics.QuenchResult   `json:"-"` // whose bands are the rows
	about    []string
	summary  []string
	notes    []string
	flags    kinetics.Flag
}

// AlongCurve is what the material did along the curve.
type AlongCurve struct {
	*Onset
	Fraction Num     `json:"fraction" result:"fraction at the end of the curve"`
	Reached  *TimeAt `json:"fraction_reached"` // null: not reached
	// NucleiAtX is the number of nuclei expected in the sample volume
	// where the fraction reaches X (with a volume, and X reached).
	NucleiAtX         *Num    `json:"expected_nuclei_at_fraction,omitempty"`
	Additivity        Num     `json:"additivity_sum" result:"additivity sum"`
	AdditivityReached *TimeAt `json:"additivity_reached"` // null: the sum stays below 1
}

// Property is a quench against a published C-curve of the Evancho–Staley
// form: its quench factor Q = ∫dt/C(T) and the fraction of the property
// retained, exp(k1·Q), which holds for that curve's first-order kinetics
// and for no other (kinetics.QuenchProperty).
type Property struct {
	Q        Num `json:"quench_factor" result:"quench factor"`
	Retained Num `json:"retained_property_fraction" result:"retained property fraction"`
}

// Verdict is the one answer of a curve screen, its last line: with a
// material, whether the path integral reaches X (and, where the additivity
// sum says otherwise, why the path integral is the answer); with a C-curve
// alone, the fraction of the property retained.
type Verdict struct {
	Text  string `json:"text"`
	Agree *bool  `json:"measures_agree,omitempty"` // with a material: the path integral and the additivity sum agree on X
	Why   string `json:"why,omitempty"`            // where they do not
}

// lines are the verdict's lines at the end of a screen.
func (v Verdict) lines() []string {
	out := []string{"verdict: " + v.Text}
	if v.Why != "" {
		out = append(out, "why the two measures differ: "+v.Why)
	}
	return out
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
	a := &Curve{Inputs: CurveInputs{Path: "curve", Curve: d.File, Points: n, X: Num(in.X), V: Num(in.V), CCurve: CCurveUsed{in.CCurve}}, Band: Num(in.Band), Warnings: []Warning{}}
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
		a.Analysis, a.Quench = &an, an.Additivity
		a.AlongCurve = a.along(an, md.Te(), in)
		a.flags = md.SpanFlags(floats.Min(p.Temp), floats.Max(p.Temp))
		keys := Strings(a.flags.Keys())
		a.Flags = &keys
		v := an.Verdict()
		agree := v.Agree()
		a.Verdict = Verdict{Text: v.String(), Agree: &agree, Why: v.Why()}
		a.startNote(p.Temp[0], md.Te())
	}
	a.about = append(a.about, fmt.Sprintf("curve: %s, %d points (%s, %s), %s",
		d.File, n, d.Headers["time"], d.Headers["temperature"], CurveSpan(p)))
	if in.Model != nil {
		a.about = append(a.about, transformLine)
	}
	if d.InKelvin("temperature") {
		a.Warnings = append(a.Warnings, coldWarning(p.Temp, "temperature")...)
	}
	if es := in.CCurve; es != nil {
		q, err := kinetics.QuenchProperty(p, *es, in.Band)
		if err != nil {
			return nil, err
		}
		a.Quench, a.Property = q.QuenchResult, &Property{Num(q.Q), Num(q.Retained)}
		a.about = append(a.about, fmt.Sprintf("C-curve: Evancho-Staley, k1 = %g, k2 = %g s, k3 = %g J/mol, k4 = %g K, k5 = %g J/mol", es.K1, es.K2, es.K3, es.K4, es.K5))
		a.summary = append(a.summary, fmt.Sprintf("quench factor Q = integral of dt/C(T) against the C-curve: %.4g; retained property fraction exp(k1 Q) = %.4g (Evancho and Staley 1974: first-order kinetics on that curve)", q.Q, q.Retained))
		if in.Model == nil {
			a.Verdict = Verdict{Text: fmt.Sprintf("retains %.4g of the property (exp(k1 Q) with Q = %.4g against the Evancho-Staley C-curve)", q.Retained, q.Q)}
		}
	}
	a.Rows = []BandRow{} // [] in JSON without bands
	for _, b := range a.Quench.Bands {
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

// FarBelowTe is how far below T_e a measured curve may start, as a share
// of T_e, before its screen says that what happened above its first point
// is not counted (common practice for a quench from solution treatment or
// from the melt, which starts at or above T_e).
const FarBelowTe = 0.05

// startNote warns of a curve whose first temperature T0 lies far below T_e.
func (a *Curve) startNote(T0, te float64) {
	if !(te-T0 > FarBelowTe*te) {
		return
	}
	a.Warnings = append(a.Warnings, Warning{"starts_below_te", fmt.Sprintf(
		"the curve starts at %.2f K, %.2f K below T_e = %.2f K: nothing that happened between T_e and its first point is counted (if it was hotter then, start the curve there)",
		T0, te-T0, te)})
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

// along is the material's part of the answer and its summary lines: with
// a volume the first nucleus first, then the fraction (the path integral),
// whether X is reached with fewer than one nucleus expected in the sample,
// and the additivity sum.
func (a *Curve) along(an kinetics.CurveAnalysis, te float64, in CurveInput) *AlongCurve {
	out := &AlongCurve{Fraction: Num(an.Path.Fraction), Additivity: Num(an.Additivity.Q)}
	var smp kinetics.Sample
	if in.V > 0 {
		smp = an.Sample(in.V)
		out.Onset = onsetOf(smp.Onset, te)
		a.summary = append(a.summary, out.Onset.line(in.V, ""))
	}
	line := fmt.Sprintf("fraction at the end of the curve: %.4g (exact path integral)", an.Path.Fraction)
	if an.Path.Reached {
		line += fmt.Sprintf("; X = %s reached at %.2f K, %s into the curve", FracLabel(in.X), an.Path.TempReached, ReadableTime(an.Path.TimeReached))
		out.Reached = &TimeAt{Num(an.Path.TempReached), Num(an.Path.TimeReached)}
	} else {
		line += fmt.Sprintf("; X = %s not reached", FracLabel(in.X))
	}
	a.summary = append(a.summary, line)
	if in.V > 0 && smp.Reached {
		out.NucleiAtX = new(Num)
		*out.NucleiAtX = Num(math.Exp(smp.LnNuclei))
		if smp.FewNuclei() {
			a.summary = append(a.summary, fewNucleiLine(smp, in.V))
		}
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

// fewNucleiLine says that the mean-field fraction reaches X with fewer
// than one nucleus expected in the sample of volume V (m³).
func fewNucleiLine(s kinetics.Sample, V float64) string {
	N := math.Exp(s.LnNuclei)
	return fmt.Sprintf("fewer than one nucleus: where the fraction reaches X = %s (%.2f K) only %.3g nuclei are expected in the %.4g m3 sample; "+
		"the fraction is a mean over many samples: this one is then still untransformed with probability %.3g, and transforms, if at all, from its first nucleus on",
		FracLabel(s.X), s.Temp, N, V, math.Exp(-N))
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

// Doc is how the curve reads: the table is where the quench factor (or
// the additivity sum) was collected, and the verdict ends it.
func (a *Curve) Doc() Doc {
	d := Doc{Title: "undercool cool: measured cooling curve " + a.Inputs.Curve, About: a.about, Summary: a.summary, Table: tableOf(a.Rows)}
	caution := Caution
	if a.AlongCurve == nil {
		caution = QuenchCaution // a C-curve alone: no nucleation rate
	}
	collected := "the quench factor against the C-curve"
	if a.Property == nil {
		collected = "the additivity sum"
		for i, c := range d.Table.Cols {
			d.Table.Cols[i].Head = strings.ReplaceAll(c.Head, "of Q", "of the sum")
		}
	}
	d.Notes = append(d.Notes, fmt.Sprintf("the table is where along the curve %s was collected: bands of %g K, hottest first", collected, float64(a.Band)))
	if a.AlongCurve != nil {
		d.Notes = append(d.Notes, "the fraction is the path integral along the curve (the answer, for nucleation at J(T) and growth at u(T)); the additivity sum (Scheil) treats the path as a sequence of isothermal holds and is exact only for isokinetic transformations (Cahn 1956)")
	}
	if in := a.Inputs; in.V > 0 && a.AlongCurve != nil {
		d.Notes = append(d.Notes, onsetNote)
	}
	d.Notes = append(d.Notes, caution)
	if a.flags != 0 {
		d.Notes = append(d.Notes, "the curve passes through temperatures where:")
		d.Notes = append(d.Notes, FlagNotes(a.flags)...)
	}
	verdict := a.Verdict.lines()
	if m := a.Inputs.Material; m != nil {
		m.mark(&d)
		if w := m.Standing.Mark(); w != "" {
			verdict[0] += " " + w
		}
	}
	for _, w := range a.Warnings {
		d.Summary = append(d.Summary, "warning: "+w.Text)
	}
	a.Uncertainty.addTo(&d)
	d.Notes = append(d.Notes, verdict...)
	return d
}
