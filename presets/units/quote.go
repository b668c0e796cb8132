package units

import (
	"fmt"
	"strconv"
	"unicode/utf8"
)

// QuoteMax is the most characters of a user's text that an error quotes.
const QuoteMax = 80

// Quote is s in double quotes, as %q writes it, for an error message. A
// text longer than QuoteMax characters is cut there, with its length
// after the quotation, so that an error quoting a huge field (a whole file
// on one line) stays one short line:
//
//	"1.5 kJ/mol"
//	"000000000000…"… (10485760 bytes)
//
// The units parser, the card loader and the data reader quote with it.
func Quote(s string) string {
	if utf8.RuneCountInString(s) <= QuoteMax {
		return strconv.Quote(s)
	}
	cut, n := 0, 0
	for i := range s {
		if n == QuoteMax {
			cut = i
			break
		}
		n++
	}
	return fmt.Sprintf("%s… (%d bytes)", strconv.Quote(s[:cut]), len(s))
}
