package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
	"time"

	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"

	"github.com/starmock/starmock/simulate"
	"github.com/starmock/starmock/synth"
)

func init() { extraCommands = append(extraCommands, newSimulateCmd) }

const simulateLong = `Run a scenario file and write its mock catalogue.

The scenario (YAML; see 'starmock scenario --help' for every key) names the
populations, the dust, the survey and the output. The catalogue holds truth
columns (masses, ages, stages, positions, extinction, companions) and observed
columns per band (magnitude, error, flux, detection flags).

The same scenario and seed always give byte-identical files, whatever the
number of workers. With --shard i/N the run writes shard i (0-based) of N into
the output path as a folder of part files (part-0000i.parquet, ...), which
Parquet readers treat as one table; the parts of all shards, in order, hold
exactly the rows of the unsharded run.

Files are written under a temporary name and renamed when the run succeeds;
after a failure nothing is left under the final name.

Examples:
  starmock simulate cluster.yaml
  starmock simulate cluster.yaml --dry-run
  starmock simulate cluster.yaml --workers 8 --out run1/catalogue
  starmock simulate field.yaml --shard 3/16 --quiet`

type simulateOptions struct {
	dryRun  bool
	workers int
	shard   string
	out     string
	quiet   bool
}

func newSimulateCmd(stdout, stderr io.Writer) *cobra.Command {
	o := &simulateOptions{}
	cmd := &cobra.Command{
		Use:   "simulate SCENARIO",
		Short: "run a scenario file and write its mock catalogue",
		Long:  simulateLong,
		Args:  cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			s, err := synth.Load(args[0])
			if err != nil {
				return asUsage(err)
			}
			var si, sn int
			if o.shard != "" {
				if si, sn, err = parseShard(o.shard); err != nil {
					return usageErrorf("--shard: %v", err)
				}
			}
			if o.workers < 0 {
				return usageErrorf("--workers %d is out of range; allowed: 0 (the scenario's value) or more", o.workers)
			}
			if o.dryRun {
				return dryRun(cmd, s, o, stdout)
			}
			opts := simulate.Options{Workers: o.workers, ShardIndex: si, ShardCount: sn, OutPath: o.out}
			bar := newProgress(stderr, o.quiet)
			opts.Progress = progressFunc(bar)
			rep, err := simulate.Run(cmd.Context(), s, opts)
			if bar != nil {
				_ = bar.Finish()
				fmt.Fprintln(stderr)
			}
			if err != nil {
				return runError(err)
			}
			printReport(stdout, rep)
			return nil
		},
	}
	f := cmd.Flags()
	f.BoolVar(&o.dryRun, "dry-run", false, "validate the scenario and print the expected star count, output size and run time; write nothing")
	f.IntVar(&o.workers, "workers", 0, "number of worker goroutines (0: the scenario's output.workers, or all CPUs); never changes the output")
	f.StringVar(&o.shard, "shard", "", "run only shard `i/N` (0-based i) of the plan, writing a part file of a partitioned dataset")
	f.StringVar(&o.out, "out", "", "output path without extension (overrides the scenario's output.path)")
	f.BoolVar(&o.quiet, "quiet", false, "no progress bar")
	return cmd
}

// runError marks scenario errors found while resolving a plan (tables, models) as usage
// errors (exit status 2); other errors pass unchanged.
func runError(err error) error {
	var se *synth.ScenarioError
	if errors.As(err, &se) {
		return asUsage(err)
	}
	return err
}

// progressFunc adapts a progress bar (nil: none) to the runners' progress callback.
func progressFunc(bar *progressbar.ProgressBar) func(done, total int64) {
	if bar == nil {
		return nil
	}
	return func(done, total int64) {
		bar.ChangeMax64(total)
		_ = bar.Set64(done)
	}
}

