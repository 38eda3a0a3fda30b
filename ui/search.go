package ui

import (
	"context"
	"fmt"
	"math"
	"strings"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"duosweep/engine"
	"duosweep/engine/planners"
	"duosweep/engine/search"
)

// The "search for a better plan" action of the plan panel: it runs the engine's search planners
// (improve, and exhaustive on small sites) in the background on the site of the plan on screen, shows
// their progress, and puts the result beside the best published planner's plan. "Use this plan" makes
// the result the current plan until the next edit.

// Search budgets offered, and their labels.
var (
	searchBudgetLabels = []string{"5 s", "15 s", "60 s"}
	searchBudgets      = []time.Duration{5 * time.Second, 15 * time.Second, 60 * time.Second}
)

// searchSeed is the seed of every search the window starts (the same site gives the same search).
const searchSeed = 1

// searchWidgets are the widgets of the search action.
type searchWidgets struct {
	run, prove      *widget.Button
	budget          *widget.Select
	bar             *widget.ProgressBar
	best            *widget.Label
	cancel          *widget.Button
	running         *fyne.Container
	status          *widget.Label
	proveHint       *widget.Label
	result          *fyne.Container
	baseKey, resKey *widget.Label
	baseVal, resVal *widget.Label
	verdict, note   *widget.Label
	use             *widget.Button
	useHint         *widget.Label
}

// searchState is the search in flight or the last one finished.
type searchState struct {
	gen     uint64 // generation of the newest search; results of older ones are dropped
	cancel  context.CancelFunc
	running bool
	budget  time.Duration
	result  *searchResult // shown beside the published plan, nil when none
	inUse   bool          // the result is the current plan
	// iterations caps the improve search (tests keep runs short; 0 in the app).
	iterations int
}

// searchResult is what one search produced, next to the best published plan of the same site and model.
type searchResult struct {
	planner   string // "improve" or "exhaustive"
	site      *engine.Site
	model     engine.Model
	base      *engine.Plan // the best published planner's plan
	baseR     *engine.Report
	plan      *engine.Plan // the search's plan, nil when err is set
	report    *engine.Report
	err       error
	cancelled bool // stopped by the Cancel button before its budget ran out
	elapsed   time.Duration
}

// searchPanel is the search action: buttons and budget, the progress while it runs, the result.
func (a *App) searchPanel() fyne.CanvasObject {
	sw := &a.w.search
	sw.run = widget.NewButtonWithIcon("Search for a better plan", theme.SearchIcon(), func() { a.startSearch("improve") })
	sw.prove = widget.NewButtonWithIcon("Prove best of class", theme.ConfirmIcon(), func() { a.startSearch("exhaustive") })
	sw.budget = widget.NewSelect(searchBudgetLabels, func(s string) {
		for i, l := range searchBudgetLabels {
			if l == s {
				a.search.budget = searchBudgets[i]
			}
		}
	})
	sw.budget.SetSelected(searchBudgetLabels[0])
	a.search.budget = searchBudgets[0]

	sw.bar = widget.NewProgressBar()
	sw.best = widget.NewLabel("")
	sw.cancel = widget.NewButtonWithIcon("Cancel", theme.CancelIcon(), a.cancelSearch)
	sw.running = container.NewBorder(nil, nil, nil, sw.cancel, container.NewVBox(sw.bar, sw.best))
	sw.running.Hide()
	sw.status = widget.NewLabel("")
	sw.status.Wrapping = fyne.TextWrapWord
	sw.status.Importance = widget.LowImportance
	sw.status.Hide()
	sw.proveHint = widget.NewLabel("")
	sw.proveHint.Wrapping = fyne.TextWrapWord
	sw.proveHint.Importance = widget.LowImportance
	sw.proveHint.Hide()

	val := func() *widget.Label {
		l := widget.NewLabel("")
		l.Wrapping = fyne.TextWrapWord
		return l
	}
	sw.baseKey, sw.resKey = widget.NewLabel(""), widget.NewLabel("")
	sw.baseVal, sw.resVal, sw.verdict, sw.note = val(), val(), val(), val()
	sw.resVal.TextStyle.Bold = true
	sw.note.Importance = widget.LowImportance
	sw.use = widget.NewButtonWithIcon("Use this plan", theme.ConfirmIcon(), a.useSearchPlan)
	sw.use.Importance = widget.HighImportance
	sw.useHint = val()
	sw.useHint.SetText("The searched plan stays in use until the next edit or model switch, which plans again with the published planners.")
	sw.useHint.Importance = widget.LowImportance
	sw.result = container.NewVBox(
		container.New(layout.NewFormLayout(), sw.baseKey, sw.baseVal, sw.resKey, sw.resVal),
		container.NewBorder(nil, nil, nil, container.NewCenter(sw.use), sw.verdict),
		sw.note,
		sw.useHint,
	)
	sw.result.Hide()

	a.refreshSearch()
	return container.NewVBox(
		widget.NewSeparator(),
		container.NewBorder(nil, nil, nil, sw.budget, sw.run),
		sw.prove,
		sw.proveHint,
		sw.running,
		sw.status,
		sw.result,
	)
}

