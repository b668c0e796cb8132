package presets

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
)

// Limits on what is read from a user's files, so that a wrong file (a
// device, a log, an endless stream such as /dev/zero) is refused at once
// rather than read until memory runs out. The shipped cards are under
// 10 KiB and nest 3 deep; a measured curve of a day at 10 Hz is under a
// million rows.
const (
	MaxCardBytes = 4 << 20   // a material card: 4 MiB
	MaxCardDepth = 16        // arrays, inline tables and dotted keys inside each other in a card
	MaxDataBytes = 64 << 20  // a data file or table (a curve, fit data, a Δg or solubility table): 64 MiB
	MaxDataRows  = 1_000_000 // data rows of a data file or table
	MaxLineBytes = 64 << 10  // a line of a data file or table: 64 KiB
)

// LimitError is a file beyond one of the limits on what is read.
type LimitError struct {
	File string
	Msg  string // "larger than the 64 MiB a data file may be"
}

func (e *LimitError) Error() string { return e.File + ": " + e.Msg }

func tooLarge(file string, limit int, what string) *LimitError {
	return &LimitError{file, fmt.Sprintf("larger than the %d MiB %s may be", limit>>20, what)}
}

// What a limitedReader returns past its limits.
var (
	errTooLarge    = errors.New("too large")
	errLineTooLong = errors.New("line too long")
)

// limitedReader reads at most n bytes of r and then fails if r has more,
// where io.LimitReader would end quietly; with line > 0 it fails too on a
// line longer than line bytes, the lines-th (from 0) of r.
type limitedReader struct {
	r     io.Reader
	n     int64
	line  int // 0: no limit
	run   int // bytes of the line being read
	lines int // newlines read
}

func (l *limitedReader) Read(p []byte) (int, error) {
	if l.n <= 0 {
		var b [1]byte
		for {
			k, err := l.r.Read(b[:])
			switch {
			case k > 0:
				return 0, errTooLarge
			case err != nil:
				return 0, err
			}
		}
	}
	if int64(len(p)) > l.n {
		p = p[:l.n]
	}
	n, err := l.r.Read(p)
	l.n -= int64(n)
	if l.line > 0 {
		for chunk := p[:n]; ; {
			i := bytes.IndexByte(chunk, '\n')
			if i < 0 {
				l.run += len(chunk)
				break
			}
			if l.run+i > l.line {
				return 0, errLineTooLong
			}
			l.run, l.lines, chunk = 0, l.lines+1, chunk[i+1:]
		}
		if l.run > l.line {
			return 0, errLineTooLong
		}
	}
	return n, err
}

// ReadFile reads the file at path, at most max bytes of it: a larger one
// (or a device that never ends) is a *LimitError naming it as what ("a
// card"); an error opening or reading it is the *os.PathError.
func ReadFile(path string, max int, what string) ([]byte, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return readAll(f, max, path, what)
}

// readAll reads all of r, failing with a *LimitError past max bytes.
func readAll(r io.Reader, max int, file, what string) ([]byte, error) {
	data, err := io.ReadAll(&limitedReader{r: r, n: int64(max)})
	if errors.Is(err, errTooLarge) {
		return nil, tooLarge(file, max, what)
	}
	return data, err
}

// checkDepth refuses a card nested more than MaxCardDepth deep: arrays and
// inline tables inside each other, or a key of more than MaxCardDepth
// dotted parts, counted outside strings and comments. The TOML decoder
// takes time that grows with the square of the depth (10,000 inline
// tables inside each other take half a minute and gigabytes), and a card
// needs a depth of 3.
func checkDepth(data []byte, file string) error {
	depth, dots, line := 0, 0, 1
	for i := 0; i < len(data); i++ {
		switch c := data[i]; c {
		case '\n':
			line++
			dots = 0
		case '#':
			for i+1 < len(data) && data[i+1] != '\n' {
				i++
			}
		case '"', '\'':
			var n int
			i, n = skipString(data, i)
			line += n
		case '[', '{':
			depth++
			dots = 0
		case ']', '}':
			depth = max(0, depth-1)
			dots = 0
		case '=', ',':
			dots = 0
		case '.':
			dots++
		}
		if depth > MaxCardDepth || dots >= MaxCardDepth {
			return &LimitError{fmt.Sprintf("%s:%d", file, line), fmt.Sprintf("nested more than %d deep (tables, arrays or dotted keys inside each other); a card needs 3", MaxCardDepth)}
		}
	}
	return nil
}

// skipString returns the index of the last byte of the TOML string that
// opens at data[i] (a basic or literal string, on one line or three-quoted
// over several) and the newlines inside it. An unterminated string runs to
// the end of its line (one-line) or of the data; the decoder says what is
// wrong with it.
func skipString(data []byte, i int) (end, newlines int) {
	q := data[i]
	basic := q == '"'
	if i+2 < len(data) && data[i+1] == q && data[i+2] == q {
		for j := i + 3; j < len(data); j++ {
			switch {
			case data[j] == '\n':
				newlines++
			case basic && data[j] == '\\':
				if j+1 < len(data) && data[j+1] == '\n' {
					newlines++
				}
				j++
			case data[j] == q && j+2 < len(data) && data[j+1] == q && data[j+2] == q:
				return j + 2, newlines
			}
		}
		return len(data) - 1, newlines
	}
	for j := i + 1; j < len(data); j++ {
		switch {
		case data[j] == '\n':
			return j - 1, 0
		case basic && data[j] == '\\':
			j++
		case data[j] == q:
			return j, 0
		}
	}
	return len(data) - 1, 0
}
