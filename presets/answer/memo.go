package answer

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"

	"undercool/kinetics"
	"undercool/kinetics/sample"
	"undercool/presets"
	"undercool/presets/units"
)

// MemoInput asks for a memo on a card's material: the TTT nose, the
// critical cooling rate, a hold, a measured curve, the onset in a sample,
// with uncertainty bands where there are spreads.
type MemoInput struct {
	Card     *presets.Card
	Model    *kinetics.Model
	X        float64
	JMAK     kinetics.JMAK
	At       float64        // K, a hold; 0: none
	V        float64        // m³, a sample; 0: none
	Path     *kinetics.Path // a measured curve; nil: none
	Data     *presets.Data  // the curve's file
	Sampling *Sampling
	Date     string // YYYY-MM-DD
	Version  string // of the program that writes the memo
	Command  string // the command line that makes the memo again
	Plot     string // how the memo links its figure; "": none
	Names    Names
	// Heat, if set, adds heating: the critical heating rate beside the
	// critical cooling rate, a rate, DSC peaks.
	Heat *MemoHeat
	// Evolve, if set, adds particles in size classes along a schedule
	// (the evolve answer), run with Context (nil: context.Background),
	// its figure linked as EvolvePlot ("": none).
	Evolve     *EvolveInput
	Context    context.Context
	EvolvePlot string
}

// memoRows is the number of rows of the memo's TTT table.
const memoRows = 11

// CurveBand is the width of the temperature bands of a memo's additivity sum, K.
const CurveBand = 25.0

// Memo is the answers a memo is made of.
type Memo struct {
	in    MemoInput
	TTT   *TTT
	Cool  *Critical // nil: not computed (site saturation, or an error: CoolErr)
	Hold  *Hold     // nil: no hold asked
	Curve *Curve    // nil: no curve
	// Heats are the answers of heating; nil: none asked.
	Heats *MemoHeats
	// Evolve is the run along a schedule; nil: none asked.
	Evolve *Evolve
	// CoolErr says why linear cooling was not computed.
	CoolErr error
	u       *Uncertainty // of every headline, in the order of the results table
	flags   kinetics.Flag
	Lo, Hi  float64 // K, where the nose was searched
}

// Memos computes the answers of a memo.
func Memos(in MemoInput) (*Memo, error) {
	md := in.Model
	m := &Memo{in: in}
	m.Lo, m.Hi = DefaultSpan(md)
	var err error
	m.TTT, err = TTTs(TTTInput{Card: in.Card, Model: md, Temps: Spread(m.Hi, m.Lo, memoRows),
		Fractions: []float64{in.X}, JMAK: in.JMAK, Lo: m.Lo, Hi: m.Hi, Sampling: in.Sampling, Names: in.Names})
	if err != nil {
		return nil, err
	}
	m.flags = m.TTT.flags
	if m.Cool != nil {
		m.flags |= m.Cool.linear.Flags
	}
	if n := m.nose(); n.Inside() {
		m.flags |= md.At(n.T).Flags
	}
	us := []*Uncertainty{m.TTT.Uncertainty}
	if in.JMAK.Nuclei == 0 {
		c, err := Cool(LinearInput{Card: in.Card, Model: md, X: in.X, V: in.V, Critical: true, Sampling: in.Sampling, Names: in.Names})
		var se *SamplingError
		var tm *TooManyError
		switch {
		case errors.As(err, &se), errors.As(err, &tm):
			return nil, err
		case err != nil:
			m.CoolErr = err
		default:
			m.Cool = c.(*Critical)
			us = append(us, m.Cool.Uncertainty)
		}
	}
	if in.At > 0 {
		if m.Hold, err = Holds(HoldInput{Card: in.Card, Model: md, T: in.At, X: in.X, JMAK: in.JMAK, Sampling: in.Sampling}); err != nil {
			return nil, err
		}
		m.flags |= m.Hold.flags
		us = append(us, m.Hold.Uncertainty)
	}
	if in.Path != nil {
		if m.Curve, err = Curves(CurveInput{Card: in.Card, Model: md, Path: *in.Path, Data: in.Data, X: in.X, V: in.V, Band: CurveBand, Sampling: in.Sampling}); err != nil {
			return nil, err
		}
		us = append(us, m.Curve.Uncertainty)
		m.flags |= m.Curve.flags
	}
	m.u = merge(us)
	if in.Heat != nil {
		if m.Heats, err = m.heats(*in.Heat); err != nil {
			return nil, err
		}
		m.flags |= m.Heats.Critical.heating.Flags
	}
	if in.Evolve != nil {
		ctx := in.Context
		if ctx == nil {
			ctx = context.Background()
		}
		if m.Evolve, err = Evolves(ctx, *in.Evolve); err != nil {
			return nil, err
		}
	}
	return m, nil
}

