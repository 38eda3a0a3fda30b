package projects

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"

	json "github.com/goccy/go-json"

	"duosweep/engine"
)

// ScenarioFormat is the "format" value of a scenario file.
const ScenarioFormat = "duosweep-scenario"

// ScenarioVersion is the scenario format version this package reads and writes.
const ScenarioVersion = 1

// Error is a projects error. Its text starts with "projects: " and names the
// field and value; Unwrap gives the underlying error (an *engine.FieldError
// for a site that engine.NewSite refused).
type Error struct {
	Msg string
	Err error
}

func (e *Error) Error() string { return e.Msg }

// Unwrap returns the wrapped error, if any.
func (e *Error) Unwrap() error { return e.Err }

func errf(format string, args ...any) error {
	return &Error{Msg: "projects: " + fmt.Sprintf(format, args...)}
}

// wrapEngine turns an engine error into a projects error without the double
// package prefix.
func wrapEngine(prefix string, err error) error {
	var fe *engine.FieldError
	if errors.As(err, &fe) {
		msg := fe.Field + ": "
		if fe.Value != "" {
			msg += fe.Value + ": "
		}
		return &Error{Msg: "projects: " + prefix + msg + fe.Msg, Err: err}
	}
	return &Error{Msg: "projects: " + prefix + trimEngine(err.Error()), Err: err}
}

func trimEngine(s string) string {
	const p = "engine: "
	if len(s) >= len(p) && s[:len(p)] == p {
		return s[len(p):]
	}
	return s
}

// Wire structs: pointers and raw numbers tell an absent field from a zero one,
// and let every number be checked with its field name.

type wireScenario struct {
	Format    *string         `json:"format"`
	Version   json.RawMessage `json:"version"`
	Name      *string         `json:"name"`
	Unit      *string         `json:"unit"`
	Start     *string         `json:"start"`
	Agents    []wireAgent     `json:"agents"`
	Nodes     []wireNode      `json:"nodes"`
	Corridors []wireCorridor  `json:"corridors"`
	Backdrop  json.RawMessage `json:"backdrop"` // drawing.go
	GeoRef    json.RawMessage `json:"georef"`   // drawing.go
}

type wireAgent struct {
	Name  *string         `json:"name"`
	Speed json.RawMessage `json:"speed"`
}

type wireNode struct {
	ID          *string         `json:"id"`
	Label       *string         `json:"label"`
	X           json.RawMessage `json:"x"`
	Y           json.RawMessage `json:"y"`
	Candidate   *bool           `json:"candidate"`
	Probability json.RawMessage `json:"probability"`
}

type wireCorridor struct {
	From   *string         `json:"from"`
	To     *string         `json:"to"`
	Length json.RawMessage `json:"length"`
	Closed json.RawMessage `json:"closed"` // drawing.go
	Path   json.RawMessage `json:"path"`   // drawing.go
}

// absent reports whether a raw value is missing or null.
func absent(raw json.RawMessage) bool {
	b := bytes.TrimSpace(raw)
	return len(b) == 0 || string(b) == "null"
}

// number parses a raw JSON value as a finite float64. The field name is used
// in the error.
func number(field string, raw json.RawMessage) (float64, error) {
	b := bytes.TrimSpace(raw)
	if len(b) == 0 || string(b) == "null" {
		return 0, errf("%s: missing", field)
	}
	if !isJSONNumber(b) {
		return 0, errf("%s: %s: not a number", field, b)
	}
	x, err := strconv.ParseFloat(string(b), 64)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, errf("%s: %s: not a finite number", field, b)
	}
	return x, nil
}

// isJSONNumber reports whether b is a number literal in the JSON grammar
// (RFC 8259 §6), which rules out NaN, Infinity, hex and leading zeros.
func isJSONNumber(b []byte) bool {
	i, n := 0, len(b)
	if i < n && b[i] == '-' {
		i++
	}
	if i >= n {
		return false
	}
	if b[i] == '0' {
		i++
	} else if b[i] >= '1' && b[i] <= '9' {
		for i < n && b[i] >= '0' && b[i] <= '9' {
			i++
		}
	} else {
		return false
	}
	if i < n && b[i] == '.' {
		i++
		j := i
		for i < n && b[i] >= '0' && b[i] <= '9' {
			i++
		}
		if i == j {
			return false
		}
	}
	if i < n && (b[i] == 'e' || b[i] == 'E') {
		i++
		if i < n && (b[i] == '+' || b[i] == '-') {
			i++
		}
		j := i
		for i < n && b[i] >= '0' && b[i] <= '9' {
			i++
		}
		if i == j {
			return false
		}
	}
	return i == n
}

func requiredString(field string, p *string) (string, error) {
	if p == nil {
		return "", errf("%s: missing", field)
	}
	return *p, nil
}

// Load reads a scenario file, applies the defaults of FORMATS.md and
// validates the site with engine.NewSite. On any problem it returns the zero
// Scenario and an error naming the field and value. O(n) plus validation.
func Load(r io.Reader) (engine.Scenario, error) {
	sc, _, err := LoadSite(r)
	return sc, err
}

