package synth

import (
	"math"
	"runtime"
	"sort"
	"sync"

	"github.com/starmock/starmock/evolve"
	"github.com/starmock/starmock/internal/consts"
	"github.com/starmock/starmock/synth/observe"
)

// Brightness bounds for magnitude-limit-aware sampling of Galactic components.
//
// Ages are measured in units of each star's main-sequence lifetime, τ = age / t_MS(m,
// [Fe/H]), so that the phases of neighbouring masses and metallicities line up. On a
// fixed grid of initial mass (boundMasses nodes, logarithmic over the evolution model's
// 0.08–150 Msun) and a fixed grid of τ (one main-sequence cell τ < boundTauMS, then
// boundTauPost cells logarithmic up to τ = 2, then boundTauLate cells logarithmic up to
// τ = 10⁴, beyond every allowed age of the shortest-lived star, the last open-ended),
// and for one rounded
// metallicity at a time, keyNodes holds the absolute magnitudes per survey band of every
// grid mass at every τ edge, at every phase end (end of the main sequence, base of the
// giant branch, helium ignition, end of core helium burning, end of the AGB — the
// brightest moments of the subgiant, giant, core-helium and AGB phases — and just after,
// for the newborn remnant), at the quarter points of each of these phases, and at the end
// of the main sequence (the brightest point of a main-sequence star, or 1.5 × 13.8 Gyr
// for stars that live longer). A magnitude the photometry cannot give (outside its grid;
// the catalogue writes null and never detects the star) counts as infinitely faint after
// the main sequence, where the cell takes the brightest of its other points, and as
// infinitely bright at the end of the main sequence, where it is the only point.
//
// A cell of (metallicity bin × mass interval × τ interval) takes the brightest magnitudes
// of its corners (two metallicities × two masses × two τ) and of every phase point of its
// four corner tracks inside the τ interval widened by 0.2 %; in the main-sequence cell, the
// end-of-main-sequence brightness of the four corners. Inside a cell, t_MS is interpolated
// bilinearly in (ln m, [Fe/H]) between the corners' ln t_MS (the interpolation error of
// this smooth function over one cell, ≲ 1e-4 in τ, is far inside the widening). A star
// fails in a band at distance modulus μ if
//
//	M_brightest + μ − 0.753 > m5 + boundMarginMag
//
// where 0.753 = 2.5 log10 2 is the most a companion that is not brighter adds, and the
// margin covers upward noise fluctuations: 3 mag below the 5σ depth the true S/N is 0.32,
// and a measured S/N of 5 needs a 4.7σ fluctuation (probability 1.3e-6). Extinction is at
// least zero and is taken as zero. For all_of a failure in any listed band suffices; for
// any_of and at_least every listed band must fail (conservative for at_least).
//
// The approximation is the interpolation between grid corners: brightness is taken to
// vary monotonically between neighbouring masses, metallicities and the sampled phase
// points, which the margin covers; the tests of issue 6 compare the detected samples with
// and without the bound (a deep and a bright survey), and check that every star detected
// without it is one the bound keeps, apart from noise-only detections more than 3 mag
// below the depth, whose number they bound by the 4.7σ tail.

const (
	boundMasses   = 320
	boundTauMS    = 0.999 // main-sequence cell: τ below this is certainly on the main sequence
	boundTauPost  = 120
	boundTauLate  = 50
	boundTauSplit = 2.0
	boundFeHStep  = 0.1 // width of the metallicity bins of the bound (dex)
)

// boundMarginMag is the noise margin of the bound (see above).
const boundMarginMag = 3.0

// binaryBoostMag is 2.5 log10 2: an equal-mass unresolved pair's brightening.
var binaryBoostMag = 2.5 * math.Log10(2)

// boundMassGrid (Msun) and boundTauGrid (edges of the cells after the main sequence, the
// first at boundTauMS, the last +Inf) are the fixed grids of the bound.
var boundMassGrid, boundTauGrid = func() ([]float64, []float64) {
	m := make([]float64, boundMasses)
	for i := range m {
		m[i] = minEvolveMass * math.Pow(maxEvolveMass/minEvolveMass, float64(i)/float64(boundMasses-1))
	}
	m[boundMasses-1] = maxEvolveMass
	// The shortest main-sequence lifetime is above 2.5 Myr (150 Msun, package evolve), so
	// τ = 1e4 covers every age up to 13.8 Gyr.
	const tauMax = 1e4
	t := []float64{boundTauMS}
	for j := 1; j <= boundTauPost; j++ {
		t = append(t, boundTauMS*math.Pow(boundTauSplit/boundTauMS, float64(j)/boundTauPost))
	}
	for j := 1; j <= boundTauLate; j++ {
		t = append(t, boundTauSplit*math.Pow(tauMax/boundTauSplit, float64(j)/boundTauLate))
	}
	t[len(t)-1] = math.Inf(1)
	return m, t
}()

