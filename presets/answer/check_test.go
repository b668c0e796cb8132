package answer

import (
	"errors"
	"math"
	"testing"
)

// A result that came out NaN or infinite is an error wherever it sits in
// an answer; a value whose NaN means "none" or "never" is not.
func TestCheck(t *testing.T) {
	nan, inf := Num(math.NaN()), Num(math.Inf(1))
	cases := []struct {
		name string
		a    any
		want string // the result named, "" for none
	}{
		{"curve fraction", &Curve{AlongCurve: &AlongCurve{Fraction: nan}}, "fraction at the end of the curve"},
		{"curve additivity", &Curve{AlongCurve: &AlongCurve{Additivity: inf}}, "additivity sum"},
		{"quench factor alone", &Curve{Property: &Property{Q: nan, Retained: 1}}, "quench factor"},
		{"retained property", &Curve{Property: &Property{Q: 1, Retained: nan}}, "retained property fraction"},
		{"a CCT row", &CCT{Rows: []CoolRow{{Fraction: 0.5}, {Fraction: nan}}}, "fraction at the end of the path"},
		{"one rate", &CCT{AtRate: &AtRate{Fraction: nan}}, "fraction at the end of the path"},
		{"critical rate", &Critical{Rate: nan}, "critical cooling rate"},
		{"a memo's part", &Memo{TTT: &TTT{}, Cool: &Critical{Rate: nan}}, "critical cooling rate"},
		{"Arrhenius Q", &FitArrhenius{Q: inf}, "activation energy Q"},
		{"Avrami n", &FitAvrami{N: nan}, "Avrami exponent n"},
		{"fitted gamma", &FitInterface{Gamma: Gamma{Gamma: nan}}, "interfacial energy"},
		{"wrapped", struct{ Answer }{&FitInduction{Gamma: Gamma{Gamma: inf}}}, "interfacial energy"},
		{"no volume, no A", &FitInduction{LnA: nan, A: nan}, ""},

		{"an evolve row", &Evolve{Rows: []EvolveRow{{NumberDensity: 1e20}, {NumberDensity: nan}}}, "number density"},

		{"no critical rate needed", &Critical{Rate: 0, NoseEstimate: nan, Nose: TimeAt{nan, nan}}, ""},
		{"a hold that never ends", &Hold{Time: inf, Lag: nan}, ""},
		{"a hold without driving force", &Hold{Time: nan}, ""},
		{"a TTT row never reached", &TTT{Rows: []TTTRow{{Time: OneOrMany[Num]{inf, nan}}}}, ""},
		{"a rate without driving force", &Rate{Rows: []RateRow{{Log10J: nan, U: nan}}}, ""},
		{"no interval", &FitArrhenius{QSE: nan, QCI: Interval{math.NaN(), math.NaN()}}, ""},
		{"nothing", (*Curve)(nil), ""},
	}
	for _, c := range cases {
		err := Check(c.a)
		var ue *UndefinedError
		switch {
		case c.want == "" && err != nil:
			t.Errorf("%s: %v, want none", c.name, err)
		case c.want != "" && (!errors.As(err, &ue) || ue.Result != c.want):
			t.Errorf("%s: %v, want an *UndefinedError of the %s", c.name, err, c.want)
		}
	}
}
