package main

import (
	"bytes"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"runtime"
	"sort"
	"strconv"
	"strings"
	"time"

	"duosweep/engine"
	"duosweep/engine/gen"
	"duosweep/engine/planners"
	"duosweep/engine/search"
)

func init() {
	register(command{
		name: "study",
		args: "[--seconds 5] [--sizes 20,100,500] [--seeds 5] [--families random,spider,caterpillar,binary] [--models radio,face-to-face] [--exhaustive] [--out PATH] [--append]",
		summary: "measure the search planners on generated sites and write a Markdown table: certified gaps of every " +
			"published planner and of improve (or, with --exhaustive, the time exhaustive needs to prove its class optimum)",
		run: runStudy,
	})
	flagSets["study"] = func() *flag.FlagSet { fs, _ := studyFlags(); return fs }
}

type studyOpts struct {
	seconds    float64
	sizes      string
	seeds      int
	families   string
	models     string
	exhaustive bool
	out        string
	appendOut  bool
}

func studyFlags() (*flag.FlagSet, *studyOpts) {
	o := &studyOpts{}
	fs := newFlags("study")
	fs.Float64Var(&o.seconds, "seconds", 5, "time budget of each search run in seconds")
	fs.StringVar(&o.sizes, "sizes", "20,100,500", "comma-separated site sizes (nodes)")
	fs.IntVar(&o.seeds, "seeds", 5, "generated sites per family and size (seeds 1..N)")
	fs.StringVar(&o.families, "families", "random,spider,caterpillar,binary", "comma-separated tree families: "+strings.Join(gen.Families, ", "))
	fs.StringVar(&o.models, "models", "radio,face-to-face", "comma-separated models")
	fs.BoolVar(&o.exhaustive, "exhaustive", false, "time the exhaustive planner instead (its budget is --seconds)")
	fs.StringVar(&o.out, "out", "", "Markdown output file (default: stdout)")
	fs.BoolVar(&o.appendOut, "append", false, "append to --out instead of replacing it")
	return fs, o
}

// studyCommand rebuilds the command line for the table heading.
func studyCommand(args []string) string {
	q := make([]string, len(args))
	for i, a := range args {
		if strings.ContainsAny(a, " \t\"'") {
			a = strconv.Quote(a)
		}
		q[i] = a
	}
	return strings.TrimSpace(progName + " study " + strings.Join(q, " "))
}

func runStudy(e *env, args []string) error {
	fs, o := studyFlags()
	if _, err := parseArgs(fs, args, 0, 0, "no arguments besides flags"); err != nil {
		return err
	}
	b, err := budget(o.seconds)
	if err != nil {
		return err
	}
	if b <= 0 {
		return fmt.Errorf("--seconds: %g: want a budget above 0", o.seconds)
	}
	var sizes []int
	for _, f := range strings.Split(o.sizes, ",") {
		n, err := strconv.Atoi(strings.TrimSpace(f))
		if err != nil || n < 2 || n > 1_000_000 {
			return fmt.Errorf("--sizes: %q: want whole numbers from 2 to 1000000", f)
		}
		sizes = append(sizes, n)
	}
	if o.seeds < 1 || o.seeds > 1000 {
		return fmt.Errorf("--seeds: %d: want 1 to 1000", o.seeds)
	}
	var fams []string
	for _, f := range strings.Split(o.families, ",") {
		f = strings.TrimSpace(f)
		if _, err := gen.Generate(f, 2, 1); err != nil {
			return fmt.Errorf("--families: %q: want some of %s", f, strings.Join(gen.Families, ", "))
		}
		fams = append(fams, f)
	}
	var models []engine.Model
	for _, f := range strings.Split(o.models, ",") {
		m, err := parseModel(strings.TrimSpace(f))
		if err != nil {
			return fmt.Errorf("--models: %q: want radio or face-to-face", f)
		}
		models = append(models, m)
	}
	var buf bytes.Buffer
	hdr := studyHeader{command: studyCommand(args), load0: loadAvg(), start: time.Now()}
	if o.exhaustive {
		err = studyExhaustive(e, &buf, &hdr, fams, sizes, o.seeds, models, b)
	} else {
		err = studyGaps(e, &buf, &hdr, fams, sizes, o.seeds, models, b)
	}
	if err != nil {
		return err
	}
	if o.out == "" {
		_, err := e.stdout.Write(buf.Bytes())
		return writeOut(err)
	}
	flags := os.O_CREATE | os.O_WRONLY | os.O_TRUNC
	if o.appendOut {
		flags = os.O_CREATE | os.O_WRONLY | os.O_APPEND
	}
	f, err := os.OpenFile(o.out, flags, 0o644)
	if err != nil {
		return failf("--out: %s: %v", o.out, err)
	}
	if _, err := f.Write(buf.Bytes()); err != nil {
		f.Close()
		return failf("--out: %s: %v", o.out, err)
	}
	return writeOut(f.Close())
}

