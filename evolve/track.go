package evolve

import (
	"math"

	"github.com/starmock/starmock/internal/consts"
)

// track is the precomputed evolution of one initial mass (times in Myr).
type track struct {
	m0                 float64
	lz, rz, lTMS, rTMS float64
	tMS, tBGB          float64
	md0, md1, md2      float64 // MS wind rate at τ = 0, 0.5, 1, Msun/Myr
	lnLRatio, lnRRatio float64 // ln(L_TMS/L_ZAMS), ln(R_TMS/R_ZAMS)
	full               bool

	cl                  coreLum
	aH                  float64
	degenerate, hgToHe  bool
	lEHG, rEHG, mcEHG   float64
	rho                 float64
	mTMS, mBGB          float64
	lBGB, mcBGB         float64
	lHeI, mcHeI, mHeI   float64
	tRGB, tHeI          float64
	kReimers            float64
	heWD                bool
	mcStrip             float64
	tHe, lHe0, lHe1     float64
	loop                float64
	dMHe, mcBAGB, mBAGB float64
	hd0, hd1, hd2       float64 // core-He-burning wind rate at τ = 0, 0.5, 1, Msun/Myr
	tauStrip, mStrip    float64 // fractional CHeB age at which the envelope is gone (> 1: never), and the mass then
	mcBAGBFit           float64 // Mc,BAGB of HPT eq. (66) before the caps
	ccsn                bool
	tLate, dMLate       float64
	mcE0, mcTP, mcWD    float64
	tE, tTP, dME, mTP   float64
	aHHe                float64
	tEnd                float64
	remnant             Stage
	mRem                float64
}

// fill computes everything after the main sequence, phase by phase (each
// phase's file documents its formulae).
func (m *Model) fill(t *track) {
	if t.full {
		return
	}
	t.full = true
	m.fillGap(t)
	m.fillRGB(t)
	if t.heWD {
		t.tEnd = t.tHeI
		t.remnant = HeliumWhiteDwarf
		t.mRem = t.mcStrip
		return
	}

	m.fillCHeB(t)
	if t.m0 >= m.mEc { // core-collapse progenitor
		m.fillCollapse(t)
		return
	}
	m.fillAGB(t)
}

