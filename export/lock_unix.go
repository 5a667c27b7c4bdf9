//go:build unix

package export

import (
	"errors"
	"os"
	"syscall"
)

// lockFile takes flock(2)'s exclusive lock without waiting. flock locks
// belong to the open file, so two opens in one process exclude each other
// too, and the kernel drops the lock when the process ends.
func lockFile(f *os.File) error {
	err := syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB)
	if errors.Is(err, syscall.EWOULDBLOCK) {
		return ErrLocked
	}
	return err
}

func unlockFile(f *os.File) { syscall.Flock(int(f.Fd()), syscall.LOCK_UN) }
