package evolve

import "math"

// Remnants.
//
// White-dwarf masses: the initial–final mass relation of Cummings, Kalirai,
// Tremblay, Ramirez-Ruiz & Choi (2018, ApJ 866, 21), first model set
// (coefficients from memory; its slopes 0.08, 0.19, 0.11 match the paper's
// abstract):
//
//	Mf = 0.080 Mi + 0.489   (Mi < 2.85)
//	Mf = 0.187 Mi + 0.184   (2.85 ≤ Mi < 3.60)
//	Mf = 0.107 Mi + 0.471   (Mi ≥ 3.60)
//
// fitted over 0.83–7.20 Msun; below 0.83 and above 7.20 Msun it is extended
// linearly (a documented extrapolation) and never exceeds maxWDMassMsun.
// Composition: carbon–oxygen below M_up, oxygen–neon between M_up and M_Ec,
// where M_up and M_Ec are the masses whose core at the base of the AGB is
// 1.6 and 2.25 Msun (HPT 2000 §6). Helium white dwarfs come from stars whose
// envelope is lost on the first giant branch.
//
// Neutron stars and black holes: the "rapid" prescription of Fryer et al.
// (2012, ApJ 749, 91), eqs. (15)–(17), from the carbon–oxygen core mass
// M_CO = max(M_Ch, 0.773 Mc,BAGB − 0.35) (HPT eq. 75) and the final mass;
// baryonic to gravitational mass M_bar = M_g + 0.075 M_g² for neutron stars
// (Lattimer & Yahil 1989) and M_g = 0.9 M_bar for black holes (Fryer et al.).
// Pair instability: a final helium core of 64–133 Msun leaves no remnant
// (Heger & Woosley 2002, ApJ 567, 532; limits from memory).
const (
	chandrasekharMsun = 1.44 // common practice (C/O, μe = 2)
	maxWDMassMsun     = 1.40 // cap on the extended IFMR, below M_Ch
	maxNSMassMsun     = 2.5  // neutron-star / black-hole boundary (common practice, 2–3 Msun)
	rNSRsun           = 1.4e-5
	mcBAGBUp          = 1.6  // HPT §6: minimum Mc,BAGB for non-degenerate carbon ignition
	mcBAGBEc          = 2.25 // HPT §6: minimum Mc,BAGB for a supernova
)

// ifmrCummings returns the white-dwarf mass (Msun) for initial mass mi.
func ifmrCummings(mi float64) float64 {
	var mf float64
	switch {
	case mi < 2.85:
		mf = 0.080*mi + 0.489
	case mi < 3.60:
		mf = 0.187*mi + 0.184
	default:
		mf = 0.107*mi + 0.471
	}
	return math.Min(mf, maxWDMassMsun)
}

// fryerRapid returns the remnant stage and gravitational mass for a star that
// ends as a core-collapse supernova with CO core mCO and final mass mFin.
func fryerRapid(mCO, mFin float64) (Stage, float64) {
	const mProto = 1.0 // Fryer et al. 2012 eq. (15)
	var mFb float64
	switch { // eq. (16)
	case mCO < 2.5:
		mFb = 0.2
	case mCO < 6:
		mFb = 0.286*mCO - 0.514
	case mCO < 7:
		mFb = mFin - mProto
	case mCO < 11:
		a1 := 0.25 - 1.275/(mFin-mProto)
		b1 := -11*a1 + 1
		mFb = (a1*mCO + b1) * (mFin - mProto)
	default:
		mFb = mFin - mProto
	}
	mBar := math.Min(mProto+math.Max(mFb, 0), mFin) // eq. (17)
	mNS := (math.Sqrt(1+0.3*mBar) - 1) / 0.15       // M_bar = M_g + 0.075 M_g²
	if mNS <= maxNSMassMsun {
		return NeutronStar, mNS
	}
	return BlackHole, 0.9 * mBar
}

// nsLum is HPT 2000 eq. (93): L = 0.02 M^(2/3) / max(t, 0.1)^2, t in Myr.
func nsLum(massMsun, ageMyr float64) float64 {
	t := math.Max(ageMyr, 0.1)
	return 0.02 * math.Pow(massMsun, 2.0/3) / (t * t)
}

// bhRadius is the Schwarzschild radius 2GM/c² in Rsun.
func bhRadius(massMsun float64) float64 {
	const k = 2 * 1.3271244e20 / (299792458.0 * 299792458.0) / 6.957e8
	return k * massMsun
}

// heZAMS returns L and R of a naked helium star on its zero-age main sequence,
// HPT 2000 eqs. (77) and (78) (from memory):
// L = 15262 M^10.25 / (M^9 + 29.54 M^7.5 + 31.18 M^6 + 0.0469),
// R = 0.2391 M^4.6 / (M^4 + 0.162 M^3 + 0.0065).
func heZAMS(m float64) (lumLsun, radiusRsun float64) {
	m3 := m * m * m
	m6 := m3 * m3
	lumLsun = 15262 * math.Pow(m, 10.25) / (m6*m3 + 29.54*m6*m*math.Sqrt(m) + 31.18*m6 + 0.0469)
	radiusRsun = 0.2391 * math.Pow(m, 4.6) / (m3*m + 0.162*m3 + 0.0065)
	return
}

// tHeMSMyr is the helium main-sequence lifetime of HPT 2000 eq. (79):
// t = (0.4129 + 18.81 M^4 + 1.853 M^6) / M^6.5 Myr.
func tHeMSMyr(m float64) float64 {
	m2 := m * m
	m4 := m2 * m2
	m6 := m4 * m2
	return (0.4129 + 18.81*m4 + 1.853*m6) / (m6 * math.Sqrt(m))
}

// fillCollapse sets the post-helium supergiant phase of a core-collapse
// progenitor and its remnant.
func (m *Model) fillCollapse(t *track) {
	h := &m.h
	t.ccsn = true
	t.tLate = 0.1 * t.tHe // post-helium-burning phases, ~10 per cent of core He burning (common practice)
	if t.tauStrip <= 1 {
		t.dMLate = t.mBAGB - m.wrMass(t.mBAGB, t.tLate)
	} else {
		r := h.rGB(t.mBAGB, 1.14*t.lHe1)
		t.dMLate = math.Min(t.tLate*mdotMsunPerMyr(1.14*t.lHe1, r, t.mBAGB, m.zWind, true), t.mBAGB-t.mcBAGB)
	}
	mFin := t.mBAGB - t.dMLate
	heCore := math.Min(t.mcBAGB, mFin)
	mCO := math.Min(math.Max(chandrasekharMsun, 0.773*heCore-0.35), mFin) // HPT eq. (75)
	t.tEnd = t.tHeI + t.tHe + t.tLate
	switch {
	case heCore >= 64 && heCore <= 133: // Heger & Woosley 2002, pair instability
		t.remnant, t.mRem = NoRemnant, 0
	case heCore > 133: // direct collapse above the pair-instability gap
		t.remnant, t.mRem = BlackHole, 0.9*mFin
	default:
		t.remnant, t.mRem = fryerRapid(mCO, mFin)
	}
}
