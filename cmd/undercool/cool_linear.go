package main

import (
	"fmt"
	"math"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"

	"undercool/kinetics"
)

// linearCool is linear cooling from T_e for the cool command.
type linearCool struct {
	cl       *kinetics.Cooling
	md       *kinetics.Model
	X, V     float64 // fraction target; volume (0: none)
	rates    []float64
	critical bool
	name     string
	qc       float64
}

// cctFactors are the rates of the CCT table printed with --critical, as
// multiples of the critical rate.
var cctFactors = []float64{0.01, 0.1, 0.3, 1, 3, 10}

func (lc *linearCool) columns() []column {
	cols := []column{
		{"rate (K/s)", "cooling_rate_k_per_s", sig(4)},
		{"fraction at end", "fraction", sig(4)},
		{"X reached at T (K)", "temperature_k", fixed(2)},
		timeColumn("after", "time_s"),
	}
	if lc.V > 0 {
		cols = append(cols,
			column{"onset T (K)", "onset_temperature_k", fixed(2)},
			column{"onset ΔT (K)", "onset_undercooling_k", fixed(2)},
			column{"nuclei expected", "expected_nuclei", sig(4)})
	}
	return cols
}

// row is the CCT row of one rate.
func (lc *linearCool) row(q float64) []any {
	p := lc.cl.Reach(q, lc.X)
	T, t := math.NaN(), math.NaN()
	if p.Reached {
		T, t = p.Temp, p.Time
	}
	row := []any{q, lc.cl.Fraction(q), T, t}
	if lc.V > 0 {
		o := lc.cl.Onset(lc.V, q)
		oT, odT := math.NaN(), math.NaN()
		if o.Reached {
			oT, odT = o.Temp, lc.cl.Te-o.Temp
		}
		row = append(row, oT, odT, o.Expected())
	}
	return row
}

// onsetJSON gives the onset keys of one rate, null when none.
func (lc *linearCool) onsetJSON(q float64) (object, string) {
	o := lc.cl.Onset(lc.V, q)
	if !o.Reached {
		return object{{"onset_temperature_k", nil}, {"onset_undercooling_k", nil}, {"onset_time_s", nil}, {"expected_nuclei", o.Expected()}},
			fmt.Sprintf("onset in %.4g m3 at %s: none, %.3g nuclei expected on the whole path", lc.V, coolRateText(q), o.Expected())
	}
	return object{{"onset_temperature_k", o.Temp}, {"onset_undercooling_k", lc.cl.Te - o.Temp}, {"onset_time_s", o.Time}, {"expected_nuclei", o.Expected()}},
		fmt.Sprintf("onset in %.4g m3 at %s: first nucleus expected at %.2f K (undercooling %.2f K) after %s", lc.V, coolRateText(q), o.Temp, lc.cl.Te-o.Temp, readableTime(o.Time))
}

func coolRateText(q float64) string { return fmt.Sprintf("%.4g K/s", q) }

func (lc *linearCool) result(about []string, inputs object) (*result, error) {
	cl := lc.cl
	about = append(about, endLine(cl), transformLine)
	inputs = append(inputs,
		kv{"path", "linear"}, kv{"end_temperature_k", cl.End}, kv{"end_reason", cl.Reason.String()},
		kv{"target_fraction", lc.X})
	if lc.V > 0 {
		inputs = append(inputs, kv{"volume_m3", lc.V})
	}
	r := &result{title: "undercool cool: linear cooling from Te", about: about, inputs: inputs, cols: lc.columns()}
	lc.qc = cl.CriticalRate(lc.X)
	rates := lc.rates
	var extra object
	if lc.critical {
		nose, n, err := cl.NoseRate(lc.X)
		if err != nil {
			return nil, fmt.Errorf("cool: nose: %v", err)
		}
		if lc.qc > 0 {
			r.summary = append(r.summary, fmt.Sprintf("critical cooling rate to stay below X = %s at %.2f K: %.4g K/s (exact path integral; Xext scales as rate^-4)", fracLabel(lc.X), cl.End, lc.qc))
		} else {
			r.summary = append(r.summary, "critical cooling rate: none needed, nothing nucleates on the path")
		}
		extra = append(extra, kv{"critical_cooling_rate_k_per_s", lc.qc})
		noseJS := object{{"temperature_k", nil}, {"time_s", nil}}
		if nose > 0 && n.Inside() {
			t := math.Exp(n.LnTime)
			r.summary = append(r.summary, fmt.Sprintf("nose estimate (Te - T_nose)/t_nose: %.4g K/s (nose %.2f K, %s); it overstates the rate, since a cooling path spends only part of its time near the nose", nose, n.T, readableTime(t)))
			noseJS = object{{"temperature_k", n.T}, {"time_s", t}}
			extra = append(extra, kv{"nose_estimate_k_per_s", nose})
		} else {
			r.summary = append(r.summary, "nose estimate: no nose of the TTT curve inside the path")
			extra = append(extra, kv{"nose_estimate_k_per_s", nil})
		}
		extra = append(extra, kv{"nose", noseJS})
		if lc.V > 0 && lc.qc > 0 {
			js, line := lc.onsetJSON(lc.qc)
			r.summary = append(r.summary, line)
			extra = append(extra, js...)
		}
		if lc.qc > 0 {
			for _, f := range cctFactors {
				rates = append(rates, f*lc.qc)
			}
		}
	} else {
		if len(rates) == 1 {
			q := rates[0]
			X := cl.Fraction(q)
			p := cl.Reach(q, lc.X)
			line := fmt.Sprintf("fraction at %.2f K after cooling at %s: %.4g", cl.End, coolRateText(q), X)
			reached := any(nil)
			if p.Reached {
				line += fmt.Sprintf("; X = %s reached at %.2f K after %s", fracLabel(lc.X), p.Temp, readableTime(p.Time))
				reached = object{{"temperature_k", p.Temp}, {"time_s", p.Time}}
			} else {
				line += fmt.Sprintf("; X = %s not reached", fracLabel(lc.X))
			}
			r.summary = append(r.summary, line)
			extra = append(extra, kv{"cooling_rate_k_per_s", q}, kv{"fraction", X}, kv{"fraction_reached", reached})
			if lc.V > 0 {
				js, l := lc.onsetJSON(q)
				r.summary = append(r.summary, l)
				extra = append(extra, js...)
			}
		}
		r.summary = append(r.summary, fmt.Sprintf("critical cooling rate to stay below X = %s: %.4g K/s", fracLabel(lc.X), lc.qc))
		extra = append(extra, kv{"critical_cooling_rate_k_per_s", lc.qc})
	}
	r.extra = extra
	for _, q := range rates {
		r.rows = append(r.rows, lc.row(q))
	}
	r.notes = append(r.notes,
		"the table is the CCT table: for each rate, where linear cooling from Te first reaches X; — where it does not before the end of the path")
	if lc.V > 0 {
		r.notes = append(r.notes, "onset: where the expected number of nuclei in the volume, V times the integral of J dt, reaches 1 (the sample is then unfrozen with probability 1/e)")
	}
	r.notes = append(r.notes, "no time lag of nucleation and no athermal (pre-existing) nuclei")
	if lc.critical {
		r.notes = append(r.notes, "the nose estimate uses the isothermal TTT curve of the same model (continuous nucleation, JMAK)")
	}
	r.notes = append(r.notes, caution)
	return r, nil
}

