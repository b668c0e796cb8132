package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"sort"
	"strings"

	"github.com/spf13/pflag"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}

// env is what a command may touch: its streams and its arguments.
type env struct {
	stdin          io.Reader
	stdout, stderr io.Writer
	notes          []string // printed on stderr once the command succeeds
}

// note keeps a one-line remark for stderr: the result stands, but the
// user may have meant something else. A command that fails prints only
// its error line, so notes appear only with a result.
func (e *env) note(format string, a ...any) {
	e.notes = append(e.notes, fmt.Sprintf("undercool: note: "+format+"\n", a...))
}

// command is one subcommand: its flags are set up by setup, its work done by run.
type command struct {
	summary string
	usage   string // "undercool rate [flags]"
	example string
	setup   func(fs *pflag.FlagSet) func(e *env, args []string) error
}

// commands is filled by each command's file in an init function.
var commands = map[string]*command{}

// usageError is bad usage or bad input: exit status 2.
type usageError struct{ msg string }

func (e *usageError) Error() string { return e.msg }

func usagef(format string, a ...any) error { return &usageError{fmt.Sprintf(format, a...)} }

// exitCode maps an error to the exit status: 2 for bad input, 1 for a failed computation.
func exitCode(err error) int {
	var u *usageError
	if errors.As(err, &u) {
		return 2
	}
	return 1
}

func commandNames() []string {
	var names []string
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	return names
}

// run is the whole program; it returns the exit status.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	fail := func(err error) int {
		msg := strings.ReplaceAll(err.Error(), "\n", " ")
		fmt.Fprintf(stderr, "undercool: %s\n", msg)
		return exitCode(err)
	}
	if len(args) == 0 {
		fmt.Fprint(stderr, manual())
		return 2
	}
	name := args[0]
	switch name {
	case "-h", "--help", "help":
		if len(args) > 1 && commands[args[1]] != nil {
			// "undercool help rate" is "undercool rate --help".
			return run([]string{args[1], "--help"}, stdin, stdout, stderr)
		}
		fmt.Fprint(stdout, manual())
		return 0
	}
	cmd, ok := commands[name]
	if !ok {
		return fail(usagef("unknown command %q (commands: %s; see undercool --help)", name, strings.Join(commandNames(), ", ")))
	}
	fs := pflag.NewFlagSet(name, pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.SortFlags = false
	do := cmd.setup(fs)
	if err := fs.Parse(args[1:]); err != nil {
		if errors.Is(err, pflag.ErrHelp) {
			fmt.Fprintf(stdout, "%s\n\n%s\n\nFlags:\n%s\nExample:\n  %s\n", cmd.usage, cmd.summary, fs.FlagUsages(), cmd.example)
			return 0
		}
		return fail(usagef("%s: %v (see undercool %s --help)", name, err, name))
	}
	e := &env{stdin: stdin, stdout: stdout, stderr: stderr}
	if err := do(e, fs.Args()); err != nil {
		return fail(err)
	}
	for _, n := range e.notes {
		fmt.Fprint(stderr, n)
	}
	return 0
}
