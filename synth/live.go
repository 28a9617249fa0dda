package synth

import (
	"errors"
	"math"
	"math/rand/v2"
	"sort"

	"gonum.org/v1/gonum/integrate/quad"
)

// liveBound samples only the systems of a Galactic component that may pass the survey's
// detection rule in a given distance shell, and no others.
//
// The component's (metallicity, initial mass, age) space is cut into cells: metallicity
// bins of boundFeHStep dex on a fixed lattice, the mass intervals of the bound's grid, and
// per (bin, mass) intervals of τ = age / t_MS (see bound.go for each cell's brightness and
// threshold distance modulus, and for t_MS inside a cell). A cell is live in a shell if
// its threshold is at least the distance modulus of the shell's inner edge; consecutive τ
// cells live in the same shells are merged into one segment. A system may be detected
// only if its primary or its companion lies in a live cell (each threshold includes the
// 0.753 mag an equal companion adds), so the systems drawn are of two classes:
//
//  1. the primary's cell is live. A segment is proposed with probability ∝ its envelope
//     weight P([Fe/H] bin) × P(m1 in the mass interval) × [G(τ1 t_max) − G(τ0 t_min)],
//     where G is the age distribution function and t_min, t_max the extreme t_MS of the
//     cell's corners (the three distributions are independent in a component); [Fe/H] and
//     m1 are drawn inside the cell by inverting their distribution functions, the
//     proposal is accepted with probability [G(τ1 t) − G(τ0 t)] / [G(τ1 t_max) −
//     G(τ0 t_min)] for the star's own t = t_MS(m1, [Fe/H]) (Poisson thinning: exact), and
//     the age is drawn by inverting G on [τ0 t, τ1 t]. The companion is drawn as for any
//     system.
//  2. the companion's cell is live but the primary's is not: the segment is proposed with
//     probability ∝ P(bin) × H × [G(τ1 t_max) − G(τ0 t_min)], where H = ∫ f(m1) P(q m1 in
//     the interval) dF(m1) is the probability that a system has its companion in the
//     mass interval (binary fraction f, mass-ratio law on [q_min, q_max]; Gauss–Legendre
//     in F between the breakpoints of the integrand); the primary mass and mass ratio are
//     drawn given the companion's interval (rejection from the mass function, then the
//     ratio law restricted to the interval), thinned and aged as in class 1 with the
//     companion's t_MS, and the system is dropped when the primary's cell is live (it
//     belongs to class 1).
//
// The expected number of proposals of each class in a shell is the shell's expected
// number of systems times the summed envelope weight of its live segments; thinning a
// Poisson process keeps it Poisson, so the accepted systems of both classes are exactly
// the population restricted to systems with a live member. Segments are sorted by the
// number of shells they are live in, so the live segments of every shell are a prefix of
// one list.
type liveBound struct {
	edges []float64      // [Fe/H] bin edges (dex); one bin of zero width for a fixed value
	kns   [][2]*keyNodes // brightness nodes of the two rounded metallicities bracketing each bin
	prim  liveList
	comp  liveList
	// Lookup of the level (number of shells a cell is live in) by bin, mass interval and
	// τ: segments seg[segStart[b*nm+i] : segStart[b*nm+i+1]] with upper τ edges segT1.
	segStart []int32
	segT1    []float64
	segLevel []int32
	// massLow[s] is the lowest initial mass (Msun) of any cell live in shell s.
	massLow []float64
	bin     *binaryModel
	// Sub-divisions of the proposal envelopes (see liveSub*): per bin the [Fe/H] edges
	// and distribution-function values of its sub-bins, per mass interval the masses and
	// mass-function values of its sub-intervals and the companion-class tables.
	subFeH, subFeHCDF [][]float64
	subM, subMCDF     [][]float64
	compTab           [][]companionTable
}

// Narrow segments after the main sequence are proposed from sub-cells (liveSubFeH
// metallicity sub-bins × liveSubMass mass sub-intervals) whose t_MS range, and so whose
// envelope, is smaller: the acceptance of the thinning rises accordingly. Index 0 of
// each sub-division is the whole bin or interval.
const (
	liveSubFeH  = 2
	liveSubMass = 4
)

