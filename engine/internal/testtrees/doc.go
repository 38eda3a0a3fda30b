// Package testtrees holds deterministic tree fixtures for the engine's tests:
// seeded random scenarios (Random), named shapes (Star, Path, Spider,
// Caterpillar, Binary) and the hand-derived examples of MODEL.md (Star113,
// Star1111, Partition). Everything here is invented test data.
//
// Random draws only from the *rand.Rand it is given, so a fixed PCG seed gives
// the same scenario on every run and platform.
package testtrees
