package answer

// Names says how the caller names an input it took (the command line: its
// flag, "--end"), for the hints an answer gives; nil names an input by its
// own name.
type Names func(input string) string

func (n Names) of(input string) string {
	if n == nil {
		return input
	}
	return n(input)
}
