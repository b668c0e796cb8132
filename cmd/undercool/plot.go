package main

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/answer"
)

// Plot files: what --plot accepts and how big a figure is.
var plotFormats = []string{".svg", ".png"}

const (
	plotWidth       = 16 * vg.Centimeter
	plotPanelHeight = 10 * vg.Centimeter
)

// checkPlotPath checks a plot's name: the extension must be .svg or .png.
// It returns the format name ("svg" or "png"). Whether the file can be
// written is checked before any work by run (plotFlag.register); the file
// is written whole or not at all by savePlots.
func checkPlotPath(path string) (string, error) {
	ext := strings.ToLower(extension(path))
	if !contains(plotFormats, ext) {
		return "", bad("%q: unsupported plot file type %q (use .svg or .png)", path, extension(path))
	}
	if filepath.Base(path) == ext {
		return "", bad("%q has no file name", path)
	}
	return ext[1:], nil
}

// extension is the extension of a file name, with its dot.
func extension(path string) string { return filepath.Ext(path) }

// savePlots draws the plots as panels stacked top to bottom on one figure
// and stages it in the file and format of pf, to be written with the
// command's other files. Each panel's legend is drawn beside it, to the
// right of its axes, so that it covers no data and no reference line.
func savePlots(pf *plotFlag, plots ...*plot.Plot) error {
	r := figureLayout(plots)
	c, err := draw.NewFormattedCanvas(r.width, r.height, pf.format)
	if err != nil {
		return placef("--plot: %v", err)
	}
	dc := draw.New(c)
	dc.SetColor(color.White) // the legends' strip too
	dc.Fill(dc.Rectangle.Path())
	for i, p := range plots {
		leg := r.legends[i]
		p.Legend = plot.NewLegend()
		plotC, legC := r.panel(dc, i)
		p.Draw(plotC)
		// The legend starts at the top of the panel's axes.
		legC.Max.Y = p.DataCanvas(plotC).Max.Y
		leg.Draw(legC)
	}
	return pf.files.write(pf.path, func(w io.Writer) error {
		_, err := c.WriteTo(w)
		return err
	})
}

// legendPad is the room between a panel's axes and its legend.
const legendPad = vg.Length(0.4 * vg.Centimeter)

// layout is where the panels of a figure and their legends go: the plot
// area is plotWidth wide, the legends take a strip to its right.
type layout struct {
	width, height vg.Length
	strip         vg.Length     // width of the legends' strip, 0 for none
	legends       []plot.Legend // each panel's, as it was built
	plots         []*plot.Plot
}

// figureLayout lays out panels stacked top to bottom, with their legends
// (at a smaller font than the axes) in a strip at the right.
func figureLayout(plots []*plot.Plot) layout {
	r := layout{width: plotWidth, height: plotPanelHeight * vg.Length(len(plots)), plots: plots}
	probe := draw.Canvas{Rectangle: vg.Rectangle{Max: vg.Point{X: plotWidth, Y: r.height}}}
	for _, p := range plots {
		leg := p.Legend
		leg.Top, leg.Left = true, true
		leg.TextStyle.Font.Size = vg.Points(10)
		leg.Padding = vg.Points(5)
		r.legends = append(r.legends, leg)
		if w := leg.Rectangle(probe).Size().X; w > 0 {
			r.strip = max(r.strip, w+legendPad)
		}
	}
	r.width += r.strip
	return r
}

// panel is the canvas of panel i, axes aligned with the others, and the
// strip of its legend.
func (r layout) panel(dc draw.Canvas, i int) (plotC, legC draw.Canvas) {
	area := draw.Crop(dc, 0, -r.strip, 0, 0)
	if len(r.plots) == 1 {
		plotC = area
	} else {
		grid := make([][]*plot.Plot, len(r.plots))
		for k, p := range r.plots {
			grid[k] = []*plot.Plot{p}
		}
		tiles := draw.Tiles{Rows: len(r.plots), Cols: 1, PadY: vg.Centimeter / 2}
		plotC = plot.Align(grid, tiles, area)[i][0]
	}
	legC = plotC
	legC.Min.X, legC.Max.X = plotC.Max.X+legendPad, dc.Max.X
	return plotC, legC
}

