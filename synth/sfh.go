package synth

import (
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
)

// AgeSampler draws stellar ages in years from a star-formation history.
type AgeSampler interface {
	// Age draws one age in yr, in [0, MaxAgeYr].
	Age(r *rand.Rand) float64
	// Range returns the youngest and oldest age the history allows, in yr.
	Range() (minYr, maxYr float64)
	// CDF returns the fraction of stars younger than ageYr.
	CDF(ageYr float64) float64
	// Quantile returns the age (yr) below which a fraction p ∈ [0, 1] of stars lie.
	Quantile(p float64) float64
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

// phi is the standard normal CDF.
func phi(x float64) float64 { return 0.5 * math.Erfc(-x/math.Sqrt2) }

// CDF of the truncated normal on [0, MaxAgeYr]; a step at the burst age without spread.
func (b burstAges) CDF(a float64) float64 {
	if b.spreadYr == 0 {
		if a < b.ageYr {
			return 0
		}
		return 1
	}
	lo, hi := phi(-b.ageYr/b.spreadYr), phi((MaxAgeYr-b.ageYr)/b.spreadYr)
	a = math.Min(math.Max(a, 0), MaxAgeYr)
	return (phi((a-b.ageYr)/b.spreadYr) - lo) / (hi - lo)
}

// Quantile of the truncated normal: μ + σ √2 erf⁻¹(2(Φ_lo + p (Φ_hi − Φ_lo)) − 1).
func (b burstAges) Quantile(p float64) float64 {
	if b.spreadYr == 0 {
		return b.ageYr
	}
	lo, hi := phi(-b.ageYr/b.spreadYr), phi((MaxAgeYr-b.ageYr)/b.spreadYr)
	q := lo + p*(hi-lo)
	a := b.ageYr + b.spreadYr*math.Sqrt2*math.Erfinv(2*q-1)
	return math.Min(math.Max(a, 0), MaxAgeYr) // guards rounding at the truncation points only
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

// CDF is linear between the two ages.
func (c constantAges) CDF(a float64) float64 {
	return math.Min(1, math.Max(0, (a-c.minYr)/(c.maxYr-c.minYr)))
}

// Quantile is linear between the two ages.
func (c constantAges) Quantile(p float64) float64 { return c.minYr + p*(c.maxYr-c.minYr) }

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

// CDF: P(age ≤ a) = P(t ≥ max − a) = 1 − F_t(max − a), F_t(x) = (1 − e^{−x/τ})/(1 − e^{−T/τ}).
func (e expAges) CDF(a float64) float64 {
	T := e.maxYr - e.minYr
	x := math.Min(T, math.Max(0, e.maxYr-a))
	return 1 - math.Expm1(-x/e.tauYr)/math.Expm1(-T/e.tauYr)
}

// Quantile inverts CDF: t = F_t⁻¹(1 − p), age = max − t.
func (e expAges) Quantile(p float64) float64 {
	T := e.maxYr - e.minYr
	t := -e.tauYr * math.Log1p((1-p)*math.Expm1(-T/e.tauYr))
	return e.maxYr - t
}

// tableAges draws ages from a piecewise-linear rate table.
type tableAges struct{ pl *piecewiseLinear }

func (t tableAges) Age(r *rand.Rand) float64 { return t.pl.Sample(r) }

// CDF of the piecewise-linear rate.
func (t tableAges) CDF(a float64) float64 { return t.pl.CDF(a) }

// Quantile of the piecewise-linear rate.
func (t tableAges) Quantile(p float64) float64 { return t.pl.Quantile(p) }
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
func (p *piecewiseLinear) Sample(r *rand.Rand) float64 { return p.Quantile(r.Float64()) }

// CDF returns the normalised integral of the density from x_0 to x.
func (p *piecewiseLinear) CDF(x float64) float64 {
	n := len(p.x)
	if x <= p.x[0] {
		return 0
	}
	if x >= p.x[n-1] {
		return 1
	}
	i := sort.SearchFloat64s(p.x, x) // x[i-1] < x <= x[i]
	x0, w0 := p.x[i-1], p.w[i-1]
	slope := (p.w[i] - w0) / (p.x[i] - x0)
	dx := x - x0
	return (p.cum[i-1] + w0*dx + 0.5*slope*dx*dx) / p.cum[n-1]
}

// Quantile returns the value below which a fraction u ∈ [0, 1] of the density lies.
func (p *piecewiseLinear) Quantile(u float64) float64 {
	target := u * p.cum[len(p.cum)-1]
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
