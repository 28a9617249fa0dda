package main

import (
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"github.com/starmock/starmock/simulate"
	"github.com/starmock/starmock/synth"
)

func init() { extraCommands = append(extraCommands, newScenarioCmd) }

func newScenarioCmd(stdout, stderr io.Writer) *cobra.Command {
	var example bool
	cmd := &cobra.Command{
		Use:   "scenario [SCENARIO]",
		Short: "describe the scenario file format, print the demo scenario, or check a file",
		Long: "Describe the scenario file format (with no argument), print the built-in demo\n" +
			"scenario (--example), or validate a scenario file (with an argument).\n\n" + synth.ScenarioReference,
		Args: cobra.MaximumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			switch {
			case example:
				_, err := stdout.Write(simulate.DemoScenarioText())
				return err
			case len(args) == 1:
				if _, err := synth.Load(args[0]); err != nil {
					return asUsage(err)
				}
				_, err := fmt.Fprintf(stdout, "%s: valid\n", args[0])
				return err
			}
			_, err := fmt.Fprintln(stdout, synth.ScenarioReference)
			return err
		},
	}
	cmd.Flags().BoolVar(&example, "example", false, "print the built-in demo scenario")
	return cmd
}