// palette gives each curve a fixed colour, so that figures are the same
// from run to run.
var palette = []color.Color{
	color.RGBA{R: 0x1f, G: 0x4e, B: 0x9c, A: 0xff}, // blue
	color.RGBA{R: 0xc2, G: 0x3b, B: 0x22, A: 0xff}, // red
	color.RGBA{R: 0x2e, G: 0x8b, B: 0x3a, A: 0xff}, // green
	color.RGBA{R: 0x7b, G: 0x3f, B: 0x9e, A: 0xff}, // purple
	color.RGBA{R: 0xd4, G: 0x8a, B: 0x00, A: 0xff}, // amber
}

var grey = color.Gray{Y: 0x70}

func curveColor(i int) color.Color { return palette[i%len(palette)] }

// decadeTicks marks powers of ten on a log axis, labelling at most about
// eight of them, every one written the same way: 1e-3, 1e0, 1e4.
type decadeTicks struct{}

func (decadeTicks) Ticks(lo, hi float64) []plot.Tick {
	a, b := int(math.Floor(math.Log10(lo))), int(math.Ceil(math.Log10(hi)))
	step := max(1, (b-a+7)/8)
	var ticks []plot.Tick
	for k := a; k <= b; k++ {
		v := math.Pow(10, float64(k))
		t := plot.Tick{Value: v}
		if k%step == 0 {
			t.Label = decadeLabel(k)
		}
		ticks = append(ticks, t)
		if b-a <= 5 && k < b {
			for m := 2; m < 10; m++ {
				ticks = append(ticks, plot.Tick{Value: float64(m) * v})
			}
		}
	}
	return ticks
}

// decadeLabel is the label of 10^k, one way for every decade.
func decadeLabel(k int) string { return fmt.Sprintf("1e%d", k) }

// plainTicks are the default ticks of a linear axis with labels written
// plainly ("750", not "750.00").
type plainTicks struct{}

func (plainTicks) Ticks(lo, hi float64) []plot.Tick {
	ticks := plot.DefaultTicks{}.Ticks(lo, hi)
	plainLabels(ticks)
	return ticks
}

// plainLabels writes the labels of the labelled ticks with the fewest
// decimals that give every one of them exactly (to 1e-9 of the axis's
// span): "1.9", "1.95", "2" become "1.90", "1.95", "2.00", and rounding
// noise such as 1.9000000000000001 never shows.
func plainLabels(ticks []plot.Tick) {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, t := range ticks {
		lo, hi = math.Min(lo, t.Value), math.Max(hi, t.Value)
	}
	exact := func(d int) bool {
		for _, t := range ticks {
			if t.Label == "" {
				continue
			}
			r, _ := strconv.ParseFloat(strconv.FormatFloat(t.Value, 'f', d, 64), 64)
			if math.Abs(r-t.Value) > 1e-9*math.Max(hi-lo, math.Abs(t.Value)) {
				return false
			}
		}
		return true
	}
	d := 0
	for d < 10 && !exact(d) {
		d++
	}
	for i := range ticks {
		if ticks[i].Label != "" {
			ticks[i].Label = strconv.FormatFloat(ticks[i].Value, 'f', d, 64)
		}
	}
}

// finitePositive reports whether x can sit on a log axis.
func finitePositive(x float64) bool { return x > 0 && !math.IsInf(x, 1) }

// tttFigure is what a TTT plot shows: the curves of the fractions with
// their noses, T_e and T_g, and what is drawn over them.
type tttFigure struct {
	title     string
	fractions []float64
	T         []float64   // K
	times     [][]float64 // times[i][k] in s at T[i] for fractions[k]; +Inf/NaN: never
	noses     [][2]float64
	// noses[k] = {T, t} of curve k, NaN when it has none inside the range
	te, tg float64   // reference lines, K (0 or NaN: none)
	labels []string  // of the curves; nil: "X = fraction"
	spanT  []float64 // temperatures the axis must reach besides the curves' (a measured curve's), K
	// shown are times, s, the time axis must reach besides the curves'
	// useful span (the end of a cooling path); over draws on the figure
	// once its axes are set.
	shown []float64
	over  []func(p *plot.Plot) error
}