// subIndices[n] lists 0 … n−1.
var subIndices = func() map[int][]int {
	m := map[int][]int{}
	for _, n := range []int{liveSubFeH, liveSubMass} {
		m[n] = make([]int, n)
		for k := range m[n] {
			m[n][k] = k
		}
	}
	return m
}()

// liveCell is a proposal entry: a live segment of a (sub-)cell.
type liveCell struct {
	level    int32
	bin      int32
	mass     int32
	fs, ms   int32   // sub-bin and mass sub-interval (0: whole; k ≥ 1: sub-division k−1)
	t0, t1   float64 // τ interval
	tLo, tHi float64 // t_MS range of the sub-cell's corners (yr)
	env      float64 // G(τ1 tHi) − G(τ0 tLo)
}

// companionTable holds what the companion class needs for one companion mass interval:
// the breakpoints of the primaries' range, their mass-function values, the rejection
// envelope and H.
type companionTable struct {
	x0, x1 float64
	pts    []float64
	p0, p1 float64
	env    float64
	h      float64
}

// liveList holds proposal entries sorted by decreasing level, their cumulative envelope
// weights and, per shell, the number of live entries.
type liveList struct {
	cells []liveCell
	w     []float64
	cum   []float64
	nLive []int
}

func (l *liveList) add(c liveCell, w float64) {
	if w > 0 {
		l.cells = append(l.cells, c)
		l.w = append(l.w, w)
	}
}

func (l *liveList) finish(nShells int) {
	idx := make([]int, len(l.cells))
	for k := range idx {
		idx[k] = k
	}
	sort.SliceStable(idx, func(a, b int) bool { return l.cells[idx[a]].level > l.cells[idx[b]].level })
	cells := make([]liveCell, len(idx))
	l.cum = make([]float64, len(idx)+1)
	for k, n := range idx {
		cells[k] = l.cells[n]
		l.cum[k+1] = l.cum[k] + l.w[n]
	}
	l.cells, l.w = cells, nil
	l.nLive = make([]int, nShells)
	for s := range l.nLive {
		l.nLive[s] = sort.Search(len(l.cells), func(k int) bool { return int(l.cells[k].level) <= s })
	}
}

// weight returns the summed envelope weight of the entries live in shell s.
func (l *liveList) weight(s int) float64 { return l.cum[l.nLive[s]] }

// pick chooses a live entry of shell s with probability ∝ weight (one uniform).
func (l *liveList) pick(s int, u float64) *liveCell {
	n := l.nLive[s]
	x := u * l.cum[n]
	k := sort.Search(n, func(k int) bool { return l.cum[k+1] > x })
	if k >= n {
		k = n - 1
	}
	return &l.cells[k]
}

// fehBins returns the metallicity bins of a sampler: edges on the lattice of
// boundFeHStep dex inside its range, merging a last bin narrower than a fifth of a step.
func fehBins(f FeHSampler) []float64 {
	lo, hi := f.Range()
	if hi <= lo {
		return []float64{lo, lo}
	}
	edges := []float64{lo}
	for x := math.Floor(lo/boundFeHStep+1) * boundFeHStep; x < hi-boundFeHStep/5; x += boundFeHStep {
		if x-edges[len(edges)-1] > boundFeHStep/5 {
			edges = append(edges, math.Round(x*100)/100)
		}
	}
	return append(edges, hi)
}

func fehKey(feh float64) int { return int(math.Round(feh / fehStep)) }

// tMS returns the main-sequence lifetime (yr) inside cell (bin b, mass interval i) at
// initial mass m (Msun) and rounded [Fe/H] fq: bilinear in (ln m, [Fe/H]) between the
// corners' ln t_MS.
func (lb *liveBound) tMS(b, i int, m, fq float64) float64 {
	k := lb.kns[b]
	u := math.Log(m/boundMassGrid[i]) / math.Log(boundMassGrid[i+1]/boundMassGrid[i])
	u = math.Max(0, math.Min(1, u))
	v := 0.0
	if k[1].fq > k[0].fq {
		v = math.Max(0, math.Min(1, (fq-k[0].fq)/(k[1].fq-k[0].fq)))
	}
	lo := k[0].lnTMS[i] + u*(k[0].lnTMS[i+1]-k[0].lnTMS[i])
	hi := k[1].lnTMS[i] + u*(k[1].lnTMS[i+1]-k[1].lnTMS[i])
	return math.Exp(lo + v*(hi-lo))
}

