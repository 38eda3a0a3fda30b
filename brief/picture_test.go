package brief

import (
	"bytes"
	"encoding/xml"
	"image/color"
	"image/png"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"
	"testing"

	"duosweep/engine"
	"duosweep/engine/planners"
)

// svgPath is what the test reads back from an SVG path element.
type svgPath struct {
	ID, Class string
	Pts       []Pt
}

func parseSVG(t *testing.T, data []byte) (paths []svgPath, texts []string) {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(data))
	inText := false
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG does not parse as XML: %v", err)
		}
		switch el := tok.(type) {
		case xml.StartElement:
			attr := map[string]string{}
			for _, a := range el.Attr {
				attr[a.Name.Local] = a.Value
			}
			switch el.Name.Local {
			case "path":
				p := svgPath{ID: attr["id"], Class: attr["class"]}
				f := strings.Fields(strings.NewReplacer("M", " ", "L", " ", "Z", " ").Replace(attr["d"]))
				if len(f)%2 != 0 {
					t.Fatalf("odd path data %q", attr["d"])
				}
				for i := 0; i < len(f); i += 2 {
					x, err1 := strconv.ParseFloat(f[i], 64)
					y, err2 := strconv.ParseFloat(f[i+1], 64)
					if err1 != nil || err2 != nil {
						t.Fatalf("path data %q", attr["d"])
					}
					p.Pts = append(p.Pts, Pt{X: x, Y: y})
				}
				paths = append(paths, p)
			case "text":
				inText = true
			}
		case xml.CharData:
			if inText {
				texts = append(texts, string(el))
			}
		case xml.EndElement:
			inText = false
		}
	}
	return paths, texts
}

// TestSVGRoutes: the SVG parses as XML and holds exactly one path per agent
// route, whose vertices are the start and then that route's waypoints in
// drawing coordinates (with the junctions the walk passes between two
// waypoints, so that the line follows the corridors). The drawing coordinates are checked to be one
// uniform scaling plus a shift of the scenario's x, y (the map is not
// distorted), worked out here from two nodes.
func TestSVGRoutes(t *testing.T) {
	for _, m := range engine.Models {
		in := demoInput(t, m)
		mp, err := BuildMap(in, 1200, 800, MapOptions{Title: in.Site.Scenario.Name, Notice: true})
		if err != nil {
			t.Fatal(err)
		}
		var buf bytes.Buffer
		if err := WriteSVG(&buf, &mp.Scene); err != nil {
			t.Fatal(err)
		}
		paths, texts := parseSVG(t, buf.Bytes())
		s := in.Site
		nodes := s.Scenario.Nodes
		// the projection: x' = z·x + ox, y' = z·y + oy
		a, b := mp.NodePos(0), mp.NodePos(s.N-1)
		z := (b.X - a.X) / (nodes[s.N-1].X - nodes[0].X)
		ox, oy := a.X-z*nodes[0].X, a.Y-z*nodes[0].Y
		draw := func(p engine.Point) Pt {
			at := func(v int) Pt { return Pt{X: z*nodes[v].X + ox, Y: z*nodes[v].Y + oy} }
			if p.To < 0 {
				return at(p.From)
			}
			var w float64
			for _, c := range s.Scenario.Corridors {
				if (c.From == s.IDs[p.From] && c.To == s.IDs[p.To]) || (c.To == s.IDs[p.From] && c.From == s.IDs[p.To]) {
					w = c.Length
				}
			}
			f := p.Offset / w
			u, v := at(p.From), at(p.To)
			return Pt{X: u.X + (v.X-u.X)*f, Y: u.Y + (v.Y-u.Y)*f}
		}
		routes := 0
		for _, p := range paths {
			if p.Class != "route" {
				continue
			}
			routes++
			ag, err := strconv.Atoi(strings.TrimPrefix(p.ID, "route-"))
			if err != nil || ag < 0 || ag > 1 {
				t.Fatalf("route path id %q", p.ID)
			}
			want := []Pt{draw(engine.At(s.Start))}
			push := func(q Pt) {
				if math.Hypot(q.X-want[len(want)-1].X, q.Y-want[len(want)-1].Y) > 1e-6 {
					want = append(want, q)
				}
			}
			cur := engine.At(s.Start)
			for _, wp := range in.Plan.Routes[ag].Waypoints {
				// the junctions the walk passes between two waypoints: in a
				// tree, x is on the path from p to q exactly when
				// d(p,x) + d(x,q) = d(p,q)
				d := s.PointDist(cur, wp.P)
				type via struct {
					d float64
					v int
				}
				var on []via
				for x := 0; x < s.N; x++ {
					dx := s.PointDist(cur, engine.At(x))
					if dx > 1e-9 && dx < d-1e-9 && math.Abs(dx+s.PointDist(engine.At(x), wp.P)-d) < 1e-9*math.Max(1, d) {
						on = append(on, via{dx, x})
					}
				}
				sort.Slice(on, func(i, j int) bool { return on[i].d < on[j].d })
				for _, o := range on {
					push(draw(engine.At(o.v)))
				}
				push(draw(wp.P))
				cur = wp.P
			}
			if len(p.Pts) != len(want) {
				t.Fatalf("%s: route %d has %d vertices, want %d (start + waypoints)", m, ag, len(p.Pts), len(want))
			}
			for i := range want {
				if math.Abs(p.Pts[i].X-want[i].X) > 0.01 || math.Abs(p.Pts[i].Y-want[i].Y) > 0.01 {
					t.Fatalf("%s: route %d vertex %d at %v, want %v", m, ag, i, p.Pts[i], want[i])
				}
			}
		}
		if routes != 2 {
			t.Fatalf("%s: %d route paths, want 2", m, routes)
		}
		if !strings.Contains(strings.Join(texts, "\n"), Notice) {
			t.Errorf("the SVG lacks the notice")
		}
	}
}