// phasePoint is the magnitude per band of a grid track at one τ.
type phasePoint struct {
	tau float64
	mag []float64
}

// keyNodes are the brightness nodes of one rounded metallicity (see above). Magnitudes
// are +Inf for a star without light; nodes that were not evaluated (ages far beyond
// 13.8 Gyr) are NaN and count as infinitely bright if a cell ever needs them.
type keyNodes struct {
	fq     float64   // [Fe/H] (dex)
	lnTMS  []float64 // ln of the main-sequence lifetime (yr) per grid mass
	msBest []float64 // [mass*nb+k]: brightest on the main sequence; −Inf: cannot tell
	node   []float64 // [(mass*len(boundTauGrid)+j)*nb+k] at τ edge j
	peaks  [][]phasePoint
}

// boundNodes returns the nodes of the given metallicity keys, building the missing ones
// in parallel once per plan.
func (p *Plan) boundNodes(keys []int) (map[int]*keyNodes, error) {
	p.boundMu.Lock()
	defer p.boundMu.Unlock()
	if p.bounds == nil {
		p.bounds = map[int]*keyNodes{}
	}
	var todo []int
	seen := map[int]bool{}
	for _, k := range keys {
		if _, ok := p.bounds[k]; !ok && !seen[k] {
			todo = append(todo, k)
			seen[k] = true
		}
	}
	sort.Ints(todo)
	built := make([]*keyNodes, len(todo))
	errs := make([]error, len(todo))
	var wg sync.WaitGroup
	sem := make(chan struct{}, max(1, min(p.Workers(), runtime.NumCPU())))
	for n, k := range todo {
		wg.Add(1)
		go func() {
			defer wg.Done()
			sem <- struct{}{}
			defer func() { <-sem }()
			built[n], errs[n] = p.buildKeyNodes(k)
		}()
	}
	wg.Wait()
	for n, k := range todo {
		if errs[n] != nil {
			return nil, errs[n]
		}
		p.bounds[k] = built[n]
	}
	out := make(map[int]*keyNodes, len(keys))
	for _, k := range keys {
		out[k] = p.bounds[k]
	}
	return out, nil
}

func (p *Plan) buildKeyNodes(key int) (*keyNodes, error) {
	fq := float64(key) * fehStep
	mod, err := p.model(key, fq)
	if err != nil {
		return nil, err
	}
	sp := p.Survey
	nb := len(sp.Bands)
	nT := len(boundTauGrid)
	kn := &keyNodes{fq: fq, lnTMS: make([]float64, boundMasses), msBest: make([]float64, boundMasses*nb),
		node: make([]float64, boundMasses*nT*nb), peaks: make([][]phasePoint, boundMasses)}
	abs := make([]float64, nb)
	// mags fills dst with the absolute magnitudes of st; a magnitude the photometry
	// cannot give (outside its grid: the catalogue writes null, which is never detected)
	// is +Inf after the main sequence and ifNaN on it.
	mags := func(dst []float64, st evolve.Star, ifNaN float64) {
		for k := range dst {
			dst[k] = math.Inf(1)
		}
		if !hasLight(st) {
			return
		}
		sp.Photo.AbsMags(st.TeffK, st.LoggCgs, fq, st.LuminosityLsun, abs)
		for k, v := range abs {
			dst[k] = v
			if math.IsNaN(v) {
				dst[k] = ifNaN
			}
		}
	}
	for i := range kn.node {
		kn.node[i] = math.NaN()
	}
	for i, m := range boundMassGrid {
		ts, err := mod.Timescales(m)
		if err != nil {
			return nil, err
		}
		tms := ts.MSLifetimeYr
		kn.lnTMS[i] = math.Log(tms)
		ms := kn.msBest[i*nb : (i+1)*nb]
		// The main sequence brightens with age: its brightest allowed point is its end, or
		// the oldest age any corner of a cell may reach.
		st, err := mod.Evolve(m, math.Min(tms*(1-1e-9), 1.5*MaxAgeYr))
		if err != nil {
			return nil, err
		}
		if st.Stage == evolve.MainSequence {
			mags(ms, st, math.Inf(-1)) // the star may be inside the grid earlier on
		} else { // cannot tell: never bound this mass by its main sequence
			for k := range ms {
				ms[k] = math.Inf(-1)
			}
		}
		if tms*boundTauMS > 1.5*MaxAgeYr {
			continue // on the main sequence at every allowed age, even for the cell's other corners
		}
		dark := ts.Remnant == evolve.NeutronStar || ts.Remnant == evolve.BlackHole || ts.Remnant == evolve.NoRemnant
		for j, tau := range boundTauGrid {
			a := tau * tms
			if j > 0 && boundTauGrid[j-1]*tms > 1.5*MaxAgeYr {
				break // no cell reaching this node has an allowed age
			}
			v := kn.node[(i*nT+j)*nb : (i*nT+j+1)*nb]
			if dark && a > ts.EndAGBYr*(1+1e-6) { // a neutron star or black hole: no light from then on
				for k := range v {
					v[k] = math.Inf(1)
				}
				continue
			}
			st, err := mod.Evolve(m, math.Min(a, evolve.MaxAgeYr))
			if err != nil {
				return nil, err
			}
			mags(v, st, math.Inf(1))
		}
		ends := []float64{ts.MSLifetimeYr, ts.BGBYr, ts.HeIgnitionYr, ts.EndCoreHeYr, ts.EndAGBYr}
		var ages []float64
		for n, t := range ends {
			ages = append(ages, t*(1-1e-7), t*(1+1e-7))
			if n+1 < len(ends) && ends[n+1] > t {
				for _, f := range []float64{0.25, 0.5, 0.75} {
					ages = append(ages, t+f*(ends[n+1]-t))
				}
			}
		}
		for _, a := range ages {
			if !(a > 0) || a > 1.5*MaxAgeYr || math.IsInf(a, 0) {
				continue
			}
			st, err := mod.Evolve(m, a)
			if err != nil {
				return nil, err
			}
			pp := phasePoint{tau: a / tms, mag: make([]float64, nb)}
			mags(pp.mag, st, math.Inf(1))
			kn.peaks[i] = append(kn.peaks[i], pp)
		}
	}
	return kn, nil
}

