package main

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"undercool/kinetics"
	"undercool/kinetics/sample"
	"undercool/presets"
)

func init() {
	commands["report"] = &command{
		summary: "A Markdown memo for a material and a question: the material with every value and its source, the model choices, the TTT nose, the critical cooling rate, a hold time (--at), a measured cooling curve (--curve) and the onset in a sample (--volume), with uncertainty bands, the sensitivity ranking, the TTT (and CCT) plot beside it as SVG, the validity flags and the cautions. Written whole or not at all.",
		usage:   "undercool report --out FILE.md|- [--material NAME|FILE.toml] [value flags] [--fraction X] [--at T] [--curve FILE.csv] [--volume V] [--spread NAME=VALUE ...] [--samples N] [--seed S] [--plot FILE.svg] [--date YYYY-MM-DD]",
		example: "undercool report --material demo-alloy --at 900K --spread gamma=2% --spread d0=x2 --out memo.md",
		setup:   setupReport,
	}
}

// reportRows is the number of rows of the memo's TTT table.
const reportRows = 11

// reportFlags are the flags of report besides the material and spreads.
type reportFlags struct {
	out, plot, at, date, format, curve, volume string
	fs                                         *pflag.FlagSet
}

// memo is everything the memo shows, computed before a byte is written.
type memo struct {
	card   *presets.Card
	md     *kinetics.Model
	X      float64
	j      kinetics.JMAK
	lo, hi float64
	ttt    *kinetics.TTT
	nose   kinetics.Nose
	cool   *kinetics.Cooling // nil when linear cooling cannot be computed
	coolEr error
	at     float64 // 0: no hold asked
	hold   kinetics.State
	holdT  float64 // time to X at `at`, s; +Inf never
	V      float64 // sample volume, m³ (0: none)
	path   *kinetics.Path
	pathD  *presets.Data
	curve  kinetics.CurveAnalysis
	flags  kinetics.Flag
	plan   *spreadPlan
	u      *sample.Uncertainty
	heads  []headline
	plot   string // path of the SVG, "" for none
	link   string // how the memo links it
}

func setupReport(fs *pflag.FlagSet) func(*env, []string) error {
	mf := addMaterialFlags(fs)
	rf := &reportFlags{fs: fs}
	fs.StringVar(&rf.out, "out", "", "the memo, FILE.md, or - for standard output; required")
	jf := addJMAKFlags(fs, false)
	fs.StringVar(&rf.at, "at", "", "also answer for a hold (storage, anneal) at this temperature, K, C or F (bare = K)")
	fs.StringVar(&rf.curve, "curve", "", "also answer for a measured cooling curve FILE.csv with columns time_UNIT and temperature_UNIT (e.g. time_s,temperature_c)")
	fs.StringVar(&rf.volume, "volume", "", "sample volume for the onset of nucleation at the critical rate and on --curve, m3, mm3, uL, mL or L (> 0)")
	fs.StringVar(&rf.plot, "plot", "", "the TTT (and CCT) plot, FILE.svg (default: beside the memo, FILE-ttt.svg; none for --out - unless given)")
	fs.StringVar(&rf.date, "date", "", "the memo's date, YYYY-MM-DD (default: today, UTC)")
	fs.StringVar(&rf.format, "format", "", "not used: the memo is always Markdown")
	_ = fs.MarkHidden("format")
	sf := addSpreadFlags(fs)
	return func(e *env, args []string) error {
		if len(args) > 0 {
			return usagef("report: unexpected argument %q", args[0])
		}
		if fs.Changed("format") {
			return usagef("--format: does not apply to report, which always writes Markdown (use --out FILE.md or --out -)")
		}
		if err := rf.checkOut(); err != nil {
			return err
		}
		date, err := rf.memoDate()
		if err != nil {
			return err
		}
		if err := sf.check(); err != nil {
			return err
		}
		fractions, j, err := jf.law(false)
		if err != nil {
			return err
		}
		m := &memo{X: fractions[0], j: j}
		if fs.Changed("at") {
			if m.at, err = parseTemp(e, "at", rf.at); err != nil {
				return err
			}
		}
		if fs.Changed("volume") {
			cf := &coolFlags{volume: rf.volume}
			if m.V, err = cf.volumeValue(); err != nil {
				return err
			}
		}
		if m.plot, m.link, err = rf.plotPath(); err != nil {
			return err
		}
		if fs.Changed("curve") {
			p, d, err := readCurve(rf.curve, e)
			if err != nil {
				return err
			}
			m.path, m.pathD = &p, d
		}
		if m.card, m.md, err = mf.model(); err != nil {
			return err
		}
		if err := transformError(m.md, j); err != nil {
			return err
		}
		if err := m.compute(); err != nil {
			return err
		}
		if m.plan, err = sf.plan(m.card, m.md); err != nil {
			return err
		}
		if m.plan != nil {
			_, heads, eval := m.results()
			m.heads = heads
			if m.u, err = m.plan.run(e, m.md, m.heads, eval); err != nil {
				return err
			}
		}
		var b bytes.Buffer
		m.write(&b, date, regenerate(fs, sf))
		if rf.out == "-" {
			if m.plot != "" {
				if err := m.writePlot(); err != nil {
					return err
				}
			}
			_, err := e.stdout.Write(b.Bytes())
			return err
		}
		if m.plot != "" {
			if err := m.writePlot(); err != nil {
				return err
			}
		}
		if err := writeFileAtomic(rf.out, func(w io.Writer) error { _, err := w.Write(b.Bytes()); return err }); err != nil {
			if m.plot != "" {
				os.Remove(m.plot)
			}
			return err
		}
		return nil
	}
}

