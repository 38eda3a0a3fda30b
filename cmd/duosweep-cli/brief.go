package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"duosweep/brief"
	"duosweep/engine"
	"duosweep/engine/planners"
	"duosweep/projects"
)

func init() {
	register(command{
		name: "brief",
		args: "SCENARIO [--out brief.pdf] [--model M] [--planner P] [--paper a4|letter] [--svg F] [--png F] [--size W×H] " +
			"[--gif F [--exit ID] [--fps N] [--seconds S] [--side-by-side MODEL]] [--csv F]",
		summary: "write a crew briefing: a PDF (map, figures, itineraries), the map as SVG or PNG, the replay as an animated GIF, a timetable CSV",
		run:     runBrief,
	})
	flagSets["brief"] = func() *flag.FlagSet { fs, _ := briefFlags(); return fs }
}

type briefOpts struct {
	out, model, planner, paper string
	svg, png, size             string
	gif, exit, side            string
	fps                        int
	seconds                    float64
	csv                        string
}

func briefFlags() (*flag.FlagSet, *briefOpts) {
	o := &briefOpts{}
	fs := newFlags("brief")
	fs.StringVar(&o.out, "out", "", "write the PDF briefing to this file")
	fs.StringVar(&o.model, "model", "radio", "communication model: radio or face-to-face")
	fs.StringVar(&o.planner, "planner", "", "planner name (default: the best of the non-search planners)")
	fs.StringVar(&o.paper, "paper", "a4", "PDF paper size: a4 or letter")
	fs.StringVar(&o.svg, "svg", "", "write the site map as SVG to this file")
	fs.StringVar(&o.png, "png", "", "write the site map as PNG to this file")
	fs.StringVar(&o.size, "size", "", "picture size W×H or WxH in pixels (default 1200x800; the GIF's default is 640x400)")
	fs.StringVar(&o.gif, "gif", "", "write the replay of one exit as an animated GIF to this file")
	fs.StringVar(&o.exit, "exit", "", "GIF: the candidate to replay (default: the worst exit)")
	fs.IntVar(&o.fps, "fps", 10, "GIF: frames per second (1 to 50)")
	fs.Float64Var(&o.seconds, "seconds", 20, "GIF: length in seconds (0.1 to 600)")
	fs.StringVar(&o.side, "side-by-side", "", "GIF: add a panel with the same plan under this model (radio or face-to-face)")
	fs.StringVar(&o.csv, "csv", "", "write the timetable as CSV to this file")
	return fs, o
}

// parseSize parses "W×H" or "WxH".
func parseSize(v string) (w, h int, err error) {
	a, b, ok := strings.Cut(strings.ReplaceAll(strings.ReplaceAll(v, "×", "x"), "X", "x"), "x")
	if ok {
		w, err = strconv.Atoi(strings.TrimSpace(a))
		if err == nil {
			h, err = strconv.Atoi(strings.TrimSpace(b))
		}
	}
	if !ok || err != nil || w < 32 || h < 32 || w > 10000 || h > 10000 {
		return 0, 0, fmt.Errorf("--size: %q: want W×H or WxH, each from 32 to 10000 pixels", v)
	}
	return w, h, nil
}

// checkOutPath refuses an output path whose directory does not exist or
// cannot take a new file, before any work is done.
func checkOutPath(flagName, path string) error {
	if path == "" || strings.HasSuffix(path, string(os.PathSeparator)) {
		return fmt.Errorf("--%s: %q: want a file name", flagName, path)
	}
	if fi, err := os.Stat(path); err == nil && fi.IsDir() {
		return fmt.Errorf("--%s: %s: is a directory", flagName, path)
	}
	dir := filepath.Dir(path)
	fi, err := os.Stat(dir)
	switch {
	case err != nil:
		return fmt.Errorf("--%s: %s: the directory %s does not exist", flagName, path, dir)
	case !fi.IsDir():
		return fmt.Errorf("--%s: %s: %s is not a directory", flagName, path, dir)
	}
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".check-*")
	if err != nil {
		var pe *os.PathError
		if errors.As(err, &pe) {
			err = pe.Err
		}
		return fmt.Errorf("--%s: %s: cannot write in %s: %v", flagName, path, dir, err)
	}
	f.Close()
	os.Remove(f.Name())
	return nil
}

