package summary

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"math/big"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

func mustBins(t testing.TB, lo, hi float64, n int) Binning {
	t.Helper()
	b, err := NewBinning(lo, hi, n)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func TestExactSumOrderIndependent(t *testing.T) {
	t.Parallel()
	// Reference: math/big.Float at 1000 bits (the standard library's arbitrary
	// precision arithmetic, independent of the fixed-point code).
	r := rand.New(rand.NewPCG(1, 2))
	ws := make([]float64, 5000)
	ref := new(big.Float).SetPrec(1000)
	for i := range ws {
		ws[i] = math.Ldexp(r.Float64(), r.IntN(40)-20) // spread over 2^-20 .. 2^20
		ref.Add(ref, new(big.Float).SetFloat64(ws[i]))
	}
	var whole exactSum
	for _, w := range ws {
		whole.add(w)
	}
	// shards of random sizes merged in reverse order
	var parts []exactSum
	for i := 0; i < len(ws); {
		n := 1 + r.IntN(700)
		var p exactSum
		for j := i; j < min(i+n, len(ws)); j++ {
			p.add(ws[j])
		}
		parts = append(parts, p)
		i += n
	}
	var merged exactSum
	for i := len(parts) - 1; i >= 0; i-- {
		merged.merge(parts[i])
	}
	if merged != whole {
		t.Errorf("merged sum %v differs from whole %v", merged, whole)
	}
	want, _ := ref.Float64()
	// each term is truncated to 2^-64 and the 128-bit value rounded once to
	// float64: relative error below 1e-15 here
	if math.Abs(whole.value()/want-1) > 1e-15 {
		t.Errorf("exact sum %v, big.Float %v", whole.value(), want)
	}
	var tiny exactSum
	tiny.add(0x1p-70) // below the 2^-64 resolution: truncated to 0 (documented)
	tiny.add(3)
	if tiny.value() != 3 {
		t.Errorf("tiny + 3 = %v", tiny.value())
	}
}

func TestHist1D(t *testing.T) {
	t.Parallel()
	h := NewHist1D(mustBins(t, 10, 20, 10))
	for _, x := range []float64{9.99, 10, 10.5, 11, 11.2, 19.999, 20, 25, math.NaN(), math.Inf(-1)} {
		h.Add(x)
	}
	wantCounts := []int64{2, 2, 0, 0, 0, 0, 0, 0, 0, 1}
	for i, w := range wantCounts {
		if h.Count(i) != w {
			t.Errorf("bin %d: %d, want %d", i, h.Count(i), w)
		}
	}
	if h.Underflow() != 2 || h.Overflow() != 2 || h.NaN() != 1 || h.Total() != 9 {
		t.Errorf("under %d over %d nan %d total %d, want 2 2 1 9", h.Underflow(), h.Overflow(), h.NaN(), h.Total())
	}
	// Poisson σ = sqrt(N) (common practice)
	if h.CountErr(0) != math.Sqrt2 {
		t.Errorf("CountErr(0) = %v, want sqrt 2", h.CountErr(0))
	}
	h.AddExpected(10.1, 0.5)
	h.AddExpected(10.2, 0.25)
	if e, ee := h.Expected(0), h.ExpectedErr(0); e != 0.75 || math.Abs(ee-math.Sqrt(0.3125)) > 1e-16 {
		t.Errorf("expected %v ± %v, want 0.75 ± sqrt(0.3125)", e, ee)
	}
	h.AddExpected(math.NaN(), 2)
	h.AddExpected(30, 4)
	if h.ExpectedNaN() != 2 || h.ExpectedOverflow() != 4 || h.ExpectedUnderflow() != 0 || h.ExpectedTotal() != 4.75 {
		t.Errorf("expected NaN %v over %v under %v total %v", h.ExpectedNaN(), h.ExpectedOverflow(), h.ExpectedUnderflow(), h.ExpectedTotal())
	}
	c, ce, _, _ := h.Cumulative()
	// N(<11) = underflow 2 + bin 0 (2) = 4; N(<20) = 2 + 2 + 2 + 1 = 7
	if c[0] != 4 || c[1] != 6 || c[9] != 7 || ce[0] != 2 {
		t.Errorf("cumulative %v ± %v", c, ce)
	}
	if err := h.Merge(NewHist1D(mustBins(t, 10, 20, 5))); err == nil {
		t.Error("merge with another binning accepted")
	}
}

func TestHistMergeEqualsWhole(t *testing.T) {
	t.Parallel()
	b := mustBins(t, 14, 26, 48)
	cb := mustBins(t, -0.5, 2.5, 30)
	whole, hw := NewHist1D(b), NewHist2D(cb, b)
	shards := []*Hist1D{NewHist1D(b), NewHist1D(b), NewHist1D(b)}
	hs := []*Hist2D{NewHist2D(cb, b), NewHist2D(cb, b), NewHist2D(cb, b)}
	r := rand.New(rand.NewPCG(3, 3))
	for i := range 30000 {
		m, c, w := 14+12*r.Float64(), 3*r.Float64()-0.5, r.Float64()
		whole.Add(m)
		whole.AddExpected(m, w)
		hw.Add(c, m)
		hw.AddExpected(c, m, w)
		shards[i%3].Add(m)
		shards[i%3].AddExpected(m, w)
		hs[i%3].Add(c, m)
		hs[i%3].AddExpected(c, m, w)
	}
	got, got2 := NewHist1D(b), NewHist2D(cb, b)
	for _, i := range []int{2, 0, 1} {
		if err := got.Merge(shards[i]); err != nil {
			t.Fatal(err)
		}
		if err := got2.Merge(hs[i]); err != nil {
			t.Fatal(err)
		}
	}
	for i := 0; i < b.N; i++ {
		if got.Count(i) != whole.Count(i) || got.Expected(i) != whole.Expected(i) || got.ExpectedErr(i) != whole.ExpectedErr(i) {
			t.Fatalf("bin %d: merged %d/%v/%v, whole %d/%v/%v", i, got.Count(i), got.Expected(i), got.ExpectedErr(i),
				whole.Count(i), whole.Expected(i), whole.ExpectedErr(i))
		}
		for ix := 0; ix < cb.N; ix++ {
			if got2.Count(ix, i) != hw.Count(ix, i) || got2.Expected(ix, i) != hw.Expected(ix, i) {
				t.Fatalf("cell (%d,%d) differs after merge", ix, i)
			}
		}
	}
	if got2.Total() != 30000 || got2.Outside() != 0 {
		t.Errorf("2-d total %d outside %d", got2.Total(), got2.Outside())
	}
}

func TestBinningErrors(t *testing.T) {
	t.Parallel()
	cases := []struct {
		lo, hi float64
		n      int
		want   string
	}{
		{20, 10, 5, "binning range [20, 10) invalid"},
		{math.NaN(), 10, 5, "binning range [NaN, 10) invalid"},
		{10, 20, 0, "binning count 0 outside allowed range [1, 100000]"},
	}
	for _, c := range cases {
		if _, err := NewBinning(c.lo, c.hi, c.n); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("NewBinning(%v, %v, %d): %v, want %q", c.lo, c.hi, c.n, err, c.want)
		}
	}
	b, err := NewBinningWidth(12, 24, 0.5)
	if err != nil || b.N != 24 || b.Hi != 24 {
		t.Errorf("NewBinningWidth(12, 24, 0.5) = %+v, %v", b, err)
	}
	if _, err := NewBinningWidth(12, 24, 0); err == nil {
		t.Error("zero width accepted")
	}
}

