package presets

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"undercool/presets/units"
)

// endless yields its pattern over and over, up to n bytes (n < 0: for
// ever), and counts what was read of it.
type endless struct {
	pattern string
	n, read int
}

func (e *endless) Read(p []byte) (int, error) {
	if e.n >= 0 && e.read >= e.n {
		return 0, io.EOF
	}
	k := 0
	for k < len(p) && (e.n < 0 || e.read+k < e.n) {
		p[k] = e.pattern[(e.read+k)%len(e.pattern)]
		k++
	}
	e.read += k
	return k, nil
}

func wantLimit(t *testing.T, what string, err error, msg string) {
	t.Helper()
	var le *LimitError
	if !errors.As(err, &le) || !strings.Contains(err.Error(), msg) {
		t.Errorf("%s: %v, want a *LimitError saying %q", what, err, msg)
	}
}

// Data files: a stream that does not end stops a little past MaxDataBytes
// (64 KiB of comment lines at a time), a line without end at MaxLineBytes,
// and a million and one rows at MaxDataRows.
func TestDataLimits(t *testing.T) {
	comment := "# " + strings.Repeat("c", 60<<10) + "\n"
	r := &endless{pattern: comment, n: -1}
	_, err := ReadData(r, "endless.csv", []Column{{Quantity: "time", Kind: units.Time, Required: true}})
	wantLimit(t, "endless comments", err, "endless.csv: larger than the 64 MiB a data file may be")
	if r.read > MaxDataBytes+64<<10 {
		t.Errorf("read %d bytes of an endless file, limit %d", r.read, MaxDataBytes)
	}

	r = &endless{pattern: "\x00", n: -1}
	_, err = ReadData(r, "zero", curveCols)
	wantLimit(t, "a line without end", err, "zero:1: a line longer than the 64 KiB")
	if r.read > 2*MaxLineBytes {
		t.Errorf("read %d bytes of a line without end, limit %d", r.read, MaxLineBytes)
	}
	_, err = ReadData(strings.NewReader("time_s,temperature_k\n1,300\n2,"+strings.Repeat("3", MaxLineBytes)+"\n"), "long.csv", curveCols)
	wantLimit(t, "a long third line", err, "long.csv:3: a line longer")

	rows := &endless{pattern: "1,2\n", n: 4 * (MaxDataRows + 1)}
	_, err = ReadData(io.MultiReader(strings.NewReader("time_s,temperature_k\n"), rows), "many.csv", curveCols)
	wantLimit(t, "too many rows", err, "many.csv: more than the 1000000 data rows")
	d, err := ReadData(io.MultiReader(strings.NewReader("time_s,temperature_k\n"), &endless{pattern: "1,2\n", n: 4 * MaxDataRows}), "full.csv", curveCols)
	if err != nil || len(d.Lines) != MaxDataRows {
		t.Errorf("exactly %d rows: %v", MaxDataRows, err)
	}
}

// An error on a huge field quotes a short piece of it.
func TestDataQuotesShort(t *testing.T) {
	field := strings.Repeat("9", 60<<10) + "x"
	for _, in := range []string{
		"time_s,temperature_k\n1," + field + "\n",
		"time_s," + field + "\n1,2\n",
		"time_s,temperature_" + field + "\n1,2\n",
	} {
		_, err := ReadData(strings.NewReader(in), "f.csv", curveCols)
		if err == nil || len(err.Error()) > 400 {
			t.Errorf("error of %d bytes: %.300v", len(err.Error()), err)
		}
	}
}

var curveCols = []Column{{Quantity: "time", Kind: units.Time, Required: true}, {Quantity: "temperature", Kind: units.Temperature, Required: true}}

