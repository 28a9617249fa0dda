package galaxy

import "math"

// Halo is the stellar halo: an oblate (flattened) power law in the ellipsoidal radius
// r_q = sqrt(R² + (z/q)²) (Jurić et al. 2008, eq. 24), softened by a core radius a so the
// density stays finite at the Galactic centre:
//
//	ρ(R, z) = ρ0 ((R_ref² + a²) / (R² + (z/q)² + a²))^(n/2)
//
// ρ0 = NormMsunPc3 is the density at (R_ref, 0); with a = 0 this is exactly Jurić's
// ρ0 (R_ref / r_q)^n. The core is our addition (Jurić et al. fit only r_q of several kpc);
// with the default a = 500 pc it changes the law by less than 1 per cent at r_q > 4.8 kpc
// for n = 2.8. In a Model, ρ0 = f_h ρ0,thin (Jurić et al. 2008, eq. 24 normalisation;
// f_h = Params.HaloToThinLocal).
//
// Optional outer break (off by default, BreakRadiusPc = 0): beyond the ellipsoidal radius
// r_b the law steepens to index n_out, continuous at r_b:
//
//	ρ(r_q > r_b) = ρ(r_b) (r_b² + a²)^(n_out/2) / (r_q² + a²)^(n_out/2)
//
// Sesar, Jurić & Ivezić 2011 (ApJ 731, 4, abstract; population_values.tsv rows
// sesar2011_halo_*) find n = 2.62 inside r ≈ 28 kpc and 3.8 outside. With the defaults the
// halo holds 4.6e9 Msun within 100 kpc of the Sun (3.8e9 with that break; computed by
// ShellMasses), more than the ~1e9 Msun usually quoted for the stellar halo (from memory):
// Jurić's normalisation counts stars of one colour range, applied here to mass.
type Halo struct {
	NormMsunPc3    float64 // ρ0 at (RRefPc, 0), Msun pc⁻³ (set by NewModel)
	RRefPc         float64 // reference radius, pc
	AxisRatioQ     float64 // q = c/a. Default 0.64: Jurić et al. 2008 (abstract)
	PowerLawIndexN float64 // n. Default 2.8: Jurić et al. 2008 (abstract; 2.77 in their Table 10, from memory)
	CoreRadiusPc   float64 // a, pc. Default 500 pc (our choice, see above)
	BreakRadiusPc  float64 // r_b, pc; 0 = no break (default). Sesar et al. 2011: 28000
	OuterIndexN    float64 // n_out beyond r_b. Sesar et al. 2011: 3.8
	massFactor
}

// Name returns "halo".
func (h *Halo) Name() string { return HaloName }

// DensityMsunPc3 evaluates the softened power law (see Halo) at Galactocentric Cartesian
// (x, y, z) in pc.
func (h *Halo) DensityMsunPc3(xPc, yPc, zPc float64) float64 {
	zq := zPc / h.AxisRatioQ
	a2 := h.CoreRadiusPc * h.CoreRadiusPc
	rq2 := xPc*xPc + yPc*yPc + zq*zq + a2
	if rq2 == 0 {
		return math.Inf(1) // only with a = 0 exactly at the centre (the pure power law diverges)
	}
	ref2 := h.RRefPc*h.RRefPc + a2
	if h.BreakRadiusPc > 0 {
		b2 := h.BreakRadiusPc*h.BreakRadiusPc + a2
		if rq2 > b2 { // Sesar et al. 2011 broken power law, continuous at r_b
			return h.NormMsunPc3 * math.Exp(0.5*(h.PowerLawIndexN*math.Log(ref2/b2)+h.OuterIndexN*math.Log(b2/rq2)))
		}
	}
	// (x)^(n/2) as exp(n/2 · ln x): twice as fast as math.Pow, same value to ~1e-15
	return h.NormMsunPc3 * math.Exp(0.5*h.PowerLawIndexN*math.Log(ref2/rq2)) // Jurić et al. 2008 eq. 24 (softened)
}

func (h *Halo) validate() error {
	if !(h.AxisRatioQ >= 0.1 && h.AxisRatioQ <= 2) {
		return rangeErr("halo axis_ratio_q", h.AxisRatioQ, "-", "[0.1, 2]")
	}
	if !(h.PowerLawIndexN >= 0 && h.PowerLawIndexN <= 6) {
		return rangeErr("halo power_law_index_n", h.PowerLawIndexN, "-", "[0, 6]")
	}
	if !(h.CoreRadiusPc >= 0 && h.CoreRadiusPc <= 20000) {
		return rangeErr("halo core_radius_pc", h.CoreRadiusPc, "pc", "[0, 20000]")
	}
	if !(h.BreakRadiusPc >= 0 && h.BreakRadiusPc <= 1e6) {
		return rangeErr("halo break_radius_pc", h.BreakRadiusPc, "pc", "0 (no break) or (0, 1e6]")
	}
	if h.BreakRadiusPc > 0 && !(h.OuterIndexN >= 0 && h.OuterIndexN <= 10) {
		return rangeErr("halo outer_index_n", h.OuterIndexN, "-", "[0, 10]")
	}
	return nil
}
