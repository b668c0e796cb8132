package main

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"undercool/kinetics"
	"undercool/presets/answer"
)

// Plot files: what --plot accepts and how big a figure is.
var plotFormats = []string{".svg", ".png"}

const (
	plotWidth       = 16 * vg.Centimeter
	plotPanelHeight = 10 * vg.Centimeter
)

// checkPlotPath checks a plot's path before any work is done: the
// extension must be .svg or .png and the directory must exist. It returns
// the format name ("svg" or "png"). The file itself is written later,
// whole or not at all, by savePlots.
func checkPlotPath(path string) (string, error) {
	ext := strings.ToLower(extension(path))
	if !contains(plotFormats, ext) {
		return "", bad("%q: unsupported plot file type %q (use .svg or .png)", path, extension(path))
	}
	if filepath.Base(path) == ext {
		return "", bad("%q has no file name", path)
	}
	if err := checkDir(path); err != nil {
		return "", err
	}
	return ext[1:], nil
}

// checkDir checks that a file can be made at path: its directory exists
// and it is not itself a directory.
func checkDir(path string) error {
	dir := filepath.Dir(path)
	st, err := os.Stat(dir)
	if err != nil {
		return bad("cannot write %s: directory %s: %v", path, dir, unwrapPath(err))
	}
	if !st.IsDir() {
		return bad("cannot write %s: %s is not a directory", path, dir)
	}
	if st, err := os.Stat(path); err == nil && st.IsDir() {
		return bad("cannot write %s: it is a directory", path)
	}
	return nil
}

// extension is the extension of a file name, with its dot.
func extension(path string) string { return filepath.Ext(path) }

