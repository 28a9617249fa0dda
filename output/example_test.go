package output_test

import (
	"fmt"
	"os"
	"path/filepath"

	"github.com/starmock/starmock/output"
)

// Example writes a two-column catalogue of an invented cluster to Parquet in one batch,
// then reads it back with its units, null and manifest.
func Example() {
	dir, _ := os.MkdirTemp("", "starmock-example")
	defer os.RemoveAll(dir)
	path := filepath.Join(dir, "cluster.parquet")

	cols := []output.Column{
		{Name: "mass_msun", Unit: "solMass", Kind: output.Float32, Description: "current mass"},
		{Name: "g_mag", Unit: "mag", Kind: output.Float32, Nullable: true, Description: "observed g magnitude"},
	}
	w, err := output.Create(output.Parquet, path, cols, &output.Manifest{Seed: 7, TotalStars: 3})
	if err != nil {
		fmt.Println(err)
		return
	}
	b := output.NewBatch(cols, 1024) // allocate once, refill per chunk
	b.Reset(3)
	copy(b.Float32(0), []float32{1.2, 0.8, 9.5})
	copy(b.Float32(1), []float32{15.25, 17.5, 0})
	b.SetNull(1, 2) // a black hole has no magnitude
	if err := w.Write(b); err != nil {
		fmt.Println(err)
		return
	}
	if err := w.Close(); err != nil {
		fmt.Println(err)
		return
	}

	t, err := output.ReadFile(output.Parquet, path, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, c := range t.Columns {
		fmt.Printf("%s [%s]:", c.Name, c.Unit)
		for r := 0; r < t.Batch.N; r++ {
			if t.Batch.IsValid(i, r) {
				fmt.Printf(" %g", t.Batch.Float32(i)[r])
			} else {
				fmt.Print(" null")
			}
		}
		fmt.Println()
	}
	fmt.Println(t.Manifest.Synthetic, "| seed", t.Manifest.Seed, "| rows", t.Manifest.Rows)
	_, err = os.Stat(output.SidecarPath(path))
	fmt.Println("sidecar written:", err == nil)
	// Output:
	// mass_msun [solMass]: 1.2 0.8 9.5
	// g_mag [mag]: 15.25 17.5 null
	// synthetic catalogue - model prediction, not observations | seed 7 | rows 3
	// sidecar written: true
}
