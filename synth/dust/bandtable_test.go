package dust

import (
	"math"
	"math/rand/v2"
	"testing"
)

func table16(t testing.TB, lawName string) *BandTable {
	t.Helper()
	pbs := make([]Passband, len(bandNames16))
	for i, n := range bandNames16 {
		pbs[i] = loadPassband(t, n)
	}
	bt, err := NewBandTable(mustLaw(t, lawName, 3.1), pbs, nil)
	if err != nil {
		t.Fatal(err)
	}
	return bt
}

// TestBandTableNodes: at the grid nodes the table equals the exact synthetic
// photometry (RatiosExact, the BandRatio formula) to 1e-10 — checks the
// incremental A_V stepping used to fill it (regression of the fill method,
// the physics reference being BandRatio's own tests).
func TestBandTableNodes(t *testing.T) {
	t.Parallel()
	bt := table16(t, NameF99)
	got := make([]float64, bt.NumBands())
	want := make([]float64, bt.NumBands())
	for _, iT := range []int{0, 1, 37, TableTeffNodes - 1} {
		teff := math.Pow(10, bt.logT0+float64(iT)*bt.dlogT)
		for _, iA := range []int{0, 1, 17, bt.nA - 1} {
			av := float64(iA) * TableAVStepMag
			bt.Ratios(teff, av, got)
			bt.RatiosExact(teff, av, want)
			for b := range got {
				if math.Abs(got[b]-want[b]) > 1e-10 {
					t.Errorf("%s node T=%.1f K A_V=%g: table %.12f exact %.12f", bandNames16[b], teff, av, got[b], want[b])
				}
			}
		}
	}
}

// TestBandTableExactIsBandRatio: the table's exact path is BandRatio of a
// blackbody (consts.PlanckLambda) through the same passbands, to 1e-12.
func TestBandTableExactIsBandRatio(t *testing.T) {
	t.Parallel()
	bt := table16(t, NameOD94)
	dst := make([]float64, bt.NumBands())
	for _, c := range []struct{ teff, av float64 }{{2500, 0}, {5772, 0.3}, {40000, 12}} {
		bt.RatiosExact(c.teff, c.av, dst)
		for b, name := range bandNames16 {
			want, err := BandRatio(bt.Law(), loadPassband(t, name), planck(c.teff), c.av)
			if err != nil || math.Abs(dst[b]-want) > 1e-12 {
				t.Errorf("%s %g K A_V=%g: table exact %.15g, BandRatio %.15g (%v)", name, c.teff, c.av, dst[b], want, err)
			}
		}
	}
}

// TestBandTableInterpolationError: the bilinear interpolation error against
// the exact value, at 1500 seeded random points uniform in (log Teff, A_V)
// over the grid, for all 16 bands and the three laws. The bar, 5e-4 in
// A_X/A_V (5e-4 mag per magnitude of A_V, i.e. 0.005 mag at A_V = 10), is an
// order of magnitude below the spread between the laws themselves; the maximum
// reached is logged.
func TestBandTableInterpolationError(t *testing.T) {
	t.Parallel()
	for _, name := range LawNames() {
		bt := table16(t, name)
		r := rand.New(rand.NewPCG(4, 6))
		got := make([]float64, bt.NumBands())
		want := make([]float64, bt.NumBands())
		maxErr := make([]float64, bt.NumBands())
		worst := 0.0
		for n := 0; n < 1500; n++ {
			teff := math.Pow(10, math.Log10(TableMinTeffK)+r.Float64()*math.Log10(TableMaxTeffK/TableMinTeffK))
			av := r.Float64() * TableMaxAVMag
			bt.Ratios(teff, av, got)
			bt.RatiosExact(teff, av, want)
			for b := range got {
				e := math.Abs(got[b] - want[b])
				maxErr[b] = math.Max(maxErr[b], e)
				worst = math.Max(worst, e)
			}
		}
		for b, e := range maxErr {
			if e > 5e-4 {
				t.Errorf("%s %s: max interpolation error %.2g > 5e-4", name, bandNames16[b], e)
			}
		}
		t.Logf("%s: max |table − exact| over 16 bands = %.2g (per band %.1e)", name, worst, maxErr)
	}
}

