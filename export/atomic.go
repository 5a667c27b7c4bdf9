package export

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
)

// WriteFileAtomic writes a file so that a reader (or a crash) sees either
// the old content or the new, never a part: write runs on a temporary file
// in the same directory, which is synced and then renamed over path. If
// write fails, nothing at path changes and the temporary file is removed.
// A new file gets mode 0644; an existing file keeps its mode.
func WriteFileAtomic(path string, write func(io.Writer) error) (err error) {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	renamed := false
	defer func() {
		if !renamed { // also after a panic in write
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	if err = write(tmp); err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	if err = tmp.Sync(); err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	mode := os.FileMode(0o644)
	if fi, statErr := os.Stat(path); statErr == nil {
		mode = fi.Mode().Perm()
	}
	if err = tmp.Chmod(mode); err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	if err = os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("save %s: %w", path, err)
	}
	renamed = true
	// Sync the directory so the rename itself survives a crash; not every
	// file system supports it, so a failure here is not an error.
	if d, dirErr := os.Open(dir); dirErr == nil {
		d.Sync()
		d.Close()
	}
	return nil
}

// Errors of the file-type checks, wrapped in a *FileError.
var (
	// ErrNotRegular reports a path that is not a regular file where one is
	// read (a FIFO, device, socket or folder): opening a FIFO to read
	// would wait for a writer for ever.
	ErrNotRegular = errors.New("not a regular file")
	// ErrReadOnly reports an output path whose file may not be written.
	ErrReadOnly = errors.New("the file is read-only; it is left as it is")
	// ErrOwnInput reports an output path that is one of the command's own
	// inputs.
	ErrOwnInput = errors.New("this is one of the command's inputs; writing the output there would replace it")
	// ErrOutputKind reports an output path that cannot take a file: a
	// folder, a block device, a socket, or a link to nothing.
	ErrOutputKind = errors.New("cannot write a file there")
)

// fileKind names a file mode's type in words for messages.
func fileKind(m os.FileMode) string {
	switch {
	case m.IsDir():
		return "a folder"
	case m&os.ModeNamedPipe != 0:
		return "a named pipe (FIFO)"
	case m&os.ModeSocket != 0:
		return "a socket"
	case m&os.ModeCharDevice != 0:
		return "a character device"
	case m&os.ModeDevice != 0:
		return "a block device"
	case m&os.ModeSymlink != 0:
		return "a symbolic link"
	case m&os.ModeIrregular != 0:
		return "a special file"
	}
	return "a regular file"
}

// OpenRegular opens path for reading only if it is a regular file (after
// following symbolic links). It checks the type before opening and opens
// without waiting (O_NONBLOCK where the system has it), so a FIFO swapped
// in between the check and the open cannot hang the caller either; a
// non-regular file gives a *FileError wrapping ErrNotRegular. (The flag
// does not change how a regular file reads.)
func OpenRegular(path string) (*os.File, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, &FileError{Path: path, Err: pathCause(err)}
	}
	if !fi.Mode().IsRegular() {
		return nil, &FileError{Path: path, Err: fmt.Errorf("%w: it is %s", ErrNotRegular, fileKind(fi.Mode()))}
	}
	f, err := os.OpenFile(path, os.O_RDONLY|openNoWait, 0)
	if err != nil {
		return nil, &FileError{Path: path, Err: pathCause(err)}
	}
	if fi, err = f.Stat(); err != nil || !fi.Mode().IsRegular() {
		f.Close()
		if err == nil {
			err = fmt.Errorf("%w: it is %s", ErrNotRegular, fileKind(fi.Mode()))
		}
		return nil, &FileError{Path: path, Err: err}
	}
	return f, nil
}

// WriteOutput writes a command's output file at path, deciding by what is
// there already:
//
//   - nothing: the file is written atomically (WriteFileAtomic);
//   - a regular file: replaced atomically, unless it is read-only (no write
//     permission bit, or it cannot be opened for writing), which is
//     refused with ErrReadOnly even where the caller could override it;
//   - a character device (/dev/null, a terminal) or a FIFO: written
//     through, in place, never replaced by a regular file;
//   - a symbolic link: followed deliberately; the rules above apply to its
//     final target, which is replaced or written while the link stays; a
//     link to nothing is refused (ErrOutputKind);
//   - a folder, block device or socket: refused (ErrOutputKind).
//
// Before anything is written, path is compared with every one of inputs
// (the files the command read; "" entries are skipped): if it is the same
// file, the write is refused with ErrOwnInput. Errors are *FileError.
func WriteOutput(path string, write func(io.Writer) error, inputs ...string) error {
	return writeTarget(path, write, true, inputs)
}

// WriteRegularFile is WriteOutput for a file the program keeps (a study):
// only a new or a writable regular file (or a link to one) is written, and
// atomically; a device, FIFO or any other kind is refused (ErrOutputKind)
// rather than written through.
func WriteRegularFile(path string, write func(io.Writer) error) error {
	return writeTarget(path, write, false, nil)
}

func writeTarget(path string, write func(io.Writer) error, through bool, inputs []string) error {
	target := path
	li, err := os.Lstat(path)
	switch {
	case errors.Is(err, os.ErrNotExist):
		return WriteFileAtomic(path, write)
	case err != nil:
		return &FileError{Path: path, Err: err}
	}
	fi := li
	if li.Mode()&os.ModeSymlink != 0 {
		if target, err = filepath.EvalSymlinks(path); err != nil {
			return &FileError{Path: path, Err: fmt.Errorf("%w: it is a symbolic link that leads to no file", ErrOutputKind)}
		}
		if fi, err = os.Stat(target); err != nil {
			return &FileError{Path: path, Err: err}
		}
	}
	for _, in := range inputs {
		if in == "" {
			continue
		}
		if ii, err := os.Stat(in); err == nil && os.SameFile(ii, fi) {
			return &FileError{Path: path, Err: fmt.Errorf("%w (%s)", ErrOwnInput, in)}
		}
	}
	m := fi.Mode()
	switch {
	case m.IsRegular():
		if m.Perm()&0o222 == 0 {
			return &FileError{Path: path, Err: ErrReadOnly}
		}
		f, err := os.OpenFile(target, os.O_WRONLY, 0) // no O_TRUNC: only asks
		if err != nil {
			if errors.Is(err, os.ErrPermission) {
				return &FileError{Path: path, Err: ErrReadOnly}
			}
			return &FileError{Path: path, Err: err}
		}
		f.Close()
		return WriteFileAtomic(target, write)
	case through && (m&os.ModeCharDevice != 0 || m&os.ModeNamedPipe != 0):
		f, err := os.OpenFile(target, os.O_WRONLY, 0)
		if err != nil {
			return &FileError{Path: path, Err: err}
		}
		err = write(f)
		if cerr := f.Close(); err == nil {
			err = cerr
		}
		if err != nil {
			return &FileError{Path: path, Err: err}
		}
		return nil
	}
	return &FileError{Path: path, Err: fmt.Errorf("%w: it is %s", ErrOutputKind, fileKind(m))}
}

// ReadRegular reads a regular file of at most limit bytes (OpenRegular's
// checks; larger files are refused with ErrFileTooLarge without reading).
func ReadRegular(path string, limit int64) ([]byte, error) { return readLimited(path, limit) }

// pathCause returns the cause inside an *fs.PathError ("no such file or
// directory", "permission denied"), without the system call's name that
// its message starts with ("stat x: …"); FileError names the path. Other
// errors are returned as they are. errors.Is(…, fs.ErrNotExist) holds as
// before.
func pathCause(err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}
