package main

import (
	"bytes"
	"fmt"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"undercool/presets/answer"
)

// The figure of an evolve run: four panels against log time on a grid of
// two columns, and the final distribution as a histogram below them.
const (
	evolveWidth       = 24 * vg.Centimeter
	evolvePanelHeight = 8 * vg.Centimeter
	evolveHistHeight  = 9 * vg.Centimeter
	// evolveDecadesShown bounds a log axis of the time panels: the number
	// density rises from nothing through tens of decades.
	evolveDecadesShown = 12
)

// evolveSeries is one panel against time: its title, axis label, value and
// whether its axis is logarithmic.
type evolveSeries struct {
	title, label string
	y            func(answer.EvolveRow) float64
	log          bool
}

// sizeScale is how the sizes of a run are drawn: the factor from metres
// and the unit.
func sizeScale(a *answer.Evolve) (float64, string) {
	if a.System == "alloy" {
		return 1e9, "nm"
	}
	return 1e6, "um"
}

// evolveTimePanels are the number density, the mean size, the volume
// fraction and the supersaturation against the time since the start of
// the schedule, on log axes (the volume fraction linear).
func evolveTimePanels(a *answer.Evolve, name string) ([]*plot.Plot, error) {
	f, unit := sizeScale(a)
	mean := evolveSeries{"mean radius", "mean radius r (" + unit + ")", func(r answer.EvolveRow) float64 { return numOr(r.MeanRadius) * f }, true}
	if a.System == "crystallizer" {
		mean = evolveSeries{"mean size", "mean size L (" + unit + ")", func(r answer.EvolveRow) float64 { return numOr(r.MeanSize) * f }, true}
	}
	series := []evolveSeries{
		{"number density, " + name, "N (m^-3)", func(r answer.EvolveRow) float64 { return float64(r.NumberDensity) }, true},
		mean,
		{"volume fraction", "f_v", func(r answer.EvolveRow) float64 { return float64(r.VolumeFraction) }, false},
		{"supersaturation", "S = c/c_eq", func(r answer.EvolveRow) float64 { return float64(r.Supersaturation) }, true},
	}
	// Time runs from the onset of supersaturation (the ageing time after a
	// quench), or from the start of a schedule that never has one.
	t0, xlabel := float64(a.Onset), "time since S > 1 (s)"
	if math.IsNaN(t0) {
		t0, xlabel = float64(a.Rows[0].Time), "time since the start (s)"
	}
	tmin, tmax, first := math.Inf(1), 0.0, math.Inf(1)
	for _, r := range a.Rows {
		if t := float64(r.Time) - t0; t > 0 {
			tmin, tmax = math.Min(tmin, t), math.Max(tmax, t)
			if r.NumberDensity > 0 {
				first = math.Min(first, t)
			}
		}
	}
	if !(tmax > 0) {
		return nil, placef("--plot: nothing to draw: the run has no output time after its start")
	}
	// The axis starts a decade before the first particles: a slow cooling
	// spends hours supersaturated before anything nucleates.
	tmin = math.Max(tmin, math.Min(first/10, tmax/100))
	var out []*plot.Plot
	for k, s := range series {
		p := plot.New()
		p.Title.Text = s.title
		p.X.Label.Text = xlabel
		p.Y.Label.Text = s.label
		p.X.Scale = plot.LogScale{}
		p.X.Tick.Marker = decadeTicks{}
		p.Y.Tick.Marker = plainTicks{}
		p.Add(plotter.NewGrid())
		var pts plotter.XYs
		for _, r := range a.Rows {
			t, y := float64(r.Time)-t0, s.y(r)
			if t > 0 && !math.IsNaN(y) && !math.IsInf(y, 0) && (!s.log || y > 0) {
				pts = append(pts, plotter.XY{X: t, Y: y})
			}
		}
		if len(pts) > 0 {
			l, err := plotter.NewLine(pts)
			if err != nil {
				return nil, placef("--plot: %v", err)
			}
			l.Color = curveColor(k)
			l.Width = vg.Points(1.5)
			p.Add(l)
			if lo, hi := yRange(pts); s.log && hi/lo >= 100 {
				// Many decades: a log axis, showing at most evolveDecadesShown below the top.
				p.Y.Scale = plot.LogScale{}
				p.Y.Tick.Marker = inRange{decadeTicks{}}
				p.Y.Min, p.Y.Max = math.Max(lo, hi*math.Pow(10, -evolveDecadesShown))/1.5, hi*1.5
			} else {
				pad := 0.05 * (hi - lo)
				if pad == 0 {
					pad = 0.05 * math.Abs(hi)
				}
				p.Y.Min, p.Y.Max = math.Min(0, lo-pad), hi+pad
			}
		} else {
			p.Title.Text += " (none)"
			p.Y.Min, p.Y.Max = 0, 1
		}
		p.X.Min, p.X.Max = tmin, tmax
		out = append(out, p)
	}
	return out, nil
}

func numOr(n *answer.Num) float64 {
	if n == nil {
		return math.NaN()
	}
	return float64(*n)
}

func yRange(pts plotter.XYs) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, q := range pts {
		lo, hi = math.Min(lo, q.Y), math.Max(hi, q.Y)
	}
	return lo, hi
}

