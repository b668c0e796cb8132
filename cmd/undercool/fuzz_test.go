package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"regexp"
	"runtime/debug"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/spf13/pflag"

	"undercool/presets"
)

// The fuzz test drives run in-process with argument lists built from the
// fuzz input and checks the promises every command makes whatever it is
// given: no panic, exit 0, 1 or 2, one "undercool: ..." line on stderr on
// failure and no partial output file, no NaN or Inf in any output, and
// JSON that parses.
//
//	go test ./cmd/undercool -run '^$' -fuzz FuzzRun -fuzztime 5m -parallel 1
//
// FUZZ_TRACE=1 go test -v -run FuzzRun logs every run's arguments and exit status.

// fuzzCommands are the commands the first byte picks from; "help" and an
// unknown name exercise the dispatcher.
var fuzzCommands = []string{"rate", "ttt", "hold", "cool", "heat", "fit", "materials", "report", "help", "frobnicate"}

// fuzzFitKinds are the fit models, with one that does not exist.
var fuzzFitKinds = []string{"arrhenius", "interface", "avrami", "induction", "wiggle"}

// fuzzFiles are the data files a positional FILE or a file flag may name;
// "-" reads the fuzzed standard input.
var fuzzFiles = []string{
	"-",
	"$REPO/testdata/fit/diffusion.csv",
	"$REPO/testdata/fit/nucleation-rates.csv",
	"$REPO/testdata/fit/crystallized-fraction.csv",
	"$REPO/testdata/solution/demo-solute-a-induction.csv",
	"$REPO/testdata/solution/demo-solute-a-solubility.csv",
	"$REPO/testdata/curves/demo-quench.csv",
	"$REPO/testdata/curves/demo-plate-quench.csv",
}

// fuzzWriteFlags name output files: their values are moved into the test's
// temporary directory.
var fuzzWriteFlags = map[string]bool{"plot": true, "out": true, "card-out": true}

// maxFuzzSamples keeps the Monte Carlo bands cheap.
const maxFuzzSamples = 50

// badToken finds a non-finite number as Go prints it.
var badToken = regexp.MustCompile(`(^|[^A-Za-z])(NaN|Inf)([^A-Za-z]|$)`)

// fuzzFlagNames lists the flags of a command, sorted.
func fuzzFlagNames(name string) []string {
	cmd := commands[name]
	if cmd == nil {
		return nil
	}
	fs := pflag.NewFlagSet(name, pflag.ContinueOnError)
	cmd.setup(fs, &env{})
	var names []string
	fs.VisitAll(func(f *pflag.Flag) { names = append(names, f.Name) })
	sort.Strings(names)
	return names
}

func fuzzMaterials() []string {
	return append(append([]string{""}, presets.Names()...), "$REPO/testdata/solution/demo-solute-a.toml")
}

// fuzzInput is one fuzz input: indexes into the lists above and up to four
// flags with their values (flag byte 255: no flag).
type fuzzInput struct {
	cmd, mat, pos, format byte
	flag                  [4]byte
	value                 [4]string
	stdin                 []byte
}

// seed builds an input from names: flags are "name=value".
func seed(cmd, mat string, pos, format byte, stdin string, flags ...string) fuzzInput {
	in := fuzzInput{cmd: byte(indexOf(fuzzCommands, cmd)), pos: pos, format: format, stdin: []byte(stdin)}
	j := indexOf(fuzzMaterials(), mat)
	if j < 0 {
		panic("fuzz seed: no material " + mat)
	}
	in.mat = byte(j)
	names := fuzzFlagNames(cmd)
	for i := range in.flag {
		in.flag[i] = 255
	}
	for i, f := range flags {
		k, v, _ := strings.Cut(f, "=")
		j := indexOf(names, k)
		if j < 0 {
			panic("fuzz seed: " + cmd + " has no flag --" + k)
		}
		in.flag[i], in.value[i] = byte(j), v
	}
	return in
}

func indexOf(list []string, s string) int {
	for i, x := range list {
		if x == s {
			return i
		}
	}
	return -1
}