type studyHeader struct {
	command string
	load0   string
	start   time.Time
}

func (h *studyHeader) write(w io.Writer, title string) {
	fmt.Fprintf(w, "## %s\n\nMade by `%s` (%s, %d CPUs, Go %s; load average at the start %s, at the end %s; %s in all).\n\n",
		title, h.command, runtime.GOOS+"/"+runtime.GOARCH, runtime.NumCPU(), runtime.Version(), h.load0, loadAvg(),
		time.Since(h.start).Round(time.Second))
}

// loadAvg returns the 1-minute load average, or "unknown".
func loadAvg() string {
	b, err := os.ReadFile("/proc/loadavg")
	if err != nil {
		return "unknown"
	}
	if f := strings.Fields(string(b)); len(f) > 0 {
		return f[0]
	}
	return "unknown"
}

type gapStat struct {
	n        int
	sum, max float64
}

func (g *gapStat) add(x float64) {
	g.n++
	g.sum += x
	g.max = math.Max(g.max, x)
}

func (g gapStat) String() string {
	if g.n == 0 {
		return "–"
	}
	return fmt.Sprintf("%.2f%% / %.2f%%", 100*g.sum/float64(g.n), 100*g.max)
}

func (g gapStat) mean() float64 {
	if g.n == 0 {
		return math.NaN()
	}
	return g.sum / float64(g.n)
}

func studySite(fam string, n int, seed int64) (*engine.Site, error) {
	sc, err := gen.Generate(fam, n, seed)
	if err != nil {
		return nil, failf("study: %v", err)
	}
	s, err := engine.NewSite(sc)
	if err != nil {
		return nil, failf("study: %s: %v", sc.Name, err)
	}
	return s, nil
}

