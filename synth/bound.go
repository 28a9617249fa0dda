package synth

import (
	"math"
	"sort"

	"github.com/starmock/starmock/evolve"

	"github.com/starmock/starmock/internal/consts"
	"github.com/starmock/starmock/synth/observe"
)

// detectBound finds, for a Galactic component, the initial mass below which a system can
// never pass the survey's detection rule, whatever its age, metallicity and extinction.
//
// For every primary mass on a fine grid it takes the brightest absolute magnitude per
// band over a grid of ages and metallicities spanning the component's allowed ranges
// (extinction is at least zero, so it is taken as zero). An unresolved companion is never
// more massive than its primary, and all stars below the bound are individually
// undetectable, so a pair is at most 2.5 log10 2 = 0.753 mag brighter than its brighter
// member. A star then cannot be detected in a band at distance d if
//
//	M_brightest + μ(d) − 0.753 > m5 + boundMarginMag
//
// where the margin covers upward noise fluctuations: 3 mag below the 5σ depth the true
// S/N is 0.32, and a measured S/N of 5 needs a 4.7σ fluctuation (probability 1.3e-6).
// The detection rule combines the bands: for all_of a star is undetectable if it fails in
// any listed band (the largest excess counts); for any_of and at_least, only if it fails in
// every listed band (the smallest excess counts), which is conservative for at_least.
// The bound is the largest grid mass below which every grid mass is undetectable
// (a running maximum of the per-mass thresholds, so a bright evolved phase of a low mass closes the bound there).
//
// A second, sharper test applies to each drawn star: a star younger than the shortest
// main-sequence lifetime of its mass over the allowed metallicities is on the main
// sequence, where it is never brighter than at the end of that phase; it is skipped if
// even that brightness (the brightest over metallicities, plus the pair boost and the
// noise margin) cannot reach the detection limit at the inner edge of its shell. Masses
// between grid points use the next grid mass up (shorter lifetime, brighter end of the
// main sequence), which keeps the test conservative.
type detectBound struct {
	masses []float64
	// tMS[i] is the shortest main-sequence lifetime (yr) of masses[i] over the
	// metallicity grid; muMS[i] the distance modulus beyond which masses[i] cannot be
	// detected anywhere on its main sequence.
	tMS  []float64
	muMS []float64
	// muLimit[i] is the distance modulus above which every grid mass up to masses[i] is
	// undetectable (a running maximum of the per-mass thresholds).
	muLimit []float64
	lo      float64
}

// boundMarginMag is the noise margin of the bound (see detectBound).
const boundMarginMag = 3.0

// binaryBoostMag is 2.5 log10 2: an equal-mass unresolved pair's brightening.
var binaryBoostMag = 2.5 * math.Log10(2)

func newDetectBound(p *Plan, cp *ComponentPlan) (*detectBound, error) {
	lo, hi := cp.IMF.Bounds()
	aLo, aHi := cp.Ages.Range()
	fLo, fHi := cp.FeH.Range()
	const nMass = 480
	const nAge = 14
	const nFeH = 5
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
	abs := make([]float64, nb)
	best := make([]float64, nb)
	db := &detectBound{masses: make([]float64, nMass), muLimit: make([]float64, nMass), lo: lo,
		tMS: make([]float64, nMass), muMS: make([]float64, nMass)}
	bestMS := make([]float64, nb)
	ages := make([]float64, 0, nAge)
	for i := 0; i < nAge; i++ {
		t := float64(i) / float64(nAge-1)
		if aLo <= 0 {
			ages = append(ages, aLo+(aHi-aLo)*t)
		} else {
			ages = append(ages, aLo*math.Pow(aHi/aLo, t))
		}
	}
	running := math.Inf(-1)
	for i := 0; i < nMass; i++ {
		m := lo * math.Pow(hi/lo, float64(i)/float64(nMass-1))
		db.masses[i] = m
		for k := range best {
			best[k] = math.Inf(1)
			bestMS[k] = math.Inf(1)
		}
		db.tMS[i] = math.Inf(1)
		for jf := 0; jf < nFeH; jf++ {
			feh := fLo
			if nFeH > 1 {
				feh = fLo + (fHi-fLo)*float64(jf)/float64(nFeH-1)
			}
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
			if st, err := mod.Evolve(m, ts.MSLifetimeYr*(1-1e-9)); err == nil && hasLight(st) && st.Stage == evolve.MainSequence {
				sp.Photo.AbsMags(st.TeffK, st.LoggCgs, fq, st.LuminosityLsun, abs)
				for k := range abs {
					if !math.IsNaN(abs[k]) && abs[k] < bestMS[k] {
						bestMS[k] = abs[k]
					}
				}
			} else if err != nil {
				return nil, err
			} else {
				for k := range bestMS { // cannot tell: never skip this mass
					bestMS[k] = math.Inf(-1)
				}
			}
			for _, a := range ages {
				st, err := mod.Evolve(m, a)
				if err != nil {
					return nil, err
				}
				if !hasLight(st) {
					continue
				}
				sp.Photo.AbsMags(st.TeffK, st.LoggCgs, fq, st.LuminosityLsun, abs)
				for k := range abs {
					if !math.IsNaN(abs[k]) && abs[k] < best[k] {
						best[k] = abs[k]
					}
				}
			}
		}
		thr := threshold(sp, use, best, combineMax)
		db.muMS[i] = threshold(sp, use, bestMS, combineMax)
		if thr < running {
			thr = running
		}
		running = thr
		db.muLimit[i] = running
	}
	return db, nil
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

// skipMainSequence reports whether a primary of initial mass m (Msun) and age (yr) is
// certainly on the main sequence and too faint at distance modulus mu to be detected.
func (d *detectBound) skipMainSequence(m, ageYr, mu float64) bool {
	i := sort.SearchFloat64s(d.masses, m)
	if i >= len(d.masses) {
		return false
	}
	return ageYr < d.tMS[i] && mu > d.muMS[i]
}

// massBelowUndetectable returns the initial mass (Msun) below which no system at
// distance ≥ dPc can be detected: the largest grid mass m_i such that μ(d) exceeds the
// threshold of every grid mass up to m_i; the IMF's lower limit if there is none.
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