// fuzzSeeds: one per command and the special values.
func fuzzSeeds() []fuzzInput {
	curve := "time_s,temperature_c\n0,900\n1,700\n2,500\n3,300\n"
	soluteA := "$REPO/testdata/solution/demo-solute-a.toml"
	rates := "temperature_k,rate_per_m3_s\n860,6.293e+14\n900,3.6e12\n950,1.659e+03\n"
	return []fuzzInput{
		seed("rate", "demo-alloy", 0, 0, "", "range=1100:700:50"),
		seed("rate", "demo-alloy", 0, 2, "", "temps=1e-300,1e300"),
		seed("rate", "demo-alloy", 0, 1, "", "temps=0,-0,1160"),
		seed("rate", "", 0, 2, "", "te=1000", "dh=10kJ/mol", "vm=7cm3/mol", "gamma=0.1J/m2"),
		seed("rate", "vit1", 0, 3, "", "gamma=1e-300J/m2", "temps=700"),
		seed("rate", "ice", 0, 2, "", "theta=1e-300", "sites=1e300"),
		seed("rate", soluteA, 0, 2, "", "supersaturation=1e300"),
		seed("rate", "paracetamol-acetone-water", 0, 0, "", "conc=0"),
		seed("rate", "demo-alloy", 0, 2, "", "spread=gamma=2%", "samples=20"),
		seed("rate", "demo-alloy", 0, 0, "", "range=1000:999:1e-9"),
		seed("ttt", "demo-alloy", 0, 0, "", "fraction=0.01,0.5,0.99"),
		seed("ttt", "vit1", 0, 2, "", "fraction=1e-300", "lag=true"),
		seed("ttt", "lithium-disilicate", 0, 1, "", "nuclei=1e300"),
		seed("ttt", "indomethacin", 0, 3, "", "dh=1e300J/mol"),
		seed("ttt", "demo-alloy", 0, 0, "", "plot=ttt.svg"),
		seed("ttt", "sucrose", 0, 2, "", "spread=d0=x3", "samples=10", "seed=0"),
		seed("hold", "demo-alloy", 0, 0, "", "at=800K"),
		seed("hold", "demo-alloy", 0, 2, "", "at=1e-300", "fraction=0.999999999999"),
		seed("hold", "ice", 0, 1, "", "at=230", "volume=1e-300m3"),
		seed("hold", soluteA, 0, 2, "", "at=20C", "volume=100mL"),
		seed("hold", "", 0, 2, "", "at=450K", "te=1300K", "dh=55kJ/mol", "vm=1e300m3/mol"),
		seed("cool", "demo-alloy", 0, 0, "", "critical=true"),
		seed("cool", "vit1", 0, 2, "", "rate=1,10,100K/s"),
		seed("cool", "demo-alloy", 0, 2, "", "rate=1e-300K/s", "volume=1mm3"),
		seed("cool", "demo-alloy", 0, 1, "", "rate=1e300K/s", "end=1e-300K"),
		seed("cool", "demo-alloy", 0, 2, curve, "curve=-", "band=1e-300K"),
		seed("cool", "", 0, 2, curve, "curve=-", "c-curve=k1=-0.00501,k2=1e-10s,k3=4000,k4=760K,k5=130kJ/mol"),
		seed("cool", "demo-alloy", 0, 0, "", "curve=$REPO/testdata/curves/demo-quench.csv", "volume=1e300m3"),
		seed("cool", "demo-alloy", 0, 0, "", "rate=1,100K/s", "plot=cct.svg"),
		seed("cool", "ice", 0, 3, "", "critical=true", "fraction=1e-300"),
		seed("fit", "", 5, 0, ""), // arrhenius diffusion.csv
		seed("fit", "", 5, 2, "", "card-out=solute.toml"),
		seed("fit", "demo-alloy", 11, 2, ""), // interface nucleation-rates.csv
		seed("fit", "demo-alloy", 1, 2, rates, "gamma=1e300J/m2"),
		seed("fit", "", 17, 1, ""), // avrami crystallized-fraction.csv
		seed("fit", "", 2, 2, "time_s,fraction\n1,1e-300\n2,0.5\n3,0.999999999999\n"),
		seed("fit", soluteA, 23, 2, "", "volume=100mL"), // induction demo-solute-a-induction.csv
		seed("fit", "", 3, 2, "temperature_c,supersaturation,induction_time_s\n15,1e300,1\n20,1.0000000001,1e300\n"),
		seed("fit", "", 0, 0, "temperature_k,diffusivity_m2_per_s\n1e-300,1e-300\n1e300,1e300\n"),
		seed("fit", "", 0, 2, "temperature_k,diffusivity_m2_per_s,weight\n900,1e-12,0\n1000,1e-11,1e300\n", "weights=true"),
		seed("materials", "", 0, 0, ""),
		seed("materials", "", 5, 2, ""),
		seed("materials", "", 9, 3, ""),
		seed("report", "demo-alloy", 0, 0, "", "at=900K"),
		seed("report", "demo-alloy", 0, 1, "", "spread=gamma=2%", "samples=20", "date=2026-01-02"),
		seed("report", "vit1", 0, 0, curve, "curve=-", "volume=1e-300m3"),
		seed("report", "demo-alloy", 0, 1, "", "plot=ttt.svg", "fraction=1e-300"),
		seed("help", "", 3, 0, ""),
		seed("frobnicate", "", 0, 0, ""),

		// Found by the fuzzer.
		seed("hold", "demo-alloy", 0, 0, "", "at=1e-100", "fraction=0"),  // a note, then the error: two lines
		seed("cool", "demo-alloy", 0, 1, curve, "curve=-", "band=1e-3"),  // 900 000 bands: seconds, 1e-7 K runs out of memory
		seed("report", "vit1", 0, 1, "", "at=1"),                         // below the VFT T0: log10 J = -Inf in the memo
		seed("hold", "demo-alloy", 0, 1, "", "at=1e-100", "fraction=.1"), // nucleus of +Inf molecules, +Inf kT
	}
}

