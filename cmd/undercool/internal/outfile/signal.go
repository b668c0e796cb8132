package outfile

import (
	"os"
	"os/signal"
	"syscall"
)

// RemoveOnSignal arranges that an interrupt (SIGINT, SIGTERM, SIGHUP)
// removes every staged file and then ends the process with the shell's
// status for that signal (128 + its number). A rename under way finishes
// first, so a set of files is never left half replaced.
func RemoveOnSignal() {
	c := make(chan os.Signal, 1)
	signal.Notify(c, syscall.SIGINT, syscall.SIGTERM, syscall.SIGHUP)
	go func() {
		s := <-c
		RemoveStaged()
		code := 1
		if n, ok := s.(syscall.Signal); ok {
			code = 128 + int(n)
		}
		os.Exit(code)
	}()
}