// fehSpan returns the raw [Fe/H] edges of sub-bin fs of bin b (fs < 0: the whole bin)
// and the distribution function at them.
func (lb *liveBound) fehSpan(b, fs int) (e0, e1, c0, c1 float64) {
	if fs < 0 {
		return lb.edges[b], lb.edges[b+1], lb.subFeHCDF[b][0], lb.subFeHCDF[b][liveSubFeH]
	}
	return lb.subFeH[b][fs], lb.subFeH[b][fs+1], lb.subFeHCDF[b][fs], lb.subFeHCDF[b][fs+1]
}

// massSpan returns the masses (Msun) of sub-interval ms of mass interval i (ms < 0: the
// whole interval) and the mass function's distribution function at them.
func (lb *liveBound) massSpan(i, ms int) (x0, x1, f0, f1 float64) {
	if ms < 0 {
		return lb.subM[i][0], lb.subM[i][liveSubMass], lb.subMCDF[i][0], lb.subMCDF[i][liveSubMass]
	}
	return lb.subM[i][ms], lb.subM[i][ms+1], lb.subMCDF[i][ms], lb.subMCDF[i][ms+1]
}

// tRange returns the smallest and largest t_MS (yr) of sub-cell (b, fs, i, ms): at its
// corners, where the bilinear interpolation takes its extremes.
func (lb *liveBound) tRange(b, fs, i, ms int) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	e0, e1, _, _ := lb.fehSpan(b, fs)
	x0, x1, _, _ := lb.massSpan(i, ms)
	for _, f := range [2]float64{e0, e1} {
		_, fq := quantiseFeH(f)
		for _, m := range [2]float64{x0, x1} {
			t := lb.tMS(b, i, m, fq)
			lo, hi = math.Min(lo, t), math.Max(hi, t)
		}
	}
	return lo, hi
}

// ageCDF returns G(a), the component's age distribution function, with G(+Inf) = 1.
func ageCDF(cp *ComponentPlan, a float64) float64 {
	if math.IsInf(a, 1) {
		return 1
	}
	return cp.Ages.CDF(a)
}

// ageProb returns G(t1) − G(t0) for the component's age distribution (t0 ≥ 0; t1 may be
// +Inf).
func ageProb(cp *ComponentPlan, a0, a1 float64) float64 {
	return math.Max(0, ageCDF(cp, a1)-ageCDF(cp, a0))
}

