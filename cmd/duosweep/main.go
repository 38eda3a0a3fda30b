// Command duosweep is the Duosweep desktop app: draw a tree-shaped site, plan a two-person sweep under
// radio or face-to-face contact, compare the two and play the plan back.
//
//	duosweep            opens the bundled demo site, already planned
//	duosweep FILE       opens a scenario file (*.sweep.json)
//
// Duosweep is a planning and training aid, not a substitute for the site's emergency plan, local
// regulations or licensed practice.
package main

import (
	"flag"
	"fmt"
	"os"
	"runtime"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/app"

	// quiet start under LANG=C.UTF-8: it must initialise before fyne's lang package reads the locale
	_ "duosweep/cmd/duosweep/internal/locale"
	"duosweep/icons"
	"duosweep/ui"
)

func main() {
	flag.Usage = func() {
		fmt.Fprintln(os.Stderr, "usage: duosweep [FILE.sweep.json]")
	}
	flag.Parse()
	if flag.NArg() > 1 {
		flag.Usage()
		os.Exit(2)
	}
	if runtime.GOOS == "linux" && os.Getenv("DISPLAY") == "" && os.Getenv("WAYLAND_DISPLAY") == "" {
		// without a display the windowing library panics deep inside; say what is wrong instead
		fmt.Fprintln(os.Stderr, "duosweep: no display (DISPLAY and WAYLAND_DISPLAY are unset): run it in a desktop session, "+
			"or under a virtual display, e.g. `xvfb-run -a duosweep`; the batch tool duosweep-cli needs no display")
		os.Exit(1)
	}
	defer func() {
		// a display that cannot be opened makes the windowing library panic
		if r := recover(); r != nil {
			fmt.Fprintf(os.Stderr, "duosweep: cannot open a window on display %q: %v\n", os.Getenv("DISPLAY"), r)
			os.Exit(1)
		}
	}()
	a := app.NewWithID("app.duosweep.planner")
	a.SetIcon(icons.App)
	w := a.NewWindow("Duosweep")
	w.Resize(fyne.NewSize(1360, 860))
	ui.New(a, w, flag.Arg(0))
	w.SetMaster()
	w.ShowAndRun()
}
