package synth

import (
	"math"
	"sort"

	"github.com/starmock/starmock/evolve"
	"github.com/starmock/starmock/internal/consts"
	"github.com/starmock/starmock/synth/observe"
)

// detectBound decides, for a Galactic component, which systems can never pass the
// survey's detection rule, whatever their metallicity and extinction, so that they need
// not be simulated. Extinction is at least zero and is taken as zero.
//
// Single-star thresholds. On a grid of initial masses (320, logarithmic over the IMF's
// range) and age cells (120, logarithmic up to the oldest allowed age), it evaluates the
// absolute magnitudes per band, brightest over four metallicities spanning the allowed
// range, at the age edges and at every phase end (end of the main sequence, base of the
// giant branch, helium ignition, end of core helium burning, end of the AGB — the
// brightest moments of each phase — and just after, for the newborn remnant). A cell
// (mass interval × age interval) takes the brightest of its two masses at its two age
// edges and at every phase end of either mass inside it (widened by 5 %). While a star is
// certainly on the main sequence (younger than the shortest main-sequence lifetime of the
// next grid mass up) the end-of-main-sequence brightness of that mass bounds it instead.
// A star fails in a band at distance modulus μ if
//
//	M_brightest + μ − 0.753 > m5 + boundMarginMag
//
// where 0.753 = 2.5 log10 2 is the most a companion that is not brighter adds, and the
// margin covers upward noise fluctuations: 3 mag below the 5σ depth the true S/N is 0.32,
// and a measured S/N of 5 needs a 4.7σ fluctuation (probability 1.3e-6). For all_of a
// failure in any listed band suffices; for any_of and at_least every listed band must fail
// (conservative for at_least).
//
// Three tests use them, from cheapest to sharpest:
//
//  1. Mass bound per shell: the largest grid mass below which every mass is undetectable at
//     every allowed age at the shell's inner distance. Companions are never more massive
//     than their primary, so such systems are never drawn (the shell's expected number is
//     reduced by the IMF fraction below the bound).
//  2. Per system, after its masses and age are drawn: both members' thresholds (cell or
//     main sequence) at the shell's inner distance; the system is dropped if neither
//     member can be seen.
//  3. Per system, after evolution: the total bolometric luminosity of both members with
//     the largest bolometric correction of each band anywhere in the photometer's grid,
//     M_X ≥ M_bol − max BC_X.
//
// Phase ends are interpolated between neighbouring grid masses by the widening, which is
// the one approximation; the test of issue 6 compares the detected samples with and without
// the bound.
type detectBound struct {
	masses []float64
	// tMS[i] is the shortest main-sequence lifetime (yr) of masses[i] over the
	// metallicity grid; muMS[i] the distance modulus beyond which masses[i] cannot be
	// detected anywhere on its main sequence.
	tMS  []float64
	muMS []float64
	// ageEdges are the age cells (yr); cell[i*nAge+j] the distance modulus beyond which a
	// star of mass in [masses[i], masses[i+1]] and age in cell j is undetectable.
	ageEdges []float64
	cell     []float64
	// muLimit[i] is the distance modulus beyond which every mass up to masses[i] is
	// undetectable at every allowed age.
	muLimit []float64
	// For the luminosity test: per band the largest bolometric correction anywhere in
	// the photometer's grid (M_X ≥ M_bol − maxBC), the band limits and the rule.
	maxBC      []float64
	limits     []float64
	use        []int
	combineMax bool

	lo float64
}

// boundMarginMag is the noise margin of the bound (see detectBound).
const boundMarginMag = 3.0

// binaryBoostMag is 2.5 log10 2: an equal-mass unresolved pair's brightening.
var binaryBoostMag = 2.5 * math.Log10(2)