// checkOut validates --out before any work: given, and a file in a
// directory that exists.
func (rf *reportFlags) checkOut() error {
	if !rf.fs.Changed("out") || rf.out == "" {
		return usagef("--out: required: the memo file, e.g. --out memo.md, or --out - to print it")
	}
	if rf.out == "-" {
		return nil
	}
	dir := filepath.Dir(rf.out)
	st, err := os.Stat(dir)
	if err != nil {
		return usagef("--out: cannot write %s: directory %s: %v", rf.out, dir, unwrapPath(err))
	}
	if !st.IsDir() {
		return usagef("--out: cannot write %s: %s is not a directory", rf.out, dir)
	}
	if st, err := os.Stat(rf.out); err == nil && st.IsDir() {
		return usagef("--out: cannot write %s: it is a directory", rf.out)
	}
	probe, err := os.CreateTemp(dir, ".undercool-probe-*")
	if err != nil {
		return usagef("--out: cannot write %s: %v", rf.out, unwrapPath(err))
	}
	probe.Close()
	os.Remove(probe.Name())
	return nil
}

// plotPath is where the SVG goes and how the memo links it.
func (rf *reportFlags) plotPath() (path, link string, err error) {
	switch {
	case rf.fs.Changed("plot"):
		if !strings.EqualFold(filepath.Ext(rf.plot), ".svg") {
			return "", "", usagef("--plot: %q: the memo's plot is an SVG file (FILE.svg)", rf.plot)
		}
		if _, err := checkPlotPath("plot", rf.plot); err != nil {
			return "", "", err
		}
		path = rf.plot
	case rf.out == "-":
		return "", "", nil
	default:
		path = strings.TrimSuffix(rf.out, filepath.Ext(rf.out)) + "-ttt.svg"
	}
	link = path
	if rf.out != "-" {
		if rel, err := filepath.Rel(filepath.Dir(rf.out), path); err == nil {
			link = rel
		}
	}
	return path, filepath.ToSlash(link), nil
}

func (rf *reportFlags) memoDate() (string, error) {
	if !rf.fs.Changed("date") {
		return time.Now().UTC().Format("2006-01-02"), nil
	}
	d, err := time.Parse("2006-01-02", rf.date)
	if err != nil {
		return "", usagef("--date: %q is not a date YYYY-MM-DD", rf.date)
	}
	return d.Format("2006-01-02"), nil
}

