package imf

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestFastLogExp compares the table-driven log and exp with the math
// package (Go's math.Log and math.Exp, accurate to about 1 ulp) over the
// ranges the samplers use and beyond, including the fall-back inputs.
// Tolerances: log absolute 2.5e-16 (1 + |ln y|) (a few ulp of the result
// plus the reference's own rounding), exp relative 6e-16 (about 2.5 ulp of the result plus up to 1 ulp of math.Exp itself).
func TestFastLogExp(t *testing.T) {
	t.Parallel()
	r := rand.New(rand.NewPCG(5, 6))
	worstLog, worstExp := 0.0, 0.0
	for i := 0; i < 2000000; i++ {
		y := math.Exp(r.Float64()*80 - 40) // 4e-18 .. 2e17
		if i%4 == 0 {
			y = 1 + (r.Float64()-0.5)*1e-3 // around 1, where log is smallest
		}
		got, want := fastLog(y), math.Log(y)
		if e := math.Abs(got-want) / (1 + math.Abs(want)); e > worstLog {
			worstLog = e
		}
		x := (r.Float64() - 0.5) * 1398
		if i%4 == 0 {
			x = (r.Float64() - 0.5) * 1e-3
		}
		g, w := fastExp(x), math.Exp(x)
		if e := math.Abs(g-w) / w; e > worstExp {
			worstExp = e
		}
	}
	if worstLog > 2.5e-16 {
		t.Errorf("fastLog worst scaled error %.3g", worstLog)
	}
	if worstExp > 6e-16 {
		t.Errorf("fastExp worst relative error %.3g", worstExp)
	}
	for _, y := range []float64{0, -1, math.Inf(1), math.NaN(), 1e-310, math.MaxFloat64, 1, 2, 0.5} {
		if g, w := fastLog(y), math.Log(y); !(g == w || (math.IsNaN(g) && math.IsNaN(w)) || math.Abs(g-w) <= 2.5e-16*(1+math.Abs(w))) {
			t.Errorf("fastLog(%g) = %v, math.Log %v", y, g, w)
		}
	}
	for _, x := range []float64{0, -745, 710, math.Inf(-1), math.Inf(1), math.NaN(), 1, -1} {
		if g, w := fastExp(x), math.Exp(x); !(g == w || (math.IsNaN(g) && math.IsNaN(w)) || math.Abs(g-w) <= 6e-16*w) {
			t.Errorf("fastExp(%g) = %v, math.Exp %v", x, g, w)
		}
	}
	t.Logf("worst: log %.3g, exp %.3g", worstLog, worstExp)
}

// TestLn2Split checks the constants of the exp argument reduction: the high
// part has its low 21 bits clear and the two parts add up to math.Ln2.
func TestLn2Split(t *testing.T) {
	hi := expLn2Hi * expTableSize
	if math.Float64bits(hi)&(1<<21-1) != 0 {
		t.Errorf("ln2 high part has low bits set: %x", math.Float64bits(hi))
	}
	if hi+expLn2Lo*expTableSize != math.Ln2 {
		t.Errorf("ln2 split does not add up to math.Ln2")
	}
}
