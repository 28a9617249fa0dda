package dust

import (
	"errors"
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// ksD returns the Kolmogorov–Smirnov statistic of the sample against cdf.
func ksD(x []float64, cdf func(float64) float64) float64 {
	sort.Float64s(x)
	n := float64(len(x))
	d := 0.0
	for i, v := range x {
		f := cdf(v)
		d = math.Max(d, math.Max(f-float64(i)/n, float64(i+1)/n-f))
	}
	return d
}

// TestSpreadDistributions: seeded samples of each kind against the
// distribution they claim, by the KS statistic. Reference CDFs from gonum
// distuv (LogNormal; Normal renormalised above 0 for the truncation). n =
// 20000; the 0.1 % critical value is 1.95/√n = 0.0138 (Kolmogorov
// distribution, common practice), so a correct sampler fails with
// probability 1e-3 for a random seed, never for this fixed one unless it changes.
func TestSpreadDistributions(t *testing.T) {
	t.Parallel()
	const n = 20000
	crit := 1.95 / math.Sqrt(n)
	r := rand.New(rand.NewPCG(11, 12))
	cases := []struct {
		kind      string
		mean, sig float64
		cdf       func(float64) float64
		checkMean bool
	}{
		{SpreadLognormal, 1.5, 0.3, distuv.LogNormal{Mu: math.Log(1.5) - 0.045, Sigma: 0.3}.CDF, true},
		{SpreadLognormal, 0.2, 1.0, distuv.LogNormal{Mu: math.Log(0.2) - 0.5, Sigma: 1.0}.CDF, true},
		{SpreadGaussian, 2.0, 0.2, truncNormCDF(2.0, 0.2), true},
		{SpreadGaussian, 0.1, 0.3, truncNormCDF(0.1, 0.3), false},
		{SpreadGaussian, 0, 0.3, truncNormCDF(0, 0.3), false},
	}
	for _, c := range cases {
		s, err := NewSpread(c.kind, c.sig)
		if err != nil {
			t.Fatal(err)
		}
		x := make([]float64, n)
		sum := 0.0
		for i := range x {
			x[i] = s.Draw(c.mean, r)
			if x[i] < 0 {
				t.Fatalf("%s: negative A_V %g", c.kind, x[i])
			}
			sum += x[i]
		}
		if d := ksD(x, c.cdf); d > crit {
			t.Errorf("%s mean %g sigma %g: KS D = %.4f > %.4f", c.kind, c.mean, c.sig, d, crit)
		}
		if c.checkMean {
			// the sample mean within 4 standard errors of Ā
			sd := c.sig
			if c.kind == SpreadLognormal {
				sd = c.mean * math.Sqrt(math.Expm1(c.sig*c.sig))
			}
			if m := sum / n; math.Abs(m-c.mean) > 4*sd/math.Sqrt(n) {
				t.Errorf("%s: sample mean %.4f, want %.4f ± %.4f", c.kind, m, c.mean, 4*sd/math.Sqrt(n))
			}
		}
	}
}

func truncNormCDF(mu, sigma float64) func(float64) float64 {
	nd := distuv.Normal{Mu: mu, Sigma: sigma}
	p0 := nd.CDF(0)
	return func(x float64) float64 {
		if x < 0 {
			return 0
		}
		return (nd.CDF(x) - p0) / (1 - p0)
	}
}

// TestSpreadZeroSigma: σ = 0 returns the input and consumes the same draws
// as σ > 0 (one normal deviate for lognormal), so streams stay aligned.
func TestSpreadZeroSigma(t *testing.T) {
	t.Parallel()
	s0, _ := NewSpread(SpreadLognormal, 0)
	s1, _ := NewSpread(SpreadLognormal, 0.5)
	r0 := rand.New(rand.NewPCG(1, 2))
	r1 := rand.New(rand.NewPCG(1, 2))
	if a := s0.Draw(0.7, r0); a != 0.7 {
		t.Errorf("sigma 0: %g", a)
	}
	s1.Draw(0.7, r1)
	if r0.Uint64() != r1.Uint64() {
		t.Error("sigma 0 and 0.5 consumed different numbers of draws")
	}
}

// TestSpreadErrors: invalid specifications and the documented panic.
func TestSpreadErrors(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		kind  string
		sigma float64
	}{{"uniform", 0.1}, {SpreadLognormal, -0.1}, {SpreadLognormal, 2.5}, {SpreadGaussian, math.NaN()}, {SpreadGaussian, math.Inf(1)}} {
		if _, err := NewSpread(c.kind, c.sigma); !errors.Is(err, ErrSpread) {
			t.Errorf("NewSpread(%q, %g): %v", c.kind, c.sigma, err)
		}
	}
	s, _ := NewSpread(SpreadGaussian, 0.1)
	func() {
		defer func() {
			if recover() == nil {
				t.Error("Draw(-1) should panic")
			}
		}()
		s.Draw(-1, rand.New(rand.NewPCG(1, 1)))
	}()
}

// BenchmarkSpreadDraw: one star's differential-reddening draw.
func BenchmarkSpreadDraw(b *testing.B) {
	s, _ := NewSpread(SpreadLognormal, 0.3)
	r := rand.New(rand.NewPCG(1, 1))
	b.ReportAllocs()
	x := 0.0
	for i := 0; i < b.N; i++ {
		x += s.Draw(1.2, r)
	}
	_ = x
}