// studyGaps: for every family, size, model and seed, the certified gap of
// every published planner, of the best of them, and of improve with the budget.
func studyGaps(e *env, w io.Writer, hdr *studyHeader, fams []string, sizes []int, seeds int, models []engine.Model, b time.Duration) error {
	var published []string
	for _, p := range planners.Planners() {
		if !p.Search {
			published = append(published, p.Name)
		}
	}
	type key struct {
		fam  string
		n    int
		m    engine.Model
		name string
	}
	stats := map[key]*gapStat{}
	stat := func(k key) *gapStat {
		if stats[k] == nil {
			stats[k] = &gapStat{}
		}
		return stats[k]
	}
	worse, runs := 0, 0
	var evals, iters int
	var secs float64
	type famModel struct {
		fam string
		m   engine.Model
	}
	pubMean, impMean := map[famModel]*gapStat{}, map[famModel]*gapStat{}
	for _, fam := range fams {
		for _, n := range sizes {
			for seed := 1; seed <= seeds; seed++ {
				s, err := studySite(fam, n, int64(seed))
				if err != nil {
					return err
				}
				for _, m := range models {
					if err := e.ctx.Err(); err != nil {
						return failure{err}
					}
					bestGap := math.Inf(1)
					bestWorst := math.Inf(1)
					for _, name := range published {
						info, _ := findPlanner(name)
						if !info.Supports(m) {
							continue
						}
						p, err := planners.MakePlan(e.ctx, s, name, m, planners.Options{})
						if err != nil {
							return failure{err}
						}
						r, err := engine.Evaluate(s, p, m)
						if err != nil {
							return failf("study: %s made an invalid plan: %v", name, err)
						}
						stat(key{fam, n, m, name}).add(r.Gap)
						if r.Worst < bestWorst {
							bestWorst, bestGap = r.Worst, r.Gap
						}
					}
					stat(key{fam, n, m, "best published"}).add(bestGap)
					p, res, err := search.Improve(e.ctx, s, m, planners.Options{Budget: b, Seed: int64(seed)})
					if err != nil {
						return failure{err}
					}
					r, err := engine.Evaluate(s, p, m)
					if err != nil {
						return failf("study: improve made an invalid plan: %v", err)
					}
					stat(key{fam, n, m, "improve"}).add(r.Gap)
					fm := famModel{fam, m}
					if pubMean[fm] == nil {
						pubMean[fm], impMean[fm] = &gapStat{}, &gapStat{}
					}
					pubMean[fm].add(bestGap)
					impMean[fm].add(r.Gap)
					runs++
					if r.Worst > bestWorst*(1+1e-9) {
						worse++
					}
					evals += res.Evaluations
					iters += res.Iterations
					secs += res.Elapsed.Seconds()
					fmt.Fprintf(e.stderr, "study: %s n=%d seed %d %s: best published gap %.2f%%, improve %.2f%% (%d evaluations in %.1f s)\n",
						fam, n, seed, m, 100*bestGap, 100*r.Gap, res.Evaluations, res.Elapsed.Seconds())
				}
			}
		}
	}
	hdr.write(w, "Certified gaps: published planners and improve")
	fmt.Fprintf(w, "Sites from `gen.Generate(family, n, seed)` for seeds 1..%d (integer corridor lengths 1..100, every node but the start a candidate, equal speeds). "+
		"Gap = worst case / lower bound − 1 (LB = max(LB1/v, LB2/v, LB3): MODEL.md §5 and docs/lower-bound.md), so 0%% means proven optimal. Each cell is mean / max over the seeds. "+
		"improve ran with a %v budget and its seed set to the site's seed; time budgets make its results depend on the machine and its load.\n\n", seeds, b)
	cols := append(append([]string{}, published...), "best published", "improve")
	fmt.Fprintf(w, "| family | nodes | model | %s |\n|---|---:|---|%s\n", strings.Join(cols, " | "), strings.Repeat("---:|", len(cols)))
	for _, fam := range fams {
		for _, n := range sizes {
			for _, m := range models {
				cells := make([]string, len(cols))
				for i, c := range cols {
					if st := stats[key{fam, n, m, c}]; st != nil {
						cells[i] = st.String()
					} else {
						cells[i] = "–"
					}
				}
				fmt.Fprintf(w, "| %s | %d | %s | %s |\n", fam, n, m, strings.Join(cells, " | "))
			}
		}
	}
	fmt.Fprintf(w, "\nMean gap per family and model over all sizes, and how much of the best published planner's gap improve removes "+
		"(the goal is at least one third):\n\n| family | model | best published | improve | reduction |\n|---|---|---:|---:|---:|\n")
	fmKeys := make([]famModel, 0, len(pubMean))
	for k := range pubMean {
		fmKeys = append(fmKeys, k)
	}
	sort.Slice(fmKeys, func(i, j int) bool {
		if fmKeys[i].fam != fmKeys[j].fam {
			return indexOf(fams, fmKeys[i].fam) < indexOf(fams, fmKeys[j].fam)
		}
		return fmKeys[i].m < fmKeys[j].m
	})
	for _, k := range fmKeys {
		pm, im := pubMean[k].mean(), impMean[k].mean()
		red := "–"
		if pm > 0 {
			red = fmt.Sprintf("%.0f%%", 100*(1-im/pm))
		}
		fmt.Fprintf(w, "| %s | %s | %.2f%% | %.2f%% | %s |\n", k.fam, k.m, 100*pm, 100*im, red)
	}
	fmt.Fprintf(w, "\nimprove was worse than the best published planner on %d of %d runs; it made %d iterations and %d exact evaluations "+
		"in %.0f s (%.0f evaluations per second on average).\n\n", worse, runs, iters, evals, secs, float64(evals)/math.Max(secs, 1e-9))
	return nil
}

