package ui

import (
	"context"
	"math"

	"duosweep/canvas"
	"duosweep/engine"
	"duosweep/engine/planners"
)

// planningState is the planning side of the window: the runs in flight and the result on screen.
// The site, plan and report are nil when err is set (site stays set when only the planner failed).
type planningState struct {
	gen      uint64             // generation of the newest planning run
	shownGen uint64             // generation of the result on screen
	cancel   context.CancelFunc // cancels the newest run
	busy     bool               // a run is in flight and its result is not on screen yet
	site     *engine.Site
	plan     *engine.Plan // the plan in use: the published one, or a search result after "Use this plan"
	report   *engine.Report
	err      error          // the engine's message for an invalid site or a failed planner
	heat     canvas.Overlay // the report's part of the canvas overlay (heat, worst, unvisited)
	// comparison is the radio-versus-face-to-face view of the site, nil while it is computed
	comparison *comparison
	// the best-available or chosen planner's plan as published (plan may be a search result in use)
	pubPlan   *engine.Plan
	pubReport *engine.Report
}

// planResult is what one background planning run produces.
type planResult struct {
	site   *engine.Site
	plan   *engine.Plan
	report *engine.Report
	err    error // the engine's message for an invalid site or a failed planner
}

// comparison is the radio-versus-face-to-face view: the best plan under each model, each evaluated
// under both models. cell[i][j] is the plan made for Models[i] evaluated under Models[j].
type comparison struct {
	plans [2]*engine.Plan
	cell  [2][2]*engine.Report
	err   error
}

// computePlan validates sc and plans it with the chosen planner ("" for the best available).
func computePlan(ctx context.Context, sc engine.Scenario, m engine.Model, planner string) planResult {
	res := planResult{}
	site, err := engine.NewSite(sc)
	if err != nil {
		res.err = err
		return res
	}
	res.site = site
	var p *engine.Plan
	var r *engine.Report
	if planner == "" {
		p, r, err = planners.BestPlan(ctx, site, m)
	} else {
		p, err = planners.MakePlan(ctx, site, planner, m, planners.Options{})
		if err == nil {
			r, err = engine.Evaluate(site, p, m)
		}
	}
	if err != nil {
		res.err = err
		return res
	}
	res.plan, res.report = p, r
	return res
}

// computeComparison plans site with the best available planner under both models and evaluates each
// plan under both. have, when not nil, is a best-available plan already made for its model and is reused.
func computeComparison(ctx context.Context, site *engine.Site, have *engine.Plan) *comparison {
	c := &comparison{}
	for i, m := range engine.Models {
		p := have
		if p == nil || p.Model != m {
			var err error
			if p, _, err = planners.BestPlan(ctx, site, m); err != nil {
				c.err = err
				return c
			}
		}
		radio, f2f, err := engine.EvaluateBoth(site, p)
		if err != nil {
			c.err = err
			return c
		}
		c.plans[i] = p
		c.cell[i] = [2]*engine.Report{radio, f2f}
	}
	return c
}

// syncPlanLimit is the largest site New plans on the UI goroutine, so that the first frame already shows
// the plan (planning such a site takes milliseconds); larger sites are planned in the background.
const syncPlanLimit = 300

// replan starts planning the current scenario in the background, cancelling the previous run. The
// result is published on the UI goroutine if no newer run has started meanwhile.
func (a *App) replan() { a.startPlan(false) }

// planAtStart plans a small scenario at once (then compares in the background), a large one like replan.
func (a *App) planAtStart() { a.startPlan(len(a.editor.Scenario().Nodes) <= syncPlanLimit) }

func (a *App) startPlan(now bool) {
	if a.planning.cancel != nil {
		a.planning.cancel()
	}
	// a search on the old site or model no longer applies
	a.dropSearch("Search cancelled: the site or the planning choices changed, so the published planners plan again.")
	ctx, cancel := context.WithCancel(context.Background())
	a.planning.cancel = cancel
	a.planning.gen++
	gen := a.planning.gen
	sc := a.editor.Scenario().Clone()
	m, planner := a.model, a.planner
	var res planResult
	if now {
		res = computePlan(ctx, sc, m, planner)
		a.publish(gen, res)
	} else {
		a.setBusy(true)
	}
	a.jobs.Add(1)
	go func() {
		defer a.jobs.Done()
		if !now {
			res = computePlan(ctx, sc, m, planner)
			if ctx.Err() != nil {
				return // a newer run owns the screen
			}
			a.post(func() {
				if gen == a.planning.gen {
					a.publish(gen, res)
				}
			})
		}
		if res.site == nil {
			return // no valid site: nothing to compare
		}
		var have *engine.Plan
		if planner == "" {
			have = res.plan
		}
		cmp := computeComparison(ctx, res.site, have)
		if ctx.Err() != nil {
			return
		}
		a.post(func() {
			if gen == a.planning.gen {
				a.publishComparison(cmp)
			}
		})
	}()
}

// publish shows a planning result. It runs on the UI goroutine.
func (a *App) publish(gen uint64, res planResult) {
	a.planning.shownGen = gen
	a.planning.err = res.err
	a.planning.comparison = nil
	if res.err != nil {
		// the canvas keeps showing the scenario; the panel shows the message
		a.planning.site, a.planning.plan, a.planning.report = res.site, nil, nil
		a.planning.pubPlan, a.planning.pubReport = nil, nil
		a.planning.heat = canvas.NoOverlay()
		a.setBusy(false)
		a.setReplay(nil)
		a.refreshResults()
		a.refreshComparison()
		return
	}
	a.planning.site, a.planning.plan, a.planning.report = res.site, res.plan, res.report
	a.planning.pubPlan, a.planning.pubReport = res.plan, res.report
	a.planning.heat = heatOverlay(res.site, res.report)
	a.setBusy(false)
	if a.playback.focus >= 0 {
		if _, ok := res.report.ExitFor(a.playback.focus); !ok {
			a.playback.focus = -1
		}
	}
	a.rebuildReplay()
	a.refreshResults()
	a.refreshComparison()
}

func (a *App) publishComparison(c *comparison) {
	a.planning.comparison = c
	a.refreshComparison()
}

// setBusy shows or hides the "planning…" state.
func (a *App) setBusy(b bool) {
	a.planning.busy = b
	if a.w.busyBar == nil {
		return
	}
	if b {
		a.w.busyLabel.SetText("planning…")
		a.w.busyBar.Show()
		a.w.busyBar.Start()
	} else {
		a.w.busyBar.Stop()
		a.w.busyBar.Hide()
		if a.planning.err == nil && a.planning.report != nil {
			a.w.busyLabel.SetText("plan up to date")
		} else {
			a.w.busyLabel.SetText("")
		}
	}
	a.refreshSearch()
}

// finiteMax returns the largest finite evacuation time of r (0 when none is finite).
func finiteMax(r *engine.Report) float64 {
	m := 0.0
	for _, ex := range r.Exits {
		if !math.IsInf(ex.EvacAt, 0) && ex.EvacAt > m {
			m = ex.EvacAt
		}
	}
	return m
}
