package answer

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"path/filepath"
	"strings"

	"undercool/kinetics"
	"undercool/kinetics/fit"
	"undercool/presets"
	"undercool/presets/units"
)

// FitData is a data file read for a fit, with its relative weights when
// the fit is to use them.
type FitData struct {
	*presets.Data
	W []float64 // nil: equal weights
	// WeightsIgnored: the file has a weight column the caller did not ask to use.
	WeightsIgnored bool
}

// WeightColumn is the optional column of relative weights of a fit's data.
var WeightColumn = presets.Column{Quantity: "weight", Kind: units.Dimensionless}

// Weigh takes the weights of a data file read with WeightColumn, if use
// says to; a weight that is not positive is a *BadData.
func Weigh(d *presets.Data, use bool, names Names) (FitData, error) {
	w, has := d.Columns["weight"]
	out := FitData{Data: d}
	switch {
	case use && !has:
		return out, &InputError{"weights", fmt.Errorf("%s has no weight column", d.File)}
	case !use:
		out.WeightsIgnored = has
		return out, nil
	}
	for i, wi := range w {
		if !(wi > 0) {
			return out, out.bad(i, fmt.Sprintf("column \"weight\": %g must be positive", wi))
		}
	}
	out.W = w
	return out, nil
}

// BadData is a data file that a fit cannot use: a point out of range, too
// few points. It names the file and the line.
type BadData struct{ Msg string }

func (e *BadData) Error() string { return e.Msg }

// badData is the error of a fit on data d: a point named by the fit's
// index becomes its file line.
func badData(d *presets.Data, err error) error {
	var pe *kinetics.PointError
	if errors.As(err, &pe) && pe.Index >= 0 && pe.Index < len(d.Lines) {
		return &BadData{fmt.Sprintf("%s:%d: %s", d.File, d.Lines[pe.Index], pe.Msg)}
	}
	if errors.Is(err, fit.ErrFewPoints) {
		return &BadData{fmt.Sprintf("%s: %d data rows; a fit of 2 parameters needs at least 2", d.File, len(d.Lines))}
	}
	return &BadData{fmt.Sprintf("%s: %v", d.File, err)}
}

// MaxListed is the most points a fit lists one by one, in its table and
// its JSON rows: a table of more is read by no one, and a million rows
// would take a minute and gigabytes to draw. The fit uses every point,
// however many.
const MaxListed = 10000

// listed reports whether a fit of the data lists its points.
func (d FitData) listed() bool { return len(d.Lines) <= MaxListed }

// listed is how many of the n points of a fit of data it lists: all or none.
func listed(data FitData, n int) int {
	if data.listed() {
		return n
	}
	return 0
}

// notes are the remarks on the data: a weight column left unused, points
// too many to list.
func (d FitData) notes(names Names) []string {
	var out []string
	if d.WeightsIgnored {
		out = append(out, fmt.Sprintf("the weight column is ignored; give %s to use it", names.of("weights")))
	}
	if !d.listed() {
		out = append(out, fmt.Sprintf("the %d rows are not listed one by one (more than %d); the fit uses them all", len(d.Lines), MaxListed))
	}
	return out
}

// weighted is the header's remark on weights.
func (d FitData) weighted() string {
	if d.W == nil {
		return ""
	}
	return ", weight (relative weights on ln y)"
}

// line is the header line naming the file, its points and the columns fitted.
func (d FitData) line(n int, quantities ...string) string {
	heads := make([]string, len(quantities))
	for i, q := range quantities {
		heads[i] = d.Headers[q]
	}
	return fmt.Sprintf("data: %s, %d points; columns %s%s", d.File, n, strings.Join(heads, ", "), d.weighted())
}

// Name is how a data file is named in a card's source: its base name, or
// "standard input".
func (d FitData) Name() string {
	if d.File == "stdin" {
		return "standard input"
	}
	return filepath.Base(d.File)
}

// positive checks that every value of a column is positive, to take its logarithm.
func (d FitData) positive(quantity string) error {
	for i, v := range d.Columns[quantity] {
		if !(v > 0) {
			return d.bad(i, fmt.Sprintf("column %q: %s must be positive to take its logarithm", d.Headers[quantity], Sig(6)(v)))
		}
	}
	return nil
}

// aboveZero checks that every temperature of the data lies above absolute zero.
func (d FitData) aboveZero() error {
	for i, t := range d.Columns["temperature"] {
		if !(t > 0) {
			return d.bad(i, fmt.Sprintf("column %q: %s K is at or below absolute zero", d.Headers["temperature"], Sig(6)(t)))
		}
	}
	return nil
}

