package output

import (
	"fmt"

	"github.com/apache/arrow-go/v18/arrow"
	"github.com/apache/arrow-go/v18/arrow/array"
	"github.com/apache/arrow-go/v18/arrow/ipc"
)

// ipcWriter writes the Arrow IPC file format: the schema (with the manifest as
// schema-level metadata under ManifestKey and units as field metadata) followed by one
// uncompressed record batch per Write, so the file can be memory-mapped by any Arrow
// reader.
type ipcWriter struct {
	*base
	schema *arrow.Schema
	rb     *array.RecordBuilder
	w      *ipc.FileWriter
}

func newIPCWriter(b *base) (*ipcWriter, error) {
	js, err := b.headerManifest()
	if err != nil {
		return nil, err
	}
	md := arrow.NewMetadata([]string{ManifestKey}, []string{string(js)})
	sch := ArrowSchema(b.cols, &md)
	fw, err := ipc.NewFileWriter(b.file.buf, ipc.WithSchema(sch), ipc.WithAllocator(b.opts.Allocator))
	if err != nil {
		return nil, fmt.Errorf("output: arrow ipc writer: %w", err)
	}
	return &ipcWriter{base: b, schema: sch, rb: array.NewRecordBuilder(b.opts.Allocator, sch), w: fw}, nil
}

// Write converts the batch to one Arrow record batch (through a builder reused across
// calls) and writes it.
func (w *ipcWriter) Write(b *Batch) error {
	if err := w.check(b); err != nil {
		return err
	}
	if b.N == 0 {
		return nil
	}
	n := b.N
	w.rb.Reserve(n)
	for c := range w.cols {
		var valid []bool
		if b.Valid != nil && b.Valid[c] != nil {
			valid = b.Valid[c][:n]
		}
		switch col := b.Cols[c].(type) {
		case []float32:
			w.rb.Field(c).(*array.Float32Builder).AppendValues(col[:n], valid)
		case []float64:
			w.rb.Field(c).(*array.Float64Builder).AppendValues(col[:n], valid)
		case []int64:
			w.rb.Field(c).(*array.Int64Builder).AppendValues(col[:n], valid)
		case []int32:
			w.rb.Field(c).(*array.Int32Builder).AppendValues(col[:n], valid)
		case []int8:
			w.rb.Field(c).(*array.Int8Builder).AppendValues(col[:n], valid)
		case []bool:
			w.rb.Field(c).(*array.BooleanBuilder).AppendValues(col[:n], valid)
		case []string:
			w.rb.Field(c).(*array.StringBuilder).AppendValues(col[:n], valid)
		}
	}
	rec := w.rb.NewRecordBatch()
	defer rec.Release()
	if err := w.w.Write(rec); err != nil {
		return w.fail(err)
	}
	w.rows += int64(n)
	return nil
}

// Close writes the IPC footer, renames into place and writes the sidecar.
func (w *ipcWriter) Close() error {
	if w.closed {
		return w.err
	}
	defer w.rb.Release()
	return w.commit(w.w.Close)
}

// Abort discards the file.
func (w *ipcWriter) Abort() error {
	if w.closed {
		return nil
	}
	w.rb.Release()
	return w.abort()
}
