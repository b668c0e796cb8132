package main

import (
	"bytes"
	"errors"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"syscall"
	"testing"
	"time"

	"undercool/cmd/undercool/internal/faulty"
)

// The files a command writes, run in-process: what happens to existing
// files, to devices and pipes, to inputs given as outputs, and to a set of
// files when writing one of them fails. Each test runs in a folder of its
// own and checks what is left in it.

// runIn runs the command line in dir and returns its exit status and streams.
func runIn(t *testing.T, dir string, args ...string) (code int, stdout, stderr string) {
	t.Helper()
	t.Chdir(dir)
	var out, errOut bytes.Buffer
	code = run(args, strings.NewReader(""), &out, &errOut)
	return code, out.String(), errOut.String()
}

// failed checks a run that must fail with code and one line on stderr
// matching want, and print nothing.
func failed(t *testing.T, code int, stdout, stderr string, wantCode int, want string) {
	t.Helper()
	if code != wantCode || stdout != "" || strings.Count(stderr, "\n") != 1 || !regexp.MustCompile("(?m)"+want).MatchString(stderr) {
		t.Errorf("exit %d, stdout %.80q, stderr %q; want exit %d and one line matching %q", code, stdout, stderr, wantCode, want)
	}
}

// A file that exists keeps its permission bits when it is replaced; a new
// file gets 0666 less the umask, as any program's output does.
func TestOutputModes(t *testing.T) {
	old := syscall.Umask(0o027)
	defer syscall.Umask(old)
	dir := t.TempDir()
	faulty.Put(t, filepath.Join(dir, "memo.md"), "old memo", 0o600)
	code, _, stderr := runIn(t, dir, "report", "--material", "demo-alloy", "--date", "2026-01-15", "--out", "memo.md")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	for name, want := range map[string]os.FileMode{"memo.md": 0o600, "memo-ttt.svg": 0o640} {
		info, err := os.Stat(filepath.Join(dir, name))
		if err != nil {
			t.Fatal(err)
		}
		if info.Mode().Perm() != want {
			t.Errorf("%s: mode %o, want %o", name, info.Mode().Perm(), want)
		}
	}
	if !strings.HasPrefix(faulty.Content(t, filepath.Join(dir, "memo.md")), "# Transformation estimate") {
		t.Error("the memo was not replaced")
	}
}

// Refused before any work, with exit 2, the file untouched and nothing
// left behind: a read-only file, and an output that is also an input
// (a measured curve, a card, a table the card names).
func TestRefusedOutputs(t *testing.T) {
	dir := t.TempDir()
	curve, err := os.ReadFile("../../testdata/curves/demo-quench.csv")
	if err != nil {
		t.Fatal(err)
	}
	faulty.Put(t, filepath.Join(dir, "q.csv"), string(curve), 0o644)
	faulty.Put(t, filepath.Join(dir, "ro.svg"), "read-only", 0o444)
	card := "name = \"own\"\nkind = \"demo\"\ndescription = \"invented for this test\"\ndriving = \"table\"\ndriving_table = \"dg.csv\"\n" +
		"[values]\nte = { value = \"1000 K\", source = \"invented for this test\" }\n"
	faulty.Put(t, filepath.Join(dir, "my.toml"), card, 0o644)
	faulty.Put(t, filepath.Join(dir, "dg.csv"), "temperature_k,dg_j_per_mol\n900,100\n1000,0\n", 0o644)
	faulty.Put(t, filepath.Join(dir, "d.csv"), "temperature_c,diffusivity_m2_per_s\n500,1e-14\n600,1e-13\n", 0o644)
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"report", "--material", "demo-alloy", "--curve", "q.csv", "--out", "q.csv"}, `^undercool: --out: cannot write q\.csv: it is also an input \(q\.csv\)`},
		{[]string{"report", "--material", "demo-alloy", "--curve", "./q.csv", "--out", "q.csv", "--plot", "x.svg"}, `^undercool: --out: cannot write q\.csv: it is also an input`},
		{[]string{"fit", "arrhenius", "d.csv", "--material", "my.toml", "--card-out", "my.toml"}, `^undercool: --card-out: cannot write my\.toml: it is also an input \(my\.toml\)`},
		{[]string{"report", "--material", "my.toml", "--out", "dg.csv"}, `^undercool: --out: cannot write dg\.csv: it is also an input \(.*dg\.csv\)`},
		{[]string{"ttt", "--material", "demo-alloy", "--plot", "ro.svg"}, `^undercool: --plot: cannot write ro\.svg: the file is read-only`},
		{[]string{"report", "--material", "demo-alloy", "--out", "x.md", "--plot", "x.md"}, `^undercool: --plot: "x\.md": the memo's plot is an SVG file`},
		{[]string{"report", "--material", "demo-alloy", "--out", "x-ttt.svg", "--plot", "x-ttt.svg"}, `already an output`},
	}
	before := faulty.Names(t, dir)
	for _, c := range cases {
		code, stdout, stderr := runIn(t, dir, c.args...)
		failed(t, code, stdout, stderr, 2, c.want)
	}
	if after := faulty.Names(t, dir); strings.Join(after, " ") != strings.Join(before, " ") {
		t.Errorf("files now %v, before %v", after, before)
	}
	if faulty.Content(t, filepath.Join(dir, "q.csv")) != string(curve) || faulty.Content(t, filepath.Join(dir, "ro.svg")) != "read-only" ||
		faulty.Content(t, filepath.Join(dir, "my.toml")) != card {
		t.Error("a refused file changed")
	}
}