// newLiveBound builds the cells of a component for the shells whose inner distance
// moduli are muInner (nondecreasing).
func newLiveBound(p *Plan, cp *ComponentPlan, muInner []float64) (*liveBound, error) {
	lb := &liveBound{edges: fehBins(cp.FeH), bin: cp.binaries}
	nbin := len(lb.edges) - 1
	var keys []int
	for b := 0; b <= nbin; b++ {
		keys = append(keys, fehKey(lb.edges[b]))
	}
	nodes, err := p.boundNodes(keys)
	if err != nil {
		return nil, err
	}
	fixed := lb.edges[0] == lb.edges[1]
	for b := 0; b < nbin; b++ {
		lb.kns = append(lb.kns, [2]*keyNodes{nodes[keys[b]], nodes[keys[b+1]]})
		e := make([]float64, liveSubFeH+1)
		c := make([]float64, liveSubFeH+1)
		for k := range e {
			e[k] = lb.edges[b] + (lb.edges[b+1]-lb.edges[b])*float64(k)/liveSubFeH
			c[k] = cp.FeH.CDF(e[k])
		}
		e[liveSubFeH] = lb.edges[b+1]
		if fixed { // a single value: the whole weight in the one bin
			for k := range c {
				c[k] = float64(k) / liveSubFeH
			}
		} else {
			c[liveSubFeH] = cp.FeH.CDF(lb.edges[b+1])
		}
		lb.subFeH, lb.subFeHCDF = append(lb.subFeH, e), append(lb.subFeHCDF, c)
	}
	nm := boundMasses - 1
	for i := 0; i < nm; i++ {
		x := make([]float64, liveSubMass+1)
		f := make([]float64, liveSubMass+1)
		for k := range x {
			x[k] = boundMassGrid[i] * math.Pow(boundMassGrid[i+1]/boundMassGrid[i], float64(k)/liveSubMass)
		}
		x[0], x[liveSubMass] = boundMassGrid[i], boundMassGrid[i+1]
		for k := range x {
			f[k] = cp.IMF.CDF(x[k])
		}
		lb.subM, lb.subMCDF = append(lb.subM, x), append(lb.subMCDF, f)
		if lb.bin != nil {
			tab := make([]companionTable, liveSubMass+1)
			for ms := -1; ms < liveSubMass; ms++ {
				x0, x1, _, _ := lb.massSpan(i, ms)
				tab[ms+1] = lb.companionTable(cp, x0, x1)
			}
			lb.compTab = append(lb.compTab, tab)
		}
	}
	sp := p.Survey
	nb := len(sp.Bands)
	use, combineMax := ruleBands(sp)
	ns := len(muInner)
	levelOf := func(thr float64) int32 {
		return int32(sort.Search(ns, func(s int) bool { return muInner[s] > thr }))
	}
	lb.segStart = make([]int32, nbin*nm+1)
	best := make([]float64, nb)
	type seg struct {
		t0, t1 float64
		level  int32
	}
	var segs []seg
	nT := len(boundTauGrid)
	aLo, aHi := cp.Ages.Range()
	for b := 0; b < nbin; b++ {
		kns := lb.kns[b]
		for i := 0; i < nm; i++ {
			segs = segs[:0]
			add := func(t0, t1 float64, level int32) {
				if n := len(segs); n > 0 && segs[n-1].level == level {
					segs[n-1].t1 = t1
					return
				}
				segs = append(segs, seg{t0, t1, level})
			}
			tLo, tHi := lb.tRange(b, -1, i, -1)
			// Main-sequence cell: the brightest end of the main sequence of the corners.
			for k := range best {
				best[k] = math.Inf(1)
				for _, kn := range kns {
					for _, ii := range [2]int{i, i + 1} {
						best[k] = math.Min(best[k], kn.msBest[ii*nb+k])
					}
				}
			}
			add(0, boundTauMS, levelOf(threshold(sp, use, best, combineMax)))
			for j := 0; j+1 < nT; j++ {
				if boundTauGrid[j]*tLo > aHi {
					add(boundTauGrid[j], math.Inf(1), 0) // no allowed age
					break
				}
				lvl := int32(0)
				if boundTauGrid[j+1]*tHi > aLo {
					cellBrightest(best, kns, i, j, nb)
					lvl = levelOf(threshold(sp, use, best, combineMax))
				}
				add(boundTauGrid[j], boundTauGrid[j+1], lvl)
			}
			for _, sg := range segs {
				lb.segT1 = append(lb.segT1, sg.t1)
				lb.segLevel = append(lb.segLevel, sg.level)
				if sg.level == 0 {
					continue
				}
				// Narrow segments after the main sequence: proposals from sub-cells.
				fss, mss := []int{-1}, []int{-1}
				if sg.t0 >= boundTauMS && sg.t1 <= boundTauSplit {
					fss, mss = subIndices[liveSubFeH], subIndices[liveSubMass]
					if fixed {
						fss = []int{-1}
					}
				}
				for _, fs := range fss {
					_, _, c0, c1 := lb.fehSpan(b, fs)
					for _, ms := range mss {
						lo, hi := lb.tRange(b, fs, i, ms)
						env := ageProb(cp, sg.t0*lo, sg.t1*hi)
						c := liveCell{level: sg.level, bin: int32(b), mass: int32(i), fs: int32(fs), ms: int32(ms),
							t0: sg.t0, t1: sg.t1, tLo: lo, tHi: hi, env: env}
						_, _, f0, f1 := lb.massSpan(i, ms)
						pf := c1 - c0
						if fixed {
							pf = 1
						}
						lb.prim.add(c, pf*(f1-f0)*env)
						if lb.bin != nil {
							lb.comp.add(c, pf*lb.compTab[i][ms+1].h*env)
						}
					}
				}
			}
			lb.segStart[b*nm+i+1] = int32(len(lb.segT1))
		}
	}
	lb.prim.finish(ns)
	lb.comp.finish(ns)
	// Lowest live mass per shell.
	lb.massLow = make([]float64, ns)
	for s := range lb.massLow {
		lb.massLow[s] = math.Inf(1)
		for _, l := range []*liveList{&lb.prim, &lb.comp} {
			for _, c := range l.cells[:l.nLive[s]] {
				lb.massLow[s] = math.Min(lb.massLow[s], boundMassGrid[c.mass])
			}
		}
	}
	return lb, nil
}