// compute finds the nose, the TTT table, linear cooling and the hold.
func (m *memo) compute() error {
	m.lo, m.hi = defaultSpan(m.md)
	temps := spread(m.hi, m.lo, reportRows)
	var err error
	if m.ttt, err = m.md.TTT(temps, []float64{m.X}, m.j, m.lo, m.hi); err != nil {
		return fmt.Errorf("report: %v", err)
	}
	m.nose = m.ttt.Noses[0]
	for _, f := range m.ttt.Flags {
		m.flags |= f
	}
	if m.nose.Inside() {
		m.flags |= m.md.At(m.nose.T).Flags
	}
	if m.j.Nuclei == 0 {
		m.cool, m.coolEr = m.md.LinearCooling(0)
	}
	if m.at > 0 {
		var a kinetics.Avrami
		m.hold, a = m.md.Isothermal(m.at, m.j)
		m.holdT, _ = secondsOf(a.LnTime(m.X))
		if math.IsNaN(m.holdT) {
			m.holdT = math.Inf(1)
		}
		m.flags |= m.hold.Flags
	}
	if m.path != nil {
		var err error
		if m.curve, err = m.md.AnalyzeCurve(*m.path, m.X, curveBand); err != nil {
			return fmt.Errorf("report: %v", err)
		}
	}
	return nil
}

// curveBand is the width of the temperature bands of the additivity sum, K.
const curveBand = 25.0

// criticalRate is the critical cooling rate of a cooling, NaN without one.
func criticalRate(c *kinetics.Cooling, X float64) float64 {
	if c == nil {
		return math.NaN()
	}
	return c.CriticalRate(X)
}

// memoLine is one row of the memo's results table; head is the index of
// its band among the headlines, -1 for none.
type memoLine struct {
	label, value string
	head         int
}

// results are the rows of the results table, the banded headlines among
// them and the evaluation of one sample for those headlines.
func (m *memo) results() ([]memoLine, []headline, sample.Eval) {
	var lines []memoLine
	var heads []headline
	var evals []sample.Eval
	add := func(h []headline, eval sample.Eval) int {
		heads = append(heads, h...)
		evals = append(evals, eval)
		return len(heads) - len(h)
	}

	h, eval := tttHeadlines([]float64{m.X}, m.j, m.lo, m.hi)
	k := add(h, eval)
	noseT, noseTime := dash, dash
	switch {
	case m.nose.Inside():
		t, _ := secondsOf(m.nose.LnTime)
		noseT = fmt.Sprintf("%.2f K (%.2f °C)", m.nose.T, m.nose.T-273.15)
		noseTime = readableTime(t)
	case math.IsNaN(m.nose.T):
		noseT, noseTime = "none: nothing transforms in the range", "never"
	default:
		noseT = "not inside the searched range"
	}
	lines = append(lines, memoLine{"nose temperature", noseT, k}, memoLine{"nose time to X", noseTime, k + 1})

	if m.cool != nil {
		qc := criticalRate(m.cool, m.X)
		h, eval := coolHeadlines(0, m.X, m.V, nil, true)
		k := add(h, eval)
		lines = append(lines, memoLine{"critical cooling rate", rateText(qc), k})
		if m.nose.Inside() {
			t, _ := secondsOf(m.nose.LnTime)
			est := kinetics.NoseEstimate(m.md.Te(), m.nose.T, t)
			lines = append(lines, memoLine{"nose estimate (T_e − T_nose)/t_nose (overstates the rate)", rateText(est), -1})
		}
		if m.V > 0 {
			v := "none: fewer than one nucleus expected"
			if qc > 0 {
				if o := m.cool.Onset(m.V, qc); o.Reached {
					v = fmt.Sprintf("%.2f K, at %.2f K", m.md.Te()-o.Temp, o.Temp)
				}
			}
			lines = append(lines, memoLine{fmt.Sprintf("onset undercooling in %.4g m³ at the critical rate", m.V), v, k + 1})
		}
	}
	if m.at > 0 {
		h, eval := holdHeadlines(m.at, m.X, m.j)
		k := add(h, eval)
		lines = append(lines, memoLine{fmt.Sprintf("time to X at %.2f K (%.2f °C)", m.at, m.at-273.15), readableTime(m.holdT), k})
	}
	if m.path != nil {
		a := m.curve
		h, eval := curveHeadlines(*m.path, m.X, m.V, curveBand)
		k := add(h, eval)
		lines = append(lines, memoLine{"fraction at the end of the curve", sig3(a.Path.Fraction), k})
		reached := "not reached"
		if a.Path.Reached {
			reached = fmt.Sprintf("at %.2f K, %s into the curve", a.Path.TempReached, readableTime(a.Path.TimeReached))
		}
		lines = append(lines, memoLine{"X reached on the curve", reached, -1})
		next := k + 1
		if m.V > 0 {
			v := "none: fewer than one nucleus expected"
			if o := kinetics.OnsetAlong(*m.path, a.Sums, m.V); o.Reached {
				v = fmt.Sprintf("%.2f K, at %.2f K, %s into the curve", m.md.Te()-o.Temp, o.Temp, readableTime(o.Time))
			}
			lines = append(lines, memoLine{fmt.Sprintf("onset undercooling in %.4g m³ on the curve", m.V), v, next})
			next++
		}
		sum := sig3(a.Additivity.Q)
		if a.Additivity.Reached {
			sum += fmt.Sprintf(", reaches 1 at %.2f K", a.Additivity.TempReached)
		} else {
			sum += ", does not reach 1"
		}
		lines = append(lines, memoLine{"additivity sum ∫dt/t_X on the curve", sum, next})
	}
	all := func(md *kinetics.Model) ([]float64, error) {
		var out []float64
		for _, ev := range evals {
			r, err := ev(md)
			if err != nil {
				return nil, err
			}
			out = append(out, r...)
		}
		return out, nil
	}
	return lines, heads, all
}

