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
	edges []float64 // [Fe/H] bin edges (dex); one bin of zero width for a fixed value
	pBin  []float64
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
}

// liveCell is a live segment: bin, mass interval, τ interval, and envelope weight.
type liveCell struct {
	level  int32
	bin    int32
	mass   int32
	t0, t1 float64 // τ interval
	w      float64
}

// liveList holds segments sorted by decreasing level, their cumulative weights and, per
// shell, the number of live segments.
type liveList struct {
	cells []liveCell
	cum   []float64
	nLive []int
}

func (l *liveList) finish(nShells int) {
	sort.SliceStable(l.cells, func(a, b int) bool { return l.cells[a].level > l.cells[b].level })
	l.cum = make([]float64, len(l.cells)+1)
	for k, c := range l.cells {
		l.cum[k+1] = l.cum[k] + c.w
	}
	l.nLive = make([]int, nShells)
	for s := range l.nLive {
		l.nLive[s] = sort.Search(len(l.cells), func(k int) bool { return int(l.cells[k].level) <= s })
	}
}

// weight returns the summed envelope weight of the segments live in shell s.
func (l *liveList) weight(s int) float64 { return l.cum[l.nLive[s]] }

// pick chooses a live segment of shell s with probability ∝ weight (one uniform).
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

// tRange returns the smallest and largest corner t_MS (yr) of cell (b, i).
func (lb *liveBound) tRange(b, i int) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, kn := range lb.kns[b] {
		for _, ii := range [2]int{i, i + 1} {
			lo, hi = math.Min(lo, kn.lnTMS[ii]), math.Max(hi, kn.lnTMS[ii])
		}
	}
	return math.Exp(lo), math.Exp(hi)
}

