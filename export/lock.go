package export

import (
	"errors"
	"os"
)

// Lock is an exclusive lock on a file, held by one running program (one
// app window's autosave) for as long as it lives. The system drops the
// lock when the holder ends, even by a crash, so a lock that can be taken
// tells that its previous holder is gone.
type Lock struct {
	path string
	f    *os.File
}

// ErrLocked reports a lock held by a running program.
var ErrLocked = errors.New("in use by a running program")

// TryLock takes the lock on path, creating the file if needed, without
// waiting: a lock another holder has (another process, or another Lock in
// this one) gives ErrLocked.
func TryLock(path string) (*Lock, error) {
	f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE, 0o600)
	if err != nil {
		return nil, err
	}
	if err := lockFile(f); err != nil {
		f.Close()
		return nil, err
	}
	return &Lock{path: path, f: f}, nil
}

// Path returns the lock file's path.
func (l *Lock) Path() string { return l.path }

// Release gives the lock up and closes the file; the file stays.
func (l *Lock) Release() {
	if l == nil || l.f == nil {
		return
	}
	unlockFile(l.f)
	l.f.Close()
	l.f = nil
}

// Remove removes the lock file, then gives the lock up: another program
// taking it in between finds its file gone and tries again.
func (l *Lock) Remove() {
	if l == nil || l.f == nil {
		return
	}
	os.Remove(l.path)
	l.Release()
}