// merge is one uncertainty of the headlines of several answers, sampled
// alike (the same spreads and seed draw the same samples).
func merge(us []*Uncertainty) *Uncertainty {
	if us[0] == nil {
		return nil
	}
	out := &Uncertainty{specs: us[0].specs}
	run := *us[0].run
	run.Outputs, run.Base, run.Bands, run.Sensitivity, run.Values = nil, nil, nil, nil, nil
	for _, u := range us {
		out.heads = append(out.heads, u.heads...)
		run.Outputs = append(run.Outputs, u.run.Outputs...)
		run.Base = append(run.Base, u.run.Base...)
		run.Bands = append(run.Bands, u.run.Bands...)
		run.Sensitivity = append(run.Sensitivity, u.run.Sensitivity...)
	}
	out.run = &run
	return out
}

func (m *Memo) nose() kinetics.Nose { return m.TTT.Curves.Noses[0] }

// WithCCT reports whether the memo's figure shows the CCT curve over the
// TTT one: for continuous nucleation without a time lag, when something
// nucleates on linear cooling.
func (m *Memo) WithCCT() bool {
	return m.Cool != nil && m.in.JMAK == (kinetics.JMAK{}) && m.Cool.Qc > 0
}

// memoLine is one row of the memo's results table; head is the index of
// its band among the headlines, -1 for none.
type memoLine struct {
	label, value string
	head         int
}

// results are the rows of the results table.
func (m *Memo) results() []memoLine {
	var lines []memoLine
	te := m.in.Model.Te()
	k := 0
	n := m.nose()
	noseT, noseTime := Dash, Dash
	switch {
	case n.Inside():
		t, _ := Seconds(n.LnTime)
		noseT, noseTime = KelvinCelsius(n.T), ReadableTime(t)
	case math.IsNaN(n.T):
		noseT, noseTime = "none: nothing transforms in the range", "never"
	default:
		noseT = "not inside the searched range"
	}
	lines = append(lines, memoLine{"nose temperature", noseT, k}, memoLine{"nose time to X", noseTime, k + 1})
	k += 2
	if c := m.Cool; c != nil {
		lines = append(lines, memoLine{"critical cooling rate", RateText(c.Qc), k})
		if n.Inside() {
			t, _ := Seconds(n.LnTime)
			lines = append(lines, memoLine{"nose estimate (T_e − T_nose)/t_nose (overstates the rate)", RateText(kinetics.NoseEstimate(te, n.T, t)), -1})
		}
		if m.in.V > 0 {
			v := (*Onset)(nil).cell(false)
			if c.Qc > 0 {
				v = onsetOf(c.Path.Onset(m.in.V, c.Qc), te).cell(false)
			}
			lines = append(lines, memoLine{fmt.Sprintf("onset undercooling in %.4g m³ at the critical rate", m.in.V), v, k + 1})
			k++
		}
		k++
	}
	if h := m.Hold; h != nil {
		lines = append(lines, memoLine{fmt.Sprintf("time to X at %s", KelvinCelsius(m.in.At)), ReadableTime(m.holdTime()), k})
		k++
	}
	if c := m.Curve; c != nil {
		a := c.Analysis
		next := k + 1
		if m.in.V > 0 {
			// the first nucleus first (its band follows the fraction's)
			lines = append(lines, memoLine{fmt.Sprintf("onset undercooling in %.4g m³ on the curve", m.in.V), c.Onset.cell(true), next})
			next++
		}
		lines = append(lines, memoLine{"fraction at the end of the curve", sig3(a.Path.Fraction), k})
		reached := "not reached"
		if a.Path.Reached {
			reached = fmt.Sprintf("at %.2f K, %s into the curve", a.Path.TempReached, ReadableTime(a.Path.TimeReached))
		}
		lines = append(lines, memoLine{"X reached on the curve", reached, -1})
		sum := sig3(a.Additivity.Q)
		if a.Additivity.Reached {
			sum += fmt.Sprintf(", reaches 1 at %.2f K", a.Additivity.TempReached)
		} else {
			sum += ", does not reach 1"
		}
		lines = append(lines, memoLine{"additivity sum ∫dt/t_X on the curve", sum, next})
	}
	return lines
}

