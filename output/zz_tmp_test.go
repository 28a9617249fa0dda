package output
import ("testing"; "math/rand/v2")
func BenchmarkTmpStrings(b *testing.B) {
	for _, enc := range []Encoding{EncodingAuto, EncodingPlain} {
		cols := CatalogueColumns(5)
		for i := range cols { if cols[i].Kind == String { cols[i].Encoding = enc } }
		batch := RandomBatch(cols, 1<<16, rand.New(rand.NewPCG(1, 2)))
		b.Run(map[Encoding]string{0:"dict",1:"plain"}[enc], func(b *testing.B) { benchWrite(b, Parquet, cols, batch, 1<<18, Options{}) })
	}
	cols := CatalogueColumns(5)
	var nc []Column
	for _, c := range cols { if c.Kind != String { nc = append(nc, c) } }
	batch := RandomBatch(nc, 1<<16, rand.New(rand.NewPCG(1, 2)))
	b.Run("nostrings", func(b *testing.B) { benchWrite(b, Parquet, nc, batch, 1<<18, Options{}) })
	b.Run("nostrings-nosync", func(b *testing.B) { benchWrite(b, Parquet, nc, batch, 1<<18, Options{Compression: Uncompressed}) })
}
