package importer

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"

	"github.com/paulmach/orb"
	"github.com/paulmach/orb/geojson"

	"duosweep/engine"
)

// ExportFormat is the "format" of the "duosweep" member of an exported
// FeatureCollection.
const ExportFormat = "duosweep-geojson"

// WriteGeoJSON writes the site as a GeoJSON FeatureCollection: one
// LineString per corridor (its path, or straight), one Point per node, and,
// when plan is not nil, one LineString per agent's uninformed route with the
// time at each vertex in the property "t" (a vertex is repeated where the
// agent waits). Coordinates are the source's again for an imported site (the
// scenario's GeoRef), else the drawing's with y pointing north (x, −y).
// Reading the file back with ReadGeoJSON gives the same site: corridors
// carry "length" and "closed", nodes "id", "label", "candidate",
// "probability", "start", and routes are skipped. rep, when not nil, adds the
// plan's worst case to the collection's "duosweep" member. O(n + m + route
// length).
func WriteGeoJSON(w io.Writer, s *engine.Site, plan *engine.Plan, rep *engine.Report) error {
	sc := s.Scenario
	g := engine.GeoRef{CRS: engine.GeoRefPlanar, Scale: [2]float64{1, 1}}
	if sc.GeoRef != nil {
		g = *sc.GeoRef
	}
	xy := drawingPositions(s)
	out := func(p [2]float64) orb.Point {
		e, n := g.FromDrawing(p[0], p[1])
		return orb.Point{e, n}
	}
	fc := geojson.NewFeatureCollection()
	for i, c := range sc.Corridors {
		ls := orb.LineString{out(xy[nodeIdx(s, c.From)])}
		for _, p := range c.Path {
			ls = append(ls, out(p))
		}
		ls = append(ls, out(xy[nodeIdx(s, c.To)]))
		f := geojson.NewFeature(ls)
		f.Properties = geojson.Properties{"duosweep": "corridor", "index": i, "from": c.From, "to": c.To, "length": c.Length}
		if c.Closed {
			f.Properties["closed"] = true
		}
		fc.Append(f)
	}
	for v, n := range sc.Nodes {
		f := geojson.NewFeature(out(xy[v]))
		f.Properties = geojson.Properties{"duosweep": "node", "id": n.ID, "candidate": n.Candidate}
		if n.Label != "" {
			f.Properties["label"] = n.Label
		}
		if n.HasProbability {
			f.Properties["probability"] = n.Probability
		}
		if v == s.Start {
			f.Properties["start"] = true
		}
		fc.Append(f)
	}
	meta := map[string]any{"format": ExportFormat, "version": 1, "name": sc.Name, "unit": s.Unit(), "crs": g.CRS,
		"agents": []map[string]any{{"name": s.Names[0], "speed": s.Speed[0]}, {"name": s.Names[1], "speed": s.Speed[1]}}}
	if plan != nil {
		trs, err := s.Trajectories(plan)
		if err != nil {
			return fmt.Errorf("export: plan: %v", err)
		}
		for a, tr := range trs {
			ls, ts := routeLine(s, xy, tr)
			for k := range ls {
				ls[k] = out([2]float64(ls[k]))
			}
			f := geojson.NewFeature(ls)
			f.Properties = geojson.Properties{"duosweep": routeKind, "agent": s.Names[a], "model": plan.Model.String(),
				"planner": plan.Planner, "t": ts, "length": tr.Length}
			fc.Append(f)
		}
		meta["model"], meta["planner"] = plan.Model.String(), plan.Planner
	}
	if rep != nil && rep.WorstExit >= 0 && !math.IsInf(rep.Worst, 0) {
		meta["worst"] = map[string]any{"node": s.IDs[rep.WorstExit], "evacuated_at": rep.Worst}
	}
	// written by hand around orb's features: one feature per line, so that
	// files stay small and still diff and grep well
	var buf bytes.Buffer
	m, err := json.Marshal(meta)
	if err != nil {
		return fmt.Errorf("export: %v", err)
	}
	buf.WriteString(`{"type":"FeatureCollection","duosweep":`)
	buf.Write(m)
	buf.WriteString(`,"features":[`)
	for i, f := range fc.Features {
		data, err := f.MarshalJSON()
		if err != nil {
			return fmt.Errorf("export: features[%d]: %v", i, err)
		}
		if i > 0 {
			buf.WriteByte(',')
		}
		buf.WriteByte('\n')
		buf.Write(data)
	}
	buf.WriteString("\n]}\n")
	if _, err := w.Write(buf.Bytes()); err != nil {
		return fmt.Errorf("export: %v", err)
	}
	return nil
}

