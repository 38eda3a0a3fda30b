package main

import (
	"flag"
	"fmt"

	"duosweep/engine"
	"duosweep/projects"
)

func init() {
	register(command{
		name:    "eval",
		args:    "SCENARIO PLAN [--model radio|face-to-face] [--json]",
		summary: "evaluate the routes of a plan file (a report, or any JSON with a routes array)",
		run:     runEval,
	})
	flagSets["eval"] = func() *flag.FlagSet { fs, _ := evalFlags(); return fs }
}

type evalOpts struct {
	model string
	json  bool
}

func evalFlags() (*flag.FlagSet, *evalOpts) {
	o := &evalOpts{}
	fs := newFlags("eval")
	fs.StringVar(&o.model, "model", "", `communication model: radio or face-to-face (default: the plan file's "model", else the scenario's, else radio)`)
	fs.BoolVar(&o.json, "json", false, "write the report as JSON instead of the itinerary")
	return fs, o
}

func runEval(e *env, args []string) error {
	fs, o := evalFlags()
	pos, err := parseArgs(fs, args, 2, 2, "SCENARIO PLAN")
	if err != nil {
		return err
	}
	var m engine.Model
	if o.model != "" {
		if m, err = parseModel(o.model); err != nil {
			return err
		}
	}
	s, err := loadSite(pos[0])
	if err != nil {
		return err
	}
	f, err := openFile(pos[1])
	if err != nil {
		return err
	}
	defer f.Close()
	p, h, err := projects.ReadPlanHeader(f, s)
	if err != nil {
		return fmt.Errorf("%s: %w", pos[1], err)
	}
	if o.model == "" {
		m = scenarioModel(s)
		if h.HasModel {
			m = h.Model
		}
	}
	r, err := engine.Evaluate(s, p, m)
	if err != nil {
		return fmt.Errorf("%s: %w", pos[1], err)
	}
	if o.json {
		return writeOut(projects.WriteReport(e.stdout, s, p, r))
	}
	return writeOut(projects.WriteItinerary(e.stdout, s, p, r))
}
