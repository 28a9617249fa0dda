package observe

import (
	"bufio"
	"math"
	"math/rand/v2"
	"os"
	"sort"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"github.com/starmock/starmock/internal/consts"
)

// refRows reads testdata/ivezic2019_checks.tsv (copied from the shared
// reference population_values.tsv, rows from Ivezić et al. 2019) into
// quantity → value.
func refRows(t *testing.T) map[string]float64 {
	t.Helper()
	f, err := os.Open("testdata/ivezic2019_checks.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	out := map[string]float64{}
	sc := bufio.NewScanner(f)
	header := true
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") {
			continue
		}
		if header {
			header = false
			continue
		}
		cols := strings.Split(line, "\t")
		v, err := strconv.ParseFloat(cols[1], 64)
		if err != nil {
			t.Fatalf("row %q: %v", cols[0], err)
		}
		out[cols[0]] = v
	}
	return out
}

func mustBand(t testing.TB, b BandSpec) *BandSpec {
	t.Helper()
	if err := b.Validate(); err != nil {
		t.Fatalf("validate: %v", err)
	}
	return &b
}

func ivezicBand(m5, floor, gamma float64) BandSpec {
	return BandSpec{Band: "r", Limit5SigmaMag: m5, FloorMag: floor, SaturationMag: 16, Noise: IvezicNoise(gamma)}
}

func TestFluxScaleAB(t *testing.T) {
	t.Parallel()
	// m_AB = 0 is 3631 Jy (Oke & Gunn 1983, via consts.ABZeroJy); 3631 is the
	// rounded value of 10^(48.6/2.5) × 1e23 Jy = 3630.78 Jy, so compare to 1e-4.
	got := FluxFromMag(0) * 1e-9 // nJy → Jy
	if math.Abs(got/consts.ABZeroJy-1) > 1e-4 {
		t.Errorf("FluxFromMag(0) = %v Jy, want %v Jy within 1e-4 (Oke & Gunn 1983)", got, consts.ABZeroJy)
	}
	// 1 nJy is m_AB = 31.4 exactly (definition of the AB scale in cgs).
	if got := FluxFromMag(31.4); math.Abs(got-1) > 1e-15 {
		t.Errorf("FluxFromMag(31.4) = %v nJy, want 1", got)
	}
	for _, m := range []float64{-1, 5, 17.25, 24, 30} {
		if back := MagFromFlux(FluxFromMag(m)); math.Abs(back-m) > 1e-12 {
			t.Errorf("round trip %v → %v", m, back)
		}
	}
	for _, f := range []float64{0, -1, math.NaN()} {
		if !math.IsNaN(MagFromFlux(f)) {
			t.Errorf("MagFromFlux(%v) = %v, want NaN", f, MagFromFlux(f))
		}
	}
}

func TestIvezicSigmaRandReference(t *testing.T) {
	t.Parallel()
	ref := refRows(t)
	// Check rows lsst_sigma_rand_at_* of population_values.tsv (Ivezić et al.
	// 2019 eq. 5 evaluated with γ = 0.039); they print 4 decimals, so the
	// tolerance is half a unit of the last digit, 5e-5 mag.
	cases := []struct {
		row   string
		dm    float64
		gamma float64
		tol   float64
	}{
		{"lsst_sigma_rand_at_m5", 0, 0.039, 1e-15}, // exact by construction
		{"lsst_sigma_rand_at_m5", 0, 0.038, 1e-15}, // any γ
		{"lsst_sigma_rand_at_m5-1_gamma0.039", -1, 0.039, 5e-5},
		{"lsst_sigma_rand_at_m5+1_gamma0.039", 1, 0.039, 5e-5},
		{"lsst_sigma_rand_at_m5-2.5_gamma0.039", -2.5, 0.039, 5e-5},
	}
	for _, c := range cases {
		want, ok := ref[c.row]
		if !ok {
			t.Errorf("row %s missing from testdata", c.row)
			continue
		}
		m5 := ref["lsst_m5_r"]
		got := IvezicSigmaRand(m5+c.dm, m5, c.gamma)
		if math.Abs(got-want) > c.tol {
			t.Errorf("%s (γ=%v): σ_rand = %.6f mag, want %v ± %v (Ivezić et al. 2019 eq. 5)", c.row, c.gamma, got, want, c.tol)
		}
	}
}

