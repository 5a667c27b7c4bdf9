// Command sectionbench-cli is Sectionbench without the window: the same
// engine, for scripts. Run it without arguments for help.
//
// Exit status: 0 on success, 2 for bad usage (an unknown command or flag, a
// malformed flag value), 1 for bad input (a file or study that cannot be
// used) or a failed solve.
package main

import (
	"os"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}
