package galaxy

import (
	"fmt"
	"math"
	"math/rand/v2"
)

// ShellSampler draws positions distributed as ρ(x) d² dd dΩ inside one shell of an area for
// one component: the density-weighted distribution that ShellMasses integrates, so the
// positions follow the density gradient inside the shell, not only the volume.
//
// Method: stratified rejection on cells × radial bins. The cells are nested HEALPix pixels
// (Galactic) that may intersect the area, found by recursive subdivision from the 12 base
// pixels with a conservative intersection test (a pixel's bounding cap against the area), so
// no part of the area is left out; a cell is split while it is larger than 1/32 of the
// area's solid angle or while the density varies across it by more than a factor 4, up to
// 2048 cells. The shell is cut into 32 radial bins, of equal width, or of equal width in
// log d when the shell spans more than a factor 4 in distance. For each cell and bin
// the envelope ρ_kj is the largest density on a 4 × 4 grid of sub-pixel centres × 5
// distances (plus each sight line's mid-plane crossing), times the largest ratio between
// neighbouring grid points in angle and in distance, times a margin of 1.25 (a grid bound
// with a safety factor, our construction: it is not a proof for arbitrary densities, hence
// the check below; a cell × bin shares its edge distances with the next bin, and a cell
// whose variation splits it is abandoned as soon as that is known). A trial picks
// (k, j) with probability ∝ ρ_kj Ω_k V_j, a direction uniform in pixel k
// (HEALPix.SampleInPixel), rejected if outside the area, a distance ∝ d² in bin j, and
// accepts with probability ρ/ρ_kj. The proposal is constant on each disjoint cell × bin,
// so accepted positions have density ∝ ρ exactly as long as the envelope holds; if a trial
// ever finds ρ > ρ_kj, Sample returns ErrEnvelopeExceeded rather than a biased draw.
//
// Areas of this package (Cone, Rect, PixelList) provide the intersection test; for another
// Area implementation every pixel is a candidate, which is correct but slow for small areas.
//
// A ShellSampler is immutable once built: several goroutines may call Sample at the same
// time, each with its own *rand.Rand.
type ShellSampler struct {
	model *Model
	area  Area
	shell Shell
	comp  Component
	hp    [30]*HEALPix // nested pixelization per level (nside 2^level)
	cells []samplerCell
	edges [samplerBins + 1]float64
	env   []float64 // envelope per (cell, bin), index k*samplerBins + j
	cum   []float64 // cumulative proposal weight, normalised to 1
}

type samplerCell struct {
	level uint8
	pix   int64
}

const (
	samplerBins      = 32
	samplerBinPoints = 5
	samplerMaxCells  = 2048
	samplerSplitVar  = 4.0
)

// capArea is implemented by areas that can say whether they may intersect a spherical cap
// (centre unit vector, angular radius): false must mean "certainly not".
type capArea interface {
	mayIntersectCap(ux, uy, uz, radiusRad float64) bool
}

func (c *Cone) mayIntersectCap(ux, uy, uz, radiusRad float64) bool {
	dot := ux*c.cx + uy*c.cy + uz*c.cz
	sep := math.Acos(math.Max(-1, math.Min(1, dot)))
	return sep <= c.RadiusDeg*degToRad+radiusRad+1e-12
}

func (q *Rect) mayIntersectCap(ux, uy, uz, radiusRad float64) bool {
	lon, lat := sphericalDeg(ux, uy, uz) // Galactic
	lon, lat = fromGal(q.System, lon, lat)
	rd := radiusRad*radToDeg + 1e-9
	if lat+rd < q.LatMinDeg || lat-rd > q.LatMaxDeg {
		return false
	}
	if lat+rd >= 90 || lat-rd <= -90 || q.widthDeg == 360 {
		return true // the cap reaches a pole: every longitude
	}
	dlon := math.Asin(math.Min(1, math.Sin(radiusRad)/math.Cos(lat*degToRad)))*radToDeg + 1e-9
	// circular interval overlap of [lon − dlon, lon + dlon] with [LonMin, LonMin + width]
	off := math.Mod(lon-dlon-q.LonMinDeg, 360)
	if off < 0 {
		off += 360
	}
	return off <= q.widthDeg || off+2*dlon >= 360
}

