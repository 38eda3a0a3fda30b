package main

import (
	"testing"

	"github.com/stretchr/testify/require"
)

// TestStudySmoke runs the study subcommand on one tiny configuration of each
// kind: the gap table and the exhaustive timing table.
func TestStudySmoke(t *testing.T) {
	code, out, stderr := runCLI("study", "--seconds", "0.1", "--sizes", "8", "--seeds", "1", "--families", "random")
	require.Equal(t, 0, code, stderr)
	require.Contains(t, out, "| random | 8 | radio |")
	require.Contains(t, out, "| random | 8 | face-to-face |")

	code, out, stderr = runCLI("study", "--exhaustive", "--seconds", "2", "--sizes", "6", "--seeds", "1", "--families", "path")
	require.Equal(t, 0, code, stderr)
	require.Contains(t, out, "path")

	code, _, stderr = runCLI("study", "--sizes", "x")
	require.Equal(t, 2, code)
	require.Contains(t, stderr, "sizes")
}