func TestSNRFiveAtLimit(t *testing.T) {
	t.Parallel()
	ref := refRows(t)
	// S/N = 5 at m5 by construction of Ivezić et al. 2019 eq. 5 (σ_rand = 0.2
	// at x = 1) with no floor; the only error is float rounding (1e-12).
	for _, band := range []string{"u", "g", "r", "i", "z", "y"} {
		m5, gamma := ref["lsst_m5_"+band], ref["lsst_gamma_"+band]
		b := mustBand(t, BandSpec{Band: band, Limit5SigmaMag: m5, SaturationMag: math.Inf(-1), Noise: IvezicNoise(gamma)})
		if s := b.ExpectedSNR(m5); math.Abs(s-5) > 1e-12 {
			t.Errorf("band %s: S/N at m5 = %.15f, want 5 (Ivezić et al. 2019 eq. 5)", band, s)
		}
		// The eq. 5 form in flux must equal eq. 5 in magnitudes at other m too.
		for _, dm := range []float64{-4, -1, 0.5, 2} {
			want := 1 / IvezicSigmaRand(m5+dm, m5, gamma)
			if s := b.ExpectedSNR(m5 + dm); math.Abs(s/want-1) > 1e-12 {
				t.Errorf("band %s m5%+v: S/N %v, want 1/σ_rand = %v", band, dm, s, want)
			}
		}
	}
	bl := mustBand(t, BandSpec{Band: "x", Limit5SigmaMag: 21, SaturationMag: 12, Noise: BackgroundLimitedNoise()})
	if s := bl.ExpectedSNR(21); math.Abs(s-5) > 1e-12 {
		t.Errorf("background-limited: S/N at m5 = %v, want 5", s)
	}
	// background-limited: σ_f constant, so S/N scales as flux: ×10 for 2.5 mag.
	if s := bl.ExpectedSNR(18.5); math.Abs(s-50) > 1e-10 {
		t.Errorf("background-limited: S/N at m5-2.5 = %v, want 50", s)
	}
	// The floor adds in quadrature (Ivezić et al. 2019 eq. 4): at a bright
	// magnitude the S/N tends to 1/σ_sys.
	fl := mustBand(t, ivezicBand(24, 0.005, 0.039))
	want := 1 / math.Hypot(0.005, IvezicSigmaRand(14, 24, 0.039))
	if s := fl.ExpectedSNR(14); math.Abs(s/want-1) > 1e-12 {
		t.Errorf("floor: S/N at 14 mag = %v, want %v", s, want)
	}
}

// ksNormal returns the one-sample Kolmogorov–Smirnov distance of xs from the
// standard normal CDF of gonum distuv (an independent implementation).
func ksNormal(xs []float64) float64 {
	sort.Float64s(xs)
	n := float64(len(xs))
	d := 0.0
	for i, x := range xs {
		c := distuv.UnitNormal.CDF(x)
		d = math.Max(d, math.Max(float64(i+1)/n-c, c-float64(i)/n))
	}
	return d
}

func TestFluxNoiseStandardNormal(t *testing.T) {
	t.Parallel()
	// KS test of (f_obs − f)/σ_f against N(0,1) at a fixed seed. Critical value
	// for a false-alarm rate of 0.1%: D = sqrt(−ln(0.0005)/2)/sqrt(n) =
	// 1.9495/sqrt(n) (asymptotic Kolmogorov distribution; common practice).
	tab, err := ParseErrorTable(strings.NewReader("mag mag_err\n16 0.01\n22 0.05\n24 0.2\n"), "inline")
	if err != nil {
		t.Fatal(err)
	}
	specs := map[string]BandSpec{
		"ivezic":     ivezicBand(24.35, 0.005, 0.039),
		"background": {Band: "g", Limit5SigmaMag: 23, SaturationMag: 15, FloorMag: 0.01, Noise: BackgroundLimitedNoise()},
		"table":      {Band: "i", Limit5SigmaMag: 24, SaturationMag: 15, Noise: TableNoise(tab)},
	}
	const n = 100000
	crit := 1.9495 / math.Sqrt(n)
	for name, spec := range specs {
		b := mustBand(t, spec)
		for _, m := range []float64{18, 23, 24.35, 26, math.Inf(1)} {
			r := rand.New(rand.NewPCG(7, 11))
			f := FluxFromMag(m)
			zs := make([]float64, n)
			for i := range zs {
				ms := b.Observe(m, r)
				zs[i] = (ms.Flux - f) / ms.FluxErr
			}
			if d := ksNormal(zs); d > crit {
				t.Errorf("%s at %v mag: KS distance %.5f > %.5f (α = 0.001)", name, m, d, crit)
			}
		}
	}
}

