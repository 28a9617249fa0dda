// Package output writes starmock catalogues: streaming, bounded-memory writers for
// Apache Parquet, Apache Arrow IPC files, FITS binary tables and CSV (in the ECSV
// dialect), each carrying the run manifest; readers that load them back for comparison;
// and partitioned Parquet datasets for sharded runs.
//
// # Data model
//
// A catalogue is a list of Columns (name, unit, description, Kind, nullability, FITS
// string width, Parquet encoding hint) and a stream of Batches: column-major blocks of
// rows held in typed Go slices with optional per-column validity. A producer allocates
// one Batch per worker with NewBatch, refills it after Reset for every chunk, and hands
// it to Writer.Write, which encodes it before returning (the batch can be reused at
// once). Memory is bounded by the batch size times the row width, never by the number of
// stars.
//
// # Formats
//
//	kind     Parquet (physical/logical)   Arrow    FITS TFORM         ECSV datatype
//	Float32  FLOAT                        float32  E                  float32
//	Float64  DOUBLE                       float64  D                  float64
//	Int64    INT64                        int64    K                  int64
//	Int32    INT32                        int32    J                  int32
//	Int8     INT32 / INT(8,signed)        int8     I (int16, widened) int8
//	Bool     BOOLEAN                      bool     L                  bool
//	String   BYTE_ARRAY / STRING          utf8     nA (n = MaxLen)    string
//
// Nulls: Parquet and Arrow store validity exactly. FITS uses NaN for floats, TNULLn
// (the most negative value of the stored type) for integers, byte 0 for logicals and an
// empty string for strings (FITS Standard 4.0 §7.3.3.1); a valid integer equal to the
// TNULL value is refused with an error. ECSV writes an empty field.
//
// Parquet: one row group per Write of at least Options.RowGroupRows rows (default
// 65536), smaller batches merged into row groups of at most that size (a detected-only
// filter must not leave thousands of tiny row groups); snappy pages by default (zstd or none on request);
// plain encoding for numbers and booleans, dictionary encoding only for String columns
// and columns marked EncodingDictionary (dictionary-encoding random floats costs several
// times the write time for no gain, BenchmarkParquetDictionary); min/max statistics on
// every column except Bool; 1 MiB data pages; the Arrow schema (with the unit and
// description field metadata) stored under "ARROW:schema" so Arrow-aware readers recover
// units; the manifest JSON in the footer key/value metadata under "starmock.manifest",
// written at Close with the final counts. With Options.Parallelism > 1 (the default is
// the number of CPUs) the column chunks of a row group are encoded by that many
// goroutines into separate in-memory page buffers and flushed in column order; with 1
// they stream straight to the file. Both give the same bytes (TestDeterministic).
// String columns are dictionary-encoded through a reused Go map and arrow-go's
// dictionary-index path, because arrow-go's own string dictionary encoder allocates once
// per value.
//
// Arrow IPC: the file format (ipc.NewFileWriter), uncompressed so it can be
// memory-mapped; units in field metadata "unit"/"description"; the manifest as
// schema-level metadata "starmock.manifest" (as known at Create).
//
// FITS: an empty primary HDU with ORIGIN, CREATOR, SYNTHETC = T (SYNTHETIC cut to the
// 8-character keyword limit), SEED, SHARDIDX, SHARDCNT; HDU 1 the BINTABLE "CATALOG"
// with TTYPEn, TFORMn, TUNITn, TNULLn, TCOMMn (TCOMM is the column description keyword
// of the FITS keyword dictionary; long descriptions use CONTINUE cards, LONGSTRN =
// 'OGIP 1.0', with ' written as " because astropy 5.2 garbles continued strings that
// contain doubled quotes); HDU 2 an IMAGE
// extension "MANIFEST" whose 8-bit data is the manifest JSON, written at Close. Rows
// are streamed and NAXIS2 is patched at Close. Strings are NUL-padded; trailing blanks
// are not significant.
//
// CSV: ECSV 1.0, which astropy reads with types and units
// (Table.read(path, format="ascii.ecsv")) and every CSV reader that skips "#" lines
// reads as plain CSV. The YAML header holds the column list (name, unit, datatype,
// description) and meta: tool, tool_version, synthetic, seed and the manifest JSON
// under "starmock.manifest" (as known at Create). Floats are printed as the shortest
// decimal that parses back to the same binary value, so the text round-trips exactly.
//
// # Files, atomicity and manifests
//
// Every writer writes `.<name>.tmp-XXXX` in the destination folder and renames it on
// Close; Abort, a failed Close or a write error leaves nothing under the final name. An
// unwritable folder is reported by Create. Close also writes the sidecar manifest
// `<path>.manifest.json` (final row count; optionally a UTC time stamp via Options.Now).
// Nothing inside a data file depends on the clock, so the same batches give
// byte-identical files in every format (TestDeterministic).
//
// # Datasets
//
// For sharded or multi-process runs, CreatePart writes `part-00000.parquet`, … into one
// folder with sidecars named `_part-00000.parquet.manifest.json`: readers of Parquet
// datasets (pyarrow.dataset, DuckDB's read_parquet('dir/*.parquet')) skip names starting
// with "_" or ".", so they see the parts as one table. ReadDataset reads them back in
// part order.
//
// # Performance
//
// Measured with the benchmarks in bench_test.go on the 2-core development machine (AMD
// EPYC, shared with other jobs at load average 4-7, so wall-clock rates vary up to 2x;
// CPU time per row is steadier), 262144 rows per file in 65536-row batches, local disk,
// fsync at Close:
//
//	schema                         Parquet(snappy)   Arrow IPC        FITS             CSV (ECSV)
//	10 float32 columns  rows/s     3.6-7.1 M         7.5-10.5 M       7.4-10.5 M       0.9 M
//	                    CPU ns/row 180               91               62               850
//	5-band catalogue    rows/s     0.29-0.90 M       1.4-2.3 M        1.2 M            0.11-0.20 M
//	(60 columns, 45     CPU ns/row 1150-1750         300-500          620-660          4650
//	nullable)           bytes/row  193               252-260          279              556
//
// Parquet codecs on the 5-band schema of random values: none 191 bytes/row, snappy 193
// (random values do not compress), zstd 174 at ~1.5x the CPU of snappy. Dictionary
// encoding forced on 32 random float64 columns: 7.5x slower (73k vs 548k rows/s) and 25%
// larger (320 vs 256 bytes/row) - hence plain encoding for floats. The I/O floor
// (scripts/bench_io.sh: WriteRandomFloor, 2e6 rows of the 5-band schema, snappy):
// 0.32-0.36 M rows/s wall, 1.9-2.1 us CPU per row, 193 bytes/row, peak resident memory
// 186 MB; with zstd 0.14 M rows/s.
//
// # References
//
//   - Apache Parquet format specification, https://parquet.apache.org/docs/file-format/
//     (row groups, column chunks, definition levels, dictionary and plain encodings).
//   - Apache Arrow columnar format and IPC file format,
//     https://arrow.apache.org/docs/format/Columnar.html.
//   - Pence, W. D., Chiappetti, L., Page, C. G., Shaw, R. A., Stobie, E. 2010, "Definition
//     of the Flexible Image Transport System (FITS), version 3.0", A&A 524, A42,
//     doi:10.1051/0004-6361/201015362; FITS Standard 4.0 (IAU FITS Working Group, 2018).
//   - Greisen, E. W., et al. 2006 / IAU 2015 recommended units for FITS (TUNIT strings
//     such as "solMass", "solLum", "solRad", "mag", "pc", "yr").
//   - Aldcroft, T., et al., "Enhanced Character Separated Values table format (ECSV)",
//     astropy APE 6 (2013, ECSV 1.0 2021), https://github.com/astropy/astropy-APEs.
//
// # Incomplete
//
// Arrow IPC and ECSV headers carry the manifest as it was at Create (row and detection
// counts updated later appear only in the sidecar, the Parquet footer and the FITS
// MANIFEST extension). Partitioned datasets were checked with this package's reader
// only: pyarrow and DuckDB are not installed on the development machine. CreatePart
// does not remove parts left by an earlier run with more shards; the caller owns the
// folder. The CSV writer formats about 1e5 rows per second for 60 columns, an order of
// magnitude below Parquet; use Parquet or Arrow for large runs.
package output
