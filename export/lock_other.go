//go:build !unix

package export

import "os"

// lockFile is not available here: every lock is taken. Autosave then
// treats a backup whose owner may still run as left behind, as before
// per-instance locks.
func lockFile(*os.File) error { return nil }

func unlockFile(*os.File) {}
