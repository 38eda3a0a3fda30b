package brief

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"sort"
	"strings"

	"codeberg.org/go-pdf/fpdf"

	"duosweep/engine"
	"duosweep/projects"
)

// Paper sizes of a briefing.
const (
	A4     = "a4"
	Letter = "letter"
)

// PDFOptions configure WritePDF. The zero value is A4.
type PDFOptions struct {
	Paper string // A4 (default) or Letter
}

// pdfFont is the family name the embedded Go font is registered under.
const pdfFont = "gofont"

// WritePDF writes the briefing of in as a PDF (codeberg.org/go-pdf/fpdf,
// the Go font embedded): page 1 has the site map with both routes, the
// headline figures and the model's rule with the times for the worst exit;
// then one itinerary table per agent and the per-candidate table. Every page
// carries the planning-aid notice and its page number. It returns the
// number of pages. O(n log n + route length).
func WritePDF(w io.Writer, in Input, opt PDFOptions) (pages int, err error) {
	if err := in.check(); err != nil {
		return 0, err
	}
	size := "A4"
	switch strings.ToLower(opt.Paper) {
	case "", A4:
	case Letter:
		size = "Letter"
	default:
		return 0, fmt.Errorf("brief: paper %q: want a4 or letter", opt.Paper)
	}
	b := &pdfBrief{in: in, pdf: fpdf.New("P", "pt", size, "")}
	pdf := b.pdf
	pdf.SetCompression(true)
	pdf.SetCreator("Duosweep", true)
	pdf.SetProducer("Duosweep", true)
	pdf.SetTitle("Duosweep briefing: "+siteName(in.Site), true)
	d := in.date()
	pdf.SetCreationDate(d)
	pdf.SetModificationDate(d)
	pdf.AddUTF8FontFromBytes(pdfFont, "", RegularTTF())
	pdf.AddUTF8FontFromBytes(pdfFont, "B", BoldTTF())
	b.pw, b.ph = pdf.GetPageSize()
	b.margin = 36
	pdf.SetMargins(b.margin, b.margin, b.margin)
	pdf.SetAutoPageBreak(true, b.margin+22)
	pdf.AliasNbPages("{nb}")
	pdf.SetFooterFunc(b.footer)

	pdf.AddPage()
	if err := b.firstPage(); err != nil {
		return 0, err
	}
	for a := 0; a < 2; a++ {
		b.itinerary(a)
	}
	b.candidates()
	if err := pdf.Error(); err != nil {
		return 0, fmt.Errorf("brief: pdf: %w", err)
	}
	pages = pdf.PageCount()
	if err := pdf.Output(w); err != nil {
		return 0, fmt.Errorf("brief: pdf: %w", err)
	}
	return pages, nil
}

type pdfBrief struct {
	in             Input
	pdf            *fpdf.Fpdf
	pw, ph, margin float64
}

func siteName(s *engine.Site) string {
	if s.Scenario.Name == "" {
		return "(unnamed site)"
	}
	return s.Scenario.Name
}

func (b *pdfBrief) font(bold bool, size float64) {
	style := ""
	if bold {
		style = "B"
	}
	b.pdf.SetFont(pdfFont, style, size)
}

func (b *pdfBrief) textColor(c color.NRGBA) { b.pdf.SetTextColor(int(c.R), int(c.G), int(c.B)) }

func (b *pdfBrief) footer() {
	pdf := b.pdf
	y := b.ph - b.margin
	pdf.SetDrawColor(int(Faint.R), int(Faint.G), int(Faint.B))
	pdf.SetLineWidth(0.5)
	pdf.SetDashPattern(nil, 0)
	pdf.Line(b.margin, y-12, b.pw-b.margin, y-12)
	b.font(false, 7.5)
	b.textColor(Ink)
	pdf.Text(b.margin, y, Notice)
	page := fmt.Sprintf("Page %d of {nb}", pdf.PageNo())
	pdf.Text(b.pw-b.margin-pdf.GetStringWidth(fmt.Sprintf("Page %d of %d", pdf.PageNo(), 999)), y, page)
}

// planner is the planner's name as the itinerary prints it.
func plannerName(p *engine.Plan, r *engine.Report) string {
	switch {
	case r.Planner != "":
		return r.Planner
	case p.Planner != "":
		return p.Planner
	}
	return "hand-made plan"
}

