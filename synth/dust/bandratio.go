package dust

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"github.com/starmock/starmock/internal/consts"
)

// Passband is a photometric response curve handed over as plain slices (so this
// package needs no photometry package): wavelengths in Å, strictly increasing,
// and throughputs ≥ 0, interpolated linearly between points and zero outside
// them. Photon says how the throughput is meant (see the reference kit's
// passbands README, "response_kind"):
//
//   - Photon true: S(λ) is a per-photon response; the band signal is
//     ∝ ∫ F_λ S λ dλ (photon counting).
//   - Photon false: an energy-type response R(λ); the signal is ∝ ∫ F_λ R dλ.
type Passband struct {
	WavelengthAA, Throughput []float64
	Photon                   bool
}

// ErrPassband marks a malformed passband (lengths, order, negative or
// non-finite values, no positive throughput).
var ErrPassband = errors.New("invalid passband")

// ErrSpectrum marks a spectrum that is negative, non-finite or zero over the band.
var ErrSpectrum = errors.New("invalid spectrum")

// Validate checks the passband: equal lengths, at least two points, finite
// strictly increasing positive wavelengths, finite non-negative throughputs
// with at least one positive value. Errors wrap ErrPassband and name the index.
func (pb Passband) Validate() error {
	n := len(pb.WavelengthAA)
	if n != len(pb.Throughput) {
		return fmt.Errorf("dust: passband: %w: %d wavelengths but %d throughputs", ErrPassband, n, len(pb.Throughput))
	}
	if n < 2 {
		return fmt.Errorf("dust: passband: %w: %d points, need at least 2", ErrPassband, n)
	}
	pos := false
	for i := 0; i < n; i++ {
		w, s := pb.WavelengthAA[i], pb.Throughput[i]
		if !(w > 0) || math.IsInf(w, 1) {
			return fmt.Errorf("dust: passband: %w: wavelength[%d] = %g Å, must be finite and > 0", ErrPassband, i, w)
		}
		if i > 0 && !(w > pb.WavelengthAA[i-1]) {
			return fmt.Errorf("dust: passband: %w: wavelength[%d] = %g Å not above wavelength[%d] = %g Å (must increase strictly)",
				ErrPassband, i, w, i-1, pb.WavelengthAA[i-1])
		}
		if !(s >= 0) || math.IsInf(s, 1) {
			return fmt.Errorf("dust: passband: %w: throughput[%d] = %g at %g Å, must be finite and >= 0", ErrPassband, i, s, w)
		}
		if s > 0 {
			pos = true
		}
	}
	if !pos {
		return fmt.Errorf("dust: passband: %w: all throughputs are zero", ErrPassband)
	}
	return nil
}

// quadStepAA is the largest sub-step of the band quadrature: each interval of
// the passband table is cut into an even number of Simpson panels no wider
// than this (5 Å keeps the Planck and extinction factors, which vary on
// scales of hundreds of Å, exact to far below 1e-6 relative).
const quadStepAA = 5.0

// bandPlan holds the quadrature nodes of one passband: wavelength (Å), weight
// (Simpson weight × throughput × λ for photon response, or × 1) and the law's
// A_λ/A_V at the node. Nodes of zero weight are dropped.
type bandPlan struct {
	lamAA, wt, a []float64
}

// newBandPlan validates pb and builds its quadrature against law.
func newBandPlan(law Law, pb Passband) (*bandPlan, error) {
	if err := pb.Validate(); err != nil {
		return nil, err
	}
	p := &bandPlan{}
	x, s := pb.WavelengthAA, pb.Throughput
	for i := 0; i+1 < len(x); i++ {
		if s[i] == 0 && s[i+1] == 0 {
			continue
		}
		h := x[i+1] - x[i]
		m := 2 * int(math.Ceil(h/(2*quadStepAA)))
		dx := h / float64(m)
		for k := 0; k <= m; k++ {
			lam := x[i] + float64(k)*dx
			if k == m {
				lam = x[i+1]
			}
			c := 2.0 // composite Simpson: 1 4 2 4 … 4 1 (× dx/3)
			switch {
			case k == 0 || k == m:
				c = 1
			case k%2 == 1:
				c = 4
			}
			f := float64(k) / float64(m)
			thr := s[i]*(1-f) + s[i+1]*f // linear interpolation of the table
			w := c * dx / 3 * thr
			if pb.Photon {
				w *= lam // per-photon response: ∫ F_λ S λ dλ
			}
			if w == 0 {
				continue
			}
			p.lamAA = append(p.lamAA, lam)
			p.wt = append(p.wt, w)
		}
	}
	// merge nodes shared by neighbouring intervals (same wavelength)
	p.merge()
	p.a = make([]float64, len(p.lamAA))
	for k, lam := range p.lamAA {
		a, err := law.ALambdaOverAV(lam)
		if err != nil {
			lo, hi := pb.WavelengthAA[0], pb.WavelengthAA[len(pb.WavelengthAA)-1]
			return nil, fmt.Errorf("dust: passband %g–%g Å has non-zero throughput at %g Å: %w", lo, hi, lam, err)
		}
		p.a[k] = a
	}
	return p, nil
}

