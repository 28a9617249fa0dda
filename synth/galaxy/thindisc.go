package galaxy

import "math"

// ThinDisc is the thin stellar disc: a double exponential in Galactocentric cylindrical
// radius R and height z (Jurić et al. 2008, eq. 22, with z measured from the mid-plane):
//
//	ρ(R, z) = ρ0 exp(−(R − R_ref)/L − |z|/H)
//
// with ρ0 = NormMsunPc3 the mid-plane density at R = RRefPc (the Sun's cylindrical radius
// in a Model). The law is used at all R and z (no inner hole, no truncation).
type ThinDisc struct {
	NormMsunPc3   float64 // ρ0: mid-plane density at RRefPc, Msun pc⁻³ (set by NewModel from the local density)
	RRefPc        float64 // reference radius of NormMsunPc3, pc
	ScaleLengthPc float64 // L, pc. Default 2600 pc: Jurić et al. 2008 (abstract), L1 = 2.6 kpc
	ScaleHeightPc float64 // H, pc. Default 300 pc: Jurić et al. 2008 (abstract), H1 = 300 pc (bias-corrected for binaries)

	// Age-dependent scale height (optional): see ScaleHeightAtAgePc. HeatingIndex = 0
	// (the default) means one scale height for all ages.
	HeatingIndex       float64 // β of H(τ) ∝ (τ + τ1)^β; 0 = off. Suggested 0.5 (see ScaleHeightAtAgePc)
	HeatingTimescaleYr float64 // τ1, yr
	HeatingRefAgeYr    float64 // τ_ref: the age at which H(τ) = ScaleHeightPc, yr
	massFactor
}

// Name returns "thin_disc".
func (d *ThinDisc) Name() string { return ThinDiscName }

// DensityMsunPc3 evaluates the double exponential (see ThinDisc) at Galactocentric
// Cartesian (x, y, z) in pc.
func (d *ThinDisc) DensityMsunPc3(xPc, yPc, zPc float64) float64 {
	r := math.Sqrt(xPc*xPc + yPc*yPc)
	return d.NormMsunPc3 * math.Exp(-(r-d.RRefPc)/d.ScaleLengthPc-math.Abs(zPc)/d.ScaleHeightPc) // Jurić et al. 2008 eq. 22
}

// MaxAgeYr is the largest stellar age accepted by age-dependent laws, 14 Gyr (older than
// the Universe's 13.8 Gyr).
const MaxAgeYr = 14e9

// ScaleHeightAtAgePc returns the thin-disc scale height of stars of age ageYr in
// [0, 14e9] yr:
//
//	H(τ) = H · ((τ + τ1)/(τ_ref + τ1))^β
//
// The form follows from disc heating with the vertical velocity dispersion growing as
// σ_z ∝ (τ + τ1)^β (Wielen 1977, A&A 60, 263: diffusion gives β ≈ 0.5; from memory) and the
// assumption H ∝ σ_z (a fixed, roughly harmonic vertical potential near the plane; our
// documented simplification, not a published calibration). With HeatingIndex = 0 it
// returns ScaleHeightPc for every valid age. Errors outside the age range.
func (d *ThinDisc) ScaleHeightAtAgePc(ageYr float64) (float64, error) {
	if !(ageYr >= 0 && ageYr <= MaxAgeYr) {
		return 0, rangeErr("thin_disc age_yr", ageYr, "yr", "[0, 1.4e10]")
	}
	if d.HeatingIndex == 0 {
		return d.ScaleHeightPc, nil
	}
	return d.ScaleHeightPc * math.Pow((ageYr+d.HeatingTimescaleYr)/(d.HeatingRefAgeYr+d.HeatingTimescaleYr), d.HeatingIndex), nil
}

// DensityAtAgeMsunPc3 returns the density of the stars of age ageYr if they formed a disc
// with the age-dependent scale height H(τ) of ScaleHeightAtAgePc and the same surface
// density as the disc as a whole (so that mixing ages keeps the disc's column):
//
//	ρ_τ(R, z) = ρ0 (H/H(τ)) exp(−(R − R_ref)/L − |z|/H(τ))
//
// It equals DensityMsunPc3 when HeatingIndex = 0. A pipeline that draws ages first can use
// it to weight or place stars by age; ShellMasses uses the age-independent law. Errors for
// ages outside [0, 14e9] yr.
func (d *ThinDisc) DensityAtAgeMsunPc3(xPc, yPc, zPc, ageYr float64) (float64, error) {
	h, err := d.ScaleHeightAtAgePc(ageYr)
	if err != nil {
		return 0, err
	}
	r := math.Sqrt(xPc*xPc + yPc*yPc)
	return d.NormMsunPc3 * d.ScaleHeightPc / h * math.Exp(-(r-d.RRefPc)/d.ScaleLengthPc-math.Abs(zPc)/h), nil
}

func (d *ThinDisc) validate() error {
	if !(d.ScaleLengthPc >= 100 && d.ScaleLengthPc <= 20000) {
		return rangeErr("thin_disc scale_length_pc", d.ScaleLengthPc, "pc", "[100, 20000]")
	}
	if !(d.ScaleHeightPc >= 10 && d.ScaleHeightPc <= 5000) {
		return rangeErr("thin_disc scale_height_pc", d.ScaleHeightPc, "pc", "[10, 5000]")
	}
	if !(d.HeatingIndex >= 0 && d.HeatingIndex <= 2) {
		return rangeErr("thin_disc heating_index", d.HeatingIndex, "-", "[0, 2]")
	}
	if d.HeatingIndex > 0 {
		if !(d.HeatingTimescaleYr > 0 && d.HeatingTimescaleYr <= MaxAgeYr) {
			return rangeErr("thin_disc heating_timescale_yr", d.HeatingTimescaleYr, "yr", "(0, 1.4e10]")
		}
		if !(d.HeatingRefAgeYr >= 0 && d.HeatingRefAgeYr <= MaxAgeYr) {
			return rangeErr("thin_disc heating_ref_age_yr", d.HeatingRefAgeYr, "yr", "[0, 1.4e10]")
		}
	}
	return nil
}