// Figures returns the headline figures of a briefing as label, value pairs,
// in the itinerary's wording and time format (projects.FormatSeconds).
func Figures(in Input) [][2]string {
	s, p, r := in.Site, in.Plan, in.Report
	var out [][2]string
	add := func(k, v string) { out = append(out, [2]string{k, v}) }
	if r.WorstExit >= 0 {
		add("Worst case", projects.FormatSeconds(r.Worst))
		add("Worst exit", projects.NodeName(s, r.WorstExit))
	} else {
		add("Worst case", "no candidates")
	}
	add("Lower bound", projects.FormatSeconds(r.Bounds.LB))
	if math.IsInf(r.Gap, 0) || math.IsNaN(r.Gap) {
		add("Certified gap", "none (the plan is incomplete)")
	} else {
		add("Certified gap", fmt.Sprintf("%.1f %% (at most this much slower than the best possible plan)", 100*r.Gap))
	}
	if r.HasExpected {
		add("Expected time", projects.FormatSeconds(r.Expected))
	} else {
		add("Expected time", "n/a (the site gives no probabilities)")
	}
	add("Model", projects.ModelLine(r.Model))
	add("Planner", plannerName(p, r))
	add("Scenario", siteName(s))
	add("Date", in.date().Format("2006-01-02 15:04"))
	add("Route lengths", fmt.Sprintf("%s %.1f %s, %s %.1f %s", s.Names[0], r.RouteLengths[0], s.Unit(), s.Names[1], r.RouteLengths[1], s.Unit()))
	if !r.Complete {
		ids := make([]string, len(r.Unvisited))
		for i, v := range r.Unvisited {
			ids[i] = s.IDs[v]
		}
		add("INCOMPLETE", "no route visits "+strings.Join(ids, ", "))
	}
	return out
}

// Rule returns the model's rule for the finder, then what happens, with
// times, when the exit is at the worst exit (the replay's events), then the
// rendezvous points of the routes.
func Rule(in Input) ([]string, error) {
	s, p, r := in.Site, in.Plan, in.Report
	out := []string{"When found: " + projects.FoundLine(r.Model) + "."}
	if r.WorstExit >= 0 && r.Complete {
		rp, err := engine.NewReplay(s, p, r.Model, r.WorstExit)
		if err != nil {
			return nil, err
		}
		out = append(out, fmt.Sprintf("If the exit is at the worst exit, %s:", projects.NodeName(s, r.WorstExit)))
		for _, ev := range rp.Events {
			text := ev.Text
			if ev.Kind == engine.EventMet {
				text += "; they meet at " + projects.PointName(s, ev.At)
			}
			out = append(out, fmt.Sprintf("   %s  %s", engine.FormatClock(ev.T), text))
		}
	}
	var rv []string
	for a := 0; a < 2; a++ {
		tr, err := s.Trajectory(p.Routes[a], a)
		if err != nil {
			return nil, err
		}
		for k, t := range tr.RVTime {
			rv = append(rv, fmt.Sprintf("%s at %s, %s", s.Names[a], projects.PointName(s, tr.RVAt[k]), engine.FormatClock(t)))
		}
	}
	if len(rv) > 0 {
		out = append(out, "Rendezvous (an agent that does not yet know where the exit is waits there for the partner): "+strings.Join(rv, "; ")+".")
	}
	return out, nil
}

