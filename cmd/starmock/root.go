package main

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"
)

const rootLong = `starmock simulates synthetic stellar populations and writes mock
colour–magnitude catalogues whose truth is known.

Stars are drawn from an initial mass function, given ages and metallicities,
evolved with published analytic stellar-evolution relations, turned into
absolute magnitudes in standard photometric systems, placed in space, dimmed by
dust and observed by a survey model with noise and detection limits.

Everything starmock writes is SYNTHETIC: it is a model prediction, not an
observation, and every output file says so in its metadata.

Exit status: 0 on success, 2 for usage errors (bad flags, arguments or input
files), 1 for any other failure.`

// newRootCmd builds the command tree. Commands write data to stdout and
// diagnostics to stderr; they never touch os.Stdout directly.
func newRootCmd(stdout, stderr io.Writer) *cobra.Command {
	root := &cobra.Command{
		Use:           "starmock",
		Short:         "simulate stellar populations and write mock catalogues with known truth",
		Long:          rootLong,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetOut(stdout)
	root.SetErr(stderr)
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return &usageError{fmt.Errorf("%w (see '%s --help')", err, c.CommandPath())}
	})
	root.AddCommand(newVersionCmd(stdout))
	for _, add := range extraCommands {
		root.AddCommand(add(stdout, stderr))
	}
	return root
}

// extraCommands lets each command file register its constructor in an init
// function, so command files can be added without editing this one.
var extraCommands []func(stdout, stderr io.Writer) *cobra.Command

// usageError marks an error caused by the user's input (flags, arguments,
// scenario or table files); it maps to exit status 2.
type usageError struct{ err error }

func (e *usageError) Error() string { return e.err.Error() }
func (e *usageError) Unwrap() error { return e.err }

// usageErrorf formats a usage error.
func usageErrorf(format string, a ...any) error {
	return &usageError{fmt.Errorf(format, a...)}
}

// asUsage wraps err as a usage error (nil stays nil).
func asUsage(err error) error {
	if err == nil {
		return nil
	}
	var ue *usageError
	if errors.As(err, &ue) {
		return err
	}
	return &usageError{err}
}

// isCobraUsageError recognises cobra's own argument and command errors.
func isCobraUsageError(err error) bool {
	msg := err.Error()
	for _, s := range []string{"unknown command", "unknown flag", "unknown shorthand flag",
		"accepts ", "requires at least", "requires at most", "invalid argument", "flag needs an argument"} {
		if strings.Contains(msg, s) {
			return true
		}
	}
	return false
}
