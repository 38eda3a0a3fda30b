package brief

import (
	"os"
	"testing"

	"duosweep/engine"
)

func TestScratchPictures(t *testing.T) {
	in := demoInput(t, engine.Radio)
	m, err := BuildMap(in, 1200, 800, MapOptions{Title: in.Site.Scenario.Name, Notice: true})
	if err != nil {
		t.Fatal(err)
	}
	f, _ := os.Create("/tmp/brief/demo.png")
	if err := WritePNG(f, &m.Scene); err != nil {
		t.Fatal(err)
	}
	f.Close()
	f, _ = os.Create("/tmp/brief/demo.svg")
	WriteSVG(f, &m.Scene)
	f.Close()
}

func TestScratchPDF(t *testing.T) {
	in := demoInput(t, engine.Radio)
	f, _ := os.Create("/tmp/brief/demo.pdf")
	n, err := WritePDF(f, in, PDFOptions{})
	if err != nil {
		t.Fatal(err)
	}
	f.Close()
	t.Log("pages", n)
}
