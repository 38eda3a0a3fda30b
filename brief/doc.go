// Package brief turns a site, a plan and its report into the material of a
// crew briefing: a site map as one drawing description (a Scene: a list of
// paths, discs and labels with colours, widths and dash patterns), and
// writers that walk that list for SVG, PNG and PDF; an animated GIF of the
// replay drawn from the same description; and a timetable CSV.
//
// The package is pure Go: it imports no fyne package (a test enforces it).
// The PNG and GIF rasteriser is github.com/srwiley/rasterx over
// golang.org/x/image/vector; the PDF writer is codeberg.org/go-pdf/fpdf; the
// one font, embedded in every output that carries text, is the Go font
// (golang.org/x/image/font/gofont), which has every character the briefing
// uses ("·", "–", "×", "≤", a test checks).
//
// Duosweep is a planning and training aid, not a substitute for the site's
// emergency plan, local regulations or licensed practice; every page and
// picture of a briefing says so.
package brief
