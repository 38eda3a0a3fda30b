package importer

import (
	stdjson "encoding/json"
	"math/rand/v2"
	"sync"
	"testing"
	"time"

	"github.com/paulmach/orb/geojson"
)

// The speed goal (issue 10): importing a generated 50,000-line network takes
// at most 3 times as long as decoding the same file's JSON alone. Compare
// BenchmarkImport50k with BenchmarkDecode50kAny (encoding/json into any) and
// BenchmarkDecode50kOrb (the GeoJSON library's decoding of the file, with
// the goccy decoder this package gives it, orbjson.go), or run
// BenchmarkImportVsDecode50k, which alternates them and reports the ratios:
//
//	go test ./importer -run XXX -bench 50k -benchtime 5x

var big struct {
	once sync.Once
	data []byte
}

// bigNetwork is a 125 × 201 grid of junctions about 40 m apart in
// longitude/latitude, every neighbouring pair joined by its own line with one
// bent vertex: 49,924 lines, 25,125 junctions, 24,800 loops.
func bigNetwork(b *testing.B) []byte {
	big.once.Do(func() {
		rng := rand.New(rand.NewPCG(50, 0))
		const rows, cols = 125, 201
		toSrc := lonLatAt(-31.25, 41.5)
		at := func(r, c int) [2]float64 { return [2]float64{float64(c) * 40, float64(r) * 40} }
		var fc collection
		fc.Type = "FeatureCollection"
		line := func(a, b [2]float64) {
			m := [2]float64{(a[0]+b[0])/2 + rng.Float64()*4 - 2, (a[1]+b[1])/2 + rng.Float64()*4 - 2}
			fc.Features = append(fc.Features, lineFeature([][2]float64{toSrc(a[0], a[1]), toSrc(m[0], m[1]), toSrc(b[0], b[1])}, nil))
		}
		for r := 0; r < rows; r++ {
			for c := 0; c < cols; c++ {
				if c+1 < cols {
					line(at(r, c), at(r, c+1))
				}
				if r+1 < rows {
					line(at(r, c), at(r+1, c))
				}
			}
		}
		p := at(0, 0)
		fc.Features = append(fc.Features, pointFeature(toSrc(p[0], p[1]), map[string]any{"name": "portal", "start": true}))
		big.data = marshal(b, fc)
	})
	return big.data
}

func BenchmarkImport50k(b *testing.B) {
	data := bigNetwork(b)
	b.SetBytes(int64(len(data)))
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		r, err := ReadGeoJSON(data, DefaultOptions())
		if err != nil {
			b.Fatal(err)
		}
		if len(r.Scenario.Corridors) != 49924 {
			b.Fatalf("%d corridors", len(r.Scenario.Corridors))
		}
	}
}

func BenchmarkDecode50kOrb(b *testing.B) {
	data := bigNetwork(b)
	b.SetBytes(int64(len(data)))
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := geojson.UnmarshalFeatureCollection(data); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDecode50kAny(b *testing.B) {
	data := bigNetwork(b)
	b.SetBytes(int64(len(data)))
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		var v any
		if err := stdjson.Unmarshal(data, &v); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkImportVsDecode50k alternates the two in every iteration, so that
// a machine shared with other work slows both alike, and reports the ratio
// of import time to decoding time (encoding/json into any, and orb's
// FeatureCollection decoding) as the metrics "x-any" and "x-orb".
func BenchmarkImportVsDecode50k(b *testing.B) {
	data := bigNetwork(b)
	var imp, dec, orbT time.Duration
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		t0 := time.Now()
		var v any
		if err := stdjson.Unmarshal(data, &v); err != nil {
			b.Fatal(err)
		}
		t1 := time.Now()
		if _, err := ReadGeoJSON(data, DefaultOptions()); err != nil {
			b.Fatal(err)
		}
		t2 := time.Now()
		if _, err := geojson.UnmarshalFeatureCollection(data); err != nil {
			b.Fatal(err)
		}
		t3 := time.Now()
		dec += t1.Sub(t0)
		imp += t2.Sub(t1)
		orbT += t3.Sub(t2)
	}
	b.ReportMetric(float64(imp)/float64(dec), "x-any")
	b.ReportMetric(float64(imp)/float64(orbT), "x-orb")
}
