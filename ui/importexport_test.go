package ui

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"duosweep/importer"
)

const sampleNetwork = "../importer/testdata/sample-workings.geojson"

func TestImportAndExport(t *testing.T) {
	h := newHarness(t, "")
	demo := h.app.editor.Scenario()

	// a bad file changes nothing
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.geojson")
	require.NoError(t, os.WriteFile(bad, []byte(`{"type":"FeatureCollection","features":[{"type":"Feature","geometry":{"type":"LineString","coordinates":[[0,0]]}}]}`), 0o644))
	err := h.app.importPath(bad, "", importer.DefaultOptions())
	require.Error(t, err)
	assert.Contains(t, err.Error(), "features[0]")
	assert.Equal(t, demo.Name, h.app.editor.Scenario().Name)

	// two pieces: refused (the dialog offers the largest), then kept with Largest
	two := filepath.Join(dir, "two.csv")
	require.NoError(t, os.WriteFile(two, []byte("from,to,length\ns,a,10\nb,c,3\n"), 0o644))
	err = h.app.importPath(two, "", importer.DefaultOptions())
	require.True(t, errors.Is(err, importer.ErrSeveralPieces), "%v", err)
	assert.Equal(t, demo.Name, h.app.editor.Scenario().Name)
	require.NoError(t, h.app.importPath(two, "", importer.Options{Largest: true}))
	h.wait()
	assert.Len(t, h.app.editor.Scenario().Nodes, 2)

	// the sample network: untitled, unsaved, planned
	require.NoError(t, h.app.importPath(sampleNetwork, "", importer.DefaultOptions()))
	h.wait()
	sc := h.app.editor.Scenario()
	assert.Equal(t, "sample-workings", sc.Name)
	assert.Equal(t, "", h.app.path)
	assert.True(t, h.app.dirty)
	require.NotNil(t, h.app.planning.site, "%v", h.app.planning.err)
	assert.Equal(t, len(sc.Nodes), h.app.planning.site.N)
	assert.True(t, strings.HasPrefix(h.w().status.Text, "Imported sample-workings.geojson"), h.w().status.Text)

	// export the site and its plan, and read the file back
	out := filepath.Join(dir, "out.geojson")
	require.NoError(t, h.app.exportTo(out))
	data, err := os.ReadFile(out)
	require.NoError(t, err)
	assert.Equal(t, 2, strings.Count(string(data), `"duosweep":"route"`))
	back, err := importer.ReadGeoJSON(data, importer.DefaultOptions())
	require.NoError(t, err)
	assert.Equal(t, len(sc.Corridors), len(back.Scenario.Corridors))
	assert.Equal(t, sc.Start, back.Scenario.Start)
}

func (h *harness) w() *widgets { return &h.app.w }
