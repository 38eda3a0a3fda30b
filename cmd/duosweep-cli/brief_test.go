package main

import (
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestBriefPDFMatchesPlan: the text pdftotext extracts from
// "duosweep-cli brief --out" holds the worst case, the lower bound and every
// itinerary step's clock time exactly as "duosweep-cli plan" prints them.
func TestBriefPDFMatchesPlan(t *testing.T) {
	pdftotext, err := exec.LookPath("pdftotext")
	if err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatal("pdftotext (poppler-utils) is not installed; scripts/deps.sh installs it")
		}
		t.Skip("pdftotext (poppler-utils) is not installed: run scripts/deps.sh; skipping the PDF text check")
	}
	demo := demoFile(t)
	for _, model := range []string{"radio", "face-to-face"} {
		code, plan, stderr := runCLI("plan", demo, "--model", model)
		require.Equal(t, 0, code, stderr)
		out := filepath.Join(t.TempDir(), "brief.pdf")
		code, stdout, stderr := runCLI("brief", demo, "--model", model, "--out", out, "--paper", "letter")
		require.Equal(t, 0, code, stderr)
		assert.Contains(t, stdout, "wrote "+out)
		text, err := exec.Command(pdftotext, "-layout", out, "-").Output()
		require.NoError(t, err)
		for _, key := range []string{"Worst case", "Lower bound"} {
			m := regexp.MustCompile(`(?m)^` + key + `:\s+(\S+ \(\S+ s\))`).FindStringSubmatch(plan)
			require.NotNil(t, m, key)
			assert.Contains(t, string(text), m[1], key)
		}
		var want, got []string
		for _, m := range regexp.MustCompile(`(?m)^\s*(\d+)\. (\S+)  `).FindAllStringSubmatch(plan, -1) {
			want = append(want, m[1]+" "+m[2])
		}
		for _, m := range regexp.MustCompile(`(?m)^\s*(\d+)\s+(\d+:\d\d(?::\d\d)?)\s`).FindAllStringSubmatch(string(text), -1) {
			got = append(got, m[1]+" "+m[2])
		}
		require.Greater(t, len(want), 10)
		assert.Equal(t, want, got, "step numbers and clock times of the itinerary tables")
	}
}

// TestBriefAllOutputs writes every kind of output at once, with the size in
// both spellings, and leaves no temporary files behind.
func TestBriefAllOutputs(t *testing.T) {
	demo := demoFile(t)
	dir := t.TempDir()
	for _, size := range []string{"700×500", "700x500"} {
		p := func(n string) string { return filepath.Join(dir, n) }
		code, stdout, stderr := runCLI("brief", demo, "--out", p("b.pdf"), "--svg", p("b.svg"), "--png", p("b.png"), "--size", size,
			"--gif", p("b.gif"), "--fps", "2", "--seconds", "3", "--side-by-side", "face-to-face", "--csv", p("b.csv"))
		require.Equal(t, 0, code, stderr)
		assert.Equal(t, 5, strings.Count(stdout, "wrote "), stdout)
		f, err := os.Open(p("b.png"))
		require.NoError(t, err)
		cfg, err := png.DecodeConfig(f)
		f.Close()
		require.NoError(t, err)
		assert.Equal(t, [2]int{700, 500}, [2]int{cfg.Width, cfg.Height})
		assert.Contains(t, stdout, "6 frames at 2 fps")
		entries, err := os.ReadDir(dir)
		require.NoError(t, err)
		for _, e := range entries {
			assert.False(t, strings.HasPrefix(e.Name(), "."), "temporary file left: %s", e.Name())
		}
	}
}

// TestBriefBadInput: one clear line and exit status 2, nothing written, an
// existing file left as it was.
func TestBriefBadInput(t *testing.T) {
	demo := demoFile(t)
	dir := t.TempDir()
	keep := filepath.Join(dir, "keep.pdf")
	require.NoError(t, os.WriteFile(keep, []byte("old"), 0o644))
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"brief", demo}, "nothing to write"},
		{[]string{"brief", demo, "--out", keep, "--colour", "red"}, "flag provided but not defined: -colour"},
		{[]string{"brief", demo, "--out", filepath.Join(dir, "no", "such", "b.pdf")}, "does not exist"},
		{[]string{"brief", demo, "--out", dir}, "is a directory"},
		{[]string{"brief", demo, "--out", keep, "--paper", "tabloid"}, `--paper: "tabloid"`},
		{[]string{"brief", demo, "--out", keep, "--model", "semaphore"}, `--model: "semaphore"`},
		{[]string{"brief", demo, "--out", keep, "--planner", "teleport"}, `--planner: "teleport"`},
		{[]string{"brief", demo, "--png", keep, "--size", "big"}, `--size: "big"`},
		{[]string{"brief", demo, "--png", keep, "--size", "10x10"}, `--size: "10x10"`},
		{[]string{"brief", demo, "--out", keep, "--size", "800x600"}, "--size: only used with"},
		{[]string{"brief", demo, "--out", keep, "--fps", "5"}, "--fps: only used with --gif"},
		{[]string{"brief", demo, "--gif", keep, "--fps", "0"}, "--fps: 0"},
		{[]string{"brief", demo, "--gif", keep, "--seconds", "-2"}, "--seconds: -2"},
		{[]string{"brief", demo, "--gif", keep, "--exit", "nowhere"}, `--exit: "nowhere": no node`},
		{[]string{"brief", demo, "--gif", keep, "--exit", "portal"}, `--exit: "portal": not a candidate`},
		{[]string{"brief", demo, "--gif", keep, "--side-by-side", "radio"}, "first panel's model already"},
		{[]string{"brief", demo, "--gif", keep, "--side-by-side", "smoke"}, `--side-by-side: "smoke"`},
		{[]string{"brief", demo, "--out", keep, "--csv", keep}, "the same file as --out"},
		{[]string{"brief", filepath.Join(dir, "missing.sweep.json"), "--out", keep}, "cannot open"},
	}
	for _, c := range cases {
		t.Run(strings.Join(c.args[2:], " "), func(t *testing.T) {
			code, out, errOut := runCLI(c.args...)
			assert.Equal(t, 2, code, errOut)
			assert.Empty(t, out)
			assert.Equal(t, 1, strings.Count(errOut, "\n"), "one line: %q", errOut)
			assert.True(t, strings.HasPrefix(errOut, "duosweep-cli brief: "), errOut)
			assert.Contains(t, errOut, c.want)
			b, err := os.ReadFile(keep)
			require.NoError(t, err)
			assert.Equal(t, "old", string(b))
		})
	}
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	assert.Len(t, entries, 1, "only keep.pdf")
}
