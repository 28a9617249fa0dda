package simulate

import (
	"context"
	"time"

	"github.com/starmock/starmock/output"
	"github.com/starmock/starmock/synth"
)

// Estimate is what a dry run reports: the plan's size and the expected output size and
// run time, measured on a small sample of the plan's own stars.
type EstimateReport struct {
	Components     []ComponentEstimate
	Stars          int64
	Chunks         int
	ChunkSize      int
	Columns        int
	Files          []FileInfo
	Workers        int
	SampleStars    int
	StarsPerSecond float64
	Time           time.Duration
}

// ComponentEstimate is one component's expected star count.
type ComponentEstimate struct {
	Name  string
	Stars int64
}

// sampleStars is the number of stars simulated (and discarded) to time a dry run.
const sampleStars = 4000

// Estimate resolves the plan (which validates every table and model and counts the
// stars of total-mass components) and times the simulation of up to sampleStars stars
// taken from the first, middle and last chunk of each component, without writing
// anything; the time ignores the writers and assumes perfect use of the workers. File
// sizes are estimated from the column types: exact row widths for FITS and Arrow,
// about 9 bytes per numeric value for CSV, and 60 % of the Arrow size for compressed
// Parquet (typical of the random-valued float columns of a catalogue; a rough figure).
func Estimate(ctx context.Context, s *synth.Scenario, workers int) (*EstimateReport, error) {
	plan, err := synth.NewPlan(ctx, s)
	if err != nil {
		return nil, err
	}
	if workers <= 0 {
		workers = plan.Workers()
	}
	e := &EstimateReport{Stars: plan.Stars, Chunks: len(plan.Chunks), ChunkSize: plan.ChunkSize, Workers: workers}
	for _, c := range plan.Components {
		e.Components = append(e.Components, ComponentEstimate{c.Name, c.Stars})
	}
	cols := plan.Columns()
	sel, err := synth.SelectColumns(cols, s.Output.Columns)
	if err != nil {
		return nil, err
	}
	e.Columns = len(sel)
	// The sample: the first, middle and last chunk of each component, each cut to a
	// share of sampleStars (chunk costs vary along a Galactic sight line). A first pass
	// warms the shared caches (evolution models, shell samplers); the second is timed.
	var sample []synth.ChunkRef
	per := sampleStars / (3 * len(plan.Components))
	byComp := map[int][]synth.ChunkRef{}
	for _, ch := range plan.Chunks {
		byComp[ch.Component] = append(byComp[ch.Component], ch)
	}
	for c := range plan.Components {
		chs := byComp[c]
		if len(chs) == 0 {
			continue
		}
		picks := []int{0, len(chs) / 2, len(chs) - 1}
		seen := map[int]bool{}
		for _, k := range picks {
			if seen[k] {
				continue
			}
			seen[k] = true
			ch := chs[k]
			if ch.N > per {
				ch.N = per
			}
			sample = append(sample, ch)
			e.SampleStars += ch.N
		}
	}
	discard := func(synth.Result) error { return nil }
	if err := plan.Run(ctx, sample, 1, discard); err != nil {
		return nil, err
	}
	start := time.Now()
	if err := plan.Run(ctx, sample, 1, discard); err != nil {
		return nil, err
	}
	el := time.Since(start)
	if e.SampleStars > 0 && el > 0 {
		e.StarsPerSecond = float64(e.SampleStars) / el.Seconds()
		e.Time = time.Duration(float64(plan.Stars) / (e.StarsPerSecond * float64(workers)) * float64(time.Second))
	}
	var rowFITS, rowArrow, rowCSV float64
	for _, j := range sel {
		c := cols[j]
		w := map[output.Kind]float64{output.Float32: 4, output.Float64: 8, output.Int64: 8, output.Int32: 4, output.Int8: 1, output.Bool: 1, output.String: float64(max(c.MaxLen, output.DefaultStringMaxLen))}[c.Kind]
		rowFITS += w
		rowArrow += w
		if c.Kind == output.String {
			rowCSV += 12
		} else {
			rowCSV += 9
		}
	}
	paths, err := outputPaths(s.Output.Path, s.Output.Formats, 0, 0)
	if err != nil {
		return nil, err
	}
	n := float64(plan.Stars)
	for _, f := range s.Output.Formats {
		var b float64
		switch f {
		case "fits":
			b = rowFITS*n + 2880*4
		case "arrow":
			b = rowArrow * n
		case "csv":
			b = rowCSV * n
		case "parquet":
			b = 0.6 * rowArrow * n
		}
		e.Files = append(e.Files, FileInfo{Path: paths[f], Bytes: int64(b)})
	}
	return e, nil
}
