package importer

import (
	"math"
	"testing"

	"github.com/paulmach/orb"
	"github.com/paulmach/orb/geo"
)

// vincentyInverse is Vincenty's inverse formula (T. Vincenty, "Direct and
// inverse solutions of geodesics on the ellipsoid with application of nested
// equations", Survey Review 23(176), 1975), written for these tests only, as
// the reference geodesic distance in metres between two points (degrees) on
// the ellipsoid (a, f).
func vincentyInverse(a, f, lon1, lat1, lon2, lat2 float64) float64 {
	const rad = math.Pi / 180
	b := a * (1 - f)
	L := (lon2 - lon1) * rad
	U1 := math.Atan((1 - f) * math.Tan(lat1*rad))
	U2 := math.Atan((1 - f) * math.Tan(lat2*rad))
	sU1, cU1 := math.Sincos(U1)
	sU2, cU2 := math.Sincos(U2)
	lambda := L
	var sSig, cSig, sig, cos2A, cos2SigM float64
	for iter := 0; iter < 200; iter++ {
		sL, cL := math.Sincos(lambda)
		sSig = math.Hypot(cU2*sL, cU1*sU2-sU1*cU2*cL)
		if sSig == 0 {
			return 0
		}
		cSig = sU1*sU2 + cU1*cU2*cL
		sig = math.Atan2(sSig, cSig)
		sA := cU1 * cU2 * sL / sSig
		cos2A = 1 - sA*sA
		cos2SigM = 0
		if cos2A != 0 {
			cos2SigM = cSig - 2*sU1*sU2/cos2A
		}
		C := f / 16 * cos2A * (4 + f*(4-3*cos2A))
		prev := lambda
		lambda = L + (1-C)*f*sA*(sig+C*sSig*(cos2SigM+C*cSig*(-1+2*cos2SigM*cos2SigM)))
		if math.Abs(lambda-prev) < 1e-14 {
			break
		}
	}
	u2 := cos2A * (a*a - b*b) / (b * b)
	A := 1 + u2/16384*(4096+u2*(-768+u2*(320-175*u2)))
	B := u2 / 1024 * (256 + u2*(-128+u2*(74-47*u2)))
	dSig := B * sSig * (cos2SigM + B/4*(cSig*(-1+2*cos2SigM*cos2SigM)-B/6*cos2SigM*(-3+4*sSig*sSig)*(-3+4*cos2SigM*cos2SigM)))
	return b * A * (sig - dSig)
}

func dms(d, m, s float64) float64 { return math.Copysign(math.Abs(d)+m/60+s/3600, d) }

// TestVincentyReference checks the test-only reference against the test
// lines of Vincenty's 1975 paper (quoted from memory of its table: line (a)
// on the Bessel ellipsoid, line (b) on the International ellipsoid).
func TestVincentyReference(t *testing.T) {
	cases := []struct {
		name       string
		a, invF    float64
		lat1, lat2 float64
		dlon       float64
		s          float64
	}{
		{"(a) Bessel", 6377397.155, 299.1528128, dms(55, 45, 0), dms(-33, 26, 0), dms(108, 13, 0), 14110526.170},
		{"(b) International", 6378388, 297, dms(37, 19, 54.95367), dms(26, 7, 42.83946), dms(41, 28, 35.50729), 4085966.703},
	}
	for _, c := range cases {
		got := vincentyInverse(c.a, 1/c.invF, 0, c.lat1, c.dlon, c.lat2)
		if math.Abs(got-c.s) > 0.002 {
			t.Errorf("Vincenty line %s: %.4f m, the paper gives %.3f m", c.name, got, c.s)
		}
	}
}