// usefulDecades bounds the time axis: a TTT curve climbs towards infinite
// time near T_e and at low mobility; the axis shows the curves up to this
// many decades above their shortest times (the noses), or to the end of
// the table where that comes first.
const usefulDecades = 4

// plot builds the TTT figure: temperature against log time, one curve per
// fraction, each nose marked and named in the legend, T_e and T_g as
// dashed reference lines, then what over draws.
func (f *tttFigure) plot() (*plot.Plot, error) {
	p := plot.New()
	p.Title.Text = f.title
	p.X.Label.Text = "time (s)"
	p.Y.Label.Text = "temperature (K)"
	p.X.Scale = plot.LogScale{}
	p.X.Tick.Marker = decadeTicks{}
	p.Y.Tick.Marker = plainTicks{}
	p.Add(plotter.NewGrid())

	// The time axis: from the shortest time of any curve to usefulDecades
	// above the slowest curve's shortest, or to the table's end.
	lo, span, end := math.Inf(1), 0.0, 0.0
	for k := range f.fractions {
		short := math.Inf(1)
		for i := range f.T {
			if t := f.times[i][k]; finitePositive(t) {
				short, end = math.Min(short, t), math.Max(end, t)
			}
		}
		if k < len(f.noses) && finitePositive(f.noses[k][1]) {
			short = math.Min(short, f.noses[k][1]) // the nose, not the grid point next to it
		}
		if !math.IsInf(short, 1) {
			lo, span = math.Min(lo, short), math.Max(span, short)
		}
	}
	if math.IsInf(lo, 1) {
		return nil, placef("--plot: nothing to draw: no finite time in the temperature range (nothing transforms there)")
	}
	hi := math.Min(end, span*math.Pow(10, usefulDecades))
	for _, t := range f.shown {
		if finitePositive(t) {
			lo, hi = math.Min(lo, t), math.Max(hi, t)
		}
	}
	xmin, xmax := lo/3, hi*3
	if xmax/xmin < 100 {
		xmin, xmax = lo/10, hi*10
	}
	Tmin, Tmax := math.Inf(1), math.Inf(-1)
	for k, X := range f.fractions {
		var pts plotter.XYs
		for i := range f.T {
			if t := f.times[i][k]; finitePositive(t) {
				pts = append(pts, plotter.XY{X: t, Y: f.T[i]})
				if t <= xmax {
					Tmin, Tmax = math.Min(Tmin, f.T[i]), math.Max(Tmax, f.T[i])
				}
			}
		}
		if len(pts) == 0 {
			continue
		}
		l, err := plotter.NewLine(pts)
		if err != nil {
			return nil, placef("--plot: %v", err)
		}
		l.Color = curveColor(k)
		l.Width = vg.Points(1.5)
		p.Add(l)
		label := "X = " + answer.FracLabel(X)
		if f.labels != nil {
			label = f.labels[k]
		}
		p.Legend.Add(label, l)
	}
	for k, n := range f.noses {
		if !finitePositive(n[1]) || math.IsNaN(n[0]) {
			continue
		}
		s, err := plotter.NewScatter(plotter.XYs{{X: n[1], Y: n[0]}})
		if err != nil {
			return nil, placef("--plot: %v", err)
		}
		s.GlyphStyle = draw.GlyphStyle{Color: curveColor(k), Radius: vg.Points(3.5), Shape: draw.CircleGlyph{}}
		p.Add(s)
		label := "nose"
		if len(f.fractions) > 1 {
			label = "nose of X = " + answer.FracLabel(f.fractions[k])
		}
		p.Legend.Add(fmt.Sprintf("%s: %.2f K, %s", label, n[0], answer.ReadableTime(n[1])), s)
	}
	drawn, err := addRefLines(p, f.te, f.tg, func(T float64) plotter.XYs {
		return plotter.XYs{{X: xmin, Y: T}, {X: xmax, Y: T}}
	})
	if err != nil {
		return nil, err
	}
	for _, T := range append(drawn, f.spanT...) {
		Tmin, Tmax = math.Min(Tmin, T), math.Max(Tmax, T)
	}
	// Set the axes last: Add widens them to the data, and the curves run
	// off towards infinite time near T_e.
	pad := 0.03 * (Tmax - Tmin)
	p.Y.Min, p.Y.Max = Tmin-pad, Tmax+pad
	p.X.Min, p.X.Max = xmin, xmax
	for _, draw := range f.over {
		if err := draw(p); err != nil {
			return nil, err
		}
	}
	// What was drawn over widened the axes to its data: set them back.
	p.Y.Min, p.Y.Max = Tmin-pad, Tmax+pad
	p.X.Min, p.X.Max = xmin, xmax
	return p, nil
}

