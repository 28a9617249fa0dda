package galaxy

import "math"

// ThickDisc is the thick stellar disc, a double exponential of the same form as the thin
// disc (Jurić et al. 2008, eq. 22):
//
//	ρ(R, z) = ρ0 exp(−(R − R_ref)/L − |z|/H)
//
// In a Model its mid-plane density at the Sun's radius is the fraction f of the thin
// disc's, ρ0 = f ρ0,thin (Jurić et al. 2008, eq. 23; f = Params.ThickToThinLocal).
type ThickDisc struct {
	NormMsunPc3   float64 // ρ0 at RRefPc, z = 0, Msun pc⁻³ (set by NewModel)
	RRefPc        float64 // reference radius, pc
	ScaleLengthPc float64 // L, pc. Default 3600 pc: Jurić et al. 2008 (abstract), L2 = 3.6 kpc
	ScaleHeightPc float64 // H, pc. Default 900 pc: Jurić et al. 2008 (abstract), H2 = 900 pc
	massFactor
}

// Name returns "thick_disc".
func (d *ThickDisc) Name() string { return ThickDiscName }

// DensityMsunPc3 evaluates the double exponential (see ThickDisc) at Galactocentric
// Cartesian (x, y, z) in pc.
func (d *ThickDisc) DensityMsunPc3(xPc, yPc, zPc float64) float64 {
	r := math.Sqrt(xPc*xPc + yPc*yPc)
	return d.NormMsunPc3 * math.Exp(-(r-d.RRefPc)/d.ScaleLengthPc-math.Abs(zPc)/d.ScaleHeightPc) // Jurić et al. 2008 eq. 22
}

func (d *ThickDisc) validate() error {
	if !(d.ScaleLengthPc >= 100 && d.ScaleLengthPc <= 20000) {
		return rangeErr("thick_disc scale_length_pc", d.ScaleLengthPc, "pc", "[100, 20000]")
	}
	if !(d.ScaleHeightPc >= 10 && d.ScaleHeightPc <= 10000) {
		return rangeErr("thick_disc scale_height_pc", d.ScaleHeightPc, "pc", "[10, 10000]")
	}
	return nil
}
