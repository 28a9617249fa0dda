package evolve

import "math"

// Solar composition assumed by the fits. Hurley, Pols & Tout (2000) and
// Tout et al. (1996) fit the models of Pols et al. (1998), whose composition is
// X = 0.76 − 3Z, Y = 0.24 + 2Z, and whose Z = 0.02 model is the solar one.
const (
	// SolarZ is the metal mass fraction of the Sun in these fits (HPT 2000 §1:
	// ζ = log10(Z/0.02)). It is older and higher than modern photospheric values
	// (Asplund et al. 2009: 0.0134); see ZFromFeH.
	SolarZ = 0.02
	// SolarX is the solar hydrogen mass fraction X = 0.76 − 3·0.02 (Pols et al. 1998).
	SolarX = 0.76 - 3*SolarZ
)

// ZFromFeH converts an iron abundance [Fe/H] (dex) to the metal mass fraction Z
// for a scaled-solar mixture:
//
//	[Fe/H] = log10(Z/X) − log10(Z/X)_sun,   X = 0.76 − 3Z  (Pols et al. 1998)
//	⇒ Z = 0.76 r / (1 + 3r),  r = (Z/X)_sun · 10^[Fe/H],  (Z/X)_sun = 0.02/0.70
//
// The first line is common practice (scaled-solar mixture, no α enhancement);
// the X(Z) relation is that of the models HPT 2000 fit, so [Fe/H] = 0 gives
// Z = 0.02, the fits' solar metallicity. The model range Z = 1e-4 … 0.03
// corresponds to [Fe/H] ≈ −2.337 … +0.195. The function itself accepts any
// finite [Fe/H]; NewModel enforces the Z range.
func ZFromFeH(feh float64) float64 {
	r := SolarZ / SolarX * math.Pow(10, feh)
	return 0.76 * r / (1 + 3*r)
}

// FeHFromZ is the inverse of ZFromFeH: [Fe/H] = log10(Z/X) − log10(0.02/0.70)
// with X = 0.76 − 3Z. Z must be in (0, 0.25); otherwise the result is NaN.
func FeHFromZ(metallicityZ float64) float64 {
	x := 0.76 - 3*metallicityZ
	if !(metallicityZ > 0) || !(x > 0) {
		return math.NaN()
	}
	return math.Log10(metallicityZ/x) - math.Log10(SolarZ/SolarX)
}