func (a *PixelList) mayIntersectCap(ux, uy, uz, radiusRad float64) bool {
	if len(a.centres) == len(a.Pixels) {
		for i, c := range a.centres {
			sep := math.Acos(math.Max(-1, math.Min(1, c[0]*ux+c[1]*uy+c[2]*uz)))
			if sep <= radiusRad+a.radii[i]+1e-12 {
				return true
			}
		}
		return false
	}
	for _, p := range a.Pixels { // a PixelList built without NewPixelList
		th, ph := a.HP.Pix2Ang(p)
		l, b := toGal(a.System, ph*radToDeg, 90-th*radToDeg)
		x, y, z := unitVector(l, b)
		sep := math.Acos(math.Max(-1, math.Min(1, x*ux+y*uy+z*uz)))
		if sep <= radiusRad+a.HP.pixelRadiusRad(p)+1e-12 {
			return true
		}
	}
	return false
}

// pixelRadiusRad bounds the angular distance from a pixel's centre to any of its points:
// the largest distance to the corners of its (z, φ) bounding box (on a latitude–longitude
// box the distance from an interior point is largest at a corner), plus 1e-9 rad.
func (h *HEALPix) pixelRadiusRad(pix int64) float64 {
	th, ph := h.Pix2Ang(pix)
	cx, cy, cz := unitVector(ph*radToDeg, 90-th*radToDeg)
	zLo, zHi, phiC, dphi := h.pixelBox(pix)
	var worst float64
	for _, z := range []float64{zLo, zHi} {
		for _, p := range []float64{phiC - dphi, phiC + dphi} {
			s := math.Sqrt(math.Max(0, 1-z*z))
			x, y := s*math.Cos(p), s*math.Sin(p)
			worst = math.Max(worst, math.Acos(math.Max(-1, math.Min(1, x*cx+y*cy+z*cz))))
		}
	}
	return worst + 1e-9
}

