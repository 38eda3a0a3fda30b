package main

import (
	"flag"

	"duosweep/projects"
)

func init() {
	register(command{
		name:    "demo",
		args:    "[PATH]",
		summary: "write the bundled demo scenario (an invented training site) to PATH or stdout",
		run:     runDemo,
	})
	flagSets["demo"] = func() *flag.FlagSet { return newFlags("demo") }
}

func runDemo(e *env, args []string) error {
	pos, err := parseArgs(newFlags("demo"), args, 0, 1, "[PATH]")
	if err != nil {
		return err
	}
	if len(pos) == 0 {
		_, err := e.stdout.Write(projects.DemoJSON())
		return writeOut(err)
	}
	return projects.SaveDemoFile(pos[0])
}
