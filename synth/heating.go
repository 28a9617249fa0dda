package synth

import (
	"math"
	"math/rand/v2"

	"github.com/starmock/starmock/synth/galaxy"
)

// Age-dependent thin-disc scale height.
//
// With field.structure.thin_disc.heating, a thin-disc component is cut into age slices
// with edges equally spaced in ln(τ + τ1) over its ages, so that the scale height
//
//	H(τ) = H · ((τ + τ1)/(τ_ref + τ1))^β          (galaxy.ThinDisc.ScaleHeightAtAgePc)
//
// changes by the same factor from one slice to the next. Slice k holds the stars of ages
// [a_k, a_{k+1}) (the component's age distribution restricted to them) in a thin disc of
// the one height H_k = H(τ_k), τ_k + τ1 = √((a_k + τ1)(a_{k+1} + τ1)), with the disc's
// scale length. The slices keep the disc's local density and share it by their
// present-day mass, each with the column its own height gives: the mid-plane amplitude
// of slice k is
//
//	A_k = C w_k / H_k,    C = ρ_thin(⊙) / Σ_j (w_j / H_j) exp(−|z⊙|/H_j)
//
// where w_k ∝ P(age in slice k) / (initial mass per present mass of the slice) is the
// slice's share of the present-day stellar mass and ρ_thin(⊙) the thin disc's density at
// the Sun in the model without heating (so the local normalisation of package galaxy is
// kept). This is the model's own construction (equal surface density per unit present
// mass at every age, as galaxy.ThinDisc.DensityAtAgeMsunPc3 assumes); within a slice the
// height varies by the slice's factor (about ±15 % with 8 slices over 0–10 Gyr).

// heatingDefaults are used for keys left out of a heating block (see ScenarioReference).
const (
	heatingDefaultIndex  = 0.5  // Wielen 1977 (diffusion: σ_z ∝ τ^0.5; from memory)
	heatingDefaultOffset = 1e8  // τ1, yr (this package's choice)
	heatingDefaultRefAge = 5e9  // τ_ref, yr: the mean age of a constant 10 Gyr history (this package's choice)
	heatingDefaultSlices = 8    // age slices
	heatingMaxSlices     = 32   // allowed range of slices: [2, heatingMaxSlices]
	heatingMinSliceProb  = 1e-9 // slices holding less of the age distribution are dropped
)

// sliceAges is an age distribution restricted to [lo, hi).
type sliceAges struct {
	base   AgeSampler
	lo, hi float64
	g0, g1 float64 // base CDF at lo and hi
}

func newSliceAges(base AgeSampler, lo, hi float64) *sliceAges {
	return &sliceAges{base: base, lo: lo, hi: hi, g0: base.CDF(lo), g1: base.CDF(hi)}
}

func (a *sliceAges) Age(r *rand.Rand) float64 { return a.Quantile(r.Float64()) }
func (a *sliceAges) Range() (float64, float64) {
	lo, hi := a.base.Range()
	return math.Max(lo, a.lo), math.Min(hi, a.hi)
}
func (a *sliceAges) CDF(x float64) float64 {
	return math.Max(0, math.Min(1, (a.base.CDF(x)-a.g0)/(a.g1-a.g0)))
}
func (a *sliceAges) Quantile(p float64) float64 {
	return math.Max(a.lo, math.Min(a.hi, a.base.Quantile(a.g0+p*(a.g1-a.g0))))
}

