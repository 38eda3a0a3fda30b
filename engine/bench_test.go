package engine_test

// Fixed-seed benchmarks on random trees of 10^4, 10^5 and 10^6 nodes. They
// run only with -bench; every benchmark reports ns/node. Run them with
//
//	go test -run X -bench . -benchtime 1x ./engine/
//
// (or a larger -benchtime for steadier figures).

import (
	"bytes"
	"context"
	"fmt"
	"math/rand/v2"
	"strconv"
	"testing"

	"duosweep/engine"
	"duosweep/engine/planners"
	"duosweep/projects"
)

var benchSizes = []int{10_000, 100_000, 1_000_000}

// bigTree is an O(n) generator of its own (independent of engine/gen): node
// i > 0 hangs off node i−1 (half the time) or a uniformly random earlier
// node, so the tree has both long drifts and bushy parts; lengths are
// integers 1..9 or reals; every node but the start is a candidate; equal
// speeds.
func bigTree(n int, seed uint64) engine.Scenario {
	rng := rand.New(rand.NewPCG(seed, 99))
	sc := engine.Scenario{Name: "bench", Start: "n0", Nodes: make([]engine.Node, n), Corridors: make([]engine.Corridor, 0, n-1)}
	for i := range sc.Nodes {
		sc.Nodes[i] = engine.Node{ID: "n" + strconv.Itoa(i), Candidate: i > 0}
	}
	for i := 1; i < n; i++ {
		p := i - 1
		if rng.IntN(2) == 0 {
			p = rng.IntN(i)
		}
		w := float64(1 + rng.IntN(9))
		if rng.IntN(2) == 0 {
			w = 0.5 + 9*rng.Float64()
		}
		sc.Corridors = append(sc.Corridors, engine.Corridor{From: sc.Nodes[p].ID, To: sc.Nodes[i].ID, Length: w})
	}
	return sc
}

var benchTrees = map[int]engine.Scenario{}

func benchTree(n int) engine.Scenario {
	if sc, ok := benchTrees[n]; ok {
		return sc
	}
	sc := bigTree(n, uint64(n))
	benchTrees[n] = sc
	return sc
}

func benchSite(b *testing.B, n int) *engine.Site {
	b.Helper()
	s, err := engine.NewSite(benchTree(n))
	if err != nil {
		b.Fatal(err)
	}
	return s
}

// freshSite builds a new site from sc with the benchmark timer stopped, so
// that nothing cached on a site (bounds, child lists) carries over between
// iterations and the build itself is not measured.
func freshSite(b *testing.B, sc engine.Scenario) *engine.Site {
	b.Helper()
	b.StopTimer()
	defer b.StartTimer()
	s, err := engine.NewSite(sc)
	if err != nil {
		b.Fatal(err)
	}
	return s
}

func perNode(b *testing.B, n int) {
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/node")
}

func sizeName(n int) string { return fmt.Sprintf("n=%d", n) }

// slowAt remembers, per benchmark family, the size and time per operation of
// the last size measured; a family whose operation took more than
// slowLimit is not run at the next (10× larger) size, and says so. This
// keeps a full -bench run bounded on a shared 2-core machine when a planner
// scales worse than linearly.
var slowAt = map[string]struct {
	n  int
	ns float64
}{}

const slowLimit = 20e9 // ns per operation

func skipIfSlow(b *testing.B, family string, n int) {
	if last, ok := slowAt[family]; ok && last.n < n && last.ns > slowLimit {
		b.Skipf("%s took %.1f s per operation at n=%d (more than %.0f s): not run at n=%d", family, last.ns/1e9, last.n, slowLimit/1e9, n)
	}
}

func noteTime(b *testing.B, family string, n int) {
	slowAt[family] = struct {
		n  int
		ns float64
	}{n, float64(b.Elapsed().Nanoseconds()) / float64(b.N)}
}

func BenchmarkNewSite(b *testing.B) {
	for _, n := range benchSizes {
		b.Run(sizeName(n), func(b *testing.B) {
			sc := benchTree(n)
			b.ResetTimer()
			for b.Loop() {
				if _, err := engine.NewSite(sc); err != nil {
					b.Fatal(err)
				}
			}
			perNode(b, n)
		})
	}
}

// BenchmarkComputeBounds: ComputeBounds caches its result on the site, so
// every iteration builds a fresh site with the timer stopped and measures
// only the first (uncached) ComputeBounds call.
func BenchmarkComputeBounds(b *testing.B) {
	for _, n := range benchSizes {
		b.Run(sizeName(n), func(b *testing.B) {
			sc := benchTree(n)
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				_ = engine.ComputeBounds(freshSite(b, sc))
			}
			perNode(b, n)
		})
	}
}

