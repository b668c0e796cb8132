package outfile

import (
	"context"
	"errors"
	"io"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"syscall"
	"testing"
	"time"

	"undercool/cmd/undercool/internal/faulty"
)

func text(s string) func(io.Writer) error {
	return func(w io.Writer) error { _, err := io.WriteString(w, s); return err }
}

// debris lists files of dir that are not in want.
func debris(t *testing.T, dir string, want ...string) []string {
	t.Helper()
	var extra []string
	for _, name := range faulty.Names(t, dir) {
		if !slices.Contains(want, name) {
			extra = append(extra, name)
		}
	}
	return extra
}

func TestNewFileHonoursUmask(t *testing.T) {
	old := syscall.Umask(0o027)
	defer syscall.Umask(old)
	dir := t.TempDir()
	path := filepath.Join(dir, "out.csv")
	var b Batch
	if err := b.Add(path, text("a,b\n")); err != nil {
		t.Fatal(err)
	}
	if err := b.Commit(); err != nil {
		t.Fatal(err)
	}
	info, _ := os.Stat(path)
	if got := info.Mode().Perm(); got != 0o640 {
		t.Errorf("mode %o, want 0640 (0666 less umask 027)", got)
	}
	if extra := debris(t, dir, "out.csv"); extra != nil {
		t.Errorf("left behind %v", extra)
	}
}

func TestExistingFileKeepsMode(t *testing.T) {
	dir := t.TempDir()
	for _, perm := range []os.FileMode{0o600, 0o755, 0o664} {
		path := filepath.Join(dir, "memo.md")
		faulty.Put(t, path, "old", perm)
		var b Batch
		if err := b.Add(path, text("new")); err != nil {
			t.Fatal(err)
		}
		if err := b.Commit(); err != nil {
			t.Fatal(err)
		}
		info, _ := os.Stat(path)
		if info.Mode().Perm() != perm || faulty.Content(t, path) != "new" {
			t.Errorf("perm %o: got mode %o content %q", perm, info.Mode().Perm(), faulty.Content(t, path))
		}
	}
}

func TestRefusedTargets(t *testing.T) {
	dir := t.TempDir()
	ro := filepath.Join(dir, "ro.md")
	faulty.Put(t, ro, "keep", 0o444)
	in := filepath.Join(dir, "q.csv")
	faulty.Put(t, in, "time_s,temperature_k\n", 0o644)
	link := filepath.Join(dir, "link.csv")
	if err := os.Symlink(in, link); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		path, want string
	}{
		{ro, "read-only"},
		{dir, "is a directory"},
		{filepath.Join(dir, "no", "such.md"), "directory"},
		{in, "also an input"},
		{link, "also an input"},
		{filepath.Join(dir, ".", "q.csv"), "also an input"},
		{"", "empty file name"},
	}
	for _, c := range cases {
		var b Batch
		if err := b.Input(in); err != nil {
			t.Fatal(err)
		}
		err := b.Check(c.path)
		var oe *Error
		if !errors.As(err, &oe) || !oe.Usage || !strings.Contains(err.Error(), c.want) {
			t.Errorf("Check(%q) = %v, want a usage error saying %q", c.path, err, c.want)
		}
	}
	if faulty.Content(t, ro) != "keep" || faulty.Content(t, in) != "time_s,temperature_k\n" {
		t.Error("a refused target changed")
	}
	var b Batch
	out := filepath.Join(dir, "out.svg")
	if err := b.Check(out); err != nil {
		t.Fatal(err)
	}
	if err := b.Check(filepath.Join(dir, "x", "..", "out.svg")); err == nil || !strings.Contains(err.Error(), "already an output") {
		t.Errorf("the same output twice: %v", err)
	}
}