// ageProb returns G(t1) − G(t0) for the component's age distribution (t0 ≥ 0; t1 may be
// +Inf).
func ageProb(cp *ComponentPlan, a0, a1 float64) float64 {
	g1 := 1.0
	if !math.IsInf(a1, 1) {
		g1 = cp.Ages.CDF(a1)
	}
	return math.Max(0, g1-cp.Ages.CDF(a0))
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
	for b := 0; b < nbin; b++ {
		lb.kns = append(lb.kns, [2]*keyNodes{nodes[keys[b]], nodes[keys[b+1]]})
		if lb.edges[0] == lb.edges[1] {
			lb.pBin = append(lb.pBin, 1)
		} else {
			lb.pBin = append(lb.pBin, math.Max(0, cp.FeH.CDF(lb.edges[b+1])-cp.FeH.CDF(lb.edges[b])))
		}
	}
	sp := p.Survey
	nb := len(sp.Bands)
	use, combineMax := ruleBands(sp)
	nm := boundMasses - 1
	ns := len(muInner)
	levelOf := func(thr float64) int32 {
		return int32(sort.Search(ns, func(s int) bool { return muInner[s] > thr }))
	}
	// Companion weights H per mass interval.
	var h []float64
	if lb.bin != nil {
		h = make([]float64, nm)
		for i := range h {
			h[i] = lb.companionProb(cp, boundMassGrid[i], boundMassGrid[i+1])
		}
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
			tLo, tHi := lb.tRange(b, i)
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
			pm := cp.IMF.NumberFraction(boundMassGrid[i], boundMassGrid[i+1])
			lowMass := pm == 0
			for _, sg := range segs {
				lb.segT1 = append(lb.segT1, sg.t1)
				lb.segLevel = append(lb.segLevel, sg.level)
				if sg.level == 0 {
					continue
				}
				env := ageProb(cp, sg.t0*tLo, sg.t1*tHi)
				c := liveCell{level: sg.level, bin: int32(b), mass: int32(i), t0: sg.t0, t1: sg.t1}
				if w := lb.pBin[b] * pm * env; w > 0 && !lowMass {
					c.w = w
					lb.prim.cells = append(lb.prim.cells, c)
				}
				if h != nil {
					if w := lb.pBin[b] * h[i] * env; w > 0 {
						c.w = w
						lb.comp.cells = append(lb.comp.cells, c)
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

// qLaw returns the mass-ratio law's exponent γ+1 and the probability that q lies in
// [a, b] (clipped to [q_min, q_max]).
func (lb *liveBound) qProb(a, b float64) float64 {
	bm := lb.bin
	a, b = math.Max(a, bm.qMin), math.Min(b, bm.qMax)
	if b <= a {
		return 0
	}
	g1 := bm.gamma + 1
	if math.Abs(g1) < 1e-12 {
		return math.Log(b/a) / math.Log(bm.qMax/bm.qMin)
	}
	return (math.Pow(b, g1) - math.Pow(a, g1)) / (math.Pow(bm.qMax, g1) - math.Pow(bm.qMin, g1))
}

// qDraw draws q from the mass-ratio law restricted to [a, b] ∩ [q_min, q_max].
func (lb *liveBound) qDraw(a, b, u float64) float64 {
	bm := lb.bin
	a, b = math.Max(a, bm.qMin), math.Min(b, bm.qMax)
	g1 := bm.gamma + 1
	if math.Abs(g1) < 1e-12 {
		return a * math.Pow(b/a, u)
	}
	lo, hi := math.Pow(a, g1), math.Pow(b, g1)
	return math.Pow(lo+u*(hi-lo), 1/g1)
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

// companionProb returns H for the companion mass interval [x0, x1] (see liveBound).
func (lb *liveBound) companionProb(cp *ComponentPlan, x0, x1 float64) float64 {
	pts := lb.companionRange(cp, x0, x1)
	sum := 0.0
	for n := 0; n+1 < len(pts); n++ {
		p0, p1 := cp.IMF.CDF(pts[n]), cp.IMF.CDF(pts[n+1])
		if p1 <= p0 {
			continue
		}
		sum += quad.Fixed(func(p float64) float64 {
			m := cp.IMF.Quantile(p)
			return lb.bin.fractionAt(m) * lb.qProb(x0/m, x1/m)
		}, p0, p1, 16, quad.Legendre{}, 0)
	}
	return sum
}

// errRejection reports a rejection loop that did not end (it cannot happen for a cell of
// positive weight; the limit guards against a defect).
var errRejection = errors.New("synth: companion-class rejection sampling did not converge")

// drawPrimaryGivenCompanion draws (m1, m2) with m2 in [x0, x1]: m1 from the mass function
// on the primaries that can have such a companion, accepted with probability
// f(m1) P(q m1 ∈ [x0, x1]) / envelope (the envelope takes the largest binary fraction and
// the largest ratio probability, found at the breakpoints between which it is monotone),
// then q from the ratio law restricted to [x0/m1, x1/m1].
func (lb *liveBound) drawPrimaryGivenCompanion(cp *ComponentPlan, x0, x1 float64, r *rand.Rand) (m1, m2 float64, err error) {
	pts := lb.companionRange(cp, x0, x1)
	if len(pts) < 2 {
		return 0, 0, errRejection
	}
	var fMax, wMax float64
	for _, m := range pts {
		fMax = math.Max(fMax, lb.bin.fractionAt(m))
		wMax = math.Max(wMax, lb.qProb(x0/m, x1/m))
		// Just below each point too: the binary fraction steps up at its breakpoints.
		mm := m * (1 - 1e-12)
		fMax = math.Max(fMax, lb.bin.fractionAt(mm))
		wMax = math.Max(wMax, lb.qProb(x0/mm, x1/mm))
	}
	env := fMax * wMax * (1 + 1e-9)
	p0, p1 := cp.IMF.CDF(pts[0]), cp.IMF.CDF(pts[len(pts)-1])
	for it := 0; it < 1_000_000; it++ {
		m := cp.IMF.Quantile(p0 + r.Float64()*(p1-p0))
		if r.Float64()*env < lb.bin.fractionAt(m)*lb.qProb(x0/m, x1/m) {
			q := lb.qDraw(x0/m, x1/m, r.Float64())
			return m, math.Min(q*m, m), nil
		}
	}
	return 0, 0, errRejection
}

// drawFeH draws a raw [Fe/H] (dex) inside bin b by inverting the distribution function.
func (lb *liveBound) drawFeH(cp *ComponentPlan, b int, u float64) float64 {
	e0, e1 := lb.edges[b], lb.edges[b+1]
	if e1 <= e0 {
		return e0
	}
	c0, c1 := cp.FeH.CDF(e0), cp.FeH.CDF(e1)
	return math.Max(e0, math.Min(e1, cp.FeH.Quantile(c0+u*(c1-c0))))
}

// draw draws one proposal of shell s: class 1 (primary live) or class 2 (companion live,
// primary not). keep is false for a proposal thinned away, or a class-2 draw whose
// primary is live. Draws: the segment, [Fe/H], mass(es), acceptance and age from rm; the
// class-1 companion from rs.
func (lb *liveBound) draw(cp *ComponentPlan, s int, companion bool, rm, rs *rand.Rand) (m1, m2, ageYr, feh float64, keep bool, err error) {
	l := &lb.prim
	if companion {
		l = &lb.comp
	}
	c := l.pick(s, rm.Float64())
	b, i := int(c.bin), int(c.mass)
	feh = lb.drawFeH(cp, b, rm.Float64())
	_, fq := quantiseFeH(feh)
	x0, x1 := boundMassGrid[i], boundMassGrid[i+1]
	var mStar float64 // the member whose cell was chosen
	if !companion {
		f0, f1 := cp.IMF.CDF(x0), cp.IMF.CDF(x1)
		m1 = cp.IMF.Quantile(f0 + rm.Float64()*(f1-f0))
		mStar = m1
	} else {
		if m1, m2, err = lb.drawPrimaryGivenCompanion(cp, x0, x1, rm); err != nil {
			return 0, 0, 0, 0, false, err
		}
		mStar = m2
	}
	// Thinning from the cell's envelope to the star's own t_MS, then the age.
	t := lb.tMS(b, i, mStar, fq)
	tLo, tHi := lb.tRange(b, i)
	env := ageProb(cp, c.t0*tLo, c.t1*tHi)
	a0, a1 := c.t0*t, c.t1*t
	g0 := cp.Ages.CDF(a0)
	g1 := 1.0
	if !math.IsInf(a1, 1) {
		g1 = cp.Ages.CDF(a1)
	}
	if rm.Float64()*env >= g1-g0 {
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