// TestSVGEscapesText: names with XML's special characters still parse.
func TestSVGEscapesText(t *testing.T) {
	in := demoInput(t, engine.Radio)
	mp, err := BuildMap(in, 800, 600, MapOptions{Title: `Site <A & "B">`, Notice: true})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteSVG(&buf, &mp.Scene); err != nil {
		t.Fatal(err)
	}
	_, texts := parseSVG(t, buf.Bytes())
	if !strings.Contains(strings.Join(texts, "\n"), `Site <A & "B">`) {
		t.Fatalf("title lost: %q", texts)
	}
}

// TestPNGHeat: the PNG decodes at the requested size, and the pixel at
// every candidate's drawn position has the candidate's heat colour: its
// evacuation time over the largest one, on the ramp.
func TestPNGHeat(t *testing.T) {
	for _, size := range [][2]int{{1200, 800}, {640, 400}, {500, 900}} {
		in := demoInput(t, engine.FaceToFace)
		mp, err := BuildMap(in, float64(size[0]), float64(size[1]), MapOptions{Title: "x", Notice: true})
		if err != nil {
			t.Fatal(err)
		}
		var buf bytes.Buffer
		if err := WritePNG(&buf, &mp.Scene); err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(&buf)
		if err != nil {
			t.Fatal(err)
		}
		if b := img.Bounds(); b.Dx() != size[0] || b.Dy() != size[1] {
			t.Fatalf("PNG is %v, want %v", b, size)
		}
		maxEvac := 0.0
		for _, ex := range in.Report.Exits {
			maxEvac = math.Max(maxEvac, ex.EvacAt)
		}
		checked := 0
		for _, ex := range in.Report.Exits {
			p := mp.NodePos(ex.Node)
			got := color.NRGBAModel.Convert(img.At(int(p.X), int(p.Y))).(color.NRGBA)
			want := HeatColor(ex.EvacAt / maxEvac)
			if got != want {
				t.Errorf("%v: candidate %s at %v: pixel %v, want heat %v", size, in.Site.IDs[ex.Node], p, got, want)
			}
			checked++
		}
		if checked < 10 {
			t.Fatalf("only %d candidates", checked)
		}
	}
}

func TestMapRefusesBadSize(t *testing.T) {
	in := demoInput(t, engine.Radio)
	for _, wh := range [][2]float64{{0, 100}, {10, 10}, {math.NaN(), 100}, {2e5, 100}} {
		if _, err := BuildMap(in, wh[0], wh[1], MapOptions{}); err == nil {
			t.Errorf("size %v accepted", wh)
		}
	}
}

// TestCurvedAndClosedCorridors: a corridor with a drawn path is drawn along
// it, and the route that walks it passes through the path's vertex; a
// closed corridor is drawn (dotted) but no route uses it. Worked by hand: s
// at (0, 0), a at (100, 0) with the corridor bent through (50, −40), b at
// (0, 100), the corridor a–b closed.
func TestCurvedAndClosedCorridors(t *testing.T) {
	sc := engine.Scenario{
		Name: "bent", Start: "s",
		Nodes: []engine.Node{
			{ID: "s", X: 0, Y: 0, HasXY: true},
			{ID: "a", X: 100, Y: 0, HasXY: true, Candidate: true},
			{ID: "b", X: 0, Y: 100, HasXY: true, Candidate: true},
		},
		Corridors: []engine.Corridor{
			{From: "s", To: "a", Length: 130, Path: [][2]float64{{50, -40}}},
			{From: "s", To: "b", Length: 100},
			{From: "a", To: "b", Length: 141, Closed: true},
		},
	}
	s, err := engine.NewSite(sc)
	if err != nil {
		t.Fatal(err)
	}
	p, r, err := planners.BestPlan(t.Context(), s, engine.Radio)
	if err != nil {
		t.Fatal(err)
	}
	mp, err := BuildMap(Input{Site: s, Plan: p, Report: r}, 600, 500, MapOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteSVG(&buf, &mp.Scene); err != nil {
		t.Fatal(err)
	}
	paths, _ := parseSVG(t, buf.Bytes())
	o, a := mp.NodePos(0), mp.NodePos(1)
	z := (a.X - o.X) / 100
	bend := Pt{X: o.X + 50*z, Y: o.Y - 40*z}
	sawBend, closed := false, 0
	for _, pa := range paths {
		switch pa.Class {
		case "route":
			for _, q := range pa.Pts {
				if math.Hypot(q.X-bend.X, q.Y-bend.Y) < 0.01 {
					sawBend = true
				}
			}
		case "closed":
			closed++
			if len(pa.Pts) != 2 || math.Hypot(pa.Pts[0].X-a.X, pa.Pts[0].Y-a.Y) > 0.01 {
				t.Errorf("closed corridor drawn as %v", pa.Pts)
			}
		}
	}
	if !sawBend || closed != 1 {
		t.Fatalf("route through the bend %v: %v; closed corridors drawn: %d", bend, sawBend, closed)
	}
}
