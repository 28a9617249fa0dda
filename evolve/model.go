package evolve

import (
	"math"

	"github.com/starmock/starmock/internal/consts"
)

// Validity limits. The fits of Hurley, Pols & Tout (2000) and Tout et al. (1996)
// cover 0.1–100 Msun and Z = 1e-4–0.03. Masses 0.08–0.1 Msun and 100–150 Msun
// are accepted as documented extrapolations of the same formulae (covered by
// tests for finiteness and monotonic trends, not for accuracy); anything else
// is a *RangeError wrapping ErrOutOfRange.
const (
	MinMassMsun    = 0.08  // lowest accepted initial mass (extrapolated below FitMinMassMsun)
	MaxMassMsun    = 150.0 // highest accepted initial mass (extrapolated above FitMaxMassMsun)
	FitMinMassMsun = 0.1   // lower end of the fitted mass range
	FitMaxMassMsun = 100.0 // upper end of the fitted mass range
	MinZ           = 1e-4  // lowest metallicity Z of the fits
	MaxZ           = 0.03  // highest metallicity Z of the fits
	// MaxAgeYr is the largest accepted age, 1e13 yr: far beyond the age of the
	// Universe, so that tracks of low-mass stars can be followed; stars whose
	// main-sequence lifetime exceeds it simply stay on the main sequence.
	MaxAgeYr = 1e13
)

// Star is the state of a single star at a given age.
//
// For remnants that emit no light (black holes, and the empty "no_remnant"
// stage) LuminosityLsun and TeffK are 0; for no_remnant MassMsun, RadiusRsun
// and LoggCgs are 0 as well. StageFraction is the elapsed fraction of the
// current stage, in [0, 1); it is 0 for remnants, whose stage never ends.
type Star struct {
	Stage          Stage
	MassMsun       float64 // current mass after winds, Msun
	LuminosityLsun float64 // bolometric luminosity, nominal Lsun (IAU 2015)
	TeffK          float64 // effective temperature, K, from L = 4πR²σT⁴
	RadiusRsun     float64 // radius, nominal Rsun
	LoggCgs        float64 // log10 surface gravity, cm s^-2
	CoreMassMsun   float64 // mass of the hydrogen-exhausted core (0 on the main sequence); for remnants the remnant mass
	StageFraction  float64 // fraction of the current stage elapsed
}

// Timescales gives the ages (yr) at which a star passes each point of its
// evolution, and its fate. A phase the star skips has zero length: its start
// and end ages coincide (for example HeIgnitionYr = BGBYr for stars that ignite
// helium in the Hertzsprung gap, and HeIgnitionYr = EndCoreHeYr = EndAGBYr for
// stars that lose their envelope on the giant branch and end as helium white
// dwarfs). EndAGBYr is the end of nuclear evolution (for core-collapse
// progenitors the supernova).
type Timescales struct {
	MSLifetimeYr    float64 // end of core hydrogen burning (HPT eq. 5)
	BGBYr           float64 // end of the Hertzsprung gap / base of the giant branch (HPT eq. 4)
	HeIgnitionYr    float64 // helium ignition (tip of the giant branch)
	EndCoreHeYr     float64 // end of core helium burning
	EndAGBYr        float64 // end of the AGB (or of the supergiant phase), birth of the remnant
	Remnant         Stage   // final remnant
	RemnantMassMsun float64 // final remnant mass (0 for no_remnant)
}

// Model holds everything that depends on metallicity only, precomputed by
// NewModel. It is immutable and safe for concurrent use.
type Model struct {
	metallicityZ float64
	zeta         float64
	z            zams
	h            hpt
	zWind        float64 // (Z/0.02)^0.5, metallicity scaling of hot-star winds
	lZAHB        float64 // start luminosity of core helium burning for M ≤ M_HeF
	fHB          float64 // radius factor of the horizontal branch at its start
	cBGB, cHeI   float64 // HPT eq. (44) constant C for the base of the GB and for He ignition
	alpha1       float64 // HPT eq. (49) continuity constant
	mUp, mEc     float64 // initial masses with Mc,BAGB = 1.6 and 2.25 Msun
	ms           msTable
}

