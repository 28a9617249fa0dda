package evolve

import "math"

// Asymptotic giant branch (HPT 2000 §5.4, with the Cummings et al. 2018
// white-dwarf mass as the end point).

// fillAGB sets the asymptotic giant branch of a star that ends as a white
// dwarf.
func (m *Model) fillAGB(t *track) {
	h := &m.h
	mass := t.m0
	cl := &t.cl
	// Asymptotic giant branch, ending as a white dwarf.
	t.remnant = CarbonOxygenWhiteDwarf
	if mass >= m.mUp {
		t.remnant = OxygenNeonWhiteDwarf
	}
	t.mcWD = math.Min(ifmrCummings(mass), t.mBAGB)
	t.mRem = t.mcWD
	t.mcTP = t.mcBAGB
	if t.mcBAGB > 0.8 {
		t.mcTP = 0.44*t.mcBAGB + 0.448 // second dredge-up, HPT eq. (69) (from memory)
	}
	t.mcTP = math.Min(t.mcTP, t.mcWD)
	t.mcE0 = math.Min(cl.core(t.lHe1), t.mcTP)
	t.tE = cl.growTime(heliumRate, t.mcE0, t.mcTP)
	const aHTP = 1.585e-5                            // A_H of low-mass stars, HPT eq. (43), used on the TP-AGB
	t.aHHe = aHTP * heliumRate / (aHTP + heliumRate) // HPT §5.4: A_H,He = A_H A_He/(A_H + A_He)
	t.tTP = cl.growTime(t.aHHe, t.mcTP, t.mcWD)
	dMTot := t.mBAGB - t.mcWD
	if t.tTP > 0 {
		lm := cl.lum(0.5 * (t.mcE0 + t.mcTP))
		t.dME = math.Min(0.5*dMTot, t.tE*mdotMsunPerMyr(lm, h.rGB(t.mBAGB, lm), t.mBAGB, m.zWind, true))
	} else {
		t.dME = dMTot
	}
	t.mTP = t.mBAGB - t.dME
	t.tEnd = t.tHeI + t.tHe + t.tE + t.tTP
}
