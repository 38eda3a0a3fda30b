package projects

import "io"

// WriteFileAtomic writes a file of any kind the way SaveFile writes a
// scenario: into a temporary file in the same directory, synced and closed,
// then renamed over path. If write fails, nothing at path changes. Errors
// start with "projects: PATH: ".
func WriteFileAtomic(path string, write func(io.Writer) error) error {
	return writeFileAtomic(path, write)
}
