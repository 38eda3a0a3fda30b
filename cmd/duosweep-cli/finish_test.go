package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The demo has a finish at the portal, two slow corridors and a model-less
// scenario; a copy with "model": "face-to-face" is planned face to face
// when --model is absent.
func TestScenarioModelIsTheDefault(t *testing.T) {
	demo := demoFile(t)
	code, out, stderr := runCLI("plan", demo, "--json")
	require.Equal(t, 0, code, stderr)
	var rep map[string]any
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	assert.Equal(t, "radio", rep["model"], "no model in the file: radio")

	b, err := os.ReadFile(demo)
	require.NoError(t, err)
	f2f := filepath.Join(t.TempDir(), "f2f.sweep.json")
	require.NoError(t, os.WriteFile(f2f, []byte(strings.Replace(string(b), `"unit": "m",`, `"unit": "m", "model": "face-to-face",`, 1)), 0o644))
	code, out, stderr = runCLI("plan", f2f, "--json")
	require.Equal(t, 0, code, stderr)
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	assert.Equal(t, "face-to-face", rep["model"])
	code, out, stderr = runCLI("plan", f2f, "--json", "--model", "radio")
	require.Equal(t, 0, code, stderr)
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	assert.Equal(t, "radio", rep["model"], "--model wins over the file")

	bad := filepath.Join(t.TempDir(), "bad.sweep.json")
	require.NoError(t, os.WriteFile(bad, []byte(strings.Replace(string(b), `"unit": "m",`, `"unit": "m", "model": "smoke-signals",`, 1)), 0o644))
	code, _, stderr = runCLI("plan", bad)
	assert.NotEqual(t, 0, code)
	assert.Contains(t, stderr, "model: smoke-signals")
}

func TestPlanItineraryCarryLeg(t *testing.T) {
	code, out, stderr := runCLI("plan", demoFile(t))
	require.Equal(t, 0, code, stderr)
	assert.Contains(t, out, "Finish:         portal (Entrance portal), carry speed 0.6 m/s")
	assert.Contains(t, out, "Carry out (both agents with the casualty, 0.6 m/s)")
	assert.Contains(t, out, "s3b: reached ")
	assert.Contains(t, out, "carry the casualty to portal: ")
	assert.Contains(t, out, "effort ×")
	assert.Regexp(t, `Worst case: +\d\d:\d\d \([0-9.]+ s\) out at portal`, out)

	code, out, stderr = runCLI("bounds", demoFile(t))
	require.Equal(t, 0, code, stderr)
	assert.Contains(t, out, "LB1 with carry:")
	assert.Contains(t, out, "LB2 with carry:")
	assert.Contains(t, out, "for the crew out at the finish")
}
