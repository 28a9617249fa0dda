package output

import (
	"encoding/base64"
	"fmt"
	"sync"
	"sync/atomic"
	"unsafe"

	"github.com/apache/arrow-go/v18/arrow"
	"github.com/apache/arrow-go/v18/arrow/array"
	"github.com/apache/arrow-go/v18/arrow/bitutil"
	"github.com/apache/arrow-go/v18/arrow/flight"
	"github.com/apache/arrow-go/v18/arrow/memory"
	"github.com/apache/arrow-go/v18/parquet"
	"github.com/apache/arrow-go/v18/parquet/compress"
	"github.com/apache/arrow-go/v18/parquet/file"
	"github.com/apache/arrow-go/v18/parquet/metadata"
	"github.com/apache/arrow-go/v18/parquet/pqarrow"
)

// Field metadata keys written on every Arrow field (Arrow IPC and the Arrow schema
// stored in Parquet).
const (
	MetaUnit        = "unit"
	MetaDescription = "description"
)

// ArrowSchema returns the Arrow schema of a column list: one field per column with its
// Arrow type (float32, float64, int64, int32, int8, bool, utf8), nullability, and field
// metadata "unit" and "description". schemaMeta, if not nil, becomes the schema-level
// metadata (keys sorted for determinism by the caller).
func ArrowSchema(cols []Column, schemaMeta *arrow.Metadata) *arrow.Schema {
	fields := make([]arrow.Field, len(cols))
	for i, c := range cols {
		md := arrow.NewMetadata([]string{MetaDescription, MetaUnit}, []string{c.Description, c.Unit})
		fields[i] = arrow.Field{Name: c.Name, Type: arrowType(c.Kind), Nullable: c.Nullable, Metadata: md}
	}
	return arrow.NewSchema(fields, schemaMeta)
}

func arrowType(k Kind) arrow.DataType {
	switch k {
	case Float32:
		return arrow.PrimitiveTypes.Float32
	case Float64:
		return arrow.PrimitiveTypes.Float64
	case Int64:
		return arrow.PrimitiveTypes.Int64
	case Int32:
		return arrow.PrimitiveTypes.Int32
	case Int8:
		return arrow.PrimitiveTypes.Int8
	case Bool:
		return arrow.FixedWidthTypes.Boolean
	case String:
		return arrow.BinaryTypes.String
	}
	panic(fmt.Sprintf("output: invalid kind %d", k))
}

// ParquetCreatedBy is the created_by string of the Parquet footer. It carries no
// build-specific detail, so identical batches give identical files.
const ParquetCreatedBy = "starmock (parquet-go via apache arrow-go v18)"

// parquetProps builds the writer properties shared by the catalogue writer and the
// I/O floor: the codec, min/max statistics on (except Bool columns), no page index or
// bloom filter, dictionary only where the column asks for it, row groups never split
// (one per Write), 1 MiB data pages, format version 2.6.
func parquetProps(cols []Column, codec Compression, mem memory.Allocator) *parquet.WriterProperties {
	opts := []parquet.WriterProperty{
		parquet.WithAllocator(mem),
		parquet.WithCreatedBy(ParquetCreatedBy),
		parquet.WithCompression(codecOf(codec)),
		parquet.WithDictionaryDefault(false),
		parquet.WithStats(true),
		parquet.WithMaxRowGroupLength(1 << 40),
		parquet.WithDataPageSize(1 << 20),
		parquet.WithVersion(parquet.V2_6),
	}
	for _, c := range cols {
		if c.Encoding == EncodingDictionary || (c.Encoding == EncodingAuto && c.Kind == String) {
			opts = append(opts, parquet.WithDictionaryFor(c.Name, true))
		}
		if c.Kind == Bool {
			// min/max of a boolean prunes almost nothing and cost ~10% of the write
			// time of the 5-band schema (profiled); counts of nulls are still written.
			opts = append(opts, parquet.WithStatsFor(c.Name, false))
		}
	}
	return parquet.NewWriterProperties(opts...)
}

func codecOf(c Compression) compress.Compression {
	switch c {
	case Zstd:
		return compress.Codecs.Zstd
	case Uncompressed:
		return compress.Codecs.Uncompressed
	}
	return compress.Codecs.Snappy
}

