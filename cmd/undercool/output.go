package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/renderer"
	"github.com/olekukonko/tablewriter/tw"
)

// Formats are the accepted values of --format.
var formats = []string{"table", "csv", "json", "markdown"}

// kv is one entry of an ordered JSON object.
type kv struct {
	Key   string
	Value any
}

// object is a JSON object that keeps its key order.
type object []kv

func (o object) MarshalJSON() ([]byte, error) {
	var b bytes.Buffer
	b.WriteByte('{')
	for i, e := range o {
		if i > 0 {
			b.WriteByte(',')
		}
		k, _ := json.Marshal(e.Key)
		b.Write(k)
		b.WriteByte(':')
		v, err := json.Marshal(jsonValue(e.Value))
		if err != nil {
			return nil, err
		}
		b.Write(v)
	}
	b.WriteByte('}')
	return b.Bytes(), nil
}

// jsonValue maps non-finite floats to null: no NaN or Inf ever reaches JSON.
func jsonValue(v any) any {
	switch x := v.(type) {
	case float64:
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return nil
		}
	case []float64:
		out := make([]any, len(x))
		for i, f := range x {
			out[i] = jsonValue(f)
		}
		return out
	}
	return v
}

// column describes one column of a result table.
type column struct {
	head string           // table header with its unit, e.g. "T (K)"
	key  string           // JSON key, snake_case ending in its unit
	text func(any) string // how a cell reads in a table; nil: default
}

// result is the whole output of a command, rendered in any format.
type result struct {
	title   string   // first line: what this is
	about   []string // header lines: material, model choices, inputs
	inputs  object   // the same for JSON
	summary []string // lines printed above the table (nose, headline results)
	extra   object   // top-level JSON entries besides inputs and rows
	cols    []column
	rows    [][]any  // cells: float64 (NaN/Inf = none), string, []string
	tables  []table  // further tables after the main one (text and markdown; CSV as comments)
	notes   []string // lines printed below the table (flag legend, cautions)
}

// table is a further table of a result, such as a sensitivity ranking.
// JSON does not show it: put its content in extra.
type table struct {
	title string
	cols  []column
	rows  [][]any
}

// maxCellWidth is the widest a text cell of a terminal table grows before it wraps.
const maxCellWidth = 56

// dash stands in tables for a value that does not exist.
const dash = "—"

// sig formats a float with n significant digits, or the dash.
func sig(n int) func(any) string { return floatCell('g', n) }

// fixed formats a float with n decimals, or the dash.
func fixed(n int) func(any) string { return floatCell('f', n) }

// floatCell formats a float with strconv's format verb and precision n, the
// dash for NaN and ±Inf, and any other cell as text.
func floatCell(verb byte, n int) func(any) string {
	return func(v any) string {
		x, ok := v.(float64)
		if !ok {
			return cellText(v)
		}
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return dash
		}
		return strconv.FormatFloat(x, verb, n, 64)
	}
}

func cellText(v any) string {
	switch x := v.(type) {
	case nil:
		return dash
	case string:
		if x == "" {
			return dash
		}
		return x
	case []string:
		if len(x) == 0 {
			return ""
		}
		return strings.Join(x, " ")
	case float64:
		return sig(4)(x)
	}
	return fmt.Sprint(v)
}

func (c column) cell(v any) string {
	if c.text != nil {
		return c.text(v)
	}
	return cellText(v)
}

// render writes the result in the format asked for.
func (r *result) render(w io.Writer, format string) error {
	switch format {
	case "json":
		return r.renderJSON(w)
	case "csv":
		return r.renderCSV(w)
	case "markdown":
		return r.renderText(w, true)
	default:
		return r.renderText(w, false)
	}
}

func (r *result) heads() []string {
	h := make([]string, len(r.cols))
	for i, c := range r.cols {
		h[i] = c.head
	}
	return h
}

func (r *result) cells(row []any) []string {
	out := make([]string, len(r.cols))
	for i, c := range r.cols {
		out[i] = c.cell(row[i])
	}
	return out
}

func (r *result) renderText(w io.Writer, markdown bool) error {
	var b bytes.Buffer
	lead := ""
	if markdown {
		fmt.Fprintf(&b, "### %s\n\n", r.title)
		lead = "- "
	} else {
		fmt.Fprintln(&b, r.title)
	}
	for _, l := range r.about {
		fmt.Fprintf(&b, "%s%s\n", lead, l)
	}
	if len(r.summary) > 0 {
		b.WriteByte('\n')
		for _, l := range r.summary {
			fmt.Fprintf(&b, "%s%s\n", lead, l)
		}
	}
	if len(r.cols) > 0 {
		b.WriteByte('\n')
		if err := writeTable(&b, r.cols, r.rows, markdown); err != nil {
			return err
		}
	}
	for _, t := range r.tables {
		b.WriteByte('\n')
		if markdown {
			fmt.Fprintf(&b, "#### %s\n\n", t.title)
		} else {
			fmt.Fprintln(&b, t.title)
		}
		if err := writeTable(&b, t.cols, t.rows, markdown); err != nil {
			return err
		}
	}
	if len(r.notes) > 0 {
		b.WriteByte('\n')
		for _, l := range r.notes {
			fmt.Fprintf(&b, "%s%s\n", lead, l)
		}
	}
	_, err := w.Write(b.Bytes())
	return err
}

