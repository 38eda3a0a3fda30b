package engine

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sort"
	"time"
)

// Options configure a planner. The zero value is useful: seed 0, the
// planner's default budget, no progress reports.
type Options struct {
	// Seed feeds the planner's random source (search planners only); the same
	// seed gives the same plan.
	Seed int64
	// Budget is the wall-clock time a search planner may use; 0 means its default.
	Budget time.Duration
	// Iterations caps a search planner's iterations; 0 means no cap (Budget rules).
	Iterations int
	// Progress, when set, receives reports from long-running planners. It is
	// called on the planner's goroutine.
	Progress func(Progress)
}

// Progress is a progress report of a long-running planner.
type Progress struct {
	Done float64 // fraction of the budget used, 0..1
	Best float64 // best worst case found so far (seconds)
	Note string  // what it is doing, in a few words
}

// PlannerInfo describes a registered planner.
type PlannerInfo struct {
	Name    string
	Models  []Model
	Summary string
	// Search marks planners that search (exhaustive, improve): slower, with
	// budgets and progress; the "best available" choice leaves them out.
	Search bool
}

// Supports reports whether the planner works under model m.
func (p PlannerInfo) Supports(m Model) bool {
	for _, x := range p.Models {
		if x == m {
			return true
		}
	}
	return false
}

type plannerFunc func(ctx context.Context, s *Site, m Model, opt Options) (*Plan, error)

type registered struct {
	info PlannerInfo
	fn   plannerFunc
}

var registry = map[string]registered{}

// floors holds, for some planners, a proven lower bound on the worst case of
// every plan the planner can make (under either model), so that BestPlan can
// skip a planner that cannot beat the best plan found so far.
var floors = map[string]func(s *Site) float64{}

func register(info PlannerInfo, fn plannerFunc) {
	if _, dup := registry[info.Name]; dup {
		panic("engine: planner registered twice: " + info.Name)
	}
	registry[info.Name] = registered{info, fn}
}

// ErrUnknownPlanner is returned for a planner name that is not registered.
var ErrUnknownPlanner = errors.New("engine: unknown planner")

// ErrModelNotSupported is returned when a planner does not work under the asked model.
var ErrModelNotSupported = errors.New("engine: planner does not support this model")

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
func PlannersFor(m Model) []PlannerInfo {
	var out []PlannerInfo
	for _, p := range Planners() {
		if p.Supports(m) {
			out = append(out, p)
		}
	}
	return out
}

// MakePlan runs the named planner on s for model m.
func MakePlan(ctx context.Context, s *Site, name string, m Model, opt Options) (*Plan, error) {
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
	if p.cached != nil {
		p.cached.Planner = name
	}
	return p, nil
}

// BestPlan runs every non-search planner and returns the plan with the
// smallest worst case under m (ties: the smaller expected time, then the
// order of Planners), with its report. Since any plan can be evaluated under
// either model, plans made for the other model compete too (a radio plan
// can be the best face-to-face plan: Plan.Model says what it was made for).
// This is the "best available" default. Above LargeSite nodes only plans
// made for m compete. A planner that fails is skipped;
// BestPlan fails only when every planner does (or ctx is done).
func BestPlan(ctx context.Context, s *Site, m Model) (*Plan, *Report, error) {
	var bestP *Plan
	var bestR *Report
	var errs []error
	for _, info := range Planners() {
		if info.Search {
			continue
		}
		if f, ok := floors[info.Name]; ok && bestR != nil && f(s) > bestR.Worst*(1+1e-9) {
			continue // cannot beat (or tie) the best so far
		}
		// plans made for m first, so that they win ties; on large sites
		// only those, to keep planning near-linear
		made := []Model{m, 1 - m}
		if s.N > LargeSite {
			made = made[:1]
		}
		for _, made := range made {
			if !info.Supports(made) {
				continue
			}
			if err := ctx.Err(); err != nil {
				return nil, nil, err
			}
			p, err := MakePlan(ctx, s, info.Name, made, Options{})
			var r *Report
			if err == nil {
				if p.cached != nil && p.cached.Model == m {
					r = p.cached
				} else {
					r, err = Evaluate(s, p, m)
				}
			}
			if err != nil {
				if ctx.Err() != nil {
					return nil, nil, ctx.Err()
				}
				errs = append(errs, fmt.Errorf("planner %s (%s): %w", info.Name, made, err))
				continue
			}
			r.Planner = p.Planner
			if bestR == nil || better(r, bestR) {
				bestP, bestR = p, r
			}
		}
	}
	if bestP == nil {
		if len(errs) > 0 {
			return nil, nil, fmt.Errorf("engine: no planner succeeded for model %s: %w", m, errors.Join(errs...))
		}
		return nil, nil, fmt.Errorf("engine: no planner for model %s", m)
	}
	return bestP, bestR, nil
}

// better reports whether report a beats b: smaller worst case, then smaller
// expected time. Planner names break remaining ties through the caller's order.
func better(a, b *Report) bool {
	if d := a.Worst - b.Worst; math.Abs(d) > tol(b.Worst) {
		return d < 0
	}
	if a.HasExpected && b.HasExpected && math.Abs(a.Expected-b.Expected) > tol(b.Expected) {
		return a.Expected < b.Expected
	}
	return false
}

// Better reports whether report a is strictly better than b (smaller worst
// case, then smaller expected time, within a relative 1e-9).
func Better(a, b *Report) bool { return better(a, b) }
