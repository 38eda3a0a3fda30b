package engine_test

import (
	"testing"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
)

func TestModelValues(t *testing.T) {
	require.Equal(t, []engine.Model{engine.Radio, engine.FaceToFace}, engine.Models)
	seen := map[engine.Model]bool{}
	for _, m := range engine.Models {
		got, err := engine.ParseModel(m.String())
		require.NoError(t, err)
		require.Equal(t, m, got)
		require.NotContains(t, m.Others(), m)
		require.Len(t, m.Others(), len(engine.Models)-1)
		require.NotEqual(t, m, m.Other())
		seen[m] = true
	}
	require.Len(t, seen, len(engine.Models))
	require.Equal(t, "radio", engine.Radio.String())
	require.Equal(t, "face-to-face", engine.FaceToFace.String())
	require.Equal(t, "Radio", engine.Radio.Label())
	require.Equal(t, "Face to face", engine.FaceToFace.Label())
	require.Equal(t, engine.FaceToFace, engine.Radio.Other())
	require.Equal(t, engine.Radio, engine.FaceToFace.Other())
	require.False(t, engine.Radio.Rendezvous())
	require.True(t, engine.FaceToFace.Rendezvous())
	require.True(t, engine.Radio.Instant())
	require.False(t, engine.FaceToFace.Instant())
	require.Equal(t, "Model(7)", engine.Model(7).String())
	_, err := engine.ParseModel("semaphore")
	require.EqualError(t, err, `engine: model: "semaphore": want radio or face-to-face`)
}
