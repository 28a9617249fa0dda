package output

import (
	"bytes"
	"errors"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/apache/arrow-go/v18/arrow/memory"
	"github.com/starmock/starmock/internal/version"
)

// testColumns covers every kind, nullable and not, with units in the FITS/IAU
// convention.
func testColumns() []Column {
	return []Column{
		{Name: "star_id", Kind: Int64, Description: "unique star index"},
		{Name: "component", Kind: Int32, Description: "population component index", Encoding: EncodingDictionary},
		{Name: "mass_msun", Unit: "solMass", Kind: Float64, Description: "current mass"},
		{Name: "teff_k", Unit: "K", Kind: Float32, Description: "effective temperature"},
		{Name: "stage", Kind: String, MaxLen: 32, Description: "evolutionary stage"},
		{Name: "spectral_type", Kind: String, MaxLen: 8, Nullable: true, Description: "MK spectral type, null outside the table"},
		{Name: "g_mag", Unit: "mag", Kind: Float32, Nullable: true, Description: "observed g magnitude, null if not detected"},
		{Name: "g_flux", Unit: "mJy", Kind: Float64, Nullable: true, Description: "observed g flux in the survey's own 'g' band, null when the star is not detected; a description longer than one FITS card (CONTINUE convention), with quotes ''"},
		{Name: "binary", Kind: Bool, Description: "unresolved binary"},
		{Name: "g_detected", Kind: Bool, Nullable: true, Description: "detected in g"},
		{Name: "quality", Kind: Int8, Nullable: true, Description: "photometry quality code"},
		{Name: "quality8", Kind: Int8, Description: "non-null int8"},
		{Name: "count32", Kind: Int32, Nullable: true, Description: "nullable int32"},
		{Name: "count64", Kind: Int64, Nullable: true, Description: "nullable int64"},
	}
}

var stages = []string{"main_sequence", "subgiant", "red_giant_branch", "core_helium_burning", "carbon_oxygen_white_dwarf"}

// fillBatch fills rows [0, n) with seeded pseudo-random values, nulls included, and
// extreme values (±Inf, largest/smallest finite, int extremes except the FITS null).
func fillBatch(b *Batch, n int, start int64, r *rand.Rand) {
	b.Reset(n)
	for i := range n {
		id := start + int64(i)
		b.Cols[0].([]int64)[i] = id
		b.Cols[1].([]int32)[i] = int32(id % 3)
		b.Cols[2].([]float64)[i] = r.ExpFloat64()
		b.Cols[3].([]float32)[i] = float32(3000 + 30000*r.Float64())
		b.Cols[4].([]string)[i] = stages[r.IntN(len(stages))]
		b.Cols[5].([]string)[i] = []string{"G2", "M4.5", "B0", "K0"}[r.IntN(4)]
		b.Cols[6].([]float32)[i] = float32(14 + 10*r.Float64())
		b.Cols[7].([]float64)[i] = r.NormFloat64()
		b.Cols[8].([]bool)[i] = r.IntN(2) == 0
		b.Cols[9].([]bool)[i] = r.IntN(2) == 0
		b.Cols[10].([]int8)[i] = int8(r.IntN(256) - 128)
		b.Cols[11].([]int8)[i] = int8(r.IntN(256) - 128)
		b.Cols[12].([]int32)[i] = int32(r.Int64N(1<<32) - 1<<31 + 1) // never MinInt32
		b.Cols[13].([]int64)[i] = r.Int64() - r.Int64()
		for _, c := range []int{5, 6, 7, 9, 10, 12, 13} {
			if r.IntN(5) == 0 {
				b.SetNull(c, i)
			}
		}
	}
	if n > 3 {
		b.Cols[2].([]float64)[0] = math.MaxFloat64
		b.Cols[2].([]float64)[1] = math.SmallestNonzeroFloat64
		b.Cols[3].([]float32)[0] = float32(math.Inf(1))
		b.Cols[3].([]float32)[1] = math.MaxFloat32
		b.Cols[3].([]float32)[2] = -math.SmallestNonzeroFloat32
		b.Cols[13].([]int64)[0] = math.MaxInt64
		b.Cols[13].([]int64)[1] = math.MinInt64 + 1
		b.Valid[13][0], b.Valid[13][1] = true, true
	}
}

