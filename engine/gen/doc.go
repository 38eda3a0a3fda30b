// Package gen generates synthetic tree sites for tests, benchmarks and
// studies: random recursive trees, stars, spiders, caterpillars, binary trees
// and paths. Generation is deterministic for a given family, size and seed,
// and O(n). Generated sites are invented data, for testing only.
package gen