func FuzzRun(f *testing.F) {
	for _, s := range fuzzSeeds() {
		f.Add(s.cmd, s.mat, s.pos, s.format,
			s.flag[0], s.value[0], s.flag[1], s.value[1], s.flag[2], s.value[2], s.flag[3], s.value[3], s.stdin)
	}
	repo, err := filepath.Abs(repoRoot())
	if err != nil {
		f.Fatal(err)
	}
	materials := fuzzMaterials()
	flagsOf := map[string][]string{}
	for _, c := range fuzzCommands {
		flagsOf[c] = fuzzFlagNames(c)
	}
	f.Fuzz(func(t *testing.T, cmd, mat, pos, format byte,
		f0 byte, v0 string, f1 byte, v1 string, f2 byte, v2 string, f3 byte, v3 string, stdin []byte) {
		dir := t.TempDir()
		name := fuzzCommands[int(cmd)%len(fuzzCommands)]
		flags := flagsOf[name]
		has := func(flag string) bool { return indexOf(flags, flag) >= 0 }
		args := []string{name}
		switch name {
		case "fit":
			args = append(args, fuzzFitKinds[int(pos)%len(fuzzFitKinds)],
				fuzzPath(repo, fuzzFiles[int(pos)/len(fuzzFitKinds)%len(fuzzFiles)]))
		case "materials":
			if m := materials[int(pos)%len(materials)]; m != "" {
				args = append(args, fuzzPath(repo, m))
			}
		case "help":
			args = append(args, fuzzCommands[int(pos)%len(fuzzCommands)])
		}
		if m := materials[int(mat)%len(materials)]; m != "" && has("material") {
			args = append(args, "--material="+fuzzPath(repo, m))
		}
		if has("format") && name != "report" {
			args = append(args, "--format="+formats[int(format)%len(formats)])
		}
		if name == "report" {
			if format%2 == 0 {
				args = append(args, "--out=-")
			} else {
				args = append(args, "--out="+filepath.Join(dir, "memo.md"))
			}
		}
		spread := false
		for i, fl := range []byte{f0, f1, f2, f3} {
			if fl == 255 || len(flags) == 0 {
				continue
			}
			flag := flags[int(fl)%len(flags)]
			v := []string{v0, v1, v2, v3}[i]
			switch {
			case fuzzWriteFlags[flag] && !(flag == "out" && v == "-"):
				v = filepath.Join(dir, fuzzBase(v))
			case flag == "samples":
				if n, err := strconv.Atoi(strings.TrimSpace(v)); err == nil && n > maxFuzzSamples {
					v = strconv.Itoa(maxFuzzSamples)
				}
			default:
				v = fuzzPath(repo, v)
			}
			spread = spread || flag == "spread"
			args = append(args, "--"+flag+"="+v)
		}
		if spread && has("samples") && !fuzzHasFlag(args, "samples") {
			args = append(args, "--samples=20")
		}

		var stdout, stderr bytes.Buffer
		code := -1
		func() {
			defer func() {
				if r := recover(); r != nil {
					t.Fatalf("panic: %v\nargs: %q\n%s", r, args, debug.Stack())
				}
			}()
			code = run(args, bytes.NewReader(stdin), &stdout, &stderr)
		}()
		if os.Getenv("FUZZ_TRACE") != "" {
			t.Logf("%d %q %.150q", code, args, stderr.String())
		}
		checkRun(t, dir, args, code, stdout.String(), stderr.String())
	})
}

