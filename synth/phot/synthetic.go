package phot

import (
	"fmt"
	"math"

	"github.com/starmock/starmock/internal/consts"
)

// abFNu is the AB zero-point flux density 3631 Jy in W m^-2 Hz^-1 (Oke & Gunn 1983).
const abFNu = consts.ABZeroJy * consts.Jansky

// ABMagFNu returns the AB magnitude through pb of a spectrum given as a flux
// density per unit frequency, fNuWM2Hz(λ) in W m^-2 Hz^-1 as a function of
// vacuum wavelength in Å (Oke & Gunn 1983; the photon-counting form of
// Fukugita et al. 1996 and Bessell & Murphy 2012; equation numbers not given
// because they are not at hand):
//
//	m_AB = −2.5 log10( ∫ f_ν S ν⁻¹ dν / ∫ 3631 Jy S ν⁻¹ dν )
//
// with S the per-photon response (the passband's response_kind is honoured).
// The integral is the trapezoid rule on the curve refined to ≤ 5 Å steps. A
// spectrum that is zero in the band gives +Inf; negative band flux gives NaN.
func ABMagFNu(pb *Passband, fNuWM2Hz func(lambdaAA float64) float64) float64 {
	var num, den float64
	xs, ws := pb.quad()
	for k, lam := range xs {
		w := ws[k] / (lam * lam) // S λ dλ × c/λ² (c cancels in the ratio)
		num += w * fNuWM2Hz(lam)
		den += w
	}
	return -2.5 * math.Log10(num/(abFNu*den))
}

// ABMagFLambda returns the AB magnitude through pb of a spectrum given as a flux
// density per unit wavelength, fLambdaWM3(λ) in W m^-2 m^-1 (per metre of
// wavelength) as a function of vacuum wavelength in Å:
//
//	m_AB = −2.5 log10( ∫ F_λ S λ dλ / ∫ (3631 Jy · c/λ²) S λ dλ )
//
// (same definition as ABMagFNu with f_ν = F_λ λ²/c).
func ABMagFLambda(pb *Passband, fLambdaWM3 func(lambdaAA float64) float64) float64 {
	var num, den float64
	xs, ws := pb.quad()
	for k, lam := range xs {
		lamM := lam * 1e-10
		num += ws[k] * fLambdaWM3(lam)
		den += ws[k] * abFNu * consts.C / (lamM * lamM)
	}
	return -2.5 * math.Log10(num/den)
}

// BlackbodyBCAB returns the bolometric correction BC = m_bol − m_AB of a
// blackbody of temperature teffK (K) through pb, on the IAU 2015 Resolution B2
// bolometric scale (m_bol = −2.5 log10(F_bol/f0), f0 = 2.518021002e-8 W m^-2):
//
//	BC = −2.5 log10(σ T⁴ / f0) − m_AB[π B_λ(T)]
//
// The flux scale (R/d)² cancels. B_λ is consts.PlanckLambda (Planck 1901).
// teffK must be positive; a temperature so low that the band flux underflows
// gives −Inf.
func BlackbodyBCAB(pb *Passband, teffK float64) float64 {
	mAB := ABMagFLambda(pb, func(lambdaAA float64) float64 {
		return math.Pi * consts.PlanckLambda(lambdaAA*1e-10, teffK)
	})
	mBol := -2.5 * math.Log10(consts.SigmaSB*math.Pow(teffK, 4)/consts.F0BolWM2)
	return mBol - mAB
}

// BlackbodyBC returns the bolometric correction of a blackbody of temperature
// teffK (K) in band b, in the band's own magnitude system: BlackbodyBCAB for AB
// bands; for Vega bands the AB−Vega offset of the band (VegaOffset) is added,
// since m_Vega = m_AB − (m_AB − m_Vega). Returns an error for a Vega band without
// a known offset (user bands are AB only).
func BlackbodyBC(b Band, teffK float64) (float64, error) {
	bc := BlackbodyBCAB(b.Curve, teffK)
	if b.System == SystemAB {
		return bc, nil
	}
	off, err := VegaOffset(b.Name)
	if err != nil {
		return math.NaN(), err
	}
	return bc + off, nil
}

// BlackbodyFLambda returns the spectrum F_λ = π B_λ(T) in W m^-2 m^-1 of a
// blackbody of temperature teffK (K), as a function of vacuum wavelength in Å:
// the surface flux, i.e. the flux at distance d from a sphere of radius R times
// (d/R)². For synthetic photometry and band extinction coefficients (the scale
// cancels in both). It panics if teffK is not positive (a caller bug).
func BlackbodyFLambda(teffK float64) func(lambdaAA float64) float64 {
	if !(teffK > 0) {
		panic(fmt.Sprintf("phot: BlackbodyFLambda: teffK = %v, want > 0", teffK))
	}
	return func(lambdaAA float64) float64 {
		return math.Pi * consts.PlanckLambda(lambdaAA*1e-10, teffK)
	}
}
