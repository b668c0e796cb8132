package main

import (
	"io"
	"os"
	"path/filepath"
)

// writeFileAtomic writes a file whole or not at all: the content goes to a
// temporary file beside the target, which is renamed over it only when
// every byte has been written and synced.
func writeFileAtomic(path string, write func(io.Writer) error) error {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return usagef("cannot write %s: %v", path, unwrapPath(err))
	}
	name := tmp.Name()
	defer os.Remove(name) // no-op after a successful rename
	if err := write(tmp); err != nil {
		tmp.Close()
		return err
	}
	// CreateTemp makes the file private (0600); an output is an ordinary file.
	if err := tmp.Chmod(0o644); err != nil {
		tmp.Close()
		return placef("cannot write %s: %v", path, err)
	}
	if err := tmp.Sync(); err != nil {
		tmp.Close()
		return placef("cannot write %s: %v", path, err)
	}
	if err := tmp.Close(); err != nil {
		return placef("cannot write %s: %v", path, err)
	}
	if err := os.Rename(name, path); err != nil {
		return usagef("cannot write %s: %v", path, unwrapPath(err))
	}
	return nil
}

// unwrapPath strips the operation and path from an *os.PathError.
func unwrapPath(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	return err
}