// A full disk while the second of two files is written: both old files
// stay as they were, nothing is left behind, and the error names the
// user's path, never the temporary one.
func TestFullDiskKeepsTheOldSet(t *testing.T) {
	dir := t.TempDir()
	memo, plot := filepath.Join(dir, "memo.md"), filepath.Join(dir, "memo-ttt.svg")
	faulty.Put(t, memo, "old memo", 0o644)
	faulty.Put(t, plot, "old plot", 0o644)
	calls := 0
	b := Batch{Wrap: func(f io.Writer) io.Writer {
		calls++
		if calls == 2 {
			return &faulty.Full{W: f, N: 3}
		}
		return f
	}}
	defer b.Discard()
	if err := b.Add(plot, text("new plot")); err != nil {
		t.Fatal(err)
	}
	err := b.Add(memo, text("new memo, longer than three bytes"))
	var oe *Error
	if !errors.As(err, &oe) || oe.Usage {
		t.Fatalf("got %v, want a write failure", err)
	}
	if msg := err.Error(); !strings.Contains(msg, memo) || strings.Contains(msg, ".uc-") || !strings.Contains(msg, "no space left") {
		t.Errorf("message %q: want the user's path and the reason, not the temporary name", msg)
	}
	b.Discard()
	if faulty.Content(t, memo) != "old memo" || faulty.Content(t, plot) != "old plot" {
		t.Error("the old files changed")
	}
	if extra := debris(t, dir, "memo.md", "memo-ttt.svg"); extra != nil {
		t.Errorf("left behind %v", extra)
	}
}

// An input named after its output was checked is refused too: the order
// in which a command learns of its files does not matter.
func TestInputAfterCheck(t *testing.T) {
	dir := t.TempDir()
	card := filepath.Join(dir, "my.toml")
	faulty.Put(t, card, "name = \"x\"", 0o644)
	var b Batch
	if err := b.Check(card); err != nil {
		t.Fatal(err)
	}
	if err := b.Input(filepath.Join(dir, "no-such.csv")); err != nil {
		t.Errorf("a missing input: %v", err)
	}
	err := b.Input(filepath.Join(dir, ".", "my.toml"))
	var oe *Error
	if !errors.As(err, &oe) || !oe.Usage || oe.Path != card || !strings.Contains(err.Error(), "also an input") {
		t.Errorf("Input after Check = %v, want a usage error naming %s", err, card)
	}
	if faulty.Content(t, card) != "name = \"x\"" {
		t.Error("the input changed")
	}
}

func TestLinkStaysALink(t *testing.T) {
	dir := t.TempDir()
	real := filepath.Join(dir, "real.md")
	faulty.Put(t, real, "old", 0o640)
	link := filepath.Join(dir, "link.md")
	if err := os.Symlink("real.md", link); err != nil {
		t.Fatal(err)
	}
	var b Batch
	if err := b.Add(link, text("new")); err != nil {
		t.Fatal(err)
	}
	if err := b.Commit(); err != nil {
		t.Fatal(err)
	}
	if info, _ := os.Lstat(link); info.Mode()&os.ModeSymlink == 0 {
		t.Error("the link was replaced by a file")
	}
	if faulty.Content(t, real) != "new" {
		t.Error("the linked file was not written")
	}
}

// A name of 250 bytes is legal; the temporary name must not push it over.
func TestLongName(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, strings.Repeat("n", 246)+".svg")
	var b Batch
	if err := b.Add(path, text("<svg/>")); err != nil {
		t.Fatal(err)
	}
	if err := b.Commit(); err != nil {
		t.Fatal(err)
	}
	if faulty.Content(t, path) != "<svg/>" {
		t.Error("not written")
	}
}

// A device is written through, never replaced: /dev/full fails as a
// write failure and stays a device.
func TestDeviceWrittenThrough(t *testing.T) {
	if _, err := os.Stat("/dev/full"); err != nil {
		t.Skip("no /dev/full")
	}
	var b Batch
	if err := b.Add("/dev/full", text("memo")); err != nil {
		t.Fatal(err)
	}
	err := b.Commit()
	var oe *Error
	if !errors.As(err, &oe) || oe.Usage || !strings.Contains(err.Error(), "/dev/full") {
		t.Errorf("got %v, want a write failure naming /dev/full", err)
	}
	if info, _ := os.Stat("/dev/full"); info.Mode()&os.ModeCharDevice == 0 {
		t.Error("/dev/full is no longer a device")
	}
	b = Batch{}
	if err := b.Add("/dev/null", text("memo")); err != nil {
		t.Fatal(err)
	}
	if err := b.Commit(); err != nil {
		t.Errorf("/dev/null: %v", err)
	}
}