// drawingPositions returns every node's drawing position; nodes without
// coordinates are laid out along the open tree (as the CSV import does).
func drawingPositions(s *engine.Site) [][2]float64 {
	sc := s.Scenario
	net := &network{nodes: make([]jnode, len(sc.Nodes))}
	for i, n := range sc.Nodes {
		net.nodes[i] = jnode{xy: [2]float64{n.X, n.Y}, hasXY: n.HasXY}
	}
	for i, c := range sc.Corridors {
		net.edges = append(net.edges, jedge{from: int(s.EU[i]), to: int(s.EV[i]), length: c.Length, closed: c.Closed})
	}
	layoutMissing(net, s.Start)
	xy := make([][2]float64, len(sc.Nodes))
	for i, n := range net.nodes {
		xy[i] = n.xy
	}
	return xy
}

// corridorShape is a corridor's drawn polyline from EU[e] to EV[e] with its
// cumulative drawn arc length.
type corridorShape struct {
	pts []([2]float64)
	arc []float64
}

func shapeOf(s *engine.Site, xy [][2]float64, e int) corridorShape {
	c := s.Scenario.Corridors[e]
	pts := append([][2]float64{xy[s.EU[e]]}, c.Path...)
	pts = append(pts, xy[s.EV[e]])
	arc := make([]float64, len(pts))
	for k := 1; k < len(pts); k++ {
		arc[k] = arc[k-1] + dist(pts[k-1], pts[k])
	}
	return corridorShape{pts, arc}
}

// at returns the point at drawn arc length a.
func (sh corridorShape) at(a float64) [2]float64 {
	for k := 1; k < len(sh.pts); k++ {
		if a <= sh.arc[k] || k == len(sh.pts)-1 {
			seg := sh.arc[k] - sh.arc[k-1]
			f := 0.0
			if seg > 0 {
				f = math.Max(0, math.Min(1, (a-sh.arc[k-1])/seg))
			}
			p, q := sh.pts[k-1], sh.pts[k]
			return [2]float64{p[0] + f*(q[0]-p[0]), p[1] + f*(q[1]-p[1])}
		}
	}
	return sh.pts[0]
}

// routeLine follows a trajectory along the corridors' drawn shapes: a vertex
// at every segment end and every shape vertex passed, with its time.
func routeLine(s *engine.Site, xy [][2]float64, tr *engine.Trajectory) (orb.LineString, []float64) {
	var ls orb.LineString
	var ts []float64
	add := func(p [2]float64, t float64) {
		n := len(ls)
		if n > 0 && t < ts[n-1] {
			t = ts[n-1] // rounding of the interpolation: times never go down
		}
		if n > 0 && ls[n-1] == orb.Point(p) && ts[n-1] == t {
			return
		}
		ls = append(ls, orb.Point(p))
		ts = append(ts, t)
	}
	add(xy[s.Start], 0)
	shapes := map[int32]corridorShape{}
	for _, g := range tr.Segs {
		if g.E < 0 {
			add(xy[g.Node], g.T0)
			add(xy[g.Node], g.T1)
			continue
		}
		sh, ok := shapes[g.E]
		if !ok {
			sh = shapeOf(s, xy, int(g.E))
			shapes[g.E] = sh
		}
		total := sh.arc[len(sh.arc)-1]
		scale := total / s.EW[g.E] // drawn per real length
		a0, a1 := g.O0*scale, g.O1*scale
		timeAt := func(a float64) float64 {
			if a1 == a0 {
				return g.T0
			}
			return g.T0 + (a-a0)/(a1-a0)*(g.T1-g.T0)
		}
		add(sh.at(a0), g.T0)
		if a1 > a0 {
			for k := 1; k < len(sh.pts)-1; k++ {
				if sh.arc[k] > a0 && sh.arc[k] < a1 {
					add(sh.pts[k], timeAt(sh.arc[k]))
				}
			}
		} else {
			for k := len(sh.pts) - 2; k >= 1; k-- {
				if sh.arc[k] < a0 && sh.arc[k] > a1 {
					add(sh.pts[k], timeAt(sh.arc[k]))
				}
			}
		}
		add(sh.at(a1), g.T1)
	}
	if len(ls) == 1 {
		ls = append(ls, ls[0])
		ts = append(ts, ts[0])
	}
	return ls, ts
}

func nodeIdx(s *engine.Site, id string) int {
	v, _ := s.Index(id)
	return v
}