func testManifest() *Manifest {
	return &Manifest{
		ScenarioText:    "seed: 42\ncomponents:\n  - name: 'Cluster A'\n",
		Scenario:        map[string]any{"seed": 42, "components": []any{map[string]any{"name": "Cluster A"}}},
		Seed:            42,
		ComponentStars:  map[string]int64{"Cluster A": 1000},
		TotalStars:      1000,
		DetectedPerBand: map[string]int64{"g": 800, "r": 850},
		ShardIndex:      1,
		ShardCount:      4,
	}
}

var allFormats = []Format{Parquet, Arrow, FITS, CSV}

// writeTestFile writes nb batches of n rows and returns the expected full batch.
func writeTestFile(t *testing.T, f Format, path string, n, nb int, opts Options) *Batch {
	t.Helper()
	cols := testColumns()
	w, err := CreateWithOptions(f, path, cols, testManifest(), opts)
	if err != nil {
		t.Fatalf("create %s: %v", f, err)
	}
	want := NewBatch(cols, n*nb)
	want.Reset(n * nb)
	b := NewBatch(cols, n)
	r := rand.New(rand.NewPCG(7, 7)) // same rows for every format (compared across formats)
	for k := range nb {
		fillBatch(b, n, int64(k*n), r)
		if err := w.Write(b); err != nil {
			t.Fatalf("write %s: %v", f, err)
		}
		appendBatch(want, b, k*n)
	}
	if err := w.Close(); err != nil {
		t.Fatalf("close %s: %v", f, err)
	}
	return want
}

// compareBatches reports every column whose values or nulls differ. Values under nulls
// are not compared. Floats are compared bit for bit except NaN == NaN: every format
// stores binary floats exactly, and ECSV writes the shortest decimal that parses back to
// the same binary value (strconv 'g', -1).
func compareBatches(t *testing.T, what string, cols []Column, got, want *Batch) {
	t.Helper()
	if got.N != want.N {
		t.Errorf("%s: %d rows, want %d", what, got.N, want.N)
		return
	}
	for c, col := range cols {
		bad := 0
		for r := range want.N {
			wv, gv := want.IsValid(c, r), got.IsValid(c, r)
			if wv != gv {
				if bad == 0 {
					t.Errorf("%s: column %q row %d valid=%v, want %v", what, col.Name, r, gv, wv)
				}
				bad++
				continue
			}
			if !wv {
				continue
			}
			var eq bool
			var g, w any
			switch v := want.Cols[c].(type) {
			case []float32:
				x, y := got.Cols[c].([]float32)[r], v[r]
				eq = math.Float32bits(x) == math.Float32bits(y) || (x != x && y != y)
				g, w = x, y
			case []float64:
				x, y := got.Cols[c].([]float64)[r], v[r]
				eq = math.Float64bits(x) == math.Float64bits(y) || (x != x && y != y)
				g, w = x, y
			case []int64:
				g, w = got.Cols[c].([]int64)[r], v[r]
				eq = g == w
			case []int32:
				g, w = got.Cols[c].([]int32)[r], v[r]
				eq = g == w
			case []int8:
				g, w = got.Cols[c].([]int8)[r], v[r]
				eq = g == w
			case []bool:
				g, w = got.Cols[c].([]bool)[r], v[r]
				eq = g == w
			case []string:
				g, w = got.Cols[c].([]string)[r], v[r]
				eq = g == w
			}
			if !eq {
				if bad == 0 {
					t.Errorf("%s: column %q row %d = %v, want %v", what, col.Name, r, g, w)
				}
				bad++
			}
		}
		if bad > 1 {
			t.Errorf("%s: column %q: %d rows differ in all", what, col.Name, bad)
		}
	}
}

