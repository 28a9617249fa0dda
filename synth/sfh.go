package synth

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// AgeSampler draws stellar ages in years from a star-formation history.
type AgeSampler interface {
	// Age draws one age in yr, in [0, MaxAgeYr].
	Age(r *rand.Rand) float64
	// Range returns the youngest and oldest age the history allows, in yr.
	Range() (minYr, maxYr float64)
}

// burstAges is a single burst at AgeYr with a Gaussian spread σ = SpreadYr, truncated to
// [0, MaxAgeYr] by redrawing (a truncated normal; common practice).
type burstAges struct{ ageYr, spreadYr float64 }

func (b burstAges) Age(r *rand.Rand) float64 {
	if b.spreadYr == 0 {
		return b.ageYr
	}
	for {
		a := b.ageYr + b.spreadYr*r.NormFloat64()
		if a >= 0 && a <= MaxAgeYr {
			return a
		}
	}
}

func (b burstAges) Range() (float64, float64) {
	if b.spreadYr == 0 {
		return b.ageYr, b.ageYr
	}
	return math.Max(0, b.ageYr-6*b.spreadYr), math.Min(MaxAgeYr, b.ageYr+6*b.spreadYr)
}

// constantAges forms stars at a constant rate: ages uniform in [min, max].
type constantAges struct{ minYr, maxYr float64 }

func (c constantAges) Age(r *rand.Rand) float64  { return c.minYr + (c.maxYr-c.minYr)*r.Float64() }
func (c constantAges) Range() (float64, float64) { return c.minYr, c.maxYr }

// expAges forms stars at a rate ∝ exp(−t/τ), t the time since formation began (at the
// oldest age). The age is a = max − t with t on [0, T], T = max − min, drawn by the
// inverse CDF t = −τ ln(1 − u (1 − e^{−T/τ})).
type expAges struct{ minYr, maxYr, tauYr float64 }

func (e expAges) Age(r *rand.Rand) float64 {
	T := e.maxYr - e.minYr
	u := r.Float64()
	t := -e.tauYr * math.Log1p(-u*(-math.Expm1(-T/e.tauYr)))
	return e.maxYr - t
}
func (e expAges) Range() (float64, float64) { return e.minYr, e.maxYr }

// tableAges draws ages from a piecewise-linear rate table.
type tableAges struct{ pl *piecewiseLinear }

func (t tableAges) Age(r *rand.Rand) float64 { return t.pl.Sample(r) }
func (t tableAges) Range() (float64, float64) {
	return t.pl.x[0], t.pl.x[len(t.pl.x)-1]
}

func (s *Scenario) ageSampler(p string, a AgeSpec) (AgeSampler, error) {
	switch a.Kind {
	case "burst":
		return burstAges{float64(a.AgeYr), float64(a.SpreadYr)}, nil
	case "constant":
		return constantAges{float64(a.MinAgeYr), float64(a.MaxAgeYr)}, nil
	case "exponential":
		return expAges{float64(a.MinAgeYr), float64(a.MaxAgeYr), float64(a.TauYr)}, nil
	case "table":
		path := s.resolvePath(a.Table)
		pl, err := loadPiecewiseLinear(path, "age_yr", "rate", 0, MaxAgeYr)
		if err != nil {
			return nil, s.errf(p+".table", "%v", err)
		}
		return tableAges{pl}, nil
	}
	return nil, s.errf(p+".kind", "unknown star-formation history %q", a.Kind)
}

// piecewiseLinear is a density that is linear between tabulated nodes (x_i, w_i), w ≥ 0,
// normalised over [x_0, x_n]; it is sampled by inverting its piecewise-quadratic CDF.
type piecewiseLinear struct {
	x, w, cum []float64 // cum[i] = integral from x_0 to x_i (unnormalised)
}

func newPiecewiseLinear(x, w []float64) (*piecewiseLinear, error) {
	if len(x) < 2 || len(x) != len(w) {
		return nil, fmt.Errorf("need at least two rows")
	}
	cum := make([]float64, len(x))
	for i := 1; i < len(x); i++ {
		if !(x[i] > x[i-1]) {
			return nil, fmt.Errorf("row %d: first column must increase strictly (%g after %g)", i+1, x[i], x[i-1])
		}
		cum[i] = cum[i-1] + 0.5*(w[i]+w[i-1])*(x[i]-x[i-1])
	}
	if !(cum[len(cum)-1] > 0) {
		return nil, fmt.Errorf("the weights integrate to zero")
	}
	return &piecewiseLinear{x: x, w: w, cum: cum}, nil
}

// Sample draws one value (one uniform draw).
func (p *piecewiseLinear) Sample(r *rand.Rand) float64 {
	target := r.Float64() * p.cum[len(p.cum)-1]
	i := 1
	for i < len(p.cum)-1 && p.cum[i] < target {
		i++
	}
	x0, x1, w0, w1 := p.x[i-1], p.x[i], p.w[i-1], p.w[i]
	c := target - p.cum[i-1] // area needed inside the segment
	h := x1 - x0
	slope := (w1 - w0) / h
	var dx float64
	if math.Abs(slope)*h < 1e-12*math.Max(w0, w1) {
		dx = c / w0
	} else {
		// w0 dx + slope dx²/2 = c  ⇒  dx = (−w0 + sqrt(w0² + 2 slope c)) / slope
		disc := w0*w0 + 2*slope*c
		if disc < 0 {
			disc = 0
		}
		dx = 2 * c / (w0 + math.Sqrt(disc)) // stable form of the root
	}
	v := x0 + dx
	if v > x1 {
		v = x1
	}
	return v
}