// parquetWriter encodes each batch as one buffered row group whose column chunks are
// encoded concurrently (each column writer has its own in-memory page sink; the chunks
// are flushed to the file in column order when the row group closes, so the bytes do
// not depend on scheduling).
type parquetWriter struct {
	*base
	fw      *file.Writer
	scratch []colScratch
	pending *Batch // small batches merged into the next row group
}

// colScratch holds per-column buffers reused across batches (no per-row allocation).
type colScratch struct {
	def  []int16
	f32  []float32
	f64  []float64
	i64  []int64
	i32  []int32
	b    []bool
	strs []parquet.ByteArray
	dict *stringDict
}

func newParquetWriter(b *base) (*parquetWriter, error) {
	props := parquetProps(b.cols, b.opts.Compression, b.opts.Allocator)
	asch := ArrowSchema(b.cols, nil)
	psch, err := pqarrow.ToParquet(asch, props, pqarrow.DefaultWriterProps())
	if err != nil {
		return nil, fmt.Errorf("output: parquet schema: %w", err)
	}
	kv := metadata.KeyValueMetadata{}
	// Store the Arrow schema (with the unit/description field metadata) the way pqarrow
	// and pyarrow do, so Arrow-aware readers recover units.
	kv.Append("ARROW:schema", base64.StdEncoding.EncodeToString(flight.SerializeSchema(asch, b.opts.Allocator)))
	fw, err := file.NewParquetWriterWithError(b.file.buf, psch.Root(), file.WithWriterProps(props), file.WithWriteMetadata(kv))
	if err != nil {
		return nil, fmt.Errorf("output: parquet writer: %w", err)
	}
	return &parquetWriter{base: b, fw: fw, scratch: make([]colScratch, len(b.cols))}, nil
}

// Write encodes the batch as one row group.
func (w *parquetWriter) Write(b *Batch) error {
	if err := w.check(b); err != nil {
		return err
	}
	if b.N == 0 {
		return nil
	}
	limit := w.opts.RowGroupRows
	if w.pending != nil && w.pending.N > 0 && w.pending.N+b.N > limit {
		if err := w.writeRowGroup(w.pending); err != nil {
			return err
		}
		w.pending.N = 0
	}
	if b.N >= limit {
		return w.writeRowGroup(b)
	}
	// A small batch (e.g. after a detected-only filter): merge it into the pending row
	// group instead of writing a tiny one.
	if w.pending == nil {
		w.pending = NewBatch(w.cols, limit)
	}
	copyRows(w.pending, w.pending.N, b)
	w.pending.N += b.N
	return nil
}

// copyRows copies the first src.N rows of src into dst from row at; dst has validity
// slices for every nullable column, and rows of src without validity become valid.
func copyRows(dst *Batch, at int, src *Batch) {
	appendBatch(dst, src, at)
	for c, v := range dst.Valid {
		if v != nil && (src.Valid == nil || src.Valid[c] == nil) {
			for i := at; i < at+src.N; i++ {
				v[i] = true
			}
		}
	}
}

// writeRowGroup encodes the batch as one row group.
func (w *parquetWriter) writeRowGroup(b *Batch) error {
	ncol := len(w.cols)
	par := min(w.opts.Parallelism, ncol)
	if par <= 1 {
		// Serial row group: each column chunk streams straight to the file, with no
		// in-memory copy of the row group (least CPU and memory).
		rg, err := w.fw.AppendRowGroupChecked()
		if err != nil {
			return w.fail(err)
		}
		for c := range ncol {
			cw, err := rg.NextColumn()
			if err == nil {
				err = w.writeColumn(cw, b, c)
			}
			if err != nil {
				rg.Close()
				return w.fail(fmt.Errorf("column %q: %w", w.cols[c].Name, err))
			}
		}
		if err := rg.Close(); err != nil {
			return w.fail(err)
		}
		w.rows += int64(b.N)
		return nil
	}
	// Buffered row group: every column chunk has its own in-memory page sink, so
	// columns can be encoded concurrently; Close flushes them in column order.
	rg, err := w.fw.AppendBufferedRowGroupChecked()
	if err != nil {
		return w.fail(err)
	}
	errs := make([]error, ncol)
	var next atomic.Int64
	var wg sync.WaitGroup
	for range par {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				c := int(next.Add(1) - 1)
				if c >= ncol {
					return
				}
				cw, err := rg.Column(c)
				if err == nil {
					err = w.writeColumn(cw, b, c)
				}
				errs[c] = err
			}
		}()
	}
	wg.Wait()
	for c, e := range errs {
		if e != nil {
			rg.Close()
			return w.fail(fmt.Errorf("column %q: %w", w.cols[c].Name, e))
		}
	}
	if err := rg.Close(); err != nil {
		return w.fail(err)
	}
	w.rows += int64(b.N)
	return nil
}

