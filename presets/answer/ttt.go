package answer

import (
	"fmt"
	"math"
	"strconv"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/units"
)

// TTTInput asks for the TTT curves of a card's model: the times to reach
// each fraction at each temperature, and the nose of each curve searched
// over [Lo, Hi].
type TTTInput struct {
	Card      *presets.Card
	Model     *kinetics.Model
	Temps     []float64 // K, the rows
	Fractions []float64 // each in (0, 1)
	JMAK      kinetics.JMAK
	Lo, Hi    float64 // K, the nose search
	Sampling  *Sampling
	Names     Names
}

// TransformInputs are the inputs of an isothermal answer: the material and
// the transformation law.
type TransformInputs struct {
	Material
	Transformation
}

func (t TransformInputs) about() []string { return append(t.Material.About(), t.Transformation.line()) }

// TTT is the TTT table with its noses.
type TTT struct {
	Inputs      TransformInputs `json:"inputs"`
	Fraction    OneOrMany[Num]  `json:"fraction"`
	Nose        OneOrMany[Nose] `json:"nose"`
	Uncertainty *Uncertainty    `json:"uncertainty,omitempty"`
	Rows        []TTTRow        `json:"rows"`

	Curves   *kinetics.TTT `json:"-"` // the times and noses as computed
	lo, hi   float64
	flags    kinetics.Flag
	overflow bool // a time beyond the float64 range
	names    Names
}

// TTTRow is one temperature: the time to each fraction.
type TTTRow struct {
	T     Num            `json:"temperature_k"`
	TC    Num            `json:"temperature_c"`
	Time  OneOrMany[Num] `json:"time_s"` // s; null: never
	Flags Strings        `json:"flags"`
}

// Nose is where a TTT curve is fastest: inside the searched range, or at
// one of its ends, or nowhere.
type Nose struct {
	Fraction Num     `json:"fraction"`
	T        Num     `json:"temperature_k"`
	Time     Num     `json:"time_s"`
	Inside   bool    `json:"inside_range"`
	Fastest  *TimeAt `json:"fastest_in_range,omitempty"` // the end where the time still falls

	line string
}

// TimeAt is a temperature and the time it is reached at.
type TimeAt struct {
	T    Num `json:"temperature_k"`
	Time Num `json:"time_s"`
}

// Seconds turns ln t into seconds: +Inf for never (including a time
// beyond the float64 range), and reports whether it overflowed.
func Seconds(lnt float64) (t float64, overflow bool) {
	t = math.Exp(lnt)
	return t, math.IsInf(t, 1) && !math.IsInf(lnt, 1)
}

// FracLabel writes a fraction the way the outputs name it.
func FracLabel(X float64) string { return strconv.FormatFloat(X, 'g', 4, 64) }

// TTTs computes the table and the noses, with the bands of the nose
// temperature and time when there are spreads.
func TTTs(in TTTInput) (*TTT, error) {
	md := in.Model
	if err := checkGamma(md, append([]float64{in.Lo, in.Hi}, in.Temps...)...); err != nil {
		return nil, err
	}
	curves, err := md.TTT(in.Temps, in.Fractions, in.JMAK, in.Lo, in.Hi)
	if err != nil {
		return nil, err
	}
	a := &TTT{
		Inputs: TransformInputs{Describe(in.Card, md), describeJMAK(in.JMAK)},
		Curves: curves, lo: in.Lo, hi: in.Hi, names: in.Names, Fraction: nums(in.Fractions),
	}
	several := len(in.Fractions) > 1
	for k, X := range in.Fractions {
		a.Nose = append(a.Nose, describeNose(curves.Noses[k], X, in.Lo, in.Hi, several, in.Names))
	}
	for i, T := range curves.T {
		times := make([]Num, len(in.Fractions))
		for k := range in.Fractions {
			t, o := Seconds(curves.LnTime[i][k])
			times[k], a.overflow = Num(t), a.overflow || o
		}
		a.Rows = append(a.Rows, TTTRow{T: Num(T), TC: Num(units.Celsius(T)), Time: times, Flags: curves.Flags[i].Keys()})
		a.flags |= curves.Flags[i]
	}
	heads, eval := tttHeadlines(in.Fractions, in.JMAK, in.Lo, in.Hi)
	if a.Uncertainty, err = sampled(in.Sampling, heads, eval, nil); err != nil {
		return nil, err
	}
	return a, nil
}

