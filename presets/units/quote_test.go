package units

import (
	"strings"
	"testing"
)

func TestQuote(t *testing.T) {
	long := strings.Repeat("0", 10<<20) + "x"
	for _, c := range []struct{ in, want string }{
		{"1.5 kJ/mol", `"1.5 kJ/mol"`},
		{"", `""`},
		{"a\"b", `"a\"b"`},
		{strings.Repeat("é", QuoteMax), `"` + strings.Repeat("é", QuoteMax) + `"`},
		{strings.Repeat("é", QuoteMax+1), `"` + strings.Repeat("é", QuoteMax) + `"… (162 bytes)`},
		{long, `"` + strings.Repeat("0", QuoteMax) + `"… (10485761 bytes)`},
	} {
		if got := Quote(c.in); got != c.want {
			t.Errorf("Quote(%.20q…) = %.120s, want %.120s", c.in, got, c.want)
		}
	}
}

// An error on a huge field quotes a short piece of it.
func TestParseQuotesShort(t *testing.T) {
	long := strings.Repeat("7", 10<<20) + "kg"
	for _, k := range []Kind{Temperature, MolarEnergy} {
		_, err := Parse(long, k)
		if err == nil || len(err.Error()) > 300 {
			t.Errorf("%s: error of %d bytes: %.200v", k.Name, len(err.Error()), err)
		}
	}
	_, _, err := ParseAny("x"+long, Temperature, MolarEnergy)
	if err == nil || len(err.Error()) > 300 {
		t.Errorf("ParseAny: error of %d bytes", len(err.Error()))
	}
}
