package output

import (
	"bufio"
	crand "crypto/rand"
	"encoding/hex"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"time"

	"github.com/apache/arrow-go/v18/arrow/memory"
)

// Format is an output file format.
type Format uint8

// Output formats.
const (
	// Parquet: compressed columnar file (Apache Parquet), one row group per batch.
	Parquet Format = iota + 1
	// Arrow: Apache Arrow IPC file format ("Feather v2"), one record batch per batch.
	Arrow
	// FITS: FITS binary table (BINTABLE) extension after an empty primary HDU, with the
	// manifest JSON in a trailing IMAGE extension named MANIFEST.
	FITS
	// CSV: comma-separated values in the ECSV 1.0 dialect (a YAML header in "# " comment
	// lines carrying types, units, descriptions and the manifest, then a plain CSV body).
	CSV
)

var formatNames = [...]string{Parquet: "parquet", Arrow: "arrow", FITS: "fits", CSV: "csv"}
var formatExts = [...]string{Parquet: ".parquet", Arrow: ".arrow", FITS: ".fits", CSV: ".csv"}

// String returns the format's name: "parquet", "arrow", "fits" or "csv".
func (f Format) String() string {
	if f >= Parquet && f <= CSV {
		return formatNames[f]
	}
	return fmt.Sprintf("format(%d)", uint8(f))
}

// Extension returns the usual file extension with its dot (".parquet", ".arrow",
// ".fits", ".csv").
func (f Format) Extension() string {
	if f >= Parquet && f <= CSV {
		return formatExts[f]
	}
	return ""
}

// ParseFormat parses a format name. It accepts the names printed by String plus the
// aliases "ipc", "feather" (Arrow), "ecsv" (CSV) and "fit" (FITS), case-insensitively.
func ParseFormat(name string) (Format, error) {
	switch strings.ToLower(name) {
	case "parquet", "pq":
		return Parquet, nil
	case "arrow", "ipc", "feather":
		return Arrow, nil
	case "fits", "fit":
		return FITS, nil
	case "csv", "ecsv":
		return CSV, nil
	}
	return 0, fmt.Errorf("output: unknown format %q (allowed: parquet, arrow, fits, csv)", name)
}

// Compression is a Parquet page compression codec.
type Compression string

// Parquet codecs. Snappy is the default: on random float data (the worst case, nothing
// to compress) it costs little over no compression, while zstd trades write speed for
// ~5-30% smaller files on real catalogues (see BenchmarkParquetCompression and the
// numbers in doc.go).
const (
	Snappy        Compression = "snappy"
	Zstd          Compression = "zstd"
	Uncompressed  Compression = "none"
	defaultCodec              = Snappy
	defaultBufLen             = 1 << 20
)

// DefaultRowGroupRows is the default Parquet row-group target: 65536 rows, the
// pipeline's default chunk, about 12 MB of a 60-column catalogue.
const DefaultRowGroupRows = 1 << 16

// Options tunes a writer; the zero value gives the documented defaults.
type Options struct {
	// Compression is the Parquet codec (default Snappy). Ignored by other formats.
	Compression Compression
	// RowGroupRows is the Parquet row-group target (default DefaultRowGroupRows). A
	// batch with at least this many rows becomes one row group; smaller batches (e.g.
	// after a detected-only filter) are copied and merged into row groups of at most
	// RowGroupRows rows, never splitting a batch. 1 gives one row group per Write.
	// Memory grows by one buffer of RowGroupRows rows.
	RowGroupRows int
	// Parallelism is the number of goroutines that encode the columns of one Parquet row
	// group concurrently (default runtime.GOMAXPROCS(0)). The bytes written do not depend
	// on it.
	Parallelism int
	// Sidecar is the sidecar manifest path; "" means SidecarPath(path), "-" means none.
	Sidecar string
	// Now, if set, stamps the sidecar manifest (never the data file) with Now().UTC().
	Now func() time.Time
	// Allocator is the Arrow allocator of the Parquet and Arrow IPC writers; nil means
	// memory.DefaultAllocator. It must be safe for concurrent use (the Parquet columns
	// are encoded in parallel); all arrow allocators are.
	Allocator memory.Allocator
}