// parseShard reads "i/N" with 0 <= i < N.
func parseShard(v string) (int, int, error) {
	a, b, ok := strings.Cut(v, "/")
	i, e1 := strconv.Atoi(a)
	n, e2 := strconv.Atoi(b)
	if !ok || e1 != nil || e2 != nil || n < 1 || i < 0 || i >= n {
		return 0, 0, fmt.Errorf("%q is not i/N with 0 <= i < N (e.g. 0/4)", v)
	}
	return i, n, nil
}

// newProgress returns a progress bar on stderr when it is a terminal and not quiet.
func newProgress(stderr io.Writer, quiet bool) *progressbar.ProgressBar {
	if quiet {
		return nil
	}
	f, ok := stderr.(*os.File)
	if !ok || !term.IsTerminal(int(f.Fd())) {
		return nil
	}
	return progressbar.NewOptions64(1, progressbar.OptionSetWriter(stderr), progressbar.OptionSetDescription("stars"),
		progressbar.OptionShowCount(), progressbar.OptionThrottle(200*time.Millisecond), progressbar.OptionShowIts(),
		progressbar.OptionSetItsString("stars"))
}

func printReport(w io.Writer, rep *simulate.Report) {
	fmt.Fprintf(w, "stars generated: %d\n", rep.Stars)
	fmt.Fprintf(w, "detected (survey rule): %d\n", rep.Detected)
	for _, b := range rep.Bands {
		fmt.Fprintf(w, "  detected in %-4s %d\n", b+":", rep.DetectedPerBand[b])
	}
	fmt.Fprintf(w, "rows written: %d\n", rep.Rows)
	for _, f := range rep.Files {
		fmt.Fprintf(w, "wrote %s (%s)\n", f.Path, humanBytes(f.Bytes))
	}
	fmt.Fprintf(w, "elapsed: %s (%.0f stars/s)\n", rep.Elapsed.Round(time.Millisecond), float64(rep.Stars)/rep.Elapsed.Seconds())
}

func humanBytes(n int64) string {
	switch {
	case n >= 1<<30:
		return fmt.Sprintf("%.2f GiB", float64(n)/(1<<30))
	case n >= 1<<20:
		return fmt.Sprintf("%.1f MiB", float64(n)/(1<<20))
	case n >= 1<<10:
		return fmt.Sprintf("%.1f KiB", float64(n)/(1<<10))
	}
	return fmt.Sprintf("%d B", n)
}

func dryRun(cmd *cobra.Command, s *synth.Scenario, o *simulateOptions, w io.Writer) error {
	est, err := simulate.Estimate(cmd.Context(), s, o.workers)
	if err != nil {
		return runError(err)
	}
	fmt.Fprintf(w, "scenario %s is valid\n", s.File())
	for _, c := range est.Components {
		fmt.Fprintf(w, "  component %-16s %12d stars\n", c.Name, c.Stars)
	}
	fmt.Fprintf(w, "expected stars: %d in %d chunks of %d\n", est.Stars, est.Chunks, est.ChunkSize)
	if est.Rows != est.Stars {
		fmt.Fprintf(w, "expected rows: about %d (stars that cannot be detected get none)\n", est.Rows)
	}
	fmt.Fprintf(w, "columns: %d\n", est.Columns)
	for _, f := range est.Files {
		fmt.Fprintf(w, "expected output: %s about %s\n", f.Path, humanBytes(f.Bytes))
	}
	fmt.Fprintf(w, "expected run time: about %s with %d workers (measured on a %d-star sample: %.0f stars/s)\n",
		roundDuration(est.Time), est.Workers, est.SampleStars, est.StarsPerSecond)
	fmt.Fprintln(w, "nothing was written (dry run)")
	return nil
}

// roundDuration rounds a duration for display: to 0.1 s from a second up, to ms below.
func roundDuration(d time.Duration) time.Duration {
	if d >= time.Second {
		return d.Round(time.Second / 10)
	}
	return d.Round(time.Millisecond)
}
