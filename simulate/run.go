package simulate

import (
	"context"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"runtime/debug"
	"sort"
	"strings"
	"time"

	"github.com/starmock/starmock/output"
	"github.com/starmock/starmock/synth"
)

// Options are the run-time choices that do not change the catalogue's content.
type Options struct {
	// Workers overrides the scenario's worker count when > 0.
	Workers int
	// ShardIndex and ShardCount select shard i of N (0-based); ShardCount 0 = no sharding.
	// A sharded run writes one part file per format into the output path, which is then a
	// folder: <path>/part-<i>.<ext>, a partitioned dataset read as one table.
	ShardIndex, ShardCount int
	// OutPath overrides the scenario's output path when not empty.
	OutPath string
	// Progress, when not nil, is called after each chunk with stars done and total.
	Progress func(done, total int64)
	// NoCatalogue runs the pipeline without writing a catalogue (forecasts).
	NoCatalogue bool
	// OnPlan, when not nil, is called once the plan is resolved, before any star is made.
	OnPlan func(p *synth.Plan) error
	// OnBatch, when not nil, sees every batch after it is written (for summaries and
	// pictures). Columns are those of Plan.Columns (before any column selection).
	OnBatch func(b *output.Batch, cols []output.Column) error
}

// FileInfo is one written file.
type FileInfo struct {
	Path  string `json:"path"`
	Bytes int64  `json:"bytes"`
}

// Report summarises a finished run.
type Report struct {
	Stars           int64            `json:"stars"`
	Rows            int64            `json:"rows"`
	Detected        int64            `json:"detected"`
	DetectedPerBand map[string]int64 `json:"detected_per_band"`
	StarsPerStage   map[string]int64 `json:"stars_per_stage"`
	ComponentStars  map[string]int64 `json:"component_stars"`
	Files           []FileInfo       `json:"files"`
	Elapsed         time.Duration    `json:"elapsed_ns"`
	Bands           []string         `json:"bands"`
}

// outputPaths returns the file path for each format: <base><ext>, or for a shard
// <base>/part-<i><ext>. A base that already ends in one format's extension keeps it
// for that format and drops it for the others.
func outputPaths(base string, formats []string, shard, shards int) (map[string]string, error) {
	stem := base
	for _, f := range []string{".parquet", ".arrow", ".fits", ".csv"} {
		stem = strings.TrimSuffix(stem, f)
	}
	paths := map[string]string{}
	for _, name := range formats {
		f, err := output.ParseFormat(name)
		if err != nil {
			return nil, err
		}
		if shards > 0 {
			paths[name] = filepath.Join(stem, fmt.Sprintf("part-%05d%s", shard, f.Extension()))
		} else {
			paths[name] = stem + f.Extension()
		}
	}
	return paths, nil
}

