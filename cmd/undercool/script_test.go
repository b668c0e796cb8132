package main

import (
	"flag"
	"os"
	"testing"

	"github.com/rogpeppe/go-internal/testscript"
)

var update = flag.Bool("update", false, "rewrite the golden files of the CLI scripts and plots")

func TestMain(m *testing.M) {
	testscript.Main(m, map[string]func(){
		"undercool": main,
	})
}

// TestScripts runs the end-to-end scripts in testdata/script: every command,
// every format and every bad input, through the real binary entry point.
func TestScripts(t *testing.T) {
	t.Parallel()
	testscript.Run(t, testscript.Params{
		Dir:           "../../testdata/script",
		UpdateScripts: *update,
		Setup: func(e *testscript.Env) error {
			e.Setenv("REPO", repoRoot())
			// The scripts read values, not layout: a screen no line wraps on.
			e.Setenv("COLUMNS", "1000")
			return nil
		},
	})
}

func repoRoot() string {
	wd, _ := os.Getwd()
	return wd + "/../.."
}