// Writer streams batches to one file. Write may be called any number of times (each
// call becomes one Arrow record batch, one block of FITS or CSV rows, one Parquet row
// group or part of one, see Options.RowGroupRows); the batch is encoded before Write
// returns and may be reused at once. Close finalises the file,
// renames it to its final name and writes the sidecar; Abort removes everything. After
// the first error every later Write returns it; Close after an error removes the
// temporary file and returns the error. Close and Abort are idempotent. A Writer is not
// safe for concurrent use: funnel batches to one goroutine (see DESIGN.md).
type Writer interface {
	Write(b *Batch) error
	Close() error
	Abort() error
}

// ErrClosed is returned by Write after Close or Abort.
var ErrClosed = errors.New("output: writer is closed")

// Create opens a streaming writer for format at path with default Options. See
// CreateWithOptions.
func Create(format Format, path string, cols []Column, meta *Manifest) (Writer, error) {
	return CreateWithOptions(format, path, cols, meta, Options{})
}

// CreateWithOptions opens a streaming writer. The file is written as
// `.<name>.tmp-XXXX` in the folder of path and renamed to path by Close; on any failure
// nothing is left under path. An unwritable folder, a path that is a folder, an invalid
// schema or invalid options give an error here, before any row is produced. meta may be
// nil; the writer never modifies *meta but reads it again at Close (see Manifest).
func CreateWithOptions(format Format, path string, cols []Column, meta *Manifest, opts Options) (Writer, error) {
	if err := ValidateColumns(cols); err != nil {
		return nil, err
	}
	if format < Parquet || format > CSV {
		return nil, fmt.Errorf("output: invalid format %d (allowed: parquet, arrow, fits, csv)", uint8(format))
	}
	switch opts.Compression {
	case "":
		opts.Compression = defaultCodec
	case Snappy, Zstd, Uncompressed:
	default:
		return nil, fmt.Errorf("output: unknown compression %q (allowed: snappy, zstd, none)", opts.Compression)
	}
	if opts.Parallelism < 0 {
		return nil, fmt.Errorf("output: parallelism %d outside 0..%d (0 = number of CPUs)", opts.Parallelism, 1024)
	}
	if opts.RowGroupRows < 0 || opts.RowGroupRows > 1<<24 {
		return nil, fmt.Errorf("output: row group size %d rows outside 0..%d (0 = %d)", opts.RowGroupRows, 1<<24, DefaultRowGroupRows)
	}
	if opts.RowGroupRows == 0 {
		opts.RowGroupRows = DefaultRowGroupRows
	}
	if opts.Parallelism == 0 {
		opts.Parallelism = runtime.GOMAXPROCS(0)
	}
	if opts.Allocator == nil {
		opts.Allocator = memory.DefaultAllocator
	}
	if st, err := os.Stat(path); err == nil && st.IsDir() {
		return nil, fmt.Errorf("output: cannot create %q: it is a folder", path)
	}
	af, err := createAtomic(path)
	if err != nil {
		return nil, err
	}
	cols = append([]Column(nil), cols...)
	base := &base{file: af, format: format, cols: cols, meta: meta, opts: opts}
	var w Writer
	switch format {
	case Parquet:
		w, err = newParquetWriter(base)
	case Arrow:
		w, err = newIPCWriter(base)
	case FITS:
		w, err = newFITSWriter(base)
	case CSV:
		w, err = newECSVWriter(base)
	}
	if err != nil {
		af.abort()
		return nil, err
	}
	return w, nil
}

// atomicFile is a temporary file renamed to its final name on commit.
type atomicFile struct {
	f     *os.File
	buf   *bufio.Writer
	final string
	tmp   string
}

func createAtomic(path string) (*atomicFile, error) {
	dir, name := filepath.Split(path)
	if name == "" {
		return nil, fmt.Errorf("output: cannot create %q: empty file name", path)
	}
	if dir == "" {
		dir = "."
	}
	f, err := createTemp(dir, name)
	if err != nil {
		return nil, fmt.Errorf("output: cannot create %q: %w", path, err)
	}
	return &atomicFile{f: f, buf: bufio.NewWriterSize(f, defaultBufLen), final: path, tmp: f.Name()}, nil
}

