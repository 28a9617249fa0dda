// Command starmock simulates synthetic stellar populations and writes mock
// colour–magnitude catalogues with known truth.
package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"
)

func main() {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	code := run(ctx, os.Args[1:], os.Stdout, os.Stderr)
	stop()
	os.Exit(code)
}

// run executes the command line args and returns the process exit status:
// 0 on success, 2 for usage errors (bad flags, arguments or input files), 1 otherwise.
func run(ctx context.Context, args []string, stdout, stderr io.Writer) int {
	root := newRootCmd(stdout, stderr)
	root.SetArgs(args)
	if err := root.ExecuteContext(ctx); err != nil {
		fmt.Fprintf(stderr, "starmock: %v\n", err)
		var ue *usageError
		if errors.As(err, &ue) || isCobraUsageError(err) {
			return 2
		}
		return 1
	}
	return 0
}
