package geom

import (
	"math"
	"math/rand/v2"
	"testing"
)

func TestSegDist(t *testing.T) {
	a, b := Pt{0, 0}, Pt{10, 0}
	for _, tc := range []struct {
		name string
		p    Pt
		d, t float64
	}{
		{"above middle", Pt{5, 3}, 3, 0.5},
		{"on the segment", Pt{2, 0}, 0, 0.2},
		{"beyond B", Pt{13, 4}, 5, 1}, // 3-4-5 triangle, worked by hand
		{"before A", Pt{-6, -8}, 10, 0},
		{"at A", Pt{0, 0}, 0, 0},
	} {
		d, f := SegDist(tc.p, a, b)
		if math.Abs(d-tc.d) > 1e-12 || math.Abs(f-tc.t) > 1e-12 {
			t.Errorf("%s: SegDist = %v, %v; want %v, %v", tc.name, d, f, tc.d, tc.t)
		}
	}
	if d, f := SegDist(Pt{3, 4}, Pt{0, 0}, Pt{0, 0}); d != 5 || f != 0 {
		t.Errorf("degenerate segment: %v %v", d, f)
	}
}

func TestNearestPoint(t *testing.T) {
	pts := []Pt{{0, 0}, {10, 0}, {10, 0}, {20, 5}}
	for _, tc := range []struct {
		name string
		p    Pt
		r    float64
		skip int
		want int
	}{
		{"exact hit", Pt{0, 0}, 12, -1, 0},
		{"closest of two", Pt{6, 0}, 12, -1, 1},
		{"tie goes to lower index", Pt{10, 1}, 12, -1, 1},
		{"skip", Pt{10, 1}, 12, 1, 2},
		{"out of radius", Pt{0, 13}, 12, -1, -1},
		{"just inside", Pt{20, 16.9}, 12, -1, 3},
		{"empty space", Pt{50, 50}, 12, -1, -1},
	} {
		if got := NearestPoint(pts, tc.p, tc.r, tc.skip); got != tc.want {
			t.Errorf("%s: NearestPoint = %d, want %d", tc.name, got, tc.want)
		}
	}
	if NearestPoint(nil, Pt{}, 10, -1) != -1 {
		t.Error("no points")
	}
}

func TestNearestSeg(t *testing.T) {
	segs := []Seg{{Pt{0, 0}, Pt{100, 0}}, {Pt{0, 0}, Pt{0, 100}}, {Pt{50, 50}, Pt{100, 100}}}
	for _, tc := range []struct {
		name string
		p    Pt
		want int
	}{
		{"near horizontal", Pt{50, 4}, 0},
		{"near vertical", Pt{-3, 60}, 1},
		{"corner tie goes to lower index", Pt{-2, -2}, 0},
		{"diagonal", Pt{76, 74}, 2},
		{"past the diagonal's end", Pt{110, 110}, -1},
		{"far away", Pt{50, 30}, -1},
	} {
		if got := NearestSeg(segs, tc.p, 6); got != tc.want {
			t.Errorf("%s: NearestSeg = %d, want %d", tc.name, got, tc.want)
		}
	}
}

func TestLerp(t *testing.T) {
	a, b := Pt{0, 0}, Pt{10, 20}
	for _, tc := range []struct {
		f    float64
		want Pt
	}{{0, a}, {1, b}, {0.25, Pt{2.5, 5}}, {-1, a}, {2, b}, {math.NaN(), a}} {
		if got := Lerp(a, b, tc.f); got != tc.want {
			t.Errorf("Lerp(%v) = %v, want %v", tc.f, got, tc.want)
		}
	}
}

