package main

import (
	"bytes"
	"context"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"duosweep/engine"
	"duosweep/engine/planners"
	"duosweep/importer"
	"duosweep/projects"
)

func init() {
	register(command{
		name:    "import",
		args:    "FILE.geojson|FILE.csv --out SITE.sweep.json [--start NAME | --start-near X,Y] [--snap D] [--planar] [--largest] [--nodes NODES.csv]",
		summary: "make a scenario from a GeoJSON network of corridor centrelines or from CSV tables of corridors and nodes",
		run:     runImport,
	})
	flagSets["import"] = func() *flag.FlagSet { fs, _ := importFlags(); return fs }
	register(command{
		name:    "export",
		args:    "SITE.sweep.json --geojson OUT.geojson [--model radio|face-to-face]",
		summary: "write a site and its best plan's two timed routes as GeoJSON for a GIS",
		run:     runExport,
	})
	flagSets["export"] = func() *flag.FlagSet { fs, _ := exportFlags(); return fs }
}

type importOpts struct {
	out, start, startNear, nodes string
	snap                         float64
	planar, largest              bool
}

func importFlags() (*flag.FlagSet, *importOpts) {
	o := &importOpts{}
	fs := newFlags("import")
	fs.StringVar(&o.out, "out", "", "the scenario file to write (required)")
	fs.StringVar(&o.start, "start", "", "id or Point name of the start node")
	fs.StringVar(&o.startNear, "start-near", "", "X,Y: the junction nearest to this position (longitude,latitude or plane x,y) is the start")
	fs.Float64Var(&o.snap, "snap", importer.DefaultSnap, "GeoJSON: line ends closer than this (metres, or plane units) become one junction")
	fs.BoolVar(&o.planar, "planar", false, "GeoJSON: coordinates are plane coordinates, not longitude/latitude")
	fs.BoolVar(&o.largest, "largest", false, "keep the largest connected piece and drop the others")
	fs.StringVar(&o.nodes, "nodes", "", "CSV: the nodes table (id,label,x,y,candidate,probability)")
	return fs, o
}

func runImport(e *env, args []string) error {
	fs, o := importFlags()
	pos, err := parseArgs(fs, args, 1, 1, "FILE.geojson or FILE.csv")
	if err != nil {
		return err
	}
	if o.out == "" {
		return fmt.Errorf("--out: missing: name the scenario file to write")
	}
	set := map[string]bool{}
	fs.Visit(func(f *flag.Flag) { set[f.Name] = true })
	opt := importer.Options{Start: o.start, Snap: o.snap, Planar: o.planar, Largest: o.largest}
	if o.startNear != "" {
		if o.start != "" {
			return fmt.Errorf("--start and --start-near: give one of them")
		}
		p, err := parseXY(o.startNear)
		if err != nil {
			return fmt.Errorf("--start-near: %q: %v", o.startNear, err)
		}
		opt.StartNear = &p
	}
	in := pos[0]
	ext := strings.ToLower(filepath.Ext(in))
	var res *importer.Result
	switch ext {
	case ".geojson", ".json":
		if o.nodes != "" {
			return fmt.Errorf("--nodes: a nodes table goes with a CSV corridors table, not with GeoJSON (use Point features)")
		}
		data, err := os.ReadFile(in)
		if err != nil {
			return fmt.Errorf("%s: cannot read: %v", in, pathReason(err))
		}
		res, err = importer.ReadGeoJSON(data, opt)
		if err != nil {
			return fmt.Errorf("%s: %v", in, trimImport(err))
		}
	case ".csv":
		for _, f := range []string{"snap", "planar"} {
			if set[f] {
				return fmt.Errorf("--%s: applies to GeoJSON only", f)
			}
		}
		data, err := os.ReadFile(in)
		if err != nil {
			return fmt.Errorf("%s: cannot read: %v", in, pathReason(err))
		}
		var nodes io.Reader
		if o.nodes != "" {
			nd, err := os.ReadFile(o.nodes)
			if err != nil {
				return fmt.Errorf("--nodes: %s: cannot read: %v", o.nodes, pathReason(err))
			}
			nodes = bytes.NewReader(nd)
		}
		res, err = importer.ReadCSV(bytes.NewReader(data), nodes, opt)
		if err != nil {
			return fmt.Errorf("%s: %v", in, trimImport(err))
		}
	default:
		return fmt.Errorf("%s: unknown kind of file %q: want .geojson, .json or .csv", in, ext)
	}
	if res.Scenario.Name == "" {
		res.Scenario.Name = strings.TrimSuffix(filepath.Base(in), filepath.Ext(in))
	}
	if err := projects.SaveFile(o.out, res.Scenario); err != nil {
		return failure{err}
	}
	for _, m := range res.Messages {
		fmt.Fprintln(e.stdout, m)
	}
	closed := 0
	for _, c := range res.Scenario.Corridors {
		if c.Closed {
			closed++
		}
	}
	fmt.Fprintf(e.stdout, "wrote %s: %d junctions, %d corridors (%d closed), start %q\n", o.out, len(res.Scenario.Nodes), len(res.Scenario.Corridors), closed, res.Scenario.Start)
	return nil
}

