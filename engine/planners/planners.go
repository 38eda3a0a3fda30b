package planners

import (
	"context"
	"fmt"
	"sort"

	"duosweep/engine"
	"duosweep/engine/published"
	"duosweep/engine/search"
)

// Options configure a planner; see search.Options. The zero value is useful.
type Options = search.Options

// Progress is a progress report of a long-running planner; see search.Progress.
type Progress = search.Progress

// PlannerInfo describes a registered planner.
type PlannerInfo struct {
	Name    string
	Models  []engine.Model
	Summary string
	// Search marks planners that search (exhaustive, improve): slower, with
	// budgets and progress; the "best available" choice leaves them out.
	Search bool
}

// Supports reports whether the planner works under model m.
func (p PlannerInfo) Supports(m engine.Model) bool {
	for _, x := range p.Models {
		if x == m {
			return true
		}
	}
	return false
}

type registered struct {
	info PlannerInfo
	fn   func(ctx context.Context, s *engine.Site, m engine.Model, opt Options) (*engine.Plan, error)
}

// registry holds every planner by name: the published ones and the search ones.
var registry = func() map[string]registered {
	reg := map[string]registered{}
	add := func(info PlannerInfo, fn func(ctx context.Context, s *engine.Site, m engine.Model, opt Options) (*engine.Plan, error)) {
		if _, dup := reg[info.Name]; dup {
			panic("engine: planner registered twice: " + info.Name)
		}
		reg[info.Name] = registered{info, fn}
	}
	for _, p := range published.Planners() {
		mk := p.Make
		add(PlannerInfo{Name: p.Name, Models: p.Models, Summary: p.Summary},
			func(ctx context.Context, s *engine.Site, m engine.Model, _ Options) (*engine.Plan, error) {
				return mk(ctx, s, m)
			})
	}
	for _, p := range search.Planners() {
		add(PlannerInfo{Name: p.Name, Models: p.Models, Summary: p.Summary, Search: true}, p.Make)
	}
	return reg
}()

// ErrUnknownPlanner is returned (wrapped) for a planner name that is not registered.
var ErrUnknownPlanner = published.ErrUnknownPlanner

// ErrModelNotSupported is returned (wrapped) when a planner does not work under the asked model.
var ErrModelNotSupported = published.ErrModelNotSupported

// Planners returns every registered planner, sorted by name.
func Planners() []PlannerInfo {
	out := make([]PlannerInfo, 0, len(registry))
	for _, r := range registry {
		out = append(out, r.info)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out
}

// PlannersFor returns the planners that support model m, sorted by name.
func PlannersFor(m engine.Model) []PlannerInfo {
	var out []PlannerInfo
	for _, p := range Planners() {
		if p.Supports(m) {
			out = append(out, p)
		}
	}
	return out
}

// MakePlan runs the named planner on s for model m.
func MakePlan(ctx context.Context, s *engine.Site, name string, m engine.Model, opt Options) (*engine.Plan, error) {
	r, ok := registry[name]
	if !ok {
		return nil, fmt.Errorf("%w: %q", ErrUnknownPlanner, name)
	}
	if !r.info.Supports(m) {
		return nil, fmt.Errorf("%w: %s under %s", ErrModelNotSupported, name, m)
	}
	p, err := r.fn(ctx, s, m, opt)
	if err != nil {
		return nil, err
	}
	p.Planner, p.Model = name, m
	if r := p.Evaluated(); r != nil {
		r.Planner = name
	}
	return p, nil
}

// BestPlan is the "best available" default: the best plan of the published
// planners under m, with its report (see published.BestPlan). The search
// planners are left out: they are slower and run only when asked for.
func BestPlan(ctx context.Context, s *engine.Site, m engine.Model) (*engine.Plan, *engine.Report, error) {
	return published.BestPlan(ctx, s, m)
}
