package importer

import (
	"bytes"
	stdjson "encoding/json"
	"fmt"
	"math"
	"strconv"

	json "github.com/goccy/go-json"
	"github.com/paulmach/orb"
	"github.com/paulmach/orb/geojson"

	"duosweep/engine"
)

// The GeoJSON reader. The collection is split into features with goccy's
// decoder, and each feature's geometry is parsed by orb/geojson; only what
// orb accepts silently (a position with fewer than 2 numbers) is checked on
// the raw bytes first.

type wireCollection struct {
	Type     *string           `json:"type"`
	Features []json.RawMessage `json:"features"`
	Duosweep json.RawMessage   `json:"duosweep"`
}

type wireFeature struct {
	Type       *string         `json:"type"`
	Geometry   json.RawMessage `json:"geometry"`
	Properties map[string]any  `json:"properties"`
}

// wireMeta is the collection's foreign member "duosweep" that Export writes:
// the scenario's name, unit and agents (all optional on input).
type wireMeta struct {
	Name   string `json:"name"`
	Unit   string `json:"unit"`
	CRS    string `json:"crs"` // "planar" reads the file as with Options.Planar
	Agents []struct {
		Name  string  `json:"name"`
		Speed float64 `json:"speed"`
	} `json:"agents"`
}

// A property "duosweep": "route" marks the plan's routes in an exported
// file; they are not corridors and are skipped on import.
const routeKind = "route"

// gline is one line (a LineString, or one part of a MultiLineString).
type gline struct {
	where  string
	src    []orb.Point  // source positions, consecutive duplicates removed
	xy     [][2]float64 // drawing positions
	length float64      // the "length" property, NaN when absent
	closed bool
}

type gpoint struct {
	where     string
	src       orb.Point
	id, label string
	hasID     bool
	candidate *bool
	prob      *float64
	start     bool
}

// ReadGeoJSON imports a GeoJSON FeatureCollection of LineString and
// MultiLineString corridor centrelines and optional Point features (see the
// package comment and docs/import.md). Bad input is refused with the
// feature index and the reason. O(V log V) for V positions.
func ReadGeoJSON(data []byte, opt Options) (*Result, error) {
	if !(opt.Snap >= 0) || math.IsInf(opt.Snap, 0) {
		return nil, errAt("snap", "%g: must be a finite number >= 0", opt.Snap)
	}
	var wc wireCollection
	if err := json.Unmarshal(data, &wc); err != nil {
		if !stdjson.Valid(data) {
			return nil, errAt("", "not JSON: %s", jsonReason(data))
		}
		return nil, errAt("", "not GeoJSON: want a FeatureCollection object: %v", err)
	}
	if wc.Type == nil {
		return nil, errAt("", "not GeoJSON: the object has no \"type\" member")
	}
	if *wc.Type != "FeatureCollection" {
		return nil, errAt("type", "%q: not a FeatureCollection (put the corridor lines in one)", *wc.Type)
	}
	if wc.Features == nil {
		return nil, errAt("features", "missing: a FeatureCollection needs a \"features\" array")
	}
	var lines []gline
	var points []gpoint
	for i, raw := range wc.Features {
		where := "features[" + strconv.Itoa(i) + "]"
		ls, pt, err := readFeature(where, raw)
		if err != nil {
			return nil, err
		}
		lines = append(lines, ls...)
		if pt != nil {
			points = append(points, *pt)
		}
	}
	if len(lines) == 0 {
		return nil, errAt("features", "no lines: %d features, none a LineString or MultiLineString", len(wc.Features))
	}
	net := &network{}
	if !absent(wc.Duosweep) {
		var m wireMeta
		if err := json.Unmarshal(wc.Duosweep, &m); err != nil {
			return nil, errAt("duosweep", "not an object {\"name\", \"unit\", \"agents\"}: %v", err)
		}
		net.name, net.unit = m.Name, m.Unit
		if m.CRS == engine.GeoRefPlanar && !opt.Planar {
			opt.Planar = true
			net.msgs = append(net.msgs, "coordinates: the file says they are plane coordinates (duosweep.crs)")
		}
		for _, a := range m.Agents {
			net.agents = append(net.agents, engine.Agent{Name: a.Name, Speed: a.Speed})
		}
	}
	georef(net, lines, points, opt)
	if err := buildJunctions(net, lines, points, opt.Snap); err != nil {
		return nil, err
	}
	return finish(net, opt)
}

func absent(raw json.RawMessage) bool {
	b := bytes.TrimSpace(raw)
	return len(b) == 0 || string(b) == "null"
}

// jsonReason is the standard library's syntax error with its line and column.
func jsonReason(data []byte) string {
	var v any
	err := stdjson.Unmarshal(data, &v)
	var se *stdjson.SyntaxError
	if e, ok := err.(*stdjson.SyntaxError); ok {
		se = e
		line, col := 1, 1
		for _, c := range data[:min(int(se.Offset), len(data))] {
			if c == '\n' {
				line, col = line+1, 1
			} else {
				col++
			}
		}
		return fmt.Sprintf("line %d, column %d: %v", line, col, se)
	}
	if err == nil {
		return "invalid"
	}
	return err.Error()
}

