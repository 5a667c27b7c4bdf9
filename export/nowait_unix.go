//go:build unix

package export

import "syscall"

// openNoWait makes an open return at once instead of waiting for the other
// end of a FIFO.
const openNoWait = syscall.O_NONBLOCK