func TestRect(t *testing.T) {
	r := Bounds([]Pt{{1, 2}, {-3, 5}, {4, -1}})
	if r != (Rect{Pt{-3, -1}, Pt{4, 5}}) {
		t.Fatalf("Bounds = %v", r)
	}
	if !EmptyRect().Empty() || r.Empty() || !Bounds(nil).Empty() {
		t.Fatal("Empty")
	}
	if !r.Contains(Pt{4, 5}) || r.Contains(Pt{4.1, 0}) {
		t.Fatal("Contains")
	}
	screen := Rect{Pt{0, 0}, Pt{100, 100}}
	for _, tc := range []struct {
		a, b Pt
		want bool
	}{
		{Pt{-10, 50}, Pt{110, 50}, true}, // crosses
		{Pt{-10, -10}, Pt{-5, 200}, false},
		{Pt{50, 50}, Pt{60, 60}, true},
		{Pt{101, 0}, Pt{200, 100}, false},
	} {
		if got := screen.SegTouches(tc.a, tc.b); got != tc.want {
			t.Errorf("SegTouches(%v, %v) = %v", tc.a, tc.b, got)
		}
	}
}

func TestViewRoundTripZoomAndFit(t *testing.T) {
	v := View{Zoom: 2.5, Off: Pt{30, -7}}
	for _, w := range []Pt{{0, 0}, {1, 2}, {-100, 3.5}} {
		if got := v.ToWorld(v.ToScreen(w)); Dist(got, w) > 1e-9 {
			t.Errorf("round trip %v → %v", w, got)
		}
	}
	s := Pt{123, 45}
	before := v.ToWorld(s)
	z := v.ZoomAround(1.7, s)
	if Dist(z.ToWorld(s), before) > 1e-9 || math.Abs(z.Zoom-2.5*1.7) > 1e-12 {
		t.Errorf("ZoomAround moved the anchored point: %v vs %v", z.ToWorld(s), before)
	}
	if got := v.ZoomAround(1e12, s).Zoom; got != MaxZoom {
		t.Errorf("zoom not clamped: %v", got)
	}
	if got := v.ZoomAround(0, s); got != v {
		t.Errorf("factor 0 must be ignored")
	}
	// Fit: a 100×50 box in a 300×300 widget with margin 50: zoom 2, centred
	f := Fit(Rect{Pt{0, 0}, Pt{100, 50}}, 300, 300, 50, 1)
	if f.Zoom != 2 {
		t.Fatalf("Fit zoom %v", f.Zoom)
	}
	if c := f.ToScreen(Pt{50, 25}); Dist(c, Pt{150, 150}) > 1e-9 {
		t.Fatalf("Fit centre at %v", c)
	}
	if p := f.ToScreen(Pt{0, 0}); Dist(p, Pt{50, 100}) > 1e-9 {
		t.Fatalf("Fit corner at %v", p)
	}
	one := Fit(Bounds([]Pt{{5, 5}}), 200, 100, 10, 3)
	if one.Zoom != 3 || Dist(one.ToScreen(Pt{5, 5}), Pt{100, 50}) > 1e-9 {
		t.Fatalf("single point fit %v", one)
	}
	line := Fit(Bounds([]Pt{{0, 0}, {0, 10}}), 200, 120, 10, 1)
	if line.Zoom != 10 {
		t.Fatalf("vertical line fit %v", line.Zoom)
	}
}

// trees used by the tidy tests
func pathTree(n int) []Edge {
	var e []Edge
	for i := 1; i < n; i++ {
		e = append(e, Edge{i - 1, i, 10})
	}
	return e
}

func starTree(n int) []Edge {
	var e []Edge
	for i := 1; i < n; i++ {
		e = append(e, Edge{0, i, float64(i)})
	}
	return e
}

func randomTree(n int, seed uint64) []Edge {
	rng := rand.New(rand.NewPCG(seed, 1))
	var e []Edge
	for i := 1; i < n; i++ {
		e = append(e, Edge{rng.IntN(i), i, 0.5 + rng.Float64()*30})
	}
	return e
}

func minDist(p []Pt) float64 {
	md := math.Inf(1)
	for i := range p {
		for j := i + 1; j < len(p); j++ {
			md = math.Min(md, Dist(p[i], p[j]))
		}
	}
	return md
}

