package output

import (
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"syscall"
	"testing"
	"time"
)

// benchWrite writes rows rows of the batch (cycled) to a fresh file per iteration and
// reports bytes (in-memory row size), rows/s and allocations.
func benchWrite(b *testing.B, f Format, cols []Column, batch *Batch, rows int, opts Options) {
	b.Helper()
	dir := b.TempDir()
	b.SetBytes(RowBytes(cols) * int64(rows))
	b.ReportAllocs()
	b.ResetTimer()
	cpu0 := cpuTime()
	for i := 0; i < b.N; i++ {
		path := filepath.Join(dir, "bench"+f.Extension())
		w, err := CreateWithOptions(f, path, cols, nil, opts)
		if err != nil {
			b.Fatal(err)
		}
		for done := 0; done < rows; done += batch.N {
			if err := w.Write(batch); err != nil {
				b.Fatal(err)
			}
		}
		if err := w.Close(); err != nil {
			b.Fatal(err)
		}
	}
	b.StopTimer()
	reportCPU(b, cpu0, rows)
	b.ReportMetric(float64(rows)*float64(b.N)/b.Elapsed().Seconds(), "rows/s")
	if st, err := os.Stat(filepath.Join(dir, "bench"+f.Extension())); err == nil {
		b.ReportMetric(float64(st.Size())/float64(rows), "file-B/row")
	}
}

// BenchmarkWrite: every format, the 5-band representative schema (60 columns) and a
// 10-column float32 schema, 4 batches of 65536 rows per file.
func BenchmarkWrite(b *testing.B) {
	const batchRows, rows = 1 << 16, 1 << 18
	schemas := map[string][]Column{"cat5band": CatalogueColumns(5), "f32x10": floatColumns(10, Float32)}
	for _, name := range []string{"f32x10", "cat5band"} {
		cols := schemas[name]
		batch := RandomBatch(cols, batchRows, rand.New(rand.NewPCG(1, 2)))
		for _, f := range allFormats {
			b.Run(fmt.Sprintf("%s/%s", f, name), func(b *testing.B) {
				benchWrite(b, f, cols, batch, rows, Options{})
			})
		}
	}
}

func floatColumns(n int, k Kind) []Column {
	cols := make([]Column, n)
	for i := range cols {
		cols[i] = Column{Name: "c" + strconv.Itoa(i), Kind: k, Unit: "mag"}
	}
	return cols
}

// BenchmarkParquetDictionary reproduces the issue-5 measurement: random float64 columns
// (32 here) with dictionary encoding forced on every column versus plain (the Auto
// default for floats).
func BenchmarkParquetDictionary(b *testing.B) {
	const batchRows, rows = 1 << 16, 1 << 18
	for _, enc := range []Encoding{EncodingAuto, EncodingDictionary} {
		cols := floatColumns(32, Float64)
		for i := range cols {
			cols[i].Encoding = enc
		}
		batch := RandomBatch(cols, batchRows, rand.New(rand.NewPCG(1, 2)))
		name := map[Encoding]string{EncodingAuto: "plain", EncodingDictionary: "dictionary"}[enc]
		b.Run(name, func(b *testing.B) { benchWrite(b, Parquet, cols, batch, rows, Options{}) })
	}
}

// BenchmarkParquetCompression compares the codecs on the representative schema.
func BenchmarkParquetCompression(b *testing.B) {
	const batchRows, rows = 1 << 16, 1 << 18
	cols := CatalogueColumns(5)
	batch := RandomBatch(cols, batchRows, rand.New(rand.NewPCG(1, 2)))
	for _, c := range []Compression{Uncompressed, Snappy, Zstd} {
		b.Run(string(c), func(b *testing.B) { benchWrite(b, Parquet, cols, batch, rows, Options{Compression: c}) })
	}
}

// BenchmarkParquetParallelism compares 1 and 2 (and 4) column-encoding goroutines.
func BenchmarkParquetParallelism(b *testing.B) {
	const batchRows, rows = 1 << 16, 1 << 18
	cols := CatalogueColumns(5)
	batch := RandomBatch(cols, batchRows, rand.New(rand.NewPCG(1, 2)))
	for _, p := range []int{1, 2, 4} {
		b.Run("goroutines="+strconv.Itoa(p), func(b *testing.B) {
			benchWrite(b, Parquet, cols, batch, rows, Options{Parallelism: p})
		})
	}
}

// BenchmarkIOFloor times WriteRandomFloor: by default 2,000,000 rows of the 5-band
// representative schema (60 columns) in 65536-row batches, snappy Parquet. Environment
// STARMOCK_FLOOR_ROWS, STARMOCK_FLOOR_BANDS, STARMOCK_FLOOR_CODEC override (used by
// scripts/bench_io.sh). Run with -benchtime=1x for one timed file.
func BenchmarkIOFloor(b *testing.B) {
	rows := envInt("STARMOCK_FLOOR_ROWS", 2_000_000)
	bands := envInt("STARMOCK_FLOOR_BANDS", 5)
	codec := Compression(os.Getenv("STARMOCK_FLOOR_CODEC"))
	cols := CatalogueColumns(bands)
	dir := b.TempDir()
	b.SetBytes(RowBytes(cols) * int64(rows))
	b.ReportAllocs()
	var size int64
	start := time.Now()
	cpu0 := cpuTime()
	for i := 0; i < b.N; i++ {
		var err error
		size, err = WriteRandomFloor(Parquet, filepath.Join(dir, "floor.parquet"), cols, rows, 1<<16, 1, Options{Compression: codec})
		if err != nil {
			b.Fatal(err)
		}
	}
	el := time.Since(start).Seconds()
	reportCPU(b, cpu0, rows)
	b.ReportMetric(float64(rows)*float64(b.N)/el, "rows/s")
	b.ReportMetric(float64(len(cols)), "columns")
	b.ReportMetric(float64(size)/float64(rows), "file-B/row")
}

func envInt(key string, def int) int {
	if v := os.Getenv(key); v != "" {
		if n, err := strconv.Atoi(v); err == nil && n > 0 {
			return n
		}
	}
	return def
}

// cpuTime returns the process's user+system CPU time. On a shared 2-core machine the
// CPU time per row is a steadier figure than wall time, which other processes inflate.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

func reportCPU(b *testing.B, cpu0 time.Duration, rows int) {
	b.ReportMetric(float64(cpuTime()-cpu0)/float64(rows)/float64(b.N), "cpu-ns/row")
}