func TestRoundTrip(t *testing.T) {
	for _, f := range allFormats {
		t.Run(f.String(), func(t *testing.T) {
			t.Parallel()
			mem := memory.NewCheckedAllocator(memory.NewGoAllocator())
			defer mem.AssertSize(t, 0)
			dir := t.TempDir()
			path := filepath.Join(dir, "cat"+f.Extension())
			want := writeTestFile(t, f, path, 1000, 3, Options{Allocator: mem, Parallelism: 3})
			tab, err := ReadFile(f, path, mem)
			if err != nil {
				t.Fatal(err)
			}
			cols := testColumns()
			if len(tab.Columns) != len(cols) {
				t.Fatalf("%d columns read back, want %d", len(tab.Columns), len(cols))
			}
			for i, c := range cols {
				g := tab.Columns[i]
				if g.Name != c.Name || g.Unit != c.Unit || g.Description != c.Description || g.Kind != c.Kind || g.Nullable != c.Nullable {
					t.Errorf("column %d read back as %+v, want %+v", i, g, c)
				}
			}
			compareBatches(t, f.String(), cols, tab.Batch, want)
			if tab.Manifest == nil {
				t.Fatal("no manifest embedded in the file")
			}
			m := tab.Manifest
			if m.Seed != 42 || m.Synthetic != SyntheticStatement || m.ToolVersion != version.Version || m.Format != f.String() ||
				m.ScenarioText != testManifest().ScenarioText || m.ShardIndex != 1 || m.ShardCount != 4 || len(m.Columns) != len(cols) {
				t.Errorf("embedded manifest %+v", m)
			}
			side, err := ReadManifest(SidecarPath(path))
			if err != nil {
				t.Fatal(err)
			}
			if side.Rows != 3000 || side.DetectedPerBand["g"] != 800 || side.WrittenAtUTC != "" {
				t.Errorf("sidecar rows=%d detected=%v written=%q", side.Rows, side.DetectedPerBand, side.WrittenAtUTC)
			}
			assertOnlyFiles(t, dir, "cat"+f.Extension(), "cat"+f.Extension()+".manifest.json")
		})
	}
}

func assertOnlyFiles(t *testing.T, dir string, names ...string) {
	t.Helper()
	ents, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, e := range ents {
		got = append(got, e.Name())
	}
	if strings.Join(got, " ") != strings.Join(names, " ") {
		t.Errorf("folder holds %q, want %q", got, names)
	}
}

// TestDeterministic checks that the same batches give byte-identical files, and that
// the Parquet bytes do not depend on the number of encoding goroutines.
func TestDeterministic(t *testing.T) {
	for _, f := range allFormats {
		t.Run(f.String(), func(t *testing.T) {
			t.Parallel()
			dir := t.TempDir()
			var files [][]byte
			for i, par := range []int{1, 4, 2} {
				p := filepath.Join(dir, "cat"+string(rune('a'+i))+f.Extension())
				opts := Options{Parallelism: par}
				if i == 2 {
					opts.Now = func() time.Time { return time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC) }
				}
				writeTestFile(t, f, p, 777, 3, opts)
				data, err := os.ReadFile(p)
				if err != nil {
					t.Fatal(err)
				}
				files = append(files, data)
			}
			if !bytes.Equal(files[0], files[1]) || !bytes.Equal(files[0], files[2]) {
				t.Errorf("%s files differ between runs (sizes %d, %d, %d)", f, len(files[0]), len(files[1]), len(files[2]))
			}
			side, err := ReadManifest(filepath.Join(dir, "catc"+f.Extension()+".manifest.json"))
			if err != nil {
				t.Fatal(err)
			}
			if side.WrittenAtUTC != "2026-01-02T03:04:05Z" {
				t.Errorf("sidecar time %q", side.WrittenAtUTC)
			}
		})
	}
}

func TestAbortLeavesNothing(t *testing.T) {
	for _, f := range allFormats {
		t.Run(f.String(), func(t *testing.T) {
			mem := memory.NewCheckedAllocator(memory.NewGoAllocator())
			defer mem.AssertSize(t, 0)
			dir := t.TempDir()
			path := filepath.Join(dir, "cat"+f.Extension())
			cols := testColumns()
			w, err := CreateWithOptions(f, path, cols, nil, Options{Allocator: mem})
			if err != nil {
				t.Fatal(err)
			}
			b := NewBatch(cols, 10)
			fillBatch(b, 10, 0, rand.New(rand.NewPCG(1, 1)))
			if err := w.Write(b); err != nil {
				t.Fatal(err)
			}
			if err := w.Abort(); err != nil {
				t.Fatal(err)
			}
			if err := w.Write(b); !errors.Is(err, ErrClosed) {
				t.Errorf("write after abort: %v, want ErrClosed", err)
			}
			if err := w.Close(); err != nil {
				t.Errorf("close after abort: %v", err)
			}
			assertOnlyFiles(t, dir)
		})
	}
}