// cctPlotRates is the number of rates the CCT curve of a plot is drawn with.
const cctPlotRates = 120

// plot draws the TTT curve for X with the CCT curve over it: for rates
// spread over eight decades below the critical rate, where linear cooling
// reaches X; and the cooling lines of the given rates.
func (lc *linearCool) plot(pf *plotFlag) error {
	cl, md := lc.cl, lc.md
	if !(lc.qc > 0) {
		return usagef("--plot: nothing to draw: nothing nucleates on the path")
	}
	lo, hi := cl.End, cl.Te*(1-1e-4)
	temps := spread(hi, lo, plotPoints)
	ttt, err := md.TTT(temps, []float64{lc.X}, kinetics.JMAK{}, lo, hi)
	if err != nil {
		return fmt.Errorf("cool: %v", err)
	}
	m := md.Material()
	fig := &tttFigure{
		title:     fmt.Sprintf("CCT over TTT, %s: X = %s", lc.name, fracLabel(lc.X)),
		fractions: []float64{lc.X},
		T:         temps,
		te:        md.Te(),
		tg:        m.Tg,
	}
	fig.times = make([][]float64, len(temps))
	for i := range temps {
		t, _ := secondsOf(ttt.LnTime[i][0])
		fig.times[i] = []float64{t}
	}
	if n := ttt.Noses[0]; n.Inside() {
		t, _ := secondsOf(n.LnTime)
		fig.noses = [][2]float64{{n.T, t}}
	}
	p, err := fig.plot()
	if err != nil {
		return err
	}
	var cct plotter.XYs
	for i := 0; i < cctPlotRates; i++ {
		q := lc.qc * math.Pow(10, -8*float64(i)/(cctPlotRates-1))
		if pt := cl.Reach(q, lc.X); pt.Reached && finitePositive(pt.Time) {
			cct = append(cct, plotter.XY{X: pt.Time, Y: pt.Temp})
		}
	}
	xmin, xmax := p.X.Min, p.X.Max
	var all plotter.XYs
	for i := range temps {
		if t := fig.times[i][0]; finitePositive(t) {
			all = append(all, plotter.XY{X: t, Y: temps[i]})
		}
	}
	all = append(all, cct...)
	if len(cct) > 1 {
		l, err := plotter.NewLine(cct)
		if err != nil {
			return fmt.Errorf("--plot: %v", err)
		}
		l.Color = curveColor(1)
		l.Width = vg.Points(1.5)
		p.Add(l)
		p.Legend.Add("CCT, X = "+fracLabel(lc.X), l)
		for _, q := range cct {
			xmin, xmax = math.Min(xmin, q.X/3), math.Max(xmax, q.X*3)
		}
	}
	rates := lc.rates
	if lc.critical {
		rates = []float64{lc.qc}
	}
	for k, q := range rates {
		// T = Te − q·t on a log time axis
		var pts plotter.XYs
		tEnd := (cl.Te - cl.End) / q
		for i := 0; i <= 100; i++ {
			t := xmin * math.Pow(xmax/xmin, float64(i)/100)
			if t >= tEnd {
				break
			}
			pts = append(pts, plotter.XY{X: t, Y: cl.Te - q*t})
		}
		if tEnd > xmin && tEnd < xmax {
			pts = append(pts, plotter.XY{X: tEnd, Y: cl.End})
		}
		all = append(all, pts...)
		if len(pts) < 2 {
			continue
		}
		l, err := plotter.NewLine(pts)
		if err != nil {
			return fmt.Errorf("--plot: %v", err)
		}
		l.Color = curveColor(2 + k)
		l.Dashes = []vg.Length{vg.Points(2), vg.Points(2)}
		p.Add(l)
		label := "cooling at " + coolRateText(q)
		if lc.critical {
			label = "critical rate " + coolRateText(q)
		}
		p.Legend.Add(label, l)
	}
	p.X.Min, p.X.Max = xmin, xmax
	placeLegend(p, all)
	return savePlots(pf.path, pf.format, p)
}
