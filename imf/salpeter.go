package imf

// SalpeterSlope is the exponent alpha of dN/dm ∝ m^-alpha found by Salpeter
// (1955, ApJ 121, 161), equivalent to x = 1.35 for dN/dlog m.
const SalpeterSlope = 2.35

// NewSalpeter returns the Salpeter (1955) single power law
//
//	dN/dm ∝ m^-2.35,   loMsun <= m <= hiMsun
//
// normalised on [loMsun, hiMsun]. Limits of 0 select DefaultLoMsun (0.1) and
// DefaultHiMsun (100); limits must lie in [MinMassMsun, MaxMassMsun] =
// [0.01, 150] Msun, otherwise an error wrapping ErrInvalidSpec is returned.
// Salpeter fitted roughly 0.4–10 Msun; using it outside that range is the
// usual, documented extrapolation.
func NewSalpeter(loMsun, hiMsun float64) (*PowerLaw, error) {
	return newBroken(KindSalpeter, nil, []float64{SalpeterSlope}, loMsun, hiMsun, MinMassMsun, MaxMassMsun)
}