func TestCreateErrors(t *testing.T) {
	dir := t.TempDir()
	cols := testColumns()
	cases := []struct {
		name   string
		path   string
		cols   []Column
		opts   Options
		errSub string
	}{
		{"missing folder", filepath.Join(dir, "no", "such", "cat.parquet"), cols, Options{}, "cannot create"},
		{"path is a folder", dir, cols, Options{}, "is a folder"},
		{"no columns", filepath.Join(dir, "a.parquet"), nil, Options{}, "no columns"},
		{"duplicate column", filepath.Join(dir, "a.parquet"), []Column{{Name: "x", Kind: Float32}, {Name: "x", Kind: Int8}}, Options{}, "duplicate"},
		{"bad kind", filepath.Join(dir, "a.parquet"), []Column{{Name: "x"}}, Options{}, "invalid kind"},
		{"comma in name", filepath.Join(dir, "a.parquet"), []Column{{Name: "x,y", Kind: Float32}}, Options{}, "character"},
		{"comment-like name", filepath.Join(dir, "a.parquet"), []Column{{Name: "#x", Kind: Float32}}, Options{}, "starts with"},
		{"bad codec", filepath.Join(dir, "a.parquet"), cols, Options{Compression: "lzma"}, "unknown compression"},
	}
	if os.Getuid() != 0 {
		ro := filepath.Join(dir, "ro")
		os.Mkdir(ro, 0o555)
		cases = append(cases, struct {
			name   string
			path   string
			cols   []Column
			opts   Options
			errSub string
		}{"read-only folder", filepath.Join(ro, "a.parquet"), cols, Options{}, "cannot create"})
	}
	for _, tc := range cases {
		for _, f := range allFormats {
			_, err := CreateWithOptions(f, tc.path, tc.cols, nil, tc.opts)
			if err == nil || !strings.Contains(err.Error(), tc.errSub) {
				t.Errorf("%s/%s: error %v, want one containing %q", tc.name, f, err, tc.errSub)
			}
		}
	}
	long := []Column{{Name: strings.Repeat("x", 69), Kind: Float32}}
	if _, err := Create(FITS, filepath.Join(dir, "l.fits"), long, nil); !errors.Is(err, ErrSchema) {
		t.Errorf("69-character FITS column name: %v", err)
	}
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		if e.Name() != "ro" {
			t.Errorf("failed Create left %q behind", e.Name())
		}
	}
	if _, err := ParseFormat("xls"); err == nil || !strings.Contains(err.Error(), "allowed") {
		t.Errorf("ParseFormat(xls): %v", err)
	}
	for _, name := range []string{"parquet", "arrow", "fits", "csv", "ECSV", "ipc"} {
		if _, err := ParseFormat(name); err != nil {
			t.Errorf("ParseFormat(%q): %v", name, err)
		}
	}
}

// TestBadBatch checks that malformed batches are rejected without spoiling the file.
func TestBadBatch(t *testing.T) {
	cols := []Column{{Name: "a", Kind: Float32}, {Name: "s", Kind: String, MaxLen: 4}, {Name: "n", Kind: Int32, Nullable: true}}
	for _, f := range allFormats {
		t.Run(f.String(), func(t *testing.T) {
			dir := t.TempDir()
			path := filepath.Join(dir, "x"+f.Extension())
			w, err := Create(f, path, cols, nil)
			if err != nil {
				t.Fatal(err)
			}
			bad := []*Batch{
				nil,
				{N: 2, Cols: []any{[]float32{1, 2}, []string{"a", "b"}}},
				{N: 2, Cols: []any{[]float64{1, 2}, []string{"a", "b"}, []int32{1, 2}}},
				{N: 3, Cols: []any{[]float32{1, 2}, []string{"a", "b"}, []int32{1, 2}}},
				{N: 2, Cols: []any{[]float32{1, 2}, []string{"a", "b"}, []int32{1, 2}}, Valid: [][]bool{{true, false}, nil, nil}},
			}
			for i, b := range bad {
				if err := w.Write(b); !errors.Is(err, ErrSchema) {
					t.Errorf("bad batch %d: %v, want ErrSchema", i, err)
				}
			}
			good := &Batch{N: 2, Cols: []any{[]float32{1, 2}, []string{"a", "b"}, []int32{1, 2}}, Valid: [][]bool{nil, nil, {true, false}}}
			if err := w.Write(good); err != nil {
				t.Fatal(err)
			}
			if f == FITS {
				long := &Batch{N: 1, Cols: []any{[]float32{1}, []string{"toolong"}, []int32{1}}}
				if err := w.Write(long); !errors.Is(err, ErrSchema) || !strings.Contains(err.Error(), "MaxLen") {
					t.Errorf("long string: %v", err)
				}
				nullVal := &Batch{N: 1, Cols: []any{[]float32{1}, []string{"x"}, []int32{math.MinInt32}}}
				if err := w.Write(nullVal); !errors.Is(err, ErrSchema) {
					t.Errorf("TNULL value in a valid cell: %v", err)
				}
			}
			if err := w.Close(); err != nil {
				t.Fatal(err)
			}
			tab, err := ReadFile(f, path, nil)
			if err != nil {
				t.Fatal(err)
			}
			compareBatches(t, f.String(), cols, tab.Batch, good)
		})
	}
}

