package brief

import (
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"duosweep/engine"
	"duosweep/projects"
)

// needPoppler returns the path of a poppler tool; without it the test is
// skipped, except under CI (CI=true), where it fails.
func needPoppler(t testing.TB, tool string) string {
	t.Helper()
	p, err := exec.LookPath(tool)
	if err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatalf("%s (poppler-utils) is not installed; scripts/deps.sh installs it", tool)
		}
		t.Skipf("%s (poppler-utils) is not installed: run scripts/deps.sh to install it; skipping the PDF text checks", tool)
	}
	return p
}

// writeDemoPDF writes the demo briefing under model m to a temporary file.
func writeDemoPDF(t *testing.T, in Input, opt PDFOptions) (path string, pages int) {
	t.Helper()
	var buf bytes.Buffer
	pages, err := WritePDF(&buf, in, opt)
	if err != nil {
		t.Fatal(err)
	}
	path = filepath.Join(t.TempDir(), "brief.pdf")
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	return path, pages
}

func run(t *testing.T, name string, args ...string) string {
	t.Helper()
	out, err := exec.Command(name, args...).CombinedOutput()
	if err != nil {
		t.Fatalf("%s %v: %v\n%s", name, args, err, out)
	}
	return string(out)
}

var (
	stepLine   = regexp.MustCompile(`(?m)^\s*(\d+)\. (\S+)  `)
	figureLine = regexp.MustCompile(`(?m)^(Worst case|Lower bound):\s+(\S+ \(\S+ s\))`)
	tableRow   = regexp.MustCompile(`(?m)^\s*(\d+)\s+(\d+:\d\d(?::\d\d)?)\s`)
)

// TestPDFText checks the text poppler's pdftotext extracts from the
// briefing (an implementation independent of fpdf): the worst case and the
// lower bound exactly as the printed itinerary (what duosweep-cli plan
// prints, projects.WriteItinerary) shows them, and every itinerary step's
// number and clock time, in order.
func TestPDFText(t *testing.T) {
	pdftotext := needPoppler(t, "pdftotext")
	for _, m := range engine.Models {
		t.Run(m.String(), func(t *testing.T) {
			in := demoInput(t, m)
			var it bytes.Buffer
			if err := projects.WriteItinerary(&it, in.Site, in.Plan, in.Report); err != nil {
				t.Fatal(err)
			}
			path, _ := writeDemoPDF(t, in, PDFOptions{})
			text := run(t, pdftotext, "-layout", path, "-")
			figs := figureLine.FindAllStringSubmatch(it.String(), -1)
			if len(figs) != 2 {
				t.Fatalf("itinerary figures: %q", figs)
			}
			for _, f := range figs {
				if !strings.Contains(text, f[2]) {
					t.Errorf("%s %q not in the PDF text", f[1], f[2])
				}
			}
			var want, got []string
			for _, s := range stepLine.FindAllStringSubmatch(it.String(), -1) {
				want = append(want, s[1]+" "+s[2])
			}
			for _, s := range tableRow.FindAllStringSubmatch(text, -1) {
				got = append(got, s[1]+" "+s[2])
			}
			if len(want) < 10 {
				t.Fatalf("only %d itinerary steps", len(want))
			}
			if strings.Join(got, "\n") != strings.Join(want, "\n") {
				t.Fatalf("PDF itinerary rows\n%s\nwant (as printed)\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
			}
		})
	}
}

// TestPDFPagesAndFonts: pdfinfo agrees with the page count WritePDF
// reports, every page carries the notice and "Page k of N", and pdffonts
// lists only embedded fonts.
func TestPDFPagesAndFonts(t *testing.T) {
	pdftotext := needPoppler(t, "pdftotext")
	pdfinfo := needPoppler(t, "pdfinfo")
	pdffonts := needPoppler(t, "pdffonts")
	for _, paper := range []string{A4, Letter} {
		in := demoInput(t, engine.Radio)
		path, pages := writeDemoPDF(t, in, PDFOptions{Paper: paper})
		info := run(t, pdfinfo, path)
		mm := regexp.MustCompile(`(?m)^Pages:\s+(\d+)`).FindStringSubmatch(info)
		if mm == nil {
			t.Fatalf("pdfinfo: %s", info)
		}
		if n, _ := strconv.Atoi(mm[1]); n != pages || pages < 3 {
			t.Fatalf("%s: pdfinfo says %d pages, WritePDF %d (want at least 3: map, two itineraries)", paper, n, pages)
		}
		wantSize := map[string]string{A4: "595.28 x 841.89", Letter: "612 x 792"}[paper]
		if !strings.Contains(info, wantSize) {
			t.Errorf("%s: page size not %s:\n%s", paper, wantSize, info)
		}
		text := run(t, pdftotext, path, "-")
		pageTexts := strings.Split(strings.TrimRight(text, "\f\n"), "\f")
		if len(pageTexts) != pages {
			t.Fatalf("%d page texts, want %d", len(pageTexts), pages)
		}
		for k, pt := range pageTexts {
			if !strings.Contains(pt, Notice) {
				t.Errorf("page %d lacks the notice", k+1)
			}
			if !strings.Contains(pt, fmt.Sprintf("Page %d of %d", k+1, pages)) {
				t.Errorf("page %d lacks its page number", k+1)
			}
		}
		fonts := strings.Split(strings.TrimSpace(run(t, pdffonts, path)), "\n")
		if len(fonts) < 3 {
			t.Fatalf("pdffonts lists no fonts:\n%s", strings.Join(fonts, "\n"))
		}
		for _, l := range fonts[2:] {
			f := strings.Fields(l)
			// name type... encoding emb sub uni object ID: emb is the 5th field from the end
			if len(f) < 6 || f[len(f)-5] != "yes" {
				t.Errorf("font not embedded: %q", l)
			}
		}
	}
}

func TestPDFRefusesBadInput(t *testing.T) {
	in := demoInput(t, engine.Radio)
	var buf bytes.Buffer
	if _, err := WritePDF(&buf, in, PDFOptions{Paper: "tabloid"}); err == nil || !strings.Contains(err.Error(), `"tabloid"`) {
		t.Fatalf("paper tabloid: %v", err)
	}
	if _, err := WritePDF(&buf, Input{Site: in.Site, Plan: in.Plan}, PDFOptions{}); err == nil {
		t.Fatal("no report accepted")
	}
}