func parseXY(s string) ([2]float64, error) {
	parts := strings.Split(s, ",")
	if len(parts) != 2 {
		return [2]float64{}, fmt.Errorf("want X,Y")
	}
	var p [2]float64
	for i, t := range parts {
		x, err := strconv.ParseFloat(strings.TrimSpace(t), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return [2]float64{}, fmt.Errorf("%q: not a finite number", t)
		}
		p[i] = x
	}
	return p, nil
}

func pathReason(err error) string {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err.Error()
	}
	return err.Error()
}

// trimImport drops the "import: " prefix (the subcommand name says it).
func trimImport(err error) string { return strings.TrimPrefix(err.Error(), "import: ") }

type exportOpts struct{ geojson, model string }

func exportFlags() (*flag.FlagSet, *exportOpts) {
	o := &exportOpts{}
	fs := newFlags("export")
	fs.StringVar(&o.geojson, "geojson", "", "the GeoJSON file to write (required)")
	fs.StringVar(&o.model, "model", "radio", "communication model of the plan: radio or face-to-face")
	return fs, o
}

func runExport(e *env, args []string) error {
	fs, o := exportFlags()
	pos, err := parseArgs(fs, args, 1, 1, "SITE.sweep.json")
	if err != nil {
		return err
	}
	if o.geojson == "" {
		return fmt.Errorf("--geojson: missing: name the GeoJSON file to write")
	}
	m, err := parseModel(o.model)
	if err != nil {
		return err
	}
	s, err := loadSite(pos[0])
	if err != nil {
		return err
	}
	ctx := e.ctx
	if ctx == nil {
		ctx = context.Background()
	}
	var plan *engine.Plan
	var rep *engine.Report
	if len(s.Candidates()) > 0 {
		if plan, rep, err = planners.BestPlan(ctx, s, m); err != nil {
			return failf("plan: %v", err)
		}
	}
	if err := projects.WriteFileAtomic(o.geojson, func(w io.Writer) error { return importer.WriteGeoJSON(w, s, plan, rep) }); err != nil {
		return failure{err}
	}
	if plan != nil {
		fmt.Fprintf(e.stdout, "wrote %s: %d corridors, %d nodes, the %s plan (%s) with worst case %s\n", o.geojson, len(s.Scenario.Corridors), s.N, plan.Planner, m, projects.FormatDuration(rep.Worst))
	} else {
		fmt.Fprintf(e.stdout, "wrote %s: %d corridors, %d nodes (no candidates, no plan)\n", o.geojson, len(s.Scenario.Corridors), s.N)
	}
	return nil
}