// msTable tabulates the main-sequence quantities of initTrack on a grid uniform
// in ln M from MinMassMsun to MaxMassMsun, so that Evolve needs no math.Pow on
// the main sequence. Linear interpolation in ln M of ln L, ln R, ln t (and of
// the wind rates) on 2048 nodes (Δ ln M = 3.7e-3) reproduces the formulae to
// better than 1e-5 relative, except within one node of a kink of the formulae
// (M_hook in t_MS, the R_TMS bridge), where the error stays below 1 per cent
// (TestMSTableAccuracy).
type msTable struct {
	lnM0, invDlnM float64
	v             [msTableN][msTableCols]float64
}

const (
	msTableN    = 2048
	msTableCols = 9 // ln lz, ln rz, ln lTMS, ln rTMS, ln tMS, ln tBGB, md0, md1, md2
)

func (m *Model) buildMSTable() {
	lo, hi := math.Log(MinMassMsun), math.Log(MaxMassMsun)
	d := (hi - lo) / (msTableN - 1)
	m.ms.lnM0, m.ms.invDlnM = lo, 1/d
	var t track
	for i := range msTableN {
		m.directMS(&t, math.Exp(lo+float64(i)*d))
		m.ms.v[i] = [msTableCols]float64{math.Log(t.lz), math.Log(t.rz), math.Log(t.lTMS), math.Log(t.rTMS),
			math.Log(t.tMS), math.Log(t.tBGB), t.md0, t.md1, t.md2}
	}
}

// NewModel precomputes the model for metal mass fraction metallicityZ, which
// must lie in [MinZ, MaxZ] (else a *RangeError wrapping ErrOutOfRange). Use
// ZFromFeH to start from [Fe/H].
func NewModel(metallicityZ float64) (*Model, error) {
	if err := checkRange("metallicity Z", metallicityZ, "", MinZ, MaxZ); err != nil {
		return nil, err
	}
	m := &Model{metallicityZ: metallicityZ, zeta: math.Log10(metallicityZ / SolarZ)}
	m.z = newZAMS(m.zeta)
	m.h = newHPT(metallicityZ)
	m.zWind = math.Sqrt(metallicityZ / SolarZ) // Kudritzki et al. 1989 scaling, HPT §7.1
	// Horizontal branch (this package's approximation, no single source): the
	// zero-age HB luminosity is 35 Lsun × 10^(−0.05 ζ) and the star doubles its
	// luminosity by the end of core helium burning, so the mid-phase red clump
	// sits near 50 Lsun (red-clump M_V ≈ +0.8 and M_bol ≈ +0.4, common
	// practice). Its radius at the start is f_HB times the giant-branch radius,
	// f_HB = 0.65 + 0.23 ζ clamped to [0.25, 0.8], so that metal-poor
	// horizontal branches are hot (RR Lyrae and blue HB stars).
	m.lZAHB = 35 * math.Pow(10, -0.05*m.zeta)
	m.fHB = math.Min(0.8, math.Max(0.25, 0.65+0.23*m.zeta))
	h := &m.h
	cl := newCoreLum(h, h.mHeF)
	m.cBGB = cl.core(h.lBGB(h.mHeF))
	lh := lHeIHigh(h.mHeF)
	m.alpha1 = (h.b9*math.Pow(h.mHeF, h.b10) - lh) / lh // HPT eq. (49)
	m.cHeI = cl.core(lh)
	m.mUp = massForMcBAGB(mcBAGBUp)
	m.mEc = massForMcBAGB(mcBAGBEc)
	m.buildMSTable()
	return m, nil
}