func (d FitData) bad(i int, msg string) error {
	return &BadData{fmt.Sprintf("%s:%d: %s", d.File, d.Lines[i], msg)}
}

// Interval is a 95 % interval; JSON writes [low, high], or null when there
// is none (an exact fit through two points).
type Interval [2]float64

func (v Interval) MarshalJSON() ([]byte, error) {
	if math.IsNaN(v[0]) || math.IsNaN(v[1]) || math.IsInf(v[0], 0) || math.IsInf(v[1], 0) {
		return []byte("null"), nil
	}
	return json.Marshal([]float64{v[0], v[1]})
}

// Scatter is how well a fit fits.
type Scatter struct {
	R2  Num `json:"r2"`
	SD  Num `json:"residual_sd_ln"`
	DoF int `json:"degrees_of_freedom"`
	T   Num `json:"student_t"`
}

func scatterOf(r2, sd float64, dof int, t float64) Scatter {
	return Scatter{Num(r2), Num(sd), dof, Num(t)}
}

// Gamma is a fitted interfacial energy with its spread.
type Gamma struct {
	Gamma Num      `json:"gamma_j_per_m2" result:"interfacial energy"`
	SE    Num      `json:"gamma_se_j_per_m2"`
	CI    Interval `json:"gamma_ci95_j_per_m2"`
}

// text is the summary line of a fitted interfacial energy, in J/m2 and
// in mJ/m2 with digits significant digits, with its spread.
func (g Gamma) text(digits int) string {
	mj := func(x float64) string { return fmt.Sprintf("%.*g", digits, x*1e3) }
	return fmt.Sprintf("gamma = %.5g J/m2 (%s mJ/m2)%s", float64(g.Gamma), mj(float64(g.Gamma)), spreadText(float64(g.SE), g.CI, mj, " mJ/m2"))
}

// spreadText formats the standard error and 95 % interval of an estimate,
// ", SE s unit, 95 % [lo, hi] unit", or says there are none (two points).
// se may be NaN alone (an interval without a standard error of its own).
func spreadText(se float64, v [2]float64, format func(float64) string, unit string) string {
	if math.IsNaN(v[0]) || math.IsNaN(v[1]) {
		return " (two points: exact, no interval)"
	}
	s := ""
	if !math.IsNaN(se) {
		s = ", SE " + format(se) + unit
	}
	return s + ", 95 % [" + format(v[0]) + ", " + format(v[1]) + "]" + unit
}

// lnText is "; ln NAME = v" with its spread, or without one for an exact fit.
func lnText(name string, v, se float64, ci [2]float64) string {
	s := fmt.Sprintf("; ln %s = %.5g", name, v)
	if math.IsNaN(se) {
		return s
	}
	return s + spreadText(se, ci, g(4), "")
}

// g formats a float with n significant digits.
func g(n int) func(float64) string {
	return func(x float64) string { return Sig(n)(x) }
}

// statsLine describes the scatter of a fit.
func statsLine(n, dof int, r2, sd float64, of string) string {
	if dof == 0 {
		return "points: 2 (exact fit, no scatter to estimate)"
	}
	return fmt.Sprintf("points: %d, %d degrees of freedom; R2 = %.5f; residual SD = %.3g in %s", n, dof, r2, sd, of)
}

// intervalNote says how a fit's intervals are made: none for two points
// (what, the line or the fit, passes through both), else estimate ± t·SE,
// followed by how, which tells how the derived intervals follow.
func intervalNote(exact bool, what string, t float64, dof int, how string) string {
	if exact {
		return "two points: the " + what + " passes through both; no standard errors or intervals"
	}
	return fmt.Sprintf("intervals: estimate ± t·SE with Student t = %.4f (%d degrees of freedom)%s", t, dof, how)
}

// fitDoc finishes the doc of a fit: the remarks on the data, the caution
// that fits what it computed; no table where the points are not listed.
func fitDoc(d Doc, data FitData, names Names, caution string) Doc {
	if !data.listed() {
		d.Table = nil
	}
	d.Notes = append(d.Notes, data.notes(names)...)
	d.Notes = append(d.Notes, caution)
	return d
}

// setValues sets each {key, text, source} on c, in order; an error is the card's.
func setValues(c *presets.Card, values ...[3]string) error {
	for _, v := range values {
		if err := c.Set(v[0], v[1], v[2]); err != nil {
			return fmt.Errorf("card: %w", err)
		}
	}
	return nil
}

// filepathExt is the extension of a file name.
func filepathExt(name string) string { return filepath.Ext(name) }