// TestDegreeLengths: one degree of latitude and of longitude at the equator
// and at 60°N on WGS 84, as tabulated in geodesy references (the "length of a
// degree" table reproduced e.g. in Wikipedia's "Latitude" and "Longitude"
// articles; values quoted from memory, to the metre): latitude 110 574 m and
// 111 412 m, longitude 111 320 m and 55 800 m. A GeoJSON line along a
// parallel follows the parallel (RFC 7946 §3.1.1), so its length is the
// parallel arc the table gives.
func TestDegreeLengths(t *testing.T) {
	cases := []struct {
		name                   string
		lon1, lat1, lon2, lat2 float64
		table                  float64
	}{
		{"latitude at the equator", 0, -0.5, 0, 0.5, 110574},
		{"latitude at 60°N", 10, 59.5, 10, 60.5, 111412},
		{"longitude at the equator", -0.5, 0, 0.5, 0, 111320},
		{"longitude at 60°N", 20, 60, 21, 60, 55800},
	}
	for _, c := range cases {
		got := EllipsoidLength(c.lon1, c.lat1, c.lon2, c.lat2)
		if math.Abs(got-c.table) > 1 {
			t.Errorf("%s: %.3f m, table %g m", c.name, got, c.table)
		}
		t.Logf("%s: %.3f m (table %g m)", c.name, got, c.table)
	}
	// the meridian degree equals the geodesic between its ends (a meridian is a geodesic)
	g := vincentyInverse(wgs84A, wgs84F, 0, -0.5, 0, 0.5)
	if d := math.Abs(EllipsoidLength(0, -0.5, 0, 0.5) - g); d > 1e-6 {
		t.Errorf("meridian degree differs from Vincenty by %g m", d)
	}
	// and the equator is a geodesic too: a·π/180 per degree
	if d := math.Abs(EllipsoidLength(-0.5, 0, 0.5, 0) - wgs84A*math.Pi/180); d > 1e-6 {
		t.Errorf("equator degree differs from a·π/180 by %g m", d)
	}
}

// TestOneKilometreCorridor measures how far EllipsoidLength of a straight
// 1 km segment is from the WGS 84 geodesic between its ends (Vincenty), over
// latitudes 0..85° and 24 bearings, and how far orb's spherical formulas are.
func TestOneKilometreCorridor(t *testing.T) {
	var worst, worst60, worstHav, worstEq float64
	for lat := 0.0; lat <= 85; lat += 5 {
		mLon, mLat := MetresPerDegree(lat)
		for b := 0.0; b < 360; b += 15 {
			s, c := math.Sincos(b * math.Pi / 180)
			lon2, lat2 := 30+1000*s/mLon, lat+1000*c/mLat
			ref := vincentyInverse(wgs84A, wgs84F, 30, lat, lon2, lat2)
			d := math.Abs(EllipsoidLength(30, lat, lon2, lat2) - ref)
			worst = math.Max(worst, d)
			if lat <= 60 {
				worst60 = math.Max(worst60, d)
			}
			p, q := orb.Point{30, lat}, orb.Point{lon2, lat2}
			worstHav = math.Max(worstHav, math.Abs(geo.DistanceHaversine(p, q)-ref))
			worstEq = math.Max(worstEq, math.Abs(geo.Distance(p, q)-ref))
		}
	}
	t.Logf("1 km segment, |length - WGS 84 geodesic|: EllipsoidLength %.3g m (%.3g m up to 60°); orb geo.DistanceHaversine %.3g m; orb geo.Distance %.3g m", worst, worst60, worstHav, worstEq)
	// The straight longitude/latitude line is not quite the geodesic: an
	// east-west line bows towards the equator, longer by about
	// L³·tan²φ/(24·R²) (0.14 mm for 1 km at 85°, 3 µm at 60°; derived by hand
	// from the curvature of a parallel), which is what remains here.
	if worst > 2e-4 || worst60 > 1e-5 {
		t.Errorf("EllipsoidLength is %g m (%g m up to 60°) from the geodesic on a 1 km corridor", worst, worst60)
	}
	// orb's sphere (radius 6378137 m) is 0.3% to 0.7% off: the reason this
	// package integrates on the ellipsoid instead
	if worstHav < 2 || worstHav > 8 {
		t.Errorf("orb's haversine is %g m off on 1 km; expected a few metres", worstHav)
	}
}

// TestLengthAgainstLibrary: where orb is not the implementation, it is still
// a check: on 1 km to 100 km lines the ellipsoid length and orb's haversine
// differ by no more than the sphere's known error (under 0.7%).
func TestLengthAgainstLibrary(t *testing.T) {
	for _, c := range [][4]float64{{0, 0, 0.01, 0.005}, {-30, 40, -29.9, 40.05}, {100, -70, 101, -70.2}, {5, 10, 5, 10.9}} {
		mine := EllipsoidLength(c[0], c[1], c[2], c[3])
		lib := geo.DistanceHaversine(orb.Point{c[0], c[1]}, orb.Point{c[2], c[3]})
		if r := math.Abs(mine/lib - 1); r > 0.007 {
			t.Errorf("%v: %g m vs orb %g m (%.3g%%)", c, mine, lib, 100*r)
		}
	}
}

// TestPlaneLength is worked by hand: a 3-4-5 triangle leg then 6 straight up.
func TestPlaneLength(t *testing.T) {
	if got := PlaneLength(0, 0, 3, 4) + PlaneLength(3, 4, 3, 10); got != 11 {
		t.Fatalf("planar polyline: %g, want 11 (5 + 6, by hand)", got)
	}
}
