// Package outfile writes the files a command produces so that nothing is
// lost: a set of files written together is replaced whole or not at all.
//
// A regular file (or a path where nothing exists yet) is staged: its content
// goes to a temporary file beside it, and only when every file of the set is
// staged are they renamed over their targets, one after the other. An
// existing file keeps its permission bits; a new one gets 0666 less the
// umask, as any program's output does. A target that is not a regular file
// (a terminal, /dev/stdout, a named pipe, a device) cannot be replaced
// without destroying it, so its content is written through to it instead.
//
// Refused before any work: a target that is a directory, a read-only file,
// a file in a directory that does not exist or cannot be written, a target
// that is also one of the command's inputs, and the same target twice.
package outfile

import (
	"bytes"
	"crypto/rand"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"sync"
	"syscall"
)

// Error is a path that cannot be written. Usage is true when the path
// itself is wrong (a missing directory, a read-only file, an input given
// as output): the user must choose another; false when writing failed
// (a full disk, an I/O error).
type Error struct {
	Path  string // the path as the user gave it
	Msg   string
	Usage bool
}

func (e *Error) Error() string { return fmt.Sprintf("cannot write %s: %s", e.Path, e.Msg) }

func usageErr(path, format string, a ...any) error {
	return &Error{Path: path, Msg: fmt.Sprintf(format, a...), Usage: true}
}

func failed(path string, err error) error {
	return &Error{Path: path, Msg: Reason(err)}
}

// Reason is an error without the operation and path an *os.PathError adds
// (they would name the temporary file, not the user's path).
func Reason(err error) string {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		err = pe.Err
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		err = le.Err
	}
	return err.Error()
}

// Batch is a set of output files written together. Register the inputs
// and Check every target first (before the work that fills them), in
// either order, then Add each file's content, then Commit. Discard (safe
// to defer) removes whatever is still staged.
type Batch struct {
	// Wrap, when not nil, stands between the content and each staged
	// file: where a test puts a writer that fails as a full disk does.
	Wrap func(io.Writer) io.Writer

	inputs  []file
	targets map[string]file // by cleaned path; info nil for a new file
	staged  []*staged
	through []through
}

// file is a path as the user gave it, and what it was when registered.
type file struct {
	path string
	info os.FileInfo
}

// staged is a complete temporary file waiting to be renamed over its target.
type staged struct {
	path   string // as given
	target string // the real file to replace (symbolic links resolved)
	tmp    string
}

// through is content for a target that is not a regular file.
type through struct {
	path string
	data []byte
}

// Input records a file the command reads, so that no output replaces it:
// a target already checked that is the same file is refused here, one
// checked later by Check. A path that does not exist (or "-") is ignored:
// it is the reader's business to say so.
func (b *Batch) Input(path string) error {
	if path == "" || path == "-" {
		return nil
	}
	info, err := os.Stat(path)
	if err != nil {
		return nil
	}
	for _, t := range b.targets {
		if t.info != nil && os.SameFile(info, t.info) {
			return alsoInput(t.path, path)
		}
	}
	b.inputs = append(b.inputs, file{path, info})
	return nil
}

func alsoInput(target, input string) error {
	return usageErr(target, "it is also an input (%s); write the output to another file", input)
}

// Check refuses a target that cannot be written, before any work is done.
// The path "-" is standard output and always accepted.
func (b *Batch) Check(path string) error {
	if path == "-" {
		return nil
	}
	if path == "" {
		return usageErr(path, "empty file name")
	}
	key := filepath.Clean(path)
	if b.targets == nil {
		b.targets = map[string]file{}
	}
	if first, ok := b.targets[key]; ok {
		return usageErr(path, "the same file is already an output (%s)", first.path)
	}
	info, err := os.Stat(path)
	switch {
	case err == nil:
		for _, in := range b.inputs {
			if os.SameFile(info, in.info) {
				return alsoInput(path, in.path)
			}
		}
		if info.IsDir() {
			return usageErr(path, "it is a directory")
		}
		if !info.Mode().IsRegular() {
			b.targets[key] = file{path, info}
			return nil // written through
		}
		if info.Mode().Perm()&0o222 == 0 {
			return usageErr(path, "the file is read-only; remove it or make it writable first")
		}
	case errors.Is(err, fs.ErrNotExist):
		// A new file: its directory must exist and take files.
	default:
		return usageErr(path, "%s", Reason(err))
	}
	target := resolve(path)
	dir := filepath.Dir(target)
	st, err := os.Stat(dir)
	if err != nil {
		return usageErr(path, "directory %s: %s", filepath.Dir(path), Reason(err))
	}
	if !st.IsDir() {
		return usageErr(path, "%s is not a directory", filepath.Dir(path))
	}
	probe, _, err := createTemp(dir, 0o600)
	if err != nil {
		return usageErr(path, "%s", Reason(err))
	}
	name := probe.Name()
	probe.Close()
	os.Remove(name)
	b.targets[key] = file{path, info}
	return nil
}

// resolve follows symbolic links to the file that would really be
// replaced, so that a link stays a link. A path that cannot be resolved
// (a dangling link) is returned as given.
func resolve(path string) string {
	if real, err := filepath.EvalSymlinks(path); err == nil {
		return real
	}
	return path
}

