package main

import (
	"go/version"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// TestGoDirective checks that go.mod asks for the oldest Go that builds
// undercool: the newest go line of the modules it depends on (the code's
// own needs are checked by go vet, whose stdversion check reports a
// standard-library name newer than that line), with no patch release
// beyond .0, so that no release of that Go needs a toolchain download;
// and that the README names the same version.
func TestGoDirective(t *testing.T) {
	root := repoRoot()
	mod, err := os.ReadFile(filepath.Join(root, "go.mod"))
	if err != nil {
		t.Fatal(err)
	}
	m := regexp.MustCompile(`(?m)^go (1\.(\d+)(?:\.(\d+))?)$`).FindSubmatch(mod)
	if m == nil {
		t.Fatal("go.mod has no go line")
	}
	directive, minor := "go"+string(m[1]), string(m[2])
	if p := string(m[3]); p != "" && p != "0" {
		t.Errorf("go.mod: go %s asks for a patch release; the language needs only 1.%s.0", m[1], minor)
	}
	readme, err := os.ReadFile(filepath.Join(root, "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	if want := "With Go 1." + minor + " or newer"; !strings.Contains(string(readme), want) {
		t.Errorf("README does not say %q, the go line of go.mod", want)
	}
	goCmd, err := exec.LookPath("go")
	if err != nil {
		t.Skip("no go command to list the modules")
	}
	cmd := exec.Command(goCmd, "list", "-m", "-f", "{{.Path}} {{.GoVersion}}", "all")
	cmd.Dir = root
	cmd.Env = append(os.Environ(), "GOFLAGS=-mod=mod", "GOPROXY=off", "GOTOOLCHAIN=local")
	out, err := cmd.Output()
	if err != nil {
		t.Skipf("go list -m all: %v (the module cache is incomplete)", err)
	}
	need, by := "go1.0", ""
	for _, line := range strings.Split(strings.TrimSpace(string(out)), "\n") {
		path, v, _ := strings.Cut(line, " ")
		if v != "" && path != "undercool" && version.Compare("go"+v, need) > 0 {
			need, by = "go"+v, path
		}
	}
	if version.Lang(directive) != version.Lang(need) {
		t.Errorf("go.mod says %s; the modules need %s (%s): the go line should be the language version %s", directive, need, by, version.Lang(need))
	}
}