func cross(a, b, c, d Pt) bool {
	o := func(p, q, r Pt) float64 { return (q.X-p.X)*(r.Y-p.Y) - (q.Y-p.Y)*(r.X-p.X) }
	return o(a, b, c)*o(a, b, d) < 0 && o(c, d, a)*o(c, d, b) < 0
}

func TestTidyNoOverlapNoCrossing(t *testing.T) {
	cases := []struct {
		name  string
		n     int
		edges []Edge
		root  int
	}{
		{"single node", 1, nil, 0},
		{"path", 20, pathTree(20), 0},
		{"path rooted inside", 20, pathTree(20), 7},
		{"star with tiny and long spokes", 30, starTree(30), 0},
		{"random 200", 200, randomTree(200, 1), 0},
		{"random 500 rooted at 42", 500, randomTree(500, 7), 42},
		{"forest (being edited)", 6, []Edge{{0, 1, 5}, {2, 3, 5}}, 0},
		{"cycle from a file", 4, []Edge{{0, 1, 5}, {1, 2, 5}, {2, 0, 5}, {2, 3, 5}}, 0},
	}
	for _, tc := range cases {
		p := Tidy(tc.n, tc.edges, tc.root)
		if len(p) != tc.n {
			t.Fatalf("%s: %d points", tc.name, len(p))
		}
		if p[tc.root] != (Pt{}) {
			t.Errorf("%s: root at %v", tc.name, p[tc.root])
		}
		unit := MedianLen(tc.edges)
		if md := minDist(p); md < unit/2-1e-9 {
			t.Errorf("%s: two nodes %.3g apart, want ≥ %.3g", tc.name, md, unit/2)
		}
		if tc.n <= 200 && len(tc.edges) == tc.n-1 {
			for i, a := range tc.edges {
				for _, b := range tc.edges[i+1:] {
					if a.A == b.A || a.A == b.B || a.B == b.A || a.B == b.B {
						continue
					}
					if cross(p[a.A], p[a.B], p[b.A], p[b.B]) {
						t.Fatalf("%s: corridors %v and %v cross", tc.name, a, b)
					}
				}
			}
		}
		for _, v := range p {
			if math.IsNaN(v.X) || math.IsNaN(v.Y) {
				t.Fatalf("%s: NaN", tc.name)
			}
		}
	}
}

func TestTidyReflectsLengths(t *testing.T) {
	// a path is drawn straight down, each corridor exactly its length
	// (within [½, 3] × the median 10), worked by hand.
	edges := []Edge{{0, 1, 10}, {1, 2, 25}, {2, 3, 10}}
	p := Tidy(4, edges, 0)
	want := []Pt{{0, 0}, {0, 10}, {0, 35}, {0, 45}}
	for i := range want {
		if Dist(p[i], want[i]) > 1e-9 {
			t.Fatalf("node %d at %v, want %v", i, p[i], want[i])
		}
	}
	// children below the parent, parent centred over them
	p = Tidy(3, []Edge{{0, 1, 4}, {0, 2, 4}}, 0)
	if p[1].Y != 4 || p[2].Y != 4 || p[1].X != -p[2].X || p[1].X >= p[2].X {
		t.Fatalf("fork %v", p)
	}
	// a very short corridor gets half the median, a very long one 3 × the median
	p = Tidy(4, []Edge{{0, 1, 10}, {1, 2, 0.1}, {2, 3, 500}}, 0)
	if p[2].Y-p[1].Y != 5 || p[3].Y-p[2].Y != 30 {
		t.Fatalf("clamped rows %v", p)
	}
}