// Add stages one file: write fills it. A regular target gets a complete
// temporary file beside it; any other target is kept in memory and
// written through on Commit. On failure nothing of the target changes.
// Add checks the path first if Check has not seen it.
func (b *Batch) Add(path string, write func(io.Writer) error) error {
	if _, ok := b.targets[filepath.Clean(path)]; !ok {
		if err := b.Check(path); err != nil {
			return err
		}
	}
	if info, err := os.Stat(path); err == nil && !info.Mode().IsRegular() {
		var buf bytes.Buffer
		if err := write(&buf); err != nil {
			return err
		}
		b.through = append(b.through, through{path, buf.Bytes()})
		return nil
	}
	target := resolve(path)
	perm := os.FileMode(0o666) // less the umask, applied by the system
	keep := false
	if info, err := os.Stat(target); err == nil {
		perm, keep = info.Mode().Perm(), true
	}
	f, name, err := createTemp(filepath.Dir(target), perm)
	if err != nil {
		return failed(path, err)
	}
	s := &staged{path: path, target: target, tmp: name}
	register(name)
	ok := false
	defer func() {
		if !ok {
			f.Close()
			unregister(name, true)
		}
	}()
	var w io.Writer = f
	if b.Wrap != nil {
		w = b.Wrap(f)
	}
	if err := write(w); err != nil {
		var pe *fs.PathError
		if errors.As(err, &pe) || errors.Is(err, syscall.ENOSPC) || errors.Is(err, syscall.EIO) {
			return failed(path, err)
		}
		return err
	}
	if keep {
		// Permission bits of the file being replaced, which the umask
		// would otherwise have trimmed.
		if err := f.Chmod(perm); err != nil {
			return failed(path, err)
		}
	}
	if err := f.Sync(); err != nil {
		return failed(path, err)
	}
	if err := f.Close(); err != nil {
		return failed(path, err)
	}
	ok = true
	b.staged = append(b.staged, s)
	return nil
}

// Commit writes through to the targets that are not regular files, then
// renames every staged file over its target in turn. Once renaming begins
// an interrupt waits for it to finish, so the set is replaced whole.
func (b *Batch) Commit() error {
	for _, t := range b.through {
		if err := writeThrough(t.path, t.data); err != nil {
			b.Discard()
			return err
		}
	}
	b.through = nil
	live.Lock()
	defer live.Unlock()
	for i, s := range b.staged {
		if err := os.Rename(s.tmp, s.target); err != nil {
			for _, rest := range b.staged[i:] {
				os.Remove(rest.tmp)
				delete(live.names, rest.tmp)
			}
			b.staged = nil
			return failed(s.path, err)
		}
		delete(live.names, s.tmp)
	}
	syncDirs(b.staged)
	b.staged = nil
	return nil
}

// Discard removes every staged file; the targets stay as they were.
func (b *Batch) Discard() {
	for _, s := range b.staged {
		unregister(s.tmp, true)
	}
	b.staged, b.through = nil, nil
}

// writeThrough writes data to a target that is not a regular file. A named
// pipe nobody reads is refused rather than waited on.
func writeThrough(path string, data []byte) error {
	flag := os.O_WRONLY
	if info, err := os.Stat(path); err == nil && info.Mode()&fs.ModeNamedPipe != 0 {
		flag |= syscall.O_NONBLOCK
	}
	f, err := os.OpenFile(path, flag, 0)
	if err != nil {
		if errors.Is(err, syscall.ENXIO) {
			return usageErr(path, "it is a named pipe that no program is reading")
		}
		return failed(path, err)
	}
	_, err = f.Write(data)
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		return failed(path, err)
	}
	return nil
}

// syncDirs makes the renames durable; a failure here loses nothing that
// the renames have not already made visible, so it is not reported.
func syncDirs(files []*staged) {
	seen := map[string]bool{}
	for _, s := range files {
		dir := filepath.Dir(s.target)
		if seen[dir] {
			continue
		}
		seen[dir] = true
		if d, err := os.Open(dir); err == nil {
			d.Sync()
			d.Close()
		}
	}
}

// createTemp makes a new file with a short random name (".uc-" and eight
// hex digits) in dir, so that a target name near the file-system limit
// still leaves room for it.
func createTemp(dir string, perm os.FileMode) (*os.File, string, error) {
	for range 100 {
		var r [4]byte
		if _, err := rand.Read(r[:]); err != nil {
			return nil, "", err
		}
		name := filepath.Join(dir, ".uc-"+hex.EncodeToString(r[:]))
		f, err := os.OpenFile(name, os.O_RDWR|os.O_CREATE|os.O_EXCL, perm)
		if errors.Is(err, fs.ErrExist) {
			continue
		}
		return f, name, err
	}
	return nil, "", errors.New("no free temporary name")
}

// live holds the staged files of this process, for RemoveStaged.
var live = struct {
	sync.Mutex
	names map[string]bool
}{names: map[string]bool{}}

func register(name string) {
	live.Lock()
	live.names[name] = true
	live.Unlock()
}

func unregister(name string, remove bool) {
	live.Lock()
	if remove {
		os.Remove(name)
	}
	delete(live.names, name)
	live.Unlock()
}

// RemoveStaged removes every staged file of the process; a signal handler
// calls it before the process exits. It waits for a Commit under way.
func RemoveStaged() {
	live.Lock()
	defer live.Unlock()
	for name := range live.names {
		os.Remove(name)
		delete(live.names, name)
	}
}
