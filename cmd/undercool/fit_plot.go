package main

import (
	"fmt"
	"math"
	"strconv"
	"undercool/presets/answer"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"undercool/kinetics/fit"
)

// inverseTempTicks label an axis of 1000/T (1/K) with the value and the
// temperature in kelvin beneath it, the secondary scale of an Arrhenius plot.
type inverseTempTicks struct{}

func (inverseTempTicks) Ticks(lo, hi float64) []plot.Tick {
	ticks := plot.DefaultTicks{}.Ticks(lo, hi)
	plainLabels(ticks)
	for i := range ticks {
		if ticks[i].Label != "" && ticks[i].Value > 0 {
			ticks[i].Label += "\n" + strconv.FormatFloat(1000/ticks[i].Value, 'f', 0, 64) + " K"
		}
	}
	return ticks
}

// dataAndLine puts measured points (scatter) and a fitted curve (line) on p.
func dataAndLine(p *plot.Plot, pts, line plotter.XYs, dataName, lineName string) error {
	s, err := plotter.NewScatter(pts)
	if err != nil {
		return placef("--plot: %v", err)
	}
	s.GlyphStyle = draw.GlyphStyle{Color: curveColor(0), Radius: vg.Points(3), Shape: draw.CircleGlyph{}}
	l, err := plotter.NewLine(line)
	if err != nil {
		return placef("--plot: %v", err)
	}
	l.Color = curveColor(1)
	l.Width = vg.Points(1.5)
	p.Add(plotter.NewGrid(), l, s)
	p.Legend.Add(dataName, s)
	p.Legend.Add(lineName, l)
	return nil
}

// fittedLine draws a fitted line over its range of x, on n points.
func fittedLine(lo, hi float64, n int, at func(x float64) (float64, bool)) plotter.XYs {
	var out plotter.XYs
	for i := range n {
		x := lo + (hi-lo)*float64(i)/float64(n-1)
		if y, ok := at(x); ok && !math.IsNaN(y) && !math.IsInf(y, 0) {
			out = append(out, plotter.XY{X: x, Y: y})
		}
	}
	return out
}

func span(xs []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, x := range xs {
		lo, hi = math.Min(lo, x), math.Max(hi, x)
	}
	pad := 0.04 * (hi - lo)
	return lo - pad, hi + pad
}

// fitPlot draws the data and the fit of an answer of fit.
func fitPlot(pf *plotFlag, a answer.Answer) error {
	switch a := a.(type) {
	case *answer.FitArrhenius:
		return arrheniusPlot(pf, a.Data.Name(), a.Inputs.Quantity, a.AUnit, a.T, a.Y, a.Fit)
	case *answer.FitInterface:
		return interfacePlot(pf, a.Data.Name(), a.T, a.LnJ, a.Fit)
	case *answer.FitAvrami:
		return avramiPlot(pf, a.Data.Name(), a.Time, a.X, a.Fit)
	case *answer.FitInduction:
		return inductionPlot(pf, a.Data.Name(), a.Times, a.Fit)
	case *answer.FitGrowth:
		return growthPlot(pf, a.Data.Name(), a.T, a.U, a.Fit)
	case *answer.FitPeaks:
		return peaksPlot(pf, a)
	case *answer.FitOzawaExponent:
		return ozawaExponentPlot(pf, a)
	}
	panic(fmt.Sprintf("undercool: fitPlot: %T", a))
}

// arrheniusPlot is y on a log axis against 1000/T, with the temperature in
// kelvin under each tick.
func arrheniusPlot(pf *plotFlag, file, symbol, unit string, T, y []float64, res *fit.ArrheniusFit) error {
	return inverseTPlot(pf, "Arrhenius fit, "+file, symbol+" ("+unit+"), log scale", fmt.Sprintf("fit, Q = %.4g kJ/mol", res.Q/1e3),
		T, y, func(x float64) float64 { return math.Exp(res.Line.At(x)) }, true)
}

// peaksPlot is the straight line of a fit to DSC peaks as it is fitted:
// ln(beta/Tp^2) (Kissinger) or ln(beta) (Ozawa) against 1000/Tp.
func peaksPlot(pf *plotFlag, a *answer.FitPeaks) error {
	res := a.Fit
	y := make([]float64, len(a.Tp))
	for i, t := range a.Tp {
		y[i] = res.LnY(a.Beta[i], t)
	}
	title, label := "Kissinger plot, ", "ln(beta/Tp^2), beta in K/s"
	if res.Method == fit.Ozawa {
		title, label = "Ozawa-Flynn-Wall plot, ", "ln(beta / 1 K/s)"
	}
	return inverseTPlot(pf, title+a.Data.Name(), label, fmt.Sprintf("fit, E = %.4g kJ/mol", res.E/1e3), a.Tp, y, res.Arrhenius.Line.At, false)
}