func indexOf(xs []string, x string) int {
	for i, y := range xs {
		if y == x {
			return i
		}
	}
	return len(xs)
}

// studyExhaustive: how long exhaustive needs to prove its class optimum.
func studyExhaustive(e *env, w io.Writer, hdr *studyHeader, fams []string, sizes []int, seeds int, models []engine.Model, b time.Duration) error {
	type row struct {
		fam    string
		n      int
		m      engine.Model
		proven int
		runs   int
		times  []float64
		states int64
		won    map[string]int
	}
	var rows []*row
	for _, fam := range fams {
		for _, n := range sizes {
			for _, m := range models {
				r := &row{fam: fam, n: n, m: m, won: map[string]int{}}
				rows = append(rows, r)
				for seed := 1; seed <= seeds; seed++ {
					s, err := studySite(fam, n, int64(seed))
					if err != nil {
						return err
					}
					if err := search.CheckExhaustiveSize(s); err != nil {
						fmt.Fprintf(e.stderr, "study: %s n=%d: %v\n", fam, n, err)
						continue
					}
					t0 := time.Now()
					_, res, err := search.Exhaustive(e.ctx, s, m, planners.Options{Budget: b, Seed: int64(seed)})
					if err != nil {
						return failure{err}
					}
					el := time.Since(t0).Seconds()
					r.runs++
					if res.Proven {
						r.proven++
						r.times = append(r.times, el)
					}
					r.states += res.States
					r.won[res.Incumbent]++
					fmt.Fprintf(e.stderr, "study: exhaustive %s n=%d seed %d %s: proven %v in %.2f s, %d states, best from %s\n",
						fam, n, seed, m, res.Proven, el, res.States, res.Incumbent)
				}
			}
		}
	}
	hdr.write(w, "Exhaustive search: time to prove the class optimum")
	fmt.Fprintf(w, "Sites from `gen.Generate(family, n, seed)` for seeds 1..%d; time limit %v per run; times are wall clock on a shared machine (see the load above). "+
		"\"best from\" counts where the winning plan came from: the search itself, or its seeds (a published planner, or the short improve run).\n\n", seeds, b)
	fmt.Fprintf(w, "| family | nodes | model | proven | mean s | max s | states per run | best from |\n|---|---:|---|---:|---:|---:|---:|---|\n")
	for _, r := range rows {
		if r.runs == 0 {
			fmt.Fprintf(w, "| %s | %d | %s | refused (over the size limit) | | | | |\n", r.fam, r.n, r.m)
			continue
		}
		mean, mx := 0.0, 0.0
		for _, t := range r.times {
			mean += t
			mx = math.Max(mx, t)
		}
		meanS, maxS := "–", "–"
		if len(r.times) > 0 {
			meanS, maxS = fmt.Sprintf("%.2f", mean/float64(len(r.times))), fmt.Sprintf("%.2f", mx)
		}
		names := make([]string, 0, len(r.won))
		for k := range r.won {
			names = append(names, k)
		}
		sort.Strings(names)
		var won []string
		for _, k := range names {
			won = append(won, fmt.Sprintf("%s %d", k, r.won[k]))
		}
		fmt.Fprintf(w, "| %s | %d | %s | %d/%d | %s | %s | %d | %s |\n", r.fam, r.n, r.m, r.proven, r.runs, meanS, maxS, r.states/int64(r.runs), strings.Join(won, ", "))
	}
	fmt.Fprintln(w)
	return nil
}