func TestEmptyFile(t *testing.T) {
	for _, f := range allFormats {
		dir := t.TempDir()
		path := filepath.Join(dir, "e"+f.Extension())
		w, err := Create(f, path, testColumns(), nil)
		if err != nil {
			t.Fatal(err)
		}
		if err := w.Write(NewBatch(testColumns(), 0)); err != nil {
			t.Fatal(err)
		}
		if err := w.Close(); err != nil {
			t.Fatal(err)
		}
		tab, err := ReadFile(f, path, nil)
		if err != nil {
			t.Errorf("%s: %v", f, err)
			continue
		}
		if tab.Batch.N != 0 || len(tab.Columns) != len(testColumns()) {
			t.Errorf("%s: %d rows %d columns", f, tab.Batch.N, len(tab.Columns))
		}
	}
}

func TestBatchHelpers(t *testing.T) {
	cols := testColumns()
	b := NewBatch(cols, 5)
	if b.Cap() != 5 || b.N != 0 {
		t.Fatalf("cap %d n %d", b.Cap(), b.N)
	}
	b.Reset(5)
	b.SetNull(6, 2)
	if b.IsValid(6, 2) || !b.IsValid(6, 1) || !b.IsValid(0, 2) {
		t.Error("validity wrong after SetNull")
	}
	b.Reset(3)
	if !b.IsValid(6, 2) || len(b.Float32(3)) != 3 {
		t.Error("Reset did not clear nulls or set N")
	}
	allocs := testing.AllocsPerRun(100, func() { b.Reset(5) })
	if allocs != 0 {
		t.Errorf("Reset allocates %v times", allocs)
	}
	if err := CheckBatch(cols, b); err != nil {
		t.Error(err)
	}
	defer func() {
		if recover() == nil {
			t.Error("Reset beyond capacity did not panic")
		}
	}()
	b.Reset(6)
}

// TestDataset writes three parts (as three shards would) and reads them back as one
// table in part order; sidecars and temporaries must not look like parts.
func TestDataset(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "cat")
	cols := testColumns()
	want := NewBatch(cols, 3*500)
	want.Reset(3 * 500)
	b := NewBatch(cols, 500)
	r := rand.New(rand.NewPCG(3, 3))
	for _, i := range []int{2, 0, 1} { // parts may finish in any order
		m := testManifest()
		m.ShardIndex, m.ShardCount = i, 3
		w, err := CreatePart(Parquet, dir, i, cols, m, Options{})
		if err != nil {
			t.Fatal(err)
		}
		fillBatch(b, 500, int64(i*500), r)
		appendBatch(want, b, i*500)
		if err := w.Write(b); err != nil {
			t.Fatal(err)
		}
		if err := w.Close(); err != nil {
			t.Fatal(err)
		}
	}
	assertOnlyFiles(t, dir, "_part-00000.parquet.manifest.json", "_part-00001.parquet.manifest.json",
		"_part-00002.parquet.manifest.json", "part-00000.parquet", "part-00001.parquet", "part-00002.parquet")
	tab, err := ReadDataset(dir, Parquet, nil)
	if err != nil {
		t.Fatal(err)
	}
	compareBatches(t, "dataset", cols, tab.Batch, want)
	side, err := ReadManifest(PartSidecarPath(dir, Parquet, 2))
	if err != nil {
		t.Fatal(err)
	}
	if side.ShardIndex != 2 || side.ShardCount != 3 || side.Rows != 500 {
		t.Errorf("part 2 sidecar shard %d/%d rows %d", side.ShardIndex, side.ShardCount, side.Rows)
	}
	if _, err := ReadDataset(t.TempDir(), Parquet, nil); err == nil {
		t.Error("empty folder read as a dataset")
	}
}

