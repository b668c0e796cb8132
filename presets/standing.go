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
//
// A card whose checks hold in order of magnitude at best (recalled values, a
// large error) stays an estimate, with its rows: estimate = true. A card of
// an invented material (a demo) says so instead, and names no rows:
// invented = true.
type Standing struct {
	Calibrated []string // the measured rows the card was calibrated on
	Checked    []string // the measured rows held out and checked
	Error      string   // the rms error of the checked rows, with its unit ("0.20 decades", "0.35 K")
	Note       string   // what else a reader must know, or ""
	Rough      bool     // checked, but still an estimate: its checks hold in order of magnitude at best
	Invented   bool     // the card describes no real material: nothing to calibrate on or check against
}

// Estimate reports whether the card is an estimate: checked against no
// measured point it was not calibrated on, or only roughly. An invented
// card is one too.
func (s Standing) Estimate() bool { return len(s.Checked) == 0 || s.Rough }

// EstimateText is the standing of a card that states none.
const EstimateText = "estimate: not checked against measured rates"

// InventedText is the standing of an invented card.
const InventedText = "invented: describes no real material, checked against nothing"

// Short is the standing in one clause, without its note.
func (s Standing) Short() string {
	switch {
	case s.Invented:
		return InventedText
	case len(s.Checked) == 0 && len(s.Calibrated) > 0:
		return fmt.Sprintf("%s; calibrated on %s", EstimateText, points(len(s.Calibrated)))
	case len(s.Checked) == 0:
		return EstimateText
	}
	c := fmt.Sprintf("calibrated on %s, checked against %d, rms error %s", points(len(s.Calibrated)), len(s.Checked), s.Error)
	if len(s.Calibrated) == 0 {
		c = fmt.Sprintf("calibrated on nothing, checked against %s, rms error %s", points(len(s.Checked)), s.Error)
	}
	if s.Rough {
		return RoughPrefix + c
	}
	return c
}

// RoughPrefix begins the standing of a card that is checked but stays an
// estimate.
const RoughPrefix = "estimate: "

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
	Estimate   bool     `toml:"estimate"`
	Invented   bool     `toml:"invented"`
}

// measuredRow is how a measured row is named: FILE:LINE (a file name, then its line).
var measuredRow = regexp.MustCompile(`^[^:\n]+:[1-9][0-9]*$`)

// standingOf checks the [standing] table of a card; where names the card.
func standingOf(raw *rawStanding, where string) (Standing, error) {
	if raw == nil {
		return Standing{}, nil
	}
	s := Standing{Calibrated: raw.Calibrated, Checked: raw.Checked, Error: strings.TrimSpace(raw.Error), Note: strings.TrimSpace(raw.Note), Rough: raw.Estimate, Invented: raw.Invented}
	switch {
	case s.Invented && (len(s.Calibrated) > 0 || len(s.Checked) > 0 || s.Error != "" || s.Rough):
		return Standing{}, fmt.Errorf("%s: [standing] invented: an invented card is calibrated on and checked against nothing (no calibrated, checked, error or estimate)", where)
	case s.Rough && len(s.Checked) == 0:
		return Standing{}, fmt.Errorf("%s: [standing] estimate = true without checked rows: a card checked against nothing is an estimate already", where)
	}
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
