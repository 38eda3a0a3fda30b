// Command duosweep-cli plans and evaluates two-person sweeps of tree-shaped
// sites from the command line. Run "duosweep-cli help" for the subcommands.
//
// Duosweep is a planning and training aid, not a substitute for the site's
// emergency plan, local regulations or licensed practice.
package main

import (
	"context"
	"os"
	"os/signal"
)

func main() {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	code := runContext(ctx, os.Args[1:], os.Stdout, os.Stderr)
	stop()
	os.Exit(code)
}
