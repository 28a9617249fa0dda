package simulate

import (
	"context"
	"math"
	"time"

	"github.com/starmock/starmock/output"
	"github.com/starmock/starmock/synth"
)

// Estimate is what a dry run reports: the plan's size and the expected output size and
// run time, measured on a small sample of the plan's own stars.
type EstimateReport struct {
	Components     []ComponentEstimate
	Stars          int64
	Rows           int64 // expected catalogue rows (from the sample's rows per drawn star)
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

// sampleStars is the number of stars simulated (and discarded) to time a dry run, in
// sampleChunks chunks per component.
const (
	sampleStars  = 4000
	sampleChunks = 12
)

// Estimate resolves the plan (which validates every table and model and counts the
// stars of total-mass components) and times the simulation of up to sampleStars stars
// taken from chunks spread over each component, without writing
// anything; the time ignores the writers and assumes perfect use of the workers. The
// number of rows is the drawn stars times the sample's rows per drawn star. File sizes
// are estimated from the column types: exact row widths for FITS and Arrow,
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
	// The sample: sampleChunks chunks of each component evenly spaced over its chunk
	// list, each cut to a share of sampleStars. Galactic stars are ordered by distance
	// shell, so evenly spaced chunks sample the shells in proportion to their stars
	// (costs and the share of stars that get a row vary strongly along a sight line). A
	// first pass warms the shared caches (evolution models, shell samplers); the second
	// is timed.
	var sample []synth.ChunkRef
	per := max(1, sampleStars/(sampleChunks*len(plan.Components)))
	byComp := map[int][]synth.ChunkRef{}
	for _, ch := range plan.Chunks {
		byComp[ch.Component] = append(byComp[ch.Component], ch)
	}
	for c := range plan.Components {
		chs := byComp[c]
		if len(chs) == 0 {
			continue
		}
		k := min(sampleChunks, len(chs))
		picks := make([]int, k)
		for j := range picks {
			picks[j] = (2*j + 1) * len(chs) / (2 * k)
		}
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
	var sampleRows int64
	count := func(r synth.Result) error {
		b := r.Batch
		if !s.Output.DetectedOnly {
			sampleRows += int64(b.N)
			return nil
		}
		det := b.Cols[len(b.Cols)-1].([]bool) // the detected column is the last one
		for _, d := range det[:b.N] {
			if d {
				sampleRows++
			}
		}
		return nil
	}
	start := time.Now()
	if err := plan.Run(ctx, sample, 1, count); err != nil {
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
	// Rows: the sample's share of drawn stars that get a row (Galactic fields drop the
	// draws that cannot be detected; detected_only keeps detected rows only).
	n := float64(plan.Stars)
	if e.SampleStars > 0 {
		n *= float64(sampleRows) / float64(e.SampleStars)
	}
	e.Rows = int64(math.Round(n))
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