// createTemp creates `<dir>/.<name>.tmp-XXXXXXXX` exclusively with mode 0666 minus the
// umask, so the renamed file gets the same permissions as any file the user creates
// (os.CreateTemp would give 0600). The suffix comes from crypto/rand: it only has to be
// unique, and draws no simulation randomness.
func createTemp(dir, name string) (*os.File, error) {
	var err error
	for range 100 {
		var sfx [4]byte
		if _, err = crand.Read(sfx[:]); err != nil {
			return nil, err
		}
		p := filepath.Join(dir, "."+name+".tmp-"+hex.EncodeToString(sfx[:]))
		var f *os.File
		f, err = os.OpenFile(p, os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o666)
		if err == nil {
			return f, nil
		}
		if !errors.Is(err, os.ErrExist) {
			return nil, err
		}
	}
	return nil, err
}

// finish flushes and closes the temporary file (without renaming).
func (a *atomicFile) finish() error {
	err := a.buf.Flush()
	if err == nil {
		err = a.f.Sync()
	}
	if cerr := a.f.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		return fmt.Errorf("output: cannot write %q: %w", a.final, err)
	}
	return nil
}

func (a *atomicFile) abort() error {
	a.f.Close()
	if err := os.Remove(a.tmp); err != nil && !errors.Is(err, os.ErrNotExist) {
		return fmt.Errorf("output: cannot remove temporary file %q: %w", a.tmp, err)
	}
	return nil
}

// base holds what every format writer shares: the temporary file, the schema, the
// manifest, the sticky error and the row count.
type base struct {
	file   *atomicFile
	format Format
	cols   []Column
	meta   *Manifest
	opts   Options
	rows   int64
	err    error
	closed bool
}

// check validates a batch before a format writes it.
func (b *base) check(batch *Batch) error {
	if b.closed {
		return ErrClosed
	}
	if b.err != nil {
		return b.err
	}
	if err := CheckBatch(b.cols, batch); err != nil {
		return err // a malformed batch is not sticky: the file is still intact
	}
	return nil
}

func (b *base) fail(err error) error {
	if b.err == nil {
		b.err = fmt.Errorf("output: writing %q: %w", b.file.final, err)
	}
	return b.err
}

// headerManifest is the manifest as known at Create, for formats whose header comes
// first.
func (b *base) headerManifest() ([]byte, error) {
	return marshalManifest(prepared(b.meta, b.format, b.cols, 0))
}

// finalManifest is the manifest with the final row count.
func (b *base) finalManifest() Manifest {
	return prepared(b.meta, b.format, b.cols, b.rows)
}

// commit finishes the temporary file, writes the sidecar and renames both into place.
// finalize, if not nil, runs first (writes footers). On any error everything is removed.
func (b *base) commit(finalize func() error) error {
	if b.closed {
		return b.err
	}
	b.closed = true
	if b.err != nil {
		b.file.abort()
		return b.err
	}
	fail := func(err error) error {
		b.file.abort()
		b.err = err
		return err
	}
	if finalize != nil {
		if err := finalize(); err != nil {
			return fail(fmt.Errorf("output: finishing %q: %w", b.file.final, err))
		}
	}
	if err := b.file.finish(); err != nil {
		return fail(err)
	}
	var side []byte
	if b.opts.Sidecar != "-" {
		m := b.finalManifest()
		if b.opts.Now != nil {
			m.WrittenAtUTC = b.opts.Now().UTC().Format(time.RFC3339)
		}
		var err error
		if side, err = marshalManifest(m); err != nil {
			return fail(err)
		}
		side = append(side, '\n')
	}
	if err := os.Rename(b.file.tmp, b.file.final); err != nil {
		return fail(fmt.Errorf("output: cannot rename %q to %q: %w", b.file.tmp, b.file.final, err))
	}
	if side != nil {
		sp := b.opts.Sidecar
		if sp == "" {
			sp = SidecarPath(b.file.final)
		}
		if err := writeFileAtomic(sp, side); err != nil {
			os.Remove(b.file.final)
			b.err = err
			return err
		}
	}
	return nil
}

func (b *base) abort() error {
	if b.closed {
		return nil
	}
	b.closed = true
	return b.file.abort()
}
