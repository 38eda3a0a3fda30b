package projects

import (
	"bytes"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"duosweep/engine"
)

func TestLoadDrawingFields(t *testing.T) {
	sc, err := LoadFile("testdata/crosscut-loop.sweep.json")
	require.NoError(t, err)
	assert.Equal(t, [][2]float64{{20, -2}, {30, -1}}, sc.Corridors[0].Path)
	assert.Nil(t, sc.Corridors[1].Path)
	assert.False(t, sc.Corridors[2].Closed)
	assert.True(t, sc.Corridors[3].Closed)
	assert.Equal(t, &engine.Backdrop{Image: "crosscut-plan.png", X: -5, Y: -5, Scale: 0.1, Opacity: 0.4}, sc.Backdrop)
	assert.Equal(t, &engine.GeoRef{CRS: "planar", Origin: [2]float64{512000, 4100000}, Scale: [2]float64{1, 1}}, sc.GeoRef)

	// defaults: backdrop at the origin with opacity 0.5; an empty path is no path
	in := strings.Replace(base, `"length": 4}]`, `"length": 4, "path": []}], "backdrop": {"image": "p.png", "scale": 2}`, 1)
	sc, err = load(t, in)
	require.NoError(t, err)
	assert.Equal(t, &engine.Backdrop{Image: "p.png", Scale: 2, Opacity: DefaultBackdropOpacity}, sc.Backdrop)
	assert.Nil(t, sc.Corridors[1].Path)

	// an old file has none of them, and saves without them
	sc, err = load(t, base)
	require.NoError(t, err)
	assert.Nil(t, sc.Backdrop)
	assert.Nil(t, sc.GeoRef)
	var buf bytes.Buffer
	require.NoError(t, Save(&buf, sc))
	for _, f := range []string{"closed", "path", "backdrop", "georef"} {
		assert.NotContains(t, buf.String(), `"`+f+`"`)
	}
}

// TestLoadDrawingInvalid: every bad drawing value is refused naming field and value.
func TestLoadDrawingInvalid(t *testing.T) {
	r := func(old, new string) string {
		require.Contains(t, base, old)
		return strings.Replace(base, old, new, 1)
	}
	c1 := func(extra string) string { return r(`"length": 4}`, `"length": 4, `+extra+`}`) }
	top := func(extra string) string { return r(`"length": 4}]`, `"length": 4}], `+extra) }
	cases := []struct {
		name, in string
		want     []string
	}{
		{"closed not a boolean", c1(`"closed": "yes"`), []string{"corridors[1].closed", `"yes"`, "not a boolean"}},
		{"closed a number", c1(`"closed": 1`), []string{"corridors[1].closed: 1", "not a boolean"}},
		{"path not an array", c1(`"path": 3`), []string{"corridors[1].path: 3"}},
		{"path item of three", c1(`"path": [[1, 2, 3]]`), []string{"corridors[1].path[0]", "[1, 2, 3]", "want [x, y]"}},
		{"path item text", c1(`"path": [[1, 2], [1, "x"]]`), []string{"corridors[1].path[1][1]", `"x"`, "not a number"}},
		{"path overflow", c1(`"path": [[1e999, 2]]`), []string{"corridors[1].path[0][0]: 1e999", "not a finite number"}},
		{"backdrop not an object", top(`"backdrop": "plan.png"`), []string{"backdrop", "plan.png"}},
		{"backdrop without image", top(`"backdrop": {"scale": 1}`), []string{"backdrop.image: missing"}},
		{"backdrop empty image", top(`"backdrop": {"image": "", "scale": 1}`), []string{"backdrop.image", `""`}},
		{"backdrop without scale", top(`"backdrop": {"image": "p.png"}`), []string{"backdrop.scale: missing"}},
		{"backdrop scale zero", top(`"backdrop": {"image": "p.png", "scale": 0}`), []string{"backdrop.scale: 0", "> 0"}},
		{"backdrop opacity", top(`"backdrop": {"image": "p.png", "scale": 1, "opacity": 2}`), []string{"backdrop.opacity: 2", "between 0 and 1"}},
		{"backdrop x text", top(`"backdrop": {"image": "p.png", "scale": 1, "x": "left"}`), []string{"backdrop.x", `"left"`}},
		{"georef crs", top(`"georef": {"crs": "mercator", "origin": [0, 0], "scale": [1, 1]}`), []string{"georef.crs: mercator"}},
		{"georef origin short", top(`"georef": {"crs": "planar", "origin": [0], "scale": [1, 1]}`), []string{"georef.origin", "[0]"}},
		{"georef scale missing", top(`"georef": {"crs": "planar", "origin": [0, 0]}`), []string{"georef.scale: missing"}},
		{"georef scale negative", top(`"georef": {"crs": "planar", "origin": [0, 0], "scale": [1, -1]}`), []string{"georef.scale[1]: -1"}},
		{"open loop", r(`"length": 4}]`, `"length": 4}, {"from": "b", "to": "s", "length": 2}]`), []string{"corridors[2]", "b-s", "b → a → s → b"}},
		{"reached only through closed", r(`"length": 4}`, `"length": 4, "closed": true}`), []string{"nodes[2]", "b", "disconnected", "closed"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			sc, err := load(t, c.in)
			require.Error(t, err)
			assert.Equal(t, engine.Scenario{}, sc, "nothing half-loaded")
			for _, w := range c.want {
				assert.Contains(t, err.Error(), w)
			}
		})
	}
	// a closed corridor that closes the loop is fine
	_, err := load(t, r(`"length": 4}]`, `"length": 4}, {"from": "b", "to": "s", "length": 2, "closed": true}]`))
	require.NoError(t, err)
}