// LoadSite is Load that also returns the validated site, so a caller that
// plans need not validate the scenario a second time.
func LoadSite(r io.Reader) (engine.Scenario, *engine.Site, error) {
	sc, err := decode(r)
	if err != nil {
		return engine.Scenario{}, nil, err
	}
	s, err := engine.NewSite(sc)
	if err != nil {
		return engine.Scenario{}, nil, wrapEngine("", err)
	}
	return sc, s, nil
}

// LoadDraft reads a scenario like Load but does not validate the tree (for
// crash-recovery autosaves of a site that is mid-edit). It still refuses
// malformed JSON, a wrong format or version, missing required fields and
// numbers that are not finite.
func LoadDraft(r io.Reader) (engine.Scenario, error) {
	return decode(r)
}

func decode(r io.Reader) (engine.Scenario, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return engine.Scenario{}, errf("read: %v", err)
	}
	var w wireScenario
	if err := json.Unmarshal(data, &w); err != nil {
		return engine.Scenario{}, errf("not a scenario file: %v", err)
	}
	sc, err := w.scenario()
	if err != nil {
		return engine.Scenario{}, err
	}
	return sc, nil
}

func (w *wireScenario) scenario() (engine.Scenario, error) {
	var sc engine.Scenario
	if w.Format == nil {
		return sc, errf("format: missing (want %q)", ScenarioFormat)
	}
	if *w.Format != ScenarioFormat {
		return sc, errf("format: %q: want %q", *w.Format, ScenarioFormat)
	}
	v, err := number("version", w.Version)
	if err != nil {
		return sc, err
	}
	if v != ScenarioVersion {
		return sc, errf("version: %s: this program reads version %d", bytes.TrimSpace(w.Version), ScenarioVersion)
	}
	if w.Name != nil {
		sc.Name = *w.Name
	}
	sc.Unit = "m"
	if w.Unit != nil && *w.Unit != "" {
		sc.Unit = *w.Unit
	}
	if sc.Start, err = requiredString("start", w.Start); err != nil {
		return engine.Scenario{}, err
	}
	if w.Agents == nil {
		sc.Agents = engine.DefaultAgents()
	} else {
		if len(w.Agents) != 2 {
			return engine.Scenario{}, errf("agents: %d agents: a crew has exactly 2 agents", len(w.Agents))
		}
		sc.Agents = make([]engine.Agent, len(w.Agents))
		for i, a := range w.Agents {
			name := string(rune('A' + i))
			if a.Name != nil && *a.Name != "" {
				name = *a.Name
			}
			sp, err := number(fmt.Sprintf("agents[%d].speed", i), a.Speed)
			if err != nil {
				return engine.Scenario{}, err
			}
			sc.Agents[i] = engine.Agent{Name: name, Speed: sp}
		}
	}
	if w.Nodes == nil {
		return engine.Scenario{}, errf("nodes: missing")
	}
	sc.Nodes = make([]engine.Node, len(w.Nodes))
	for i, n := range w.Nodes {
		f := func(name string) string { return fmt.Sprintf("nodes[%d].%s", i, name) }
		var nd engine.Node
		if nd.ID, err = requiredString(f("id"), n.ID); err != nil {
			return engine.Scenario{}, err
		}
		if n.Label != nil {
			nd.Label = *n.Label
		}
		switch ax, ay := absent(n.X), absent(n.Y); {
		case ax && ay:
		case ax:
			return engine.Scenario{}, errf("%s: missing (y is set)", f("x"))
		case ay:
			return engine.Scenario{}, errf("%s: missing (x is set)", f("y"))
		default:
			if nd.X, err = number(f("x"), n.X); err != nil {
				return engine.Scenario{}, err
			}
			if nd.Y, err = number(f("y"), n.Y); err != nil {
				return engine.Scenario{}, err
			}
			nd.HasXY = true
		}
		if n.Candidate != nil {
			nd.Candidate = *n.Candidate
		} else {
			nd.Candidate = nd.ID != sc.Start
		}
		if !absent(n.Probability) {
			if nd.Probability, err = number(f("probability"), n.Probability); err != nil {
				return engine.Scenario{}, err
			}
			nd.HasProbability = true
		}
		sc.Nodes[i] = nd
	}
	if w.Corridors == nil && len(sc.Nodes) > 1 {
		return engine.Scenario{}, errf("corridors: missing")
	}
	sc.Corridors = make([]engine.Corridor, len(w.Corridors))
	for i, c := range w.Corridors {
		f := func(name string) string { return fmt.Sprintf("corridors[%d].%s", i, name) }
		var cr engine.Corridor
		if cr.From, err = requiredString(f("from"), c.From); err != nil {
			return engine.Scenario{}, err
		}
		if cr.To, err = requiredString(f("to"), c.To); err != nil {
			return engine.Scenario{}, err
		}
		if cr.Length, err = number(f("length"), c.Length); err != nil {
			return engine.Scenario{}, err
		}
		if err := c.drawing(f, &cr); err != nil {
			return engine.Scenario{}, err
		}
		sc.Corridors[i] = cr
	}
	if err := w.drawing(&sc); err != nil {
		return engine.Scenario{}, err
	}
	return sc, nil
}
