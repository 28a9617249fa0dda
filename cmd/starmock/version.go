package main

import (
	"fmt"
	"io"
	"runtime"

	"github.com/spf13/cobra"
	"github.com/starmock/starmock/internal/version"
)

func newVersionCmd(stdout io.Writer) *cobra.Command {
	return &cobra.Command{
		Use:   "version",
		Short: "print the starmock version",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			_, err := fmt.Fprintf(stdout, "starmock %s (%s, %s/%s)\n", version.Version, runtime.Version(), runtime.GOOS, runtime.GOARCH)
			return err
		},
	}
}
