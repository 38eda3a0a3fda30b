package canvas

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/theme"

	"duosweep/engine"
)

// randomScenario returns a random tree with n nodes (node i>0 hangs below a
// uniformly chosen earlier node), every node but the start a candidate; with
// xy false the editor lays it out. Fixed seed.
func randomScenario(n int, seed uint64, xy bool) engine.Scenario {
	rng := rand.New(rand.NewPCG(seed, 2))
	sc := engine.Scenario{Name: fmt.Sprintf("random %d", n), Start: "n0"}
	for i := 0; i < n; i++ {
		sc.Nodes = append(sc.Nodes, engine.Node{ID: fmt.Sprintf("n%d", i), Candidate: i > 0,
			X: rng.Float64() * 1000, Y: rng.Float64() * 1000, HasXY: xy})
		if i > 0 {
			sc.Corridors = append(sc.Corridors, engine.Corridor{From: fmt.Sprintf("n%d", rng.IntN(i)), To: sc.Nodes[i].ID,
				Length: math.Round((1+rng.Float64()*40)*10) / 10})
		}
	}
	return sc
}

func benchEditor(b *testing.B, n int) (*Editor, fyne.Window) {
	a := test.NewTempApp(b)
	a.Settings().SetTheme(theme.LightTheme())
	e := NewEditor(randomScenario(n, 1, false))
	w := test.NewWindow(e)
	w.Resize(fyne.NewSize(1280, 800))
	e.FitView()
	b.Cleanup(w.Close)
	return e, w
}

func benchOverlay(e *Editor, frame int) Overlay {
	sc := &e.sc
	n := len(sc.Nodes)
	ev := make([]float64, n)
	for i := range ev {
		ev[i] = float64(i % 97)
		if i == 0 {
			ev[i] = math.NaN()
		}
	}
	o := Overlay{Evac: ev, EvacMax: 96, Worst: 17, Focus: 3, Unvisited: []int{5, 9}}
	// two agents walking down corridors, each with a 60-point trail
	for a := 0; a < 2; a++ {
		m := AgentMark{Name: string(rune('A' + a))}
		for k := 0; k < 60; k++ {
			ci := (frame + k + a*500) % len(sc.Corridors)
			en := e.d.ends[ci]
			m.Trail = append(m.Trail, engine.Point{From: en[0], To: en[1], Offset: sc.Corridors[ci].Length / 2})
		}
		ci := (frame + 60 + a*500) % len(sc.Corridors)
		en := e.d.ends[ci]
		m.At = engine.Point{From: en[0], To: en[1], Offset: sc.Corridors[ci].Length / 3}
		o.Agents = append(o.Agents, m)
	}
	mp := o.Agents[0].At
	o.Meeting = &mp
	return o
}

// BenchmarkRefresh2000: renderer Refresh + Layout of a 2,000-node random tree.
func BenchmarkRefresh2000(b *testing.B) {
	e, _ := benchEditor(b, 2000)
	e.SetOverlay(benchOverlay(e, 0))
	r := rendererOf(e)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		r.Refresh()
	}
}

// BenchmarkLayout2000: Layout alone (what a pan or zoom step costs).
func BenchmarkLayout2000(b *testing.B) {
	e, _ := benchEditor(b, 2000)
	r := rendererOf(e)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		e.PanBy(fyne.NewDelta(1, 0))
	}
	_ = r
}

// BenchmarkOverlayFrame2000: one playback frame, SetOverlay with two agents
// and trails, heat colours, worst and focus markers, then Refresh.
func BenchmarkOverlayFrame2000(b *testing.B) {
	e, _ := benchEditor(b, 2000)
	frames := make([]Overlay, 16)
	for i := range frames {
		frames[i] = benchOverlay(e, i)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		e.SetOverlay(frames[i%len(frames)])
	}
}

// BenchmarkEdit2000: an Edit that moves a node (copy, cycle check, undo
// history, derived state, Refresh).
func BenchmarkEdit2000(b *testing.B) {
	e, _ := benchEditor(b, 2000)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		k := i % 2000
		if err := e.MoveNode(k, fyne.NewPos(float32(i%1000), float32(i%700))); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSetScenario2000: SetScenario with no coordinates (tidy layout, fit, first refresh).
func BenchmarkSetScenario2000(b *testing.B) {
	e, _ := benchEditor(b, 2000)
	sc := randomScenario(2000, 3, false)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		e.SetScenario(sc)
	}
}