// evolveHistogram is the final distribution: the particles per m³ in each
// bin of equal width in log size, drawn as bars on a log size axis, with
// D10, D50 and D90 of a crystallizer as dashed lines.
func evolveHistogram(a *answer.Evolve, name string) (*plot.Plot, error) {
	if len(a.Histogram) == 0 {
		return nil, fmt.Errorf("no particles at the end of the schedule: no distribution to draw")
	}
	f, unit := sizeScale(a)
	p := plot.New()
	p.Title.Text = "final distribution, " + name
	p.X.Label.Text = fmt.Sprintf("%s (%s), log scale", a.Kind, unit)
	p.Y.Label.Text = "particles per m^3 in the bin"
	p.X.Scale = plot.LogScale{}
	p.X.Tick.Marker = fineLogTicks{}
	p.Add(plotter.NewGrid())
	ymax := 0.0
	for _, b := range a.Histogram {
		lo, hi, n := float64(b.Lo)*f, float64(b.Hi)*f, float64(b.Number)
		ymax = math.Max(ymax, n)
		if !(n > 0) {
			continue
		}
		bar, err := plotter.NewPolygon(plotter.XYs{{X: lo, Y: 0}, {X: hi, Y: 0}, {X: hi, Y: n}, {X: lo, Y: n}})
		if err != nil {
			return nil, placef("--plot: %v", err)
		}
		bar.Color = curveColor(0)
		bar.LineStyle.Color = palette[0]
		bar.LineStyle.Width = vg.Points(0.5)
		p.Add(bar)
	}
	lo, hi := float64(a.Histogram[0].Lo)*f, float64(a.Histogram[len(a.Histogram)-1].Hi)*f
	if a.D50 != nil {
		for _, d := range []*answer.Num{a.D10, a.D90} {
			if x := float64(*d) * f; finitePositive(x) {
				lo, hi = math.Min(lo, x), math.Max(hi, x)
			}
		}
	}
	if hi/lo < 2 { // room for at least two labels
		mid := math.Sqrt(lo * hi)
		lo, hi = mid/math.Sqrt2, mid*math.Sqrt2
	}
	p.X.Min, p.X.Max = lo/1.1, hi*1.1
	top := ymax * 1.15
	if a.D50 != nil {
		top = ymax * 1.4 // room for the legend
	}
	p.Y.Min, p.Y.Max = 0, top
	if a.D50 != nil {
		for k, d := range []struct {
			name string
			x    *answer.Num
		}{{"D10", a.D10}, {"D50", a.D50}, {"D90", a.D90}} {
			x := float64(*d.x) * f
			if !finitePositive(x) {
				continue
			}
			l, err := plotter.NewLine(plotter.XYs{{X: x, Y: 0}, {X: x, Y: top}})
			if err != nil {
				return nil, placef("--plot: %v", err)
			}
			l.Color = curveColor(1 + k)
			l.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
			p.Add(l)
			p.Legend.Add(fmt.Sprintf("%s = %.4g %s (by volume)", d.name, x, unit), l)
		}
		p.Legend.Top = true
	}
	return p, nil
}

// inRange keeps the ticks of a marker that lie on the axis: a tick beyond
// it would still take room for its label.
type inRange struct{ plot.Ticker }

func (r inRange) Ticks(lo, hi float64) []plot.Tick {
	var out []plot.Tick
	for _, t := range r.Ticker.Ticks(lo, hi) {
		if t.Value >= lo && t.Value <= hi {
			out = append(out, t)
		}
	}
	return out
}

// fineLogTicks mark a log axis of a narrow span: 1, 2 and 5 times the
// powers of ten labelled, the other integers marked.
type fineLogTicks struct{}

func (fineLogTicks) Ticks(lo, hi float64) []plot.Tick {
	var ticks []plot.Tick
	for k := int(math.Floor(math.Log10(lo))); k <= int(math.Ceil(math.Log10(hi))); k++ {
		for m := 1; m < 10; m++ {
			v := float64(m) * math.Pow(10, float64(k))
			if v < lo || v > hi {
				continue
			}
			t := plot.Tick{Value: v}
			if m == 1 || m == 2 || m == 5 {
				t.Label = strconv.FormatFloat(v, 'g', -1, 64)
			}
			ticks = append(ticks, t)
		}
	}
	return ticks
}

// evolveFigure draws the time panels (time) and the histogram (dist) of a
// run, one above the other, and returns the file's bytes in the format.
func evolveFigure(a *answer.Evolve, name, format string, time, dist bool) ([]byte, error) {
	var panels []*plot.Plot
	var hist *plot.Plot
	var err error
	if time {
		if panels, err = evolveTimePanels(a, name); err != nil {
			return nil, err
		}
	}
	if dist {
		if hist, err = evolveHistogram(a, name); err != nil {
			return nil, err
		}
	}
	rows := (len(panels) + 1) / 2
	h := evolvePanelHeight * vg.Length(rows)
	if hist != nil {
		h += evolveHistHeight
	}
	c, err := draw.NewFormattedCanvas(evolveWidth, h, format)
	if err != nil {
		return nil, placef("--plot: %v", err)
	}
	dc := draw.New(c)
	top := dc
	if hist != nil && rows > 0 {
		top = draw.Crop(dc, 0, 0, evolveHistHeight, 0)
		hist.Draw(draw.Crop(dc, 0, 0, 0, -evolvePanelHeight*vg.Length(rows)))
	} else if hist != nil {
		hist.Draw(dc)
	}
	tiles := draw.Tiles{Rows: rows, Cols: 2, PadX: vg.Centimeter / 2, PadY: vg.Centimeter / 2}
	for k, p := range panels {
		p.Draw(tiles.At(top, k%2, k/2))
	}
	var b bytes.Buffer
	if _, err := c.WriteTo(&b); err != nil {
		return nil, placef("--plot: %v", err)
	}
	return b.Bytes(), nil
}
