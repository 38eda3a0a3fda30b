package published

import (
	"context"
	"errors"
	"fmt"
	"math"

	"duosweep/engine"
)

// Planner is one published planner: its name, the models it works under, a
// one-line summary with its guarantee, and how to run it.
type Planner struct {
	Name    string
	Models  []engine.Model
	Summary string
	// Make builds the planner's plan for s under m. Most planners try a few
	// variants, evaluate each exactly and keep the best (Plan.Evaluated then
	// holds that evaluation).
	Make func(ctx context.Context, s *engine.Site, m engine.Model) (*engine.Plan, error)
	// Floor, when set, is a proven lower bound on the worst case of every
	// plan the planner can make (under either model), so that BestPlan can
	// skip a planner that cannot beat the best plan found so far.
	Floor func(s *engine.Site) float64
}

// Supports reports whether the planner works under model m.
func (p Planner) Supports(m engine.Model) bool {
	for _, x := range p.Models {
		if x == m {
			return true
		}
	}
	return false
}

// planners lists the published planners sorted by name (the order in which
// BestPlan tries them, which breaks its ties).
var planners = []Planner{
	{Name: "hub-rendezvous", Models: []engine.Model{engine.FaceToFace},
		Summary: "both explore around the weighted centroid within a time budget of W and meet there, then search what is left from it (worst ≤ 1.5·W when the parts split evenly)",
		Make:    planHub},
	{Name: "opposite-tours", Models: engine.Models,
		Summary: "one walks a depth-first tour forwards, the other the same tour backwards; they meet at its midpoint (radio: worst ≤ 1.5·W; face to face, with a rendezvous at the midpoint: worst ≤ 2W)",
		Make:    planOpposite},
	{Name: "spine-split", Models: []engine.Model{engine.Radio},
		Summary: "the walk down the path to the farthest junction is cut where half the side work is done; one takes the first part, the other the rest (worst ≤ W + L2 ≤ 4/3 of the lower bound)",
		Make:    planSpine},
	{Name: "together", Models: engine.Models,
		Summary: "both walk one depth-first tour together, the branch with the farthest junction last (worst ≤ 2W − L)",
		Make:    planTogether,
		// Both agents walk one walk from the start that reaches every
		// candidate, so the last candidate is first reached after at least
		// 2W − L (the shortest such walk ends at the farthest candidate), at
		// the faster speed.
		Floor: func(s *engine.Site) float64 {
			b := engine.ComputeBounds(s)
			return (2*b.W - b.L) / math.Max(s.Speed[0], s.Speed[1])
		}},
}

// Planners returns the published planners, sorted by name.
func Planners() []Planner { return append([]Planner(nil), planners...) }

// ErrUnknownPlanner is returned (wrapped) for a name that is not a published planner.
var ErrUnknownPlanner = errors.New("engine: unknown planner")

// ErrModelNotSupported is returned (wrapped) when a planner does not work under the asked model.
var ErrModelNotSupported = errors.New("engine: planner does not support this model")

// MakePlan runs the published planner called name on s for model m and
// stamps the plan (and its kept evaluation) with the planner's name and m.
func MakePlan(ctx context.Context, s *engine.Site, name string, m engine.Model) (*engine.Plan, error) {
	for _, p := range planners {
		if p.Name != name {
			continue
		}
		if !p.Supports(m) {
			return nil, fmt.Errorf("%w: %s under %s", ErrModelNotSupported, name, m)
		}
		pl, err := p.Make(ctx, s, m)
		if err != nil {
			return nil, err
		}
		pl.Planner, pl.Model = name, m
		if r := pl.Evaluated(); r != nil {
			r.Planner = name
		}
		return pl, nil
	}
	return nil, fmt.Errorf("%w: %q", ErrUnknownPlanner, name)
}
