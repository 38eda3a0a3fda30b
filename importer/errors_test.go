package importer

import (
	"errors"
	"strconv"
	"strings"
	"testing"

	"duosweep/engine"
)

const okLine = `{"type":"Feature","properties":{},"geometry":{"type":"LineString","coordinates":[[0,0],[0.001,0]]}}`

func fcOf(features ...string) string {
	return `{"type":"FeatureCollection","features":[` + strings.Join(features, ",") + `]}`
}

// TestGeoJSONRefusals: every kind of bad input is refused with the feature
// index (or the member) and the reason; nothing is returned with an error.
func TestGeoJSONRefusals(t *testing.T) {
	line := func(coords string) string {
		return `{"type":"Feature","properties":{},"geometry":{"type":"LineString","coordinates":` + coords + `}}`
	}
	point := func(coords, props string) string {
		return `{"type":"Feature","properties":` + props + `,"geometry":{"type":"Point","coordinates":` + coords + `}}`
	}
	far := line(`[[1,1],[1.001,1]]`)
	cases := []struct {
		name string
		in   string
		opt  Options
		want []string
	}{
		{"not JSON", `{"type":"FeatureCollection",`, Options{}, []string{"not JSON", "line 1"}},
		{"empty file", ``, Options{}, []string{"not JSON"}},
		{"not GeoJSON: an array", `[1, 2]`, Options{}, []string{"not GeoJSON"}},
		{"not GeoJSON: no type", `{"features": []}`, Options{}, []string{"not GeoJSON", "no \"type\""}},
		{"a Feature, not a collection", okLine, Options{}, []string{"type", `"Feature"`, "not a FeatureCollection"}},
		{"no features member", `{"type":"FeatureCollection"}`, Options{}, []string{"features", "missing"}},
		{"feature of another type", fcOf(okLine, `{"type":"Thing","geometry":null}`), Options{}, []string{"features[1]", `"Thing"`, "not a Feature"}},
		{"feature not an object", fcOf(okLine, `[1]`), Options{}, []string{"features[1]", "not a GeoJSON Feature"}},
		{"no geometry", fcOf(okLine, `{"type":"Feature","properties":{},"geometry":null}`), Options{}, []string{"features[1]", "no geometry"}},
		{"no lines", fcOf(point(`[0,0]`, `{"name":"a"}`)), Options{}, []string{"no lines"}},
		{"empty collection", fcOf(), Options{}, []string{"no lines", "0 features"}},
		{"line with one position", fcOf(okLine, line(`[[0,0]]`)), Options{}, []string{"features[1]", "1 position", "at least 2"}},
		{"line with no position", fcOf(line(`[]`)), Options{}, []string{"features[0]", "0 positions"}},
		{"position with one number", fcOf(okLine, line(`[[0,0],[1]]`)), Options{}, []string{"features[1]", "1 number", "needs 2"}},
		{"point with no numbers", fcOf(okLine, point(`[]`, `{}`)), Options{}, []string{"features[1]", "0 numbers"}},
		{"non-finite coordinate", fcOf(okLine, line(`[[0,0],[1e999,0]]`)), Options{}, []string{"features[1]", "1e999"}},
		{"coordinate not a number", fcOf(line(`[[0,0],["x",0]]`)), Options{}, []string{"features[0]", "string"}},
		{"all positions equal", fcOf(line(`[[0,0],[0,0],[0,0]]`)), Options{}, []string{"features[0]", "all 3 positions are equal"}},
		{"a polygon", fcOf(okLine, `{"type":"Feature","properties":{},"geometry":{"type":"Polygon","coordinates":[[[0,0],[1,0],[1,1],[0,0]]]}}`), Options{}, []string{"features[1]", "Polygon", "only LineString"}},
		{"unknown geometry", fcOf(`{"type":"Feature","properties":{},"geometry":{"type":"Blob","coordinates":[]}}`), Options{}, []string{"features[0]", "geometry"}},
		{"unknown start name", fcOf(okLine), Options{Start: "portal"}, []string{"start", `"portal"`, "unknown start name"}},
		{"empty result", fcOf(line(`[[0,0],[0.000001,0]]`)), Options{Snap: 5}, []string{"empty result"}},
		{"bad closed property", fcOf(`{"type":"Feature","properties":{"closed":"yes"},"geometry":{"type":"LineString","coordinates":[[0,0],[1,0]]}}`), Options{}, []string{"features[0]", `"closed"`, "true or false"}},
		{"bad length property", fcOf(`{"type":"Feature","properties":{"length":-3},"geometry":{"type":"LineString","coordinates":[[0,0],[1,0]]}}`), Options{}, []string{"features[0]", `"length"`, "-3", "> 0"}},
		{"bad candidate property", fcOf(okLine, point(`[0,0]`, `{"name":"a","candidate":"no"}`)), Options{}, []string{"features[1]", `"candidate"`}},
		{"point off the lines", fcOf(okLine, point(`[0.5,0.5]`, `{"name":"lost"}`)), Options{}, []string{"features[1]", `"lost"`, "not within the snap"}},
		{"two points on one junction", fcOf(okLine, point(`[0,0]`, `{"name":"a"}`), point(`[0,0]`, `{"name":"b"}`)), Options{}, []string{"features[2]", `"b"`, "same junction as features[1]"}},
		{"duplicate point names", fcOf(okLine, point(`[0,0]`, `{"name":"a"}`), point(`[0.001,0]`, `{"name":"a"}`)), Options{}, []string{"nodes[1].id: a", "duplicate", "features[2]"}},
		{"probabilities do not sum to 1", fcOf(okLine, point(`[0.001,0]`, `{"name":"a","probability":0.5}`)), Options{}, []string{"probability", "sum to 1"}},
		{"two pieces", fcOf(okLine, far), Options{}, []string{"2 unconnected pieces", "--largest", "features[1]"}},
		{"start outside the largest piece", fcOf(okLine, line(`[[1,1],[1.01,1]]`)), Options{Start: "j1", Largest: true}, []string{"start", "j1", "not in the largest piece"}},
		{"negative snap", fcOf(okLine), Options{Snap: -1}, []string{"snap", "-1"}},
		{"bad duosweep member", `{"type":"FeatureCollection","duosweep":[1],"features":[` + okLine + `]}`, Options{}, []string{"duosweep"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r, err := ReadGeoJSON([]byte(c.in), c.opt)
			if err == nil {
				t.Fatalf("accepted: %+v", r.Scenario)
			}
			if r != nil {
				t.Fatal("a result with an error")
			}
			msg := err.Error()
			if !strings.HasPrefix(msg, "import: ") {
				t.Errorf("message %q lacks the prefix", msg)
			}
			mustContain(t, msg, c.want...)
		})
	}
	if len(cases) < 12 {
		t.Fatal("fewer than 12 kinds")
	}
}