// tttCurves fills a figure with the TTT curves of a model for fractions on
// plotPoints temperatures between lo and hi, with their noses there.
func tttCurves(fig *tttFigure, md *kinetics.Model, fractions []float64, j kinetics.JMAK, lo, hi float64) error {
	temps := answer.Spread(hi, lo, plotPoints)
	ttt, err := md.TTT(temps, fractions, j, lo, hi)
	if err != nil {
		return err
	}
	fig.fractions, fig.T, fig.te, fig.tg = fractions, temps, md.Te(), md.Material().Tg
	fig.times = make([][]float64, len(temps))
	for i := range temps {
		fig.times[i] = make([]float64, len(fractions))
		for k := range fractions {
			fig.times[i][k], _ = answer.Seconds(ttt.LnTime[i][k])
		}
	}
	fig.noses = nil
	for _, n := range ttt.Noses {
		t, _ := answer.Seconds(n.LnTime)
		if !n.Inside() {
			t = math.NaN()
		}
		fig.noses = append(fig.noses, [2]float64{n.T, t})
	}
	return nil
}

// figureName names a material in a figure's title; an invented one says
// so, so that a figure used alone still does.
func figureName(c *presets.Card) string {
	if strings.EqualFold(c.Kind, "demo") {
		return c.Name + " (invented demo)"
	}
	return c.Name
}

// rateFigure is what a rate plot shows: log10 J and u against temperature.
type rateFigure struct {
	title  string
	T      []float64 // K
	log10J []float64 // NaN/−Inf: none
	u      []float64 // m/s; ≤ 0 or NaN: none
	te, tg float64
}

// rateMaxDecades bounds the lower end of each panel: rates fall by
// thousands of decades towards T_e; the panel shows this many below the
// highest value.
const rateMaxDecades = 60

func (f *rateFigure) plots() ([]*plot.Plot, error) {
	var jpts, upts plotter.XYs
	jmax, umax := math.Inf(-1), 0.0
	for i, T := range f.T {
		if j := f.log10J[i]; !math.IsNaN(j) && !math.IsInf(j, 0) {
			jpts = append(jpts, plotter.XY{X: T, Y: j})
			jmax = math.Max(jmax, j)
		}
		if u := f.u[i]; finitePositive(u) {
			upts = append(upts, plotter.XY{X: T, Y: u})
			umax = math.Max(umax, u)
		}
	}
	if len(jpts) == 0 && len(upts) == 0 {
		return nil, placef("--plot: nothing to draw: no finite rate in the temperature range")
	}
	var out []*plot.Plot
	panel := func(title, ylabel string, pts plotter.XYs, c color.Color) (*plot.Plot, error) {
		p := plot.New()
		p.Title.Text = title
		p.X.Label.Text = "temperature (K)"
		p.Y.Label.Text = ylabel
		p.X.Tick.Marker = plainTicks{}
		p.Y.Tick.Marker = plainTicks{}
		p.Add(plotter.NewGrid())
		l, err := plotter.NewLine(pts)
		if err != nil {
			return nil, placef("--plot: %v", err)
		}
		l.Color = c
		l.Width = vg.Points(1.5)
		p.Add(l)
		return p, nil
	}
	if len(jpts) > 0 {
		p, err := panel(f.title, "log10 J (m^-3 s^-1)", jpts, curveColor(0))
		if err != nil {
			return nil, err
		}
		p.Y.Min = math.Max(p.Y.Min, jmax-rateMaxDecades)
		p.Y.Max = jmax + 0.05*(jmax-p.Y.Min) + 0.5
		out = append(out, p)
	}
	if len(upts) > 0 {
		title := ""
		if len(out) == 0 {
			title = f.title
		}
		p, err := panel(title, "growth rate u (m/s)", upts, curveColor(1))
		if err != nil {
			return nil, err
		}
		p.Y.Scale = plot.LogScale{}
		p.Y.Tick.Marker = decadeTicks{}
		p.Y.Min = math.Max(p.Y.Min, umax*math.Pow(10, -rateMaxDecades/3))
		p.Y.Max = umax * 2
		out = append(out, p)
	}
	// Reference lines: T_e and T_g as vertical dashes on every panel.
	for _, p := range out {
		xmin, xmax := p.X.Min, p.X.Max
		drawn, err := addRefLines(p, f.te, f.tg, func(T float64) plotter.XYs {
			return plotter.XYs{{X: T, Y: p.Y.Min}, {X: T, Y: p.Y.Max}}
		})
		if err != nil {
			return nil, err
		}
		for _, T := range drawn {
			xmin, xmax = math.Min(xmin, T), math.Max(xmax, T)
		}
		p.X.Min, p.X.Max = xmin, xmax
	}
	return out, nil
}

