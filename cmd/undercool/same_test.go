package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"undercool/presets"
)

// TestSameNoseEverywhere checks that the nose of a card's TTT curve, as
// ttt finds it over its default range and as cool finds it over the
// cooling path, prints the same to the 0.01 K every output shows.
func TestSameNoseEverywhere(t *testing.T) {
	nose := func(args ...string) (float64, bool) {
		var stdout, stderr bytes.Buffer
		if code := run(append(args, "--format", "json"), nil, &stdout, &stderr); code != 0 {
			return 0, false
		}
		var a struct {
			Nose struct {
				T *float64 `json:"temperature_k"`
			} `json:"nose"`
		}
		if err := json.Unmarshal(stdout.Bytes(), &a); err != nil || a.Nose.T == nil {
			return 0, false
		}
		return *a.Nose.T, true
	}
	compared := 0
	for _, name := range presets.Names() {
		tt, ok1 := nose("ttt", "--material", name)
		tc, ok2 := nose("cool", "--material", name, "--critical")
		if !ok1 || !ok2 {
			continue // no nose, or no cooling (a card without a mobility law)
		}
		compared++
		if a, b := fmt.Sprintf("%.2f", tt), fmt.Sprintf("%.2f", tc); a != b {
			t.Errorf("%s: nose %s K in ttt, %s K in cool", name, a, b)
		}
	}
	if compared < 8 {
		t.Errorf("compared the noses of %d cards; want the shipped cards with a mobility law", compared)
	}
}

// TestMemoRegenerates runs report without --date, then the command line
// the memo gives for regenerating it: the same memo and figure, byte for
// byte, whatever the day.
func TestMemoRegenerates(t *testing.T) {
	t.Chdir(t.TempDir())
	run1 := func(args []string) (memo, svg []byte) {
		t.Helper()
		var stdout, stderr bytes.Buffer
		if code := run(args, nil, &stdout, &stderr); code != 0 {
			t.Fatalf("%s: exit %d: %s", strings.Join(args, " "), code, stderr.String())
		}
		memo, err := os.ReadFile("memo.md")
		if err != nil {
			t.Fatal(err)
		}
		svg, err = os.ReadFile("memo-ttt.svg")
		if err != nil {
			t.Fatal(err)
		}
		return memo, svg
	}
	memo, svg := run1([]string{"report", "--material", "demo-alloy", "--at", "900K", "--spread", "gamma=2%", "--samples", "40", "--out", "memo.md"})
	i := bytes.Index(memo, []byte("```\nundercool report "))
	if i < 0 {
		t.Fatalf("the memo has no regenerate line:\n%s", memo)
	}
	line := string(memo[i+4 : i+4+bytes.IndexByte(memo[i+4:], '\n')])
	if !strings.Contains(line, " --date ") {
		t.Errorf("the regenerate line %q omits the memo's date", line)
	}
	args := shellWords(t, strings.TrimPrefix(line, "undercool "))
	if err := os.Remove("memo.md"); err != nil {
		t.Fatal(err)
	}
	memo2, svg2 := run1(args)
	if !bytes.Equal(memo, memo2) {
		t.Errorf("%s does not make the same memo:\n%s", line, firstDiff(string(memo2), string(memo)))
	}
	if !bytes.Equal(svg, svg2) {
		t.Errorf("%s does not make the same figure", line)
	}
	if _, err := os.Stat(filepath.Join(".", "memo.md")); err != nil {
		t.Error(err)
	}
}

// shellWords splits a command line as a POSIX shell does the words
// shellQuote writes: plain, or in single quotes.
func shellWords(t *testing.T, s string) []string {
	var out []string
	for s = strings.TrimSpace(s); s != ""; s = strings.TrimSpace(s) {
		var w strings.Builder
		for s != "" && s[0] != ' ' {
			if s[0] == '\'' {
				end := strings.IndexByte(s[1:], '\'')
				if end < 0 {
					t.Fatalf("unclosed quote in %q", s)
				}
				w.WriteString(s[1 : 1+end])
				s = s[end+2:]
				continue
			}
			if s[0] == '\\' && len(s) > 1 {
				s = s[1:]
			}
			w.WriteByte(s[0])
			s = s[1:]
		}
		out = append(out, w.String())
	}
	return out
}