// rateText writes a cooling rate, K/s.
func rateText(q float64) string {
	if math.IsNaN(q) || math.IsInf(q, 0) {
		return dash
	}
	return threeSig(q) + " K/s"
}

// mdEscape keeps text from breaking a Markdown table.
func mdEscape(s string) string { return strings.ReplaceAll(s, "|", "\\|") }

// write renders the memo.
func (m *memo) write(b *bytes.Buffer, date, command string) {
	c, md := m.card, m.md

	X := fracLabel(m.X)
	fmt.Fprintf(b, "# Transformation estimate: %s\n\n", c.Name)
	fmt.Fprintf(b, "Date: %s. Written by undercool report. Transformed fraction X = %s.\n\n", date, X)
	fmt.Fprintf(b, "> **Estimates only.** Nucleation rates depend on the cube of the interfacial energy inside an exponential: a 10 %% error in it moves a rate by orders of magnitude. See the cautions at the end.\n\n")

	b.WriteString("## Question\n\n")
	fmt.Fprintf(b, "- At which temperature does the material reach X = %s fastest in an isothermal hold (the nose of the TTT curve), and how soon?\n", X)
	if m.cool != nil {
		fmt.Fprintf(b, "- How fast must it cool, linearly from the equilibrium temperature, to stay below X = %s (the critical cooling rate)?\n", X)
	}
	if m.at > 0 {
		fmt.Fprintf(b, "- How long can it be held at %.2f K (%.2f °C) before X = %s transforms?\n", m.at, m.at-273.15, X)
	}
	if m.V > 0 && m.cool != nil {
		fmt.Fprintf(b, "- Where does the first nucleus appear in a sample of %.4g m³ cooled at the critical rate?\n", m.V)
	}
	if m.path != nil {
		n := len(m.path.Time)
		fmt.Fprintf(b, "- What did the measured cooling curve %s (%d points, %.2f to %.2f K over %s) do: the fraction at its end and the additivity sum?\n",
			m.pathD.File, n, m.path.Temp[0], m.path.Temp[n-1], readableTime(m.path.Time[n-1]-m.path.Time[0]))
	}
	b.WriteString("\n## Material\n\n")
	fmt.Fprintf(b, "Card: %s (%s)", c.Name, c.File)
	if c.Description != "" {
		fmt.Fprintf(b, ": %s", c.Description)
	}
	b.WriteString(".\n\n")
	vt := table{cols: []column{{"value", "", nil}, {"meaning", "", nil}, {"as given", "", nil}, {"SI", "", nil}, {"source", "", nil}}}
	for _, p := range presets.Params {
		v, ok := c.Values[p.Key]
		if !ok {
			continue
		}
		si := fmt.Sprintf("%.6g %s", v.SI, v.Kind.SI)
		vt.rows = append(vt.rows, []any{p.Key, mdEscape(p.About), mdEscape(v.Text), strings.TrimSpace(si), mdEscape(v.Source)})
	}
	_ = writeTable(b, vt.cols, vt.rows, true)
	fmt.Fprintf(b, "\nDerived: molecular volume v = %.4g m³, jump distance λ = %.4g m, shape factor f(θ) = %.4g.\n", md.MolecularVolume(), md.JumpDistance(), md.ShapeFactor())

	b.WriteString("\n## Model choices\n\n")
	about, _ := describeCard(c, md)
	for _, l := range about {
		if strings.HasPrefix(l, "models: ") {
			fmt.Fprintf(b, "- %s\n", strings.TrimPrefix(l, "models: "))
		}
	}
	fmt.Fprintf(b, "- transformation: %s\n", m.j.Describe())
	fmt.Fprintf(b, "- nose: searched between %.2f and %.2f K to %.2g K (a bracketing search, not read off the table)\n", m.lo, m.hi, kinetics.NoseTolerance)
	if m.cool != nil {
		lag := ""
		if m.j.Lag {
			lag = "; steady nucleation from the start, without the time lag of the TTT curve"
		}
		fmt.Fprintf(b, "- critical cooling rate: linear cooling from T_e = %.2f K to %.2f K (%s), from the exact extended-volume integral, which scales as q⁻⁴%s\n", m.md.Te(), m.cool.End, m.cool.Reason, lag)
	} else if m.coolEr != nil {
		fmt.Fprintf(b, "- critical cooling rate: not computed (%v)\n", m.coolEr)
	}
	if m.u != nil {
		fmt.Fprintf(b, "- uncertainty: Monte Carlo, %d samples, seed %d, inputs drawn independently; P5, P50 and P95 are the %s\n", m.u.Samples, m.u.Seed, sample.QuantileDefinition)
	} else {
		b.WriteString("- uncertainty: none given (no spreads on the card or the command line)\n")
	}

	b.WriteString("\n## Results\n\n")
	m.writeResults(b)

	b.WriteString("\n## Uncertainty and what to measure next\n\n")
	m.writeUncertainty(b)

	if m.plot != "" {
		if m.withCCT() {
			b.WriteString("\n## TTT and CCT plot\n\n")
			fmt.Fprintf(b, "![TTT and CCT curves of %s for X = %s](%s)\n\n", c.Name, X, m.link)
			fmt.Fprintf(b, "Temperature against log time: the isothermal TTT curve to X = %s with its nose marked, the CCT curve (where linear cooling from T_e reaches X) and the cooling line at the critical rate; T_e (and T_g where the card has one) are dashed.\n", X)
		} else {
			b.WriteString("\n## TTT plot\n\n")
			fmt.Fprintf(b, "![TTT curve of %s for X = %s](%s)\n\n", c.Name, X, m.link)
			fmt.Fprintf(b, "Temperature against log time to X = %s; the nose is marked, T_e (and T_g where the card has one) are dashed.\n", X)
		}
	}

	b.WriteString("\n## Validity flags\n\n")
	if m.flags == 0 {
		b.WriteString("None raised over the TTT range, at the nose or at the hold temperature.\n")
	} else {
		for _, n := range flagNotes(m.flags) {
			fmt.Fprintf(b, "- %s\n", strings.TrimPrefix(n, "flag "))
		}
	}

	b.WriteString("\n## Cautions\n\n")
	b.WriteString("These results are estimates from classical nucleation theory with the inputs above. Rates depend on the cube of the interfacial energy inside an exponential, and a 10 % error in it moves a rate by orders of magnitude; the uncertainty bands cover only the spreads stated, not the choice of model.\n\n")
	b.WriteString("Heat treatment and quenching (hot metal, quench-oil fires, steam) and pharmaceutical or food process decisions must follow local codes, validated procedures and licensed practice. Do not use this memo as the sole basis for such a decision.\n")
	if strings.EqualFold(c.Kind, "demo") {
		b.WriteString("\nThe material of this memo is invented for demonstration; its numbers describe no real material.\n")
	}

	b.WriteString("\n---\n\nRegenerate this memo with:\n\n")
	fmt.Fprintf(b, "```\n%s\n```\n", command)
}