// NewShellSampler builds the sampler for component name (error for an unknown name or an
// invalid shell, or when the density is zero or not finite everywhere on the grid).
func (m *Model) NewShellSampler(area Area, s Shell, name string) (*ShellSampler, error) {
	c, err := m.Component(name)
	if err != nil {
		return nil, err
	}
	if !(s.InnerPc >= 0 && s.InnerPc < s.OuterPc && s.OuterPc <= MaxDistancePc) {
		return nil, fmt.Errorf("galaxy: shell [%g, %g) pc is not 0 <= inner < outer <= 1e6 pc: %w", s.InnerPc, s.OuterPc, ErrOutOfRange)
	}
	ss := &ShellSampler{model: m, area: area, shell: s, comp: c}
	logBins := s.InnerPc > 0 && s.OuterPc > 4*s.InnerPc
	for j := range ss.edges {
		f := float64(j) / samplerBins
		if logBins {
			ss.edges[j] = s.InnerPc * math.Pow(s.OuterPc/s.InnerPc, f)
		} else {
			ss.edges[j] = s.InnerPc + (s.OuterPc-s.InnerPc)*f
		}
	}
	ss.edges[samplerBins] = s.OuterPc
	ca, hasCap := area.(capArea)
	omega := area.SolidAngleSr()
	type pending struct {
		cell samplerCell
		env  [samplerBins]float64
	}
	var queue, done []pending
	for p := int64(0); p < 12; p++ {
		cl := samplerCell{0, p}
		if !hasCap || ss.intersects(ca, cl) {
			queue = append(queue, pending{cell: cl})
		}
	}
	for len(queue) > 0 {
		q := queue[0]
		queue = queue[1:]
		canSplit := q.cell.level+2 < 29 && len(done)+len(queue)+4 <= samplerMaxCells
		split := canSplit && ss.level(q.cell.level).PixelAreaSr() > omega/32 // too large: split unseen
		// evaluate: the envelope is kept unless the angular variation splits the cell
		if !split {
			q.env, _, split = ss.cellEnvelope(q.cell, canSplit)
		}
		if split {
			for ch := q.cell.pix * 4; ch < q.cell.pix*4+4; ch++ {
				cl := samplerCell{q.cell.level + 1, ch}
				if !hasCap || ss.intersects(ca, cl) {
					queue = append(queue, pending{cell: cl})
				}
			}
			continue
		}
		done = append(done, q)
	}
	var total float64
	for _, d := range done {
		for j := 0; j < samplerBins; j++ {
			if math.IsInf(d.env[j], 0) || math.IsNaN(d.env[j]) {
				return nil, fmt.Errorf("galaxy: %s density in shell [%g, %g) pc of %v is not finite on the sampling grid", name, s.InnerPc, s.OuterPc, area)
			}
		}
	}
	ss.cells = make([]samplerCell, len(done))
	ss.env = make([]float64, len(done)*samplerBins)
	ss.cum = make([]float64, len(done)*samplerBins)
	for k, d := range done {
		ss.cells[k] = d.cell
		om := ss.level(d.cell.level).PixelAreaSr()
		for j := 0; j < samplerBins; j++ {
			lo, hi := ss.edges[j], ss.edges[j+1]
			ss.env[k*samplerBins+j] = d.env[j]
			total += d.env[j] * om * (hi*hi*hi - lo*lo*lo)
			ss.cum[k*samplerBins+j] = total
		}
	}
	if !(total > 0) {
		return nil, fmt.Errorf("galaxy: %s density in shell [%g, %g) pc of %v is zero on the sampling grid: cannot sample", name, s.InnerPc, s.OuterPc, area)
	}
	for i := range ss.cum {
		ss.cum[i] /= total
	}
	ss.cum[len(ss.cum)-1] = 1
	return ss, nil
}

func (ss *ShellSampler) level(l uint8) *HEALPix {
	if ss.hp[l] == nil {
		ss.hp[l], _ = NewHEALPix(int64(1)<<l, Nested)
	}
	return ss.hp[l]
}

func (ss *ShellSampler) intersects(ca capArea, cl samplerCell) bool {
	h := ss.level(cl.level)
	th, ph := h.Pix2Ang(cl.pix)
	x, y, z := unitVector(ph*radToDeg, 90-th*radToDeg)
	return ca.mayIntersectCap(x, y, z, h.pixelRadiusRad(cl.pix))
}

// samplerNeighbours lists the pairs of angular neighbours on the 4 × 4 face grid of a
// cell's 16 children at two levels down (nested numbering: child ch has face coordinates
// ix = even bits, iy = odd bits of ch; Górski et al. 2005, sec. 4): 12 pairs along ix and
// 12 along iy.
var samplerNeighbours = func() (nb [24][2]uint8) {
	n := 0
	for ch := 0; ch < 16; ch++ {
		ix, iy := compact(uint64(ch)), compact(uint64(ch)>>1)
		if ix < 3 {
			nb[n] = [2]uint8{uint8(ch), uint8(interleave(int64(ix+1), int64(iy)))}
			n++
		}
		if iy < 3 {
			nb[n] = [2]uint8{uint8(ch), uint8(interleave(int64(ix), int64(iy+1)))}
			n++
		}
	}
	return nb
}()

