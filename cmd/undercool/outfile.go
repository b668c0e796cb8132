package main

import (
	"errors"
	"io"

	"github.com/spf13/pflag"

	"undercool/cmd/undercool/internal/outfile"
)

// files are what a command reads and writes, one outfile.Batch: run
// registers the inputs and checks the outputs its flags name before any
// work, so that a path that cannot be written costs nothing; a command
// registers the files it learns of later (a data file argument, the tables
// a card names) before it computes, stages each output as it is made, and
// run commits them together once the command has succeeded, or discards
// them. An output is never also an input.
type files struct {
	batch outfile.Batch
	flags map[string]string // an output's path as given → the flag that names it
}

// stageWriter, when not nil, stands between the content and every staged
// file: tests put a writer there that fails as a full disk does.
var stageWriter func(io.Writer) io.Writer

// fileFlag is a flag that names a file; run hands it the command's files
// before any work, to register it as an input or check it as an output.
type fileFlag interface {
	register(name string, f *files) error
}

// register gives every file flag of fs the command's files.
func (f *files) register(fs *pflag.FlagSet) error {
	var err error
	fs.VisitAll(func(fl *pflag.Flag) {
		if v, ok := fl.Value.(fileFlag); ok && err == nil {
			err = v.register(fl.Name, f)
		}
	})
	return err
}

// input registers a file the command reads.
func (f *files) input(path string) error { return f.explain(f.batch.Input(path)) }

// output checks a file the command will write, named by a flag.
func (f *files) output(flag, path string) error {
	if f.flags == nil {
		f.flags = map[string]string{}
	}
	f.flags[path] = flag
	return f.explain(f.batch.Check(path))
}

// write stages the content of an output.
func (f *files) write(path string, write func(io.Writer) error) error {
	f.batch.Wrap = stageWriter
	return f.explain(f.batch.Add(path, write))
}

func (f *files) commit() error { return f.explain(f.batch.Commit()) }
func (f *files) discard()      { f.batch.Discard() }

// fileError is an output that cannot be written, with the flag that names it.
type fileError struct {
	flag string
	err  *outfile.Error
}

func (e *fileError) Error() string {
	if e.flag == "" {
		return e.err.Error()
	}
	return "--" + e.flag + ": " + e.err.Error()
}

func (e *fileError) Unwrap() error { return e.err }

// explain names the flag of an output that cannot be written.
func (f *files) explain(err error) error {
	var oe *outfile.Error
	if errors.As(err, &oe) {
		return &fileError{f.flags[oe.Path], oe}
	}
	return err
}

// pathFlag is a flag naming a file the command reads (or, output, writes).
type pathFlag struct {
	given
	output bool
	isPath func(string) bool // nil: every value is a path
	files  *files            // the command's files, once run has registered them
}

func (f *pathFlag) Set(s string) error { f.given = given{true, s}; return nil }

func (f *pathFlag) register(name string, fl *files) error {
	f.files = fl
	switch {
	case !f.set || (f.isPath != nil && !f.isPath(f.text)):
		return nil
	case f.output:
		return fl.output(name, f.text)
	}
	return fl.input(f.text)
}

// addInput declares a flag naming a file the command reads.
func addInput(fs *pflag.FlagSet, name, help string) *pathFlag {
	f := &pathFlag{}
	fs.Var(f, name, help)
	return f
}

// addOutput declares a flag naming a file the command writes.
func addOutput(fs *pflag.FlagSet, name, help string) *pathFlag {
	f := &pathFlag{output: true}
	fs.Var(f, name, help)
	return f
}
