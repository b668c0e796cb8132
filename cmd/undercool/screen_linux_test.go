//go:build linux

package main

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"strings"
	"testing"
	"unicode/utf8"

	"golang.org/x/sys/unix"
)

// TestTerminalWidth: on a terminal of 72 columns, with no $COLUMNS, the
// table is fitted to 72 characters (the width is read from the real
// standard output, not from the buffer the command writes into).
func TestTerminalWidth(t *testing.T) {
	t.Setenv("COLUMNS", "")
	master, err := os.OpenFile("/dev/ptmx", os.O_RDWR, 0)
	if err != nil {
		t.Skipf("no pseudo-terminal here: %v", err)
	}
	defer master.Close()
	if err := unix.IoctlSetPointerInt(int(master.Fd()), unix.TIOCSPTLCK, 0); err != nil {
		t.Skipf("cannot unlock the pseudo-terminal: %v", err)
	}
	n, err := unix.IoctlGetInt(int(master.Fd()), unix.TIOCGPTN)
	if err != nil {
		t.Skipf("no pseudo-terminal number: %v", err)
	}
	tty, err := os.OpenFile(fmt.Sprintf("/dev/pts/%d", n), os.O_RDWR|unix.O_NOCTTY, 0)
	if err != nil {
		t.Skipf("cannot open the terminal: %v", err)
	}
	if err := unix.IoctlSetWinsize(int(tty.Fd()), unix.TIOCSWINSZ, &unix.Winsize{Row: 24, Col: 72}); err != nil {
		t.Fatal(err)
	}
	var got bytes.Buffer
	done := make(chan struct{})
	go func() { io.Copy(&got, master); close(done) }()
	var stderr bytes.Buffer
	code := run([]string{"rate", "--material", "demo-alloy", "--temps", "900K,800K"}, nil, tty, &stderr)
	tty.Close()
	<-done
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr.String())
	}
	widest := 0
	for _, l := range strings.Split(strings.ReplaceAll(got.String(), "\r", ""), "\n") {
		widest = max(widest, utf8.RuneCountInString(l))
	}
	if widest > 72 || widest < 60 {
		t.Errorf("widest line %d characters on a 72-column terminal; want at most 72 and near it:\n%s", widest, got.String())
	}
}
