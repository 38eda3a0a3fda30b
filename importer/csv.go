package importer

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// The CSV reader: a corridors table (from,to,length; optional
// effort,covered,closed) and an optional nodes table
// (id,label,x,y,candidate,probability). A header row is required; columns
// may come in any order; other columns are ignored. Errors name the table,
// the line and the column.

// CorridorColumns and NodeColumns list the columns the corridors and nodes
// tables read (other columns are ignored).
var (
	CorridorColumns = []string{"from", "to", "length", "effort", "covered", "closed"}
	NodeColumns     = []string{"id", "label", "x", "y", "candidate", "probability"}
)

// csvCorridor keeps a corridor row's optional values as read, so that the
// effort and covered columns can be applied once the scenario has those
// fields (MODEL.md §8, §9); until then a row that sets them is refused.
type csvCorridor struct {
	effort  *float64
	covered *bool
}

// table is one CSV table being read.
type table struct {
	name string // for messages: "corridors" or "nodes", or a file name
	r    *csv.Reader
	col  map[string]int // column index by name
	head []string
}

func openTable(name string, in io.Reader, want []string, required ...string) (*table, error) {
	r := csv.NewReader(in)
	r.FieldsPerRecord = -1
	r.TrimLeadingSpace = true
	r.ReuseRecord = true
	t := &table{name: name, r: r, col: map[string]int{}}
	head, err := r.Read()
	if err == io.EOF {
		return nil, errAt(name, "empty: a header row is required (%s)", strings.Join(want, ","))
	}
	if err != nil {
		return nil, t.csvErr(err)
	}
	t.head = append([]string(nil), head...)
	for i, h := range t.head {
		h = strings.ToLower(strings.TrimSpace(strings.TrimPrefix(h, "\ufeff")))
		t.head[i] = h
		if _, dup := t.col[h]; dup && h != "" {
			return nil, errAt(fmt.Sprintf("%s line 1, column %d", name, i+1), "%q: the column appears twice", h)
		}
		t.col[h] = i
	}
	for _, req := range required {
		if _, ok := t.col[req]; !ok {
			return nil, errAt(name+" line 1", "header %q has no %q column: a header row with %s is required", strings.Join(head, ","), req, strings.Join(required, ","))
		}
	}
	return t, nil
}

func (t *table) csvErr(err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return errAt(fmt.Sprintf("%s line %d, column %d", t.name, pe.Line, pe.Column), "%v", pe.Err)
	}
	return errAt(t.name, "%v", err)
}

// row is one record with its position.
type row struct {
	t    *table
	rec  []string
	line int
}

func (t *table) next() (*row, error) {
	rec, err := t.r.Read()
	if err == io.EOF {
		return nil, nil
	}
	if err != nil {
		return nil, t.csvErr(err)
	}
	line, _ := t.r.FieldPos(0)
	return &row{t: t, rec: rec, line: line}, nil
}

// where names the row's cell in column name.
func (r *row) where(name string) string {
	i, ok := r.t.col[name]
	if !ok {
		return fmt.Sprintf("%s line %d", r.t.name, r.line)
	}
	return fmt.Sprintf("%s line %d, column %d (%s)", r.t.name, r.line, i+1, name)
}

// get returns the trimmed cell of column name and whether it is non-empty.
func (r *row) get(name string) (string, bool) {
	i, ok := r.t.col[name]
	if !ok || i >= len(r.rec) {
		return "", false
	}
	v := strings.TrimSpace(r.rec[i])
	return v, v != ""
}

func (r *row) num(name string) (float64, bool, error) {
	v, ok := r.get(name)
	if !ok {
		return 0, false, nil
	}
	x, err := strconv.ParseFloat(v, 64)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, false, errAt(r.where(name), "%q: not a finite number", v)
	}
	return x, true, nil
}

func (r *row) flag(name string) (bool, bool, error) {
	v, ok := r.get(name)
	if !ok {
		return false, false, nil
	}
	switch strings.ToLower(v) {
	case "true", "yes", "1":
		return true, true, nil
	case "false", "no", "0":
		return false, true, nil
	}
	return false, false, errAt(r.where(name), "%q: want true or false", v)
}

