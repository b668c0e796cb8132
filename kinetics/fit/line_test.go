package fit

import (
	"errors"
	"math"
	"testing"

	"undercool/kinetics"
)

func relClose(got, want, tol float64) bool {
	if want == 0 {
		return math.Abs(got) <= tol
	}
	return math.Abs(got-want) <= tol*math.Abs(want)
}

// NIST Statistical Reference Datasets, linear least squares, data set
// "Norris" (calibration of ozone monitors, 36 observations, lower
// difficulty), data and certified values from
// https://www.itl.nist.gov/div898/strd/lls/data/Norris.shtml (y, x pairs).
var norris = [][2]float64{
	{0.1, 0.2}, {338.8, 337.4}, {118.1, 118.2}, {888.0, 884.6}, {9.2, 10.1},
	{228.1, 226.5}, {668.5, 666.3}, {998.5, 996.3}, {449.1, 448.6}, {778.9, 777.0},
	{559.2, 558.2}, {0.3, 0.4}, {0.1, 0.6}, {778.1, 775.5}, {668.8, 666.9},
	{339.3, 338.0}, {448.9, 447.5}, {10.8, 11.6}, {557.7, 556.0}, {228.3, 228.1},
	{998.0, 995.8}, {888.8, 887.6}, {119.6, 120.2}, {0.3, 0.3}, {0.6, 0.3},
	{557.6, 556.8}, {339.3, 339.1}, {888.0, 887.2}, {998.5, 999.0}, {778.9, 779.0},
	{10.2, 11.1}, {117.6, 118.3}, {228.9, 229.2}, {668.4, 669.1}, {449.2, 448.9},
	{0.2, 0.5},
}

func TestFitLineNorris(t *testing.T) {
	x := make([]float64, len(norris))
	y := make([]float64, len(norris))
	for i, p := range norris {
		y[i], x[i] = p[0], p[1]
	}
	l, err := Line(x, y, nil)
	if err != nil {
		t.Fatal(err)
	}
	// Certified values, NIST StRD Norris; the data set is easy, so agreement
	// to 1e-9 relative is expected of any sound algorithm in float64.
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"intercept", l.Intercept, -0.262323073774029},
		{"intercept SE", l.InterceptSE, 0.232818234301152},
		{"slope", l.Slope, 1.00211681802045},
		{"slope SE", l.SlopeSE, 0.429796848199937e-03},
		{"residual SD", l.ResidualSD, 0.884796396144373},
		{"R²", l.R2, 0.999993745883712},
	} {
		if !relClose(c.got, c.want, 1e-9) {
			t.Errorf("Norris %s = %.15g, certified %.15g", c.name, c.got, c.want)
		}
	}
	if l.DoF != 34 {
		t.Errorf("DoF = %d, want 34", l.DoF)
	}
}

// Weighted fit cross-checked against the textbook weighted formulas
// (Draper and Smith 1998, §9.2) evaluated once in exact rational arithmetic
// with Python 3.11.7 fractions.Fraction (square roots taken last in float).
func TestFitLineWeighted(t *testing.T) {
	x := []float64{1, 2, 3, 4, 5, 6}
	y := []float64{1.1, 1.9, 3.2, 3.9, 5.1, 5.8}
	w := []float64{1, 2, 1, 0.5, 1, 1.5}
	l, err := Line(x, y, w)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"intercept", l.Intercept, 0.0820754716981132},
		{"slope", l.Slope, 0.969811320754717},
		{"intercept SE", l.InterceptSE, 0.14138752610562874},
		{"slope SE", l.SlopeSE, 0.0365061022645711},
		{"R²", l.R2, 0.9943641182929824},
		{"residual SD", l.ResidualSD, 0.17398628226125856},
		{"covariance", l.Covariance, -0.004569241723033108},
	} {
		if !relClose(c.got, c.want, 1e-12) {
			t.Errorf("weighted %s = %.17g, want %.17g", c.name, c.got, c.want)
		}
	}
	// Relative weights: scaling them all changes nothing.
	w10 := make([]float64, len(w))
	for i := range w {
		w10[i] = 10 * w[i]
	}
	l10, _ := Line(x, y, w10)
	if !relClose(l10.SlopeSE, l.SlopeSE, 1e-12) || !relClose(l10.InterceptSE, l.InterceptSE, 1e-12) {
		t.Errorf("scaled weights changed the errors: %g %g vs %g %g", l10.SlopeSE, l10.InterceptSE, l.SlopeSE, l.InterceptSE)
	}
	// The 95 % interval is estimate ± t(4)·SE.
	ci := l.SlopeCI()
	if !relClose(ci[1]-l.Slope, StudentT95(4)*l.SlopeSE, 1e-12) {
		t.Errorf("slope interval %v not slope ± t·SE", ci)
	}
}

// Two-sided 95 % critical values of Student's t, NIST/SEMATECH e-Handbook of
// Statistical Methods, §1.3.6.7.2 (upper critical values, α = 0.025),
// printed to 3 decimals; tolerance half a unit of the last printed digit.
func TestStudentT95(t *testing.T) {
	for _, c := range []struct {
		dof  int
		want float64
	}{{1, 12.706}, {2, 4.303}, {3, 3.182}, {5, 2.571}, {10, 2.228}, {20, 2.086}, {30, 2.042}, {100, 1.984}} {
		if got := StudentT95(c.dof); math.Abs(got-c.want) > 5e-4 {
			t.Errorf("t(%d) = %.5f, table %.3f", c.dof, got, c.want)
		}
	}
	if !math.IsNaN(StudentT95(0)) {
		t.Error("t(0) should be NaN")
	}
}

func TestFitLineSpecial(t *testing.T) {
	// Two points: the exact line, no scatter, no intervals.
	l, err := Line([]float64{1, 3}, []float64{2, 6}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !l.Exact() || l.Slope != 2 || math.Abs(l.Intercept) > 1e-15 || l.R2 != 1 {
		t.Errorf("two points: %+v", l)
	}
	for _, v := range []float64{l.SlopeSE, l.InterceptSE, l.T, l.SlopeCI()[0], l.InterceptCI()[1], l.AtSE(2)} {
		if !math.IsNaN(v) {
			t.Errorf("two points: want NaN for intervals, got %g", v)
		}
	}
	if _, err := Line([]float64{1}, []float64{1}, nil); !errors.Is(err, ErrFewPoints) {
		t.Errorf("one point: %v", err)
	}
	if _, err := Line([]float64{2, 2, 2}, []float64{1, 2, 3}, nil); !errors.Is(err, ErrSameX) {
		t.Errorf("same x: %v", err)
	}
	var pe *kinetics.PointError
	if _, err := Line([]float64{1, 2, 3}, []float64{1, 2, 3}, []float64{1, 0, 1}); !errors.As(err, &pe) || pe.Index != 1 {
		t.Errorf("zero weight: %v", err)
	}
	if _, err := Line([]float64{1, 2, 3}, []float64{1, 2, 3}, []float64{1, math.NaN(), 1}); !errors.As(err, &pe) {
		t.Errorf("NaN weight: %v", err)
	}
	// A perfect line with scatter-free points: zero errors, R² = 1.
	l, _ = Line([]float64{1, 2, 3, 4}, []float64{3, 5, 7, 9}, nil)
	if l.SlopeSE != 0 || l.R2 != 1 || l.Slope != 2 {
		t.Errorf("perfect line: %+v", l)
	}
}
