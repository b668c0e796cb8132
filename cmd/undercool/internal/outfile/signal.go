package outfile

import (
	"context"
	"os"
	"os/signal"
	"sync"
	"syscall"
)

// interrupts are the signals RemoveOnSignal handles.
var interrupts = []os.Signal{syscall.SIGINT, syscall.SIGTERM, syscall.SIGHUP}

// handler is the state of RemoveOnSignal: whether it is installed, and the
// contexts of the runs that stop on an interrupt by themselves.
var handler = struct {
	sync.Mutex
	installed bool
	runs      map[*int]context.CancelFunc
}{runs: map[*int]context.CancelFunc{}}

// RemoveOnSignal arranges that an interrupt (SIGINT, SIGTERM, SIGHUP)
// removes every staged file and then ends the process with the shell's
// status for that signal (128 + its number). A rename under way finishes
// first, so a set of files is never left half replaced.
//
// A run that stops by itself takes the interrupt through NotifyContext:
// the first interrupt cancels its context instead, and the run returns by
// its own error path (where its staged files are discarded); a second
// interrupt ends the process as above.
func RemoveOnSignal() {
	c := make(chan os.Signal, 1)
	signal.Notify(c, interrupts...)
	handler.Lock()
	handler.installed = true
	handler.Unlock()
	go func() {
		for s := range c {
			if cancelRuns() {
				continue
			}
			RemoveStaged()
			code := 1
			if n, ok := s.(syscall.Signal); ok {
				code = 128 + int(n)
			}
			os.Exit(code)
		}
	}()
}

// cancelRuns cancels the runs waiting for an interrupt, once each, and
// reports whether there were any.
func cancelRuns() bool {
	handler.Lock()
	defer handler.Unlock()
	for key, cancel := range handler.runs {
		cancel()
		delete(handler.runs, key)
		return true
	}
	return false
}

// NotifyContext returns a context that an interrupt cancels, for a run
// that stops on it by itself; stop releases it. Where RemoveOnSignal is
// installed the interrupt goes to the context alone (the first one: see
// RemoveOnSignal); elsewhere, as in a test that calls the command
// in-process, it is signal.NotifyContext.
func NotifyContext(parent context.Context) (ctx context.Context, stop context.CancelFunc) {
	handler.Lock()
	defer handler.Unlock()
	if !handler.installed {
		return signal.NotifyContext(parent, interrupts...)
	}
	ctx, cancel := context.WithCancel(parent)
	key := new(int)
	handler.runs[key] = cancel
	return ctx, func() {
		handler.Lock()
		delete(handler.runs, key)
		handler.Unlock()
		cancel()
	}
}
