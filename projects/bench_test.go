package projects

import (
	"bytes"
	"testing"

	"duosweep/engine/gen"
)

// BenchmarkLoad100k measures Load (parse and validate) of a generated
// 100 000-node scenario.
func BenchmarkLoad100k(b *testing.B) {
	sc, err := gen.Generate("random", 100_000, 1)
	if err != nil {
		b.Fatal(err)
	}
	var buf bytes.Buffer
	if err := Save(&buf, sc); err != nil {
		b.Fatal(err)
	}
	data := buf.Bytes()
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if _, err := Load(bytes.NewReader(data)); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSave100k measures Save (validate and write) of the same scenario.
func BenchmarkSave100k(b *testing.B) {
	sc, err := gen.Generate("random", 100_000, 1)
	if err != nil {
		b.Fatal(err)
	}
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := Save(&buf, sc); err != nil {
			b.Fatal(err)
		}
	}
}
