package published

import (
	"context"
	"errors"
	"fmt"

	"duosweep/engine"
)

// BestPlan runs every published planner and returns the plan with the
// smallest worst case under m (ties: the smaller expected time, then the
// order of Planners), with its report. Since any plan can be evaluated under
// either model, plans made for the other model compete too (a radio plan
// can be the best face-to-face plan: Plan.Model says what it was made for).
// This is the "best available" default. Above LargeSite nodes only plans
// made for m compete. A planner that fails is skipped;
// BestPlan fails only when every planner does (or ctx is done).
func BestPlan(ctx context.Context, s *engine.Site, m engine.Model) (*engine.Plan, *engine.Report, error) {
	var bestP *engine.Plan
	var bestR *engine.Report
	var errs []error
	for _, info := range Planners() {
		if info.Floor != nil && bestR != nil && info.Floor(s) > bestR.Worst*(1+1e-9) {
			continue // cannot beat (or tie) the best so far
		}
		// plans made for m first, so that they win ties; on large sites
		// only those, to keep planning near-linear
		made := append([]engine.Model{m}, m.Others()...)
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
			p, err := MakePlan(ctx, s, info.Name, made)
			var r *engine.Report
			if err == nil {
				if p.Evaluated() != nil && p.Evaluated().Model == m {
					r = p.Evaluated()
				} else {
					r, err = engine.Evaluate(s, p, m)
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
			if bestR == nil || engine.Better(r, bestR) {
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