func TestLabelOffset(t *testing.T) {
	const w, h, g = 40, 10, 10
	d := g / math.Sqrt2
	for _, tc := range []struct {
		name string
		dirs []Pt
		want Pt
	}{
		{"isolated node: right-above", nil, Pt{d, -d - h}},
		{"corridor to the right-above: label left-below", []Pt{{1, -1}}, Pt{-d - w, d}},
		{"vertical path: right", []Pt{{0, -5}, {0, 5}}, Pt{g, -h / 2}},
		{"horizontal path: above", []Pt{{-3, 0}, {3, 0}}, Pt{-w / 2, -g - h}},
		{"fork below (tree drawn downwards): above", []Pt{{0, -1}, {-1, 1}, {1, 1}}, Pt{d, -d - h}},
		{"zero vectors ignored", []Pt{{0, 0}}, Pt{d, -d - h}},
	} {
		got := LabelOffset(tc.dirs, w, h, g)
		if Dist(got, tc.want) > 1e-9 {
			t.Errorf("%s: LabelOffset = %v, want %v", tc.name, got, tc.want)
		}
	}
}

func TestLabelCandidatesAndPlacer(t *testing.T) {
	dirs := []Pt{{0, -1}, {0, 1}}
	c := LabelCandidates(dirs, 40, 10, 10, nil)
	if len(c) != 8 || c[0] != LabelOffset(dirs, 40, 10, 10) {
		t.Fatalf("candidates %v", c)
	}
	// the two candidates beside a vertical path (right, then left) come first
	if c[0] != (Pt{10, -5}) || c[1] != (Pt{-50, -5}) {
		t.Fatalf("order %v", c[:2])
	}
	var p Placer
	p.Reset(16)
	a := Rect{Pt{0, 0}, Pt{40, 10}}
	if !p.Free(a) {
		t.Fatal("empty placer")
	}
	p.Add(a)
	for _, tc := range []struct {
		r    Rect
		free bool
	}{
		{Rect{Pt{39, 9}, Pt{60, 20}}, false}, // corner overlap
		{Rect{Pt{40, 0}, Pt{60, 10}}, true},  // touching edge only
		{Rect{Pt{-100, -100}, Pt{-90, -90}}, true},
		{Rect{Pt{10, -5}, Pt{20, 50}}, false}, // crosses
	} {
		if got := p.Free(tc.r); got != tc.free {
			t.Errorf("Free(%v) = %v", tc.r, got)
		}
	}
	p.Reset(16)
	if !p.Free(a) {
		t.Fatal("Reset did not empty")
	}
}

func TestFitExtentsKeepsLabelsInside(t *testing.T) {
	// worked by hand: two points 100 apart in a 300×100 widget; the right one
	// carries a 90-wide label on its right, every point needs 10 elsewhere.
	// Horizontally 10 + 100·z + 90 ≤ 300 gives z = 2; vertically one row, so
	// the zoom is 2 and the points sit at x = 10 and x = 210.
	pts := []Pt{{0, 0}, {100, 0}}
	ext := []Extent{{10, 10, 10, 10}, {10, 90, 10, 10}}
	v := FitExtents(pts, ext, 300, 100, 48, 1)
	if math.Abs(v.Zoom-2) > 1e-9 {
		t.Fatalf("zoom %v, want 2", v.Zoom)
	}
	a, b := v.ToScreen(pts[0]), v.ToScreen(pts[1])
	if math.Abs(a.X-10) > 1e-6 || math.Abs(b.X-210) > 1e-6 || math.Abs(a.Y-50) > 1e-6 {
		t.Fatalf("points at %v and %v, want x 10 and 210, y 50", a, b)
	}
	// every box stays inside on random points with random extents
	rng := rand.New(rand.NewPCG(3, 4))
	for trial := 0; trial < 50; trial++ {
		n := 1 + rng.IntN(40)
		pts, ext := make([]Pt, n), make([]Extent, n)
		for i := range pts {
			pts[i] = Pt{rng.Float64() * 1000, rng.Float64() * 300}
			ext[i] = Extent{8, 8 + rng.Float64()*120, 8 + rng.Float64()*20, 8}
		}
		const w, h = 800, 500
		v := FitExtents(pts, ext, w, h, 48, 1)
		tight := false
		for i, p := range pts {
			s := v.ToScreen(p)
			if s.X-ext[i].L < -1e-6 || s.X+ext[i].R > w+1e-6 || s.Y-ext[i].T < -1e-6 || s.Y+ext[i].B > h+1e-6 {
				t.Fatalf("trial %d: point %d at %v with extent %v leaves the widget", trial, i, s, ext[i])
			}
			if s.X-ext[i].L < 1e-3 || s.X+ext[i].R > w-1e-3 || s.Y-ext[i].T < 1e-3 || s.Y+ext[i].B > h-1e-3 {
				tight = true
			}
		}
		if n > 1 && !tight {
			t.Fatalf("trial %d: nothing touches the edge, the zoom %v could be larger", trial, v.Zoom)
		}
	}
	// a widget narrower than two labels (10 + 90 > 80), or one where the
	// labels would more than halve the zoom, falls back to the plain fit
	for _, w := range []float64{80, 120} {
		if got, want := FitExtents(pts[:2], ext[:2], w, 100, 20, 1), Fit(Bounds(pts[:2]), w, 100, 20, 1); got != want {
			t.Fatalf("width %v: fallback %v, want %v", w, got, want)
		}
	}
}