// post evaluates a star after the main sequence at age tm (Myr).
func (m *Model) post(t *track, tm float64) Star {
	h := &m.h
	cl := &t.cl
	switch {
	case tm < t.tBGB: // Hertzsprung gap
		tau := (tm - t.tMS) / (t.tBGB - t.tMS)
		l := t.lTMS * math.Pow(t.lEHG/t.lTMS, tau)
		r := t.rTMS * math.Pow(t.rEHG/t.rTMS, tau)
		mc := ((1-tau)*t.rho + tau) * t.mcEHG
		return finish(Subgiant, t.mTMS+(t.mBGB-t.mTMS)*tau, l, r, mc, tau)
	case tm < t.tHeI: // first giant branch
		dt := tm - t.tBGB
		tau := dt / t.tRGB
		if t.degenerate {
			mc := math.Min(cl.coreAfter(t.aH, t.mcBGB, dt), t.mcStrip)
			l := cl.lum(mc)
			mass := math.Max(t.rgbMass(h, mc), mc)
			return finish(RedGiantBranch, mass, l, h.rGB(mass, l), mc, tau)
		}
		l := t.lBGB * math.Pow(t.lHeI/t.lBGB, tau)
		mass := t.mBGB + (t.mHeI-t.mBGB)*tau
		return finish(RedGiantBranch, mass, l, h.rGB(mass, l), t.mcBGB+(t.mcHeI-t.mcBGB)*tau, tau)
	case t.heWD:
		return m.remnantStar(t, tm)
	case tm < t.tHeI+t.tHe: // core helium burning
		tau := (tm - t.tHeI) / t.tHe
		if tau >= t.tauStrip { // envelope gone: naked helium star, HPT eqs. (77)–(78)
			mass := m.wrMass(t.mStrip, (tau-t.tauStrip)*t.tHe)
			l, r := heZAMS(mass)
			return finish(HeliumMainSequence, mass, l, r, mass, tau)
		}
		mass := t.mHeI - t.heMassLost(tau)
		mc := t.mcHeI + (t.mcBAGB-t.mcHeI)*tau
		l, r := m.chebLR(t, tau, mass)
		return finish(CoreHeliumBurning, mass, l, r, mc, tau)
	}
	t0 := t.tHeI + t.tHe
	if t.ccsn {
		if tm < t.tEnd {
			tau := (tm - t0) / t.tLate
			if t.tauStrip <= 1 { // naked helium giant: radius grows to twice the He ZAMS value (this package)
				mass := m.wrMass(t.mBAGB, tau*t.tLate)
				l, r := heZAMS(mass)
				return finish(HeliumGiant, mass, l*(1+0.3*tau), r*(1+tau), mass, tau)
			}
			l := t.lHe1 * math.Pow(1.3, tau)
			mass := t.mBAGB - t.dMLate*tau
			return finish(EarlyAGB, mass, l, h.rGB(mass, l), t.mcBAGB, tau)
		}
		return m.remnantStar(t, tm)
	}
	if tm < t0+t.tE { // early AGB: CO core grows by helium burning, HPT §5.4
		dt := tm - t0
		tau := dt / t.tE
		mc := math.Min(cl.coreAfter(heliumRate, t.mcE0, dt), t.mcTP)
		l := cl.lum(mc)
		var mass float64
		if t.tTP > 0 {
			mass = t.mBAGB - t.dME*tau
		} else {
			mass = t.mBAGB - t.dME*tau*tau*tau*tau
		}
		// Reported core: the helium core, shrinking from Mc,BAGB to the
		// post-dredge-up value Mc,TP across the early AGB (HPT eq. 69), never
		// above the star's mass.
		core := math.Min(math.Max(mc, t.mcBAGB+(t.mcTP-t.mcBAGB)*tau), mass)
		if t.tauStrip <= 1 { // stripped during core He burning: shell-burning helium star
			_, r := heZAMS(mass)
			return finish(HeliumGiant, mass, l, r*math.Sqrt(l/t.lHe1), core, tau)
		}
		return finish(EarlyAGB, mass, l, h.rGB(mass, l), core, tau)
	}
	if tm < t.tEnd { // thermally pulsing AGB
		dt := tm - t0 - t.tE
		tau := dt / t.tTP
		mc := math.Min(cl.coreAfter(t.aHHe, t.mcTP, dt), t.mcWD)
		l := cl.lum(mc)
		mass := t.mTP - (t.mTP-t.mcWD)*tau*tau
		return finish(ThermallyPulsingAGB, mass, l, h.rGB(mass, l), mc, tau)
	}
	return m.remnantStar(t, tm)
}

// remnantStar evaluates the remnant at age tm (Myr).
func (m *Model) remnantStar(t *track, tm float64) Star {
	age := tm - t.tEnd
	switch t.remnant {
	case NeutronStar:
		return finish(NeutronStar, t.mRem, nsLum(t.mRem, age), rNSRsun, t.mRem, 0)
	case BlackHole:
		return finish(BlackHole, t.mRem, 0, bhRadius(t.mRem), t.mRem, 0)
	case NoRemnant:
		return Star{Stage: NoRemnant}
	}
	return finish(t.remnant, t.mRem, wdLum(t.remnant, t.mRem, m.metallicityZ, age), wdRadius(t.mRem), t.mRem, 0)
}

func finish(st Stage, mass, lum, rad, core, frac float64) Star {
	s := Star{Stage: st, MassMsun: mass, LuminosityLsun: lum, RadiusRsun: rad, CoreMassMsun: core, StageFraction: frac}
	if rad > 0 {
		if lum > 0 {
			s.TeffK = consts.TeffSunK * math.Sqrt(math.Sqrt(lum)/rad) // L = 4πR²σT⁴ in nominal solar units
		}
		s.LoggCgs = consts.LogGSunCgs + math.Log10(mass) - 2*math.Log10(rad)
	}
	return s
}

func clamp01(x float64) float64 { return math.Max(0, math.Min(1, x)) }
