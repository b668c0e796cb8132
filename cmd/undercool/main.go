package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"sort"
	"strings"

	"github.com/spf13/pflag"

	"undercool/cmd/undercool/internal/outfile"
	"undercool/presets"
	"undercool/presets/answer"
)

func main() {
	outfile.RemoveOnSignal() // an interrupt leaves no staged file behind
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}

// env is what a command may touch: its streams, its files and its arguments.
type env struct {
	stdin          io.Reader
	stdout, stderr io.Writer // stdout is held until the command's files are written
	width          int       // of the screen the tables are fitted to (screenWidth of the real stdout)
	files          files
	notes          []string // printed on stderr once the command succeeds
	finish         []func() // run when the command returns (a progress bar clears its line)
}

// note keeps a one-line remark for stderr: the result stands, but the
// user may have meant something else. A command that fails prints only
// its error line, so notes appear only with a result.
func (e *env) note(format string, a ...any) {
	e.notes = append(e.notes, fmt.Sprintf("undercool: note: "+format+"\n", a...))
}

// command is one subcommand: setup declares its flags and returns the
// work, run once the flags are parsed.
type command struct {
	summary string
	usage   string // "undercool rate [flags]"
	example string
	setup   func(fs *pflag.FlagSet, e *env) func(args []string) error
}

// commands is filled by each command's file in an init function.
var commands = map[string]*command{}

// usageError is bad usage or bad input: exit status 2.
type usageError struct{ err error }

func (e *usageError) Error() string { return e.err.Error() }
func (e *usageError) Unwrap() error { return e.err }

func usagef(format string, a ...any) error { return &usageError{fmt.Errorf(format, a...)} }

// usage marks an error of the input as bad usage.
func usage(err error) error { return &usageError{err} }

// placed is a failed computation that names its place, a flag or a file,
// rather than the command: a figure that cannot be drawn, a file that
// cannot be written.
type placed struct{ msg string }

func (e *placed) Error() string { return e.msg }

func placef(format string, a ...any) error { return &placed{fmt.Sprintf(format, a...)} }

// explain turns an error into the one line the user reads, and its exit
// status: the errors of the library that carry an input's name (a missing
// card value, an input that does not fit, a data file) are bad input and
// name the flag that gives it; a failed computation names its place (a
// flag, a file) or else the command. This is the one place a key becomes
// a flag, and the one rule for how a message begins.
func explain(cmd string, err error) (string, int) {
	var (
		missing *presets.MissingError
		input   *answer.InputError
		data    *answer.BadData
		many    *answer.TooManyError
		draws   *answer.SamplingError
		u       *usageError
		p       *placed
		f       *fileError
		stopped *interrupted
	)
	switch {
	case errors.As(err, &stopped):
		return err.Error(), 130
	case errors.As(err, &f):
		if f.err.Usage {
			return f.Error(), 2
		}
		return f.Error(), 1
	case errors.As(err, &input):
		return fmt.Sprintf("%s: %v", flagNames(input.Input), input.Err), 2
	case errors.As(err, &many):
		return fmt.Sprintf("--samples: %v; use fewer samples or fewer rows", many), 2
	case errors.As(err, &draws):
		return fmt.Sprintf("--spread: %v", draws), 2
	case errors.As(err, &missing):
		return fmt.Sprintf("%v; give it in the card or with %s", err, flagNames(missing.Key)), 2
	case errors.As(err, &data), errors.As(err, &u):
		return err.Error(), 2
	case errors.As(err, &p):
		return err.Error(), 1
	}
	return cmd + ": " + err.Error(), 1
}

func commandNames() []string {
	var names []string
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	return names
}

// run is the whole program; it returns the exit status. Its tables are
// fitted to the screen stdout writes to (screenWidth).
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	return runWidth(screenWidth(stdout), args, stdin, stdout, stderr)
}

// runWidth is run with the tables and help fitted to width characters.
func runWidth(width int, args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	fail := func(msg string, code int) int {
		fmt.Fprintf(stderr, "undercool: %s\n", strings.ReplaceAll(msg, "\n", " "))
		return code
	}
	if len(args) == 0 {
		fmt.Fprint(stderr, manual())
		return 2
	}
	name := args[0]
	switch name {
	case "--version", "version":
		fmt.Fprintln(stdout, buildVersion())
		return 0
	case "-h", "--help", "help":
		if len(args) > 1 && commands[args[1]] != nil {
			// "undercool help rate" is "undercool rate --help".
			return runWidth(width, []string{args[1], "--help"}, stdin, stdout, stderr)
		}
		fmt.Fprint(stdout, manual())
		return 0
	}
	cmd, ok := commands[name]
	if !ok {
		return fail(fmt.Sprintf("unknown command %q (commands: %s; see undercool --help)", name, strings.Join(commandNames(), ", ")), 2)
	}
	fs := pflag.NewFlagSet(name, pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.SortFlags = false
	var out bytes.Buffer
	e := &env{stdin: stdin, stdout: &out, stderr: stderr, width: width}
	do := cmd.setup(fs, e)
	if err := fs.Parse(args[1:]); err != nil {
		var bad *pflag.InvalidValueError
		var v *valueError
		switch {
		case errors.Is(err, pflag.ErrHelp):
			printHelp(stdout, width, name, cmd, fs, args[1:])
			return 0
		case errors.As(err, &bad) && errors.As(err, &v):
			return fail(fmt.Sprintf("--%s: %v", bad.GetFlag().Name, v), 2)
		}
		return fail(fmt.Sprintf("%s: %v (see undercool %s --help)", name, err, name), 2)
	}
	// Every temperature written without a unit is kelvin: say how it was
	// read, beside the result, or inside the error it may have caused.
	var bare []string
	fs.Visit(func(f *pflag.Flag) {
		if b, ok := f.Value.(bareTemps); ok && len(b.bareKelvin()) > 0 {
			bare = append(bare, bareNote(f.Name, b.bareKelvin()))
			e.note("%s", bare[len(bare)-1])
		}
	})
	// Every file the flags name is checked before any work; the files are
	// written only once the command has succeeded, and its output printed
	// only once they are.
	err := e.files.register(fs)
	if err == nil {
		err = do(fs.Args())
	}
	for _, f := range e.finish {
		f()
	}
	if err == nil {
		err = e.files.commit()
	}
	if err != nil {
		e.files.discard()
		msg, code := explain(name, err)
		if len(bare) > 0 {
			msg += " (note: " + strings.Join(bare, "; ") + ")"
		}
		return fail(msg, code)
	}
	if _, err := stdout.Write(out.Bytes()); err != nil {
		return fail("cannot write the standard output: "+outfile.Reason(err), 1)
	}
	for _, n := range e.notes {
		fmt.Fprint(stderr, n)
	}
	return 0
}

// noArgs rejects arguments to a command that takes none.
func noArgs(name string, args []string) error {
	if len(args) > 0 {
		return usagef("%s: unexpected argument %q", name, args[0])
	}
	return nil
}
