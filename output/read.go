package output

import (
	"bufio"
	"context"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"github.com/apache/arrow-go/v18/arrow"
	"github.com/apache/arrow-go/v18/arrow/array"
	"github.com/apache/arrow-go/v18/arrow/ipc"
	"github.com/apache/arrow-go/v18/arrow/memory"
	"github.com/apache/arrow-go/v18/parquet"
	"github.com/apache/arrow-go/v18/parquet/file"
	"github.com/apache/arrow-go/v18/parquet/pqarrow"
	"go.yaml.in/yaml/v3"
)

// Table is a whole catalogue read back into memory: its columns (names, kinds, units,
// descriptions, nullability as recorded in the file), the manifest embedded in the file
// (nil if there is none), and all rows in one Batch.
type Table struct {
	Columns  []Column
	Manifest *Manifest
	Batch    *Batch
}

// ReadFile reads a catalogue written by this package (or any file of the same layout)
// entirely into memory, for comparisons, tests and small catalogues; memory grows with
// the row count. mem is the Arrow allocator used for Parquet and Arrow IPC (nil means
// memory.DefaultAllocator); everything it allocates is released before ReadFile
// returns. Parquet and Arrow IPC are read with the arrow-go readers, FITS with the
// binary-table parser of this package (github.com/astrogo/fitsio v0.3.0 misreads FITS
// logicals 'F' as true and expects a leading NUL in strings, so the tests use it only to
// cross-check headers and numeric columns), CSV with the ECSV header parser of this
// package and encoding/csv.
//
// Nulls: Parquet and Arrow carry them exactly. FITS: NaN in a nullable float column,
// TNULL in an integer column, byte 0 in a logical column and an empty string in a
// nullable string column read as null. ECSV: an empty field in a nullable column reads
// as null.
func ReadFile(format Format, path string, mem memory.Allocator) (*Table, error) {
	if mem == nil {
		mem = memory.DefaultAllocator
	}
	var t *Table
	var err error
	switch format {
	case Parquet:
		t, err = readParquet(path, mem)
	case Arrow:
		t, err = readIPC(path, mem)
	case FITS:
		t, err = readFITS(path)
	case CSV:
		t, err = readECSV(path)
	default:
		return nil, fmt.Errorf("output: invalid format %d (allowed: parquet, arrow, fits, csv)", uint8(format))
	}
	if err != nil {
		return nil, fmt.Errorf("output: reading %s file %q: %w", format, path, err)
	}
	return t, nil
}

// columnsFromArrow maps an Arrow schema back to columns.
func columnsFromArrow(s *arrow.Schema) ([]Column, error) {
	cols := make([]Column, s.NumFields())
	for i, f := range s.Fields() {
		var k Kind
		switch f.Type.ID() {
		case arrow.FLOAT32:
			k = Float32
		case arrow.FLOAT64:
			k = Float64
		case arrow.INT64:
			k = Int64
		case arrow.INT32:
			k = Int32
		case arrow.INT8:
			k = Int8
		case arrow.BOOL:
			k = Bool
		case arrow.STRING:
			k = String
		default:
			return nil, fmt.Errorf("column %q has unsupported Arrow type %s", f.Name, f.Type)
		}
		c := Column{Name: f.Name, Kind: k, Nullable: f.Nullable}
		if v, ok := f.Metadata.GetValue(MetaUnit); ok {
			c.Unit = v
		}
		if v, ok := f.Metadata.GetValue(MetaDescription); ok {
			c.Description = v
		}
		cols[i] = c
	}
	return cols, nil
}