func runBrief(e *env, args []string) error {
	fs, o := briefFlags()
	pos, err := parseArgs(fs, args, 1, 1, "SCENARIO")
	if err != nil {
		return err
	}
	set := map[string]bool{}
	fs.Visit(func(f *flag.Flag) { set[f.Name] = true })
	m, err := parseModel(o.model)
	if err != nil {
		return err
	}
	paper := strings.ToLower(o.paper)
	if paper != brief.A4 && paper != brief.Letter {
		return fmt.Errorf("--paper: %q: want a4 or letter", o.paper)
	}
	if o.planner != "" {
		if _, err := findPlanner(o.planner); err != nil {
			return err
		}
	}
	outs := []struct{ flag, path string }{{"out", o.out}, {"svg", o.svg}, {"png", o.png}, {"gif", o.gif}, {"csv", o.csv}}
	seen := map[string]string{}
	any := false
	for _, x := range outs {
		if !set[x.flag] {
			continue
		}
		any = true
		if err := checkOutPath(x.flag, x.path); err != nil {
			return err
		}
		abs, _ := filepath.Abs(x.path)
		if prev, dup := seen[abs]; dup {
			return fmt.Errorf("--%s: %s: the same file as --%s", x.flag, x.path, prev)
		}
		seen[abs] = x.flag
	}
	if !any {
		return fmt.Errorf("nothing to write: give --out, --svg, --png, --gif or --csv")
	}
	for _, f := range []string{"exit", "fps", "seconds", "side-by-side"} {
		if set[f] && o.gif == "" {
			return fmt.Errorf("--%s: only used with --gif", f)
		}
	}
	if set["size"] && o.svg == "" && o.png == "" && o.gif == "" {
		return fmt.Errorf("--size: only used with --svg, --png or --gif")
	}
	pw, ph := 1200, 800
	gw, gh := 640, 400
	if set["size"] {
		if pw, ph, err = parseSize(o.size); err != nil {
			return err
		}
		gw, gh = pw, ph
	}
	gopt := brief.GIFOptions{W: gw, H: gh, FPS: o.fps, Seconds: o.seconds, Exit: o.exit}
	if o.gif != "" {
		if o.fps < 1 || o.fps > 50 {
			return fmt.Errorf("--fps: %d: want 1 to 50", o.fps)
		}
		if !(o.seconds >= 0.1 && o.seconds <= 600) {
			return fmt.Errorf("--seconds: %g: want 0.1 to 600", o.seconds)
		}
		if gw > 4000 || gh > 4000 || gw < 64 || gh < 64 {
			return fmt.Errorf("--size: %q: an animation takes 64 to 4000 pixels in each direction", o.size)
		}
		if o.side != "" {
			sm, err := engine.ParseModel(o.side)
			if err != nil {
				return fmt.Errorf("--side-by-side: %q: want radio or face-to-face", o.side)
			}
			if sm == m {
				return fmt.Errorf("--side-by-side: %q is the first panel's model already (--model %s): name the other", o.side, m)
			}
			gopt.Compare = &sm
		}
	}
	s, err := loadSite(pos[0])
	if err != nil {
		return err
	}
	if o.exit != "" {
		v, ok := s.Index(o.exit)
		switch {
		case !ok:
			return fmt.Errorf("--exit: %q: no node has this id", o.exit)
		case !s.Candidate[v]:
			return fmt.Errorf("--exit: %q: not a candidate", o.exit)
		}
	}
	p, r, err := makePlan(e, s, o.planner, m, planners.Options{})
	if err != nil {
		return err
	}
	in := brief.Input{Site: s, Plan: p, Report: r}
	write := func(path string, fn func(w io.Writer) error) error {
		if err := projects.WriteFileAtomic(path, fn); err != nil {
			return failure{err}
		}
		return nil
	}
	if o.out != "" {
		pages := 0
		if err := write(o.out, func(w io.Writer) (err error) {
			pages, err = brief.WritePDF(w, in, brief.PDFOptions{Paper: paper})
			return err
		}); err != nil {
			return err
		}
		fmt.Fprintf(e.stdout, "wrote %s (PDF briefing, %d pages)\n", o.out, pages)
	}
	if o.svg != "" || o.png != "" {
		mp, err := brief.BuildMap(in, float64(pw), float64(ph), brief.MapOptions{Title: siteTitle(s, r), Notice: true})
		if err != nil {
			return err
		}
		if o.svg != "" {
			if err := write(o.svg, func(w io.Writer) error { return brief.WriteSVG(w, &mp.Scene) }); err != nil {
				return err
			}
			fmt.Fprintf(e.stdout, "wrote %s (SVG map, %d×%d)\n", o.svg, pw, ph)
		}
		if o.png != "" {
			if err := write(o.png, func(w io.Writer) error { return brief.WritePNG(w, &mp.Scene) }); err != nil {
				return err
			}
			fmt.Fprintf(e.stdout, "wrote %s (PNG map, %d×%d)\n", o.png, pw, ph)
		}
	}
	if o.gif != "" {
		if err := write(o.gif, func(w io.Writer) error { return brief.WriteGIF(e.ctx, w, in, gopt) }); err != nil {
			return err
		}
		fmt.Fprintf(e.stdout, "wrote %s (GIF, %d×%d, %d frames at %d fps)\n", o.gif, gw, gh, gopt.Frames(), o.fps)
	}
	if o.csv != "" {
		if err := write(o.csv, func(w io.Writer) error { return brief.WriteCSV(w, in) }); err != nil {
			return err
		}
		fmt.Fprintf(e.stdout, "wrote %s (timetable CSV)\n", o.csv)
	}
	return nil
}

// siteTitle is the heading of a map picture.
func siteTitle(s *engine.Site, r *engine.Report) string {
	name := s.Scenario.Name
	if name == "" {
		name = "(unnamed site)"
	}
	return fmt.Sprintf("%s · %s · worst case %s", name, r.Model, projects.FormatDuration(r.Worst))
}