// writeTable renders one table with tablewriter, as text or Markdown.
func writeTable(b *bytes.Buffer, cols []column, rows [][]any, markdown bool) error {
	r := &result{cols: cols}
	align := make([]tw.Align, len(cols))
	for i, c := range cols {
		align[i] = tw.AlignRight
		if c.text == nil {
			align[i] = tw.AlignLeft
		}
	}
	opts := []tablewriter.Option{
		tablewriter.WithHeaderAutoFormat(tw.Off),
		tablewriter.WithRowAlignmentConfig(tw.CellAlignment{PerColumn: align}),
		tablewriter.WithHeaderAlignment(tw.AlignCenter),
	}
	if markdown {
		opts = append(opts, tablewriter.WithRenderer(renderer.NewMarkdown()))
	} else {
		// Long text (sources, descriptions) wraps in a terminal table.
		opts = append(opts, tablewriter.WithRowAutoWrap(tw.WrapNormal), tablewriter.WithRowMaxWidth(maxCellWidth))
	}
	t := tablewriter.NewTable(b, opts...)
	t.Header(r.heads())
	for _, row := range rows {
		if err := t.Append(r.cells(row)); err != nil {
			return err
		}
	}
	return t.Render()
}

func (r *result) renderCSV(w io.Writer) error {
	var b bytes.Buffer
	fmt.Fprintf(&b, "# %s\n", r.title)
	for _, l := range append(append(append([]string{}, r.about...), r.summary...), r.notes...) {
		fmt.Fprintf(&b, "# %s\n", l)
	}
	for _, t := range r.tables {
		fmt.Fprintf(&b, "# %s\n", t.title)
		tr := &result{cols: t.cols}
		for _, row := range t.rows {
			fmt.Fprintf(&b, "#   %s\n", strings.Join(tr.cells(row), ", "))
		}
	}
	cw := csv.NewWriter(&b)
	keys := make([]string, len(r.cols))
	for i, c := range r.cols {
		keys[i] = c.key
	}
	if err := cw.Write(keys); err != nil {
		return err
	}
	for _, row := range r.rows {
		rec := make([]string, len(row))
		for i, v := range row {
			switch x := v.(type) {
			case float64:
				if !math.IsNaN(x) && !math.IsInf(x, 0) {
					rec[i] = strconv.FormatFloat(x, 'g', 8, 64)
				}
			case []string:
				rec[i] = strings.Join(x, ";")
			default:
				rec[i] = cellText(v)
				if rec[i] == dash {
					rec[i] = ""
				}
			}
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	if err := cw.Error(); err != nil {
		return err
	}
	_, err := w.Write(b.Bytes())
	return err
}

func (r *result) renderJSON(w io.Writer) error {
	doc := object{{"inputs", r.inputs}}
	doc = append(doc, r.extra...)
	if r.cols != nil {
		rows := make([]object, len(r.rows))
		for i, row := range r.rows {
			o := make(object, len(r.cols))
			for j, c := range r.cols {
				v := row[j]
				if s, ok := v.([]string); ok && s == nil {
					v = []string{}
				}
				o[j] = kv{c.key, v}
			}
			rows[i] = o
		}
		doc = append(doc, kv{"rows", rows})
	}
	b, err := json.MarshalIndent(doc, "", "  ")
	if err != nil {
		return err
	}
	b = append(b, '\n')
	_, err = w.Write(b)
	return err
}

// readableTime writes a time in seconds in the unit a person would use:
// s, min, h, days or years, with three significant digits; "never" for
// +Inf or NaN.
func readableTime(t float64) string {
	const (
		minute = 60.0
		hour   = 3600.0
		day    = 86400.0
		year   = 365.25 * day // Julian year
	)
	switch {
	case math.IsNaN(t) || math.IsInf(t, 1):
		return "never"
	case t < minute:
		return threeSig(t) + " s"
	case t < hour:
		return threeSig(t/minute) + " min"
	case t < day:
		return threeSig(t/hour) + " h"
	case t < year:
		return threeSig(t/day) + " days"
	default:
		return threeSig(t/year) + " years"
	}
}

// threeSig formats with three significant digits, trailing zeros kept
// ("1.00", "59.9", "123"), in exponent form below 1e-3 and from 1000 up
// ("3.60e+04"), so no more than three digits are ever shown.
func threeSig(x float64) string {
	if x != 0 && (math.Abs(x) < 1e-3 || math.Abs(x) >= 1e3) {
		return strconv.FormatFloat(x, 'e', 2, 64)
	}
	if x == 0 {
		return "0"
	}
	decimals := max(0, 2-int(math.Floor(math.Log10(math.Abs(x)))))
	return strconv.FormatFloat(x, 'f', decimals, 64)
}
