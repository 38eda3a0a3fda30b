package engine_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
)

// Worked by hand: 372.4 s is 6 min 12.4 s; 3725 s is 1 h 2 min 5 s.
func TestFormatClock(t *testing.T) {
	for _, c := range []struct {
		sec         float64
		clock, both string
	}{
		{0, "00:00", "00:00 (0.0 s)"},
		{59.9999999999, "01:00", "01:00 (60.0 s)"},
		{372.4, "06:12", "06:12 (372.4 s)"},
		{3725, "1:02:05", "1:02:05 (3725.0 s)"},
		{-61, "-01:01", "-01:01 (-61.0 s)"},
		{math.Inf(1), "never", "never"},
		{math.Inf(-1), "-never", "-never"},
		{math.NaN(), "n/a", "n/a"},
	} {
		require.Equal(t, c.clock, engine.FormatClock(c.sec), "%g", c.sec)
		require.Equal(t, c.both, engine.FormatClockSeconds(c.sec), "%g", c.sec)
	}
}