// writeColumn writes column c of the batch into the row group. Null rows get
// definition level 0 and are left out of the value stream (Parquet's layout).
func (w *parquetWriter) writeColumn(cw file.ColumnChunkWriter, b *Batch, c int) error {
	var err error
	s := &w.scratch[c]
	n := b.N
	var valid []bool
	if b.Valid != nil && b.Valid[c] != nil && w.cols[c].Nullable {
		valid = b.Valid[c][:n]
	}
	var def []int16
	if w.cols[c].Nullable {
		s.def = grow(s.def, n)
		def = s.def
		nulls := 0
		for i := range def {
			def[i] = 1
		}
		for i, ok := range valid {
			if !ok {
				def[i] = 0
				nulls++
			}
		}
		if nulls == 0 {
			valid = nil // no null in this batch: write the values without compaction
		}
	}
	switch col := b.Cols[c].(type) {
	case []float32:
		v := col[:n]
		if valid != nil {
			s.f32 = compact(s.f32, v, valid)
			v = s.f32
		}
		_, err = cw.(*file.Float32ColumnChunkWriter).WriteBatch(v, def, nil)
	case []float64:
		v := col[:n]
		if valid != nil {
			s.f64 = compact(s.f64, v, valid)
			v = s.f64
		}
		_, err = cw.(*file.Float64ColumnChunkWriter).WriteBatch(v, def, nil)
	case []int64:
		v := col[:n]
		if valid != nil {
			s.i64 = compact(s.i64, v, valid)
			v = s.i64
		}
		_, err = cw.(*file.Int64ColumnChunkWriter).WriteBatch(v, def, nil)
	case []int32:
		v := col[:n]
		if valid != nil {
			s.i32 = compact(s.i32, v, valid)
			v = s.i32
		}
		_, err = cw.(*file.Int32ColumnChunkWriter).WriteBatch(v, def, nil)
	case []int8:
		// Parquet stores int8 as INT32 annotated INT(8, signed).
		s.i32 = s.i32[:0]
		for i, x := range col[:n] {
			if valid == nil || valid[i] {
				s.i32 = append(s.i32, int32(x))
			}
		}
		_, err = cw.(*file.Int32ColumnChunkWriter).WriteBatch(s.i32, def, nil)
	case []bool:
		v := col[:n]
		if valid != nil {
			s.b = compact(s.b, v, valid)
			v = s.b
		}
		_, err = cw.(*file.BooleanColumnChunkWriter).WriteBatch(v, def, nil)
	case []string:
		if isDictEncoding(cw) {
			if s.dict == nil {
				s.dict = &stringDict{index: map[string]int32{}}
			}
			return s.dict.write(cw, w.opts.Allocator, col[:n], valid, def)
		}
		s.strs = s.strs[:0]
		for i, x := range col[:n] {
			if valid == nil || valid[i] {
				// Zero-copy view of the string bytes; the encoder copies them before
				// WriteBatch returns and never writes through the slice.
				s.strs = append(s.strs, unsafe.Slice(unsafe.StringData(x), len(x)))
			}
		}
		_, err = cw.(*file.ByteArrayColumnChunkWriter).WriteBatch(s.strs, def, nil)
	default:
		err = fmt.Errorf("unsupported column type %T", col)
	}
	return err
}

func grow[T any](s []T, n int) []T {
	if cap(s) < n {
		return make([]T, n)
	}
	return s[:n]
}

// compact copies the valid values of v into dst (reused) in order.
func compact[T any](dst, v []T, valid []bool) []T {
	dst = dst[:0]
	for i, ok := range valid {
		if ok {
			dst = append(dst, v[i])
		}
	}
	return dst
}

