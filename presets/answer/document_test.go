package answer

import (
	"encoding/json"
	"math"
	"testing"
)

func TestReadableTime(t *testing.T) {
	for _, tc := range []struct {
		s    float64
		want string
	}{
		{math.Inf(1), "never"},
		{math.NaN(), "never"},
		{1.4e-8, "1.40e-08 s"},
		{0.00144, "0.00144 s"},
		{6.014, "6.01 s"},
		{59.9, "59.9 s"},
		{60, "1.00 min"},
		{173.4, "2.89 min"},
		{7200, "2.00 h"},
		{86400 * 3.5, "3.50 days"},
		{365.25 * 86400 * 5.34, "5.34 years"},
		{365.25 * 86400 * 1.23e5, "1.23e+05 years"},
		{365.25 * 86400 * 36036, "3.60e+04 years"}, // never more than three digits
		{365.25 * 86400 * 3.97e73, "3.97e+73 years"},
	} {
		if got := ReadableTime(tc.s); got != tc.want {
			t.Errorf("ReadableTime(%g) = %q, want %q", tc.s, got, tc.want)
		}
	}
}

// JSON writes a number without a value as null, a list of one as its
// element, and an empty list of names as [].
func TestJSONShapes(t *testing.T) {
	for _, c := range []struct {
		v    any
		want string
	}{
		{Num(math.NaN()), "null"},
		{Num(math.Inf(1)), "null"},
		{Num(1.5), "1.5"},
		{OneOrMany[Num]{2}, "2"},
		{OneOrMany[Num]{2, Num(math.Inf(-1))}, "[2,null]"},
		{Strings(nil), "[]"},
		{Interval{1, 2}, "[1,2]"},
		{Interval{math.NaN(), 2}, "null"},
		{Object{{"b", 1}, {"a", Num(math.NaN())}}, `{"b":1,"a":null}`},
	} {
		b, err := json.Marshal(c.v)
		if err != nil || string(b) != c.want {
			t.Errorf("%#v: %s (%v), want %s", c.v, b, err, c.want)
		}
	}
}

// A table's columns come from the col tags of its row type, in order: the
// head, the format, the JSON key; a pointer column only where the first
// row has it.
func TestTableOf(t *testing.T) {
	type row struct {
		T    Num     `json:"temperature_k" col:"T (K),f2"`
		Skip Num     `json:"skip"`
		Opt  *Num    `json:"opt,omitempty" col:"opt,g3"`
		Name string  `json:"name" col:"name"`
		F    Strings `json:"flags" col:"flags"`
	}
	x := Num(2)
	tab := tableOf([]row{{T: 1, Name: "a"}, {T: Num(math.NaN()), Opt: &x}})
	if len(tab.Cols) != 3 || tab.Cols[0].Key != "temperature_k" || tab.Cols[1].Key != "name" || tab.Cols[2].Head != "flags" {
		t.Fatalf("columns %+v, want temperature_k, name, flags", tab.Cols)
	}
	if got := tab.Cols[0].Cell(tab.Rows[0][0]); got != "1.00" {
		t.Errorf("T cell %q, want 1.00", got)
	}
	if got := tab.Cols[0].Cell(tab.Rows[1][0]); got != Dash {
		t.Errorf("NaN cell %q, want the dash", got)
	}
	if tab.Cols[1].Text != nil || tab.Cols[0].Text == nil {
		t.Error("text columns have no format, number columns one")
	}
	with := tableOf([]row{{Opt: &x}})
	if len(with.Cols) != 4 || with.Cols[1].Key != "opt" {
		t.Errorf("columns %+v, want opt second", with.Cols)
	}
}