// writeResults is the results table and the short TTT table.
func (m *memo) writeResults(b *bytes.Buffer) {
	lines, _, _ := m.results()
	cols := []column{{"result", "", nil}, {"value", "", nil}}
	if m.u != nil {
		cols = append(cols, column{"P5", "", nil}, column{"P50", "", nil}, column{"P95", "", nil})
	}
	var rows [][]any
	for _, l := range lines {
		row := []any{mdEscape(l.label), mdEscape(l.value)}
		if m.u != nil {
			p5, p50, p95 := "", "", ""
			if l.head >= 0 {
				h, bd := m.heads[l.head], m.u.Bands[l.head]
				p5, p50, p95 = h.text(bd.P5), h.text(bd.P50), h.text(bd.P95)
			}
			row = append(row, p5, p50, p95)
		}
		rows = append(rows, row)
	}
	_ = writeTable(b, cols, rows, true)
	if m.cool != nil && m.nose.Inside() {
		b.WriteString("\nThe nose estimate assumes the whole path is spent at the nose; a real path spends only part of its time there, so the exact critical rate is lower.\n")
	}
	if m.at > 0 && m.hold.Dmu > 0 {
		// No mobility (below the VFT T0) gives log10 J = −Inf: the dash, as in the tables.
		fmt.Fprintf(b, "\nAt %.2f K: undercooling %.2f K, log10 J = %s (J in m⁻³ s⁻¹), growth rate u = %s m/s, critical nucleus %s molecules.\n",
			m.at, m.hold.Undercooling, fixed(3)(m.hold.Log10J()), sig(4)(m.hold.Growth), sig(4)(m.hold.Nucleus.Size))
	}

	fmt.Fprintf(b, "\nTTT table for X = %s:\n\n", fracLabel(m.X))
	tcols := []column{{"T (K)", "", nil}, {"T (°C)", "", nil}, {"time to X", "", nil}, {"log10 J (m⁻³ s⁻¹)", "", nil}, {"u (m/s)", "", nil}, {"flags", "", nil}}
	var trows [][]any
	for i, T := range m.ttt.T {
		s := m.md.At(T)
		t, _ := secondsOf(m.ttt.LnTime[i][0])
		trows = append(trows, []any{fixed(2)(T), fixed(2)(T - 273.15), readableTime(t), fixed(3)(s.Log10J()), sig(3)(s.Growth), strings.Join(s.Flags.Keys(), " ")})
	}
	_ = writeTable(b, tcols, trows, true)
}