// massCell returns the mass interval i with grid[i] < m ≤ grid[i+1] (clamped).
func massCell(m float64) int {
	i := sort.SearchFloat64s(boundMassGrid, m) - 1
	return max(0, min(i, boundMasses-2))
}

// level returns the number of shells in which a star of initial mass m (Msun), rounded
// [Fe/H] fq and age ageYr in metallicity bin b lies in a live cell.
func (lb *liveBound) level(b int, m, fq, ageYr float64) int32 {
	nm := boundMasses - 1
	i := massCell(m)
	tau := ageYr / lb.tMS(b, i, m, fq)
	lo, hi := lb.segStart[b*nm+i], lb.segStart[b*nm+i+1]
	seg := lo + int32(sort.Search(int(hi-lo), func(k int) bool { return lb.segT1[lo+int32(k)] > tau }))
	if seg >= hi {
		seg = hi - 1
	}
	return lb.segLevel[seg]
}

// companionRange returns the primary masses that can have a companion in [x0, x1] and
// the breakpoints of f(m1) P(q m1 ∈ [x0, x1]) inside them (sorted, with the ends).
func (lb *liveBound) companionRange(cp *ComponentPlan, x0, x1 float64) []float64 {
	lo, hi := cp.IMF.Bounds()
	bm := lb.bin
	r0, r1 := math.Max(lo, x0), math.Min(hi, x1/bm.qMin)
	if r1 <= r0 {
		return nil
	}
	pts := []float64{r0, r1}
	cand := []float64{x0 / bm.qMax, x1 / bm.qMax, x0 / bm.qMin, x1 / bm.qMin}
	for _, r := range bm.byMass {
		cand = append(cand, r.AboveMassMsun)
	}
	for _, c := range cand {
		if c > r0 && c < r1 {
			pts = append(pts, c)
		}
	}
	sort.Float64s(pts)
	return pts
}

// companionProb returns H for the companion mass interval [x0, x1] (see liveBound),
// integrating between the breakpoints pts of companionRange.
func (lb *liveBound) companionProb(cp *ComponentPlan, x0, x1 float64, pts []float64) float64 {
	sum := 0.0
	for n := 0; n+1 < len(pts); n++ {
		p0, p1 := cp.IMF.CDF(pts[n]), cp.IMF.CDF(pts[n+1])
		if p1 <= p0 {
			continue
		}
		sum += quad.Fixed(func(p float64) float64 {
			m := cp.IMF.Quantile(p)
			return lb.bin.fractionAt(m) * lb.bin.ratioProb(x0/m, x1/m)
		}, p0, p1, 16, quad.Legendre{}, 0)
	}
	return sum
}

// companionTable prepares the companion class for the interval [x0, x1]: H and the
// rejection envelope (the largest binary fraction times the largest ratio probability,
// found at the breakpoints between which the latter is monotone, and just below them,
// where the binary fraction steps).
func (lb *liveBound) companionTable(cp *ComponentPlan, x0, x1 float64) companionTable {
	ct := companionTable{x0: x0, x1: x1, pts: lb.companionRange(cp, x0, x1)}
	if len(ct.pts) < 2 {
		return ct
	}
	var fMax, wMax float64
	for _, m := range ct.pts {
		for _, mm := range [2]float64{m, m * (1 - 1e-12)} {
			fMax = math.Max(fMax, lb.bin.fractionAt(mm))
			wMax = math.Max(wMax, lb.bin.ratioProb(x0/mm, x1/mm))
		}
	}
	ct.env = fMax * wMax * (1 + 1e-9)
	ct.p0, ct.p1 = cp.IMF.CDF(ct.pts[0]), cp.IMF.CDF(ct.pts[len(ct.pts)-1])
	ct.h = lb.companionProb(cp, x0, x1, ct.pts)
	return ct
}