// inverseTPlot is y against 1000/T, with the temperature in kelvin under
// each tick, and the fitted curve at(1/T); y on a log axis if logY.
func inverseTPlot(pf *plotFlag, title, yLabel, legend string, T, y []float64, at func(invT float64) float64, logY bool) error {
	x := make([]float64, len(T))
	pts := make(plotter.XYs, len(T))
	for i, t := range T {
		x[i] = 1000 / t
		pts[i] = plotter.XY{X: x[i], Y: y[i]}
	}
	lo, hi := span(x)
	line := fittedLine(lo, hi, 50, func(x float64) (float64, bool) { return at(x / 1000), true })
	p := plot.New()
	p.Title.Text = title
	p.X.Label.Text = "1000/T (1/K), T beneath"
	p.Y.Label.Text = yLabel
	p.X.Tick.Marker = inverseTempTicks{}
	if logY {
		p.Y.Scale = plot.LogScale{}
		p.Y.Tick.Marker = decadeTicks{}
	}
	p.X.Min, p.X.Max = lo, hi
	if err := dataAndLine(p, pts, line, "data", legend); err != nil {
		return err
	}
	return savePlots(pf, p)
}

// ozawaExponentPlot is ln(−ln(1−X)) against ln beta, a line for each
// temperature fitted, with its points used.
func ozawaExponentPlot(pf *plotFlag, a *answer.FitOzawaExponent) error {
	p := plot.New()
	p.Title.Text = "Ozawa plot, " + a.Data.Name()
	p.X.Label.Text = "ln(beta / 1 K/s)"
	p.Y.Label.Text = "ln(-ln(1 - X))"
	var all []float64
	for i, res := range a.Fits {
		for _, j := range res.Used {
			all = append(all, math.Log(a.Beta[i][j]))
		}
	}
	lo, hi := span(all)
	p.X.Min, p.X.Max = lo, hi
	p.Add(plotter.NewGrid())
	for i, res := range a.Fits {
		var pts plotter.XYs
		var xs []float64
		for _, j := range res.Used {
			x := math.Log(a.Beta[i][j])
			pts = append(pts, plotter.XY{X: x, Y: math.Log(-math.Log1p(-a.X[i][j]))})
			xs = append(xs, x)
		}
		l0, h0 := span(xs)
		ln, err := plotter.NewLine(fittedLine(l0, h0, 2, func(x float64) (float64, bool) { return res.Line.At(x), true }))
		if err != nil {
			return placef("--plot: %v", err)
		}
		sc, err := plotter.NewScatter(pts)
		if err != nil {
			return placef("--plot: %v", err)
		}
		ln.Color, ln.Width = curveColor(i), vg.Points(1.5)
		sc.GlyphStyle = draw.GlyphStyle{Color: curveColor(i), Radius: vg.Points(3), Shape: draw.CircleGlyph{}}
		p.Add(ln, sc)
		p.Legend.Add(fmt.Sprintf("%.5g K, m = %.3g", float64(a.Exponents[i].T), res.M), ln, sc)
	}
	return savePlots(pf, p)
}

// avramiPlot is the linearized plot, ln(−ln(1−X)) against ln t, of the points used.
func avramiPlot(pf *plotFlag, file string, t, X []float64, res *fit.AvramiFit) error {
	var pts plotter.XYs
	var xs []float64
	for _, i := range res.Used {
		lx := math.Log(t[i])
		pts = append(pts, plotter.XY{X: lx, Y: math.Log(-math.Log1p(-X[i]))})
		xs = append(xs, lx)
	}
	lo, hi := span(xs)
	line := fittedLine(lo, hi, 2, func(x float64) (float64, bool) { return res.Line.At(x), true })
	p := plot.New()
	p.Title.Text = "Avrami fit, " + file
	p.X.Label.Text = "ln(t / 1 s)"
	p.Y.Label.Text = "ln(-ln(1 - X))"
	p.X.Min, p.X.Max = lo, hi
	if err := dataAndLine(p, pts, line, "data used", fmt.Sprintf("fit, n = %.4g", res.N)); err != nil {
		return err
	}
	return savePlots(pf, p)
}

