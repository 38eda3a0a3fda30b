package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"sort"
	"strings"
	"time"

	"duosweep/engine"
	"duosweep/engine/planners"
	"duosweep/projects"
)

// Exit statuses.
const (
	exitOK      = 0
	exitFailure = 1 // the input was fine but the work failed (e.g. writing the output)
	exitUsage   = 2 // bad input: unknown subcommand or flag, missing or invalid file, unknown planner or model
	exitPanic   = 3 // a bug: a panic turned into an error line
)

const progName = "duosweep-cli"

// command is one subcommand. Add one in its own file with
//
//	func init() { register(command{name: "x", args: "…", summary: "…", run: runX}) }
//
// run gets the arguments after the subcommand name; it returns a usage error
// (exit 2) for bad input, or a failure (exit 1) made with failf.
type command struct {
	name    string
	args    string // argument synopsis for the usage text, e.g. "SCENARIO [--json]"
	summary string // one line
	run     func(e *env, args []string) error
}

var commands = map[string]command{}

// register adds a subcommand; it panics on a duplicate name (a programmer error).
func register(c command) {
	if _, dup := commands[c.name]; dup {
		panic(progName + ": subcommand registered twice: " + c.name)
	}
	commands[c.name] = c
}

// env is what a subcommand runs with.
type env struct {
	ctx    context.Context
	stdout io.Writer
	stderr io.Writer
	name   string // the subcommand name
}

// failure marks an error that is not the user's input (exit 1).
type failure struct{ err error }

func (f failure) Error() string { return f.err.Error() }
func (f failure) Unwrap() error { return f.err }

func failf(format string, args ...any) error { return failure{fmt.Errorf(format, args...)} }

// errHelp asks for the subcommand usage on stdout and exit 0.
var errHelp = flag.ErrHelp

func run(args []string, stdout, stderr io.Writer) int {
	return runContext(context.Background(), args, stdout, stderr)
}

func runContext(ctx context.Context, args []string, stdout, stderr io.Writer) (code int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(stderr, "%s: internal error (please report): %s\n", progName, oneLine(fmt.Sprint(r)))
			code = exitPanic
		}
	}()
	if len(args) == 0 {
		usage(stderr)
		return exitUsage
	}
	name := args[0]
	switch name {
	case "help", "-h", "-help", "--help":
		if len(args) > 1 {
			if c, ok := commands[args[1]]; ok {
				commandUsage(stdout, c, nil)
				return exitOK
			}
			fmt.Fprintf(stderr, "%s: help: %q: unknown subcommand (see %s help)\n", progName, args[1], progName)
			return exitUsage
		}
		usage(stdout)
		return exitOK
	}
	c, ok := commands[name]
	if !ok {
		fmt.Fprintf(stderr, "%s: %q: unknown subcommand (see %s help)\n", progName, name, progName)
		return exitUsage
	}
	e := &env{ctx: ctx, stdout: stdout, stderr: stderr, name: name}
	err := c.run(e, args[1:])
	switch {
	case err == nil:
		return exitOK
	case errors.Is(err, errHelp):
		commandUsage(stdout, c, nil)
		return exitOK
	}
	fmt.Fprintf(stderr, "%s %s: %s\n", progName, name, oneLine(err.Error()))
	var f failure
	if errors.As(err, &f) {
		return exitFailure
	}
	return exitUsage
}

func oneLine(s string) string {
	return strings.Join(strings.Fields(s), " ")
}

func usage(w io.Writer) {
	fmt.Fprintf(w, "%s plans and evaluates two-person sweeps of tree-shaped sites.\n\n", progName)
	fmt.Fprintf(w, "Usage: %s SUBCOMMAND [ARGUMENTS]\n\nSubcommands:\n", progName)
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		c := commands[n]
		fmt.Fprintf(w, "  %s %s\n      %s\n", c.name, c.args, c.summary)
	}
	fmt.Fprintf(w, "  help [SUBCOMMAND]\n      this text, or the flags of one subcommand\n")
	fmt.Fprintf(w, "\nModels: radio, face-to-face. Planners: %s.\n", plannerList())
	fmt.Fprintf(w, "Exit status: 0 done, 1 failed, 2 bad input.\n\n%s\n", projects.Disclaimer)
}

func commandUsage(w io.Writer, c command, fs *flag.FlagSet) {
	fmt.Fprintf(w, "Usage: %s %s %s\n\n%s\n", progName, c.name, c.args, c.summary)
	if fs == nil {
		fs = flagsOf(c)
	}
	if fs != nil {
		fmt.Fprintf(w, "\nFlags:\n")
		fs.SetOutput(w)
		fs.PrintDefaults()
	}
}

// flagSets holds each subcommand's flag definitions for help output; a
// subcommand fills it through newFlags.
var flagSets = map[string]func() *flag.FlagSet{}