// writeUncertainty is the spreads, the sensitivity ranking and the advice.
func (m *memo) writeUncertainty(b *bytes.Buffer) {
	if m.u == nil {
		b.WriteString("No spreads were given, so the results above are single values with no band. ")
		if d, ok := m.gammaGuide(m.md.Material().Gamma); ok {
			fmt.Fprintf(b, "As a guide, ±2 %% in the interfacial energy alone moves the nose time by %s decades. ", d)
		}
		b.WriteString("Give the standard deviations of the inputs (for example `--spread gamma=2% --spread d0=x2`, or a `[spread]` table on the card) to get P5, P50 and P95 and the ranking of what to measure next.\n")
		return
	}
	st := table{cols: []column{{"input", "", nil}, {"as given", "", nil}, {"distribution", "", nil}, {"standard deviation", "", nil}, {"redrawn", "", nil}, {"source", "", nil}}}
	for i, s := range m.plan.specs {
		su := m.u.Spreads[i]
		p, _ := presets.ParamByKey(s.Key)
		sd := fmt.Sprintf("%.4g %s", su.SD, p.Kinds[0].SI)
		if su.Dist == sample.LogNormal {
			sd = fmt.Sprintf("σ(ln) = %.3g (×/÷ %.3g)", su.SD, math.Exp(su.SD))
		}
		st.rows = append(st.rows, []any{s.Key, mdEscape(s.Text), su.Dist.String(), strings.TrimSpace(sd), fmt.Sprint(su.Redrawn), mdEscape(s.Source)})
	}
	_ = writeTable(b, st.cols, st.rows, true)
	fmt.Fprintf(b, "\nLog-normal spreads (%s) take the card value as the median; normal ones are centred on it. A draw outside a value's allowed range is drawn again.\n\n", strings.Join(presets.LogNormalKeys(), ", "))

	scratch := &result{}
	addUncertainty(scratch, m.plan, m.u, m.heads, nil)
	t := scratch.tables[0]
	b.WriteString("Sensitivity: the change of each result for −1σ / +1σ of one input alone, the others at their card values; in decades for times and rates, in K for temperatures.\n\n")
	_ = writeTable(b, t.cols, t.rows, true)
	for k, h := range m.heads {
		if !h.log || len(m.u.Sensitivity[k]) == 0 {
			continue
		}
		top := m.u.Sensitivity[k][0]
		if top.Size() == 0 {
			continue
		}
		fmt.Fprintf(b, "\n- %s: driven most by **%s** (%s decades for ±1σ)", h.label, top.Key, effectText(top))
	}
	b.WriteString("\n\nThe input at the top of the ranking is the one to measure better first.\n")
	for k, h := range m.heads {
		if miss := m.u.Bands[k].Missing; miss > 0 {
			fmt.Fprintf(b, "\n%s: %d of %d samples gave no answer and are left out of its band.\n", h.label, miss, m.u.Samples)
		}
	}
}