// writeRatePlot draws log10 J and u against temperature on plotPoints
// temperatures spanning the table's, and writes the file. It is the
// --plot of the rate command.
func writeRatePlot(pf *plotFlag, name string, md *kinetics.Model, temps []float64) error {
	lo, hi := floats.Min(temps), floats.Max(temps)
	if !(lo < hi) {
		return usagef("--plot: a rate plot needs more than one temperature (give --range or several --temps)")
	}
	fig := &rateFigure{title: "nucleation and growth rates, " + name, te: md.Te(), tg: md.Material().Tg}
	for _, T := range answer.Spread(hi, lo, plotPoints) {
		s := md.At(T)
		fig.T = append(fig.T, T)
		fig.log10J = append(fig.log10J, s.Log10J())
		fig.u = append(fig.u, s.Growth)
	}
	ps, err := fig.plots()
	if err != nil {
		return err
	}
	return savePlots(pf, ps...)
}

// addRefLines draws T_e and T_g, each where it is positive, as grey dashed
// lines along seg(T) with a legend entry, and returns the temperatures drawn.
func addRefLines(p *plot.Plot, te, tg float64, seg func(T float64) plotter.XYs) ([]float64, error) {
	var drawn []float64
	for _, r := range []struct {
		name string
		T    float64
	}{{"Te", te}, {"Tg", tg}} {
		if !(r.T > 0) {
			continue
		}
		l, err := plotter.NewLine(seg(r.T))
		if err != nil {
			return nil, placef("--plot: %v", err)
		}
		l.Color = grey
		l.Dashes = []vg.Length{vg.Points(4), vg.Points(3)}
		p.Add(l)
		p.Legend.Add(fmt.Sprintf("%s = %.2f K", r.name, r.T), l)
		drawn = append(drawn, r.T)
	}
	return drawn, nil
}

// linePlot adds a line of points to p with its legend entry; dashes nil
// for a solid line.
func linePlot(p *plot.Plot, pts plotter.XYs, c color.Color, width vg.Length, dashes []vg.Length, label string) error {
	l, err := plotter.NewLine(pts)
	if err != nil {
		return placef("--plot: %v", err)
	}
	l.Color, l.Width, l.Dashes = c, width, dashes
	p.Add(l)
	p.Legend.Add(label, l)
	return nil
}

// markPlot adds a marked point to p with its legend entry.
func markPlot(p *plot.Plot, x, y float64, c color.Color, shape draw.GlyphDrawer, label string) error {
	s, err := plotter.NewScatter(plotter.XYs{{X: x, Y: y}})
	if err != nil {
		return placef("--plot: %v", err)
	}
	s.GlyphStyle = draw.GlyphStyle{Color: c, Radius: vg.Points(4), Shape: shape}
	p.Add(s)
	p.Legend.Add(label, s)
	return nil
}