// TestBandTableOutside: outside the grid Ratios returns the exact value
// (no clamp), and InTable says so.
func TestBandTableOutside(t *testing.T) {
	t.Parallel()
	bt := table16(t, NameCCM89)
	got := make([]float64, bt.NumBands())
	want := make([]float64, bt.NumBands())
	edge := make([]float64, bt.NumBands())
	for _, c := range []struct{ teff, av float64 }{{700, 1}, {400000, 1}, {5000, 25}, {600, 30}} {
		if bt.InTable(c.teff, c.av) {
			t.Errorf("InTable(%g, %g) = true", c.teff, c.av)
		}
		bt.Ratios(c.teff, c.av, got)
		bt.RatiosExact(c.teff, c.av, want)
		for b := range got {
			if got[b] != want[b] {
				t.Errorf("outside (%g K, %g mag) %s: %g vs exact %g", c.teff, c.av, bandNames16[b], got[b], want[b])
			}
		}
	}
	// a cool star below the grid differs from the grid's edge value (so a clamp would be visible)
	bt.Ratios(700, 1, got)
	bt.Ratios(TableMinTeffK, 1, edge)
	if math.Abs(got[13]-edge[13]) < 1e-3 { // Gaia G
		t.Errorf("A_G/A_V at 700 K (%.5f) ≈ at the grid edge (%.5f): test cannot tell a clamp", got[13], edge[13])
	}
	if !bt.InTable(TableMaxTeffK, TableMaxAVMag) || !bt.InTable(TableMinTeffK, 0) {
		t.Error("grid corners should be inside")
	}
}

// TestBandTablePivotFallback: a band without a curve is the law at its pivot.
func TestBandTablePivotFallback(t *testing.T) {
	t.Parallel()
	law := mustLaw(t, NameCCM89, 3.1)
	v := loadPassband(t, "johnson_cousins_V")
	bt, err := NewBandTable(law, []Passband{v, {}}, []float64{0, 12500})
	if err != nil {
		t.Fatal(err)
	}
	dst := make([]float64, 2)
	bt.Ratios(6000, 3, dst)
	want, _ := law.ALambdaOverAV(12500)
	if dst[1] != want {
		t.Errorf("pivot band: %g, want a(12500 Å) = %g", dst[1], want)
	}
	if _, err := NewBandTable(law, []Passband{{}}, nil); err == nil {
		t.Error("band with neither curve nor pivot: want error")
	}
	if _, err := NewBandTable(law, []Passband{{}}, []float64{500}); err == nil {
		t.Error("pivot outside the law's range: want error")
	}
}

// TestBandTableNoAlloc: the per-star path allocates nothing, in and out of the grid.
func TestBandTableNoAlloc(t *testing.T) {
	bt := table16(t, NameF99)
	dst := make([]float64, bt.NumBands())
	if a := testing.AllocsPerRun(100, func() { bt.Ratios(5772, 1.3, dst) }); a != 0 {
		t.Errorf("Ratios allocates %v per call", a)
	}
	if a := testing.AllocsPerRun(5, func() { bt.Ratios(1000, 1.3, dst) }); a != 0 {
		t.Errorf("Ratios outside the grid allocates %v per call", a)
	}
}

// TestBandTablePanics: documented panics for caller bugs.
func TestBandTablePanics(t *testing.T) {
	t.Parallel()
	bt := table16(t, NameCCM89)
	for _, c := range []struct {
		name     string
		teff, av float64
		n        int
	}{{"short dst", 5000, 1, 3}, {"negative A_V", 5000, -1, 16}, {"NaN A_V", 5000, math.NaN(), 16}, {"zero Teff", 0, 1, 16}} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", c.name)
				}
			}()
			bt.Ratios(c.teff, c.av, make([]float64, c.n))
		}()
	}
}

// BenchmarkBandTableRatios16: one star, 16 bands, inside the grid.
func BenchmarkBandTableRatios16(b *testing.B) {
	bt := table16(b, NameF99)
	r := rand.New(rand.NewPCG(1, 1))
	const n = 1024
	teffs := make([]float64, n)
	avs := make([]float64, n)
	for i := range teffs {
		teffs[i] = 3000 + r.Float64()*20000
		avs[i] = r.Float64() * 5
	}
	dst := make([]float64, bt.NumBands())
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		bt.Ratios(teffs[i%n], avs[i%n], dst)
	}
}

// BenchmarkNewBandTable16: building the table for 16 bands.
func BenchmarkNewBandTable16(b *testing.B) {
	pbs := make([]Passband, len(bandNames16))
	for i, n := range bandNames16 {
		pbs[i] = loadPassband(b, n)
	}
	law := mustLaw(b, NameF99, 3.1)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := NewBandTable(law, pbs, nil); err != nil {
			b.Fatal(err)
		}
	}
}
