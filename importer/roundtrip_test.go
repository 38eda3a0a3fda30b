package importer

import (
	"bytes"
	"context"
	"encoding/json"
	"testing"

	"duosweep/engine"
	"duosweep/engine/published"
)

func importBytes(t *testing.T, data []byte, opt Options) *Result {
	t.Helper()
	r, err := ReadGeoJSON(data, opt)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

func export(t *testing.T, s *engine.Site, withPlan bool) []byte {
	t.Helper()
	var plan *engine.Plan
	var rep *engine.Report
	if withPlan {
		var err error
		if plan, rep, err = published.BestPlan(context.Background(), s, engine.Radio); err != nil {
			t.Fatal(err)
		}
	}
	var buf bytes.Buffer
	if err := WriteGeoJSON(&buf, s, plan, rep); err != nil {
		t.Fatal(err)
	}
	if !json.Valid(buf.Bytes()) {
		t.Fatal("export is not valid JSON")
	}
	return buf.Bytes()
}

// TestRoundTripSample: import the committed invented network, export it
// with its plan, import the export: the same site.
func TestRoundTripSample(t *testing.T) {
	r1 := importBytes(t, readFile(t, samplePath), DefaultOptions())
	sc := r1.Scenario
	if sc.GeoRef == nil || sc.GeoRef.CRS != engine.GeoRefLonLat {
		t.Fatalf("georef %+v, want lonlat", sc.GeoRef)
	}
	if len(r1.Closed) == 0 || len(sc.Corridors) < 100 {
		t.Fatalf("the sample should have ≥100 corridors and loops: %d corridors, %d closed", len(sc.Corridors), len(r1.Closed))
	}
	if sc.Start != "P1" || sc.Nodes[sc.NodeIndex("P3")].Label != "Refuge A" || !r1.Site.HasProb {
		t.Fatalf("Point layer not applied: start %q", sc.Start)
	}
	out := export(t, r1.Site, true)
	r2 := importBytes(t, out, DefaultOptions())
	sameSite(t, sc, r2.Scenario, 1e-9)
	if sc.Name != r2.Scenario.Name || r2.Scenario.Agents[0] != sc.Agents[0] {
		t.Fatalf("name or agents lost: %q %+v", r2.Scenario.Name, r2.Scenario.Agents)
	}
	if len(r2.Closed) != 0 {
		t.Fatalf("the re-import closed %d more corridors", len(r2.Closed))
	}
	// and again from the second import: byte-identical exports
	if out2 := export(t, r2.Site, true); !bytes.Equal(out, out2) {
		t.Fatal("exporting the re-imported site gives a different file")
	}

	// without the exported lengths, they are measured again from the lines
	var fc map[string]any
	if err := json.Unmarshal(out, &fc); err != nil {
		t.Fatal(err)
	}
	for _, f := range fc["features"].([]any) {
		delete(f.(map[string]any)["properties"].(map[string]any), "length")
	}
	// the lengths differ only where a line end was snapped to a junction
	// (the export draws every corridor from its junction): by at most the snap
	r3 := importBytes(t, marshal(t, fc), DefaultOptions())
	sameSiteLen(t, sc, r3.Scenario, 1e-9, DefaultSnap)
	moved := 0
	for i, c := range sc.Corridors {
		if c.Length != r3.Scenario.Corridors[i].Length {
			moved++
		}
	}
	if moved == 0 || moved > len(sc.Corridors)/4 {
		t.Fatalf("%d of %d lengths changed; want a few (the snapped ends)", moved, len(sc.Corridors))
	}
}

// TestRoundTripPlanar: the same network in projected coordinates (found
// automatically) and from a hand-drawn site (no georef) round-trips too.
func TestRoundTripPlanar(t *testing.T) {
	fc := genNetwork(5, 4, 12, func(x, y float64) [2]float64 { return [2]float64{512000 + x, 4100000 + y} })
	r1 := importBytes(t, marshal(t, fc), DefaultOptions())
	if r1.Scenario.GeoRef.CRS != engine.GeoRefPlanar {
		t.Fatal("projected coordinates not detected")
	}
	mustContain(t, r1.Messages[0], "outside the longitude/latitude range", "plane")
	// a junction's position maps back to the source exactly
	g := r1.Scenario.GeoRef
	n0 := r1.Scenario.Nodes[0]
	e, n := g.FromDrawing(n0.X, n0.Y)
	first := fc.Features[0].Geometry["coordinates"].([][2]float64)[0]
	if e != first[0] || n != first[1] {
		t.Fatalf("node 0 maps back to %g,%g, source %v", e, n, first)
	}
	r2 := importBytes(t, export(t, r1.Site, true), DefaultOptions())
	sameSite(t, r1.Scenario, r2.Scenario, 1e-9)

	// a site drawn in the app (small coordinates, no georef) exports as plane
	// coordinates with y north and comes back the same
	sc := r1.Scenario.Clone()
	sc.GeoRef = nil
	for i := range sc.Nodes {
		sc.Nodes[i].X, sc.Nodes[i].Y = sc.Nodes[i].X/100, sc.Nodes[i].Y/100
	}
	for i := range sc.Corridors {
		for k := range sc.Corridors[i].Path {
			sc.Corridors[i].Path[k][0] /= 100
			sc.Corridors[i].Path[k][1] /= 100
		}
	}
	s, err := engine.NewSite(sc)
	if err != nil {
		t.Fatal(err)
	}
	opt := DefaultOptions()
	opt.Snap = 0.001
	r3 := importBytes(t, export(t, s, false), opt)
	if r3.Scenario.GeoRef.CRS != engine.GeoRefPlanar {
		t.Fatal("the export's crs is not honoured")
	}
	// positions come back shifted to the new origin; compare relative to node 0
	want := sc.Clone()
	dx, dy := r3.Scenario.Nodes[0].X-want.Nodes[0].X, r3.Scenario.Nodes[0].Y-want.Nodes[0].Y
	for i := range want.Nodes {
		want.Nodes[i].X += dx
		want.Nodes[i].Y += dy
	}
	for i := range want.Corridors {
		for k := range want.Corridors[i].Path {
			want.Corridors[i].Path[k][0] += dx
			want.Corridors[i].Path[k][1] += dy
		}
	}
	sameSite(t, want, r3.Scenario, 1e-9)
}

// TestExportRoutes: each route's times are non-decreasing, start at 0 at the
// start node, and end at the trajectory's end; the route length is the
// trajectory's.
func TestExportRoutes(t *testing.T) {
	r := importBytes(t, readFile(t, samplePath), DefaultOptions())
	plan, _, err := published.BestPlan(context.Background(), r.Site, engine.FaceToFace)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteGeoJSON(&buf, r.Site, plan, nil); err != nil {
		t.Fatal(err)
	}
	var fc struct {
		Features []struct {
			Geometry struct {
				Coordinates json.RawMessage `json:"coordinates"`
			} `json:"geometry"`
			Properties map[string]any `json:"properties"`
		} `json:"features"`
	}
	if err := json.Unmarshal(buf.Bytes(), &fc); err != nil {
		t.Fatal(err)
	}
	trs, _ := r.Site.Trajectories(plan)
	routes := 0
	for _, f := range fc.Features {
		if f.Properties["duosweep"] != "route" {
			continue
		}
		var coords [][2]float64
		if err := json.Unmarshal(f.Geometry.Coordinates, &coords); err != nil {
			t.Fatal(err)
		}
		ts := f.Properties["t"].([]any)
		if len(ts) != len(coords) {
			t.Fatalf("%d times for %d vertices", len(ts), len(coords))
		}
		for k := 1; k < len(ts); k++ {
			if ts[k].(float64) < ts[k-1].(float64) {
				t.Fatalf("time goes down at vertex %d: %v", k, ts[k-3:k+2])
			}
		}
		a := routes
		if ts[0].(float64) != 0 || ts[len(ts)-1].(float64) != trs[a].Segs[len(trs[a].Segs)-1].T1 {
			t.Fatalf("route %d times %v..%v", a, ts[0], ts[len(ts)-1])
		}
		if f.Properties["length"].(float64) != trs[a].Length || f.Properties["model"] != "face-to-face" {
			t.Fatalf("route %d properties %v", a, f.Properties)
		}
		start := r.Scenario.Nodes[r.Site.Start]
		e, n := r.Scenario.GeoRef.FromDrawing(start.X, start.Y)
		if c := coords[0]; c != [2]float64{e, n} {
			t.Fatalf("route %d starts at %v, the start is at %g,%g", a, c, e, n)
		}
		routes++
	}
	if routes != 2 {
		t.Fatalf("%d routes", routes)
	}
}