// MetallicityZ returns the model's metal mass fraction Z.
func (m *Model) MetallicityZ() float64 { return m.metallicityZ }

// HeliumFlashMassMsun returns M_HeF, the largest initial mass (Msun) that
// ignites helium degenerately in a flash, HPT 2000 eq. (2).
func (m *Model) HeliumFlashMassMsun() float64 { return m.h.mHeF }

// FirstGiantBranchMassMsun returns M_FGB, the largest initial mass (Msun) that
// ignites helium on the first giant branch, HPT 2000 eq. (3).
func (m *Model) FirstGiantBranchMassMsun() float64 { return m.h.mFGB }

// MaxWhiteDwarfProgenitorMsun returns the largest initial mass (Msun) that ends
// as a white dwarf (M_Ec of HPT 2000 §6: Mc,BAGB = 2.25 Msun).
func (m *Model) MaxWhiteDwarfProgenitorMsun() float64 { return m.mEc }

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
	ccsn                bool
	tLate, dMLate       float64
	mcE0, mcTP, mcWD    float64
	tE, tTP, dME, mTP   float64
	aHHe                float64
	tEnd                float64
	remnant             Stage
	mRem                float64
}

// initTrack fills what the main sequence needs, from the table.
func (m *Model) initTrack(t *track, mass float64) {
	x := (math.Log(mass) - m.ms.lnM0) * m.ms.invDlnM
	i := int(x)
	if i >= msTableN-1 {
		i = msTableN - 2
	}
	if i < 0 {
		i = 0
	}
	f := x - float64(i)
	a, b := &m.ms.v[i], &m.ms.v[i+1]
	var v [msTableCols]float64
	for k := range v {
		v[k] = a[k] + f*(b[k]-a[k])
	}
	t.m0 = mass
	t.lz, t.rz, t.lTMS, t.rTMS = math.Exp(v[0]), math.Exp(v[1]), math.Exp(v[2]), math.Exp(v[3])
	t.tMS, t.tBGB = math.Exp(v[4]), math.Exp(v[5])
	t.md0, t.md1, t.md2 = v[6], v[7], v[8]
	t.lnLRatio, t.lnRRatio = v[2]-v[0], v[3]-v[1]
}

// directMS evaluates the main-sequence quantities from the formulae.
func (m *Model) directMS(t *track, mass float64) {
	h := &m.h
	t.m0 = mass
	t.lz, t.rz = m.z.lumRad(mass)
	t.tBGB = h.tBGBMyr(mass)
	t.tMS = h.tMSMyr(mass, t.tBGB)
	t.lTMS = h.lTMS(mass)
	t.rTMS = math.Max(h.rTMS(mass), t.rz)
	t.lnLRatio, t.lnRRatio = math.Log(t.lTMS/t.lz), math.Log(t.rTMS/t.rz)
	t.md0, t.md1, t.md2 = 0, 0, 0
	if t.lTMS > 2000 { // winds matter only for luminous stars
		l, r := m.msLR(t, 0)
		t.md0 = mdotMsunPerMyr(l, r, mass, m.zWind, false)
		l, r = m.msLR(t, 0.5)
		t.md1 = mdotMsunPerMyr(l, r, mass, m.zWind, false)
		t.md2 = mdotMsunPerMyr(t.lTMS, t.rTMS, mass, m.zWind, false)
	}
}

