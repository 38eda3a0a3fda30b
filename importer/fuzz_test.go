package importer

import (
	"bytes"
	stdjson "encoding/json"
	"strings"
	"testing"

	"duosweep/engine"
)

// FuzzReadGeoJSON: never panics; an error comes without a result and with
// the package prefix; what it accepts is valid JSON for the standard
// library (a parser outside this package), validates with engine.NewSite,
// and round-trips through WriteGeoJSON.
func FuzzReadGeoJSON(f *testing.F) {
	f.Add([]byte(fcOf(okLine)))
	f.Add([]byte(fcOf(okLine, `{"type":"Feature","properties":{"name":"a","start":true},"geometry":{"type":"Point","coordinates":[0,0]}}`)))
	f.Add([]byte(`{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"closed":true},"geometry":{"type":"MultiLineString","coordinates":[[[0,0],[1,0],[1,1]],[[1,1],[0,0]]]}}]}`))
	f.Add([]byte(`{"type":"FeatureCollection","features":[{"type":"Feature","geometry":{"type":"LineString","coordinates":[[500000,0],[500010,0],[500010,10],[500000,0]]}}]}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		if len(data) > 1<<16 {
			return
		}
		r, err := ReadGeoJSON(data, DefaultOptions())
		if err != nil {
			if r != nil || !strings.HasPrefix(err.Error(), "import: ") {
				t.Fatalf("error %v with result %v", err, r)
			}
			return
		}
		if !stdjson.Valid(data) {
			t.Fatalf("accepted invalid JSON %q", data)
		}
		if _, err := engine.NewSite(r.Scenario); err != nil {
			t.Fatalf("accepted a scenario NewSite refuses: %v", err)
		}
		var buf bytes.Buffer
		if err := WriteGeoJSON(&buf, r.Site, nil, nil); err != nil {
			t.Fatalf("export: %v", err)
		}
		back, err := ReadGeoJSON(buf.Bytes(), DefaultOptions())
		if err != nil {
			t.Fatalf("the export does not import: %v", err)
		}
		if len(back.Scenario.Corridors) != len(r.Scenario.Corridors) || back.Scenario.Start != r.Scenario.Start {
			t.Fatalf("round trip: %d corridors start %q, was %d %q", len(back.Scenario.Corridors), back.Scenario.Start, len(r.Scenario.Corridors), r.Scenario.Start)
		}
	})
}

// FuzzReadCSV: never panics; errors come without a result; what it accepts
// validates with engine.NewSite and has every node placed.
func FuzzReadCSV(f *testing.F) {
	f.Add(corridorsCSV, nodesCSV)
	f.Add("from,to,length\ns,a,1\na,b,1\nb,s,5\n", "")
	f.Add("length,to,from,closed\n3,a,s,\n4,b,a,true\n", "id,x,y\ns,0,0\n")
	f.Fuzz(func(t *testing.T, corridors, nodes string) {
		var r *Result
		var err error
		if nodes == "" {
			r, err = ReadCSV(strings.NewReader(corridors), nil, Options{})
		} else {
			r, err = ReadCSV(strings.NewReader(corridors), strings.NewReader(nodes), Options{})
		}
		if err != nil {
			if r != nil || !strings.HasPrefix(err.Error(), "import: ") {
				t.Fatalf("error %v with result %v", err, r)
			}
			return
		}
		if _, err := engine.NewSite(r.Scenario); err != nil {
			t.Fatalf("accepted a scenario NewSite refuses: %v", err)
		}
		for _, n := range r.Scenario.Nodes {
			if !n.HasXY {
				t.Fatalf("node %q not laid out", n.ID)
			}
		}
	})
}
