package engine

import (
	"fmt"
	"math"
)

// Backdrop is an image drawn under the site: its top-left corner at (X, Y) in
// drawing coordinates, Scale site units per image pixel, Opacity in [0, 1].
// Image is a path relative to the scenario file. Drawing only.
type Backdrop struct {
	Image   string
	X, Y    float64
	Scale   float64
	Opacity float64
}

// GeoRef records how an imported site's drawing coordinates map back to the
// source's coordinates, so that an export can write the source's coordinate
// system again. With (E, N) the source position (longitude and latitude in
// degrees for CRS "lonlat", plane easting and northing for CRS "planar"):
//
//	x = (E − Origin[0]) · Scale[0]
//	y = (Origin[1] − N) · Scale[1]        (drawing y grows downwards)
//
// Drawing only: corridor lengths are computed from the source, not from x, y.
type GeoRef struct {
	CRS    string // GeoRefLonLat or GeoRefPlanar
	Origin [2]float64
	Scale  [2]float64 // drawing units per source unit, each > 0
}

// The GeoRef coordinate systems.
const (
	GeoRefLonLat = "lonlat" // RFC 7946 longitude/latitude on WGS 84
	GeoRefPlanar = "planar" // projected plane coordinates
)

// ToDrawing maps a source position to drawing coordinates. O(1).
func (g GeoRef) ToDrawing(e, n float64) (x, y float64) {
	return (e - g.Origin[0]) * g.Scale[0], (g.Origin[1] - n) * g.Scale[1]
}

// FromDrawing maps drawing coordinates back to a source position. O(1).
func (g GeoRef) FromDrawing(x, y float64) (e, n float64) {
	return g.Origin[0] + x/g.Scale[0], g.Origin[1] - y/g.Scale[1]
}

// cloneDrawing gives out private copies of the corridor paths, backdrop and
// georef (Clone's deep copy of the drawing fields).
func cloneDrawing(out *Scenario) {
	for i := range out.Corridors {
		if p := out.Corridors[i].Path; p != nil {
			out.Corridors[i].Path = append([][2]float64(nil), p...)
		}
	}
	if out.Backdrop != nil {
		b := *out.Backdrop
		out.Backdrop = &b
	}
	if out.GeoRef != nil {
		g := *out.GeoRef
		out.GeoRef = &g
	}
}

// checkDrawing validates the drawing-only fields: finite path vertices, a
// backdrop with an image, a scale > 0 and an opacity in [0, 1], a georef with
// a known CRS, a finite origin and scales > 0. O(total path length).
func checkDrawing(sc Scenario) error {
	for i, c := range sc.Corridors {
		for k, p := range c.Path {
			if !finite(p[0]) || !finite(p[1]) {
				return fieldErr(fmt.Sprintf("corridors[%d].path[%d]", i, k), fmtNum(p[0])+","+fmtNum(p[1]), "coordinates must be finite")
			}
		}
	}
	if b := sc.Backdrop; b != nil {
		if b.Image == "" {
			return fieldErr("backdrop.image", `""`, "a backdrop names its image file")
		}
		if !finite(b.X) || !finite(b.Y) {
			return fieldErr("backdrop.x", fmtNum(b.X)+","+fmtNum(b.Y), "coordinates must be finite")
		}
		if !(b.Scale > 0) || math.IsInf(b.Scale, 0) {
			return fieldErr("backdrop.scale", fmtNum(b.Scale), "scale must be a finite number > 0 (site units per image pixel)")
		}
		if !(b.Opacity >= 0 && b.Opacity <= 1) {
			return fieldErr("backdrop.opacity", fmtNum(b.Opacity), "opacity must be between 0 and 1")
		}
	}
	if g := sc.GeoRef; g != nil {
		if g.CRS != GeoRefLonLat && g.CRS != GeoRefPlanar {
			return fieldErr("georef.crs", g.CRS, "want %q or %q", GeoRefLonLat, GeoRefPlanar)
		}
		if !finite(g.Origin[0]) || !finite(g.Origin[1]) {
			return fieldErr("georef.origin", fmtNum(g.Origin[0])+","+fmtNum(g.Origin[1]), "origin must be finite")
		}
		for k, f := range g.Scale {
			if !(f > 0) || math.IsInf(f, 0) {
				return fieldErr(fmt.Sprintf("georef.scale[%d]", k), fmtNum(f), "scale must be a finite number > 0")
			}
		}
	}
	return nil
}