func readFeature(where string, raw json.RawMessage) ([]gline, *gpoint, error) {
	var wf wireFeature
	if err := json.Unmarshal(raw, &wf); err != nil {
		return nil, nil, errAt(where, "not a GeoJSON Feature: %v", err)
	}
	if wf.Type == nil || *wf.Type != "Feature" {
		t := "none"
		if wf.Type != nil {
			t = strconv.Quote(*wf.Type)
		}
		return nil, nil, errAt(where, "type %s: not a Feature", t)
	}
	if kind, _ := wf.Properties["duosweep"].(string); kind == routeKind {
		return nil, nil, nil
	}
	if absent(wf.Geometry) {
		return nil, nil, errAt(where, "no geometry")
	}
	if err := checkPositions(wf.Geometry); err != nil {
		return nil, nil, errAt(where, "%v", err)
	}
	g, err := geojson.UnmarshalGeometry(wf.Geometry)
	if err != nil {
		return nil, nil, errAt(where, "geometry: %v", err)
	}
	props := wf.Properties
	switch geom := g.Geometry().(type) {
	case orb.LineString:
		l, err := readLine(where, geom, props)
		if err != nil {
			return nil, nil, err
		}
		return []gline{l}, nil, nil
	case orb.MultiLineString:
		if len(geom) == 0 {
			return nil, nil, errAt(where, "a MultiLineString with no lines")
		}
		var ls []gline
		for k, part := range geom {
			l, err := readLine(fmt.Sprintf("%s part %d", where, k), part, props)
			if err != nil {
				return nil, nil, err
			}
			ls = append(ls, l)
		}
		if !math.IsNaN(ls[0].length) {
			return nil, nil, errAt(where, "property \"length\": not supported on a MultiLineString (give each part its own feature)")
		}
		return ls, nil, nil
	case orb.Point:
		p, err := readPoint(where, geom, props)
		return nil, p, err
	case nil:
		return nil, nil, errAt(where, "no geometry")
	default:
		return nil, nil, errAt(where, "a %s: only LineString, MultiLineString and Point features are read", g.Geometry().GeoJSONType())
	}
}

type wireGeometry struct {
	Type        string          `json:"type"`
	Coordinates json.RawMessage `json:"coordinates"`
}

// positionDepth is the array depth of a position in each geometry type's coordinates.
var positionDepth = map[string]int{"Point": 1, "MultiPoint": 2, "LineString": 2, "MultiLineString": 3, "Polygon": 3, "MultiPolygon": 4}

// checkPositions checks on the raw geometry that every position has at
// least 2 numbers: orb reads [1] as (1, 0) and [] as (0, 0).
func checkPositions(raw []byte) error {
	var wg wireGeometry
	if err := json.Unmarshal(raw, &wg); err != nil {
		return fmt.Errorf("geometry: %v", err)
	}
	want, ok := positionDepth[wg.Type]
	if !ok || absent(wg.Coordinates) {
		return nil // orb reports unknown types and missing coordinates
	}
	c := bytes.TrimSpace(wg.Coordinates)
	depth, count, inString := 0, 0, false
	for i := 0; i < len(c); i++ {
		b := c[i]
		if inString {
			if b == '\\' {
				i++
			} else if b == '"' {
				inString = false
			}
			continue
		}
		switch {
		case b == '"':
			inString = true
			if depth == want {
				count++
			}
		case b == '[':
			depth++
			if depth == want {
				count = 0
			}
		case b == ']':
			if depth == want && count < 2 {
				return fmt.Errorf("a position has %d number%s; a position needs 2 (longitude, latitude or x, y)", count, plural(count))
			}
			depth--
		case depth == want && b != ',' && b != ' ' && b != '\n' && b != '\t' && b != '\r' && (i == 0 || c[i-1] == '[' || c[i-1] == ',' || c[i-1] == ' ' || c[i-1] == '\n' || c[i-1] == '\t' || c[i-1] == '\r'):
			count++ // the first byte of a value
		}
	}
	return nil
}

