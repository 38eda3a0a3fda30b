// Package importer brings site layouts into Duosweep and takes them out
// again: a GeoJSON (RFC 7946) network of corridor centrelines with optional
// Point features, or CSV tables of corridors and nodes, become an
// engine.Scenario; a scenario and its plan become a GeoJSON FeatureCollection
// a GIS can show.
//
// Every importer is a small pipeline (DESIGN.md §17): parse with a library
// (github.com/paulmach/orb/geojson, encoding/csv), check what only the source
// can tell (feature index or line and column of the bad value), build a
// Scenario, then validate it with engine.NewSite exactly like a loaded file.
// There is no second validator.
//
// The GeoJSON pipeline: line ends within Options.Snap become one junction;
// lines that share a vertex, or whose interior vertex lies within the snap of
// a line end or a Point, are split there; each corridor keeps its shape as
// its Path. Lengths are along the lines: on the WGS 84 ellipsoid for
// longitude/latitude input (EllipsoidLength), in the plane for projected
// input. Loops are broken by keeping a shortest-path tree from the start open
// and marking every other corridor closed; unconnected pieces are refused or,
// with Options.Largest, all but the largest dropped. Every such decision is
// reported in Result.Messages.
//
// Drawing coordinates of an imported site are the source's mapped by an
// engine.GeoRef (saved as the scenario's "georef" field, docs/import.md), so
// Export writes the source's coordinate system again.
//
// Duosweep is a planning and training aid, not a substitute for the site's
// emergency plan, local regulations or licensed practice.
package importer
