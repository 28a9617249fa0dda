package imf

// Parameters of the Kroupa (2001, MNRAS 322, 231, eq. 2) multi-segment power
// law dN/dm ∝ m^-alpha. The paper's segments 0.5–1 Msun and above 1 Msun have
// the same alpha = 2.3, so one break at 0.5 Msun suffices.
const (
	KroupaBreak1Msun = 0.08 // first break mass, Msun (eq. 2)
	KroupaBreak2Msun = 0.5  // second break mass, Msun (eq. 2)
	KroupaAlpha0     = 0.3  // alpha for 0.01–0.08 Msun (eq. 2; ±0.7)
	KroupaAlpha1     = 1.3  // alpha for 0.08–0.5 Msun (eq. 2; ±0.5)
	KroupaAlpha2     = 2.3  // alpha above 0.5 Msun (eq. 2; ±0.3 to 1 Msun, ±0.7 above)
)

// NewKroupa returns the Kroupa (2001) canonical broken power law
//
//	dN/dm ∝ m^-0.3   for 0.01 <= m < 0.08 Msun
//	        m^-1.3   for 0.08 <= m < 0.5
//	        m^-2.3   for 0.5  <= m
//
// (Kroupa 2001, MNRAS 322, 231, eq. 2), continuous at the breaks and
// normalised on [loMsun, hiMsun]. The substellar segment is used only when
// loMsun < 0.08. Limits of 0 select DefaultLoMsun (0.1) and DefaultHiMsun
// (100); limits must lie in [MinMassMsun, MaxMassMsun] = [0.01, 150] Msun,
// otherwise an error wrapping ErrInvalidSpec is returned.
func NewKroupa(loMsun, hiMsun float64) (*PowerLaw, error) {
	return newBroken(KindKroupa, []float64{KroupaBreak1Msun, KroupaBreak2Msun},
		[]float64{KroupaAlpha0, KroupaAlpha1, KroupaAlpha2}, loMsun, hiMsun, MinMassMsun, MaxMassMsun)
}
