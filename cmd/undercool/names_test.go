package main

import (
	"crypto/sha256"
	"encoding/hex"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"unicode"
	"unicode/utf8"

	"undercool/presets"
)

// retiredNames are the SHA-256 digests (first 8 bytes) of the lower-case
// words that must appear nowhere in the repository: invented names that
// read like a medicine's or an alloy's brand, and a commercial trade name.
// They are kept as digests so that this file does not spell them.
var retiredNames = map[string]bool{
	"29dbec0cbf9b7a94": true, // the invented solute, now demo-solute-A
	"e6286a813caf0064": true, // the invented alloy, now demo alloy DA-1
	"c3d1fa9dd9f5704e": true, // the trade name of the Vit1 alloy
}

// TestNoRetiredNames reads every text file of the repository, word by word.
func TestNoRetiredNames(t *testing.T) {
	root, err := filepath.Abs(repoRoot())
	if err != nil {
		t.Fatal(err)
	}
	err = filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() {
			if d.Name() == ".git" {
				return filepath.SkipDir
			}
			return nil
		}
		b, err := os.ReadFile(path)
		if err != nil || !utf8.Valid(b) {
			return nil // unreadable or binary (PNG): no words
		}
		words := strings.FieldsFunc(strings.ToLower(string(b)), func(r rune) bool { return !unicode.IsLetter(r) })
		for _, w := range words {
			sum := sha256.Sum256([]byte(w))
			if retiredNames[hex.EncodeToString(sum[:8])] {
				rel, _ := filepath.Rel(root, path)
				t.Errorf("%s: a retired name (%s…) is still written here", rel, w[:3])
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
}

// TestInventedCardsSayso checks that the shipped demo cards and the
// invented cards of testdata read as invented: a name beginning "demo-"
// and a description that says so.
func TestInventedCardsSayso(t *testing.T) {
	paths := append([]string{}, presets.Names()...)
	more, _ := filepath.Glob(filepath.Join(repoRoot(), "testdata", "solution", "*.toml"))
	paths = append(paths, more...)
	for _, p := range paths {
		c, err := presets.Open(p)
		if err != nil {
			t.Fatalf("%s: %v", p, err)
		}
		if c.Kind != "demo" {
			continue
		}
		if !strings.HasPrefix(c.Name, "demo-") {
			t.Errorf("%s: the invented card is named %q; an invented name begins with demo-", p, c.Name)
		}
		if !strings.Contains(strings.ToLower(c.Description), "invented") {
			t.Errorf("%s: the description %q does not say the card is invented", p, c.Description)
		}
	}
	au, err := presets.Open("au")
	if err != nil {
		t.Fatal(err)
	}
	if want := "textbook values; gamma after Turnbull 1950"; !strings.Contains(au.Description, want) {
		t.Errorf("au: description %q; want it to say %q (the citations stay in the source fields)", au.Description, want)
	}
}
