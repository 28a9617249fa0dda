package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"sort"

	"github.com/spf13/cobra"

	"github.com/starmock/starmock/simulate"
	"github.com/starmock/starmock/synth"
)

func init() { extraCommands = append(extraCommands, newForecastCmd) }

const forecastLong = `Forecast what a survey will detect: run a scenario and report, per band,
how many stars pass the survey's detection, in total, per population
component, per evolutionary stage and per 0.25 mag bin, with Poisson
uncertainties, and the cumulative counts N(<m).

"Realised" numbers count the stars detected in this simulated realisation
(error sqrt(N)); "expected" numbers add each simulated star's detection
probability (error sqrt(sum p^2)), which removes the noise and completeness
lottery but not the Poisson sampling of the population itself.

Written into --out: forecast.json (everything below), counts.csv and
counts.json (per band, component, stage and magnitude bin), cumulative.csv,
shells.csv (expected and drawn systems per distance shell of each Galactic
component), hess.csv, and the pictures cmd.png (colour-magnitude diagram),
hess.png (Hess diagrams of detected stars, one panel per component) and
counts.png (N(<m) per band). The numbers are model predictions, not
observations.

Examples:
  starmock forecast field.yaml
  starmock forecast field.yaml --out forecasts/deep --json
  starmock forecast cluster.yaml --catalogue`

func newForecastCmd(stdout, stderr io.Writer) *cobra.Command {
	var o simulate.ForecastOptions
	var asJSON, quiet bool
	cmd := &cobra.Command{
		Use:   "forecast SCENARIO",
		Short: "forecast the numbers, magnitudes and colours of the stars a survey detects",
		Long:  forecastLong,
		Args:  cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			s, err := synth.Load(args[0])
			if err != nil {
				return asUsage(err)
			}
			if o.Workers < 0 {
				return usageErrorf("--workers %d is out of range; allowed: 0 or more", o.Workers)
			}
			bar := newProgress(stderr, quiet)
			o.Progress = progressFunc(bar)
			fc, err := simulate.RunForecast(cmd.Context(), s, o)
			if bar != nil {
				_ = bar.Finish()
				fmt.Fprintln(stderr)
			}
			if err != nil {
				return runError(err)
			}
			if asJSON {
				enc := json.NewEncoder(stdout)
				enc.SetIndent("", "  ")
				return enc.Encode(fc)
			}
			printForecast(stdout, fc)
			return nil
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.Dir, "out", "forecast-out", "folder for the tables and pictures")
	f.IntVar(&o.Workers, "workers", 0, "number of worker goroutines (0: the scenario's, or all CPUs)")
	f.BoolVar(&o.Catalogue, "catalogue", false, "also write the scenario's catalogue into --out")
	f.BoolVar(&asJSON, "json", false, "print the forecast as JSON instead of tables")
	f.BoolVar(&quiet, "quiet", false, "no progress bar")
	return cmd
}

func printForecast(w io.Writer, fc *simulate.Forecast) {
	fmt.Fprintf(w, "synthetic forecast (seed %d): %d stars simulated, %d pass the detection rule\n", fc.Seed, fc.Stars, fc.Detected)
	if fc.SolidAngleSr > 0 {
		deg2 := fc.SolidAngleSr * math.Pow(180/math.Pi, 2)
		fmt.Fprintf(w, "field: %.4g deg^2\n", deg2)
	}
	for _, b := range fc.Bands {
		fmt.Fprintf(w, "\nband %s: detected %d ± %.0f (expected %.1f ± %.1f)\n", b.Band, b.Total.Realised, b.Total.RealisedErr, b.Total.Expected, b.Total.ExpectedErr)
		printCounts(w, "component", b.ByComponent)
		printCounts(w, "stage", b.ByStage)
	}
	fmt.Fprintln(w)
	for _, f := range fc.Files {
		fmt.Fprintf(w, "wrote %s\n", f)
	}
}

func printCounts(w io.Writer, what string, m map[string]simulate.Count) {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		c := m[k]
		if c.Realised == 0 && c.Expected < 0.05 {
			continue
		}
		fmt.Fprintf(w, "  %-9s %-28s %10d ± %-7.0f expected %10.1f ± %.1f\n", what, k, c.Realised, c.RealisedErr, c.Expected, c.ExpectedErr)
	}
}