func fillCounts(t *testing.T, s *StarCounts, r *rand.Rand, n int) {
	comps := []string{"thin_disc", "halo", "cluster"}
	stages := []string{"main_sequence", "red_giant_branch", "core_helium_burning"}
	for range n {
		c, st := comps[r.IntN(3)], stages[r.IntN(3)]
		for b := range s.Bands() {
			m := 15 + 10*r.Float64()
			s.Add(b, c, st, m)
			s.AddExpected(b, c, st, m, r.Float64())
		}
	}
}

func TestStarCountsWriters(t *testing.T) {
	t.Parallel()
	b := mustBins(t, 15, 25, 10)
	s, err := NewStarCounts([]string{"g", "r"}, b)
	if err != nil {
		t.Fatal(err)
	}
	fillCounts(t, s, rand.New(rand.NewPCG(5, 5)), 2000)
	// sharded: two halves with the same draws merged in reverse order
	s1, _ := NewStarCounts([]string{"g", "r"}, b)
	s2, _ := NewStarCounts([]string{"g", "r"}, b)
	r := rand.New(rand.NewPCG(5, 5))
	fillCounts(t, s1, r, 1000)
	fillCounts(t, s2, r, 1000)
	m, _ := NewStarCounts([]string{"g", "r"}, b)
	if err := m.Merge(s2); err != nil {
		t.Fatal(err)
	}
	if err := m.Merge(s1); err != nil {
		t.Fatal(err)
	}
	var a, c bytes.Buffer
	if err := s.WriteCSV(&a); err != nil {
		t.Fatal(err)
	}
	if err := m.WriteCSV(&c); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a.Bytes(), c.Bytes()) {
		t.Error("CSV of merged shards differs from CSV of the whole run")
	}
	recs, err := csv.NewReader(bytes.NewReader(a.Bytes())).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	// keys per band: (all,all) + 3 stages + 3 comps × (all + 3 stages) = 16; × 2 bands × 10 bins
	if len(recs) != 1+16*2*10 {
		t.Errorf("%d CSV records, want %d", len(recs), 1+16*2*10)
	}
	if strings.Join(recs[0], ",") != strings.Join(starCountsCSVHeader, ",") || recs[1][1] != All || recs[1][2] != All {
		t.Errorf("header %v, first row %v", recs[0], recs[1])
	}
	// the last cumulative of (g, all, all) is every g star: 2000 (none outside 15–25)
	if recs[10][9] != "2000" {
		t.Errorf("cum_count at the last bin of g/all/all = %s, want 2000", recs[10][9])
	}
	var j bytes.Buffer
	if err := s.WriteJSON(&j); err != nil {
		t.Fatal(err)
	}
	var doc StarCountsJSON
	if err := json.Unmarshal(j.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Kind != "star_counts" || len(doc.Histograms) != 32 || doc.MagBinning.N != 10 {
		t.Errorf("json: kind %q, %d histograms, binning %+v", doc.Kind, len(doc.Histograms), doc.MagBinning)
	}
	tot, _ := s.Get(Key{"r", All, All})
	halo, _ := s.Get(Key{"r", "halo", All})
	if tot.Total() != 2000 || halo.Total() == 0 || halo.Total() >= 2000 {
		t.Errorf("totals: all %d, halo %d", tot.Total(), halo.Total())
	}
	if _, err := s.Get(Key{"z", All, All}); err == nil || !strings.Contains(err.Error(), `band "z" not in the star counts`) {
		t.Errorf("unknown band: %v", err)
	}
	if _, err := NewStarCounts([]string{"g", "g"}, b); err == nil {
		t.Error("repeated band accepted")
	}
	func() {
		defer func() {
			if recover() == nil {
				t.Error("component named all accepted")
			}
		}()
		s.Add(0, All, "main_sequence", 20)
	}()
}