// appendArrow appends the values of arrow array a to column c of batch t.
func appendArrow(b *Batch, c int, a arrow.Array) {
	n := a.Len()
	valid := make([]bool, n)
	for i := range valid {
		valid[i] = a.IsValid(i)
	}
	switch v := a.(type) {
	case *array.Float32:
		b.Cols[c] = append(b.Cols[c].([]float32), v.Float32Values()...)
	case *array.Float64:
		b.Cols[c] = append(b.Cols[c].([]float64), v.Float64Values()...)
	case *array.Int64:
		b.Cols[c] = append(b.Cols[c].([]int64), v.Int64Values()...)
	case *array.Int32:
		b.Cols[c] = append(b.Cols[c].([]int32), v.Int32Values()...)
	case *array.Int8:
		b.Cols[c] = append(b.Cols[c].([]int8), v.Int8Values()...)
	case *array.Boolean:
		s := b.Cols[c].([]bool)
		for i := range n {
			s = append(s, v.Value(i))
		}
		b.Cols[c] = s
	case *array.String:
		s := b.Cols[c].([]string)
		for i := range n {
			s = append(s, strings.Clone(v.Value(i))) // the Arrow buffer is released later
		}
		b.Cols[c] = s
	}
	b.Valid[c] = append(b.Valid[c], valid...)
}

// finishBatch sets N and drops all-true validity slices of non-nullable columns.
func finishBatch(b *Batch, cols []Column) {
	b.N = b.Cap()
	for i, c := range cols {
		if !c.Nullable {
			b.Valid[i] = nil
		}
	}
}

func readParquet(path string, mem memory.Allocator) (*Table, error) {
	props := parquet.NewReaderProperties(mem)
	rdr, err := file.OpenParquetFile(path, false, file.WithReadProps(props))
	if err != nil {
		return nil, err
	}
	defer rdr.Close()
	t := &Table{}
	if v := rdr.MetaData().KeyValueMetadata().FindValue(ManifestKey); v != nil {
		if t.Manifest, err = decodeManifest([]byte(*v), path); err != nil {
			return nil, err
		}
	}
	fr, err := pqarrow.NewFileReader(rdr, pqarrow.ArrowReadProperties{BatchSize: 1 << 16}, mem)
	if err != nil {
		return nil, err
	}
	tbl, err := fr.ReadTable(context.Background())
	if err != nil {
		return nil, err
	}
	defer tbl.Release()
	if t.Columns, err = columnsFromArrow(tbl.Schema()); err != nil {
		return nil, err
	}
	t.Batch = NewBatch(t.Columns, 0)
	for c := range t.Columns {
		for _, chunk := range tbl.Column(c).Data().Chunks() {
			appendArrow(t.Batch, c, chunk)
		}
	}
	finishBatch(t.Batch, t.Columns)
	return t, nil
}

func readIPC(path string, mem memory.Allocator) (*Table, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	r, err := ipc.NewFileReader(f, ipc.WithAllocator(mem))
	if err != nil {
		return nil, err
	}
	defer r.Close()
	t := &Table{}
	if v, ok := r.Schema().Metadata().GetValue(ManifestKey); ok {
		if t.Manifest, err = decodeManifest([]byte(v), path); err != nil {
			return nil, err
		}
	}
	if t.Columns, err = columnsFromArrow(r.Schema()); err != nil {
		return nil, err
	}
	t.Batch = NewBatch(t.Columns, 0)
	for i := 0; i < r.NumRecords(); i++ {
		rec, err := r.RecordBatchAt(i)
		if err != nil {
			return nil, err
		}
		for c := range t.Columns {
			appendArrow(t.Batch, c, rec.Column(c))
		}
		rec.Release()
	}
	finishBatch(t.Batch, t.Columns)
	return t, nil
}

