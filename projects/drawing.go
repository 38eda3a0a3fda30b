package projects

import (
	"bytes"
	"fmt"
	"math"

	json "github.com/goccy/go-json"

	"duosweep/engine"
)

// The second-wave drawing fields of FORMATS.md: corridors[].closed,
// corridors[].path, backdrop, and georef (this package's additive field for
// imported sites, documented in docs/import.md). Here they are only read and
// written with their types checked; engine.NewSite validates their values.

type wireBackdrop struct {
	Image   *string         `json:"image"`
	X       json.RawMessage `json:"x"`
	Y       json.RawMessage `json:"y"`
	Scale   json.RawMessage `json:"scale"`
	Opacity json.RawMessage `json:"opacity"`
}

type wireGeoRef struct {
	CRS    *string         `json:"crs"`
	Origin json.RawMessage `json:"origin"`
	Scale  json.RawMessage `json:"scale"`
}

type outBackdrop struct {
	Image   string  `json:"image"`
	X       float64 `json:"x"`
	Y       float64 `json:"y"`
	Scale   float64 `json:"scale"`
	Opacity float64 `json:"opacity"`
}

type outGeoRef struct {
	CRS    string     `json:"crs"`
	Origin [2]float64 `json:"origin"`
	Scale  [2]float64 `json:"scale"`
}

// DefaultBackdropOpacity is a backdrop's opacity when the file gives none.
const DefaultBackdropOpacity = 0.5

// boolean parses an optional JSON boolean (absent or null is false).
func boolean(field string, raw json.RawMessage) (bool, error) {
	switch b := bytes.TrimSpace(raw); string(b) {
	case "", "null", "false":
		return false, nil
	case "true":
		return true, nil
	default:
		return false, errf("%s: %s: not a boolean (want true or false)", field, b)
	}
}

// pair parses a JSON array of exactly two finite numbers.
func pair(field string, raw json.RawMessage) ([2]float64, error) {
	var items []json.RawMessage
	if err := json.Unmarshal(raw, &items); err != nil || len(items) != 2 {
		return [2]float64{}, errf("%s: %s: want [x, y]", field, clip(raw))
	}
	var p [2]float64
	for k, it := range items {
		x, err := number(fmt.Sprintf("%s[%d]", field, k), it)
		if err != nil {
			return [2]float64{}, err
		}
		p[k] = x
	}
	return p, nil
}

// clip shortens a raw value for an error message.
func clip(raw json.RawMessage) string {
	b := bytes.TrimSpace(raw)
	if len(b) > 40 {
		return string(b[:37]) + "..."
	}
	return string(b)
}

// drawing reads a corridor's closed and path fields; f names a field of this corridor.
func (c *wireCorridor) drawing(f func(string) string, cr *engine.Corridor) error {
	var err error
	if cr.Closed, err = boolean(f("closed"), c.Closed); err != nil {
		return err
	}
	if absent(c.Path) {
		return nil
	}
	var items []json.RawMessage
	if err := json.Unmarshal(c.Path, &items); err != nil {
		return errf("%s: %s: want [[x, y], ...]", f("path"), clip(c.Path))
	}
	if len(items) == 0 {
		return nil
	}
	cr.Path = make([][2]float64, len(items))
	for k, it := range items {
		if cr.Path[k], err = pair(fmt.Sprintf("%s[%d]", f("path"), k), it); err != nil {
			return err
		}
	}
	return nil
}

// drawing reads the scenario's backdrop and georef.
func (w *wireScenario) drawing(sc *engine.Scenario) error {
	if !absent(w.Backdrop) {
		var b wireBackdrop
		if err := json.Unmarshal(w.Backdrop, &b); err != nil {
			return errf("backdrop: %s: want {\"image\": ..., \"x\": ..., \"y\": ..., \"scale\": ..., \"opacity\": ...}", clip(w.Backdrop))
		}
		bd := engine.Backdrop{Opacity: DefaultBackdropOpacity}
		var err error
		if bd.Image, err = requiredString("backdrop.image", b.Image); err != nil {
			return err
		}
		opt := func(field string, raw json.RawMessage, dst *float64) error {
			if absent(raw) {
				return nil
			}
			*dst, err = number(field, raw)
			return err
		}
		if err := opt("backdrop.x", b.X, &bd.X); err != nil {
			return err
		}
		if err := opt("backdrop.y", b.Y, &bd.Y); err != nil {
			return err
		}
		if bd.Scale, err = number("backdrop.scale", b.Scale); err != nil {
			return err
		}
		if err := opt("backdrop.opacity", b.Opacity, &bd.Opacity); err != nil {
			return err
		}
		sc.Backdrop = &bd
	}
	if !absent(w.GeoRef) {
		var g wireGeoRef
		if err := json.Unmarshal(w.GeoRef, &g); err != nil {
			return errf("georef: %s: want {\"crs\": ..., \"origin\": [e, n], \"scale\": [kx, ky]}", clip(w.GeoRef))
		}
		var gr engine.GeoRef
		var err error
		if gr.CRS, err = requiredString("georef.crs", g.CRS); err != nil {
			return err
		}
		if absent(g.Origin) {
			return errf("georef.origin: missing")
		}
		if gr.Origin, err = pair("georef.origin", g.Origin); err != nil {
			return err
		}
		if absent(g.Scale) {
			return errf("georef.scale: missing")
		}
		if gr.Scale, err = pair("georef.scale", g.Scale); err != nil {
			return err
		}
		sc.GeoRef = &gr
	}
	return nil
}

// outDrawing returns the backdrop and georef as written.
func outDrawing(sc engine.Scenario) (*outBackdrop, *outGeoRef) {
	var b *outBackdrop
	var g *outGeoRef
	if sc.Backdrop != nil {
		bd := sc.Backdrop
		b = &outBackdrop{Image: bd.Image, X: bd.X, Y: bd.Y, Scale: bd.Scale, Opacity: bd.Opacity}
	}
	if sc.GeoRef != nil {
		g = &outGeoRef{CRS: sc.GeoRef.CRS, Origin: sc.GeoRef.Origin, Scale: sc.GeoRef.Scale}
	}
	return b, g
}

// checkDrawingFinite refuses non-finite drawing numbers in a draft (a saved
// draft must load again).
func checkDrawingFinite(sc engine.Scenario) error {
	bad := func(x float64) bool { return math.IsNaN(x) || math.IsInf(x, 0) }
	for i, c := range sc.Corridors {
		for k, p := range c.Path {
			if bad(p[0]) || bad(p[1]) {
				return errf("save: corridors[%d].path[%d]: %g,%g: not a finite number", i, k, p[0], p[1])
			}
		}
	}
	if b := sc.Backdrop; b != nil && (bad(b.X) || bad(b.Y) || bad(b.Scale) || bad(b.Opacity)) {
		return errf("save: backdrop: %g,%g scale %g opacity %g: not a finite number", b.X, b.Y, b.Scale, b.Opacity)
	}
	if g := sc.GeoRef; g != nil && (bad(g.Origin[0]) || bad(g.Origin[1]) || bad(g.Scale[0]) || bad(g.Scale[1])) {
		return errf("save: georef: origin %g,%g scale %g,%g: not a finite number", g.Origin[0], g.Origin[1], g.Scale[0], g.Scale[1])
	}
	return nil
}
