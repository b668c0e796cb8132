// Package faulty holds what the tests of written files share: a writer
// that fails as a full disk does, and helpers that make, read and list
// files, failing the test on any error.
package faulty

import (
	"bufio"
	"errors"
	"io"
	"os"
	"os/exec"
	"syscall"
	"testing"
)

// Full passes N bytes to W and then fails with ENOSPC, as a full disk
// does, naming a temporary file as the system would.
type Full struct {
	W io.Writer
	N int
}

func (f *Full) Write(p []byte) (int, error) {
	if len(p) > f.N {
		k, _ := f.W.Write(p[:f.N])
		f.N = 0
		return k, &os.PathError{Op: "write", Path: ".uc-0badf00d", Err: syscall.ENOSPC}
	}
	f.N -= len(p)
	return f.W.Write(p)
}

// Put writes a file with its permission bits (set after writing, so that
// the umask does not trim them).
func Put(t testing.TB, path, content string, perm os.FileMode) {
	t.Helper()
	if err := os.WriteFile(path, []byte(content), perm); err != nil {
		t.Fatal(err)
	}
	if err := os.Chmod(path, perm); err != nil {
		t.Fatal(err)
	}
}

// Content is what a file holds.
func Content(t testing.TB, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// Names lists the entries of dir, sorted.
func Names(t testing.TB, dir string) []string {
	t.Helper()
	ents, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, e := range ents {
		out = append(out, e.Name())
	}
	return out
}

// Staged is the line a child process writes on its standard output once
// it holds staged files, waiting to be interrupted.
const Staged = "staged\n"

// Interrupt runs the test named test again in a child process of this
// test binary, with the environment variable env (NAME=VALUE) that tells
// it to be the child; waits until the child writes Staged; calls during,
// to look at the files while it waits; sends it SIGINT; and returns its
// exit status.
func Interrupt(t testing.TB, test, env string, during func()) int {
	t.Helper()
	cmd := exec.Command(os.Args[0], "-test.run=^"+test+"$")
	cmd.Env = append(os.Environ(), env)
	out, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	if line, _ := bufio.NewReader(out).ReadString('\n'); line != Staged {
		cmd.Process.Kill()
		cmd.Wait()
		t.Fatalf("child said %q", line)
	}
	during()
	cmd.Process.Signal(syscall.SIGINT)
	err = cmd.Wait()
	var ee *exec.ExitError
	if !errors.As(err, &ee) {
		t.Fatalf("child ended with %v", err)
	}
	return ee.ExitCode()
}