// gammaGuide is the change of the nose time, in decades, for ±2 % in γ.
func (m *memo) gammaGuide(g float64) (string, bool) {
	with := m.card.Vary([]sample.Spread{{Key: "gamma", Base: g}})
	var d [2]float64
	for i, f := range []float64{0.98, 1.02} {
		md, err := with([]float64{f * g})
		if err != nil {
			return "", false
		}
		n, err := md.Nose(m.lo, m.hi, m.X, m.j)
		if err != nil || !n.Inside() || !m.nose.Inside() {
			return "", false
		}
		d[i] = (n.LnTime - m.nose.LnTime) / math.Ln10
	}
	return effectText(sample.Effect{Minus: d[0], Plus: d[1]}), true
}

// withCCT reports whether the plot shows the CCT curve over the TTT one:
// for continuous nucleation without a time lag, when something nucleates
// on linear cooling.
func (m *memo) withCCT() bool {
	return m.cool != nil && m.j == (kinetics.JMAK{}) && criticalRate(m.cool, m.X) > 0
}

// writePlot draws the TTT curve beside the memo, with the CCT curve and
// the cooling line at the critical rate over it where there is one (the
// figure of undercool cool --critical --plot).
func (m *memo) writePlot() error {
	pf := &plotFlag{path: m.plot, format: "svg"}
	if m.withCCT() {
		lc := &linearCool{cl: m.cool, md: m.md, X: m.X, critical: true, name: m.card.Name, qc: criticalRate(m.cool, m.X)}
		return lc.plot(pf)
	}
	return writeTTTPlot(pf, m.md, m.card.Name, []float64{m.X}, m.j, m.lo, m.hi, m.ttt)
}

// regenerate is the command line that makes the same memo.
func regenerate(fs *pflag.FlagSet, sf *spreadFlags) string {
	parts := []string{"undercool", "report"}
	fs.VisitAll(func(f *pflag.Flag) {
		if !f.Changed {
			return
		}
		if f.Name == "spread" {
			for _, s := range sf.given {
				parts = append(parts, "--spread", shellQuote(s))
			}
			return
		}
		parts = append(parts, "--"+f.Name, shellQuote(f.Value.String()))
	})
	return strings.Join(parts, " ")
}

// shellQuote quotes a word for a POSIX shell when it needs it.
func shellQuote(s string) string {
	if s != "" && strings.Trim(s, "abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789-_=.,:/%+") == "" {
		return s
	}
	return "'" + strings.ReplaceAll(s, "'", `'\''`) + "'"
}