// cellBrightest fills best with the brightest magnitudes of the cell after the main
// sequence (metallicity keys kns, grid masses i and i+1, τ edges j and j+1; see above).
func cellBrightest(best []float64, kns [2]*keyNodes, i, j, nb int) {
	nT := len(boundTauGrid)
	for k := range best {
		best[k] = math.Inf(1)
	}
	lo, hi := boundTauGrid[j]/1.002, boundTauGrid[j+1]*1.002
	for _, kn := range kns {
		for _, ii := range [2]int{i, i + 1} {
			for _, jj := range [2]int{j, j + 1} {
				if jj >= nT {
					continue
				}
				v := kn.node[(ii*nT+jj)*nb : (ii*nT+jj+1)*nb]
				for k := range best {
					if math.IsNaN(v[k]) {
						best[k] = math.Inf(-1)
					} else {
						best[k] = math.Min(best[k], v[k])
					}
				}
			}
			for _, pk := range kn.peaks[ii] {
				if pk.tau >= lo && pk.tau <= hi {
					for k := range best {
						best[k] = math.Min(best[k], pk.mag[k])
					}
				}
			}
		}
	}
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

// ruleBands returns the indices of the survey bands the detection rule reads and whether
// a failure in one of them suffices (all_of).
func ruleBands(sp *SurveyPlan) (use []int, combineMax bool) {
	in := map[string]bool{}
	for _, b := range sp.Detection.Bands() {
		in[b] = true
	}
	for k, b := range sp.Bands {
		if in[b.Name] {
			use = append(use, k)
		}
	}
	return use, sp.Detection.Kind() == observe.RuleAllOf
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

// lumBound is the test applied after evolution: a system of total bolometric luminosity
// L cannot pass the rule at distance modulus μ if per band M_X ≥ M_bol − maxBC_X gives
// M_X + μ > m5 + margin (no pair boost: L already holds both stars).
type lumBound struct {
	maxBC      []float64
	limits     []float64
	use        []int
	combineMax bool
}

func newLumBound(sp *SurveyPlan) *lumBound {
	lb := &lumBound{maxBC: maxBolometricCorrections(sp)}
	lb.use, lb.combineMax = ruleBands(sp)
	for _, spec := range sp.Specs {
		lb.limits = append(lb.limits, spec.Limit5SigmaMag)
	}
	return lb
}

// skip reports whether a system of total bolometric luminosity lumLsun can never pass the
// rule at distance modulus mu.
func (d *lumBound) skip(lumLsun, mu float64) bool {
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