// cellEnvelope evaluates one cell: its envelope per radial bin (Msun pc⁻³) and the
// splitting criterion varRatio, the largest max/min density ratio across the cell's 16
// directions at one grid distance (angular variation only, since splitting a cell cannot
// reduce the radial one). With canSplit it stops as soon as varRatio exceeds
// samplerSplitVar and returns split = true and no envelope: varRatio is a running maximum
// over the grid distances, so this is the decision the complete evaluation gives.
//
// Grid and bound (see ShellSampler): in bin j = [lo, hi) the density is evaluated at the 16
// sub-pixel centres (two levels down) × the 5 distances lo + (hi − lo) p/4, p = 0…4, plus,
// for each direction whose mid-plane crossing lies inside the bin, at that crossing; the
// envelope is (largest value) × (largest ratio between radial neighbours p−1, p of one
// direction) × (largest ratio between angular neighbours at one grid distance) × 1.25.
// Neighbouring bins share their common edge (the p = 4 point of bin j is the p = 0 point
// of bin j + 1, distance edges[j+1] exactly), so a direction costs 129 evaluations, not
// 32 × 6. The edges are evaluated first (pass A, where a split is usually detected), then
// the interior points and the crossings (pass B). The values, and so the envelope, are
// those of the one-pass grid evaluation, only fewer. A NaN value makes its bin's
// envelope NaN (the caller rejects it) and is left out of the spread at its distance, as
// math.Max and math.Min would.
func (ss *ShellSampler) cellEnvelope(cl samplerCell, canSplit bool) (env [samplerBins]float64, varRatio float64, split bool) {
	m, c := ss.model, ss.comp
	h := ss.level(cl.level + 2)
	var dirs [16][3]float64
	var cross [16]float64
	for ch := 0; ch < 16; ch++ {
		th, ph := h.Pix2Ang(cl.pix*16 + int64(ch))
		x, y, z := unitVector(ph*radToDeg, 90-th*radToDeg)
		dirs[ch] = [3]float64{x, y, z}
		cross[ch] = m.Frame.planeCrossingPc(x, y, z)
	}

	eval := func(ch int, dist float64) float64 {

		x, y, z := m.Frame.dirToGalactocentric(dirs[ch][0], dirs[ch][1], dirs[ch][2], dist)
		return c.DensityMsunPc3(x, y, z)
	}
	varRatio = 1
	// row folds one grid distance (16 values) into the splitting ratio; it returns the
	// largest value, the largest angular-neighbour ratio and whether a value is NaN
	row := func(v *[16]float64) (amax, ang float64, hasNaN bool) {
		amin := math.Inf(1)
		ang = 1
		for _, x := range v {
			if x != x {
				hasNaN = true
				continue
			}
			if x > amax {
				amax = x
			}
			if x < amin {
				amin = x
			}
		}
		for _, nb := range samplerNeighbours {
			if r := ratio(v[nb[0]], v[nb[1]]); r > ang {
				ang = r
			}
		}
		if hasNaN {
			return amax, ang, true
		}
		if amin > 0 {
			if r := amax / amin; r > varRatio {
				varRatio = r
			}
		} else if amax > 0 {
			varRatio = math.Inf(1)
		}
		return amax, ang, false
	}
	// pass A: the bin edges
	var edge [samplerBins + 1][16]float64
	var edgeMax, edgeAng [samplerBins + 1]float64
	var edgeNaN [samplerBins + 1]bool
	for e := 0; e <= samplerBins; e++ {
		for ch := range edge[e] {
			edge[e][ch] = eval(ch, ss.edges[e])
		}
		edgeMax[e], edgeAng[e], edgeNaN[e] = row(&edge[e])
		if canSplit && varRatio > samplerSplitVar {
			return env, varRatio, true
		}
	}
	// pass B: interior points and mid-plane crossings, bin by bin
	const np = samplerBinPoints // grid distances per bin, edges included
	var vals [np + 1][16]float64
	for j := 0; j < samplerBins; j++ {
		lo, hi := ss.edges[j], ss.edges[j+1]
		vals[0], vals[np-1] = edge[j], edge[j+1]
		vmax := math.Max(edgeMax[j], edgeMax[j+1])
		ang := math.Max(edgeAng[j], edgeAng[j+1])
		nan := edgeNaN[j] || edgeNaN[j+1]
		for p := 1; p < np-1; p++ {
			dist := lo + (hi-lo)*float64(p)/(np-1)
			for ch := range vals[p] {
				vals[p][ch] = eval(ch, dist)
			}
			amax, a, hasNaN := row(&vals[p])
			vmax, ang, nan = math.Max(vmax, amax), math.Max(ang, a), nan || hasNaN
		}
		if canSplit && varRatio > samplerSplitVar {
			return env, varRatio, true
		}
		rad := 1.0
		for p := 1; p < np; p++ {
			for ch := 0; ch < 16; ch++ {
				if r := ratio(vals[p][ch], vals[p-1][ch]); r > rad {
					rad = r
				}
			}
		}
		// mid-plane crossings inside the bin (elsewhere the point would repeat the edge hi)
		anyCross := false
		for ch := 0; ch < 16; ch++ {
			vals[np][ch] = vals[np-1][ch]
			if cross[ch] > lo && cross[ch] < hi {
				v := eval(ch, cross[ch])
				vals[np][ch] = v
				anyCross = true
				if v != v {
					nan = true
				} else if v > vmax {
					vmax = v
				}
			}
		}
		if anyCross {
			for _, nb := range samplerNeighbours {
				if r := ratio(vals[np][nb[0]], vals[np][nb[1]]); r > ang {
					ang = r
				}
			}
		}
		env[j] = vmax * rad * ang * 1.25
		if nan {
			env[j] = math.NaN()
		}
	}
	return env, varRatio, false
}