// holdTime is the time to X at the hold temperature, s; +Inf for never.
func (m *Memo) holdTime() float64 {
	t := float64(m.Hold.Time)
	if math.IsNaN(t) {
		return math.Inf(1)
	}
	return t
}

// mdEscape keeps text from breaking a Markdown table.
func mdEscape(s string) string { return strings.ReplaceAll(s, "|", "\\|") }

// text is a table column of text.
func text(head string) Col { return Col{Head: head} }

// Blocks is the memo.
func (m *Memo) Blocks() []Block {
	in := m.in
	c, md := in.Card, in.Model
	X := FracLabel(in.X)
	bs := []Block{
		Heading(1, "Transformation estimate: "+c.Name),
		Para(fmt.Sprintf("Date: %s. Written by undercool report (%s). Transformed fraction X = %s.", in.Date, in.Version, X)),
		Quote("**Estimates only.** Nucleation rates depend on the cube of the interfacial energy inside an exponential: a 10 % error in it moves a rate by orders of magnitude. See the cautions at the end."),
		Para("**Standing of the card:** " + c.Standing.String() + "."),
		Heading(2, "Question"),
	}
	qs := []string{fmt.Sprintf("At which temperature does the material reach X = %s fastest in an isothermal hold (the nose of the TTT curve), and how soon?", X)}
	if m.Cool != nil {
		qs = append(qs, fmt.Sprintf("How fast must it cool, linearly from the equilibrium temperature, to stay below X = %s (the critical cooling rate)?", X))
	}
	if in.At > 0 {
		qs = append(qs, fmt.Sprintf("How long can it be held at %s before X = %s transforms?", KelvinCelsius(in.At), X))
	}
	if in.V > 0 && m.Cool != nil {
		qs = append(qs, fmt.Sprintf("Where does the first nucleus appear in a sample of %.4g m³ cooled at the critical rate?", in.V))
	}
	if p := in.Path; p != nil {
		qs = append(qs, fmt.Sprintf("What did the measured cooling curve %s (%d points, %s) do: the fraction at its end and the additivity sum?",
			in.Data.File, len(p.Time), CurveSpan(*p)))
	}
	qs = append(qs, m.heatQuestions()...)
	if ev := in.Evolve; ev != nil {
		qs = append(qs, fmt.Sprintf("How do the particles nucleate, grow and coarsen along the schedule %s: their number, size and volume fraction against time, and their final size distribution?", ev.Schedule.String()))
	}
	bs = append(bs, List(qs...), Heading(2, "Material"))
	card := fmt.Sprintf("Card: %s (%s)", c.Name, c.File)
	if c.Description != "" {
		card += ": " + c.Description
	}
	bs = append(bs, Para(card+"."))
	vt := Table{Cols: []Col{text("value"), text("meaning"), text("as given"), text("SI"), text("source")}}
	for _, p := range presets.Params {
		if v, ok := c.Values[p.Key]; ok {
			si := fmt.Sprintf("%.6g %s", v.SI, v.Kind.SI)
			vt.Rows = append(vt.Rows, []any{p.Key, mdEscape(p.About), mdEscape(v.Text), strings.TrimSpace(si), mdEscape(v.Source)})
		}
	}
	bs = append(bs, TableBlock(vt),
		Para(fmt.Sprintf("Derived: molecular volume v = %.4g m³, jump distance λ = %.4g m, shape factor f(θ) = %.4g.", md.MolecularVolume(), md.JumpDistance(), md.ShapeFactor())),
		Heading(2, "Model choices"))
	var choices []string
	for _, l := range m.TTT.Inputs.Material.About() {
		if s, ok := strings.CutPrefix(l, "models: "); ok {
			choices = append(choices, s)
		}
		for _, p := range []string{"laws: ", "calibrated range: "} {
			if strings.HasPrefix(l, p) {
				choices = append(choices, l)
			}
		}
	}
	choices = append(choices, "transformation: "+in.JMAK.Describe(),
		fmt.Sprintf("nose: searched between %.2f and %.2f K to %.2g K (a bracketing search, not read off the table)", m.Lo, m.Hi, kinetics.NoseTolerance))
	if cl := m.Cool; cl != nil {
		lag := ""
		if in.JMAK.Lag {
			lag = "; steady nucleation from the start, without the time lag of the TTT curve"
		}
		choices = append(choices, fmt.Sprintf("critical cooling rate: linear cooling from T_e = %.2f K to %.2f K (%s), from the exact extended-volume integral, which scales as q⁻⁴%s", md.Te(), cl.Path.End, cl.Path.Reason, lag))
	} else if m.CoolErr != nil {
		choices = append(choices, fmt.Sprintf("critical cooling rate: not computed (%v)", m.CoolErr))
	}
	if u := m.u; u != nil {
		choices = append(choices, fmt.Sprintf("uncertainty: Monte Carlo, %d samples, seed %d, inputs drawn independently; P5, P50 and P95 are the %s", u.run.Samples, u.run.Seed, sample.QuantileDefinition))
		if w := u.Warning(); w != "" {
			choices = append(choices, "**warning**: "+w)
		}
	} else {
		choices = append(choices, "uncertainty: none given (no spreads on the card or the command line)")
	}
	bs = append(bs, List(choices...), Heading(2, "Results"))
	bs = append(bs, m.resultBlocks()...)
	bs = append(bs, m.heatBlocks()...)
	bs = append(bs, Heading(2, "Uncertainty and what to measure next"))
	bs = append(bs, m.uncertaintyBlocks()...)
	if in.Plot != "" {
		curve := ""
		if m.Curve != nil {
			curve = fmt.Sprintf(" The measured cooling curve %s is drawn over them, its time counted from its first point, with the points where it reaches X = %s and where its additivity sum reaches 1 marked where it does.", in.Data.File, X)
		}
		if m.WithCCT() {
			bs = append(bs, Heading(2, "TTT and CCT plot"),
				Para(fmt.Sprintf("![TTT and CCT curves of %s for X = %s](%s)", c.Name, X, in.Plot)),
				Para(fmt.Sprintf("Temperature against log time: the isothermal TTT curve to X = %s with its nose marked, the CCT curve (where linear cooling from T_e reaches X) and the cooling line at the critical rate; T_e (and T_g where the card has one) are dashed.%s", X, curve)))
		} else {
			bs = append(bs, Heading(2, "TTT plot"),
				Para(fmt.Sprintf("![TTT curve of %s for X = %s](%s)", c.Name, X, in.Plot)),
				Para(fmt.Sprintf("Temperature against log time to X = %s; the nose is marked, T_e (and T_g where the card has one) are dashed.%s", X, curve)))
		}
	}
	if m.Evolve != nil {
		bs = append(bs, m.Evolve.memoBlocks(in.EvolvePlot)...)
	}
	bs = append(bs, Heading(2, "Validity flags"))
	if m.flags == 0 {
		bs = append(bs, Para("None raised over the TTT range, at the nose or at the hold temperature."))
	} else {
		var fl []string
		for _, n := range FlagNotes(m.flags) {
			fl = append(fl, strings.TrimPrefix(n, "flag "))
		}
		bs = append(bs, List(fl...))
	}
	bs = append(bs, Heading(2, "Cautions"),
		Para("These results are estimates from classical nucleation theory with the inputs above. Rates depend on the cube of the interfacial energy inside an exponential, and a 10 % error in it moves a rate by orders of magnitude; the uncertainty bands cover only the spreads stated, not the choice of model."),
		Para("Heat treatment and quenching (hot metal, quench-oil fires, steam) and pharmaceutical or food process decisions must follow local codes, validated procedures and licensed practice. Do not use this memo as the sole basis for such a decision."))
	if m.Heats != nil {
		bs = append(bs, Para("Hot glass, furnaces and molten material can burn and injure people: reheating and heat treatment follow the site's procedures. Amorphous drugs and their processing carry risk to patients: the estimates above do not replace validated stability and process studies."))
	}
	if strings.EqualFold(c.Kind, "demo") {
		bs = append(bs, Para("The material of this memo is invented for demonstration; its numbers describe no real material."))
	}
	return append(bs, Para("---"), Para(fmt.Sprintf("Regenerate this memo (the same, with %s) with:", in.Version)), Code(in.Command))
}

