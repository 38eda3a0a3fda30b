package importer

import (
	stdjson "encoding/json"
	"math/rand/v2"
	"sync"
	"testing"

	"github.com/paulmach/orb/geojson"
)

// The speed goal (issue 10): importing a generated 50,000-line network takes
// at most 3 times as long as decoding the same file's JSON alone. Compare
// BenchmarkImport50k with BenchmarkDecode50kOrb (the GeoJSON library's own
// decoding of the file) and BenchmarkDecode50kAny (encoding/json into any):
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
