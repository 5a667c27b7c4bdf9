//go:build !unix

package export

// openNoWait is 0 where the system has no non-blocking open; OpenRegular's
// check of the file type before opening is what keeps FIFOs out there.
const openNoWait = 0