// resultBlocks are the results table and the short TTT table.
func (m *Memo) resultBlocks() []Block {
	in, md := m.in, m.in.Model
	cols := []Col{text("result"), text("value")}
	if m.u != nil {
		cols = append(cols, text("P5"), text("P50"), text("P95"))
	}
	results := Table{Cols: cols}
	mark := ""
	if w := m.TTT.Inputs.Standing.Mark(); w != "" {
		mark = " " + w
	}
	for _, l := range m.results() {
		row := []any{mdEscape(l.label), mdEscape(l.value + mark)}
		if m.u != nil {
			p5, p50, p95 := "", "", ""
			if l.head >= 0 {
				h, bd := m.u.heads[l.head], m.u.run.Bands[l.head]
				p5, p50, p95 = h.text(bd.P5), h.text(bd.P50), h.text(bd.P95)
			}
			row = append(row, p5, p50, p95)
		}
		results.Rows = append(results.Rows, row)
	}
	bs := []Block{TableBlock(results)}
	if c := m.Cool; c != nil && in.V > 0 && c.Qc > 0 {
		if s := c.Path.Sample(in.V, c.Qc, in.X); s.FewNuclei() {
			bs = append(bs, Para("At the critical rate, "+fewNucleiLine(s, in.V)+"."))
		}
	}
	if c := m.Curve; c != nil {
		if in.V > 0 {
			if s := c.Analysis.Sample(in.V); s.FewNuclei() {
				bs = append(bs, Para("On the curve, "+fewNucleiLine(s, in.V)+"."))
			}
		}
		bs = append(bs, Para("**Verdict on the measured curve:** "+c.Verdict.Text+mark+"."))
		if c.Verdict.Why != "" {
			bs = append(bs, Para("Why the path integral and the additivity sum differ: "+c.Verdict.Why+"."))
		}
	}
	if m.Cool != nil && m.nose().Inside() {
		bs = append(bs, Para("The nose estimate assumes the whole path is spent at the nose; a real path spends only part of its time there, so the exact critical rate is lower."))
	}
	if h := m.Hold; h != nil && h.State.Dmu > 0 {
		// No mobility (below the VFT T0) gives log10 J = −Inf: the dash, as in the tables.
		s := h.State
		bs = append(bs, Para(fmt.Sprintf("At %.2f K: undercooling %.2f K, log10 J = %s (J in m⁻³ s⁻¹), growth rate u = %s m/s, critical nucleus %s molecules.",
			in.At, s.Undercooling, Fixed(3)(s.Log10J()), Sig(4)(s.Growth), Sig(4)(s.Nucleus.Size))))
	}
	bs = append(bs, Para(fmt.Sprintf("TTT table for X = %s:", FracLabel(in.X))))
	tt := Table{Cols: []Col{text("T (K)"), text("T (°C)"), text("time to X"), text("log10 J (m⁻³ s⁻¹)"), text("u (m/s)"), text("flags")}}
	curves := m.TTT.Curves
	for i, T := range curves.T {
		s := md.At(T)
		t, _ := Seconds(curves.LnTime[i][0])
		tt.Rows = append(tt.Rows, []any{Fixed(2)(T), Fixed(2)(units.Celsius(T)), ReadableTime(t), Fixed(3)(s.Log10J()), Sig(3)(s.Growth), strings.Join(s.Flags.Keys(), " ")})
	}
	return append(bs, TableBlock(tt))
}

