package main

import (
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"runtime/debug"
	"strconv"
	"strings"
)

// Exit codes.
const (
	exitOK    = 0
	exitInput = 1
	exitUsage = 2
)

// usageError marks a problem with the command line itself.
type usageError struct{ msg string }

func (e *usageError) Error() string { return e.msg }

func usagef(format string, a ...any) error { return &usageError{fmt.Sprintf(format, a...)} }

type command struct {
	name, summary string
	run           func(args []string, stdout, stderr io.Writer) error
}

func commands() []command {
	return []command{
		{"solve", "solve one angle of attack and print the coefficients and surface Cp", cmdSolve},
		{"sweep", "solve a range of angles of attack (the polar)", cmdSweep},
		{"clean", "clean a coordinate file and print what was changed", cmdClean},
		{"density", "density study: the answer against panel count, extrapolated", cmdDensity},
		{"report", "the team report as PDF", cmdReport},
		{"export", "coordinates, CSV tables, manufacturing outlines (DXF, SVG) and figures", cmdExport},
		{"map", "downforce, drag and separation over one or two set-up variables (ride height, angle, flap settings, speed)", cmdMap},
		{"search", "the flap and ride-height setting with the most downforce, the best lift-to-drag or the least drag, within bounds", cmdSearch},
		{"bench", "median times of the solver's stages, for comparing builds and machines", cmdBench},
	}
}

const overview = `sectionbench-cli — two-dimensional wing sections with a linear-strength vortex
panel method, without the window.

Usage:
  sectionbench-cli COMMAND [flags]

Commands:
%s
Section specs (--section):
  naca:DIGITS        a NACA 4- or 5-digit section, e.g. naca:2412, naca:23012
                     (also written as the designation: naca2412, "NACA 2412")
  kt:CX,CY,TAU       the Kármán–Trefftz family: circle centre and trailing-edge
                     angle in degrees, e.g. kt:-0.1,0.1,10 (exact solution known)
  PATH               a coordinate file (cleaned on loading; see 'clean')

Results are 2-D estimates: potential flow, plus with --re a viscous solution
whose boundary layers and wakes act back on the flow (or, with
--viscous-mode estimate, a one-way boundary-layer estimate); a viscous point
that did not converge is shown as such, without numbers. Validate by test.
Structural design and mounting of a wing follow the competition's rules and
qualified engineering review.

Run 'sectionbench-cli COMMAND -h' for a command's flags.
`

func printOverview(w io.Writer) {
	var b strings.Builder
	for _, c := range commands() {
		fmt.Fprintf(&b, "  %-8s %s\n", c.name, c.summary)
	}
	fmt.Fprintf(w, overview, b.String())
}

// run executes one command line and returns the exit status. Every error
// is printed as one line on stderr (an internal error adds its trace);
// nothing panics on user input.
func run(args []string, stdout, stderr io.Writer) (code int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "sectionbench-cli: internal error: %v (please report it with the command line and the trace below)\n%s", r, debug.Stack())
			code = exitInput
		}
	}()
	if len(args) == 0 || args[0] == "-h" || args[0] == "--help" || args[0] == "help" {
		printOverview(stdout)
		if len(args) == 0 {
			return exitUsage
		}
		return exitOK
	}
	for _, c := range commands() {
		if c.name != args[0] {
			continue
		}
		err := c.run(args[1:], stdout, stderr)
		var ue *usageError
		switch {
		case err == nil:
			return exitOK
		case errors.Is(err, flag.ErrHelp):
			return exitOK
		case errors.As(err, &ue):
			fmt.Fprintf(stderr, "sectionbench-cli %s: %v\n", c.name, err)
			return exitUsage
		default:
			fmt.Fprintf(stderr, "sectionbench-cli %s: %v\n", c.name, err)
			return exitInput
		}
	}
	fmt.Fprintf(stderr, "sectionbench-cli: unknown command %q (want one of %s)\n", args[0], commandNames())
	return exitUsage
}

func commandNames() string {
	var n []string
	for _, c := range commands() {
		n = append(n, c.name)
	}
	return strings.Join(n, ", ")
}

// flags is a command's flag set with the writer its help goes to.
type flags struct {
	*flag.FlagSet
	usage string
	help  io.Writer
}

// newFlags returns a flag set that reports errors instead of exiting.
func newFlags(name, usage string, help io.Writer) *flags {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	return &flags{FlagSet: fs, usage: usage, help: help}
}

// Float64Var defines a number flag read strictly as a decimal number:
// the flag package's own would take "1_0" as 10 and "0x1p3" as 8.
func (fs *flags) Float64Var(p *float64, name string, value float64, usage string) {
	*p = value
	fs.Var(decimalFlag{p}, name, usage)
}

// Float64 is Float64Var returning the variable.
func (fs *flags) Float64(name string, value float64, usage string) *float64 {
	p := new(float64)
	fs.Float64Var(p, name, value, usage)
	return p
}

// decimalFlag is a float64 flag that accepts plain decimal numbers only.
type decimalFlag struct{ p *float64 }

func (f decimalFlag) String() string {
	if f.p == nil {
		return "0"
	}
	return strconv.FormatFloat(*f.p, 'g', -1, 64)
}

func (f decimalFlag) Set(s string) error {
	t := strings.ToLower(strings.TrimSpace(s))
	if strings.ContainsAny(t, "_") || strings.Contains(t, "0x") {
		return errors.New("not a plain decimal number")
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil {
		return errors.New("not a number")
	}
	*f.p = v
	return nil
}

// parse parses args and turns flag-package errors into usage errors; flags
// may follow positional arguments, of which at most positional are allowed.
func (fs *flags) parse(args []string, positional int) ([]string, error) {
	err := fs.Parse(args)
	if errors.Is(err, flag.ErrHelp) {
		fmt.Fprintf(fs.help, "Usage: sectionbench-cli %s\n\nFlags:\n", fs.usage)
		fs.SetOutput(fs.help)
		fs.PrintDefaults()
		return nil, err
	}
	if err != nil {
		return nil, usagef("%v", err)
	}
	// Allow flags after positional arguments (clean IN -o OUT).
	rest := fs.Args()
	var pos []string
	for len(rest) > 0 {
		pos = append(pos, rest[0])
		if err := fs.Parse(rest[1:]); err != nil {
			return nil, usagef("%v", err)
		}
		rest = fs.Args()
	}
	if len(pos) > positional {
		return nil, usagef("unexpected argument %q", pos[positional])
	}
	return pos, nil
}

// writeJSON writes v as indented JSON, the form every command's
// --format json prints.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}