func TestNormalFromBitsEnds(t *testing.T) {
	t.Parallel()
	lo, hi := normalFromBits(0), normalFromBits(math.MaxUint64)
	if math.IsInf(lo, 0) || math.IsInf(hi, 0) || lo != -hi || hi < 8 || hi > 8.5 {
		t.Errorf("ends of the deviate grid: %v, %v; want finite, symmetric, about ±8.3", lo, hi)
	}
	// the middle of the grid is 0 to within one grid step of p (2^-53 ≈ 1.1e-16)
	if z := normalFromBits(1 << 63); math.Abs(z) > 1e-15 {
		t.Errorf("middle deviate %v, want ~0", z)
	}
}

func TestDetectedFractionFollowsModel(t *testing.T) {
	t.Parallel()
	// Detected fraction per magnitude vs DetectionProbability, which in turn is
	// checked against an independent formula: c(m) Φ((f − 5σ)/σ) with Φ from
	// gonum distuv. Binomial tolerance 4σ = 4 sqrt(n p (1 − p)) per bin
	// (two-sided false-alarm 6e-5 per bin), plus 1 count for p near 0 or 1.
	b := mustBand(t, BandSpec{Band: "r", Limit5SigmaMag: 24, FloorMag: 0.005, SaturationMag: 16,
		Noise: IvezicNoise(0.039), Completeness: LogisticCompleteness(0.95, 23.5, 0.3)})
	const n = 20000
	r := rand.New(rand.NewPCG(3, 5))
	for _, m := range []float64{15.5, 18, 22, 23, 23.5, 24, 24.3, 25} {
		f := FluxFromMag(m)
		s := b.FluxErr(m)
		want := 0.0
		if m >= 16 {
			want = 0.95 / (1 + math.Exp((m-23.5)/0.3)) * distuv.UnitNormal.CDF((f-5*s)/s)
		}
		if p := b.DetectionProbability(m); math.Abs(p-want) > 1e-12 {
			t.Errorf("%v mag: DetectionProbability %v, want %v", m, p, want)
		}
		k := 0
		for range n {
			if b.Observe(m, r).Detected {
				k++
			}
		}
		tol := 4*math.Sqrt(n*want*(1-want)) + 1
		if math.Abs(float64(k)-n*want) > tol {
			t.Errorf("%v mag: %d of %d detected, want %.1f ± %.1f (binomial 4σ)", m, k, n, n*want, tol)
		}
	}
}

func TestCompletenessTableDetection(t *testing.T) {
	t.Parallel()
	ct, err := ParseCompletenessTable(strings.NewReader("# test\nmag completeness\n20 1\n22 0.8\n23 0.3\n24 0\n"), "inline")
	if err != nil {
		t.Fatal(err)
	}
	// Completeness dominates here: S/N threshold tiny-valued and the depth faint.
	b := mustBand(t, BandSpec{Band: "r", Limit5SigmaMag: 30, SaturationMag: 10, DetectionSNR: 0.001,
		Noise: BackgroundLimitedNoise(), Completeness: TableCompleteness(ct)})
	cases := []struct{ m, c float64 }{{19, 1}, {21, 0.9}, {22.5, 0.55}, {23.5, 0.15}, {25, 0}} // linear between rows, constant outside
	r := rand.New(rand.NewPCG(9, 9))
	const n = 10000
	for _, c := range cases {
		if got := b.Completeness.At(c.m); math.Abs(got-c.c) > 1e-12 {
			t.Errorf("c(%v) = %v, want %v", c.m, got, c.c)
		}
		k := 0
		for range n {
			if b.Observe(c.m, r).Detected {
				k++
			}
		}
		tol := 4*math.Sqrt(n*c.c*(1-c.c)) + 1
		if math.Abs(float64(k)-n*c.c) > tol {
			t.Errorf("%v mag: %d of %d detected, want %v ± %.1f", c.m, k, n, n*c.c, tol)
		}
	}
}

