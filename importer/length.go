package importer

import "math"

// WGS 84 ellipsoid (NIMA TR8350.2): semi-major axis and flattening.
const (
	wgs84A  = 6378137.0
	wgs84F  = 1 / 298.257223563
	wgs84E2 = wgs84F * (2 - wgs84F) // first eccentricity squared
)

// meridianRadius returns M(φ), the WGS 84 radius of curvature in the meridian
// at latitude phi (radians).
func meridianRadius(phi float64) float64 {
	s := math.Sin(phi)
	w := 1 - wgs84E2*s*s
	return wgs84A * (1 - wgs84E2) / (w * math.Sqrt(w))
}

// primeVerticalRadius returns N(φ), the WGS 84 radius of curvature in the
// prime vertical at latitude phi (radians).
func primeVerticalRadius(phi float64) float64 {
	s := math.Sin(phi)
	return wgs84A / math.Sqrt(1-wgs84E2*s*s)
}

// MetresPerDegree returns the lengths of one degree of longitude and of
// latitude at latitude lat (degrees) on WGS 84, for the local drawing scale:
// N(φ)·cos φ·π/180 and M(φ)·π/180. O(1).
func MetresPerDegree(lat float64) (lon, latm float64) {
	phi := lat * math.Pi / 180
	return primeVerticalRadius(phi) * math.Cos(phi) * math.Pi / 180, meridianRadius(phi) * math.Pi / 180
}

// Gauss–Legendre nodes and weights on [0, 1] (5 points; exact for
// polynomials of degree 9).
var glX, glW = func() ([5]float64, [5]float64) {
	x := [5]float64{-0.9061798459386640, -0.5384693101056831, 0, 0.5384693101056831, 0.9061798459386640}
	w := [5]float64{0.2369268850561891, 0.4786286704993665, 0.5688888888888889, 0.4786286704993665, 0.2369268850561891}
	for i := range x {
		x[i] = (x[i] + 1) / 2
		w[i] /= 2
	}
	return x, w
}()

// EllipsoidLength returns the length in metres, on the WGS 84 ellipsoid, of
// the line from (lon1, lat1) to (lon2, lat2) (degrees) that is straight in
// longitude/latitude, which is what a GeoJSON line between two positions is
// (RFC 7946 §3.1.1): the integral of sqrt((M(φ)·dφ)² + (N(φ)·cos φ·dλ)²)
// along it, by 5-point Gauss–Legendre quadrature on pieces of at most half a
// degree. Over a corridor-sized segment this is the geodesic distance to
// within a few nanometres (measured in length_test.go against Vincenty's
// inverse formula); over a whole degree along a parallel it is the parallel
// arc, as the tables of "length of a degree" give. O(1) for segments below
// half a degree.
func EllipsoidLength(lon1, lat1, lon2, lat2 float64) float64 {
	const rad = math.Pi / 180
	dphi := (lat2 - lat1) * rad
	dlam := (lon2 - lon1) * rad
	span := math.Max(math.Abs(lat2-lat1), math.Abs(lon2-lon1))
	pieces := 1
	if span > 0.5 {
		pieces = int(math.Ceil(span / 0.5))
	}
	total := 0.0
	for p := 0; p < pieces; p++ {
		for i := range glX {
			t := (float64(p) + glX[i]) / float64(pieces)
			phi := lat1*rad + t*dphi
			s := math.Sin(phi)
			w := 1 - wgs84E2*s*s
			m := wgs84A * (1 - wgs84E2) / (w * math.Sqrt(w))
			n := wgs84A / math.Sqrt(w) * math.Cos(phi)
			total += glW[i] * math.Hypot(m*dphi, n*dlam)
		}
	}
	return total / float64(pieces)
}

// PlaneLength returns the Euclidean distance between two plane points. O(1).
func PlaneLength(x1, y1, x2, y2 float64) float64 { return math.Hypot(x2-x1, y2-y1) }