// Run executes a validated scenario and writes its catalogue. Files appear under their
// final names only if the run succeeds; on any error every partial file is removed.
func Run(ctx context.Context, s *synth.Scenario, opts Options) (*Report, error) {
	start := time.Now()
	plan, err := synth.NewPlan(ctx, s)
	if err != nil {
		return nil, err
	}
	if opts.OnPlan != nil {
		if err := opts.OnPlan(plan); err != nil {
			return nil, err
		}
	}
	chunks := plan.Chunks
	if opts.ShardCount > 0 {
		if chunks, err = plan.Shard(opts.ShardIndex, opts.ShardCount); err != nil {
			return nil, err
		}
	}
	workers := plan.Workers()
	if opts.Workers > 0 {
		workers = opts.Workers
	}
	cols := plan.Columns()
	sel, err := synth.SelectColumns(cols, s.Output.Columns)
	if err != nil {
		return nil, fmt.Errorf("%s: output.columns: %w", s.File(), err)
	}
	outCols := make([]output.Column, len(sel))
	for i, j := range sel {
		outCols[i] = cols[j]
	}
	base := s.Output.Path
	if opts.OutPath != "" {
		base = opts.OutPath
	}
	paths, err := outputPaths(base, s.Output.Formats, opts.ShardIndex, opts.ShardCount)
	if err != nil {
		return nil, err
	}
	rep := &Report{DetectedPerBand: map[string]int64{}, StarsPerStage: map[string]int64{}, ComponentStars: map[string]int64{}}
	for _, b := range plan.Survey.Bands {
		rep.Bands = append(rep.Bands, b.Name)
	}
	man := &output.Manifest{ScenarioText: string(s.Text()), Scenario: resolvedScenario(s, plan), Seed: plan.Seed,
		ShardIndex: opts.ShardIndex, ShardCount: opts.ShardCount, ComponentStars: map[string]int64{}, DetectedPerBand: map[string]int64{}}
	for _, cp := range plan.Components {
		man.ComponentStars[cp.Name] = cp.Stars
	}
	var writers []output.Writer
	abort := func() {
		for _, w := range writers {
			_ = w.Abort()
		}
	}
	formats := s.Output.Formats
	if opts.NoCatalogue {
		formats = nil
	}
	for _, name := range formats {
		f, _ := output.ParseFormat(name)
		path := paths[name]
		var w output.Writer
		var err error
		if opts.ShardCount > 0 {
			w, err = output.CreatePart(f, filepath.Dir(path), opts.ShardIndex, outCols, man, output.Options{})
		} else {
			if dir := filepath.Dir(path); dir != "" {
				if err := os.MkdirAll(dir, 0o755); err != nil {
					abort()
					return nil, fmt.Errorf("output path %s: %w", path, err)
				}
			}
			w, err = output.Create(f, path, outCols, man)
		}
		if err != nil {
			abort()
			return nil, fmt.Errorf("output path %s: %w", path, err)
		}
		writers = append(writers, w)
	}
	setMemoryLimit(cols, plan.ChunkSize, workers)
	var total int64
	for _, c := range chunks {
		total += int64(c.N)
	}
	proj := &output.Batch{Cols: make([]any, len(sel)), Valid: make([][]bool, len(sel))}
	filtered := output.NewBatch(outCols, plan.ChunkSize)
	idxDetected := len(cols) - 1
	stageCol := 2
	nb := len(plan.Survey.Bands)
	var done int64
	sink := func(r synth.Result) error {
		b := r.Batch
		det := b.Cols[idxDetected].([]bool)
		stages := b.Cols[stageCol].([]string)
		comp := plan.Components[r.Chunk.Component].Name
		rep.ComponentStars[comp] += int64(b.N)
		for j := 0; j < b.N; j++ {
			rep.StarsPerStage[stages[j]]++
			if det[j] {
				rep.Detected++
			}
		}
		for k := 0; k < nb; k++ {
			dk := b.Cols[synth.BandColumn(k, 6)].([]bool)
			n := int64(0)
			for j := 0; j < b.N; j++ {
				if dk[j] {
					n++
				}
			}
			rep.DetectedPerBand[rep.Bands[k]] += n
		}
		if opts.OnBatch != nil {
			if err := opts.OnBatch(b, cols); err != nil {
				return err
			}
		}
		out := project(b, sel, proj)
		if s.Output.DetectedOnly {
			out = keepRows(out, det, outCols, filtered)
		}
		for _, w := range writers {
			if err := w.Write(out); err != nil {
				return err
			}
		}
		rep.Rows += int64(out.N)
		done += int64(r.Chunk.N) // stars drawn, including field stars skipped as undetectable
		if opts.Progress != nil {
			opts.Progress(done, total)
		}
		return nil
	}
	if err := plan.Run(ctx, chunks, workers, sink); err != nil {
		abort()
		return nil, err
	}
	rep.Stars = done
	man.TotalStars = done
	for k, v := range rep.DetectedPerBand {
		man.DetectedPerBand[k] = v
	}
	for _, w := range writers {
		if err := w.Close(); err != nil {
			abort()
			return nil, err
		}
	}
	names := make([]string, 0, len(paths))
	for _, name := range formats {
		names = append(names, paths[name])
	}
	sort.Strings(names)
	for _, p := range names {
		fi, err := os.Stat(p)
		if err != nil {
			return nil, err
		}
		rep.Files = append(rep.Files, FileInfo{Path: p, Bytes: fi.Size()})
	}
	rep.Elapsed = time.Since(start)
	return rep, nil
}