// cctOver draws the CCT curve and the cooling lines of the rates (the
// critical one, with critical) over a TTT figure, and makes the time axis
// reach the end of each cooling line.
func cctOver(fig *tttFigure, cl *kinetics.Cooling, cct plotter.XYs, X float64, rates []float64, critical bool) {
	for _, q := range rates {
		fig.shown = append(fig.shown, (cl.Te-cl.End)/q)
	}
	fig.over = append(fig.over, func(p *plot.Plot) error {
		if len(cct) > 1 {
			if err := linePlot(p, cct, curveColor(1), vg.Points(1.5), nil, "CCT, X = "+answer.FracLabel(X)); err != nil {
				return err
			}
		}
		for k, q := range rates {
			// T = Te − q·t on a log time axis
			var pts plotter.XYs
			tEnd := (cl.Te - cl.End) / q
			for i := 0; i <= 100; i++ {
				t := p.X.Min * math.Pow(p.X.Max/p.X.Min, float64(i)/100)
				if t >= tEnd {
					break
				}
				pts = append(pts, plotter.XY{X: t, Y: cl.Te - q*t})
			}
			if tEnd > p.X.Min && tEnd < p.X.Max {
				pts = append(pts, plotter.XY{X: tEnd, Y: cl.End})
			}
			if len(pts) < 2 {
				continue
			}
			label := "cooling at " + answer.RateText(q)
			if critical {
				label = "critical rate " + answer.RateText(q)
			}
			if err := linePlot(p, pts, curveColor(2+k), vg.Points(1), []vg.Length{vg.Points(2), vg.Points(2)}, label); err != nil {
				return err
			}
		}
		return nil
	})
}

// zonePlot draws the metastable zone width against the cooling rate, the
// rate on a log axis.
func zonePlot(pf *plotFlag, name string, pts plotter.XYs) error {
	l, s, err := plotter.NewLinePoints(pts)
	if err != nil {
		return placef("--plot: %v", err)
	}
	l.Color, s.Color = curveColor(0), curveColor(0)
	p := plot.New()
	p.Title.Text = "metastable zone width, " + name
	p.X.Label.Text = "cooling rate (K/min), log scale"
	p.Y.Label.Text = "width T_sat - T_onset (K)"
	p.X.Scale = plot.LogScale{}
	p.X.Tick.Marker = decadeTicks{}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, q := range pts {
		lo, hi = math.Min(lo, q.X), math.Max(hi, q.X)
	}
	p.X.Min, p.X.Max = lo/1.5, hi*1.5 // room for the decade labels at the ends
	p.Add(plotter.NewGrid(), l, s)
	return savePlots(pf, p)
}

// cctPlotRates is the number of rates the CCT curve of a plot is drawn with.
const cctPlotRates = 120

// cctFigure is the TTT curve for X with the CCT curve over it, for rates
// spread over eight decades below the critical rate qc, where linear
// cooling reaches X; and the cooling lines of the given rates.
func cctFigure(cl *kinetics.Cooling, md *kinetics.Model, c *presets.Card, X float64, rates []float64, critical bool, qc float64) (*tttFigure, error) {
	if !(qc > 0) {
		return nil, usagef("--plot: nothing to draw: nothing nucleates on the path")
	}
	fig := &tttFigure{title: fmt.Sprintf("CCT over TTT, %s: X = %s", figureName(c), answer.FracLabel(X))}
	if err := tttCurves(fig, md, []float64{X}, kinetics.JMAK{}, cl.End, cl.Te*(1-1e-4)); err != nil {
		return nil, err
	}
	var cct plotter.XYs
	for i := 0; i < cctPlotRates; i++ {
		q := qc * math.Pow(10, -8*float64(i)/(cctPlotRates-1))
		if pt := cl.Reach(q, X); pt.Reached && finitePositive(pt.Time) {
			cct = append(cct, plotter.XY{X: pt.Time, Y: pt.Temp})
		}
	}
	cctOver(fig, cl, cct, X, rates, critical)
	return fig, nil
}

