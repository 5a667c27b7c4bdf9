package session

import (
	"fmt"
	"log"
	"runtime/debug"
)

// InternalError turns a value recovered from a panic into the error the
// window shows, and logs the panic with its whole stack on the standard
// logger (stderr), so that a report of it carries the trace and not only
// the status line's first line. where says what was running ("in the
// solver", "drawing pressure"); it may be empty. Call it from the deferred
// function that recovered, so the stack is the panicking goroutine's.
func InternalError(where string, r any) error {
	if where != "" {
		where = " " + where
	}
	log.Printf("sectionbench: internal error%s: %v\n%s", where, r, debug.Stack())
	return fmt.Errorf("internal error%s: %v (the details are in the log; please report them)", where, r)
}