// ratio returns max(a/b, b/a) for positive a, b and 1 otherwise.
func ratio(a, b float64) float64 {
	if a > 0 && b > 0 {
		if a > b {
			return a / b
		}
		return b / a
	}
	return 1
}

// Cells returns the number of angular cells of the sampler (diagnostic).
func (ss *ShellSampler) Cells() int { return len(ss.cells) }

// Sample draws one position: Galactic lDeg, bDeg (degrees) and distancePc. See SampleTrials
// for the draws used. Errors as SampleTrials. No allocation.
func (ss *ShellSampler) Sample(r *rand.Rand) (lDeg, bDeg, distancePc float64, err error) {
	lDeg, bDeg, distancePc, _, err = ss.SampleTrials(r)
	return lDeg, bDeg, distancePc, err
}

// SampleTrials is Sample that also reports the number of trials used (1/acceptance on
// average). Each trial uses one r.Float64 for the cell and bin, the draws of
// HEALPix.SampleInPixel, one for the distance and, when the direction is inside the area,
// one for the acceptance. Error ErrEnvelopeExceeded (see ShellSampler); it gives up with an
// error after 10⁷ trials. No allocation.
func (ss *ShellSampler) SampleTrials(r *rand.Rand) (lDeg, bDeg, distancePc float64, trials int, err error) {
	for t := 1; t <= 10000000; t++ {
		u := r.Float64()
		lo, hi := 0, len(ss.cum)-1
		for lo < hi { // first index with cum > u
			mid := (lo + hi) / 2
			if ss.cum[mid] > u {
				hi = mid
			} else {
				lo = mid + 1
			}
		}
		k, j := lo/samplerBins, lo%samplerBins
		cl := ss.cells[k]
		th, ph := ss.hp[cl.level].SampleInPixel(cl.pix, r)
		l, b := ph*radToDeg, 90-th*radToDeg
		d := SampleDistanceUniformVolume(Shell{ss.edges[j], ss.edges[j+1]}, r)
		if !ss.area.Contains(l, b) {
			continue
		}
		env := ss.env[lo]
		rho := ss.model.ComponentDensityAt(ss.comp, l, b, d)
		if rho > env {
			return 0, 0, 0, t, fmt.Errorf("galaxy: %s density %g Msun/pc^3 at (l, b, d) = (%g, %g, %g) exceeds envelope %g: %w",
				ss.comp.Name(), rho, l, b, d, env, ErrEnvelopeExceeded)
		}
		if r.Float64()*env < rho {
			return l, b, d, t, nil
		}
	}
	return 0, 0, 0, 10000000, fmt.Errorf("galaxy: %s shell sampler accepted nothing in 1e7 trials", ss.comp.Name())
}
