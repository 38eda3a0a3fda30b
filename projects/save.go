package projects

import (
	"bytes"
	"errors"
	"io"
	"io/fs"
	"math"
	"os"
	"path/filepath"

	json "github.com/goccy/go-json"

	"duosweep/engine"
)

// Output structs: field order here is the order in the file.

type outScenario struct {
	Format    string        `json:"format"`
	Version   int           `json:"version"`
	Name      string        `json:"name"`
	Unit      string        `json:"unit"`
	Start     string        `json:"start"`
	Agents    []outAgent    `json:"agents"`
	Nodes     []outNode     `json:"nodes"`
	Corridors []outCorridor `json:"corridors"`
	Backdrop  *outBackdrop  `json:"backdrop,omitempty"` // drawing.go
	GeoRef    *outGeoRef    `json:"georef,omitempty"`   // drawing.go
}

type outAgent struct {
	Name  string  `json:"name"`
	Speed float64 `json:"speed"`
}

type outNode struct {
	ID          string   `json:"id"`
	Label       string   `json:"label,omitempty"`
	X           *float64 `json:"x,omitempty"`
	Y           *float64 `json:"y,omitempty"`
	Candidate   bool     `json:"candidate"`
	Probability *float64 `json:"probability,omitempty"`
}

type outCorridor struct {
	From   string       `json:"from"`
	To     string       `json:"to"`
	Length float64      `json:"length"`
	Closed bool         `json:"closed,omitempty"`
	Path   [][2]float64 `json:"path,omitempty"`
}

// Save writes sc as an indented scenario file with a stable field order. It
// writes "candidate" for every node, omits x/y for nodes without coordinates
// and probability where it is absent. It refuses a scenario that
// engine.NewSite refuses, so a saved file always loads.
func Save(w io.Writer, sc engine.Scenario) error {
	if _, err := engine.NewSite(sc); err != nil {
		return wrapEngine("save: ", err)
	}
	return encode(w, sc)
}

// SaveDraft writes sc like Save but without validating the tree (for
// autosaves of a site that is mid-edit). Numbers must still be finite.
func SaveDraft(w io.Writer, sc engine.Scenario) error {
	if err := checkFinite(sc); err != nil {
		return err
	}
	return encode(w, sc)
}

func checkFinite(sc engine.Scenario) error {
	bad := func(x float64) bool { return math.IsNaN(x) || math.IsInf(x, 0) }
	for i, a := range sc.Agents {
		if bad(a.Speed) {
			return errf("save: agents[%d].speed: %g: not a finite number", i, a.Speed)
		}
	}
	for i, n := range sc.Nodes {
		if n.HasXY && bad(n.X) {
			return errf("save: nodes[%d].x: %g: not a finite number", i, n.X)
		}
		if n.HasXY && bad(n.Y) {
			return errf("save: nodes[%d].y: %g: not a finite number", i, n.Y)
		}
		if n.HasProbability && bad(n.Probability) {
			return errf("save: nodes[%d].probability: %g: not a finite number", i, n.Probability)
		}
	}
	for i, c := range sc.Corridors {
		if bad(c.Length) {
			return errf("save: corridors[%d].length: %g: not a finite number", i, c.Length)
		}
	}
	return checkDrawingFinite(sc)
}

func encode(w io.Writer, sc engine.Scenario) error {
	out := outScenario{
		Format: ScenarioFormat, Version: ScenarioVersion,
		Name: sc.Name, Unit: sc.Unit, Start: sc.Start,
		Agents:    []outAgent{},
		Nodes:     make([]outNode, len(sc.Nodes)),
		Corridors: make([]outCorridor, len(sc.Corridors)),
	}
	if out.Unit == "" {
		out.Unit = "m"
	}
	agents := sc.Agents
	if len(agents) == 0 {
		agents = engine.DefaultAgents()
	}
	for i, a := range agents {
		name := a.Name
		if name == "" {
			name = string(rune('A' + i))
		}
		out.Agents = append(out.Agents, outAgent{Name: name, Speed: a.Speed})
	}
	for i, n := range sc.Nodes {
		o := outNode{ID: n.ID, Label: n.Label, Candidate: n.Candidate}
		if n.HasXY {
			x, y := n.X, n.Y
			o.X, o.Y = &x, &y
		}
		if n.HasProbability {
			p := n.Probability
			o.Probability = &p
		}
		out.Nodes[i] = o
	}
	for i, c := range sc.Corridors {
		out.Corridors[i] = outCorridor{From: c.From, To: c.To, Length: c.Length, Closed: c.Closed, Path: c.Path}
	}
	out.Backdrop, out.GeoRef = outDrawing(sc)
	return writeJSON(w, "save", out)
}