// fieldSlices returns the age slices of a Galactic component: the component itself,
// or the heated thin disc's slices with their models (factors are set later by
// heatedFactors, once the initial-to-present mass factors are known).
func (s *Scenario) fieldSlices(p *Plan, cp *ComponentPlan, c *Component, model *galaxy.Model) ([]*fieldSlice, error) {
	aLo, aHi := cp.Ages.Range()
	one := []*fieldSlice{{cp: cp, model: model, ageLo: 0, ageHi: math.Inf(1), factor: 1}}
	st := s.Field.Structure
	if c.Kind != "thin_disc" || st == nil || st.ThinDisc == nil || st.ThinDisc.Heating == nil {
		return one, nil
	}
	par := s.Field.GalaxyParams()
	disc := par.ThinDisc
	n := heatingDefaultSlices
	if v := st.ThinDisc.Heating.Slices; v != nil {
		n = *v
	}
	t1 := disc.HeatingTimescaleYr
	edges := make([]float64, n+1)
	for k := range edges {
		edges[k] = math.Exp(math.Log(aLo+t1)+(math.Log(aHi+t1)-math.Log(aLo+t1))*float64(k)/float64(n)) - t1
	}
	edges[0], edges[n] = aLo, aHi
	var out []*fieldSlice
	for k := 0; k < n; k++ {
		lo, hi := edges[k], edges[k+1]
		if k == n-1 {
			hi = math.Nextafter(aHi, math.Inf(1)) // the oldest age belongs to the last slice
		}
		if cp.Ages.CDF(hi)-cp.Ages.CDF(lo) < heatingMinSliceProb {
			continue
		}
		mid := math.Sqrt((lo+t1)*(hi+t1)) - t1
		h, err := disc.ScaleHeightAtAgePc(mid)
		if err != nil {
			return nil, s.errf("field.structure.thin_disc.heating", "%v", err)
		}
		sp := par
		sp.ThinDisc.ScaleHeightPc = h
		sp.ThinDisc.HeatingIndex = 0
		m, err := galaxy.NewModel(sp)
		if err != nil {
			return nil, s.errf("field.structure.thin_disc.heating", "slice %.3g–%.3g yr with scale height %.4g pc: %v", lo, hi, h, err)
		}
		sc := *cp
		sc.Ages = newSliceAges(cp.Ages, lo, hi)
		out = append(out, &fieldSlice{cp: &sc, model: m, ageLo: lo, ageHi: hi, heightPc: h})
	}
	if len(out) == 0 {
		return one, nil
	}
	out[0].ageLo = 0
	out[len(out)-1].ageHi = math.Inf(1)
	return out, nil
}

// heatedFactors sets each slice's factor: the ratio of its mid-plane amplitude A_k (see
// above) to the one its own model has, so that the slices' densities add up to the thin
// disc's density at the Sun.
func heatedFactors(slices []*fieldSlice, main *galaxy.Model) {
	sx, sy, sz := main.Frame.SunGalactocentric()
	rhoSun := main.ThinDisc.DensityMsunPc3(sx, sy, sz)
	w := make([]float64, len(slices))
	var den float64
	for k, sl := range slices {
		pk := sl.cp.Ages.(*sliceAges)
		w[k] = (pk.g1 - pk.g0) / sl.initialPerPresent
		den += w[k] / sl.heightPc * math.Exp(-math.Abs(sz)/sl.heightPc)
	}
	c := rhoSun / den
	for k, sl := range slices {
		sl.factor = c * w[k] / sl.heightPc / sl.model.ThinDisc.NormMsunPc3
	}
}

// initialPerPresent returns the initial mass per present-day mass of a component over
// 20000 primaries: masses at the stratified mass-function quantiles (i + 1/2)/n and ages
// at the history's quantiles of the golden-ratio sequence frac(i φ) (a quasi-random
// design with far less scatter than random draws, so the normalisation barely depends on
// the seed); [Fe/H] from the stream r.
func initialPerPresent(p *Plan, cp *ComponentPlan, r *rand.Rand) (float64, error) {
	var sumInit, sumPresent float64
	const nMC = 20000
	const phiFrac = 0.6180339887498949 // golden ratio − 1
	for i := 0; i < nMC; i++ {
		m := cp.IMF.Quantile((float64(i) + 0.5) / nMC)
		_, pa := math.Modf(float64(i) * phiFrac)
		a := cp.Ages.Quantile(pa)
		key, fq := quantiseFeH(cp.FeH.FeH(r))
		mod, err := p.model(key, fq)
		if err != nil {
			return 0, err
		}
		st, err := mod.Evolve(m, a)
		if err != nil {
			return 0, err
		}
		sumInit += m
		sumPresent += st.MassMsun
	}
	return sumInit / sumPresent, nil
}
