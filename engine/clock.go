package engine

import (
	"fmt"
	"math"
)

// FormatClock formats sec as "mm:ss", or "h:mm:ss" from one hour on,
// truncating to whole seconds like a stopwatch. +Inf is "never", NaN "n/a".
// It is the one clock format of the itinerary, the reports and the window.
func FormatClock(sec float64) string {
	switch {
	case math.IsNaN(sec):
		return "n/a"
	case math.IsInf(sec, 1):
		return "never"
	case math.IsInf(sec, -1):
		return "-never"
	case sec < 0:
		return "-" + FormatClock(-sec)
	}
	// a tiny epsilon so that 59.9999999999 from float sums shows as 01:00
	total := int64(math.Floor(sec + 1e-9))
	h, m, s := total/3600, total/60%60, total%60
	if h > 0 {
		return fmt.Sprintf("%d:%02d:%02d", h, m, s)
	}
	return fmt.Sprintf("%02d:%02d", m, s)
}

// FormatClockSeconds is a time both as FormatClock and in seconds:
// "06:12 (372.4 s)"; +Inf and NaN as FormatClock.
func FormatClockSeconds(sec float64) string {
	if math.IsInf(sec, 0) || math.IsNaN(sec) {
		return FormatClock(sec)
	}
	return fmt.Sprintf("%s (%.1f s)", FormatClock(sec), sec)
}