func (b *pdfBrief) firstPage() error {
	pdf, in := b.pdf, b.in
	x0, cw := b.margin, b.pw-2*b.margin
	b.font(true, 15)
	b.textColor(Ink)
	pdf.SetXY(x0, b.margin)
	pdf.CellFormat(cw, 18, "Duosweep briefing: "+siteName(in.Site), "", 1, "L", false, 0, "")
	b.font(false, 9)
	pdf.CellFormat(cw, 12, fmt.Sprintf("%s · %s model · planner %s · %d junctions, %d candidates", in.date().Format("2006-01-02"),
		in.Report.Model, plannerName(in.Plan, in.Report), in.Site.N, len(in.Report.Exits)), "", 1, "L", false, 0, "")
	// the map
	mapH := math.Min(0.5*b.ph, cw*0.78)
	top := pdf.GetY() + 4
	m, err := BuildMap(in, cw, mapH, MapOptions{})
	if err != nil {
		return err
	}
	pdf.SetDrawColor(int(Faint.R), int(Faint.G), int(Faint.B))
	pdf.SetLineWidth(0.6)
	pdf.SetDashPattern(nil, 0)
	pdf.Rect(x0, top, cw, mapH, "D")
	b.drawScene(&m.Scene, x0, top)
	pdf.SetXY(x0, top+mapH+8)
	// figures
	kw := 92.0
	for _, f := range Figures(in) {
		b.font(true, 9.5)
		col := Ink
		if f[0] == "INCOMPLETE" {
			col = WorstInk
		}
		b.textColor(col)
		pdf.CellFormat(kw, 13, f[0], "", 0, "L", false, 0, "")
		b.font(f[0] == "Worst case" || f[0] == "Worst exit", 9.5)
		pdf.MultiCell(cw-kw, 13, f[1], "", "L", false)
	}
	b.textColor(Ink)
	pdf.Ln(4)
	lines, err := Rule(in)
	if err != nil {
		return err
	}
	for i, l := range lines {
		b.font(i == 0, 9)
		pdf.MultiCell(cw, 11.5, l, "", "L", false)
	}
	return nil
}

// drawScene draws a scene's shapes with its top-left corner at (ox, oy).
func (b *pdfBrief) drawScene(sc *Scene, ox, oy float64) {
	pdf := b.pdf
	pdf.SetLineJoinStyle("round")
	for _, s := range sc.Shapes {
		switch s := s.(type) {
		case *Path:
			if len(s.Pts) == 0 {
				continue
			}
			style := b.paint(s.Fill, s.Stroke, s.Width, s.Dash)
			if style == "" {
				continue
			}
			pdf.MoveTo(ox+s.Pts[0].X, oy+s.Pts[0].Y)
			for _, p := range s.Pts[1:] {
				pdf.LineTo(ox+p.X, oy+p.Y)
			}
			if s.Closed {
				pdf.ClosePath()
			}
			pdf.DrawPath(style)
		case *Disc:
			if style := b.paint(s.Fill, s.Stroke, s.Width, nil); style != "" {
				pdf.Circle(ox+s.C.X, oy+s.C.Y, s.R, style)
			}
		case *Label:
			b.font(s.Bold, s.Size)
			b.textColor(s.Color)
			pdf.Text(ox+s.Left(), oy+s.At.Y, s.Text)
		}
	}
	pdf.SetDashPattern(nil, 0)
	pdf.SetLineCapStyle("butt")
}

// paint sets the colours, width and dash pattern and returns the fpdf style
// ("F", "D", "FD"), or "" when there is nothing to draw.
func (b *pdfBrief) paint(fill, stroke color.NRGBA, width float64, dash []float64) string {
	pdf := b.pdf
	style := ""
	if fill.A > 0 {
		pdf.SetFillColor(int(fill.R), int(fill.G), int(fill.B))
		style = "F"
	}
	if stroke.A > 0 && width > 0 {
		pdf.SetDrawColor(int(stroke.R), int(stroke.G), int(stroke.B))
		pdf.SetLineWidth(width)
		pdf.SetDashPattern(dash, 0)
		if len(dash) > 0 {
			pdf.SetLineCapStyle("butt")
		} else {
			pdf.SetLineCapStyle("round")
		}
		style += "D"
	}
	return style
}

// table writes a table with a header row (repeated after a page break).
type column struct {
	title string
	w     float64 // fraction of the text width
	align string
}

func (b *pdfBrief) table(title string, cols []column, rows [][]string, mark func(i int) bool) {
	pdf := b.pdf
	cw := b.pw - 2*b.margin
	const rh = 11.5
	header := func() {
		b.font(true, 8.5)
		b.textColor(Ink)
		pdf.SetFillColor(0xec, 0xec, 0xec)
		pdf.SetDrawColor(int(Ink.R), int(Ink.G), int(Ink.B))
		pdf.SetLineWidth(0.6)
		pdf.SetDashPattern(nil, 0)
		for _, c := range cols {
			pdf.CellFormat(c.w*cw, rh+2, c.title, "B", 0, c.align, true, 0, "")
		}
		pdf.Ln(rh + 2)
	}
	b.font(true, 12)
	b.textColor(Ink)
	pdf.CellFormat(cw, 18, title, "", 1, "L", false, 0, "")
	header()
	_, pageH := pdf.GetPageSize()
	for i, row := range rows {
		if pdf.GetY()+rh > pageH-(b.margin+22) {
			pdf.AddPage()
			b.font(true, 9)
			pdf.CellFormat(cw, 14, title+" (continued)", "", 1, "L", false, 0, "")
			header()
		}
		bold := mark != nil && mark(i)
		b.font(bold, 8.5)
		if bold {
			b.textColor(WorstInk)
		} else {
			b.textColor(Ink)
		}
		for k, c := range cols {
			pdf.CellFormat(c.w*cw, rh, b.fit(row[k], c.w*cw-4), "", 0, c.align, false, 0, "")
		}
		pdf.Ln(rh)
	}
	pdf.Ln(8)
}

