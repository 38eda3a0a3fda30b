package brief

import (
	"context"
	"io"
	"testing"

	"duosweep/engine"
	"duosweep/engine/gen"
	"duosweep/engine/planners"
)

// Speed goals (issue 11): the demo's PDF under 1 s, a 2,000-junction
// site's PDF under 5 s, the demo's GIF (640×400, 10 fps, 20 s) under 10 s.
// Planning is done once outside the timed loop: these measure the briefing.

func BenchmarkDemoPDF(b *testing.B) {
	in := demoInput(b, engine.Radio)
	for b.Loop() {
		if _, err := WritePDF(io.Discard, in, PDFOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkPDF2000(b *testing.B) {
	sc, err := gen.Generate("random", 2000, 1)
	if err != nil {
		b.Fatal(err)
	}
	s, err := engine.NewSite(sc)
	if err != nil {
		b.Fatal(err)
	}
	p, r, err := planners.BestPlan(context.Background(), s, engine.Radio)
	if err != nil {
		b.Fatal(err)
	}
	in := Input{Site: s, Plan: p, Report: r, Date: briefDate}
	pages := 0
	for b.Loop() {
		if pages, err = WritePDF(io.Discard, in, PDFOptions{}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(pages), "pages")
}

func BenchmarkDemoGIF(b *testing.B) {
	in := demoInput(b, engine.Radio)
	var n countWriter
	for b.Loop() {
		n = 0
		if err := WriteGIF(context.Background(), &n, in, GIFOptions{W: 640, H: 400, FPS: 10, Seconds: 20}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(n), "bytes")
}

type countWriter int

func (c *countWriter) Write(p []byte) (int, error) { *c += countWriter(len(p)); return len(p), nil }