func TestTidyAspectRatio(t *testing.T) {
	bbox := func(p []Pt) (w, h float64) {
		b := Bounds(p)
		return b.Max.X - b.Min.X, b.Max.Y - b.Min.Y
	}
	// a 2,000-junction random tree has about 1,000 leaves on a few rows:
	// without the stretch it is over 30 times wider than high
	n := 2000
	edges := randomTree(n, 11)
	p := Tidy(n, edges, 0)
	w, h := bbox(p)
	if !(h > 0) || w/h > TidyAspect+1e-9 || w/h < TidyAspect/4 {
		t.Fatalf("2,000-node tree drawn %.0f × %.0f (ratio %.2f), want at most %.2f and not a tall strip", w, h, w/h, TidyAspect)
	}
	if md := minDist(p); md < MedianLen(edges)/2-1e-9 {
		t.Fatalf("two nodes %.3g apart after the stretch", md)
	}
	// a wide star (one row of 40 leaves) becomes a fan; a path stays as it is
	p = Tidy(41, starTree(41), 0)
	if w, h := bbox(p); w/h > TidyAspect+1e-9 {
		t.Fatalf("star drawn %.0f × %.0f", w, h)
	}
	p = Tidy(5, pathTree(5), 0)
	if w, h := bbox(p); w != 0 || h != 40 {
		t.Fatalf("path drawn %v × %v, want 0 × 40", w, h)
	}
}

// TestLabelRoom checks the room FitView keeps for a label against values worked out by hand from the
// spacing constants (gap 11 from a junction, 21 beside the start; 8 across and 4 along beyond the label).
func TestLabelRoom(t *testing.T) {
	for _, tc := range []struct {
		w, h, margin float64
		start        bool
		want         Extent
	}{
		{40, 12, 32, false, Extent{L: 32, R: 59, T: 32, B: 32}},   // R = 11+40+8; T = 11+12+4 = 27 < 32
		{40, 12, 32, true, Extent{L: 32, R: 69, T: 32, B: 37}},    // R = 21+40+8; B = 21+12+4
		{120, 30, 16, false, Extent{L: 16, R: 139, T: 45, B: 16}}, // R = 11+120+8; T = 11+30+4
		{0, 0, 32, true, Extent{L: 32, R: 32, T: 32, B: 32}},      // no label: the margin everywhere
	} {
		if got := LabelRoom(tc.w, tc.h, tc.margin, tc.start); got != tc.want {
			t.Errorf("LabelRoom(%v, %v, %v, %v) = %+v, want %+v", tc.w, tc.h, tc.margin, tc.start, got, tc.want)
		}
	}
}
