package ui

import (
	"bytes"
	"context"
	"image/gif"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"duosweep/brief"
	"duosweep/engine"
)

// TestExportWritesFiles: the three exports write the current plan's
// briefing, map and animation (through the brief package) and say so in the
// status line; every widget change arrives through the posted queue.
func TestExportWritesFiles(t *testing.T) {
	h := newHarness(t, "")
	in, err := h.app.briefInput()
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	pdf, svg, png, anim := filepath.Join(dir, "b.pdf"), filepath.Join(dir, "m.svg"), filepath.Join(dir, "m.png"), filepath.Join(dir, "r.gif")
	h.app.exportPDF(in, pdf)
	h.wait()
	if !strings.Contains(h.app.w.status.Text, "Exported the briefing to "+pdf) {
		t.Fatalf("status %q", h.app.w.status.Text)
	}
	h.app.exportMap(in, svg)
	h.app.exportMap(in, png)
	h.app.exportGIF(in, anim, brief.GIFOptions{W: 320, H: 200, FPS: 2, Seconds: 2})
	h.wait()
	for path, magic := range map[string]string{pdf: "%PDF-", svg: "<?xml", png: "\x89PNG", anim: "GIF89a"} {
		b, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.HasPrefix(b, []byte(magic)) {
			t.Errorf("%s starts %q", path, b[:min(8, len(b))])
		}
	}
	b, _ := os.ReadFile(anim)
	g, err := gif.DecodeAll(bytes.NewReader(b))
	if err != nil || len(g.Image) != 4 {
		t.Fatalf("animation: %v, %d frames", err, len(g.Image))
	}
}

// TestExportCancel: Cancel stops a long animation; nothing is written and
// the status says so.
func TestExportCancel(t *testing.T) {
	h := newHarness(t, "")
	in, err := h.app.briefInput()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "long.gif")
	started := make(chan struct{})
	job := h.app.startExport("animation", path, func(ctx context.Context, w io.Writer, progress func(float64)) error {
		opt := brief.GIFOptions{W: 640, H: 400, FPS: 50, Seconds: 600, Progress: func(f float64) {
			select {
			case <-started:
			default:
				close(started)
			}
			progress(f)
		}}
		return brief.WriteGIF(ctx, w, in, opt)
	})
	<-started
	job.cancel()
	h.wait()
	if _, err := os.Stat(path); !os.IsNotExist(err) {
		t.Fatalf("cancelled export left %s: %v", path, err)
	}
	if !strings.Contains(h.app.w.status.Text, "cancelled") {
		t.Fatalf("status %q", h.app.w.status.Text)
	}
	entries, _ := os.ReadDir(filepath.Dir(path))
	if len(entries) != 0 {
		t.Fatalf("left %v", entries)
	}
}

func TestAnimationOptions(t *testing.T) {
	ff := engine.FaceToFace
	opt, err := animationOptions("n4b", true, ff, "960×600", "12", "7.5")
	if err != nil || opt.Exit != "n4b" || opt.Compare == nil || *opt.Compare != ff || opt.W != 960 || opt.H != 600 || opt.FPS != 12 || opt.Seconds != 7.5 {
		t.Fatalf("%+v %v", opt, err)
	}
	for _, bad := range [][2]string{{"0", "20"}, {"ten", "20"}, {"10", "-1"}, {"10", "x"}} {
		if _, err := animationOptions("worst exit", false, ff, "640×400", bad[0], bad[1]); err == nil {
			t.Errorf("fps %q, length %q accepted", bad[0], bad[1])
		}
	}
}