// searchable reports whether the plan on screen is a valid, up-to-date plan a search can start from.
func (a *App) searchable() bool {
	p := &a.planning
	return !p.busy && p.err == nil && p.site != nil && p.report != nil && len(p.report.Exits) > 0
}

// refreshSearch enables the search buttons when a search can start, and explains why "prove best of
// class" is not offered on large sites.
func (a *App) refreshSearch() {
	sw := &a.w.search
	if sw.run == nil {
		return
	}
	ok := a.searchable() && !a.search.running
	setEnabled(sw.run, ok)
	proveOK := ok
	if site := a.planning.site; site != nil && a.planning.err == nil {
		if err := search.CheckExhaustiveSize(site); err != nil {
			proveOK = false
			nc, ns := 0, 0
			for v := 0; v < site.N; v++ {
				if site.Candidate[v] {
					nc++
				}
				if site.InSearch[v] {
					ns++
				}
			}
			sw.proveHint.SetText(fmt.Sprintf("Proving the best plan of its class is offered on sites of at most %d candidates and %d junctions in the searched part; this site has %d and %d.",
				search.ExhaustiveMaxCandidates, search.ExhaustiveMaxNodes, nc, ns))
			sw.proveHint.Show()
		} else {
			sw.proveHint.Hide()
		}
	} else {
		sw.proveHint.Hide()
	}
	setEnabled(sw.prove, proveOK)
	setEnabled(sw.budget, !a.search.running)
}

type enabler interface {
	Enable()
	Disable()
}

func setEnabled(w enabler, on bool) {
	if on {
		w.Enable()
	} else {
		w.Disable()
	}
}

// startSearch runs planner ("improve" or "exhaustive") on the site of the plan on screen, in the
// background, with the chosen budget. Progress and the result reach the UI through a.post.
func (a *App) startSearch(planner string) {
	if !a.searchable() || a.search.running {
		return
	}
	ctx, cancel := context.WithCancel(context.Background())
	st := &a.search
	st.gen++
	gen := st.gen
	st.cancel, st.running, st.result = cancel, true, nil
	site, m, budget, iters := a.planning.site, a.model, st.budget, st.iterations
	// the best published plan: the plan on screen when it is the "best available" one
	var base *engine.Plan
	var baseR *engine.Report
	if a.planner == "" && a.planning.pubPlan != nil {
		base, baseR = a.planning.pubPlan, a.planning.pubReport
	}
	sw := &a.w.search
	sw.bar.SetValue(0)
	sw.best.SetText("starting the " + planner + " search…")
	sw.cancel.Enable()
	sw.running.Show()
	sw.status.Hide()
	sw.result.Hide()
	a.refreshSearch()

	a.jobs.Add(1)
	go func() {
		defer a.jobs.Done()
		t0 := time.Now()
		res := &searchResult{planner: planner, site: site, model: m, base: base, baseR: baseR}
		if res.base == nil {
			res.base, res.baseR, res.err = planners.BestPlan(ctx, site, m)
		}
		if res.err == nil {
			opt := planners.Options{Budget: budget, Seed: searchSeed, Iterations: iters, Progress: func(p planners.Progress) {
				a.post(func() {
					if gen == a.search.gen && a.search.running {
						a.showSearchProgress(p)
					}
				})
			}}
			res.plan, res.err = planners.MakePlan(ctx, site, planner, m, opt)
			if res.err == nil {
				res.report, res.err = engine.Evaluate(site, res.plan, m)
			}
		}
		res.cancelled = ctx.Err() != nil
		res.elapsed = time.Since(t0)
		a.post(func() {
			if gen == a.search.gen {
				a.finishSearch(res)
			}
		})
	}()
}

// showSearchProgress updates the progress bar and the best worst case found so far.
func (a *App) showSearchProgress(p planners.Progress) {
	sw := &a.w.search
	sw.bar.SetValue(math.Max(0, math.Min(1, p.Done)))
	if math.IsInf(p.Best, 0) || math.IsNaN(p.Best) {
		sw.best.SetText("no complete plan yet")
	} else {
		sw.best.SetText("best so far " + clock(p.Best))
	}
}