// Cards: larger than MaxCardBytes, or nested deeper than MaxCardDepth (the
// decoder's time grows with the square of the depth), are refused before
// decoding; brackets and dots inside strings and comments do not count.
func TestCardLimits(t *testing.T) {
	dir := t.TempDir()
	big := filepath.Join(dir, "big.toml")
	if err := os.WriteFile(big, []byte(strings.Repeat("# padding\n", MaxCardBytes/10+1)), 0o644); err != nil {
		t.Fatal(err)
	}
	_, err := Open(big)
	wantLimit(t, "a large card", err, "big.toml: larger than the 4 MiB a card may be")
	if _, err := os.Stat("/dev/zero"); err == nil {
		_, err := Open("/dev/zero")
		wantLimit(t, "/dev/zero", err, "/dev/zero: larger than the 4 MiB a card may be")
	}

	const n = 10000
	deep := map[string]string{
		"inline tables": "name = \"x\"\na = " + strings.Repeat("{b = ", n) + "1" + strings.Repeat("}", n) + "\n",
		"arrays":        "name = \"x\"\na = " + strings.Repeat("[", n) + "1" + strings.Repeat("]", n) + "\n",
		"dotted key":    "name = \"x\"\na" + strings.Repeat(".b", n) + " = 1\n",
		"table header":  "name = \"x\"\n[a" + strings.Repeat(".b", n) + "]\n",
		"just too deep": "name = \"x\"\na = " + strings.Repeat("{b = ", MaxCardDepth+1) + "1" + strings.Repeat("}", MaxCardDepth+1) + "\n",
	}
	for what, card := range deep {
		_, err := Parse([]byte(card), "deep.toml")
		wantLimit(t, what, err, "deep.toml:2: nested more than 16 deep")
	}

	shallow := []string{
		// A card's own shape, 3 deep.
		"name = \"x\"\nkind = \"demo\"\ndriving = \"linear\"\n[values]\nte = { value = \"1000 K\", source = \"invented\" }\n",
		// Brackets, braces and dots in strings and comments.
		"name = \"" + strings.Repeat("[{.", 100) + "\"\nkind = \"demo\"\ndriving = \"linear\"\n# " + strings.Repeat("[{.", 100) + "\n" +
			"description = '''\n" + strings.Repeat("[{.", 100) + "\n'''\n[values]\nte = { value = \"1000 K\", source = 'a.b.c.d.e.f.g.h.i.j.k.l.m.n.o.p.q.r.s [[[[[[[[[[[[[[[[[[' }\n",
		// Exactly MaxCardDepth inline tables: not refused for its depth.
		"name = \"x\"\nkind = \"demo\"\ndriving = \"linear\"\na = " + strings.Repeat("{b = ", MaxCardDepth) + "1" + strings.Repeat("}", MaxCardDepth) + "\n",
	}
	for i, card := range shallow {
		_, err := Parse([]byte(card), "ok.toml")
		var le *LimitError
		if errors.As(err, &le) {
			t.Errorf("card %d: %v", i, err)
		}
	}
}

// An error on a huge key or value of a card quotes a short piece of it
// (beside the list of allowed keys, which the message may give).
func TestCardQuotesShort(t *testing.T) {
	long := strings.Repeat("k", 1<<20)
	for _, card := range []string{
		"name = \"x\"\n" + long + " = 1\n",
		"name = \"x\"\nkind = \"" + long + "\"\ndriving = \"linear\"\n",
		"name = \"x\"\nkind = \"demo\"\ndriving = \"linear\"\n[values]\n" + long + " = { value = \"1 K\", source = \"s\" }\n",
		"name = \"x\"\nkind = \"demo\"\ndriving = \"linear\"\n[values]\nte = { value = \"1" + long + " K\", source = \"s\" }\n",
		"name = \"x\"\nkind = \"demo\"\ndriving = \"linear\"\n[values]\nte = { value = \"1000 K\", source = \"s\" }\n[spread]\nte = { value = \"" + long + "\", source = \"s\" }\n",
	} {
		_, err := Parse([]byte(card), "c.toml")
		if err == nil || len(err.Error()) > 1000 {
			t.Errorf("error of %d bytes: %.300v", len(err.Error()), err)
		}
	}
}