func newDetectBound(p *Plan, cp *ComponentPlan) (*detectBound, error) {
	lo, hi := cp.IMF.Bounds()
	aLo, aHi := cp.Ages.Range()
	fLo, fHi := cp.FeH.Range()
	const nMass = 320
	const nAge = 120
	const nFeH = 4
	sp := p.Survey
	rule := sp.Detection
	ruleIdx := map[string]bool{}
	for _, b := range rule.Bands() {
		ruleIdx[b] = true
	}
	var use []int
	for k, b := range sp.Bands {
		if ruleIdx[b.Name] {
			use = append(use, k)
		}
	}
	combineMax := rule.Kind() == observe.RuleAllOf
	nb := len(sp.Bands)
	db := &detectBound{masses: make([]float64, nMass), lo: lo,
		tMS: make([]float64, nMass), muMS: make([]float64, nMass)}
	db.maxBC, db.use, db.combineMax = maxBolometricCorrections(sp), use, combineMax
	for _, spec := range sp.Specs {
		db.limits = append(db.limits, spec.Limit5SigmaMag)
	}
	// Age cells: logarithmic from 1 Myr (or the youngest age) to the oldest age.
	a0 := math.Max(aLo, 1e6)
	if a0 >= aHi {
		a0 = aHi / 2
	}
	db.ageEdges = make([]float64, nAge+1)
	for j := range db.ageEdges {
		db.ageEdges[j] = a0 * math.Pow(aHi/a0, float64(j)/float64(nAge))
	}
	db.ageEdges[0] = 0
	db.ageEdges[nAge] = aHi * (1 + 1e-12)
	fehs := make([]float64, nFeH)
	for jf := range fehs {
		fehs[jf] = fLo + (fHi-fLo)*float64(jf)/float64(nFeH-1)
	}
	abs := make([]float64, nb)
	// node[i][j][k]: brightest M_k of mass i over metallicities at age edge j; peaks[i]
	// the brightest M_k at each phase end (the brightest moments of the subgiant, giant,
	// core-helium and AGB phases, and the newborn remnant) with its age.
	node := make([][]float64, nMass)
	type peak struct {
		age float64
		mag []float64
	}
	peaks := make([][]peak, nMass)
	brightest := func(dst []float64, st evolve.Star, fq float64) {
		if !hasLight(st) {
			return
		}
		sp.Photo.AbsMags(st.TeffK, st.LoggCgs, fq, st.LuminosityLsun, abs)
		for k := range abs {
			if !math.IsNaN(abs[k]) && abs[k] < dst[k] {
				dst[k] = abs[k]
			}
		}
	}
	inf := func() []float64 {
		v := make([]float64, nb)
		for k := range v {
			v[k] = math.Inf(1)
		}
		return v
	}
	bestMS := make([]float64, nb)
	for i := 0; i < nMass; i++ {
		m := lo * math.Pow(hi/lo, float64(i)/float64(nMass-1))
		db.masses[i] = m
		db.tMS[i] = math.Inf(1)
		copy(bestMS, inf())
		node[i] = make([]float64, (nAge+1)*nb)
		for k := range node[i] {
			node[i][k] = math.Inf(1)
		}
		for _, feh := range fehs {
			key, fq := quantiseFeH(feh)
			mod, err := p.model(key, fq)
			if err != nil {
				return nil, err
			}
			ts, err := mod.Timescales(m)
			if err != nil {
				return nil, err
			}
			db.tMS[i] = math.Min(db.tMS[i], ts.MSLifetimeYr)
			st, err := mod.Evolve(m, ts.MSLifetimeYr*(1-1e-9))
			if err != nil {
				return nil, err
			}
			if st.Stage == evolve.MainSequence {
				brightest(bestMS, st, fq)
			} else {
				for k := range bestMS { // cannot tell: never skip this mass on the main sequence
					bestMS[k] = math.Inf(-1)
				}
			}
			for j, a := range db.ageEdges {
				st, err := mod.Evolve(m, math.Min(a, aHi))
				if err != nil {
					return nil, err
				}
				brightest(node[i][j*nb:(j+1)*nb], st, fq)
			}
			for _, t := range []float64{ts.MSLifetimeYr, ts.BGBYr, ts.HeIgnitionYr, ts.EndCoreHeYr, ts.EndAGBYr} {
				for _, a := range []float64{t * (1 - 1e-7), t * (1 + 1e-7)} {
					if !(a > 0) || a > aHi || math.IsInf(a, 0) || math.IsNaN(a) {
						continue
					}
					st, err := mod.Evolve(m, a)
					if err != nil {
						return nil, err
					}
					pk := peak{age: a, mag: inf()}
					brightest(pk.mag, st, fq)
					peaks[i] = append(peaks[i], pk)
				}
			}
		}
		db.muMS[i] = threshold(sp, use, bestMS, combineMax)
	}
	// Cell thresholds: mass interval [m_i, m_{i+1}] × age cell [a_j, a_{j+1}], the
	// brightest over both masses at both age edges and at every phase peak inside the
	// cell, of either mass (phase times move smoothly between neighbouring masses).
	db.cell = make([]float64, (nMass-1)*nAge)
	best := make([]float64, nb)
	for i := 0; i+1 < nMass; i++ {
		for j := 0; j < nAge; j++ {
			copy(best, inf())
			for _, ii := range []int{i, i + 1} {
				for _, jj := range []int{j, j + 1} {
					for k := 0; k < nb; k++ {
						best[k] = math.Min(best[k], node[ii][jj*nb+k])
					}
				}
				for _, pk := range peaks[ii] {
					if pk.age >= db.ageEdges[j]/1.05 && pk.age <= db.ageEdges[j+1]*1.05 {
						for k := 0; k < nb; k++ {
							best[k] = math.Min(best[k], pk.mag[k])
						}
					}
				}
			}
			db.cell[i*nAge+j] = threshold(sp, use, best, combineMax)
		}
	}
	// Mass bound: a mass is undetectable at any allowed age if every cell next to it
	// (inside the allowed ages) is; a running maximum over masses, so that all masses up
	// to masses[i] are undetectable beyond muLimit[i]. Companions are never more massive
	// than their primary, so a system whose primary lies below the bound is undetectable
	// too.
	db.muLimit = make([]float64, nMass)
	running := math.Inf(-1)
	for i := 0; i < nMass; i++ {
		thr := math.Inf(-1)
		for j := 0; j < nAge; j++ {
			if db.ageEdges[j+1] < aLo {
				continue
			}
			if i < nMass-1 {
				thr = math.Max(thr, db.cell[i*nAge+j])
			}
			if i > 0 {
				thr = math.Max(thr, db.cell[(i-1)*nAge+j])
			}
		}
		running = math.Max(running, thr)
		db.muLimit[i] = running
	}
	return db, nil
}

