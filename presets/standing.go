package presets

import (
	"fmt"
	"regexp"
	"strings"
)

// Standing is how far a card has been held against measurements: the
// measured rows it was calibrated on, the rows held out and checked, and
// the rms error of the checked ones. A card that states none has the
// standing of an estimate.
//
// On a card it is a table of its own; rows are "FILE.csv:LINE" of the
// measured data files (testdata/measured for the shipped cards):
//
//	[standing]
//	calibrated = ["lithium-disilicate-nucleation.csv:10", …]
//	checked    = ["lithium-disilicate-nucleation.csv:11", …]
//	error      = "0.20 decades"
//	note       = "the measured rates are recalled values (±0.5 decade)"
type Standing struct {
	Calibrated []string // the measured rows the card was calibrated on
	Checked    []string // the measured rows held out and checked
	Error      string   // the rms error of the checked rows, with its unit ("0.20 decades", "0.35 K")
	Note       string   // what else a reader must know, or ""
}

// Estimate reports whether the card is an estimate: checked against no
// measured point it was not calibrated on.
func (s Standing) Estimate() bool { return len(s.Checked) == 0 }

// EstimateText is the standing of a card that states none.
const EstimateText = "estimate: not checked against measured rates"

// Short is the standing in one clause, without its note.
func (s Standing) Short() string {
	if s.Estimate() {
		if n := len(s.Calibrated); n > 0 {
			return fmt.Sprintf("%s; calibrated on %s", EstimateText, points(n))
		}
		return EstimateText
	}
	return fmt.Sprintf("calibrated on %s, checked against %d, rms error %s", points(len(s.Calibrated)), len(s.Checked), s.Error)
}

// String is the standing with its note.
func (s Standing) String() string {
	if s.Note == "" {
		return s.Short()
	}
	return s.Short() + "; " + s.Note
}

func points(n int) string {
	if n == 1 {
		return "1 measured point"
	}
	return fmt.Sprintf("%d measured points", n)
}

type rawStanding struct {
	Calibrated []string `toml:"calibrated"`
	Checked    []string `toml:"checked"`
	Error      string   `toml:"error"`
	Note       string   `toml:"note"`
}

// measuredRow is how a measured row is named: FILE:LINE (a file name, then its line).
var measuredRow = regexp.MustCompile(`^[^:\n]+:[1-9][0-9]*$`)

// standingOf checks the [standing] table of a card; where names the card.
func standingOf(raw *rawStanding, where string) (Standing, error) {
	if raw == nil {
		return Standing{}, nil
	}
	s := Standing{Calibrated: raw.Calibrated, Checked: raw.Checked, Error: strings.TrimSpace(raw.Error), Note: strings.TrimSpace(raw.Note)}
	seen := map[string]string{}
	for _, list := range []struct {
		name string
		rows []string
	}{{"calibrated", s.Calibrated}, {"checked", s.Checked}} {
		for _, r := range list.rows {
			if !measuredRow.MatchString(r) {
				return Standing{}, fmt.Errorf("%s: [standing] %s: %q is not a measured row FILE:LINE", where, list.name, r)
			}
			if other, dup := seen[r]; dup {
				return Standing{}, fmt.Errorf("%s: [standing] %s: %q is already in %s (a row is either calibrated on or checked against)", where, list.name, r, other)
			}
			seen[r] = list.name
		}
	}
	switch {
	case len(s.Checked) > 0 && s.Error == "":
		return Standing{}, fmt.Errorf("%s: [standing] checked rows need error, the rms error of the checked rows with its unit (\"0.2 decades\")", where)
	case len(s.Checked) == 0 && s.Error != "":
		return Standing{}, fmt.Errorf("%s: [standing] error without checked rows", where)
	}
	return s, nil
}

// Changed records that the values or model choices named by keys were
// changed from the card's own (on the command line): a card that was
// calibrated or checked is then an estimate, and says what changed. A card
// without a standing is left as it is.
func (c *Card) Changed(keys []string) {
	s := c.Standing
	if len(keys) == 0 || (len(s.Calibrated) == 0 && len(s.Checked) == 0) {
		return
	}
	c.Standing = Standing{Note: fmt.Sprintf("changed from the card (%s), so its standing (%s) no longer applies", strings.Join(keys, ", "), s.Short())}
}
