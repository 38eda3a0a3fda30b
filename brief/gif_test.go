package brief

import (
	"bytes"
	"context"
	"encoding/csv"
	"errors"
	"image"
	"image/color"
	"image/draw"
	"image/gif"
	"math"
	"strconv"
	"testing"

	"duosweep/engine"
	"duosweep/projects"
)

// decodeFrames decodes a GIF and composites its frames (each is drawn over
// the previous with disposal "none", transparent pixels keeping it).
func decodeFrames(t *testing.T, data []byte) (*gif.GIF, []*image.RGBA) {
	t.Helper()
	g, err := gif.DecodeAll(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	canvas := image.NewRGBA(image.Rect(0, 0, g.Config.Width, g.Config.Height))
	var out []*image.RGBA
	for i, fr := range g.Image {
		if g.Disposal[i] != gif.DisposalNone {
			t.Fatalf("frame %d disposal %d", i, g.Disposal[i])
		}
		draw.Draw(canvas, fr.Bounds(), fr, fr.Bounds().Min, draw.Over)
		out = append(out, image.NewRGBA(canvas.Rect))
		copy(out[i].Pix, canvas.Pix)
	}
	return g, out
}

// TestGIFFramesShowTheReplay: the frame count is length × fps, the size is
// the one asked for, and at frame k each agent's marker is where
// engine.Replay puts the agent at that frame's time: the pixel there has
// the agent's colour (checked on every frame where the two markers do not
// overlap, in both panels of a side-by-side animation).
func TestGIFFramesShowTheReplay(t *testing.T) {
	in := demoInput(t, engine.Radio)
	ff := engine.FaceToFace
	cases := []GIFOptions{
		{W: 640, H: 400, FPS: 10, Seconds: 20},
		{W: 900, H: 420, FPS: 4, Seconds: 7.5, Compare: &ff, Exit: "s3c"},
	}
	for _, opt := range cases {
		var buf bytes.Buffer
		if err := WriteGIF(context.Background(), &buf, in, opt); err != nil {
			t.Fatal(err)
		}
		g, frames := decodeFrames(t, buf.Bytes())
		n := int(math.Round(opt.Seconds * float64(opt.FPS)))
		if len(frames) != n {
			t.Fatalf("%d frames, want %g s × %d fps = %d", len(frames), opt.Seconds, opt.FPS, n)
		}
		if g.Config.Width != opt.W || g.Config.Height != opt.H {
			t.Fatalf("GIF %d×%d, want %d×%d", g.Config.Width, g.Config.Height, opt.W, opt.H)
		}
		if d := g.Delay[0]; d != int(math.Round(100/float64(opt.FPS))) {
			t.Fatalf("delay %d cs at %d fps", d, opt.FPS)
		}
		// the replays, made here from the engine directly
		a, err := NewAnimation(in, opt)
		if err != nil {
			t.Fatal(err)
		}
		models := []engine.Model{in.Report.Model}
		if opt.Compare != nil {
			models = append(models, *opt.Compare)
		}
		exit := in.Report.WorstExit
		if opt.Exit != "" {
			exit, _ = in.Site.Index(opt.Exit)
		}
		checked := 0
		for pi, m := range models {
			rp, err := engine.NewReplay(in.Site, in.Plan, m, exit)
			if err != nil {
				t.Fatal(err)
			}
			p := a.Panels[pi]
			mr := MarkerRadius(p.Map)
			for k := range frames {
				tk := FrameTime(k, n, a.End)
				var at [2]Pt
				for ag := 0; ag < 2; ag++ {
					at[ag] = p.Map.PointPos(rp.Position(ag, tk)).Add(Pt{X: float64(p.X)})
				}
				if math.Hypot(at[0].X-at[1].X, at[0].Y-at[1].Y) < 2*mr+3 {
					continue
				}
				for ag := 0; ag < 2; ag++ {
					c := color.NRGBAModel.Convert(frames[k].At(int(at[ag].X), int(at[ag].Y))).(color.NRGBA)
					if c != AgentColor(ag) {
						t.Fatalf("panel %d frame %d (t=%.1f): pixel at %s's replay position %v is %v, want %v", pi, k, tk, in.Site.Names[ag], at[ag], c, AgentColor(ag))
					}
					checked++
				}
			}
		}
		if checked < n {
			t.Fatalf("only %d marker checks over %d frames", checked, n)
		}
	}
}

func TestFrameTime(t *testing.T) {
	if FrameTime(0, 200, 100) != 0 || FrameTime(199, 200, 100) != 100 || FrameTime(180, 200, 100) != 100 {
		t.Fatal("FrameTime ends")
	}
	// hand-worked: frame 90 of 200 is 90 / (199·0.9) of the way
	if got, want := FrameTime(90, 200, 100), 100*90/(199*0.9); math.Abs(got-want) > 1e-12 {
		t.Fatalf("FrameTime(90) = %g, want %g", got, want)
	}
}

// TestGIFDemoSize: the demo at 640×400, 10 fps, 20 s (one panel and two)
// stays under 5 MB.
func TestGIFDemoSize(t *testing.T) {
	in := demoInput(t, engine.Radio)
	ff := engine.FaceToFace
	for _, cmp := range []*engine.Model{nil, &ff} {
		var buf bytes.Buffer
		if err := WriteGIF(context.Background(), &buf, in, GIFOptions{W: 640, H: 400, FPS: 10, Seconds: 20, Compare: cmp}); err != nil {
			t.Fatal(err)
		}
		if buf.Len() >= 5<<20 {
			t.Fatalf("demo GIF is %d bytes", buf.Len())
		}
		t.Logf("demo GIF (second panel %v): %d bytes", cmp != nil, buf.Len())
	}
}

func TestGIFCancelAndBadOptions(t *testing.T) {
	in := demoInput(t, engine.Radio)
	ctx, cancel := context.WithCancel(context.Background())
	calls := 0
	err := WriteGIF(ctx, &bytes.Buffer{}, in, GIFOptions{Progress: func(f float64) {
		calls++
		if calls == 3 {
			cancel()
		}
	}})
	if !errors.Is(err, context.Canceled) || calls != 3 {
		t.Fatalf("cancel: %v after %d frames", err, calls)
	}
	for _, opt := range []GIFOptions{{FPS: 99}, {Seconds: -1}, {W: 10, H: 10}, {Exit: "nowhere"}, {Exit: "portal"}} {
		if err := WriteGIF(context.Background(), &bytes.Buffer{}, in, opt); err == nil {
			t.Errorf("%+v accepted", opt)
		}
	}
}

// TestCSV: one row per waypoint per agent with the time the engine's
// trajectory leaves it, then one row per candidate with the report's times.
func TestCSV(t *testing.T) {
	for _, m := range engine.Models {
		in := demoInput(t, m)
		var buf bytes.Buffer
		if err := WriteCSV(&buf, in); err != nil {
			t.Fatal(err)
		}
		rows, err := csv.NewReader(&buf).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		if len(rows[0]) != len(CSVHeader) || rows[0][0] != "record" {
			t.Fatalf("header %q", rows[0])
		}
		rows = rows[1:]
		i := 0
		s := in.Site
		for a := 0; a < 2; a++ {
			tr, err := s.Trajectory(in.Plan.Routes[a], a)
			if err != nil {
				t.Fatal(err)
			}
			for k, wp := range in.Plan.Routes[a].Waypoints {
				r := rows[i]
				i++
				if r[0] != "waypoint" || r[1] != s.Names[a] || r[2] != strconv.Itoa(k+1) {
					t.Fatalf("row %d: %q", i, r)
				}
				if ts, _ := strconv.ParseFloat(r[3], 64); math.Abs(ts-tr.WpTime[k]) > 0.05 || r[4] != projects.FormatDuration(tr.WpTime[k]) {
					t.Fatalf("row %d: time %q %q, want %.1f", i, r[3], r[4], tr.WpTime[k])
				}
				if (wp.P.To < 0 && r[5] != s.IDs[wp.P.From]) || (wp.P.To >= 0 && (r[6] != s.IDs[wp.P.From] || r[7] != s.IDs[wp.P.To])) {
					t.Fatalf("row %d: place %q", i, r)
				}
			}
		}
		for _, ex := range in.Report.Exits {
			r := rows[i]
			i++
			if r[0] != "candidate" || r[5] != s.IDs[ex.Node] || r[12] != projects.FormatDuration(ex.FoundAt) || r[15] != projects.FormatDuration(ex.EvacAt) {
				t.Fatalf("candidate row %q for %s", r, s.IDs[ex.Node])
			}
		}
		if i != len(rows) {
			t.Fatalf("%d rows left over", len(rows)-i)
		}
	}
}
