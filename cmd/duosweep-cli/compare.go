package main

import (
	"errors"
	"flag"
	"fmt"
	"math"
	"text/tabwriter"
	"time"

	"duosweep/engine"
	"duosweep/engine/planners"
)

func init() {
	register(command{
		name:    "compare",
		args:    "SCENARIO [--seconds S] [--seed N]",
		summary: "run every planner under both models and show the results in one table",
		run:     runCompare,
	})
	flagSets["compare"] = func() *flag.FlagSet { fs, _ := compareFlags(); return fs }
}

type compareOpts struct {
	seconds float64
	seed    int64
}

func compareFlags() (*flag.FlagSet, *compareOpts) {
	o := &compareOpts{}
	fs := newFlags("compare")
	fs.Float64Var(&o.seconds, "seconds", 2, "time budget of each search planner, in seconds")
	fs.Int64Var(&o.seed, "seed", 0, "seed of the search planners' random source")
	return fs, o
}

// compareRow is one line of the comparison table.
type compareRow struct {
	planner string
	model   engine.Model
	r       *engine.Report // nil: not applicable
	note    string         // shown instead of figures when r is nil
	detail  string         // a footnote below the table (why it failed)
}

func runCompare(e *env, args []string) error {
	fs, o := compareFlags()
	pos, err := parseArgs(fs, args, 1, 1, "SCENARIO")
	if err != nil {
		return err
	}
	b, err := budget(o.seconds)
	if err != nil {
		return err
	}
	s, err := loadSite(pos[0])
	if err != nil {
		return err
	}
	rows, err := compareRows(e, s, b, o.seed)
	if err != nil {
		return err
	}
	writeCompare(e, s, rows)
	return nil
}

func compareRows(e *env, s *engine.Site, b time.Duration, seed int64) ([]compareRow, error) {
	var rows []compareRow
	var bestP [2]*engine.Plan
	var bestR [2]*engine.Report
	for _, info := range planners.Planners() {
		for _, m := range engine.Models {
			if !info.Supports(m) {
				rows = append(rows, compareRow{planner: info.Name, model: m, note: "n/a"})
				continue
			}
			opt := planners.Options{Seed: seed}
			if info.Search {
				opt.Budget = b
				opt.Progress = progressTo(e.stderr, info.Name)
			}
			p, err := planners.MakePlan(e.ctx, s, info.Name, m, opt)
			if err != nil {
				if errors.Is(err, e.ctx.Err()) && e.ctx.Err() != nil {
					return nil, failure{err}
				}
				rows = append(rows, compareRow{planner: info.Name, model: m, note: "failed", detail: oneLine(err.Error())})
				continue
			}
			r, err := engine.Evaluate(s, p, m)
			if err != nil {
				rows = append(rows, compareRow{planner: info.Name, model: m, note: "invalid plan", detail: oneLine(err.Error())})
				continue
			}
			rows = append(rows, compareRow{planner: info.Name, model: m, r: r})
			if bestR[m] == nil || engine.Better(r, bestR[m]) {
				bestP[m], bestR[m] = p, r
			}
		}
	}
	// the best plan of each model under the other model: what losing (or gaining) radios does
	for _, m := range engine.Models {
		other := m.Other()
		label := fmt.Sprintf("%s best under %s", m, other)
		if bestP[m] == nil {
			rows = append(rows, compareRow{planner: label, model: other, note: "n/a (no plan for " + m.String() + ")"})
			continue
		}
		r, err := engine.Evaluate(s, bestP[m], other)
		if err != nil {
			return nil, failf("re-evaluating %s: %w", bestP[m].Planner, err)
		}
		rows = append(rows, compareRow{planner: label + " (" + bestP[m].Planner + ")", model: other, r: r})
	}
	return rows, nil
}

func writeCompare(e *env, s *engine.Site, rows []compareRow) {
	w := e.stdout
	bd := engine.ComputeBounds(s)
	fmt.Fprintf(w, "%s\nlower bound %s (%.1f s); %d candidates\n\n", s.Scenario.Name, engine.FormatClock(bd.LB), bd.LB, len(s.Candidates()))
	tw := tabwriter.NewWriter(w, 0, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "planner\tmodel\tworst\tworst s\tworst exit\tgap %\texpected\tcomplete")
	var notes []string
	for _, row := range rows {
		if row.r == nil {
			note := row.note
			if row.detail != "" {
				notes = append(notes, fmt.Sprintf("[%d] %s, %s: %s", len(notes)+1, row.planner, row.model, row.detail))
				note += fmt.Sprintf(" [%d]", len(notes))
			}
			fmt.Fprintf(tw, "%s\t%s\t%s\t\t\t\t\t\n", row.planner, row.model, note)
			continue
		}
		r := row.r
		exit, gap, exp, worstS := "-", "-", "-", "inf"
		if r.WorstExit >= 0 {
			exit = s.IDs[r.WorstExit]
		}
		if !math.IsInf(r.Worst, 0) {
			worstS = fmt.Sprintf("%.1f", r.Worst)
		}
		if !math.IsInf(r.Gap, 0) && !math.IsNaN(r.Gap) {
			gap = fmt.Sprintf("%.1f", 100*r.Gap)
		}
		if r.HasExpected {
			exp = engine.FormatClock(r.Expected)
		}
		complete := "yes"
		if !r.Complete {
			complete = fmt.Sprintf("no (%d unvisited)", len(r.Unvisited))
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", row.planner, row.model, engine.FormatClock(r.Worst), worstS, exit, gap, exp, complete)
	}
	tw.Flush()
	if len(notes) > 0 {
		fmt.Fprintln(w)
		for _, n := range notes {
			fmt.Fprintln(w, n)
		}
	}
}