// ReadCSV imports a corridors table and, if nodes is not nil, a nodes table.
// Nodes named only in the corridors table are added in order of first
// mention (when there is no nodes table). Nodes without coordinates are laid
// out along the open tree (canvas/geom's Tidy). Loops and pieces are handled
// as for GeoJSON; Options.Snap and Options.Planar do not apply. O(m log n).
func ReadCSV(corridors, nodes io.Reader, opt Options) (*Result, error) {
	net := &network{unit: "m", firstWhere: "the corridors table"}
	index := map[string]int{}
	if nodes != nil {
		if err := readNodes(net, index, nodes); err != nil {
			return nil, err
		}
	}
	hasNodes := nodes != nil
	t, err := openTable("corridors", corridors, CorridorColumns, "from", "to", "length")
	if err != nil {
		return nil, err
	}
	net.corrCol = t.col
	for {
		r, err := t.next()
		if err != nil {
			return nil, err
		}
		if r == nil {
			break
		}
		if blank(r.rec) {
			continue
		}
		var e jedge
		var ends [2]int
		for k, name := range []string{"from", "to"} {
			id, ok := r.get(name)
			if !ok {
				return nil, errAt(r.where(name), "empty: a corridor names both its ends")
			}
			v, known := index[id]
			if !known {
				if hasNodes {
					return nil, errAt(r.where(name), "%q: not in the nodes table", id)
				}
				v = len(net.nodes)
				index[id] = v
				net.nodes = append(net.nodes, jnode{id: id, named: true, where: fmt.Sprintf("corridors line %d", r.line)})
			}
			ends[k] = v
		}
		e.from, e.to = ends[0], ends[1]
		x, ok, err := r.num("length")
		if err != nil {
			return nil, err
		}
		if !ok {
			return nil, errAt(r.where("length"), "empty: a corridor needs a length")
		}
		e.length = x
		if e.closed, _, err = r.flag("closed"); err != nil {
			return nil, err
		}
		var extra csvCorridor
		if x, ok, err := r.num("effort"); err != nil {
			return nil, err
		} else if ok {
			extra.effort = &x
		}
		if b, ok, err := r.flag("covered"); err != nil {
			return nil, err
		} else if ok {
			extra.covered = &b
		}
		if err := extra.apply(r, &e); err != nil {
			return nil, err
		}
		e.where = fmt.Sprintf("%s line %d", t.name, r.line)
		net.edges = append(net.edges, e)
	}
	net.layout = true
	return finish(net, opt)
}

// apply puts the optional values into the corridor. The scenario has no
// effort or covered field yet, so a row that sets either to anything but
// the default is refused.
func (c csvCorridor) apply(r *row, e *jedge) error {
	if c.effort != nil && *c.effort != 1 {
		return errAt(r.where("effort"), "%g: not supported yet: this version's scenario has no corridor effort", *c.effort)
	}
	if c.covered != nil && *c.covered {
		return errAt(r.where("covered"), "true: not supported yet: this version's scenario has no radio coverage")
	}
	return nil
}

func blank(rec []string) bool {
	for _, v := range rec {
		if strings.TrimSpace(v) != "" {
			return false
		}
	}
	return true
}

func readNodes(net *network, index map[string]int, in io.Reader) error {
	t, err := openTable("nodes", in, NodeColumns, "id")
	if err != nil {
		return err
	}
	net.nodeCol = t.col
	lines := map[string]int{}
	for {
		r, err := t.next()
		if err != nil {
			return err
		}
		if r == nil {
			return nil
		}
		if blank(r.rec) {
			continue
		}
		id, ok := r.get("id")
		if !ok {
			return errAt(r.where("id"), "empty: a node needs an id")
		}
		if l, dup := lines[id]; dup {
			return errAt(r.where("id"), "%q: duplicate id (also on line %d)", id, l)
		}
		lines[id] = r.line
		n := jnode{id: id, named: true, where: fmt.Sprintf("nodes line %d", r.line)}
		n.label, _ = r.get("label")
		x, hx, err := r.num("x")
		if err != nil {
			return err
		}
		y, hy, err := r.num("y")
		if err != nil {
			return err
		}
		switch {
		case hx && hy:
			n.xy, n.hasXY = [2]float64{x, y}, true
			n.src = n.xy
		case hx:
			return errAt(r.where("y"), "empty while x is set: give both coordinates or neither")
		case hy:
			return errAt(r.where("x"), "empty while y is set: give both coordinates or neither")
		}
		if b, ok, err := r.flag("candidate"); err != nil {
			return err
		} else if ok {
			n.candidate = &b
		}
		if p, ok, err := r.num("probability"); err != nil {
			return err
		} else if ok {
			n.prob = &p
		}
		index[id] = len(net.nodes)
		net.nodes = append(net.nodes, n)
	}
}
