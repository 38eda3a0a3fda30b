package ui

import (
	"context"
	"math"

	"duosweep/engine"
	"duosweep/engine/planners"
)

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
	if a.cancel != nil {
		a.cancel()
	}
	// a search on the old site or model no longer applies
	a.dropSearch("Search cancelled: the site or the planning choices changed, so the published planners plan again.")
	ctx, cancel := context.WithCancel(context.Background())
	a.cancel = cancel
	a.gen++
	gen := a.gen
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
				if gen == a.gen {
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
			if gen == a.gen {
				a.publishComparison(cmp)
			}
		})
	}()
}

// publish shows a planning result. It runs on the UI goroutine.
func (a *App) publish(gen uint64, res planResult) {
	a.shownGen = gen
	a.planErr = res.err
	a.comparison = nil
	if res.err != nil {
		// the canvas keeps showing the scenario; the panel shows the message
		a.site, a.plan, a.report = res.site, nil, nil
		a.pubPlan, a.pubReport = nil, nil
		a.heat = noHeat()
		a.setBusy(false)
		a.setReplay(nil)
		a.refreshResults()
		a.refreshComparison()
		return
	}
	a.site, a.plan, a.report = res.site, res.plan, res.report
	a.pubPlan, a.pubReport = res.plan, res.report
	a.heat = heatOverlay(res.site, res.report)
	a.setBusy(false)
	if a.focus >= 0 {
		if _, ok := res.report.ExitFor(a.focus); !ok {
			a.focus = -1
		}
	}
	a.rebuildReplay()
	a.refreshResults()
	a.refreshComparison()
}

func (a *App) publishComparison(c *comparison) {
	a.comparison = c
	a.refreshComparison()
}

// setBusy shows or hides the "planning…" state.
func (a *App) setBusy(b bool) {
	a.busy = b
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
		if a.planErr == nil && a.report != nil {
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
