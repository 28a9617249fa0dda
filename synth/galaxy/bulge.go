package galaxy

import "math"

// Bulge is the triaxial bulge/bar, model G2 of Dwek et al. 1995 (ApJ 445, 716; the
// Gaussian-type "G2" family, from memory):
//
//	ρ = ρ0 exp(−r_s²/2),  r_s = ( [(x'/x0)² + (y'/y0)²]² + (z'/z0)⁴ )^(1/4)
//
// in the bar frame: x' along the bar's major axis, which lies in the plane at BarAngleDeg
// from the Sun–Galactic-centre line with its near end at positive longitude, z' = Z.
// ρ0 follows from the total mass: M = ρ0 x0 y0 z0 I_G2 with
// I_G2 = ∫ exp(−r_s²/2) d³u = 20.64819186766789 (scipy 1.10.1 dblquad of
// π ∫₀^∞ ds ∫ dw exp(−√(s² + w⁴)/2); rechecked with gonum quad in the tests).
//
// Defaults, all from memory: x0, y0, z0 = 1580, 620, 430 pc (Dwek et al. 1995 G2 fit
// to COBE/DIRBE as commonly quoted), bar angle 27° and stellar mass 1.5e10 Msun
// (Bland-Hawthorn & Gerhard 2016, sec. 4: bar angle 27 ± 2° for the bulge, bulge stellar
// mass 1.4–1.7 × 10¹⁰ Msun). No outer cut-off is applied (the Gaussian fall-off makes the
// bulge density below 1e-9 of its central value beyond ~4 kpc along the major axis).
type Bulge struct {
	MassMsun    float64 // total present-day stellar mass, Msun. Default 1.5e10 (BHG16, from memory)
	X0Pc        float64 // major-axis scale length, pc. Default 1580 (Dwek et al. 1995 G2, from memory)
	Y0Pc        float64 // intermediate-axis scale length, pc. Default 620 (from memory)
	Z0Pc        float64 // vertical scale length, pc. Default 430 (from memory)
	BarAngleDeg float64 // angle between the major axis and the Sun–centre line, deg. Default 27 (BHG16, from memory)

	norm       float64 // ρ0 = M / (x0 y0 z0 I_G2)
	cosA, sinA float64
	massFactor
}

// BulgeG2VolumeIntegral is I_G2 = ∫ exp(−r_s²/2) d³u over all space in units of
// x0 y0 z0 (see Bulge).
const BulgeG2VolumeIntegral = 20.64819186766789

// Name returns "bulge".
func (b *Bulge) Name() string { return BulgeName }

// CentralDensityMsunPc3 returns ρ0 = M / (x0 y0 z0 I_G2) (valid after NewModel or Init).
func (b *Bulge) CentralDensityMsunPc3() float64 { return b.norm }

// Init validates the parameters and precomputes ρ0 and the bar rotation; NewModel calls
// it, and a caller who changes fields of a Model's Bulge must call it again.
func (b *Bulge) Init() error {
	if !(b.MassMsun >= 0 && b.MassMsun <= 1e12) {
		return rangeErr("bulge mass_msun", b.MassMsun, "Msun", "[0, 1e12]")
	}
	for _, v := range []struct {
		n string
		v float64
	}{{"bulge x0_pc", b.X0Pc}, {"bulge y0_pc", b.Y0Pc}, {"bulge z0_pc", b.Z0Pc}} {
		if !(v.v >= 10 && v.v <= 10000) {
			return rangeErr(v.n, v.v, "pc", "[10, 10000]")
		}
	}
	if !(b.BarAngleDeg >= -90 && b.BarAngleDeg <= 90) {
		return rangeErr("bulge bar_angle_deg", b.BarAngleDeg, "deg", "[-90, 90]")
	}
	b.norm = b.MassMsun / (b.X0Pc * b.Y0Pc * b.Z0Pc * BulgeG2VolumeIntegral)
	b.sinA, b.cosA = math.Sincos(b.BarAngleDeg * degToRad)
	return nil
}

// DensityMsunPc3 evaluates the G2 law (see Bulge) at Galactocentric Cartesian (x, y, z)
// in pc.
func (b *Bulge) DensityMsunPc3(xPc, yPc, zPc float64) float64 {
	// bar frame: major axis toward (−cos α, sin α) in (X, Y) (near end at l > 0)
	xb := (-xPc*b.cosA + yPc*b.sinA) / b.X0Pc
	yb := (xPc*b.sinA + yPc*b.cosA) / b.Y0Pc
	zb := zPc / b.Z0Pc
	p := xb*xb + yb*yb
	rs2 := math.Sqrt(p*p + zb*zb*zb*zb) // r_s² (Dwek et al. 1995, G2)
	return b.norm * math.Exp(-0.5*rs2)  // Dwek et al. 1995, G2
}
