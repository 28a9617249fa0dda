package observe

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

func TestMaxNormalDeviate(t *testing.T) {
	t.Parallel()
	// the outermost grid point is p = 1 − 2^-54; by symmetry z = −Φ⁻¹(2^-54),
	// from gonum distuv (mathext.NormalQuantile, an implementation separate from
	// math.Erfinv); both are accurate to ~1e-15 relative, compared to 1e-9
	want := -distuv.UnitNormal.Quantile(0x1p-54)
	if math.Abs(MaxNormalDeviate-want) > 1e-9 {
		t.Errorf("MaxNormalDeviate %v, gonum quantile %v", MaxNormalDeviate, want)
	}
}

func TestExactFaintLimit(t *testing.T) {
	t.Parallel()
	b := mustBand(t, ivezicBand(24, 0.005, 0.039))
	if m, ok := b.ExactFaintLimit(); ok || !math.IsInf(m, 1) {
		t.Errorf("default S/N 5 < max deviate: limit %v %v, want +Inf false", m, ok)
	}
	// S/N threshold 20: impossible where the noise-free S/N < 20 − 8.29
	hi := mustBand(t, BandSpec{Band: "r", Limit5SigmaMag: 24, SaturationMag: 15, DetectionSNR: 20, Noise: BackgroundLimitedNoise()})
	m, ok := hi.ExactFaintLimit()
	// background-limited: S/N = 5·10^(−0.4 (m − m5)); crossing at S/N = 20 − z_max
	want := 24 - 2.5*math.Log10((20-MaxNormalDeviate)/5)
	if !ok || m < want || m > want+2e-6 {
		t.Errorf("limit %v %v, want just fainter than %v", m, ok, want)
	}
	r := rand.New(rand.NewPCG(1, 9))
	for range 20000 {
		if hi.Observe(m+0.001, r).Detected {
			t.Fatal("detection fainter than the exact limit")
		}
	}
	ct, _ := ParseCompletenessTable(strings.NewReader("mag completeness\n20 1\n23 0.5\n23.5 0\n25 0\n"), "inline")
	tb := mustBand(t, BandSpec{Band: "r", Limit5SigmaMag: 24, SaturationMag: 15, Noise: IvezicNoise(0.039), Completeness: TableCompleteness(ct)})
	if m, ok := tb.ExactFaintLimit(); !ok || m != 23.5 {
		t.Errorf("completeness-table limit %v %v, want 23.5", m, ok)
	}
}

func TestMagAtProbability(t *testing.T) {
	t.Parallel()
	// No floor, no completeness, background-limited: P = Φ(S/N − 5), so P = 0.5
	// exactly at m5 (S/N = 5) and P = Φ(−1) at S/N = 4, m = m5 + 2.5 log10(5/4).
	b := mustBand(t, BandSpec{Band: "r", Limit5SigmaMag: 24, SaturationMag: 15, Noise: BackgroundLimitedNoise()})
	if m := b.MagAtProbability(0.5); math.Abs(m-24) > 1e-8 {
		t.Errorf("50%% at %v, want 24", m)
	}
	p := distuv.UnitNormal.CDF(-1)
	if m, want := b.MagAtProbability(p), 24+2.5*math.Log10(1.25); math.Abs(m-want) > 1e-8 {
		t.Errorf("Φ(−1) at %v, want %v", m, want)
	}
	low := mustBand(t, BandSpec{Band: "r", Limit5SigmaMag: 24, SaturationMag: 15, Noise: BackgroundLimitedNoise(),
		Completeness: LogisticCompleteness(0.4, 23, 0.2)})
	if m := low.MagAtProbability(0.5); !math.IsNaN(m) {
		t.Errorf("ceiling 0.4 below p = 0.5: %v, want NaN", m)
	}
}