// uncertaintyBlocks are the spreads, the sensitivity ranking and the advice.
func (m *Memo) uncertaintyBlocks() []Block {
	u := m.u
	if u == nil {
		s := "No spreads were given, so the results above are single values with no band. "
		if d, ok := m.gammaGuide(m.in.Model.Material().Gamma); ok {
			s += fmt.Sprintf("As a guide, ±2 %% in the interfacial energy alone moves the nose time by %s decades. ", d)
		}
		spread := m.in.Names.of("spread")
		return []Block{Para(s + fmt.Sprintf("Give the standard deviations of the inputs (for example `%s gamma=2%% %s d0=x2`, or a `[spread]` table on the card) to get P5, P50 and P95 and the ranking of what to measure next.", spread, spread))}
	}
	st := Table{Cols: []Col{text("input"), text("as given"), text("distribution"), text("standard deviation"), text("redrawn"), text("source")}}
	for i, s := range u.specs {
		su := u.run.Spreads[i]
		p, _ := presets.ParamByKey(s.Key)
		sd := fmt.Sprintf("%.4g %s", su.SD, p.Kinds[0].SI)
		if su.Dist == sample.LogNormal {
			sd = fmt.Sprintf("σ(ln) = %.3g (×/÷ %.3g)", su.SD, math.Exp(su.SD))
		}
		st.Rows = append(st.Rows, []any{s.Key, mdEscape(s.Text), su.Dist.String(), strings.TrimSpace(sd), fmt.Sprint(su.Redrawn), mdEscape(s.Source)})
	}
	bs := []Block{TableBlock(st),
		Para(fmt.Sprintf("Log-normal spreads (%s) take the card value as the median; normal ones are centred on it. A draw outside a value's allowed range is drawn again.", strings.Join(presets.LogNormalKeys(), ", "))),
		Para("Sensitivity: the change of each result for −1σ / +1σ of one input alone, the others at their card values; in decades for times and rates, in K for temperatures."),
		TableBlock(u.SensitivityTable())}
	var driven []string
	for k, h := range u.heads {
		if !h.log || len(u.run.Sensitivity[k]) == 0 {
			continue
		}
		top := u.run.Sensitivity[k][0]
		if top.Size() == 0 {
			continue
		}
		driven = append(driven, fmt.Sprintf("%s: driven most by **%s** (%s decades for ±1σ)", h.label, top.Key, EffectText(top)))
	}
	if len(driven) > 0 {
		bs = append(bs, List(driven...))
	}
	bs = append(bs, Para("The input at the top of the ranking is the one to measure better first."))
	for k, h := range u.heads {
		if miss := u.run.Bands[k].Missing; miss > 0 {
			bs = append(bs, Para(fmt.Sprintf("%s: %d of %d samples gave no answer and are left out of its band.", h.label, miss, u.run.Samples)))
		}
	}
	return bs
}

// gammaGuide is the change of the nose time, in decades, for ±2 % in γ.
func (m *Memo) gammaGuide(g float64) (string, bool) {
	with := m.in.Card.Vary([]sample.Spread{{Key: "gamma", Base: g}})
	n0 := m.nose()
	var d [2]float64
	for i, f := range []float64{0.98, 1.02} {
		md, err := with([]float64{f * g})
		if err != nil {
			return "", false
		}
		n, err := md.Nose(m.Lo, m.Hi, m.in.X, m.in.JMAK)
		if err != nil || !n.Inside() || !n0.Inside() {
			return "", false
		}
		d[i] = (n.LnTime - n0.LnTime) / math.Ln10
	}
	return EffectText(sample.Effect{Minus: d[0], Plus: d[1]}), true
}
