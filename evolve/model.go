package evolve

import "math"

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