// interfacePlot is two panels: log10 J measured and fitted against T, and
// the classical straight line.
func interfacePlot(pf *plotFlag, file string, T, lnJ []float64, res *fit.InterfaceFit) error {
	pts := make(plotter.XYs, len(T))
	for i, t := range T {
		pts[i] = plotter.XY{X: t, Y: lnJ[i] / math.Ln10}
	}
	lo, hi := span(T)
	line := fittedLine(lo, hi, 60, func(t float64) (float64, bool) {
		l := res.Model.LnJ(t)
		return (l + res.LnScale) / math.Ln10, !math.IsInf(l, 0)
	})
	p := plot.New()
	p.Title.Text = "interfacial energy fit, " + file
	p.X.Label.Text = "temperature (K)"
	p.Y.Label.Text = "log10 J (m^-3 s^-1)"
	p.X.Tick.Marker = plainTicks{}
	p.X.Min, p.X.Max = lo, hi
	if err := dataAndLine(p, pts, line, "data", fmt.Sprintf("fit, gamma = %.4g J/m2", res.Gamma)); err != nil {
		return err
	}
	plots := []*plot.Plot{p}
	if res.Linear != nil {
		cp := make(plotter.XYs, len(T))
		for i := range T {
			cp[i] = plotter.XY{X: res.LinearX[i] * 1e20, Y: res.LinearY[i]}
		}
		xlo, xhi := span(res.LinearX)
		cl := fittedLine(xlo, xhi, 2, func(x float64) (float64, bool) { return res.Linear.At(x), true })
		for i := range cl {
			cl[i].X *= 1e20
		}
		q := plot.New()
		q.Title.Text = "classical plot (for comparison)"
		q.X.Label.Text = "1e20/(T dg_v^2) (m6/(J2 K))"
		q.Y.Label.Text = "ln J - ln D"
		if res.Model.Material().Mobility == nil {
			q.Y.Label.Text = "ln J"
		}
		q.X.Min, q.X.Max = xlo*1e20, xhi*1e20
		name := "straight line"
		if !math.IsNaN(res.LinearGamma) {
			name = fmt.Sprintf("straight line, gamma = %.4g J/m2", res.LinearGamma)
		}
		if err := dataAndLine(q, cp, cl, "data", name); err != nil {
			return err
		}
		plots = append(plots, q)
	}
	return savePlots(pf, plots...)
}

// inductionPlot is the induction time on a log axis against 1/(T³·ln²S),
// with the fitted straight line.
func inductionPlot(pf *plotFlag, file string, t []float64, res *fit.InductionFit) error {
	pts := make(plotter.XYs, len(t))
	for i := range t {
		pts[i] = plotter.XY{X: res.X[i] * 1e8, Y: t[i]}
	}
	lo, hi := span(res.X)
	line := fittedLine(lo, hi, 50, func(x float64) (float64, bool) { return math.Exp(res.Line.At(x)), true })
	for i := range line {
		line[i].X *= 1e8
	}
	p := plot.New()
	p.Title.Text = "induction times, " + file
	p.X.Label.Text = "1/(T^3 ln^2 S) (1e-8 K^-3)"
	p.Y.Label.Text = "induction time (s), log scale"
	p.Y.Scale = plot.LogScale{}
	p.Y.Tick.Marker = decadeTicks{}
	p.X.Min, p.X.Max = lo*1e8, hi*1e8
	if err := dataAndLine(p, pts, line, "data", fmt.Sprintf("fit, gamma = %.4g mJ/m2", res.Gamma*1e3)); err != nil {
		return err
	}
	return savePlots(pf, p)
}

// growthPlot is two panels: log10 u measured and fitted against T, and
// the straight line the fit is made on.
func growthPlot(pf *plotFlag, file string, T, u []float64, res *fit.GrowthFit) error {
	pts := make(plotter.XYs, len(T))
	for i, t := range T {
		pts[i] = plotter.XY{X: t, Y: math.Log10(u[i])}
	}
	lo, hi := span(T)
	line := fittedLine(lo, hi, 60, func(t float64) (float64, bool) {
		g := res.Model.GrowthRate(t)
		return math.Log10(g), g > 0
	})
	p := plot.New()
	p.Title.Text = "growth fit (" + res.Law + "), " + file
	p.X.Label.Text = "temperature (K)"
	p.Y.Label.Text = "log10 u (m/s)"
	p.X.Tick.Marker = plainTicks{}
	p.X.Min, p.X.Max = lo, hi
	name := fmt.Sprintf("fit, u_g = %.3g m/s, xi = %.3g", res.Ug, res.Xi)
	if res.Law == "arrhenius" {
		name = fmt.Sprintf("fit, Q_u = %.4g kJ/mol", res.Arrhenius.Q/1e3)
	}
	if err := dataAndLine(p, pts, line, "data", name); err != nil {
		return err
	}
	plots := []*plot.Plot{p}
	if res.Line != nil {
		sp := make(plotter.XYs, len(T))
		for i := range T {
			sp[i] = plotter.XY{X: res.X[i], Y: res.Y[i]}
		}
		xlo, xhi := span(res.X)
		sl := fittedLine(xlo, xhi, 2, func(x float64) (float64, bool) { return res.Line.At(x), true })
		q := plot.New()
		q.Title.Text = "the straight line fitted"
		q.X.Label.Text = "log10 eta(Tg) - log10 eta(T)"
		q.Y.Label.Text = "log10 u - log10[(T/Tg)(1 - exp(-dmu/kT))]"
		if res.Law == "arrhenius" {
			q.X.Label.Text = "1/T (1/K)"
			q.Y.Label.Text = "ln(u/[1 - exp(-dmu/kT)])"
		}
		q.X.Min, q.X.Max = xlo, xhi
		if err := dataAndLine(q, sp, sl, "data", "straight line"); err != nil {
			return err
		}
		plots = append(plots, q)
	}
	return savePlots(pf, plots...)
}