// cancelSearch is the Cancel button: the search stops and returns the best plan it has found so far.
func (a *App) cancelSearch() {
	if !a.search.running || a.search.cancel == nil {
		return
	}
	a.search.cancel()
	a.w.search.cancel.Disable()
	a.w.search.best.SetText("cancelling…")
}

// dropSearch cancels a running search and forgets its result (the site, the model or the planner
// changed, so it no longer applies). why, when not empty, is shown where the result was.
func (a *App) dropSearch(why string) {
	st := &a.search
	was := st.running
	if st.cancel != nil {
		st.cancel()
	}
	st.gen++ // a result still on its way is dropped
	st.cancel, st.running, st.result, st.inUse = nil, false, nil, false
	sw := &a.w.search
	if sw.run == nil {
		return
	}
	sw.running.Hide()
	sw.result.Hide()
	if was && why != "" {
		sw.status.SetText(why)
		sw.status.Show()
	} else {
		sw.status.Hide()
	}
	a.refreshSearch()
}

// finishSearch shows a finished (or cancelled) search beside the best published plan.
func (a *App) finishSearch(res *searchResult) {
	st := &a.search
	st.running, st.cancel = false, nil
	sw := &a.w.search
	sw.running.Hide()
	a.refreshSearch()
	if res.err != nil {
		if res.cancelled {
			sw.status.SetText("Search cancelled; the current plan is kept.")
		} else {
			sw.status.SetText("The search failed; the current plan is kept. " + res.err.Error())
		}
		sw.status.Show()
		sw.result.Hide()
		return
	}
	st.result = res
	sw.status.Hide()
	name := res.planner
	if res.planner == "exhaustive" {
		name = "exhaustive search"
	}
	sw.baseKey.SetText("Best published planner")
	sw.baseVal.SetText(fmt.Sprintf("%s: %s, gap %s", res.base.Planner, clock(res.baseR.Worst), gapText(res.baseR)))
	sw.resKey.SetText("Search result")
	proof := ""
	if res.planner == "exhaustive" {
		// the exhaustive planner's note opens with what it proved (engine/exhaustive.go)
		switch {
		case strings.HasPrefix(res.plan.Note, "best of class"):
			proof = ", proved best of class"
		case strings.HasPrefix(res.plan.Note, "NOT proven"):
			proof = ", not proven (stopped)"
		}
	}
	sw.resVal.SetText(fmt.Sprintf("%s: %s, gap %s%s", name, clock(res.report.Worst), gapText(res.report), proof))
	gain := res.baseR.Worst - res.report.Worst
	better := engine.Better(res.report, res.baseR)
	switch {
	case gain > engine.Tol(res.baseR.Worst):
		sw.verdict.SetText(fmt.Sprintf("%.1f s (%.1f %%) shorter worst case than the published plan.", gain, 100*gain/res.baseR.Worst))
	case better:
		sw.verdict.SetText(fmt.Sprintf("Same worst case, %.1f s shorter expected time than the published plan.", res.baseR.Expected-res.report.Expected))
	default:
		sw.verdict.SetText("No shorter worst case found: the published plan stands.")
	}
	note := res.plan.Note
	if res.cancelled {
		note = fmt.Sprintf("Cancelled after %.1f s: the best plan found so far. ", res.elapsed.Seconds()) + note
	}
	sw.note.SetText(note)
	if better {
		sw.use.SetText("Use this plan")
		sw.use.Enable()
	} else {
		sw.use.SetText("Nothing better")
		sw.use.Disable()
	}
	sw.result.Show()
}

// gapText is the certified gap of r as a percentage, or "none" for an incomplete plan.
func gapText(r *engine.Report) string {
	if math.IsInf(r.Worst, 0) {
		return "none (incomplete)"
	}
	return fmt.Sprintf("%.1f %%", 100*r.Gap)
}

// useSearchPlan makes the search result the current plan: the results, the canvas colouring, the
// table, playback and the itinerary all follow it until the next edit.
func (a *App) useSearchPlan() {
	res := a.search.result
	if res == nil || res.site != a.planning.site || res.model != a.model {
		return
	}
	a.planning.plan, a.planning.report = res.plan, res.report
	a.planning.heat = heatOverlay(a.planning.site, a.planning.report)
	if a.playback.focus >= 0 {
		if _, ok := a.planning.report.ExitFor(a.playback.focus); !ok {
			a.playback.focus = -1
		}
	}
	a.search.inUse = true
	a.rebuildReplay()
	a.refreshResults()
	a.w.busyLabel.SetText("search plan in use")
	a.w.search.use.SetText("In use")
	a.w.search.use.Disable()
	a.setStatus("Using the " + res.planner + " plan until the next edit.")
}