// fit shortens s with "…" until it fits width w in the current font.
func (b *pdfBrief) fit(s string, w float64) string {
	if b.pdf.GetStringWidth(s) <= w {
		return s
	}
	r := []rune(s)
	for len(r) > 1 && b.pdf.GetStringWidth(string(r)+"…") > w {
		r = r[:len(r)-1]
	}
	return string(r) + "…"
}

// ItineraryRows returns agent a's itinerary as table rows: step, clock
// time, action, junction, distance, and the candidates the agent is the
// first to check at that step.
func ItineraryRows(in Input, a int) [][]string {
	s := in.Site
	steps := projects.ItinerarySteps(s, in.Plan, a)
	type check struct {
		t float64
		v int
	}
	var first []check
	for _, ex := range in.Report.Exits {
		if (ex.Finder == engine.Finder(a) || ex.Finder == engine.Both) && ex.Node != s.Start {
			first = append(first, check{ex.FoundAt, ex.Node})
		}
	}
	sort.SliceStable(first, func(i, j int) bool { return first[i].t < first[j].t })
	rows := make([][]string, len(steps))
	k := 0
	for i, st := range steps {
		var found []string
		for k < len(first) && first[k].t <= st.T+1e-9*math.Max(1, st.T) {
			found = append(found, s.IDs[first[k].v])
			k++
		}
		action, dist := st.Action, ""
		switch st.Action {
		case "walk":
			action = "walk to"
			dist = fmt.Sprintf("%.1f %s", st.Dist, s.Unit())
		case "wait":
			action = "wait until " + st.Clock
		case "rendezvous":
			action = "rendezvous with " + s.Names[1-a]
		case "end":
			action = "end of route: stay"
		}
		rows[i] = []string{fmt.Sprint(i + 1), st.Clock, action, st.Place, dist, strings.Join(found, ", ")}
	}
	return rows
}

func (b *pdfBrief) itinerary(a int) {
	s := b.in.Site
	b.pdf.AddPage()
	cols := []column{{"Step", 0.06, "R"}, {"Clock", 0.09, "R"}, {"Action", 0.22, "L"}, {"Junction", 0.37, "L"}, {"Distance", 0.1, "R"}, {"First to check", 0.16, "L"}}
	title := fmt.Sprintf("Itinerary of %s (%g %s/s, %.1f %s walked)", s.Names[a], s.Speed[a], s.Unit(), b.in.Report.RouteLengths[a], s.Unit())
	b.table(title, cols, ItineraryRows(b.in, a), nil)
}

// CandidateRows returns one row per candidate: node, found at, finder,
// reached at (when both agents are there).
func CandidateRows(in Input) [][]string {
	s, r := in.Site, in.Report
	rows := make([][]string, 0, len(r.Exits))
	for _, ex := range r.Exits {
		finder := "nobody"
		switch ex.Finder {
		case 0, 1:
			finder = s.Names[ex.Finder]
		case engine.Both:
			finder = "both"
		}
		rows = append(rows, []string{projects.NodeName(s, ex.Node), engine.FormatClock(ex.FoundAt), finder, engine.FormatClock(ex.EvacAt)})
	}
	return rows
}

func (b *pdfBrief) candidates() {
	r := b.in.Report
	pdf := b.pdf
	if pdf.GetY() > b.ph*0.7 {
		pdf.AddPage()
	}
	cols := []column{{"Candidate", 0.5, "L"}, {"Found at", 0.15, "R"}, {"Finder", 0.17, "L"}, {"Reached at", 0.18, "R"}}
	b.table("Candidates: when each is found and when both agents are there (worst in red)", cols, CandidateRows(b.in), func(i int) bool {
		return r.Exits[i].Node == r.WorstExit
	})
}