// msLR gives L and R on the main sequence at fractional age τ = t/t_MS.
//
// HPT eqs. (12)–(13) have the form log(L/L_ZAMS) = α_L τ + β_L τ^η +
// (log(L_TMS/L_ZAMS) − α_L − β_L) τ² − ΔL(…) and a similar one for R, with
// mass-dependent α, β, Δ and a hook near the end of the MS. Their
// coefficients are not recalled, so this package uses the same endpoints with
// fixed shapes and no hook:
//
//	log(L/L_ZAMS) = log(L_TMS/L_ZAMS) (0.5 τ + 0.5 τ²)
//	log(R/R_ZAMS) = log(R_TMS/R_ZAMS) (0.4 τ + 0.6 τ³)
//
// checked against the present Sun and the Pecaut & Mamajek dwarf sequence.
func (m *Model) msLR(t *track, tau float64) (lumLsun, radiusRsun float64) {
	fl := 0.5*tau + 0.5*tau*tau
	fr := 0.4*tau + 0.6*tau*tau*tau
	lumLsun = t.lz * math.Exp(fl*t.lnLRatio)
	radiusRsun = t.rz * math.Exp(fr*t.lnRRatio)
	return
}

// cumLinear integrates exactly, from 0 to τ, a rate that is piecewise linear
// through its values r0, r1, r2 at τ = 0, 0.5, 1.
func cumLinear(r0, r1, r2, tau float64) float64 {
	if tau <= 0.5 {
		return r0*tau + (r1-r0)*tau*tau
	}
	u := tau - 0.5
	return 0.25*(r0+r1) + r1*u + (r2-r1)*u*u
}

// msMassLost is the mass lost by winds up to fractional MS age τ (cumLinear
// of the rates at τ = 0, 0.5, 1), capped at half the initial mass.
func (t *track) msMassLost(tau float64) float64 {
	return math.Min(cumLinear(t.md0, t.md1, t.md2, tau)*t.tMS, 0.5*t.m0)
}

// heMassLost is the mass lost by winds during core helium burning up to τ.
func (t *track) heMassLost(tau float64) float64 {
	return cumLinear(t.hd0, t.hd1, t.hd2, tau) * t.tHe
}

func clamp01(x float64) float64 { return math.Max(0, math.Min(1, x)) }