// Every output path is checked before any work: a plot that cannot be
// written is reported at once, not after the computation (which here
// would itself fail, later, with another message).
func TestOutputsCheckedFirst(t *testing.T) {
	dir := t.TempDir()
	faulty.Put(t, filepath.Join(dir, "ro.svg"), "read-only", 0o444)
	code, stdout, stderr := runIn(t, dir, "ttt", "--material", "demo-alloy", "--range", "1300:1200", "--plot", "ro.svg")
	failed(t, code, stdout, stderr, 2, `^undercool: --plot: cannot write ro\.svg: the file is read-only`)
	if os.Geteuid() == 0 {
		return // a directory's mode does not stop root
	}
	ro := filepath.Join(dir, "ro")
	if err := os.Mkdir(ro, 0o555); err != nil {
		t.Fatal(err)
	}
	code, stdout, stderr = runIn(t, dir, "cool", "--material", "demo-alloy", "--critical", "--spread", "gamma=2%", "--samples", "1000000", "--plot", "ro/t.svg")
	failed(t, code, stdout, stderr, 2, `^undercool: --plot: cannot write ro/t\.svg: `)
}

// A name of 254 bytes is legal (the limit is 255); the temporary file
// beside it must not push it over.
func TestLongNames(t *testing.T) {
	dir := t.TempDir()
	for _, n := range []int{242, 250, 254} {
		memo := strings.Repeat("m", n-3) + ".md"
		plot := strings.Repeat("p", n-4) + ".svg"
		code, _, stderr := runIn(t, dir, "report", "--material", "demo-alloy", "--date", "2026-01-15", "--out", memo, "--plot", plot)
		if code != 0 {
			t.Errorf("%d bytes: exit %d: %s", n, code, stderr)
			continue
		}
		for _, f := range []string{memo, plot} {
			if _, err := os.Stat(filepath.Join(dir, f)); err != nil {
				t.Errorf("%d bytes: %v", n, err)
			}
		}
	}
	if len(faulty.Names(t, dir)) != 6 {
		t.Errorf("left behind: %v", faulty.Names(t, dir))
	}
}

// failNth puts a full disk behind the nth staged file of each run.
func failNth(t *testing.T, n int) {
	calls := 0
	stageWriter = func(w io.Writer) io.Writer {
		calls++
		if calls == n {
			return &faulty.Full{W: w, N: 100}
		}
		return w
	}
	t.Cleanup(func() { stageWriter = nil })
}

// The memo and its plot are one set: a disk that fills up while the memo is
// written (after the plot) keeps the old memo and the old plot, leaves no
// temporary file, exits 1 and names the memo, not the temporary file.
func TestFullDiskKeepsTheOldMemoAndPlot(t *testing.T) {
	dir := t.TempDir()
	faulty.Put(t, filepath.Join(dir, "memo.md"), "old memo", 0o644)
	faulty.Put(t, filepath.Join(dir, "memo-ttt.svg"), "old plot", 0o644)
	failNth(t, 2)
	code, stdout, stderr := runIn(t, dir, "report", "--material", "demo-alloy", "--out", "memo.md")
	failed(t, code, stdout, stderr, 1, `^undercool: --out: cannot write memo\.md: no space left on device$`)
	if faulty.Content(t, filepath.Join(dir, "memo.md")) != "old memo" || faulty.Content(t, filepath.Join(dir, "memo-ttt.svg")) != "old plot" {
		t.Error("the old memo or plot changed")
	}
	if got := faulty.Names(t, dir); len(got) != 2 {
		t.Errorf("left behind: %v", got)
	}
}

// A fit's plot and card are one set too: a full disk on the card keeps the
// old plot, and prints nothing.
func TestFullDiskKeepsTheOldFitFiles(t *testing.T) {
	dir := t.TempDir()
	faulty.Put(t, filepath.Join(dir, "fit.svg"), "old plot", 0o644)
	failNth(t, 2)
	repo, _ := filepath.Abs(repoRoot())
	code, stdout, stderr := runIn(t, dir, "fit", "arrhenius", filepath.Join(repo, "testdata/fit/diffusion.csv"), "--plot", "fit.svg", "--card-out", "fit.toml")
	failed(t, code, stdout, stderr, 1, `^undercool: --card-out: cannot write fit\.toml: no space left on device$`)
	if faulty.Content(t, filepath.Join(dir, "fit.svg")) != "old plot" {
		t.Error("the old plot changed")
	}
	if got := faulty.Names(t, dir); len(got) != 1 {
		t.Errorf("left behind: %v", got)
	}
}

