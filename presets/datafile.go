package presets

import (
	"bufio"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"strings"

	"undercool/presets/units"
)

// Column is a quantity a data file may carry: header names are the
// quantity, an underscore and the unit written with underscores, such as
// temperature_c, time_min, diffusivity_m2_per_s or rate_per_m3_s.
// A Dimensionless column is named by the bare quantity ("fraction").
type Column struct {
	Quantity string
	Kind     units.Kind
	Required bool
}

// Data is a file of columns, converted to SI, with the file line of every row.
type Data struct {
	File    string
	Columns map[string][]float64 // by quantity
	Headers map[string]string    // the header as written, by quantity
	Lines   []int                // file line of each row
}

// headerUnit turns the unit part of a header name into a unit spelling:
// underscores before "per" multiply, those after divide
// (m2_per_s → m2/s, per_m3_s → /m3/s, pa_s → pa*s).
func headerUnit(s string) string {
	parts := strings.Split(s, "_")
	var num, den []string
	after := false
	for _, p := range parts {
		if p == "per" {
			after = true
			continue
		}
		if after {
			den = append(den, p)
		} else {
			num = append(num, p)
		}
	}
	u := strings.Join(num, "*")
	for _, d := range den {
		u += "/" + d
	}
	return u
}

// InKelvin reports whether the column of a quantity was written in kelvin:
// its header names the unit K (temperature_k).
func (d *Data) InKelvin(quantity string) bool {
	_, u, ok := matchHeader(d.Headers[quantity], []Column{{Quantity: quantity}})
	return ok && u == "k"
}

// matchHeader returns the column a header names and the header's unit, or false.
func matchHeader(h string, cols []Column) (int, string, bool) {
	h = strings.ToLower(strings.TrimSpace(h))
	for i, c := range cols {
		if h == c.Quantity { // bare name: fine for a plain number, else "needs a unit"
			return i, "", true
		}
		if rest, ok := strings.CutPrefix(h, c.Quantity+"_"); ok {
			return i, headerUnit(rest), true
		}
	}
	return 0, "", false
}

func acceptedHeaders(cols []Column) string {
	var out []string
	for _, c := range cols {
		switch {
		case len(c.Kind.Units()) == 0:
			out = append(out, c.Quantity)
			continue
		case c.Kind.Bare && c.Kind.SI == "":
			out = append(out, c.Quantity+" or "+c.Quantity+"_UNIT (UNIT one of "+strings.Join(c.Kind.Units(), " ")+")")
			continue
		}
		out = append(out, c.Quantity+"_UNIT (UNIT one of "+strings.Join(c.Kind.Units(), " ")+", with _ for * and _per_ for /)")
	}
	return strings.Join(out, "; ")
}

// sniffSize is how much of a data file is read ahead to find its header.
const sniffSize = 64 << 10

// utf8BOM is the byte-order mark a spreadsheet may write first.
const utf8BOM = "\ufeff"

// separator finds how a file separates its columns: by semicolons when its
// header (the first line that is neither blank nor a comment) has a
// semicolon and no comma, as spreadsheets write CSV where the decimal mark
// is a comma; else by commas.
func separator(br *bufio.Reader) rune {
	head, _ := br.Peek(sniffSize) // a short file gives what it has
	for _, line := range strings.Split(string(head), "\n") {
		line = strings.TrimSpace(strings.TrimPrefix(line, utf8BOM))
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		if strings.Contains(line, ";") && !strings.Contains(line, ",") {
			return ';'
		}
		break
	}
	return ','
}

// decimalPoint writes a decimal comma as a point ("1,5" → "1.5"), for a
// file separated by semicolons; a value with both marks is left alone and
// fails as a number.
func decimalPoint(f string) string {
	if strings.Count(f, ",") == 1 && !strings.Contains(f, ".") {
		return strings.Replace(f, ",", ".", 1)
	}
	return f
}

// unitHint says which units a column takes, for a message: the list, or
// that it takes none.
func unitHint(c Column) string {
	if us := c.Kind.Units(); len(us) > 0 {
		return "use " + strings.Join(us, ", ")
	}
	return fmt.Sprintf("it is a plain number: name the column %s, without a unit", c.Quantity)
}