// setMemoryLimit sets the Go runtime's soft memory limit, unless the user set GOMEMLIMIT,
// to twice the bytes of the batches in flight plus 160 MiB for the writers, and at
// least 350 MiB. The live heap of a run is those batches plus the encoders; the limit
// makes the collector run before the default GOGC=100 slack doubles them, so resident
// memory stays bounded by workers × chunk size as the design asks.
func setMemoryLimit(cols []output.Column, chunk, workers int) {
	if os.Getenv("GOMEMLIMIT") != "" {
		return
	}
	perRow := output.RowBytes(cols) + int64(len(cols)) // values plus validity
	for _, c := range cols {
		if c.Kind == output.String {
			perRow += 16 // string headers
		}
	}
	live := perRow * int64(chunk) * int64(synth.BatchesInFlight(workers))
	limit := max(2*live+160<<20, 350<<20)
	debug.SetMemoryLimit(limit)
}

// project returns a view of b holding only the selected columns (no copy).
func project(b *output.Batch, sel []int, dst *output.Batch) *output.Batch {
	dst.N = b.N
	for i, j := range sel {
		dst.Cols[i] = b.Cols[j]
		if b.Valid != nil {
			dst.Valid[i] = b.Valid[j]
		} else {
			dst.Valid[i] = nil
		}
	}
	return dst
}

// keepRows copies the rows with keep[j] into dst (allocated for cols) and returns it.
func keepRows(b *output.Batch, keep []bool, cols []output.Column, dst *output.Batch) *output.Batch {
	n := 0
	for j := 0; j < b.N; j++ {
		if !keep[j] {
			continue
		}
		for i := range cols {
			switch src := b.Cols[i].(type) {
			case []float32:
				dst.Cols[i].([]float32)[n] = src[j]
			case []float64:
				dst.Cols[i].([]float64)[n] = src[j]
			case []int64:
				dst.Cols[i].([]int64)[n] = src[j]
			case []int32:
				dst.Cols[i].([]int32)[n] = src[j]
			case []int8:
				dst.Cols[i].([]int8)[n] = src[j]
			case []bool:
				dst.Cols[i].([]bool)[n] = src[j]
			case []string:
				dst.Cols[i].([]string)[n] = src[j]
			}
			if dst.Valid != nil && dst.Valid[i] != nil {
				v := true
				if b.Valid != nil && b.Valid[i] != nil {
					v = b.Valid[i][j]
				}
				dst.Valid[i][n] = v
			}
		}
		n++
	}
	dst.N = n
	return dst
}

// resolvedScenario is what the manifest records as the resolved scenario: the
// scenario with every default filled, plus the derived star counts.
func resolvedScenario(s *synth.Scenario, p *synth.Plan) any {
	raw, _ := json.Marshal(s)
	var m map[string]any
	_ = json.Unmarshal(raw, &m)
	counts := map[string]any{}
	for _, c := range p.Components {
		counts[c.Name] = map[string]any{"stars": c.Stars, "first_star_id": c.FirstID, "realised_initial_mass_msun": c.RealisedMassMsun}
	}
	m["derived"] = map[string]any{"components": counts, "chunk_count": len(p.Chunks), "stars": p.Stars,
		"warning": "synthetic catalogue: a model prediction, not observations; see the README's model limits"}
	return m
}