// charDevice makes a private copy of /dev/full (character device 1, 7)
// in dir, where the system allows it.
func charDevice(t *testing.T, dir string) string {
	t.Helper()
	path := filepath.Join(dir, "full")
	if err := syscall.Mknod(path, syscall.S_IFCHR|0o666, 1<<8|7); err != nil {
		t.Skip("cannot make a device node:", err)
	}
	return path
}

// A device is written through, never replaced: a full one fails with exit
// 1 and stays a device; the null device takes the memo and the plot.
func TestDeviceOutput(t *testing.T) {
	dir := t.TempDir()
	dev := charDevice(t, dir)
	code, stdout, stderr := runIn(t, dir, "report", "--material", "demo-alloy", "--out", dev)
	failed(t, code, stdout, stderr, 1, `^undercool: --out: cannot write .*/full: no space left on device$`)
	if info, err := os.Lstat(dev); err != nil || info.Mode()&os.ModeCharDevice == 0 {
		t.Errorf("the device was replaced: %v %v", info.Mode(), err)
	}
	code, _, stderr = runIn(t, dir, "report", "--material", "demo-alloy", "--out", "/dev/null", "--plot", "p.svg")
	if code != 0 {
		t.Errorf("--out /dev/null: exit %d: %s", code, stderr)
	}
	if got := faulty.Names(t, dir); len(got) != 2 {
		t.Errorf("left behind: %v", got)
	}
}

// A named pipe is written through, and stays a pipe: its reader gets the
// memo. A pipe nobody reads is refused at once rather than waited on.
func TestNamedPipeOutput(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe.md")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skip("no named pipes:", err)
	}
	code, stdout, stderr := runIn(t, dir, "report", "--material", "demo-alloy", "--out", fifo)
	failed(t, code, stdout, stderr, 2, `^undercool: --out: cannot write .*pipe\.md: it is a named pipe that no program is reading$`)

	got := make(chan string, 1)
	opened := make(chan struct{})
	go func() {
		f, err := os.OpenFile(fifo, os.O_RDONLY|syscall.O_NONBLOCK, 0)
		close(opened)
		if err != nil {
			got <- err.Error()
			return
		}
		defer f.Close()
		var b bytes.Buffer
		deadline := time.Now().Add(30 * time.Second)
		buf := make([]byte, 4096)
		for time.Now().Before(deadline) {
			n, err := f.Read(buf)
			b.Write(buf[:n])
			if err == io.EOF && b.Len() > 0 {
				break
			}
			if n == 0 {
				time.Sleep(5 * time.Millisecond)
			}
		}
		got <- b.String()
	}()
	<-opened
	code, _, stderr = runIn(t, dir, "report", "--material", "demo-alloy", "--date", "2026-01-15", "--out", fifo, "--plot", "p.svg")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if s := <-got; !strings.HasPrefix(s, "# Transformation estimate: demo-alloy") {
		t.Errorf("the reader got %.80q", s)
	}
	if info, _ := os.Lstat(fifo); info.Mode()&os.ModeNamedPipe == 0 {
		t.Error("the pipe was replaced")
	}
}

// An interrupt while the memo is being written removes the staged files
// (the plot, complete, and the memo, half written), keeps the old ones,
// and ends with the shell's status for SIGINT. The child is this test
// binary running main, with a writer that stops in the memo.
func TestInterruptLeavesNoDebris(t *testing.T) {
	if dir := os.Getenv("UNDERCOOL_INTERRUPT_DIR"); dir != "" {
		calls := 0
		stageWriter = func(w io.Writer) io.Writer {
			calls++
			if calls < 2 {
				return w
			}
			return writerFunc(func(p []byte) (int, error) {
				w.Write(p[:1])
				os.Stdout.WriteString(faulty.Staged)
				time.Sleep(time.Minute)
				return 0, errors.New("not interrupted")
			})
		}
		if err := os.Chdir(dir); err != nil {
			os.Exit(3)
		}
		os.Args = []string{"undercool", "report", "--material", "demo-alloy", "--out", "memo.md"}
		main()
		return
	}
	dir := t.TempDir()
	faulty.Put(t, filepath.Join(dir, "memo.md"), "old memo", 0o644)
	faulty.Put(t, filepath.Join(dir, "memo-ttt.svg"), "old plot", 0o644)
	code := faulty.Interrupt(t, "TestInterruptLeavesNoDebris", "UNDERCOOL_INTERRUPT_DIR="+dir, func() {
		if got := faulty.Names(t, dir); len(got) != 4 {
			t.Errorf("while writing: %v, want the two files and two staged ones", got)
		}
	})
	if code != 130 {
		t.Errorf("child ended with status %d, want 130", code)
	}
	if got := faulty.Names(t, dir); len(got) != 2 {
		t.Errorf("left behind: %v", got)
	}
	if faulty.Content(t, filepath.Join(dir, "memo.md")) != "old memo" || faulty.Content(t, filepath.Join(dir, "memo-ttt.svg")) != "old plot" {
		t.Error("the old memo or plot changed")
	}
}

type writerFunc func([]byte) (int, error)

func (f writerFunc) Write(p []byte) (int, error) { return f(p) }