func TestSaturationAndNonPositiveFlux(t *testing.T) {
	t.Parallel()
	b := mustBand(t, ivezicBand(24, 0, 0.039))
	r := rand.New(rand.NewPCG(1, 2))
	for range 100 {
		m := b.Observe(15, r)
		if !m.Saturated || m.Detected {
			t.Fatalf("15 mag with saturation at 16: %+v, want saturated and not detected", m)
		}
	}
	// No light at all: pure noise, half the fluxes non-positive.
	nonPos := 0
	for range 2000 {
		m := b.Observe(math.Inf(1), r)
		if m.Flux <= 0 {
			nonPos++
			if !math.IsNaN(m.Mag) || !math.IsNaN(m.MagErr) || m.Detected {
				t.Fatalf("non-positive flux: %+v, want NaN mag and not detected", m)
			}
		}
		if m.Flux > 0 && m.Detected != (m.Flux >= 5*m.FluxErr) {
			t.Fatalf("detection flag %v inconsistent with S/N %v", m.Detected, m.Flux/m.FluxErr)
		}
	}
	if nonPos < 900 || nonPos > 1100 { // binomial(2000, 0.5): ±4.5σ
		t.Errorf("%d of 2000 zero-flux measurements non-positive, want about 1000", nonPos)
	}
	m := b.Observe(math.NaN(), r)
	if !math.IsNaN(m.Flux) || m.Detected {
		t.Errorf("NaN magnitude: %+v, want NaN flux, not detected", m)
	}
}

// countingSource counts the 64-bit values drawn.
type countingSource struct {
	rand.Source
	n int
}

func (c *countingSource) Uint64() uint64 { c.n++; return c.Source.Uint64() }

func TestDrawsPerObserve(t *testing.T) {
	t.Parallel()
	tab, _ := ParseErrorTable(strings.NewReader("mag mag_err\n16 0.01\n24 0.2\n"), "inline")
	specs := []BandSpec{
		ivezicBand(24, 0.01, 0.039),
		{Band: "g", Limit5SigmaMag: 23, SaturationMag: 15, Noise: TableNoise(tab), Completeness: LogisticCompleteness(1, 22, 0.2)},
	}
	for _, spec := range specs {
		b := mustBand(t, spec)
		src := &countingSource{Source: rand.NewPCG(4, 4)}
		r := rand.New(src)
		for i, m := range []float64{10, 15.9, 20, 24, 27, math.Inf(1), math.NaN()} {
			b.Observe(m, r)
			if src.n != DrawsPerObserve*(i+1) {
				t.Errorf("after %d calls (last %v mag): %d draws, want %d", i+1, m, src.n, DrawsPerObserve*(i+1))
			}
		}
	}
}

func TestObserveDeterministic(t *testing.T) {
	t.Parallel()
	b := mustBand(t, ivezicBand(24, 0.005, 0.039))
	r1, r2 := rand.New(rand.NewPCG(5, 6)), rand.New(rand.NewPCG(5, 6))
	for i := range 1000 {
		m := 18 + float64(i)*0.008
		a, c := b.Observe(m, r1), b.Observe(m, r2)
		if a != c && !(math.IsNaN(a.Mag) && math.IsNaN(c.Mag) && a.Flux == c.Flux) {
			t.Fatalf("same seed, different results: %+v vs %+v", a, c)
		}
	}
}

func TestObserveNoAlloc(t *testing.T) {
	b := mustBand(t, ivezicBand(24, 0.005, 0.039))
	r := rand.New(rand.NewPCG(1, 1))
	if a := testing.AllocsPerRun(1000, func() { b.Observe(22, r) }); a != 0 {
		t.Errorf("Observe allocates %v times per call, want 0", a)
	}
}

func TestObserveBeforeValidatePanics(t *testing.T) {
	t.Parallel()
	defer func() {
		if recover() == nil {
			t.Error("Observe on an unvalidated BandSpec did not panic")
		}
	}()
	b := ivezicBand(24, 0, 0.039)
	b.Observe(20, rand.New(rand.NewPCG(1, 1)))
}
