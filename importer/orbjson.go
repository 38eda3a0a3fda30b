package importer

import (
	json "github.com/goccy/go-json"
	"github.com/paulmach/orb/geojson"
)

// orb/geojson decodes with encoding/json unless told otherwise; its
// documented hook (geojson.CustomJSONUnmarshaler, "set in an init() or
// main()") lets it use goccy's faster decoder, which duosweep already uses
// for its own files. This package is duosweep's only user of orb.
func init() {
	if geojson.CustomJSONUnmarshaler == nil {
		geojson.CustomJSONUnmarshaler = goccyUnmarshaler{}
	}
}

type goccyUnmarshaler struct{}

func (goccyUnmarshaler) Unmarshal(data []byte, v any) error { return json.Unmarshal(data, v) }