func (p *bandPlan) merge() {
	if !sort.Float64sAreSorted(p.lamAA) {
		panic("dust: internal error: quadrature nodes out of order")
	}
	j := 0
	for k := range p.lamAA {
		if j > 0 && p.lamAA[k] == p.lamAA[j-1] {
			p.wt[j-1] += p.wt[k]
			continue
		}
		p.lamAA[j], p.wt[j] = p.lamAA[k], p.wt[k]
		j++
	}
	p.lamAA, p.wt = p.lamAA[:j], p.wt[:j]
}

// ln10Over25 is 0.4 ln 10: 10^(−0.4 A) = exp(−ln10Over25 · A).
const ln10Over25 = 0.4 * math.Ln10

// ratio returns A_X/A_V given the flux f at the plan's nodes (no allocation):
//
//	A_X = −2.5 log10(1 + Σ W F (10^(−0.4 A_V a) − 1) / Σ W F)
//
// written with expm1/log1p so that it is exact as A_V → 0, where the ratio
// tends to Σ W F a / Σ W F.
func (p *bandPlan) ratio(flux func(k int) float64, avMag float64) float64 {
	var den, num float64
	if avMag == 0 {
		for k := range p.wt {
			wf := p.wt[k] * flux(k)
			den += wf
			num += wf * p.a[k]
		}
		return num / den
	}
	for k := range p.wt {
		wf := p.wt[k] * flux(k)
		den += wf
		num += wf * math.Expm1(-ln10Over25*avMag*p.a[k])
	}
	return -math.Log1p(num/den) / ln10Over25 / avMag
}

// BlackbodyFlux returns the spectrum of a blackbody of temperature teffK (K)
// as a function of wavelength in Å, for BandRatio: B_λ(T) in W m⁻³ sr⁻¹ from
// consts.PlanckLambda (Planck 1901). Panics if teffK is not finite and > 0.
func BlackbodyFlux(teffK float64) func(lambdaAA float64) float64 {
	if !(teffK > 0) || math.IsInf(teffK, 1) {
		panic(fmt.Sprintf("dust: BlackbodyFlux: teffK %g K must be finite and > 0", teffK))
	}
	return func(lambdaAA float64) float64 { return consts.PlanckLambda(lambdaAA*1e-10, teffK) }
}

// BandRatio returns A_X/A_V for the passband pb, for a source of spectrum
// spectrum(λ) (F_λ, flux per unit wavelength in any fixed unit; λ in Å)
// seen through avMag magnitudes of V-band extinction of the given law, by
// synthetic photometry:
//
//	A_X = −2.5 log10( ∫ S F 10^(−0.4 A_V a(λ)) w dλ / ∫ S F w dλ ),  ratio = A_X / A_V
//
// with a(λ) = law.ALambdaOverAV(λ) and w = λ for a per-photon response or 1 for
// an energy-type one (see Passband). As avMag → 0 the ratio tends to the
// flux-weighted mean of a(λ), ∫ S F a w / ∫ S F w, which is returned for
// avMag = 0; the formula is evaluated with expm1/log1p so it is continuous
// there. The integrals are composite Simpson sums on the linearly interpolated
// throughput table with sub-steps ≤ 5 Å.
//
// Errors: a malformed passband (ErrPassband), non-zero throughput outside the
// law's range (ErrWavelengthRange), negative or non-finite avMag
// (ErrNegativeAV), a spectrum that is negative or not finite anywhere the
// throughput is positive, or zero over the whole band (ErrSpectrum).
// Not for per-star use in a pipeline: it allocates; see BandTable.
func BandRatio(law Law, pb Passband, spectrum func(lambdaAA float64) float64, avMag float64) (float64, error) {
	if err := CheckAV(avMag); err != nil {
		return 0, err
	}
	p, err := newBandPlan(law, pb)
	if err != nil {
		return 0, err
	}
	f := make([]float64, len(p.lamAA))
	tot := 0.0
	for k, lam := range p.lamAA {
		v := spectrum(lam)
		if !(v >= 0) || math.IsInf(v, 1) {
			return 0, fmt.Errorf("dust: spectrum at %g Å is %g: %w (must be finite and >= 0)", lam, v, ErrSpectrum)
		}
		f[k] = v
		tot += v * p.wt[k]
	}
	if !(tot > 0) || math.IsInf(tot, 1) {
		return 0, fmt.Errorf("dust: spectrum: %w: band-weighted flux is %g (zero or overflowing over the band)", ErrSpectrum, tot)
	}
	return p.ratio(func(k int) float64 { return f[k] }, avMag), nil
}