// BenchmarkPlanner runs every non-search planner under every model it
// supports, on a fresh site per iteration (built with the timer stopped, so
// that nothing cached on the site from an earlier iteration is reused).
func BenchmarkPlanner(b *testing.B) {
	for _, info := range planners.Planners() {
		if info.Search {
			continue
		}
		for _, m := range info.Models {
			for _, n := range benchSizes {
				family := "planner " + info.Name + "/" + m.String()
				b.Run(info.Name+"/"+m.String()+"/"+sizeName(n), func(b *testing.B) {
					skipIfSlow(b, family, n)
					sc := benchTree(n)
					b.ResetTimer()
					for i := 0; i < b.N; i++ {
						if _, err := planners.MakePlan(context.Background(), freshSite(b, sc), info.Name, m, planners.Options{}); err != nil {
							b.Fatal(err)
						}
					}
					perNode(b, n)
					noteTime(b, family, n)
				})
			}
		}
	}
}

// benchBestPlan is BestPlan for the benchmarks: the best plan of the
// non-search planners for m, leaving out (and logging) a planner whose
// benchmark took more than slowLimit per plan at a smaller size.
func benchBestPlan(b *testing.B, s *engine.Site, m engine.Model, n int) *engine.Plan {
	b.Helper()
	var bestP *engine.Plan
	var bestR *engine.Report
	for _, info := range planners.PlannersFor(m) {
		if info.Search {
			continue
		}
		if last, ok := slowAt["planner "+info.Name+"/"+m.String()]; ok && last.n < n && last.ns > slowLimit {
			b.Logf("best plan at n=%d leaves out %s (%.1f s per plan at n=%d)", n, info.Name, last.ns/1e9, last.n)
			continue
		}
		p, err := planners.MakePlan(context.Background(), s, info.Name, m, planners.Options{})
		if err != nil {
			b.Fatal(err)
		}
		r, err := engine.Evaluate(s, p, m)
		if err != nil {
			b.Fatal(err)
		}
		if bestR == nil || engine.Better(r, bestR) {
			bestP, bestR = p, r
		}
	}
	return bestP
}

// BenchmarkEvaluate evaluates the best available plan for each model under
// that model (see benchBestPlan; run after BenchmarkPlanner in a full run).
func BenchmarkEvaluate(b *testing.B) {
	for _, m := range engine.Models {
		for _, n := range benchSizes {
			b.Run(m.String()+"/"+sizeName(n), func(b *testing.B) {
				s := benchSite(b, n)
				p := benchBestPlan(b, s, m, n)
				b.ResetTimer()
				for b.Loop() {
					if _, err := engine.Evaluate(s, p, m); err != nil {
						b.Fatal(err)
					}
				}
				perNode(b, n)
			})
		}
	}
}

// BenchmarkPlanAndEvaluateBoth measures, on a fresh site per iteration,
// "planning plus evaluating under both models" two ways: per planner
// (MakePlan, then Evaluate under both models) and for the app's default
// (BestPlan for each model, which runs every non-search planner and
// evaluates each plan, then the winner under the other model). Compare with
// BenchmarkLoadAndValidate in the same run.
func BenchmarkPlanAndEvaluateBoth(b *testing.B) {
	for _, n := range benchSizes {
		for _, info := range planners.Planners() {
			if info.Search {
				continue
			}
			family := "plan+evaluate " + info.Name
			b.Run(info.Name+"/"+sizeName(n), func(b *testing.B) {
				skipIfSlow(b, family, n)
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					s := freshSite(b, benchTree(n))
					p, err := planners.MakePlan(context.Background(), s, info.Name, info.Models[0], planners.Options{})
					if err != nil {
						b.Fatal(err)
					}
					if _, _, err := engine.EvaluateBoth(s, p); err != nil {
						b.Fatal(err)
					}
				}
				perNode(b, n)
				noteTime(b, family, n)
			})
		}
		b.Run("best/"+sizeName(n), func(b *testing.B) {
			skipIfSlow(b, "plan+evaluate best", n)
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				s := freshSite(b, benchTree(n))
				for _, m := range engine.Models {
					p, _, err := planners.BestPlan(context.Background(), s, m)
					if err != nil {
						b.Fatal(err)
					}
					if _, err := engine.Evaluate(s, p, 1-m); err != nil {
						b.Fatal(err)
					}
				}
			}
			perNode(b, n)
			noteTime(b, "plan+evaluate best", n)
		})
	}
}

// BenchmarkLoadAndValidate is what opening a scenario file costs: parse the
// JSON written by projects.Save and validate it into the Site the planners
// need (projects.LoadSite).
func BenchmarkLoadAndValidate(b *testing.B) {
	for _, n := range benchSizes {
		b.Run(sizeName(n), func(b *testing.B) {
			var buf bytes.Buffer
			if err := projects.Save(&buf, benchTree(n)); err != nil {
				b.Fatal(err)
			}
			data := buf.Bytes()
			b.SetBytes(int64(len(data)))
			b.ResetTimer()
			for b.Loop() {
				if _, _, err := projects.LoadSite(bytes.NewReader(data)); err != nil {
					b.Fatal(err)
				}
			}
			perNode(b, n)
		})
	}
}