// errRejection reports a rejection loop that did not end (it cannot happen for a cell of
// positive weight; the limit guards against a defect).
var errRejection = errors.New("synth: companion-class rejection sampling did not converge")

// drawPrimaryGivenCompanion draws (m1, m2) with m2 in the table's interval [x0, x1]: m1
// from the mass function on the primaries that can have such a companion, accepted with
// probability f(m1) P(q m1 ∈ [x0, x1]) / envelope, then q from the ratio law restricted
// to [x0/m1, x1/m1].
func (lb *liveBound) drawPrimaryGivenCompanion(cp *ComponentPlan, ct *companionTable, r *rand.Rand) (m1, m2 float64, err error) {
	if ct.env <= 0 {
		return 0, 0, errRejection
	}
	for it := 0; it < 1_000_000; it++ {
		m := cp.IMF.Quantile(ct.p0 + r.Float64()*(ct.p1-ct.p0))
		if r.Float64()*ct.env < lb.bin.fractionAt(m)*lb.bin.ratioProb(ct.x0/m, ct.x1/m) {
			q := lb.bin.ratioQuantile(ct.x0/m, ct.x1/m, r.Float64())
			return m, math.Min(q*m, m), nil
		}
	}
	return 0, 0, errRejection
}

// draw draws one proposal of shell s: class 1 (primary live) or class 2 (companion live,
// primary not). keep is false for a proposal thinned away, or a class-2 draw whose
// primary is live. Draws: the entry, [Fe/H], mass(es), acceptance and age from rm; the
// class-1 companion from rs.
func (lb *liveBound) draw(cp *ComponentPlan, s int, companion bool, rm, rs *rand.Rand) (m1, m2, ageYr, feh float64, keep bool, err error) {
	l := &lb.prim
	if companion {
		l = &lb.comp
	}
	if l.nLive[s] == 0 { // nothing can be proposed (a zero-weight class is never drawn)
		return 0, 0, 0, 0, false, nil
	}
	c := l.pick(s, rm.Float64())
	b, i := int(c.bin), int(c.mass)
	e0, e1, c0, c1 := lb.fehSpan(b, int(c.fs))
	feh = e0
	if e1 > e0 {
		feh = math.Max(e0, math.Min(e1, cp.FeH.Quantile(c0+rm.Float64()*(c1-c0))))
	}
	_, fq := quantiseFeH(feh)
	var mStar float64 // the member whose cell was chosen
	if !companion {
		_, _, f0, f1 := lb.massSpan(i, int(c.ms))
		m1 = cp.IMF.Quantile(f0 + rm.Float64()*(f1-f0))
		mStar = m1
	} else {
		if m1, m2, err = lb.drawPrimaryGivenCompanion(cp, &lb.compTab[i][c.ms+1], rm); err != nil {
			return 0, 0, 0, 0, false, err
		}
		mStar = m2
	}
	// Thinning from the entry's envelope to the star's own t_MS, then the age.
	t := lb.tMS(b, i, mStar, fq)
	a0, a1 := c.t0*t, c.t1*t
	g0, g1 := ageCDF(cp, a0), ageCDF(cp, a1)
	if rm.Float64()*c.env >= g1-g0 {
		return m1, m2, 0, feh, false, nil
	}
	ageYr = cp.Ages.Quantile(g0 + rm.Float64()*(g1-g0))
	ageYr = math.Max(a0, math.Min(a1, ageYr))
	if !companion {
		if cp.binaries != nil {
			m2 = cp.binaries.draw(m1, rs)
		}
		return m1, m2, ageYr, feh, true, nil
	}
	return m1, m2, ageYr, feh, int(lb.level(b, m1, fq, ageYr)) <= s, nil
}
