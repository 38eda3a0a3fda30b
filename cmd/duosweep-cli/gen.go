package main

import (
	"flag"
	"fmt"
	"strings"

	"duosweep/engine/gen"
	"duosweep/projects"
)

func init() {
	register(command{
		name:    "gen",
		args:    "--family F --nodes N [--seed S] [--out PATH]",
		summary: "write a generated test scenario (families: " + strings.Join(gen.Families, ", ") + ")",
		run:     runGen,
	})
	flagSets["gen"] = func() *flag.FlagSet { fs, _ := genFlags(); return fs }
}

type genOpts struct {
	family string
	nodes  int
	seed   int64
	out    string
}

func genFlags() (*flag.FlagSet, *genOpts) {
	o := &genOpts{}
	fs := newFlags("gen")
	fs.StringVar(&o.family, "family", "random", "tree family: "+strings.Join(gen.Families, ", "))
	fs.IntVar(&o.nodes, "nodes", 100, "number of nodes")
	fs.Int64Var(&o.seed, "seed", 1, "random seed")
	fs.StringVar(&o.out, "out", "", "output file (default: stdout)")
	return fs, o
}

func runGen(e *env, args []string) error {
	fs, o := genFlags()
	if _, err := parseArgs(fs, args, 0, 0, "no arguments besides flags"); err != nil {
		return err
	}
	sc, err := gen.Generate(o.family, o.nodes, o.seed)
	if err != nil {
		return fmt.Errorf("--%s", strings.TrimPrefix(err.Error(), "gen: "))
	}
	if o.out == "" {
		return writeOut(projects.Save(e.stdout, sc))
	}
	return projects.SaveFile(o.out, sc)
}
