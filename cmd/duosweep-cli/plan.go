package main

import (
	"flag"

	"duosweep/engine/planners"
	"duosweep/projects"
)

func init() {
	register(command{
		name:    "plan",
		args:    "SCENARIO [--model radio|face-to-face] [--planner NAME] [--json] [--seconds S] [--seed N]",
		summary: "make a plan for a scenario and print its itinerary (or its report as JSON)",
		run:     runPlan,
	})
	flagSets["plan"] = func() *flag.FlagSet { fs, _ := planFlags(); return fs }
}

type planOpts struct {
	model, planner string
	json           bool
	seconds        float64
	seed           int64
}

func planFlags() (*flag.FlagSet, *planOpts) {
	o := &planOpts{}
	fs := newFlags("plan")
	fs.StringVar(&o.model, "model", "radio", "communication model: radio or face-to-face")
	fs.StringVar(&o.planner, "planner", "", "planner name (default: the best of the non-search planners)")
	fs.BoolVar(&o.json, "json", false, "write the plan report as JSON instead of the itinerary")
	fs.Float64Var(&o.seconds, "seconds", 0, "time budget of a search planner in seconds (0: its default)")
	fs.Int64Var(&o.seed, "seed", 0, "seed of a search planner's random source")
	return fs, o
}

func runPlan(e *env, args []string) error {
	fs, o := planFlags()
	pos, err := parseArgs(fs, args, 1, 1, "SCENARIO")
	if err != nil {
		return err
	}
	m, err := parseModel(o.model)
	if err != nil {
		return err
	}
	b, err := budget(o.seconds)
	if err != nil {
		return err
	}
	if o.planner != "" {
		if _, err := findPlanner(o.planner); err != nil {
			return err
		}
	}
	s, err := loadSite(pos[0])
	if err != nil {
		return err
	}
	p, r, err := makePlan(e, s, o.planner, m, planners.Options{Seed: o.seed, Budget: b})
	if err != nil {
		return err
	}
	if o.json {
		return writeOut(projects.WriteReport(e.stdout, s, p, r))
	}
	return writeOut(projects.WriteItinerary(e.stdout, s, p, r))
}