func readLine(where string, ls orb.LineString, props map[string]any) (gline, error) {
	l := gline{where: where, length: math.NaN()}
	if len(ls) < 2 {
		return l, errAt(where, "a line has %d position%s; it needs at least 2", len(ls), plural(len(ls)))
	}
	l.src = make([]orb.Point, 0, len(ls))
	for k, p := range ls {
		if !finite(p[0]) || !finite(p[1]) {
			return l, errAt(where, "position %d: %g,%g: coordinates must be finite", k, p[0], p[1])
		}
		if k > 0 && p == l.src[len(l.src)-1] {
			continue
		}
		l.src = append(l.src, p)
	}
	if len(l.src) < 2 {
		return l, errAt(where, "all %d positions are equal: a line needs length", len(ls))
	}
	if v, ok := props["length"]; ok && v != nil {
		x, ok := v.(float64)
		if !ok || !(x > 0) || math.IsInf(x, 0) {
			return l, errAt(where, "property \"length\": %v: want a finite number > 0", v)
		}
		l.length = x
	}
	if v, ok := props["closed"]; ok && v != nil {
		b, ok := v.(bool)
		if !ok {
			return l, errAt(where, "property \"closed\": %v: want true or false", v)
		}
		l.closed = b
	}
	return l, nil
}

func readPoint(where string, p orb.Point, props map[string]any) (*gpoint, error) {
	if !finite(p[0]) || !finite(p[1]) {
		return nil, errAt(where, "%g,%g: coordinates must be finite", p[0], p[1])
	}
	gp := &gpoint{where: where, src: p}
	str := func(key string) (string, bool, error) {
		v, ok := props[key]
		if !ok || v == nil {
			return "", false, nil
		}
		switch x := v.(type) {
		case string:
			return x, x != "", nil
		case float64:
			return strconv.FormatFloat(x, 'f', -1, 64), true, nil
		}
		return "", false, errAt(where, "property %q: %v: want text", key, v)
	}
	id, hasID, err := str("id")
	if err != nil {
		return nil, err
	}
	name, hasName, err := str("name")
	if err != nil {
		return nil, err
	}
	label, _, err := str("label")
	if err != nil {
		return nil, err
	}
	switch {
	case hasID:
		gp.id, gp.hasID = id, true
		if label == "" && hasName && name != id {
			label = name
		}
	case hasName:
		gp.id, gp.hasID = name, true
	}
	gp.label = label
	flag := func(key string) (*bool, error) {
		v, ok := props[key]
		if !ok || v == nil {
			return nil, nil
		}
		b, ok := v.(bool)
		if !ok {
			return nil, errAt(where, "property %q: %v: want true or false", key, v)
		}
		return &b, nil
	}
	if gp.candidate, err = flag("candidate"); err != nil {
		return nil, err
	}
	st, err := flag("start")
	if err != nil {
		return nil, err
	}
	gp.start = st != nil && *st
	if v, ok := props["probability"]; ok && v != nil {
		x, ok := v.(float64)
		if !ok {
			return nil, errAt(where, "property \"probability\": %v: want a number", v)
		}
		gp.prob = &x
	}
	return gp, nil
}

// georef chooses the coordinate system (planar when asked, or when some
// position is outside the longitude/latitude range) and maps every position
// to drawing coordinates.
func georef(net *network, lines []gline, points []gpoint, opt Options) {
	minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	outside := ""
	see := func(where string, p orb.Point) {
		minX, maxX = math.Min(minX, p[0]), math.Max(maxX, p[0])
		minY, maxY = math.Min(minY, p[1]), math.Max(maxY, p[1])
		if outside == "" && (math.Abs(p[0]) > 180 || math.Abs(p[1]) > 90) {
			outside = fmt.Sprintf("%s has %g,%g", where, p[0], p[1])
		}
	}
	for _, l := range lines {
		for _, p := range l.src {
			see(l.where, p)
		}
	}
	for _, p := range points {
		see(p.where, p.src)
	}
	g := &engine.GeoRef{CRS: engine.GeoRefPlanar, Origin: [2]float64{minX, maxY}, Scale: [2]float64{1, 1}}
	switch {
	case opt.Planar:
		net.msgs = append(net.msgs, "coordinates: plane coordinates (--planar); lengths in the plane")
	case outside != "":
		net.msgs = append(net.msgs, fmt.Sprintf("coordinates: outside the longitude/latitude range (%s), so read as projected plane coordinates; lengths in the plane, in the file's unit", outside))
	default:
		kx, ky := MetresPerDegree((minY + maxY) / 2)
		g = &engine.GeoRef{CRS: engine.GeoRefLonLat, Origin: [2]float64{minX, maxY}, Scale: [2]float64{kx, ky}}
		net.unit = "m"
		net.msgs = append(net.msgs, "coordinates: longitude/latitude (RFC 7946); lengths along the lines on the WGS 84 ellipsoid, in metres")
	}
	net.geo = g
	for i := range lines {
		l := &lines[i]
		l.xy = make([][2]float64, len(l.src))
		for k, p := range l.src {
			x, y := g.ToDrawing(p[0], p[1])
			l.xy[k] = [2]float64{x, y}
		}
	}
}

// segLength is the length of one line segment in the network's system.
func (net *network) segLength(a, b orb.Point) float64 {
	if net.geo.CRS == engine.GeoRefLonLat {
		return EllipsoidLength(a[0], a[1], b[0], b[1])
	}
	return PlaneLength(a[0], a[1], b[0], b[1])
}
