package answer

import (
	"encoding/json"
	"fmt"
	"math"
	"reflect"
	"strconv"
	"strings"
)

// Doc is how an answer reads: its title, the header lines that name the
// material, model choices and inputs, the summary lines, the main table,
// further tables and the notes. Renderers draw it as a terminal table,
// Markdown or CSV; JSON is the answer itself.
type Doc struct {
	Title   string
	About   []string
	Summary []string
	Table   *Table
	Tables  []Table // further tables: text and Markdown draw them, CSV lists them as comments
	Notes   []string
	// Record is an answer without a table as one row, for a spreadsheet.
	Record *Table
}

// Table is a table of an answer.
type Table struct {
	Title string // for a further table
	Cols  []Col
	Rows  [][]any // cells: float64 (NaN or ±Inf: none), string, []string
}

// Col is one column: its header with its unit, its key (the JSON key,
// and the CSV header), how a cell reads in a text table (nil: as text,
// left-aligned), and when it gives way on a narrow screen.
type Col struct {
	Head string
	Key  string
	Text func(any) string
	// Drop orders the columns a terminal table leaves out when it does not
	// fit the screen: the larger first; 0 only when nothing else is left.
	// CSV, JSON and Markdown show every column.
	Drop int
}

// Cell is how a cell of the column reads in a text table.
func (c Col) Cell(v any) string {
	if c.Text != nil {
		return c.Text(v)
	}
	return CellText(v)
}

// Dash stands in tables for a value that does not exist.
const Dash = "—"

// Num is a number of an answer: JSON writes NaN and ±Inf (no value,
// never) as null.
type Num float64

func (n Num) MarshalJSON() ([]byte, error) {
	x := float64(n)
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return []byte("null"), nil
	}
	return json.Marshal(x)
}

// nums converts a list of numbers.
func nums(x []float64) []Num {
	out := make([]Num, len(x))
	for i, v := range x {
		out[i] = Num(v)
	}
	return out
}

// OneOrMany is a list that JSON writes as its element when it has one.
type OneOrMany[T any] []T

func (l OneOrMany[T]) MarshalJSON() ([]byte, error) {
	if len(l) == 1 {
		return json.Marshal(l[0])
	}
	return json.Marshal([]T(l))
}

// Strings is a list of names that JSON writes as [] when empty.
type Strings []string

func (s Strings) MarshalJSON() ([]byte, error) {
	if s == nil {
		return []byte("[]"), nil
	}
	return json.Marshal([]string(s))
}

// Sig formats a number with n significant digits, or the dash.
func Sig(n int) func(any) string { return floatCell('g', n, 1) }

// Fixed formats a number with n decimals, or the dash.
func Fixed(n int) func(any) string { return floatCell('f', n, 1) }

// Scaled shows a number multiplied by factor with n significant digits.
func Scaled(factor float64, n int) func(any) string { return floatCell('g', n, factor) }

// TimeCell shows seconds readably ("3.2 min"), "never" for none.
func TimeCell(v any) string {
	if x, ok := number(v); ok {
		return ReadableTime(x)
	}
	return CellText(v)
}

// log10Cell shows a decimal logarithm with two decimals, in exponent form
// from 1e5 decades up (a rate that is zero for any purpose).
func log10Cell(v any) string {
	if x, ok := number(v); ok && math.Abs(x) >= 1e5 {
		return Sig(4)(v)
	}
	return Fixed(2)(v)
}

// elapsedCell shows seconds readably, the dash for none (NaN).
func elapsedCell(v any) string {
	if x, ok := number(v); ok && math.IsNaN(x) {
		return Dash
	}
	return TimeCell(v)
}

func number(v any) (float64, bool) {
	switch x := v.(type) {
	case float64:
		return x, true
	case Num:
		return float64(x), true
	}
	return 0, false
}

// floatCell formats a number times factor with strconv's verb and
// precision n, the dash for NaN and ±Inf, and any other cell as text.
func floatCell(verb byte, n int, factor float64) func(any) string {
	return func(v any) string {
		x, ok := number(v)
		if !ok {
			return CellText(v)
		}
		x *= factor
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return Dash
		}
		return strconv.FormatFloat(x, verb, n, 64)
	}
}

