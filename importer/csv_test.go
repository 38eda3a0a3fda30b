package importer

import (
	"math"
	"strings"
	"testing"
)

const corridorsCSV = `from,to,length,closed,note
portal,j1,40,,main drift
j1,j2,25.5,false,
j1,j3,30,,
j2,j3,12,true,crosscut (barricaded)
j3,j4,18,,
`

const nodesCSV = `id,label,x,y,candidate,probability
portal,Portal,0,0,false,
j1,Tee,40,0,,0.25
j2,,,,,0.25
j3,Far end,70,10,,0.25
j4,,,,yes,0.25
`

func TestCSVImport(t *testing.T) {
	r, err := ReadCSV(strings.NewReader(corridorsCSV), strings.NewReader(nodesCSV), Options{})
	if err != nil {
		t.Fatal(err)
	}
	sc := r.Scenario
	if sc.Start != "portal" || len(sc.Nodes) != 5 || len(sc.Corridors) != 5 || !sc.Corridors[3].Closed || sc.Corridors[1].Closed {
		t.Fatalf("%+v", sc)
	}
	if sc.Nodes[0].Candidate || !sc.Nodes[4].Candidate || sc.Nodes[1].Label != "Tee" || !r.Site.HasProb {
		t.Fatalf("nodes table not applied: %+v", sc.Nodes)
	}
	// j2 and j4 had no coordinates: laid out, the others kept
	if sc.Nodes[1].X != 40 || sc.Nodes[3].Y != 10 || !sc.Nodes[2].HasXY || !sc.Nodes[4].HasXY {
		t.Fatalf("layout: %+v", sc.Nodes)
	}
	// j4 hangs from j3 and is placed relative to it, below it (Tidy draws downwards)
	if !(sc.Nodes[4].Y > sc.Nodes[3].Y) {
		t.Fatalf("j4 at %g,%g not below j3 at %g,%g", sc.Nodes[4].X, sc.Nodes[4].Y, sc.Nodes[3].X, sc.Nodes[3].Y)
	}
	mustContain(t, strings.Join(r.Messages, "\n"), "2 nodes without coordinates")

	// no nodes table: nodes in order of first mention, all laid out; an
	// unclosed loop is closed along the shortest-path tree
	r, err = ReadCSV(strings.NewReader("from,to,length\ns,a,1\na,b,1\nb,s,5\n"), nil, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if ids := []string{r.Scenario.Nodes[0].ID, r.Scenario.Nodes[1].ID, r.Scenario.Nodes[2].ID}; ids[0] != "s" || ids[2] != "b" {
		t.Fatalf("order %v", ids)
	}
	// by hand: s–a–b is 2 < 5, so the s–b corridor is the one closed
	if len(r.Closed) != 1 || r.Closed[0] != 2 {
		t.Fatalf("closed %v", r.Closed)
	}
	for _, n := range r.Scenario.Nodes {
		if !n.HasXY || math.IsNaN(n.X) {
			t.Fatalf("not laid out: %+v", n)
		}
	}
	// effort 1 and covered false are the defaults, so they are accepted
	if _, err := ReadCSV(strings.NewReader("from,to,length,effort,covered\ns,a,1,1,false\n"), nil, Options{}); err != nil {
		t.Fatal(err)
	}
}

// TestCSVRefusals: each bad table is refused naming the line and the column.
func TestCSVRefusals(t *testing.T) {
	cases := []struct {
		name, corridors, nodes string
		want                   []string
	}{
		{"empty", "", "", []string{"corridors", "header row is required"}},
		{"no header", "s,a,1\n", "", []string{"corridors line 1", `no "from" column`}},
		{"missing length column", "from,to\ns,a\n", "", []string{"corridors line 1", `no "length" column`}},
		{"column twice", "from,to,length,to\ns,a,1,b\n", "", []string{"corridors line 1, column 4", `"to"`, "twice"}},
		{"empty from", "from,to,length\n,a,1\n", "", []string{"corridors line 2, column 1 (from)", "empty"}},
		{"length not a number", "from,to,length\ns,a,1\na,b,ten\n", "", []string{"corridors line 3, column 3 (length)", `"ten"`, "not a finite number"}},
		{"length NaN", "from,to,length\ns,a,NaN\n", "", []string{"corridors line 2, column 3 (length)", `"NaN"`}},
		{"length empty", "from,to,length\ns,a,\n", "", []string{"corridors line 2, column 3 (length)", "empty"}},
		{"length zero", "from,to,length\ns,a,1\na,b,0\n", "", []string{"corridors line 3, column 3 (length)", "corridors[1].length: 0", "> 0"}},
		{"self loop", "length,from,to\n2,s,s\n", "", []string{"corridors line 2", "s-s", "itself"}},
		{"closed not a boolean", "from,to,length,closed\ns,a,1,maybe\n", "", []string{"corridors line 2, column 4 (closed)", `"maybe"`}},
		{"bare quote", "from,to,length\ns,\"a,1\n", "", []string{"corridors line 2", "column"}},
		{"effort not supported", "from,to,length,effort\ns,a,1,2\n", "", []string{"corridors line 2, column 4 (effort)", "not supported yet"}},
		{"effort not a number", "from,to,length,effort\ns,a,1,slow\n", "", []string{"corridors line 2, column 4 (effort)", `"slow"`}},
		{"covered not supported", "from,to,length,covered\ns,a,1,true\n", "", []string{"corridors line 2, column 4 (covered)", "not supported yet"}},
		{"two pieces", "from,to,length\ns,a,1\nb,c,1\n", "", []string{"2 unconnected pieces", "corridors line 3"}},
		{"only closed", "from,to,length,closed\ns,a,1,\na,b,1,true\n", "", []string{"2 unconnected pieces", "reached only through closed"}},
		{"no corridors", "from,to,length\n", "", []string{"empty result"}},
		{"unknown node", "from,to,length\ns,zz,1\n", "id\ns\n", []string{"corridors line 2, column 2 (to)", `"zz"`, "not in the nodes table"}},
		{"node table without id", "from,to,length\ns,a,1\n", "name\ns\n", []string{"nodes line 1", `no "id" column`}},
		{"duplicate node id", "from,to,length\ns,a,1\n", "id\ns\na\ns\n", []string{"nodes line 4, column 1 (id)", `"s"`, "also on line 2"}},
		{"x without y", "from,to,length\ns,a,1\n", "id,x,y\ns,1,\na,,\n", []string{"nodes line 2, column 3 (y)", "give both"}},
		{"candidate not a boolean", "from,to,length\ns,a,1\n", "id,candidate\ns,perhaps\na,\n", []string{"nodes line 2, column 2 (candidate)", `"perhaps"`}},
		{"probability sum", "from,to,length\ns,a,1\n", "id,probability\ns,\na,0.5\n", []string{"probability", "sum to 1"}},
		{"probability on non-candidate", "from,to,length\ns,a,1\n", "id,candidate,probability\ns,,\na,false,1\n", []string{"nodes line 3, column 3 (probability)", "not a candidate"}},
		{"unknown start", "from,to,length\ns,a,1\n", "", []string{"start", `"x"`, "unknown start name"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var nodes *strings.Reader
			opt := Options{}
			if c.name == "unknown start" {
				opt.Start = "x"
			}
			var r *Result
			var err error
			if c.nodes != "" {
				nodes = strings.NewReader(c.nodes)
				r, err = ReadCSV(strings.NewReader(c.corridors), nodes, opt)
			} else {
				r, err = ReadCSV(strings.NewReader(c.corridors), nil, opt)
			}
			if err == nil || r != nil {
				t.Fatalf("accepted: %v", r)
			}
			mustContain(t, err.Error(), c.want...)
		})
	}
}