func flagsOf(c command) *flag.FlagSet {
	if mk, ok := flagSets[c.name]; ok {
		return mk()
	}
	return nil
}

// newFlags returns a silent flag set for a subcommand (errors are reported by run).
func newFlags(name string) *flag.FlagSet {
	fs := flag.NewFlagSet(progName+" "+name, flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	return fs
}

// parseArgs parses flags placed anywhere among the arguments and returns the
// positional arguments; it checks their number against min and max.
func parseArgs(fs *flag.FlagSet, args []string, min, max int, names string) ([]string, error) {
	var pos []string
	for {
		if err := fs.Parse(args); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				return nil, errHelp
			}
			return nil, err
		}
		args = fs.Args()
		if len(args) == 0 {
			break
		}
		if args[0] == "--" {
			pos = append(pos, args[1:]...)
			break
		}
		pos = append(pos, args[0])
		args = args[1:]
	}
	if len(pos) < min {
		return nil, fmt.Errorf("missing argument: want %s", names)
	}
	if len(pos) > max {
		return nil, fmt.Errorf("%q: unexpected argument (want %s)", pos[max], names)
	}
	return pos, nil
}

// loadSite loads and validates a scenario file.
func loadSite(path string) (*engine.Site, error) {
	_, s, err := projects.LoadSiteFile(path)
	return s, err
}

func parseModel(v string) (engine.Model, error) {
	m, err := engine.ParseModel(v)
	if err != nil {
		return 0, fmt.Errorf("--model: %q: want radio or face-to-face", v)
	}
	return m, nil
}

func plannerList() string {
	ps := planners.Planners()
	if len(ps) == 0 {
		return "none registered"
	}
	names := make([]string, len(ps))
	for i, p := range ps {
		names[i] = p.Name
	}
	return strings.Join(names, ", ")
}

// findPlanner returns the registered planner called name.
func findPlanner(name string) (planners.PlannerInfo, error) {
	for _, p := range planners.Planners() {
		if p.Name == name {
			return p, nil
		}
	}
	return planners.PlannerInfo{}, fmt.Errorf("--planner: %q: unknown planner (known: %s)", name, plannerList())
}

// budget turns --seconds into a planner budget; negative or non-finite values are bad input.
func budget(sec float64) (time.Duration, error) {
	if !(sec >= 0) || sec > 1e6 {
		return 0, fmt.Errorf("--seconds: %g: want a number of seconds from 0 to 1000000", sec)
	}
	return time.Duration(sec * float64(time.Second)), nil
}

// progressTo returns a progress callback that writes to w at most four times a second.
func progressTo(w io.Writer, planner string) func(planners.Progress) {
	var last time.Time
	return func(p planners.Progress) {
		now := time.Now()
		if now.Sub(last) < 250*time.Millisecond {
			return
		}
		last = now
		fmt.Fprintf(w, "%s: %3.0f%%  best %s  %s\n", planner, 100*p.Done, engine.FormatClock(p.Best), p.Note)
	}
}

// makePlan runs the named planner ("" = the best non-search planner) and evaluates the plan under m.
func makePlan(e *env, s *engine.Site, name string, m engine.Model, opt planners.Options) (*engine.Plan, *engine.Report, error) {
	if name == "" {
		p, r, err := planners.BestPlan(e.ctx, s, m)
		if err != nil {
			return nil, nil, failure{err}
		}
		return p, r, nil
	}
	info, err := findPlanner(name)
	if err != nil {
		return nil, nil, err
	}
	if !info.Supports(m) {
		return nil, nil, fmt.Errorf("--planner: %q does not support the %s model (it supports %s)", name, m, modelList(info.Models))
	}
	if info.Search && opt.Progress == nil {
		opt.Progress = progressTo(e.stderr, name)
	}
	p, err := planners.MakePlan(e.ctx, s, name, m, opt)
	if err != nil {
		return nil, nil, failure{err}
	}
	r, err := engine.Evaluate(s, p, m)
	if err != nil {
		return nil, nil, failf("planner %s made an invalid plan: %w", name, err)
	}
	return p, r, nil
}

func modelList(ms []engine.Model) string {
	out := make([]string, len(ms))
	for i, m := range ms {
		out[i] = m.String()
	}
	return strings.Join(out, " and ")
}

// writeOut writes through fn and turns a write error into a failure.
func writeOut(err error) error {
	if err != nil {
		return failure{err}
	}
	return nil
}

// openFile opens a file named on the command line with a one-line error.
func openFile(path string) (*os.File, error) {
	f, err := os.Open(path)
	if err != nil {
		var pe *os.PathError
		if errors.As(err, &pe) {
			return nil, fmt.Errorf("%s: cannot open: %v", path, pe.Err)
		}
		return nil, err
	}
	return f, nil
}
