package main

import (
	"io"
	"os"
	"strconv"
	"strings"
)

// Screen widths, in characters.
const (
	defaultWidth = 100 // a screen that does not say its own: a file, a pipe
	minWidth     = 40  // the narrowest a table is fitted to
)

// screenWidth is the width the text of a terminal table is fitted to:
// $COLUMNS when it holds a number, else the width of the terminal w writes
// to, else defaultWidth; never less than minWidth.
func screenWidth(w io.Writer) int {
	n, err := strconv.Atoi(strings.TrimSpace(os.Getenv("COLUMNS")))
	if err != nil || n <= 0 {
		n = defaultWidth
		if f, ok := w.(*os.File); ok {
			if t := terminalWidth(f); t > 0 {
				n = t
			}
		}
	}
	return max(n, minWidth)
}