// starThreshold returns the distance modulus beyond which a star of initial mass m
// (Msun) and age ageYr can never be detected: the main-sequence bound while the star is
// certainly on the main sequence, else the (mass, age) cell bound. Masses below the grid
// use the lowest grid mass (a brighter star); masses above it cannot be bounded (+Inf).
func (d *detectBound) starThreshold(m, ageYr float64) float64 {
	n := len(d.masses)
	i := sort.SearchFloat64s(d.masses, m) // masses[i-1] < m <= masses[i]
	if i >= n {
		return math.Inf(1)
	}
	if ageYr < d.tMS[i] {
		return d.muMS[i]
	}
	ic := max(i-1, 0)
	j := sort.SearchFloat64s(d.ageEdges, ageYr) - 1
	if j < 0 {
		j = 0
	}
	if j >= len(d.ageEdges)-1 {
		return math.Inf(1)
	}
	return d.cell[ic*(len(d.ageEdges)-1)+j]
}

// skipSystem reports whether a primary (m1, age) with an optional companion of initial
// mass m2 (0 for none) at distance modulus mu can never be detected: both members are
// individually below the limit (their thresholds include the pair boost).
func (d *detectBound) skipSystem(m1, m2, ageYr, mu float64) bool {
	thr := d.starThreshold(m1, ageYr)
	if m2 > 0 {
		thr = math.Max(thr, d.starThreshold(m2, ageYr))
	}
	return mu > thr
}

// threshold returns the distance modulus beyond which a star whose brightest absolute
// magnitudes per band are best cannot pass the rule: per band the star fails when
// M + μ − boost > m5 + margin, i.e. μ > T_k = m5 + margin + boost − M; for all_of a failure
// in any listed band suffices (min T_k), otherwise every listed band must fail (max T_k).
// A band without light never detects (T_k = −∞).
func threshold(sp *SurveyPlan, use []int, best []float64, combineMax bool) float64 {
	thr := math.Inf(1)
	if !combineMax {
		thr = math.Inf(-1)
	}
	for _, k := range use {
		t := sp.Specs[k].Limit5SigmaMag + boundMarginMag + binaryBoostMag - best[k]
		if math.IsInf(best[k], 1) {
			t = math.Inf(-1)
		}
		if combineMax {
			thr = math.Min(thr, t)
		} else {
			thr = math.Max(thr, t)
		}
	}
	return thr
}

// maxBolometricCorrections scans the photometer's grid (400 steps in log Teff × 60 in
// log g over its whole domain, at the middle of its [Fe/H] range) and returns per band the
// largest BC_X plus 0.05 mag: the grid is interpolated by a monotone cubic in log Teff and
// linearly in log g, so values between scan points cannot exceed neighbouring nodes by
// more than the curvature the margin covers.
func maxBolometricCorrections(sp *SurveyPlan) []float64 {
	tLo, tHi, gLo, gHi, fLo, fHi := sp.Photo.Domain()
	nb := len(sp.Bands)
	out := make([]float64, nb)
	for k := range out {
		out[k] = math.Inf(-1)
	}
	bc := make([]float64, nb)
	for it := 0; it <= 400; it++ {
		teff := tLo * math.Pow(tHi/tLo, float64(it)/400)
		for ig := 0; ig <= 60; ig++ {
			g := gLo + (gHi-gLo)*float64(ig)/60
			sp.Photo.BCs(teff, g, 0.5*(fLo+fHi), bc)
			for k, v := range bc {
				if !math.IsNaN(v) && v > out[k] {
					out[k] = v
				}
			}
		}
	}
	for k := range out {
		out[k] += 0.05
	}
	return out
}

// skipLuminosity reports whether a system of total bolometric luminosity lumLsun can
// never pass the rule at distance modulus mu: per band M_X ≥ M_bol − maxBC_X, and the
// band fails if M_X + μ > m5 + margin (no pair boost: lumLsun already holds both stars).
func (d *detectBound) skipLuminosity(lumLsun, mu float64) bool {
	if !(lumLsun > 0) {
		return true // no light at all
	}
	mbol := consts.MBol(lumLsun)
	fails := 0
	for _, k := range d.use {
		if mbol-d.maxBC[k]+mu > d.limits[k]+boundMarginMag {
			fails++
		}
	}
	if d.combineMax {
		return fails > 0
	}
	return fails == len(d.use)
}

// massBelowUndetectable returns the initial mass (Msun) below which no system at
// distance ≥ dPc can be detected: the largest grid mass m_i such that μ(d) exceeds
// muLimit[i]; the IMF's lower limit if there is none.
func (d *detectBound) massBelowUndetectable(dPc float64) float64 {
	mu := consts.DistanceModulus(dPc)
	m := d.lo
	for i := range d.masses {
		if mu > d.muLimit[i] {
			m = d.masses[i]
		} else {
			break
		}
	}
	return m
}
