package synth

import (
	"math"
	"math/rand/v2"
)

// Metallicity range of the evolution model in [Fe/H] (Z = 1e-4 to 0.03 with Z☉ = 0.02 and
// [Fe/H] = log10(Z/Z☉): see package evolve).
const (
	MinFeH = -2.3
	MaxFeH = 0.17
)

// FeHSampler draws [Fe/H] in dex.
type FeHSampler interface {
	FeH(r *rand.Rand) float64
	Range() (lo, hi float64)
	// CDF returns the fraction of stars with [Fe/H] below fehDex.
	CDF(fehDex float64) float64
	// Quantile returns the [Fe/H] (dex) below which a fraction p ∈ [0, 1] of stars lie.
	Quantile(p float64) float64
}

type fixedFeH float64

func (f fixedFeH) FeH(*rand.Rand) float64    { return float64(f) }
func (f fixedFeH) Range() (float64, float64) { return float64(f), float64(f) }
func (f fixedFeH) Quantile(float64) float64  { return float64(f) }
func (f fixedFeH) CDF(x float64) float64 {
	if x < float64(f) {
		return 0
	}
	return 1
}

// gaussFeH is a normal distribution truncated to the evolution model's range by redrawing:
// the tails outside [MinFeH, MaxFeH] cannot be evolved, and dropping them is documented in
// the README rather than clamping them onto the edges.
type gaussFeH struct {
	mean, sigma float64
	pLo, pHi    float64 // Φ at MinFeH and MaxFeH
}

func newGaussFeH(mean, sigma float64) gaussFeH {
	return gaussFeH{mean: mean, sigma: sigma, pLo: phi((MinFeH - mean) / sigma), pHi: phi((MaxFeH - mean) / sigma)}
}

func (g gaussFeH) FeH(r *rand.Rand) float64 {
	for {
		v := g.mean + g.sigma*r.NormFloat64()
		if v >= MinFeH && v <= MaxFeH {
			return v
		}
	}
}
func (g gaussFeH) Range() (float64, float64) {
	return math.Max(MinFeH, g.mean-6*g.sigma), math.Min(MaxFeH, g.mean+6*g.sigma)
}

// CDF of the normal truncated to [MinFeH, MaxFeH]: (Φ(z) − Φ(z_min)) / (Φ(z_max) − Φ(z_min)).
func (g gaussFeH) CDF(x float64) float64 {
	x = math.Max(MinFeH, math.Min(MaxFeH, x))
	return (phi((x-g.mean)/g.sigma) - g.pLo) / (g.pHi - g.pLo)
}

// Quantile inverts CDF: x = μ + σ Φ⁻¹(Φ(z_min) + p (Φ(z_max) − Φ(z_min))), with
// Φ⁻¹(y) = −√2 erfc⁻¹(2y).
func (g gaussFeH) Quantile(p float64) float64 {
	y := g.pLo + p*(g.pHi-g.pLo)
	x := g.mean - g.sigma*math.Sqrt2*math.Erfcinv(2*y)
	return math.Max(MinFeH, math.Min(MaxFeH, x))
}

type tableFeH struct{ pl *piecewiseLinear }

func (t tableFeH) FeH(r *rand.Rand) float64 { return t.pl.Sample(r) }
func (t tableFeH) Range() (float64, float64) {
	return t.pl.x[0], t.pl.x[len(t.pl.x)-1]
}
func (t tableFeH) CDF(x float64) float64      { return t.pl.CDF(x) }
func (t tableFeH) Quantile(p float64) float64 { return t.pl.Quantile(p) }

func (s *Scenario) fehSampler(p string, m Metallicity) (FeHSampler, error) {
	switch m.Kind {
	case "fixed":
		if m.FeH < MinFeH || m.FeH > MaxFeH {
			return nil, s.errf(p+".feh", "%g dex is out of range; allowed: %g to %g", m.FeH, MinFeH, MaxFeH)
		}
		return fixedFeH(m.FeH), nil
	case "gaussian":
		if m.FeH < MinFeH || m.FeH > MaxFeH {
			return nil, s.errf(p+".feh", "%g dex is out of range; allowed: %g to %g", m.FeH, MinFeH, MaxFeH)
		}
		return newGaussFeH(m.FeH, m.SigmaDex), nil
	case "table":
		pl, err := loadPiecewiseLinear(s.resolvePath(m.Table), "feh", "weight", MinFeH, MaxFeH)
		if err != nil {
			return nil, s.errf(p+".table", "%v", err)
		}
		return tableFeH{pl}, nil
	}
	return nil, s.errf(p+".kind", "unknown metallicity distribution %q", m.Kind)
}

// fehStep is the resolution of the per-worker evolution-model cache in dex: a drawn
// [Fe/H] is rounded to it, and the catalogue reports the rounded value, so the truth
// columns are exactly what was evolved.
const fehStep = 0.01

func quantiseFeH(feh float64) (key int, rounded float64) {
	key = int(math.Round(feh / fehStep))
	return key, float64(key) * fehStep
}
