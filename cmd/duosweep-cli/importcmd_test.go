package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"duosweep/projects"
)

const sampleGeoJSON = "../../importer/testdata/sample-workings.geojson"

func TestImportExportRoundTrip(t *testing.T) {
	dir := t.TempDir()
	site := filepath.Join(dir, "site.sweep.json")
	code, out, stderr := runCLI("import", sampleGeoJSON, "--out", site)
	require.Equal(t, 0, code, stderr)
	assert.Contains(t, out, "longitude/latitude")
	assert.Contains(t, out, "closed to break loops")
	assert.Contains(t, out, "wrote "+site)
	sc, err := projects.LoadFile(site)
	require.NoError(t, err)
	require.NotNil(t, sc.GeoRef)

	gj := filepath.Join(dir, "out.geojson")
	code, out, stderr = runCLI("export", site, "--geojson", gj, "--model", "face-to-face")
	require.Equal(t, 0, code, stderr)
	assert.Contains(t, out, "wrote "+gj)
	data, err := os.ReadFile(gj)
	require.NoError(t, err)
	assert.Equal(t, 2, strings.Count(string(data), `"duosweep":"route"`))

	again := filepath.Join(dir, "again.sweep.json")
	code, _, stderr = runCLI("import", gj, "--out", again)
	require.Equal(t, 0, code, stderr)
	a, _ := os.ReadFile(site)
	b, _ := os.ReadFile(again)
	// the names differ (the file's base name), nothing else does
	assert.Equal(t, strings.Replace(string(a), `"name": "sample-workings"`, "", 1), strings.Replace(string(b), `"name": "sample-workings"`, "", 1))
}

func TestImportCSVAndFlags(t *testing.T) {
	dir := t.TempDir()
	cor := filepath.Join(dir, "corridors.csv")
	nod := filepath.Join(dir, "nodes.csv")
	require.NoError(t, os.WriteFile(cor, []byte("from,to,length\nportal,a,10\na,b,5\nb,portal,20\nc,d,4\n"), 0o644))
	require.NoError(t, os.WriteFile(nod, []byte("id,label\nportal,Portal\na,\nb,\nc,\nd,\n"), 0o644))
	out := filepath.Join(dir, "s.sweep.json")
	code, _, stderr := runCLI("import", cor, "--nodes", nod, "--out", out)
	assert.Equal(t, 2, code)
	assert.Contains(t, stderr, "2 unconnected pieces")
	assert.Equal(t, 1, strings.Count(stderr, "\n"), "one line")
	_, err := os.Stat(out)
	assert.True(t, os.IsNotExist(err), "nothing written on bad input")

	code, stdout, stderr := runCLI("import", cor, "--nodes", nod, "--out", out, "--largest", "--start", "portal")
	require.Equal(t, 0, code, stderr)
	assert.Contains(t, stdout, "dropped 2 junctions and 1 corridors")
	assert.Contains(t, stdout, "1 corridor closed to break loops")
	sc, err := projects.LoadFile(out)
	require.NoError(t, err)
	assert.Len(t, sc.Nodes, 3)
	assert.True(t, sc.Corridors[2].Closed, "by hand: portal–a–b is 15 < 20, so b–portal is closed")

	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"import", cor}, "--out: missing"},
		{[]string{"import", cor, "--out", out, "--planar"}, "--planar: applies to GeoJSON only"},
		{[]string{"import", sampleGeoJSON, "--out", out, "--nodes", nod}, "--nodes"},
		{[]string{"import", filepath.Join(dir, "none.geojson"), "--out", out}, "cannot read"},
		{[]string{"import", filepath.Join(dir, "x.txt"), "--out", out}, "unknown kind of file"},
		{[]string{"import", sampleGeoJSON, "--out", out, "--start-near", "1,x"}, "--start-near"},
		{[]string{"import", sampleGeoJSON, "--out", out, "--start", "P1", "--start-near", "1,2"}, "give one of them"},
		{[]string{"import", sampleGeoJSON, "--out", out, "--start", "nowhere"}, "unknown start name"},
		{[]string{"import", sampleGeoJSON, "--out", out, "--snap", "-2"}, "snap"},
		{[]string{"export", out}, "--geojson: missing"},
		{[]string{"export", out, "--geojson", filepath.Join(dir, "o.geojson"), "--model", "pigeon"}, "--model"},
		{[]string{"export", filepath.Join(dir, "none.sweep.json"), "--geojson", filepath.Join(dir, "o.geojson")}, "cannot open"},
	} {
		code, _, stderr := runCLI(c.args...)
		assert.Equal(t, 2, code, "%v: %s", c.args, stderr)
		assert.Contains(t, stderr, c.want, "%v", c.args)
		assert.Equal(t, 1, strings.Count(stderr, "\n"), "%v: one line: %q", c.args, stderr)
	}
	// --start-near picks the nearest junction of the sample (P1, the portal, is at its corner)
	code, stdout, stderr = runCLI("import", sampleGeoJSON, "--out", out, "--start-near", "-31.2501,41.4999")
	require.Equal(t, 0, code, stderr)
	assert.Contains(t, stdout, `start: "P1", the junction nearest`)
}
