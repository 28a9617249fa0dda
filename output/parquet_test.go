package output

import (
	"math"
	"math/rand/v2"
	"path/filepath"
	"slices"
	"testing"

	"github.com/apache/arrow-go/v18/parquet"
	"github.com/apache/arrow-go/v18/parquet/compress"
	"github.com/apache/arrow-go/v18/parquet/file"
	"github.com/apache/arrow-go/v18/parquet/metadata"
)

// TestParquetLayout checks the layout decisions in the file's own metadata, read by
// arrow-go's Parquet reader: one row group per Write (RowGroupRows 1), the chosen codec, dictionary
// encoding only on String and EncodingDictionary columns, min/max statistics equal to
// the true extremes of each row group, and the footer key/values.
func TestParquetLayout(t *testing.T) {
	for _, codec := range []Compression{"", Zstd, Uncompressed} {
		t.Run(string(codec), func(t *testing.T) {
			t.Parallel()
			path := filepath.Join(t.TempDir(), "cat.parquet")
			cols := testColumns()
			w, err := CreateWithOptions(Parquet, path, cols, testManifest(), Options{Compression: codec, RowGroupRows: 1})
			if err != nil {
				t.Fatal(err)
			}
			b := NewBatch(cols, 500)
			r := rand.New(rand.NewPCG(5, 5))
			var teffMin, teffMax []float32
			for range 3 {
				fillBatch(b, 500, 0, r)
				lo, hi := float32(math.Inf(1)), float32(math.Inf(-1))
				for _, v := range b.Float32(3) {
					lo, hi = min(lo, v), max(hi, v)
				}
				teffMin, teffMax = append(teffMin, lo), append(teffMax, hi)
				if err := w.Write(b); err != nil {
					t.Fatal(err)
				}
			}
			if err := w.Close(); err != nil {
				t.Fatal(err)
			}
			rdr, err := file.OpenParquetFile(path, false)
			if err != nil {
				t.Fatal(err)
			}
			defer rdr.Close()
			md := rdr.MetaData()
			if md.NumRowGroups() != 3 || md.NumRows != 1500 {
				t.Errorf("%d row groups, %d rows; want 3, 1500", md.NumRowGroups(), md.NumRows)
			}
			if md.GetCreatedBy() != ParquetCreatedBy {
				t.Errorf("created_by %q", md.GetCreatedBy())
			}
			kv := md.KeyValueMetadata()
			if kv.FindValue(ManifestKey) == nil || kv.FindValue("ARROW:schema") == nil {
				t.Errorf("footer key/values %v lack the manifest or the Arrow schema", kv.Keys())
			}
			wantCodec := map[Compression]compress.Compression{"": compress.Codecs.Snappy, Zstd: compress.Codecs.Zstd, Uncompressed: compress.Codecs.Uncompressed}[codec]
			for g := range md.NumRowGroups() {
				rg := md.RowGroup(g)
				for c, col := range cols {
					cc, err := rg.ColumnChunk(c)
					if err != nil {
						t.Fatal(err)
					}
					if cc.Compression() != wantCodec {
						t.Errorf("row group %d column %q codec %v, want %v", g, col.Name, cc.Compression(), wantCodec)
					}
					dict := slices.Contains(cc.Encodings(), parquet.Encodings.RLEDict) || slices.Contains(cc.Encodings(), parquet.Encodings.PlainDict)
					wantDict := col.Kind == String || col.Encoding == EncodingDictionary
					if dict != wantDict {
						t.Errorf("column %q encodings %v, dictionary %v want %v", col.Name, cc.Encodings(), dict, wantDict)
					}
					set, _ := cc.StatsSet()
					if set != (col.Kind != Bool) {
						t.Errorf("column %q statistics set = %v", col.Name, set)
					}
				}
				cc, _ := rg.ColumnChunk(3)
				st, err := cc.Statistics()
				if err != nil {
					t.Fatal(err)
				}
				fs, ok := st.(*metadata.Float32Statistics)
				if !ok || !fs.HasMinMax() {
					t.Fatalf("teff_k statistics %T without min/max", st)
				}
				// teff_k row 0 is +Inf by construction (fillBatch), so max is +Inf.
				if fs.Min() != teffMin[g] || fs.Max() != teffMax[g] {
					t.Errorf("row group %d teff_k min/max %v/%v, want %v/%v", g, fs.Min(), fs.Max(), teffMin[g], teffMax[g])
				}
			}
		})
	}
}

// TestParquetRowGroupMerge: small batches are merged into row groups of at most
// RowGroupRows rows without splitting a batch, a batch without validity slices gives
// valid rows, and the rows read back in order.
func TestParquetRowGroupMerge(t *testing.T) {
	path := filepath.Join(t.TempDir(), "cat.parquet")
	cols := testColumns()
	w, err := CreateWithOptions(Parquet, path, cols, nil, Options{RowGroupRows: 250})
	if err != nil {
		t.Fatal(err)
	}
	want := NewBatch(cols, 1000+300)
	want.Reset(1300)
	b := NewBatch(cols, 300)
	r := rand.New(rand.NewPCG(8, 8))
	at := 0
	for k := range 11 {
		n := 100
		if k == 10 {
			n = 300 // larger than RowGroupRows: its own row group
		}
		fillBatch(b, n, int64(at), r)
		in := *b
		if k == 3 {
			in.Valid = nil // all valid
			for c := range b.Valid {
				if b.Valid[c] != nil {
					for i := range n {
						b.Valid[c][i] = true
					}
				}
			}
		}
		appendBatch(want, b, at)
		if err := w.Write(&in); err != nil {
			t.Fatal(err)
		}
		at += n
	}
	if err := w.Close(); err != nil {
		t.Fatal(err)
	}
	rdr, err := file.OpenParquetFile(path, false)
	if err != nil {
		t.Fatal(err)
	}
	var sizes []int64
	for g := range rdr.NumRowGroups() {
		sizes = append(sizes, rdr.MetaData().RowGroup(g).NumRows())
	}
	rdr.Close()
	if !slices.Equal(sizes, []int64{200, 200, 200, 200, 200, 300}) {
		t.Errorf("row groups of %v rows, want 5 x 200 then 300", sizes)
	}
	tab, err := ReadFile(Parquet, path, nil)
	if err != nil {
		t.Fatal(err)
	}
	compareBatches(t, "merged row groups", cols, tab.Batch, want)
}
