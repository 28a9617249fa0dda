package evolve

import "math"

// Core helium burning (HPT 2000 §5.3–5.4 quantities and this package's
// shapes, see doc.go).

// lHeIHigh is the helium-ignition luminosity for M > M_HeF in the functional
// form of HPT eq. (49), L = (b11 + b12 M^3.8)/(b13 + M^2). The paper's
// coefficients are not recalled; b11 = 0, b12 = 1000, b13 = 320 are this
// package's choice, so that L ≈ 60 Lsun near 2.2 Msun, 1.3e3 Lsun at 5 Msun and
// ≈ L_TMS above 20 Msun (L_TMS → 786 M^1.8, HPT eq. 8). Uncertain.
func lHeIHigh(m float64) float64 {
	return 1000 * math.Pow(m, 3.8) / (320 + m*m)
}

// lHeI is the luminosity at helium ignition, HPT eq. (49). For M ≤ M_HeF,
// L = b9 M^b10 / (1 + α1 exp(k (M − M_HeF))); HPT take k = 15 (from memory);
// we take k = 40 so that the tip stays above 2000 Lsun up to 1.8 Msun at solar
// metallicity, as detailed models show (common practice).
func (m *Model) lHeI(mass float64) float64 {
	h := &m.h
	if mass > h.mHeF {
		return lHeIHigh(mass)
	}
	return h.b9 * math.Pow(mass, h.b10) / (1 + m.alpha1*math.Exp(40*(mass-h.mHeF)))
}

// heliumBurningFraction is t_He/t_BGB for stars that ignite helium
// non-degenerately: 0.1 + 0.2/(1 + (M/5)^3), this package's fit to the
// common-practice lifetimes (≈ 25 per cent of the MS at 2–3 Msun, ≈ 10 per cent
// above 10 Msun). HPT's eq. (57) coefficients are not recalled.
func heliumBurningFraction(m float64) float64 {
	r := m / 5
	return 0.1 + 0.2/(1+r*r*r)
}

// heMassLost is the mass lost by winds during core helium burning up to τ.
func (t *track) heMassLost(tau float64) float64 {
	return cumLinear(t.hd0, t.hd1, t.hd2, tau) * t.tHe
}

// chebLR gives L and R during core helium burning at fractional age τ for
// current mass mass (see doc.go for the shapes; this package's approximation).
func (m *Model) chebLR(t *track, tau, mass float64) (lumLsun, radiusRsun float64) {
	h := &m.h
	if t.degenerate {
		lumLsun = t.lHe0 * math.Pow(t.lHe1/t.lHe0, tau)
		// mass factor of R_GB capped at 1 Msun at the start: clump stars of
		// 1–2 Msun share one temperature (common practice)
		capFactor := 1.0 // undo A ∝ M^-0.3 above 1 Msun, fading out by the end
		if mass > 1 {
			capFactor = math.Exp(0.3 * (1 - tau*tau) * math.Log(mass))
		}
		radiusRsun = h.rGB(mass, lumLsun) * capFactor * (m.fHB + (1-m.fHB)*tau*tau)
		return
	}
	s := math.Sin(math.Pi * tau)
	lumLsun = t.lHe0 * math.Pow(t.lHe1/t.lHe0, tau) * (1 - 0.3*s)
	if t.hgToHe {
		radiusRsun = t.rEHG * math.Pow(h.rGB(mass, t.lHe1)/t.rEHG, tau)
		return
	}
	radiusRsun = h.rGB(mass, lumLsun) * (1 - t.loop*s*s)
	return
}

// fillCHeB sets core helium burning: duration, luminosities, winds and
// envelope loss.
func (m *Model) fillCHeB(t *track) {
	h := &m.h
	mass := t.m0
	// Core helium burning.
	if t.degenerate {
		t.lHe0, t.lHe1 = m.lZAHB, 2*m.lZAHB
		t.tHe = math.Min(0.6*tHeMSMyr(t.mcHeI), heliumBurningFraction(mass)*t.tBGB) // this package, see doc.go
	} else {
		// L rises by a factor 2 during core He burning up to 5 Msun, falling to
		// 1.4 at 20 Msun and above (this package; detailed tracks, from memory)
		rise := 2 - 0.6*clamp01(math.Log(mass/5)/math.Log(4))
		t.lHe0, t.lHe1 = t.lHeI, rise*t.lHeI
		t.tHe = heliumBurningFraction(mass) * t.tBGB
	}
	if !t.degenerate && !t.hgToHe { // blue-loop amplitude (this package): largest between 5 and M_FGB − 2
		t.loop = 0.6 * clamp01((mass-3)/2) * clamp01((h.mFGB-mass)/2)
	}
	t.mcBAGB = math.Min(math.Max(t.mcBAGBFit, t.mcHeI), t.mHeI)
	var hd [3]float64 // wind rate at τ = 0, 0.5, 1 at the start mass (this package's approximation)
	for i := range hd {
		if i == 1 && t.degenerate { // clump and HB winds are weak and smooth: mean of the ends
			continue
		}
		l, r := m.chebLR(t, 0.5*float64(i), t.mHeI)
		hd[i] = mdotMsunPerMyr(l, r, t.mHeI, m.zWind, true)
	}
	if t.degenerate {
		hd[1] = 0.5 * (hd[0] + hd[2])
	}
	t.hd0, t.hd1, t.hd2 = hd[0], hd[1], hd[2]
	t.dMHe = t.heMassLost(1)
	t.tauStrip = 2 // never
	if t.mHeI-t.dMHe <= t.mcBAGB {
		// The envelope is gone at τs where M(τ) = Mc(τ) (found by bisection);
		// from then on the star is a naked helium star losing mass by a
		// Wolf–Rayet wind (wrMass).
		lo, hi := 0.0, 1.0
		for range 40 {
			mid := 0.5 * (lo + hi)
			if t.mHeI-t.heMassLost(mid) > t.mcHeI+(t.mcBAGB-t.mcHeI)*mid {
				lo = mid
			} else {
				hi = mid
			}
		}
		t.tauStrip = lo
		t.mStrip = t.mHeI - t.heMassLost(lo)
		t.mBAGB = m.wrMass(t.mStrip, (1-t.tauStrip)*t.tHe)
		t.mcBAGB = t.mBAGB
	} else {
		t.mBAGB = t.mHeI - t.dMHe
	}
}