// Close writes the footer (with the final manifest under ManifestKey), renames the file
// into place and writes the sidecar.
func (w *parquetWriter) Close() error {
	return w.commit(func() error {
		if w.pending != nil && w.pending.N > 0 {
			if err := w.writeRowGroup(w.pending); err != nil {
				return err
			}
			w.pending.N = 0
		}
		js, err := marshalManifest(w.finalManifest())
		if err != nil {
			return err
		}
		if err := w.fw.AppendKeyValueMetadata(ManifestKey, string(js)); err != nil {
			return err
		}
		return w.fw.Close()
	})
}

// Abort discards the file.
func (w *parquetWriter) Abort() error {
	return w.abort()
}

// isDictEncoding reports whether the column writer currently dictionary-encodes.
func isDictEncoding(cw file.ColumnChunkWriter) bool {
	e := cw.CurrentEncoder().Encoding()
	return e == parquet.Encodings.PlainDict || e == parquet.Encodings.RLEDict
}

// dictEncoder is the part of arrow-go's (internal) dictionary encoder used here.
type dictEncoder interface {
	NormalizeDict(arrow.Array) (arrow.Array, error)
	PutDictionary(arrow.Array) error
	NumEntries() int
}

// stringDict dictionary-encodes a string column chunk without allocating per row.
// arrow-go's ByteArray dictionary encoder boxes every value on insertion (one heap
// allocation per row); instead the dictionary of the batch is built here with a reused
// Go map, handed to the encoder once with PutDictionary, and the rows are written as
// int32 indices with WriteDictIndices - the same path pqarrow takes for Arrow dictionary
// arrays. Dictionary order is first appearance, so the bytes are deterministic.
type stringDict struct {
	index  map[string]int32
	words  []string
	idx    []int32
	bitmap []byte
}

func (d *stringDict) write(cw file.ColumnChunkWriter, mem memory.Allocator, vals []string, valid []bool, def []int16) error {
	clear(d.index)
	d.words = d.words[:0]
	n := len(vals)
	d.idx = grow(d.idx, n)
	nulls := 0
	for i, v := range vals {
		if valid != nil && !valid[i] {
			d.idx[i] = 0
			nulls++
			continue
		}
		k, ok := d.index[v]
		if !ok {
			k = int32(len(d.words))
			d.index[v] = k
			d.words = append(d.words, v)
		}
		d.idx[i] = k
	}
	sb := array.NewStringBuilder(mem)
	sb.AppendValues(d.words, nil)
	dict := sb.NewStringArray()
	sb.Release()
	defer dict.Release()

	enc, ok := cw.CurrentEncoder().(dictEncoder)
	if !ok {
		return fmt.Errorf("dictionary encoder not available for %s", cw.Descr().Name())
	}
	norm, err := enc.NormalizeDict(dict)
	if err != nil {
		return err
	}
	defer norm.Release()
	if err := enc.PutDictionary(norm); err != nil {
		return err
	}
	if enc.NumEntries() != len(d.words) {
		return fmt.Errorf("dictionary of %d words became %d entries", len(d.words), enc.NumEntries())
	}
	if st := cw.PageStatistics(); st != nil {
		st.IncNulls(int64(nulls))
		st.IncNumValues(int64(n - nulls))
		if err := st.UpdateFromArrow(norm, false); err != nil {
			return err
		}
	}
	var bufs []*memory.Buffer
	if nulls > 0 {
		d.bitmap = grow(d.bitmap, int(bitutil.BytesForBits(int64(n))))
		clear(d.bitmap)
		for i, ok := range valid {
			if ok {
				bitutil.SetBit(d.bitmap, i)
			}
		}
		bufs = []*memory.Buffer{memory.NewBufferBytes(d.bitmap), memory.NewBufferBytes(arrow.Int32Traits.CastToBytes(d.idx))}
	} else {
		bufs = []*memory.Buffer{nil, memory.NewBufferBytes(arrow.Int32Traits.CastToBytes(d.idx))}
	}
	data := array.NewData(arrow.PrimitiveTypes.Int32, n, bufs, nil, nulls, 0)
	indices := array.NewInt32Data(data)
	data.Release()
	defer indices.Release()
	return cw.WriteDictIndices(indices, def, nil)
}