func TestNamedPipe(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skip("no named pipes:", err)
	}
	// Nobody reads: refused at once, no hang.
	var b Batch
	if err := b.Add(fifo, text("x")); err != nil {
		t.Fatal(err)
	}
	err := b.Commit()
	var oe *Error
	if !errors.As(err, &oe) || !oe.Usage || !strings.Contains(err.Error(), "no program is reading") {
		t.Errorf("unread pipe: %v", err)
	}
	// A reader gets the content, and the pipe stays a pipe.
	got := make(chan string)
	go func() {
		f, err := os.Open(fifo)
		if err != nil {
			got <- err.Error()
			return
		}
		defer f.Close()
		b, _ := io.ReadAll(f)
		got <- string(b)
	}()
	b = Batch{}
	if err := b.Add(fifo, text("hello")); err != nil {
		t.Fatal(err)
	}
	// The reader must have opened its end before the writer opens.
	deadline := time.Now().Add(5 * time.Second)
	for {
		err = b.Commit()
		if err == nil || time.Now().After(deadline) {
			break
		}
		b.through = append(b.through[:0], through{fifo, []byte("hello")})
		time.Sleep(10 * time.Millisecond)
	}
	if err != nil {
		t.Fatal(err)
	}
	if s := <-got; s != "hello" {
		t.Errorf("reader got %q", s)
	}
	if info, _ := os.Lstat(fifo); info.Mode()&os.ModeNamedPipe == 0 {
		t.Error("the pipe was replaced")
	}
}

// An interrupt while a file is staged removes it: a child process stages
// a file, says so, and is sent SIGINT.
func TestInterruptRemovesStaged(t *testing.T) {
	if dir := os.Getenv("OUTFILE_CHILD_DIR"); dir != "" {
		RemoveOnSignal()
		var b Batch
		if err := b.Add(filepath.Join(dir, "memo.md"), text("new")); err != nil {
			os.Exit(3)
		}
		os.Stdout.WriteString(faulty.Staged)
		time.Sleep(time.Minute)
		os.Exit(4)
	}
	dir := t.TempDir()
	faulty.Put(t, filepath.Join(dir, "memo.md"), "old", 0o644)
	code := faulty.Interrupt(t, "TestInterruptRemovesStaged", "OUTFILE_CHILD_DIR="+dir, func() {
		if extra := debris(t, dir, "memo.md"); len(extra) != 1 {
			t.Errorf("expected one staged file, found %v", extra)
		}
	})
	if code != 130 {
		t.Errorf("child ended with status %d, want 130", code)
	}
	if extra := debris(t, dir, "memo.md"); extra != nil {
		t.Errorf("left behind %v", extra)
	}
	if faulty.Content(t, filepath.Join(dir, "memo.md")) != "old" {
		t.Error("the old memo changed")
	}
}

// A run that stops on an interrupt by itself (NotifyContext) gets the
// first interrupt through its context, and ends by its own path: here it
// discards its staged file and exits with status 7.
func TestInterruptGoesToTheRun(t *testing.T) {
	if dir := os.Getenv("OUTFILE_RUN_DIR"); dir != "" {
		RemoveOnSignal()
		ctx, stop := NotifyContext(context.Background())
		defer stop()
		var b Batch
		if err := b.Add(filepath.Join(dir, "memo.md"), text("new")); err != nil {
			os.Exit(3)
		}
		os.Stdout.WriteString(faulty.Staged)
		select {
		case <-ctx.Done():
			b.Discard()
			os.Exit(7)
		case <-time.After(time.Minute):
			os.Exit(4)
		}
	}
	dir := t.TempDir()
	faulty.Put(t, filepath.Join(dir, "memo.md"), "old", 0o644)
	code := faulty.Interrupt(t, "TestInterruptGoesToTheRun", "OUTFILE_RUN_DIR="+dir, func() {})
	if code != 7 {
		t.Errorf("child ended with status %d, want 7 (its own path)", code)
	}
	if extra := debris(t, dir, "memo.md"); extra != nil {
		t.Errorf("left behind %v", extra)
	}
}