func TestHessSetWriters(t *testing.T) {
	t.Parallel()
	hs, err := NewHessSet("g-r", "r", mustBins(t, -0.5, 2, 25), mustBins(t, 14, 26, 60))
	if err != nil {
		t.Fatal(err)
	}
	r := rand.New(rand.NewPCG(8, 1))
	for range 5000 {
		hs.Add([]string{"thin_disc", "halo"}[r.IntN(2)], r.NormFloat64()*0.3+0.7, 14+12*r.Float64())
	}
	var a, b bytes.Buffer
	if err := hs.WriteCSV(&a); err != nil {
		t.Fatal(err)
	}
	if err := hs.WriteCSV(&b); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Error("CSV not deterministic")
	}
	recs, _ := csv.NewReader(&a).ReadAll()
	if recs[0][1] != "colour_lo[g-r]" || recs[1][0] != All {
		t.Errorf("header %v first %v", recs[0], recs[1])
	}
	var sum int64
	for _, rec := range recs[1:] {
		if rec[0] == All {
			n, err := strconv.ParseInt(rec[5], 10, 64)
			if err != nil {
				t.Fatal(err)
			}
			sum += n
		}
	}
	all := hs.Get(All)
	if sum != all.Total() || all.Total()+all.Outside() != 5000 {
		t.Errorf("CSV all-cells sum %d, total %d, outside %d", sum, all.Total(), all.Outside())
	}
	var j bytes.Buffer
	if err := hs.WriteJSON(&j); err != nil {
		t.Fatal(err)
	}
	var doc HessSetJSON
	if err := json.Unmarshal(j.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Diagrams) != 3 || len(doc.Diagrams[0].Count) != 60 || len(doc.Diagrams[0].Count[0]) != 25 {
		t.Errorf("json shape: %d diagrams", len(doc.Diagrams))
	}
	if _, err := NewHessSet("", "r", mustBins(t, 0, 1, 2), mustBins(t, 0, 1, 2)); err == nil {
		t.Error("empty label accepted")
	}
}