func readECSV(path string) (*Table, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	br := bufio.NewReaderSize(f, 1<<20)
	var yml strings.Builder
	line := 0
	for {
		l, err := br.ReadString('\n')
		line++
		if err != nil {
			return nil, fmt.Errorf("line %d: header ends before the column names: %v", line, err)
		}
		if line == 1 {
			if !strings.HasPrefix(l, "# %ECSV ") {
				return nil, fmt.Errorf("line 1: %q is not an ECSV signature (want \"# %%ECSV 1.0\")", strings.TrimSpace(l))
			}
			continue
		}
		if line == 2 {
			if strings.TrimSpace(l) != "# ---" {
				return nil, fmt.Errorf("line 2: %q is not \"# ---\"", strings.TrimSpace(l))
			}
			continue
		}
		if !strings.HasPrefix(l, "#") {
			// The column-name line; hand it back to the CSV reader by re-prepending.
			br = bufio.NewReader(io.MultiReader(strings.NewReader(l), br))
			break
		}
		l = strings.TrimPrefix(l, "#")
		l = strings.TrimPrefix(l, " ")
		yml.WriteString(l)
	}
	var h ecsvHeader
	if err := yaml.Unmarshal([]byte(yml.String()), &h); err != nil {
		return nil, fmt.Errorf("ecsv header: %w", err)
	}
	t := &Table{}
	if h.Meta.Manifest != "" {
		if t.Manifest, err = decodeManifest([]byte(h.Meta.Manifest), path); err != nil {
			return nil, err
		}
	}
	nullable := map[string]bool{}
	if t.Manifest != nil {
		for _, c := range t.Manifest.Columns {
			nullable[c.Name] = c.Nullable
		}
	}
	t.Columns = make([]Column, len(h.Datatype))
	for i, d := range h.Datatype {
		k, err := ParseKind(d.Datatype)
		if err != nil {
			return nil, fmt.Errorf("ecsv header column %q: %w", d.Name, err)
		}
		t.Columns[i] = Column{Name: d.Name, Unit: d.Unit, Description: d.Description, Kind: k, Nullable: nullable[d.Name]}
	}
	delim := ','
	if h.Delimiter == " " {
		delim = ' '
	}
	cr := csv.NewReader(br)
	cr.Comma = delim
	cr.FieldsPerRecord = len(t.Columns)
	cr.ReuseRecord = true
	names, err := cr.Read()
	if err != nil {
		return nil, fmt.Errorf("line %d: column names: %w", line, err)
	}
	for i, n := range names {
		if n != t.Columns[i].Name {
			return nil, fmt.Errorf("line %d: column %d is %q, header says %q", line, i+1, n, t.Columns[i].Name)
		}
	}
	b := NewBatch(t.Columns, 0)
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		line++
		if err != nil {
			return nil, err
		}
		for c, s := range rec {
			col := t.Columns[c]
			null := s == "" && col.Nullable
			b.Valid[c] = append(b.Valid[c], !null)
			if err := appendText(b, c, col, s, null); err != nil {
				return nil, fmt.Errorf("line %d: %w", line, err)
			}
		}
	}
	finishBatch(b, t.Columns)
	t.Batch = b
	return t, nil
}

// appendText parses one ECSV field into column c.
func appendText(b *Batch, c int, col Column, s string, null bool) error {
	bad := func(err error) error {
		return fmt.Errorf("column %q: cannot parse %q as %s: %v", col.Name, s, col.Kind, err)
	}
	switch col.Kind {
	case Float32, Float64:
		v := 0.0
		if !null {
			var err error
			bits := 64
			if col.Kind == Float32 {
				bits = 32
			}
			if v, err = strconv.ParseFloat(s, bits); err != nil {
				return bad(err)
			}
		}
		if col.Kind == Float32 {
			b.Cols[c] = append(b.Cols[c].([]float32), float32(v))
		} else {
			b.Cols[c] = append(b.Cols[c].([]float64), v)
		}
	case Int64, Int32, Int8:
		var v int64
		if !null {
			bits := map[Kind]int{Int64: 64, Int32: 32, Int8: 8}[col.Kind]
			var err error
			if v, err = strconv.ParseInt(s, 10, bits); err != nil {
				return bad(err)
			}
		}
		switch col.Kind {
		case Int64:
			b.Cols[c] = append(b.Cols[c].([]int64), v)
		case Int32:
			b.Cols[c] = append(b.Cols[c].([]int32), int32(v))
		default:
			b.Cols[c] = append(b.Cols[c].([]int8), int8(v))
		}
	case Bool:
		v := false
		if !null {
			switch s {
			case "True", "true", "1":
				v = true
			case "False", "false", "0":
			default:
				return bad(errors.New("want True or False"))
			}
		}
		b.Cols[c] = append(b.Cols[c].([]bool), v)
	case String:
		b.Cols[c] = append(b.Cols[c].([]string), s)
	}
	return nil
}