// writeJSON writes v indented, without HTML escaping, ending in a newline.
// The bytes are built in memory first so a failing writer gets one Write.
func writeJSON(w io.Writer, what string, v any) error {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(v); err != nil {
		return errf("%s: %v", what, err)
	}
	if _, err := w.Write(buf.Bytes()); err != nil {
		return errf("%s: %v", what, err)
	}
	return nil
}

// LoadFile reads and validates the scenario file at path (see Load). Errors
// start with "projects: PATH: ".
func LoadFile(path string) (engine.Scenario, error) {
	sc, _, err := LoadSiteFile(path)
	return sc, err
}

// LoadSiteFile is LoadFile that also returns the validated site.
func LoadSiteFile(path string) (engine.Scenario, *engine.Site, error) {
	f, err := os.Open(path)
	if err != nil {
		return engine.Scenario{}, nil, &Error{Msg: "projects: " + path + ": cannot open: " + pathErrText(err), Err: err}
	}
	defer f.Close()
	sc, s, err := LoadSite(f)
	if err != nil {
		return engine.Scenario{}, nil, withPath(path, err)
	}
	return sc, s, nil
}

// withPath inserts the file path after the package prefix.
func withPath(path string, err error) error {
	if pe, ok := err.(*Error); ok {
		return &Error{Msg: "projects: " + path + ": " + pe.Msg[len("projects: "):], Err: pe.Err}
	}
	return &Error{Msg: "projects: " + path + ": " + err.Error(), Err: err}
}

// SaveFile saves sc (see Save) to path atomically: it writes a temporary
// file in the same directory, syncs and closes it, then renames it over
// path. On any error the temporary file is removed and an existing file at
// path is left as it was.
func SaveFile(path string, sc engine.Scenario) error {
	return writeFileAtomic(path, func(w io.Writer) error { return Save(w, sc) })
}

// SaveDraftFile saves a draft (see SaveDraft) to path atomically.
func SaveDraftFile(path string, sc engine.Scenario) error {
	return writeFileAtomic(path, func(w io.Writer) error { return SaveDraft(w, sc) })
}

// WriteFileAtomic writes path through write atomically, like SaveFile: a
// temporary file in the same directory, synced, closed and renamed over path;
// on any error the temporary file is removed and path is left as it was.
// Errors start with "projects: PATH: ".
func WriteFileAtomic(path string, write func(io.Writer) error) error {
	return writeFileAtomic(path, write)
}

// writeHook lets tests make the write fail after the temporary file exists.
var writeHook func(io.Writer) io.Writer

func writeFileAtomic(path string, write func(io.Writer) error) (err error) {
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	f, err := os.CreateTemp(dir, "."+base+".tmp-*")
	if err != nil {
		return withPath(path, errf("%v", err))
	}
	tmp := f.Name()
	defer func() {
		if err != nil {
			f.Close()
			os.Remove(tmp)
		}
	}()
	var w io.Writer = f
	if writeHook != nil {
		w = writeHook(f)
	}
	if err = write(w); err != nil {
		return withPath(path, err)
	}
	if err = f.Sync(); err != nil {
		return withPath(path, errf("sync: %v", err))
	}
	if err = f.Close(); err != nil {
		return withPath(path, errf("close: %v", err))
	}
	if err = os.Chmod(tmp, 0o644); err != nil {
		return withPath(path, errf("chmod: %v", err))
	}
	if err = os.Rename(tmp, path); err != nil {
		return withPath(path, errf("rename: %v", err))
	}
	return nil
}

// pathErrText returns the reason of a file-system error without the path
// (the caller names the path once).
func pathErrText(err error) string {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	return err.Error()
}
