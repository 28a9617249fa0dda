package output

import (
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strconv"

	"github.com/apache/arrow-go/v18/arrow/memory"
)

// PartName returns the file name of part index of a dataset: "part-00000.parquet" for
// index 0 and Parquet. It panics if index is outside 0..99999 (a programming error).
func PartName(format Format, index int) string {
	if index < 0 || index > 99999 {
		panic(fmt.Sprintf("output: PartName: part index %d outside 0..99999", index))
	}
	return fmt.Sprintf("part-%05d%s", index, format.Extension())
}

// PartSidecarPath returns the sidecar path of a dataset part:
// "<dir>/_part-00000.parquet.manifest.json". The leading underscore makes dataset
// readers (pyarrow.dataset, Spark, DuckDB globs on *.parquet) skip it.
func PartSidecarPath(dir string, format Format, index int) string {
	return filepath.Join(dir, "_"+PartName(format, index)+".manifest.json")
}

// CreatePart opens a writer for part index of a dataset folder dir (created if missing,
// mode 0755). Use one part per shard (index = shard index) or per writer goroutine; each
// part is an independent, atomically written file, and the parts in index order form
// the whole catalogue. opts.Sidecar is replaced by PartSidecarPath.
func CreatePart(format Format, dir string, index int, cols []Column, meta *Manifest, opts Options) (Writer, error) {
	if index < 0 || index > 99999 {
		return nil, fmt.Errorf("output: dataset part index %d outside 0..99999", index)
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, fmt.Errorf("output: cannot create dataset folder %q: %w", dir, err)
	}
	opts.Sidecar = PartSidecarPath(dir, format, index)
	return CreateWithOptions(format, filepath.Join(dir, PartName(format, index)), cols, meta, opts)
}

var partRE = regexp.MustCompile(`^part-(\d{5})(\.[a-z]+)$`)

// DatasetParts lists the part files of format in dir in index order.
func DatasetParts(dir string, format Format) ([]string, error) {
	ents, err := os.ReadDir(dir)
	if err != nil {
		return nil, fmt.Errorf("output: cannot read dataset folder: %w", err)
	}
	type part struct {
		idx  int
		path string
	}
	var parts []part
	for _, e := range ents {
		m := partRE.FindStringSubmatch(e.Name())
		if m == nil || m[2] != format.Extension() || e.IsDir() {
			continue
		}
		i, _ := strconv.Atoi(m[1])
		parts = append(parts, part{i, filepath.Join(dir, e.Name())})
	}
	sort.Slice(parts, func(a, b int) bool { return parts[a].idx < parts[b].idx })
	out := make([]string, len(parts))
	for i, p := range parts {
		out[i] = p.path
	}
	return out, nil
}

// ReadDataset reads every part of a dataset folder, in index order, into one Table (see
// ReadFile). All parts must have the same columns; the manifest is that of the first
// part. It returns an error if the folder holds no part of the format.
func ReadDataset(dir string, format Format, mem memory.Allocator) (*Table, error) {
	paths, err := DatasetParts(dir, format)
	if err != nil {
		return nil, err
	}
	if len(paths) == 0 {
		return nil, fmt.Errorf("output: dataset folder %q holds no %s parts (part-NNNNN%s)", dir, format, format.Extension())
	}
	var out *Table
	for _, p := range paths {
		t, err := ReadFile(format, p, mem)
		if err != nil {
			return nil, err
		}
		if out == nil {
			out = t
			continue
		}
		if len(t.Columns) != len(out.Columns) {
			return nil, fmt.Errorf("output: dataset part %q has %d columns, first part has %d", p, len(t.Columns), len(out.Columns))
		}
		for i := range t.Columns {
			if t.Columns[i] != out.Columns[i] {
				return nil, fmt.Errorf("output: dataset part %q column %d is %+v, first part has %+v", p, i, t.Columns[i], out.Columns[i])
			}
		}
		merged := NewBatch(out.Columns, out.Batch.N+t.Batch.N)
		merged.Reset(out.Batch.N + t.Batch.N)
		appendBatch(merged, fullValid(out.Batch, out.Columns), 0)
		appendBatch(merged, fullValid(t.Batch, t.Columns), out.Batch.N)
		finishBatch(merged, out.Columns)
		out.Batch = merged
	}
	return out, nil
}

// fullValid gives b validity slices for every nullable column (for copying).
func fullValid(b *Batch, cols []Column) *Batch {
	if b.Valid == nil {
		b.Valid = make([][]bool, len(cols))
	}
	for i, c := range cols {
		if c.Nullable && b.Valid[i] == nil {
			v := make([]bool, b.N)
			for j := range v {
				v[j] = true
			}
			b.Valid[i] = v
		}
	}
	return b
}

// appendBatch copies the first src.N rows of src into dst at row at (dst must have room
// and validity slices wherever src has them).
func appendBatch(dst, src *Batch, at int) {
	for c := range src.Cols {
		switch v := src.Cols[c].(type) {
		case []float32:
			copy(dst.Cols[c].([]float32)[at:], v[:src.N])
		case []float64:
			copy(dst.Cols[c].([]float64)[at:], v[:src.N])
		case []int64:
			copy(dst.Cols[c].([]int64)[at:], v[:src.N])
		case []int32:
			copy(dst.Cols[c].([]int32)[at:], v[:src.N])
		case []int8:
			copy(dst.Cols[c].([]int8)[at:], v[:src.N])
		case []bool:
			copy(dst.Cols[c].([]bool)[at:], v[:src.N])
		case []string:
			copy(dst.Cols[c].([]string)[at:], v[:src.N])
		}
		if src.Valid != nil && src.Valid[c] != nil && dst.Valid[c] != nil {
			copy(dst.Valid[c][at:], src.Valid[c][:src.N])
		}
	}
}
