package brief

import (
	"bufio"
	"encoding/xml"
	"fmt"
	"image/color"
	"io"
	"strconv"
	"strings"
)

// WriteSVG writes the scene as an SVG 1.1 document, one element per shape in
// drawing order; text is XML-escaped with encoding/xml. Paths carry their
// class and id attributes. O(shapes).
func WriteSVG(w io.Writer, sc *Scene) error {
	bw := bufio.NewWriter(w)
	num := func(x float64) string { return strconv.FormatFloat(x, 'f', 2, 64) }
	pf := func(format string, args ...any) { fmt.Fprintf(bw, format, args...) }
	esc := func(s string) string {
		var b strings.Builder
		_ = xml.EscapeText(&b, []byte(s))
		return b.String()
	}
	pf(`<?xml version="1.0" encoding="UTF-8"?>` + "\n")
	pf(`<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="%s" height="%s" viewBox="0 0 %s %s">`+"\n",
		num(sc.W), num(sc.H), num(sc.W), num(sc.H))
	pf(`<rect x="0" y="0" width="%s" height="%s" fill="%s"/>`+"\n", num(sc.W), num(sc.H), hexColor(sc.Background))
	attrs := func(class, id string) string {
		out := ""
		if class != "" {
			out += ` class="` + esc(class) + `"`
		}
		if id != "" {
			out += ` id="` + esc(id) + `"`
		}
		return out
	}
	paint := func(fill, stroke color.NRGBA, width float64, dash []float64) string {
		out := ` fill="none"`
		if fill.A > 0 {
			out = ` fill="` + hexColor(fill) + `"` + opacity("fill-opacity", fill)
		}
		if stroke.A > 0 && width > 0 {
			out += ` stroke="` + hexColor(stroke) + `"` + opacity("stroke-opacity", stroke) + ` stroke-width="` + num(width) + `"`
			if len(dash) > 0 {
				ds := make([]string, len(dash))
				for i, d := range dash {
					ds[i] = num(d)
				}
				out += ` stroke-dasharray="` + strings.Join(ds, " ") + `" stroke-linecap="butt" stroke-linejoin="round"`
			} else {
				out += ` stroke-linecap="round" stroke-linejoin="round"`
			}
		}
		return out
	}
	for _, s := range sc.Shapes {
		switch s := s.(type) {
		case *Path:
			if len(s.Pts) == 0 {
				continue
			}
			var d strings.Builder
			for i, p := range s.Pts {
				if i == 0 {
					d.WriteString("M")
				} else {
					d.WriteString(" L")
				}
				d.WriteString(num(p.X) + " " + num(p.Y))
			}
			if s.Closed {
				d.WriteString(" Z")
			}
			pf(`<path%s d="%s"%s/>`+"\n", attrs(s.Class, s.ID), d.String(), paint(s.Fill, s.Stroke, s.Width, s.Dash))
		case *Disc:
			pf(`<circle%s cx="%s" cy="%s" r="%s"%s/>`+"\n", attrs(s.Class, s.ID), num(s.C.X), num(s.C.Y), num(s.R), paint(s.Fill, s.Stroke, s.Width, nil))
		case *Label:
			anchor := "start"
			switch s.Anchor {
			case Middle:
				anchor = "middle"
			case End:
				anchor = "end"
			}
			weight := ""
			if s.Bold {
				weight = ` font-weight="bold"`
			}
			pf(`<text%s x="%s" y="%s" font-family="Go, 'Go Regular', sans-serif" font-size="%s"%s text-anchor="%s" fill="%s">%s</text>`+"\n",
				attrs(s.Class, ""), num(s.At.X), num(s.At.Y), num(s.Size), weight, anchor, hexColor(s.Color), esc(s.Text))
		}
	}
	pf("</svg>\n")
	return bw.Flush()
}

func hexColor(c color.NRGBA) string { return fmt.Sprintf("#%02x%02x%02x", c.R, c.G, c.B) }

func opacity(attr string, c color.NRGBA) string {
	if c.A == 0xff {
		return ""
	}
	return fmt.Sprintf(` %s="%.3f"`, attr, float64(c.A)/255)
}