// ReadData reads a CSV whose first non-comment row is a header of unit-bearing
// names; '#' starts a comment line and blank lines are skipped. Every value
// must be a finite number. A byte-order mark at the start is skipped, and a
// file whose header is separated by semicolons is read as such, with decimal
// commas (as spreadsheets write it in many languages). Errors name the file
// and line; more than MaxDataBytes, MaxLineBytes a line or MaxDataRows is a
// *LimitError.
func ReadData(r io.Reader, file string, cols []Column) (*Data, error) {
	lr := &limitedReader{r: r, n: MaxDataBytes, line: MaxLineBytes}
	br := bufio.NewReaderSize(lr, sniffSize)
	if b, err := br.Peek(len(utf8BOM)); err == nil && string(b) == utf8BOM {
		br.Discard(len(utf8BOM))
	}
	comma := separator(br)
	cr := csv.NewReader(br)
	cr.Comma = comma
	cr.Comment = '#'
	cr.FieldsPerRecord = -1
	cr.TrimLeadingSpace = true
	cr.ReuseRecord = true
	d := &Data{File: file, Columns: map[string][]float64{}, Headers: map[string]string{}}
	var index []int                           // column position → cols index
	var parse []func(string) (float64, error) // column position → its parser
	var values [][]float64                    // column position → its values
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			switch {
			case errors.Is(err, errTooLarge):
				return nil, tooLarge(file, MaxDataBytes, "a data file")
			case errors.Is(err, errLineTooLong):
				return nil, &LimitError{fmt.Sprintf("%s:%d", file, lr.lines+1), fmt.Sprintf("a line longer than the %d KiB a line of a data file may be", MaxLineBytes>>10)}
			case errors.As(err, &pe):
				return nil, fmt.Errorf("%s:%d: not valid CSV: %v", file, pe.Line, pe.Err)
			}
			return nil, fmt.Errorf("%s: %v", file, err)
		}
		line, _ := cr.FieldPos(0)
		if blankOrComment(rec) {
			continue
		}
		if index == nil {
			index = make([]int, len(rec))
			parse = make([]func(string) (float64, error), len(rec))
			values = make([][]float64, len(rec))
			seen := map[int]bool{}
			for j, h := range rec {
				i, u, ok := matchHeader(h, cols)
				if !ok {
					return nil, fmt.Errorf("%s:%d: unknown column %s; accepted: %s", file, line, units.Quote(strings.TrimSpace(h)), acceptedHeaders(cols))
				}
				if seen[i] {
					return nil, fmt.Errorf("%s:%d: two columns for %s", file, line, cols[i].Quantity)
				}
				seen[i] = true
				if u == "" && cols[i].Kind.SI != "" { // a plain number (a fraction) may go without
					return nil, fmt.Errorf("%s:%d: column %s needs a unit, e.g. %s_%s", file, line, units.Quote(h), cols[i].Quantity, headerExample(cols[i].Kind))
				}
				p, err := cols[i].Kind.In(u)
				if err != nil {
					return nil, fmt.Errorf("%s:%d: column %s: unit %s is not a unit of %s (%s)", file, line, units.Quote(strings.TrimSpace(h)), units.Quote(u), cols[i].Kind.Name, unitHint(cols[i]))
				}
				index[j], parse[j] = i, p
				d.Headers[cols[i].Quantity] = strings.TrimSpace(h)
			}
			for _, c := range cols {
				if c.Required && !seenQuantity(d.Headers, c.Quantity) {
					return nil, fmt.Errorf("%s:%d: missing column for %s; accepted: %s", file, line, c.Quantity, acceptedHeaders(cols))
				}
			}
			continue
		}
		if len(d.Lines) == MaxDataRows {
			return nil, &LimitError{file, fmt.Sprintf("more than the %d data rows a data file may have", MaxDataRows)}
		}
		if len(rec) != len(index) {
			hint := ""
			if comma == ',' && len(rec) > len(index) {
				hint = " (a decimal comma? write 1.5, not 1,5, or separate the columns with semicolons)"
			}
			return nil, fmt.Errorf("%s:%d: %d fields, header has %d%s", file, line, len(rec), len(index), hint)
		}
		for j, f := range rec {
			if comma == ';' {
				f = decimalPoint(strings.TrimSpace(f))
			}
			v, err := parse[j](f)
			if err != nil {
				return nil, fmt.Errorf("%s:%d: column %s: %s is not a finite number", file, line, units.Quote(d.Headers[cols[index[j]].Quantity]), units.Quote(strings.TrimSpace(f)))
			}
			values[j] = append(values[j], v)
		}
		d.Lines = append(d.Lines, line)
	}
	for j, v := range values {
		d.Columns[cols[index[j]].Quantity] = v
	}
	if index == nil {
		return nil, fmt.Errorf("%s: empty file: no header row", file)
	}
	if len(d.Lines) == 0 {
		return nil, fmt.Errorf("%s: no data rows after the header", file)
	}
	return d, nil
}

// blankOrComment reports a record of only spaces, or one whose first field
// starts with '#' after spaces (the CSV reader skips only unindented comments).
func blankOrComment(rec []string) bool {
	if strings.HasPrefix(strings.TrimSpace(rec[0]), "#") {
		return true
	}
	for _, f := range rec {
		if strings.TrimSpace(f) != "" {
			return false
		}
	}
	return true
}

// headerExample is the unit part of a header for a kind's SI unit, or of
// its first unit, as a header spells it (lower case, _per_ for /).
func headerExample(k units.Kind) string {
	u := k.Units()[0]
	for _, x := range k.Units() {
		if x == k.SI {
			u = x
		}
	}
	return strings.ReplaceAll(strings.ToLower(u), "/", "_per_")
}

func seenQuantity(h map[string]string, q string) bool { _, ok := h[q]; return ok }

// ReadDataFile reads a data file by path; "-" reads stdin.
func ReadDataFile(path string, stdin io.Reader, cols []Column) (*Data, error) {
	if path == "-" {
		return ReadData(stdin, "stdin", cols)
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cannot read %s: %v", path, errors.Unwrap(err))
	}
	defer f.Close()
	return ReadData(f, path, cols)
}