func TestGeoJSONOptions(t *testing.T) {
	if _, err := ReadGeoJSON([]byte(fcOf(okLine, `{"type":"Feature","properties":{},"geometry":{"type":"LineString","coordinates":[[1,1],[1.01,1]]}}`)), Options{}); !errors.Is(err, ErrSeveralPieces) {
		t.Fatalf("want ErrSeveralPieces, got %v", err)
	}
	// --largest keeps the longer piece and says what it dropped
	far := `{"type":"Feature","properties":{},"geometry":{"type":"LineString","coordinates":[[1,1],[1.01,1]]}}`
	r, err := ReadGeoJSON([]byte(fcOf(okLine, far)), Options{Largest: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Scenario.Nodes) != 2 || r.DroppedNodes != 2 || r.DroppedCorridors != 1 || r.Scenario.Corridors[0].Length < 1000 {
		t.Fatalf("kept %+v, dropped %d/%d", r.Scenario.Corridors, r.DroppedNodes, r.DroppedCorridors)
	}
	mustContain(t, strings.Join(r.Messages, "\n"), "kept the largest of 2 pieces", "dropped 2 junctions and 1 corridors")
	// --start may name a unique label
	labelled := fcOf(okLine, `{"type":"Feature","properties":{"id":"p","label":"Portal"},"geometry":{"type":"Point","coordinates":[0.001,0]}}`)
	r, err = ReadGeoJSON([]byte(labelled), Options{Start: "Portal"})
	if err != nil || r.Scenario.Start != "p" {
		t.Fatalf("start by label: %v", err)
	}
	// --start-near picks the nearest junction
	r, err = ReadGeoJSON([]byte(fcOf(okLine)), Options{StartNear: &[2]float64{0.0009, 0.0001}})
	if err != nil {
		t.Fatal(err)
	}
	if r.Scenario.Start != "j2" {
		t.Fatalf("start %q, want j2", r.Scenario.Start)
	}
	// ends within the snap join; beyond it they do not (0.2 m and 0.8 m at the equator)
	const dlon = 1.0 / 111319.49 // one metre of longitude at the equator
	two := func(gap float64) string {
		return fcOf(okLine, `{"type":"Feature","properties":{},"geometry":{"type":"LineString","coordinates":[[`+ftoa(0.001+gap*dlon)+`,0],[0.001,0.001]]}}`)
	}
	if _, err := ReadGeoJSON([]byte(two(0.2)), DefaultOptions()); err != nil {
		t.Fatalf("0.2 m gap: %v", err)
	}
	if _, err := ReadGeoJSON([]byte(two(0.8)), DefaultOptions()); err == nil || !strings.Contains(err.Error(), "2 unconnected pieces") {
		t.Fatalf("0.8 m gap: %v", err)
	}
	// a line through an interior shared vertex is split there; the engine error type is kept
	cross := fcOf(`{"type":"Feature","properties":{},"geometry":{"type":"LineString","coordinates":[[0,0],[0.001,0],[0.002,0]]}}`,
		`{"type":"Feature","properties":{},"geometry":{"type":"LineString","coordinates":[[0.001,-0.001],[0.001,0],[0.001,0.001]]}}`)
	r, err = ReadGeoJSON([]byte(cross), DefaultOptions())
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Scenario.Corridors) != 4 || len(r.Scenario.Nodes) != 5 {
		t.Fatalf("a crossing through a shared vertex: %d corridors, %d nodes; want 4 and 5", len(r.Scenario.Corridors), len(r.Scenario.Nodes))
	}
	_, err = ReadGeoJSON([]byte(fcOf(okLine, `{"type":"Feature","properties":{"name":"a","probability":2},"geometry":{"type":"Point","coordinates":[0.001,0]}}`)), DefaultOptions())
	var fe *engine.FieldError
	if !errors.As(err, &fe) || fe.Field != "nodes[].probability" {
		t.Fatalf("want the engine's FieldError, got %v", err)
	}
}

func ftoa(x float64) string { return strconv.FormatFloat(x, 'f', -1, 64) }
