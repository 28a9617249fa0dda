package observe

import "math"

// FluxZeroPointMag is the magnitude of unit flux on the scale used for every
// flux in this package:
//
//	f = 10^(−0.4 (m − 31.4))
//
// For AB bands f is the flux density in nanojansky: m_AB = −2.5 log10(f_ν) − 48.60
// with f_ν in erg s⁻¹ cm⁻² Hz⁻¹ (Oke & Gunn 1983, ApJ 266, 713, eq. 1), and
// 1 nJy = 1e−32 erg s⁻¹ cm⁻² Hz⁻¹ gives 80 − 48.60 = 31.4 exactly. For Vega bands
// the same formula is used, so f is a flux relative to the Vega zero point of the
// band (1 unit = 10^(−12.56) times the flux of a 0-mag star); it is not a
// nanojansky value then.
const FluxZeroPointMag = 31.4

// FluxFromMag converts a magnitude to a flux on the FluxZeroPointMag scale
// (nJy for AB bands, Vega-relative units for Vega bands):
//
//	f = 10^(−0.4 (m − 31.4))
//
// m = +Inf gives 0, m = −Inf gives +Inf and NaN gives NaN.
func FluxFromMag(mag float64) float64 {
	return math.Exp(-0.4 * math.Ln10 * (mag - FluxZeroPointMag)) // Pogson's ratio, definition of m
}

// MagFromFlux converts a flux on the FluxZeroPointMag scale to a magnitude:
//
//	m = 31.4 − 2.5 log10(f)
//
// A non-positive or NaN flux has no magnitude and gives NaN (never a clamp).
func MagFromFlux(flux float64) float64 {
	if !(flux > 0) {
		return math.NaN()
	}
	return FluxZeroPointMag - 2.5*math.Log10(flux)
}

// pogson is 2.5/ln 10 ≈ 1.0857, the factor of the first-order propagation
// σ_m = (2.5/ln 10) σ_f / f (common practice).
const pogson = 2.5 / math.Ln10
