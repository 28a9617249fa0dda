package imf_test

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat/distuv"

	"github.com/starmock/starmock/imf"
)

// testParetoCrossCheck: a Salpeter function on [lo, hi] is a Pareto
// distribution with Xm = lo and Alpha = 2.35 - 1 = 1.35, truncated at hi.
// Source: gonum v0.17 stat/distuv.Pareto (independent implementation).
func testParetoCrossCheck(t *testing.T) {
	for _, lim := range [][2]float64{{0.1, 100}, {0.01, 150}, {0.5, 8}} {
		lo, hi := lim[0], lim[1]
		f, err := imf.NewSalpeter(lo, hi)
		if err != nil {
			t.Fatal(err)
		}
		p := distuv.Pareto{Xm: lo, Alpha: imf.SalpeterSlope - 1}
		cHi := p.CDF(hi) // renormalise for the upper cut-off
		for i := 0; i <= 50; i++ {
			m := lo * math.Pow(hi/lo, float64(i)/50)
			if got, want := f.Prob(m), p.Prob(m)/cHi; !scalar.EqualWithinRel(got, want, 1e-12) {
				t.Errorf("[%g,%g] Prob(%g) = %.15g, Pareto %.15g", lo, hi, m, got, want)
			}
			if got, want := f.CDF(m), p.CDF(m)/cHi; !scalar.EqualWithinAbsOrRel(got, want, 1e-15, 1e-12) {
				t.Errorf("[%g,%g] CDF(%g) = %.15g, Pareto %.15g", lo, hi, m, got, want)
			}
		}
		for _, q := range []float64{0.01, 0.3, 0.5, 0.9, 0.999} {
			if got, want := f.Quantile(q), p.Quantile(q*cHi); !scalar.EqualWithinRel(got, want, 1e-12) {
				t.Errorf("[%g,%g] Quantile(%g) = %.15g, Pareto %.15g", lo, hi, q, got, want)
			}
		}
		// Mean of the truncated Pareto: E[m; m<hi]/P(m<hi) with
		// E[m; m<hi] = Alpha Xm/(Alpha-1) (1 - (Xm/hi)^(Alpha-1)) (for
		// Alpha != 1), checked here against Pareto.Mean for hi -> infinity.
		a := p.Alpha
		trunc := a * lo / (a - 1) * (1 - math.Pow(lo/hi, a-1)) / cHi
		if !scalar.EqualWithinRel(p.Mean(), a*lo/(a-1), 1e-15) {
			t.Fatalf("Pareto.Mean formula mismatch")
		}
		if !scalar.EqualWithinRel(f.Mean(), trunc, 1e-12) {
			t.Errorf("[%g,%g] Mean %.15g, truncated Pareto %.15g", lo, hi, f.Mean(), trunc)
		}
	}
}