// CellText is how a cell without a format reads: the dash for nothing.
func CellText(v any) string {
	switch x := v.(type) {
	case nil:
		return Dash
	case string:
		if x == "" {
			return Dash
		}
		return x
	case []string:
		return strings.Join(x, " ")
	case Strings:
		return strings.Join(x, " ")
	case float64, Num:
		return Sig(4)(x)
	}
	return fmt.Sprint(v)
}

// ReadableTime writes a time in seconds in the unit a person would use:
// s, min, h, days or years, with three significant digits; "never" for
// +Inf or NaN.
func ReadableTime(t float64) string {
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
		return ThreeSig(t) + " s"
	case t < hour:
		return ThreeSig(t/minute) + " min"
	case t < day:
		return ThreeSig(t/hour) + " h"
	case t < year:
		return ThreeSig(t/day) + " days"
	default:
		return ThreeSig(t/year) + " years"
	}
}

// ThreeSig formats with three significant digits, trailing zeros kept
// ("1.00", "59.9", "123"), in exponent form below 1e-3 and from 1000 up
// ("3.60e+04"), so no more than three digits are ever shown.
func ThreeSig(x float64) string {
	if x != 0 && (math.Abs(x) < 1e-3 || math.Abs(x) >= 1e3) {
		return strconv.FormatFloat(x, 'e', 2, 64)
	}
	if x == 0 {
		return "0"
	}
	decimals := max(0, 2-int(math.Floor(math.Log10(math.Abs(x)))))
	return strconv.FormatFloat(x, 'f', decimals, 64)
}

// formats are the cell formats a row type names in its col tags.
var formats = map[string]func(any) string{
	"f1": Fixed(1), "f2": Fixed(2), "f3": Fixed(3), "f4": Fixed(4),
	"g3": Sig(3), "g4": Sig(4), "g5": Sig(5), "g6": Sig(6),
	"nm": Scaled(1e9, 4), "um": Scaled(1e6, 4), "per_kk": Scaled(1e3, 5), "time": TimeCell, "elapsed": elapsedCell, "log10": log10Cell,
}

// tableOf is the table of a list of rows: a slice of structs whose fields
// with a col tag are the columns, in order, headed by the tag's first part,
// formatted by its second (see formats; none: text) and, by a third, given
// up in that order on a narrow screen (Col.Drop), keyed by the field's JSON
// name. A pointer field is a column only where the first row has it.
func tableOf[R any](rows []R) *Table {
	t := &Table{}
	rt := reflect.TypeFor[R]()
	var fields []int
	for i := range rt.NumField() {
		f := rt.Field(i)
		tag, ok := f.Tag.Lookup("col")
		if !ok {
			continue
		}
		if f.Type.Kind() == reflect.Pointer && (len(rows) == 0 || reflect.ValueOf(rows[0]).Field(i).IsNil()) {
			continue
		}
		head, format, _ := strings.Cut(tag, ",")
		format, drop, _ := strings.Cut(format, ",")
		col := Col{Head: head, Key: strings.Split(f.Tag.Get("json"), ",")[0]}
		if drop != "" {
			n, err := strconv.Atoi(drop)
			if err != nil || n < 1 {
				panic("answer: col tag " + tag + ": the third part is a drop order, 1 or more")
			}
			col.Drop = n
		}
		if format != "" {
			col.Text = formats[format]
			if col.Text == nil {
				panic("answer: unknown cell format " + format)
			}
		}
		t.Cols = append(t.Cols, col)
		fields = append(fields, i)
	}
	for _, r := range rows {
		v := reflect.ValueOf(r)
		row := make([]any, len(fields))
		for j, i := range fields {
			row[j] = cell(v.Field(i))
		}
		t.Rows = append(t.Rows, row)
	}
	return t
}

// cell is the table value of a field: numbers as float64, names as they are.
func cell(v reflect.Value) any {
	if v.Kind() == reflect.Pointer {
		if v.IsNil() {
			return math.NaN()
		}
		v = v.Elem()
	}
	switch x := v.Interface().(type) {
	case Num:
		return float64(x)
	case Strings:
		return []string(x)
	case int:
		return fmt.Sprint(x)
	default:
		return x
	}
}

// Answer is any answer: its value is its JSON, its Doc how it reads.
type Answer interface{ Doc() Doc }