// savePlots draws the plots as panels stacked top to bottom on one figure
// and writes it to path in the given format, whole or not at all.
func savePlots(path, format string, plots ...*plot.Plot) error {
	h := plotPanelHeight * vg.Length(len(plots))
	c, err := draw.NewFormattedCanvas(plotWidth, h, format)
	if err != nil {
		return placef("--plot: %v", err)
	}
	dc := draw.New(c)
	if len(plots) == 1 {
		plots[0].Draw(dc)
	} else {
		grid := make([][]*plot.Plot, len(plots))
		for i, p := range plots {
			grid[i] = []*plot.Plot{p}
		}
		tiles := draw.Tiles{Rows: len(plots), Cols: 1, PadY: vg.Centimeter / 2}
		canvases := plot.Align(grid, tiles, dc)
		for i, p := range plots {
			p.Draw(canvases[i][0])
		}
	}
	return writeFileAtomic(path, func(w io.Writer) error {
		_, err := c.WriteTo(w)
		return err
	})
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
// eight of them, with labels plain for 0.001 to 10000 and 1e-8 style beyond.
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

func decadeLabel(k int) string {
	if k >= -3 && k <= 4 {
		return strconv.FormatFloat(math.Pow(10, float64(k)), 'f', -1, 64)
	}
	return fmt.Sprintf("1e%d", k)
}

// plainTicks are the default ticks of a linear axis with labels written
// plainly ("750", not "750.00").
type plainTicks struct{}

func (plainTicks) Ticks(lo, hi float64) []plot.Tick {
	ticks := plot.DefaultTicks{}.Ticks(lo, hi)
	for i := range ticks {
		if ticks[i].Label != "" {
			ticks[i].Label = strconv.FormatFloat(ticks[i].Value, 'f', -1, 64)
		}
	}
	return ticks
}

// placeLegend puts a plot's legend in the corner, of the four, that holds
// the fewest of the given data points within 45 % of the width and 35 % of
// the height, so that it hides as little as possible. Call it after the
// axis ranges are final. Ties go to the top left, then the bottom right.
func placeLegend(p *plot.Plot, pts plotter.XYs) {
	corners := []struct{ top, left bool }{{true, true}, {false, false}, {true, false}, {false, true}}
	best, count := 0, math.MaxInt
	for i, c := range corners {
		n := 0
		for _, q := range pts {
			x := p.X.Scale.Normalize(p.X.Min, p.X.Max, q.X)
			y := p.Y.Scale.Normalize(p.Y.Min, p.Y.Max, q.Y)
			if !(x >= 0 && x <= 1 && y >= 0 && y <= 1) {
				continue
			}
			inX := x <= 0.45
			if !c.left {
				inX = x >= 0.55
			}
			inY := y <= 0.35
			if c.top {
				inY = y >= 0.65
			}
			if inX && inY {
				n++
			}
		}
		if n < count {
			best, count = i, n
		}
	}
	p.Legend.Top, p.Legend.Left = corners[best].top, corners[best].left
}

// finitePositive reports whether x can sit on a log axis.
func finitePositive(x float64) bool { return x > 0 && !math.IsInf(x, 1) }

// tttFigure is what a TTT plot shows.
type tttFigure struct {
	title     string
	fractions []float64
	T         []float64   // K
	times     [][]float64 // times[i][k] in s at T[i] for fractions[k]; +Inf/NaN: never
	noses     [][2]float64
	// noses[k] = {T, t} of curve k, NaN when it has none inside the range
	te, tg float64 // reference lines, K (0: none)
}

// tttMaxDecades bounds the time axis: a curve climbs towards infinite time
// near T_e and at low mobility; the axis shows this many decades above the
// shortest time at most.
const tttMaxDecades = 12

// plot builds the TTT figure: temperature against log time, one curve per
// fraction, the nose of each marked, T_e and T_g as dashed reference lines.
func (f *tttFigure) plot() (*plot.Plot, error) {
	p := plot.New()
	p.Title.Text = f.title
	p.X.Label.Text = "time (s)"
	p.Y.Label.Text = "temperature (K)"
	p.X.Scale = plot.LogScale{}
	p.X.Tick.Marker = decadeTicks{}
	p.Y.Tick.Marker = plainTicks{}
	p.Add(plotter.NewGrid())

	tmin, tmax := math.Inf(1), 0.0
	Tmin, Tmax := math.Inf(1), math.Inf(-1)
	for i := range f.T {
		for k := range f.fractions {
			if t := f.times[i][k]; finitePositive(t) {
				tmin, tmax = math.Min(tmin, t), math.Max(tmax, t)
				Tmin, Tmax = math.Min(Tmin, f.T[i]), math.Max(Tmax, f.T[i])
			}
		}
	}
	if math.IsInf(tmin, 1) {
		return nil, placef("--plot: nothing to draw: no finite time in the temperature range (nothing transforms there)")
	}
	tmax = math.Min(tmax, tmin*math.Pow(10, tttMaxDecades))
	xmin, xmax := tmin/3, tmax*3
	if xmax/xmin < 100 {
		xmin, xmax = tmin/10, tmax*10
	}
	entries := 0
	for k, X := range f.fractions {
		var pts plotter.XYs
		for i := range f.T {
			if t := f.times[i][k]; finitePositive(t) {
				pts = append(pts, plotter.XY{X: t, Y: f.T[i]})
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
		p.Legend.Add("X = "+strconv.FormatFloat(X, 'g', 4, 64), l)
		entries++
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
		switch {
		case len(f.fractions) == 1:
			p.Legend.Add(fmt.Sprintf("nose %.1f K, %s", n[0], answer.ReadableTime(n[1])), s)
			entries++
		case k == 0:
			p.Legend.Add(fmt.Sprintf("nose of X = %s: %.1f K, %s", strconv.FormatFloat(f.fractions[0], 'g', 4, 64), n[0], answer.ReadableTime(n[1])), s)
			entries++
		}
	}
	drawn, err := addRefLines(p, f.te, f.tg, func(T float64) plotter.XYs {
		return plotter.XYs{{X: xmin, Y: T}, {X: xmax, Y: T}}
	})
	if err != nil {
		return nil, err
	}
	for _, T := range drawn {
		entries++
		Tmin, Tmax = math.Min(Tmin, T), math.Max(Tmax, T)
	}
	// Set the axes last: Add widens them to the data, and the curves run
	// off towards infinite time near T_e.
	pad := 0.03 * (Tmax - Tmin)
	p.Y.Min, p.Y.Max = Tmin-pad, Tmax+pad
	p.X.Min, p.X.Max = xmin, xmax
	var all plotter.XYs
	for i := range f.T {
		for k := range f.fractions {
			if t := f.times[i][k]; finitePositive(t) {
				all = append(all, plotter.XY{X: t, Y: f.T[i]})
			}
		}
	}
	placeLegend(p, all)
	if p.Legend.Top {
		// Make room above T_e so the legend does not sit on its line.
		p.Y.Max += 0.075 * float64(entries) * (p.Y.Max - p.Y.Min)
	}
	return p, nil
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
	// Legend in the emptiest corner of each panel.
	if len(jpts) > 0 {
		placeLegend(out[0], jpts)
	}
	if len(upts) > 0 {
		placeLegend(out[len(out)-1], upts)
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
	return savePlots(pf.path, pf.format, ps...)
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
		p.Legend.Add(fmt.Sprintf("%s = %.1f K", r.name, r.T), l)
		drawn = append(drawn, r.T)
	}
	return drawn, nil
}

// drawCCT finishes the figure of linear cooling: the CCT curve over the
// TTT curve p, and the cooling lines of the rates (the critical one, with
// critical), then writes the file.
func drawCCT(pf *plotFlag, p *plot.Plot, fig *tttFigure, cl *kinetics.Cooling, cct plotter.XYs, X float64, rates []float64, critical bool) error {
	xmin, xmax := p.X.Min, p.X.Max
	var all plotter.XYs
	for i := range fig.T {
		if t := fig.times[i][0]; finitePositive(t) {
			all = append(all, plotter.XY{X: t, Y: fig.T[i]})
		}
	}
	all = append(all, cct...)
	if len(cct) > 1 {
		l, err := plotter.NewLine(cct)
		if err != nil {
			return placef("--plot: %v", err)
		}
		l.Color = curveColor(1)
		l.Width = vg.Points(1.5)
		p.Add(l)
		p.Legend.Add("CCT, X = "+answer.FracLabel(X), l)
		for _, q := range cct {
			xmin, xmax = math.Min(xmin, q.X/3), math.Max(xmax, q.X*3)
		}
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
			return placef("--plot: %v", err)
		}
		l.Color = curveColor(2 + k)
		l.Dashes = []vg.Length{vg.Points(2), vg.Points(2)}
		p.Add(l)
		label := "cooling at " + answer.RateText(q)
		if critical {
			label = "critical rate " + answer.RateText(q)
		}
		p.Legend.Add(label, l)
	}
	p.X.Min, p.X.Max = xmin, xmax
	placeLegend(p, all)
	return savePlots(pf.path, pf.format, p)
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
	p.X.Tick.Marker = plot.LogTicks{}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, q := range pts {
		lo, hi = math.Min(lo, q.X), math.Max(hi, q.X)
	}
	p.X.Min, p.X.Max = lo/1.5, hi*1.5 // room for the decade labels at the ends
	p.Add(plotter.NewGrid(), l, s)
	return savePlots(pf.path, pf.format, p)
}
