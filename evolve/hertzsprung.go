package evolve

import "math"

// fillGap sets the core masses at the base of the giant branch and at helium
// ignition and the end point of the Hertzsprung gap.
func (m *Model) fillGap(t *track) {
	h := &m.h
	mass := t.m0
	t.cl = newCoreLum(h, mass)
	cl := &t.cl
	t.aH = hydrogenRate(mass)
	t.degenerate = mass <= h.mHeF
	t.hgToHe = mass >= h.mFGB
	t.mcBAGBFit = mcBAGB(mass)
	mcBA := t.mcBAGBFit
	t.mTMS = t.m0 - t.msMassLost(1)

	t.lBGB = h.lBGB(mass)
	if mass < 1 {
		t.lBGB = math.Max(t.lBGB, 1.05*t.lTMS) // guard for very low masses, where eq. (10) is never used by HPT
	}
	t.lHeI = m.lHeI(mass)
	if t.degenerate {
		t.lHeI = math.Max(t.lHeI, t.lBGB)
		t.mcBGB = cl.core(t.lBGB)
		t.mcHeI = cl.core(t.lHeI)
	} else {
		t.mcBGB = mcBGBHigh(m.cBGB, mass, mcBA)                    // HPT eq. (44)
		t.mcHeI = math.Max(mcBGBHigh(m.cHeI, mass, mcBA), t.mcBGB) // eq. (44) form with C at He ignition
		if mass < h.mFGB {
			t.lHeI = math.Max(t.lHeI, t.lBGB) // He ignites on the giant branch, above its base
		}
	}
	t.mcBGB = math.Min(t.mcBGB, t.mTMS) // a core never exceeds the star
	t.mcHeI = math.Min(t.mcHeI, t.mTMS)

	// Hertzsprung gap, HPT §5.2: L and R move geometrically from TMS to the end
	// of the gap (eqs. 26–27); core mass Mc = ((1−τ)ρ + τ) Mc,EHG (eqs. 29–30).
	m525 := math.Pow(mass, 5.25)
	t.rho = (1.586 + m525) / (2.434 + 1.02*m525) // eq. (29)
	tHG := t.tBGB - t.tMS
	if t.hgToHe {
		t.lEHG = t.lHeI
		t.rEHG = math.Min(3*t.rTMS, h.rGB(t.mTMS, t.lHeI)) // blue supergiant at He ignition (this package)
		t.mcEHG = t.mcHeI
	} else {
		t.lEHG = t.lBGB
		t.mcEHG = t.mcBGB
	}
	mdHG := mdotMsunPerMyr(t.lTMS, t.rTMS, t.mTMS, m.zWind, false)
	t.mBGB = math.Max(t.mTMS-tHG*mdHG, t.mcEHG)
	if !t.hgToHe {
		t.rEHG = h.rGB(t.mBGB, t.lBGB)
	}
}