// checkRun asserts what every run promises.
func checkRun(t *testing.T, dir string, args []string, code int, stdout, stderr string) {
	t.Helper()
	lines := strings.Split(strings.TrimSuffix(stderr, "\n"), "\n")
	if stderr == "" {
		lines = nil
	}
	switch code {
	case 0:
		for _, l := range lines {
			if !strings.HasPrefix(l, "undercool: note: ") {
				t.Errorf("exit 0 but stderr line %q is not a note\nargs: %q", l, args)
			}
		}
	case 1, 2:
		if len(lines) != 1 || !strings.HasPrefix(lines[0], "undercool: ") || !strings.HasSuffix(stderr, "\n") {
			t.Errorf("exit %d: stderr is not one line \"undercool: ...\": %q\nargs: %q", code, stderr, args)
		}
		if stdout != "" {
			t.Errorf("exit %d with output on stdout: %.200q\nargs: %q", code, stdout, args)
		}
		if ents, _ := os.ReadDir(dir); len(ents) > 0 {
			t.Errorf("exit %d left files behind: %v\nargs: %q", code, ents, args)
		}
		return
	default:
		t.Fatalf("exit %d, want 0, 1 or 2\nargs: %q\nstderr: %s", code, args, stderr)
	}
	outputs := map[string]string{"stdout": stdout, "stderr": stderr}
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		switch filepath.Ext(e.Name()) {
		case ".md", ".toml", ".svg":
			b, err := os.ReadFile(filepath.Join(dir, e.Name()))
			if err != nil {
				t.Fatal(err)
			}
			outputs[e.Name()] = string(b)
		}
	}
	for what, out := range outputs {
		if m := badToken.FindStringIndex(out); m != nil {
			lo, hi := max(0, m[0]-120), min(len(out), m[1]+120)
			t.Errorf("%s has a non-finite number: ...%s...\nargs: %q", what, out[lo:hi], args)
		}
	}
	if fuzzFormat(args) == "json" && args[0] != "help" {
		var v any
		if err := json.Unmarshal([]byte(stdout), &v); err != nil {
			t.Errorf("--format json output does not parse: %v\n%.300s\nargs: %q", err, stdout, args)
		}
	}
}

// fuzzPath expands $REPO and keeps a value that could name a file only
// when it stays inside the repository's testdata or below the package
// directory: no fuzz input reads /dev or /proc. (A unit such as kJ/mol
// is a relative path that does not exist.)
func fuzzPath(repo, v string) string {
	v = strings.ReplaceAll(v, "$REPO", repo)
	if !strings.ContainsRune(v, '/') {
		return v
	}
	if strings.Contains(v, "..") || strings.HasPrefix(v, "/") && !strings.HasPrefix(v, repo+"/testdata/") ||
		strings.Contains(v, "=/") || strings.Contains(v, ",/") {
		return strings.ReplaceAll(v, "/", "_")
	}
	return v
}

// fuzzBase is a file name for an output file inside the temporary
// directory, keeping the extension the command checks.
func fuzzBase(v string) string {
	ext := strings.Map(func(r rune) rune {
		if r >= 'a' && r <= 'z' || r >= '0' && r <= '9' || r == '.' {
			return r
		}
		return -1
	}, strings.ToLower(filepath.Ext(v)))
	return "out" + ext
}

func fuzzHasFlag(args []string, flag string) bool {
	for _, a := range args {
		if strings.HasPrefix(a, "--"+flag+"=") {
			return true
		}
	}
	return false
}

// fuzzFormat is the last --format of the arguments.
func fuzzFormat(args []string) string {
	f := "table"
	for _, a := range args {
		if v, ok := strings.CutPrefix(a, "--format="); ok {
			f = v
		}
	}
	return f
}
