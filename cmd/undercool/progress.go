package main

import (
	"fmt"
	"io"
	"os"
	"strings"
	"sync"
	"time"
)

// progress draws a bar on stderr for a run that lasts over a second, only
// when stderr is a terminal.
type progress struct {
	label string // what is counted; "" is "sampling"
	w     io.Writer
	on    bool
	start time.Time
	mu    sync.Mutex
	drawn bool
	last  time.Time
}

func newProgress(w io.Writer) *progress {
	p := &progress{w: w, start: time.Now()}
	if f, ok := w.(*os.File); ok {
		if fi, err := f.Stat(); err == nil && fi.Mode()&os.ModeCharDevice != 0 {
			p.on = true
		}
	}
	return p
}

func (p *progress) update(done, total int) {
	if !p.on {
		return
	}
	now := time.Now()
	if now.Sub(p.start) < time.Second {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.drawn && now.Sub(p.last) < 100*time.Millisecond && done < total {
		return
	}
	const width = 30
	n := width * done / total
	label := p.label
	if label == "" {
		label = "sampling"
	}
	fmt.Fprintf(p.w, "\rundercool: %s [%s%s] %d/%d", label, strings.Repeat("#", n), strings.Repeat(".", width-n), done, total)
	p.drawn, p.last = true, now
}

func (p *progress) finish() {
	if p.drawn {
		fmt.Fprintf(p.w, "\r%s\r", strings.Repeat(" ", 70))
	}
}