// fill computes everything after the main sequence.
func (m *Model) fill(t *track) {
	if t.full {
		return
	}
	t.full = true
	h := &m.h
	mass := t.m0
	t.cl = newCoreLum(h, mass)
	cl := &t.cl
	t.aH = hydrogenRate(mass)
	t.degenerate = mass <= h.mHeF
	t.hgToHe = mass >= h.mFGB
	mcBA := mcBAGB(mass)
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

	// First giant branch.
	t.kReimers = 4e-13 * reimersEta / (t.aH * 1e-6)
	t.mcStrip = t.mcHeI
	switch {
	case t.hgToHe:
		t.tRGB = 0
		t.mHeI = t.mBGB
	case t.degenerate:
		t.tRGB = cl.growTime(t.aH, t.mcBGB, t.mcHeI)
		t.mHeI = t.rgbMass(h, t.mcHeI)
		if t.mHeI <= t.mcHeI { // envelope lost before the flash: helium white dwarf
			lo, hi := t.mcBGB, t.mcHeI
			for range 40 {
				mid := 0.5 * (lo + hi)
				if t.rgbMass(h, mid) > mid {
					lo = mid
				} else {
					hi = mid
				}
			}
			t.heWD = true
			t.mcStrip = lo
			t.tRGB = cl.growTime(t.aH, t.mcBGB, lo)
			t.mHeI = lo
		}
	default:
		lm := math.Sqrt(t.lBGB * t.lHeI)
		// this package: ΔMc / (A_H ⟨L⟩), at least 1 per cent of t_MS so that
		// L rises continuously from L_BGB to L_HeI
		t.tRGB = math.Max((t.mcHeI-t.mcBGB)/(t.aH*lm), 0.01*t.tMS)
		rm := h.rGB(t.mBGB, lm)
		t.mHeI = math.Max(t.mBGB-t.tRGB*mdotMsunPerMyr(lm, rm, t.mBGB, m.zWind, true), t.mcHeI)
	}
	t.mcHeI = math.Min(t.mcHeI, t.mHeI)
	t.tHeI = t.tBGB + t.tRGB
	if t.heWD {
		t.tEnd = t.tHeI
		t.remnant = HeliumWhiteDwarf
		t.mRem = t.mcStrip
		return
	}

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
	t.mcBAGB = math.Min(math.Max(mcBA, t.mcHeI), t.mHeI)
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

	if mass >= m.mEc { // core-collapse progenitor
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
		return
	}

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

// wrMass returns the mass of a naked helium star of initial mass m0 after
// dt Myr of Wolf–Rayet wind. HPT §7.1 take Ṁ = 1e-13 L^1.5 Msun/yr (after
// Hamann, Koesterke & Wessolowski 1995); we divide it by 3 for wind clumping
// (common practice) and scale it by (Z/0.02)^0.5 like the other hot-star
// winds, with L the helium-ZAMS luminosity of the current mass (HPT eq. 77).
// The equation is integrated with 16 midpoint steps (relative error < 1e-3
// for the cases met here).
func (m *Model) wrMass(m0, dt float64) float64 {
	const steps = 16
	k := 1e-13 / 3 * m.zWind * 1e6 // Msun/Myr per Lsun^1.5
	h := dt / steps
	rate := func(mass float64) float64 {
		l, _ := heZAMS(mass)
		return k * l * math.Sqrt(l)
	}
	mass := m0
	for range steps {
		mid := math.Max(mass-0.5*h*rate(mass), 0.5*mass)
		mass = math.Max(mass-h*rate(mid), 0.5*mass)
	}
	return mass
}

// rgbMass is the mass on a degenerate-core giant branch when the core has grown
// to mc: the closed-form Reimers integral (massloss.go).
func (t *track) rgbMass(h *hpt, mc float64) float64 {
	v := math.Pow(t.mBGB, 2.3) - 2.3*t.kReimers*h.reimersRGBIntegral(&t.cl, t.mcBGB, mc)
	if v <= 0 {
		return 0
	}
	return math.Pow(v, 1/2.3)
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

// Evolve returns the state of a star of initial mass massMsun (Msun) at age
// ageYr (yr) for this model's metallicity. Mass must be in
// [MinMassMsun, MaxMassMsun] and age in [0, MaxAgeYr]; otherwise (or for NaN)
// a *RangeError wrapping ErrOutOfRange is returned. Evolve does not allocate.
func (m *Model) Evolve(massMsun, ageYr float64) (Star, error) {
	if err := checkRange("mass", massMsun, "Msun", MinMassMsun, MaxMassMsun); err != nil {
		return Star{}, err
	}
	if err := checkRange("age", ageYr, "yr", 0, MaxAgeYr); err != nil {
		return Star{}, err
	}
	var t track
	m.initTrack(&t, massMsun)
	tm := ageYr * 1e-6
	if tm < t.tMS {
		tau := tm / t.tMS
		l, r := m.msLR(&t, tau)
		return finish(MainSequence, t.m0-t.msMassLost(tau), l, r, 0, tau), nil
	}
	m.fill(&t)
	return m.post(&t, tm), nil
}

// Timescales returns the ages of the evolutionary milestones and the final
// remnant of a star of initial mass massMsun (range as for Evolve).
func (m *Model) Timescales(massMsun float64) (Timescales, error) {
	if err := checkRange("mass", massMsun, "Msun", MinMassMsun, MaxMassMsun); err != nil {
		return Timescales{}, err
	}
	var t track
	m.initTrack(&t, massMsun)
	m.fill(&t)
	ts := Timescales{
		MSLifetimeYr: t.tMS * 1e6, BGBYr: t.tBGB * 1e6, HeIgnitionYr: t.tHeI * 1e6,
		EndCoreHeYr: (t.tHeI + t.tHe) * 1e6, EndAGBYr: t.tEnd * 1e6,
		Remnant: t.remnant, RemnantMassMsun: t.mRem,
	}
	if t.heWD {
		ts.EndCoreHeYr = ts.HeIgnitionYr
	}
	return ts, nil
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
