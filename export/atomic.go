package export

import (
	"fmt"
	"io"
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
