package output

import (
	"fmt"
	"math/rand/v2"
	"os"
)

// FloorWords are the values drawn for String columns by WriteRandomFloor: a handful of
// stage-like words, so the dictionary encoding sees a low cardinality, as in a real
// catalogue's stage column.
var FloorWords = []string{"main_sequence", "subgiant", "red_giant_branch", "core_helium_burning",
	"early_agb", "thermally_pulsing_agb", "carbon_oxygen_white_dwarf", "neutron_star"}

// WriteRandomFloor writes rows rows of seeded random values for the schema cols to path
// in format, in batches of batchRows rows, with the same writer and Options the
// pipeline uses. It measures the I/O floor: the cost of encoding and writing a catalogue
// of that shape with no physics at all. The random batch is filled once, before the
// writer is created, and written repeatedly (the generator's cost is not part of the
// floor); nullable columns get ~10% nulls. Floats are uniform on [0, 30) (magnitudes),
// integers uniform over their type, booleans fair coins, strings drawn from FloorWords
// (cut to the column's FITS width).
// It returns the size of the file written in bytes. rows must be >= 0 and batchRows >= 1.
func WriteRandomFloor(format Format, path string, cols []Column, rows, batchRows int, seed uint64, opts Options) (int64, error) {
	if rows < 0 {
		return 0, fmt.Errorf("output: floor rows %d outside 0..inf", rows)
	}
	if batchRows < 1 {
		return 0, fmt.Errorf("output: floor batch size %d rows outside 1..inf", batchRows)
	}
	if err := ValidateColumns(cols); err != nil {
		return 0, err
	}
	b := RandomBatch(cols, min(batchRows, max(rows, 1)), rand.New(rand.NewPCG(seed, 0x5eed)))
	w, err := CreateWithOptions(format, path, cols, &Manifest{Seed: seed, ScenarioText: "I/O floor: random values"}, opts)
	if err != nil {
		return 0, err
	}
	for done := 0; done < rows; done += b.N {
		n := min(batchRows, rows-done)
		b.N = n
		if err := w.Write(b); err != nil {
			w.Abort()
			return 0, err
		}
	}
	if err := w.Close(); err != nil {
		return 0, err
	}
	st, err := os.Stat(path)
	if err != nil {
		return 0, fmt.Errorf("output: floor file: %w", err)
	}
	return st.Size(), nil
}

// RandomBatch returns a batch of n rows of random values for cols, drawn as described
// for WriteRandomFloor. Used by the floor and the benchmarks.
func RandomBatch(cols []Column, n int, r *rand.Rand) *Batch {
	b := NewBatch(cols, n)
	b.Reset(n)
	for c, col := range cols {
		switch v := b.Cols[c].(type) {
		case []float32:
			for i := range v {
				v[i] = float32(30 * r.Float64())
			}
		case []float64:
			for i := range v {
				v[i] = 30 * r.Float64()
			}
		case []int64:
			for i := range v {
				v[i] = r.Int64N(1<<62) + 1
			}
		case []int32:
			for i := range v {
				v[i] = int32(r.Int64N(1<<31-1)) + 1
			}
		case []int8:
			for i := range v {
				v[i] = int8(r.IntN(256) - 128)
			}
		case []bool:
			for i := range v {
				v[i] = r.IntN(2) == 0
			}
		case []string:
			width := col.strLen()
			for i := range v {
				w := FloorWords[r.IntN(len(FloorWords))]
				v[i] = w[:min(len(w), width)] // fits the FITS width
			}
		}
		if col.Nullable {
			for i := range n {
				if r.IntN(10) == 0 {
					b.Valid[c][i] = false
				}
			}
		}
	}
	return b
}

// CatalogueColumns returns a representative catalogue schema with the given number of
// bands, for benchmarks and the I/O floor when the pipeline's own schema is not at hand:
// 20 truth columns (ids, masses, age, [Fe/H], stage, L, Teff, R, log g, spectral type,
// position, distance, A_V, binary flag and companion) and 8 per band (absolute, true
// apparent, observed magnitude, magnitude error, flux, flux error as float32; detected
// and saturated flags). Five bands give 60 columns.
func CatalogueColumns(bands int) []Column {
	cols := []Column{
		{Name: "star_id", Kind: Int64},
		{Name: "component", Kind: Int32, Encoding: EncodingDictionary},
		{Name: "initial_mass_msun", Unit: "solMass", Kind: Float32},
		{Name: "mass_msun", Unit: "solMass", Kind: Float32},
		{Name: "age_yr", Unit: "yr", Kind: Float64},
		{Name: "feh", Unit: "dex", Kind: Float32},
		{Name: "stage", Kind: String, MaxLen: 32},
		{Name: "lum_lsun", Unit: "solLum", Kind: Float32},
		{Name: "teff_k", Unit: "K", Kind: Float32},
		{Name: "radius_rsun", Unit: "solRad", Kind: Float32},
		{Name: "logg_cgs", Unit: "dex", Kind: Float32},
		{Name: "spectral_type", Kind: String, MaxLen: 8, Nullable: true},
		{Name: "x_pc", Unit: "pc", Kind: Float32},
		{Name: "y_pc", Unit: "pc", Kind: Float32},
		{Name: "distance_pc", Unit: "pc", Kind: Float64},
		{Name: "distance_modulus_mag", Unit: "mag", Kind: Float32},
		{Name: "av_mag", Unit: "mag", Kind: Float32},
		{Name: "binary", Kind: Bool},
		{Name: "companion_mass_msun", Unit: "solMass", Kind: Float32, Nullable: true},
		{Name: "companion_stage", Kind: String, MaxLen: 32, Nullable: true},
	}
	for i := range bands {
		p := fmt.Sprintf("b%d_", i)
		cols = append(cols,
			Column{Name: p + "abs_mag", Unit: "mag", Kind: Float32, Nullable: true},
			Column{Name: p + "true_mag", Unit: "mag", Kind: Float32, Nullable: true},
			Column{Name: p + "obs_mag", Unit: "mag", Kind: Float32, Nullable: true},
			Column{Name: p + "mag_err", Unit: "mag", Kind: Float32, Nullable: true},
			Column{Name: p + "flux", Unit: "nJy", Kind: Float32, Nullable: true},
			Column{Name: p + "flux_err", Unit: "nJy", Kind: Float32, Nullable: true},
			Column{Name: p + "detected", Kind: Bool},
			Column{Name: p + "saturated", Kind: Bool},
		)
	}
	return cols
}

// RowBytes returns the in-memory size of one row of cols in bytes (strings counted at
// 16 bytes, a typical stage word), used for b.SetBytes and throughput figures.
func RowBytes(cols []Column) int64 {
	var n int64
	for _, c := range cols {
		switch c.Kind {
		case Float64, Int64:
			n += 8
		case Float32, Int32:
			n += 4
		case Int8, Bool:
			n++
		case String:
			n += 16
		}
	}
	return n
}