// saveFigure draws a TTT figure and writes it.
func saveFigure(pf *plotFlag, fig *tttFigure) error {
	p, err := fig.plot()
	if err != nil {
		return err
	}
	return savePlots(pf, p)
}

// curvePlot draws a measured cooling curve over the material's TTT curve
// for X (or over the C-curve of a quench factor alone) and writes the file.
func curvePlot(pf *plotFlag, in answer.CurveInput, a *answer.Curve) error {
	var fig *tttFigure
	if in.Model != nil {
		lo, hi := answer.DefaultSpan(in.Model)
		fig = &tttFigure{title: fmt.Sprintf("measured curve over TTT, %s: X = %s", figureName(in.Card), answer.FracLabel(in.X))}
		if err := tttCurves(fig, in.Model, []float64{in.X}, kinetics.JMAK{}, lo, hi); err != nil {
			return err
		}
	} else {
		fig = cCurveFigure(*in.CCurve, in.Path)
	}
	curveOver(fig, in.Path, in.X, a)
	return saveFigure(pf, fig)
}

// cCurveFigure is the C-curve C(T) of a quench factor over the
// temperatures of a path, below the curve's k4 (where it diverges).
func cCurveFigure(es kinetics.EvanchoStaley, p kinetics.Path) *tttFigure {
	lo, hi := floats.Min(p.Temp), math.Min(floats.Max(p.Temp), es.K4*(1-1e-3))
	fig := &tttFigure{title: "measured curve over the C-curve (Evancho-Staley)", fractions: []float64{math.NaN()}, labels: []string{"C-curve"}}
	if !(hi > lo) {
		hi = lo
	}
	for _, T := range answer.Spread(hi, lo, plotPoints) {
		fig.T = append(fig.T, T)
		fig.times = append(fig.times, []float64{es.Time(T)})
	}
	fig.noses = [][2]float64{{math.NaN(), math.NaN()}}
	return fig
}

// curveOver draws a measured cooling curve over a figure, its time counted
// from its first point (which a log axis cannot show), and marks where it
// reaches X (the path integral) and where its additivity sum, or the
// quench factor against a C-curve alone, reaches 1.
func curveOver(fig *tttFigure, path kinetics.Path, X float64, a *answer.Curve) {
	t0 := path.Time[0]
	var pts plotter.XYs
	for i, t := range path.Time {
		if t > t0 {
			pts = append(pts, plotter.XY{X: t - t0, Y: path.Temp[i]})
		}
	}
	if len(pts) < 2 {
		return
	}
	fig.shown = append(fig.shown, pts[0].X, pts[len(pts)-1].X)
	fig.spanT = append(fig.spanT, floats.Min(path.Temp), floats.Max(path.Temp))
	fig.over = append(fig.over, func(p *plot.Plot) error {
		label := "measured curve"
		if an := a.Analysis; an != nil && !an.Path.Reached {
			label += fmt.Sprintf(" (X = %s not reached: %s at its end)", answer.FracLabel(X), answer.Sig(3)(an.Path.Fraction))
		}
		if err := linePlot(p, pts, color.Black, vg.Points(1.2), nil, label); err != nil {
			return err
		}
		mark := func(reached bool, t, T float64, shape draw.GlyphDrawer, what string) error {
			if !reached || !(t-t0 > 0) {
				return nil
			}
			return markPlot(p, t-t0, T, color.Black, shape, fmt.Sprintf("%s: %.2f K, %s into the curve", what, T, answer.ReadableTime(t-t0)))
		}
		if an := a.Analysis; an != nil {
			r := an.Path
			if err := mark(r.Reached, r.TimeReached, r.TempReached, draw.CircleGlyph{}, "X = "+answer.FracLabel(X)+" reached"); err != nil {
				return err
			}
			s := an.Additivity
			return mark(s.Reached, s.TimeReached, s.TempReached, draw.BoxGlyph{}, "additivity sum reaches 1")
		}
		q := a.Quench
		return mark(q.Reached, q.TimeReached, q.TempReached, draw.BoxGlyph{}, "quench factor reaches 1")
	})
}