// describeNose is the nose of the curve for X and its summary line.
func describeNose(n kinetics.Nose, X, lo, hi float64, several bool, names Names) Nose {
	label := "nose"
	if several {
		label = "nose (X = " + FracLabel(X) + ")"
	}
	nan := Num(math.NaN())
	out := Nose{Fraction: Num(X), T: nan, Time: nan}
	switch {
	case math.IsNaN(n.T):
		out.line = fmt.Sprintf("%s: none, nothing transforms between %.2f and %.2f K", label, lo, hi)
	case !n.Inside():
		t, _ := Seconds(n.LnTime)
		end, dir := "lower", "below"
		if n.Edge > 0 {
			end, dir = "upper", "above"
		}
		out.line = fmt.Sprintf("%s: not inside %.2f–%.2f K; the time still falls at the %s end (%s at %.2f K): the nose lies %s, widen %s",
			label, lo, hi, end, ReadableTime(t), n.T, dir, names.of("range"))
		out.Fastest = &TimeAt{Num(n.T), Num(t)}
	default:
		t, _ := Seconds(n.LnTime)
		out.line = fmt.Sprintf("%s: %s, %s", label, KelvinCelsius(n.T), ReadableTime(t))
		out.T, out.Time, out.Inside = Num(n.T), Num(t), true
	}
	return out
}

// tttHeadlines are the bands of a TTT curve: the nose temperature and
// time for each fraction. A nose outside [lo, hi] has no answer.
func tttHeadlines(fractions []float64, j kinetics.JMAK, lo, hi float64) ([]headline, func(*kinetics.Model) ([]float64, error)) {
	var heads []headline
	for _, X := range fractions {
		suffix, label := "", ""
		if len(fractions) > 1 {
			suffix, label = "_x_"+FracLabel(X), " (X = "+FracLabel(X)+")"
		}
		heads = append(heads,
			headline{key: "nose_temperature_k" + suffix, label: "nose temperature" + label, text: kelvin, row: -1},
			headline{key: "nose_time_s" + suffix, label: "nose time" + label, log: true, text: ReadableTime, row: -1})
	}
	eval := func(md *kinetics.Model) ([]float64, error) {
		out := make([]float64, 0, 2*len(fractions))
		for _, X := range fractions {
			n, err := md.Nose(lo, hi, X, j)
			if err != nil {
				return nil, err
			}
			switch {
			case math.IsNaN(n.T): // nothing transforms in the range
				out = append(out, math.NaN(), math.Inf(1))
			case !n.Inside():
				out = append(out, math.NaN(), math.NaN())
			default:
				t, _ := Seconds(n.LnTime)
				out = append(out, n.T, t)
			}
		}
		return out, nil
	}
	return heads, eval
}

// LagNote explains the time lag where it is added.
const LagNote = "time lag: nucleation taken to start after Kashchiev's intercept lag theta = 2/(3 pi Z^2 beta*) (Kashchiev 1969) and run at the steady rate after; against a numerical solution of the cluster master equation (Becker-Doring) the lag is 0.72 to 1.6 times theta over barriers of 10 to 160 kT (1.15 at 40 kT)"

// Doc is how the table reads: one time column per fraction.
func (a *TTT) Doc() Doc {
	d := Doc{Title: "undercool ttt: time to transform in an isothermal hold", About: a.Inputs.about()}
	for _, n := range a.Nose {
		d.Summary = append(d.Summary, n.line)
	}
	t := &Table{Cols: []Col{{Head: "T (K)", Key: "temperature_k", Text: Fixed(2)}, {Head: "T (°C)", Key: "temperature_c", Text: Fixed(2), Drop: 1}}}
	if fs := a.Curves.Fractions; len(fs) > 1 {
		for _, X := range fs {
			t.Cols = append(t.Cols, Col{Head: "time to X = " + FracLabel(X), Key: "time_s_x_" + FracLabel(X), Text: TimeCell})
		}
	} else {
		t.Cols = append(t.Cols, Col{Head: "time to X = " + FracLabel(fs[0]), Key: "time_s", Text: TimeCell})
	}
	t.Cols = append(t.Cols, Col{Head: "flags", Key: "flags"})
	for _, r := range a.Rows {
		row := []any{float64(r.T), float64(r.TC)}
		for _, x := range r.Time {
			row = append(row, float64(x))
		}
		t.Rows = append(t.Rows, append(row, []string(r.Flags)))
	}
	d.Table = t
	d.Notes = FlagNotes(a.flags)
	d.Notes = append(d.Notes, fmt.Sprintf("nose searched between %.2f and %.2f K to %.2g K; \"never\" in the table means nothing transforms there (no driving force or no mobility)", a.lo, a.hi, kinetics.NoseTolerance))
	if a.overflow {
		d.Notes = append(d.Notes, "never also stands for times beyond 1.8e308 s")
	}
	if a.Curves.JMAK.Lag {
		d.Notes = append(d.Notes, LagNote)
	}
	a.Inputs.mark(&d, "time_s")
	a.Uncertainty.addTo(&d)
	d.Notes = append(d.Notes, Caution)
	return d
}