// TestWriteFailureLeavesNothing simulates a failing disk (the temporary file is closed
// under the writer): the error sticks, Close reports it, and neither the final file nor
// the temporary nor a sidecar is left.
func TestWriteFailureLeavesNothing(t *testing.T) {
	for _, f := range allFormats {
		t.Run(f.String(), func(t *testing.T) {
			dir := t.TempDir()
			path := filepath.Join(dir, "cat"+f.Extension())
			cols := testColumns()
			w, err := Create(f, path, cols, nil)
			if err != nil {
				t.Fatal(err)
			}
			var af *atomicFile
			switch v := w.(type) {
			case *parquetWriter:
				af = v.file
			case *ipcWriter:
				af = v.file
			case *fitsWriter:
				af = v.file
			case *ecsvWriter:
				af = v.file
			}
			af.f.Close()
			b := NewBatch(cols, 5000)
			fillBatch(b, 5000, 0, rand.New(rand.NewPCG(1, 1)))
			var werr error
			for range 20 { // enough bytes to overflow the 1 MiB buffer
				if werr = w.Write(b); werr != nil {
					break
				}
			}
			if werr != nil {
				if err := w.Write(b); err == nil || errors.Is(err, ErrClosed) {
					t.Errorf("error did not stick: %v", err)
				}
			}
			cerr := w.Close()
			if cerr == nil {
				t.Error("Close succeeded after a write error")
			}
			assertOnlyFiles(t, dir)
		})
	}
}

// TestWriteAllocsPerBatch checks that a writer's allocations per Write do not grow with
// the number of rows (no per-star allocation): a 20000-row batch may allocate at most
// 400 more times than a 100-row batch, one per 50 rows - what remains is arrow-go's
// Parquet encoder growing its level and page buffers by doubling (measured: +242 for
// the 14 columns here), while one allocation per row would add 19900.
func TestWriteAllocsPerBatch(t *testing.T) {
	if testing.Short() {
		t.Skip("allocation counting")
	}
	cols := testColumns()
	for _, f := range allFormats {
		t.Run(f.String(), func(t *testing.T) {
			w, err := CreateWithOptions(f, filepath.Join(t.TempDir(), "a"+f.Extension()), cols, nil, Options{Parallelism: 1, RowGroupRows: 1})
			if err != nil {
				t.Fatal(err)
			}
			defer w.Abort()
			r := rand.New(rand.NewPCG(9, 9))
			small, big := NewBatch(cols, 100), NewBatch(cols, 20000)
			fillBatch(small, 100, 0, r)
			fillBatch(big, 20000, 0, r)
			w.Write(big) // warm the scratch buffers
			as := testing.AllocsPerRun(5, func() { w.Write(small) })
			ab := testing.AllocsPerRun(5, func() { w.Write(big) })
			if ab > as+400 {
				t.Errorf("%s: %v allocations for 20000 rows vs %v for 100 rows", f, ab, as)
			}
		})
	}
}

// TestFileMode: the catalogue and its sidecar get mode 0666 minus the umask, like any
// file the user creates, not the 0600 of a temporary file.
func TestFileMode(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "cat.csv")
	writeTestFile(t, CSV, path, 10, 1, Options{})
	probe := filepath.Join(dir, "probe")
	if err := os.WriteFile(probe, nil, 0o666); err != nil {
		t.Fatal(err)
	}
	want, _ := os.Stat(probe)
	for _, p := range []string{path, SidecarPath(path)} {
		st, err := os.Stat(p)
		if err != nil {
			t.Fatal(err)
		}
		if st.Mode().Perm() != want.Mode().Perm() {
			t.Errorf("%s mode %v, want %v", filepath.Base(p), st.Mode().Perm(), want.Mode().Perm())
		}
	}
}
