package phot

import (
	"fmt"
	"math"
	"strings"

	"github.com/starmock/starmock/internal/consts"
	"gonum.org/v1/gonum/interp"
)

// accelBinDex is the bin width in log10 Teff of the lookup accelerator that
// maps log Teff to its grid interval; it must be below the smallest node
// spacing for the one-step search in BCs to suffice (checked at construction;
// otherwise the search walks further, still correct).
const accelBinDex = 0.0005

// Photometer turns (Teff, log g, [Fe/H], L) into absolute magnitudes in an
// ordered list of bands, using a bolometric-correction grid. It is built once
// (NewPhotometer precomputes the interpolation coefficients) and is then safe
// for concurrent use; AbsMags does not allocate.
//
// Interpolation: along Teff, a monotone piecewise cubic in log Teff through the
// nodes of each (log g, [Fe/H]) row (Fritsch & Butland 1984, as in gonum's
// interp.FritschButland: no overshoot between nodes, exact at nodes); linear in
// log g and in [Fe/H] between rows.
type Photometer struct {
	bands []Band
	nb    int
	ltg   []float64 // grid log Teff nodes
	logg  []float64
	feh   []float64
	// coef[(((f*nG+j)*(nT-1)+m)*nb+k)*4+c]: cubic coefficients in (log T − ltg[m])
	coef  []float64
	cellQ []Quality // [(f*nG+j)*(nT-1)+m]: worst quality of the two nodes of interval m
	accel []int32   // accel[int((lt-ltg[0])/accelBinDex)] = interval containing the bin start
	grid  *Grid
}

// NewPhotometer binds grid g to the named bands, in order (nil or empty: every
// band of the grid in grid order), and precomputes the lookup table. A band
// name not in the grid gives an error listing the grid's bands.
func NewPhotometer(g *Grid, bands []string) (*Photometer, error) {
	if g == nil {
		return nil, fmt.Errorf("phot: NewPhotometer: nil grid")
	}
	if len(bands) == 0 {
		for _, b := range g.bands {
			bands = append(bands, b.Name)
		}
	}
	var cols []int
	var names []string
	for _, b := range g.bands {
		names = append(names, b.Name)
	}
	seen := map[string]bool{}
	p := &Photometer{grid: g}
	for _, name := range bands {
		k := g.BandIndex(name)
		if k < 0 {
			return nil, fmt.Errorf("band %q is not in the bolometric-correction grid, want one of %s", name, strings.Join(names, ", "))
		}
		if seen[name] {
			return nil, fmt.Errorf("band %q requested twice", name)
		}
		seen[name] = true
		cols = append(cols, k)
		band := Band{Name: name, System: g.bands[k].System, PivotAA: math.NaN(), Source: g.bands[k].Description}
		if bb, err := LookupBand(name); err == nil && bb.System == band.System {
			band.PivotAA, band.Curve = bb.PivotAA, bb.Curve
			if band.Source == "" {
				band.Source = bb.Source
			}
		}
		p.bands = append(p.bands, band)
	}
	p.nb = len(cols)
	nG, nF, nTg := len(g.loggCgs), len(g.feh), len(g.teffK)
	p.logg = append([]float64(nil), g.loggCgs...)
	p.feh = append([]float64(nil), g.feh...)
	p.ltg = make([]float64, nTg)
	for i, t := range g.teffK {
		p.ltg[i] = math.Log10(t)
	}
	ni := nTg - 1
	p.coef = make([]float64, nF*nG*ni*p.nb*4)
	p.cellQ = make([]Quality, nF*nG*ni)
	var mask uint64
	for _, k := range cols {
		mask |= 1 << uint(k)
	}
	ys := make([]float64, nTg)
	ds := make([]float64, nTg)
	var fb interp.FritschButland
	for f := 0; f < nF; f++ {
		for j := 0; j < nG; j++ {
			row := f*nG + j
			for kk, k := range cols {
				for it := 0; it < nTg; it++ {
					ys[it] = g.bc[g.nodeIndex(it, j, f)*len(g.bands)+k]
				}
				fb.Fit(p.ltg, ys)
				for it := 0; it < nTg; it++ {
					ds[it] = fb.PredictDerivative(p.ltg[it])
				}
				// the derivative at the last node from the left interval
				ds[nTg-1] = fb.PredictDerivative(p.ltg[nTg-1])
				for m := 0; m < ni; m++ {
					// cubic Hermite coefficients on [x_m, x_m+1] (value and slope at both ends)
					h := p.ltg[m+1] - p.ltg[m]
					s := (ys[m+1] - ys[m]) / h
					d0, d1 := ds[m], ds[m+1]
					c := p.coef[((row*ni+m)*p.nb+kk)*4:]
					c[0] = ys[m]
					c[1] = d0
					c[2] = (3*s - 2*d0 - d1) / h
					c[3] = (d0 + d1 - 2*s) / (h * h)
				}
			}
			for m := 0; m < ni; m++ {
				q := QualityEmpirical
				for _, it := range [2]int{m, m + 1} {
					n := g.nodeIndex(it, j, f)
					nq := g.quality[n]
					if g.bbMask[n]&mask != 0 {
						nq = QualityBlackbody
					}
					q = max(q, nq)
				}
				p.cellQ[row*ni+m] = q
			}
		}
	}
	nBins := int((p.ltg[nTg-1]-p.ltg[0])/accelBinDex) + 1
	p.accel = make([]int32, nBins)
	m := 0
	for bin := range p.accel {
		x := p.ltg[0] + float64(bin)*accelBinDex
		for m < ni-1 && p.ltg[m+1] <= x {
			m++
		}
		p.accel[bin] = int32(m)
	}
	return p, nil
}

// NewDefaultPhotometer returns a Photometer for DefaultGrid and the sixteen
// DefaultBandNames bands, in that order.
func NewDefaultPhotometer() (*Photometer, error) {
	g, err := DefaultGrid()
	if err != nil {
		return nil, err
	}
	return NewPhotometer(g, DefaultBandNames)
}

// Bands returns the photometer's bands in output order. Bands that are also
// built in carry their curve and pivot wavelength; other grid bands have a nil
// Curve and a NaN PivotAA.
func (p *Photometer) Bands() []Band { return append([]Band(nil), p.bands...) }

// Grid returns the grid the photometer was built from.
func (p *Photometer) Grid() *Grid { return p.grid }

// Domain returns the ranges the photometer accepts: Teff in K, log g in cgs and
// [Fe/H] in dex. An axis with a single node is not a dimension of the grid:
// every value is accepted and gives that node's BCs (the built-in grid has one
// [Fe/H] = 0 slice, so it ignores [Fe/H]).
func (p *Photometer) Domain() (teffLoK, teffHiK, loggLo, loggHi, fehLo, fehHi float64) {
	return p.grid.teffK[0], p.grid.teffK[len(p.grid.teffK)-1],
		p.logg[0], p.logg[len(p.logg)-1], p.feh[0], p.feh[len(p.feh)-1]
}

// bracket finds j and the weight of node j+1 for x on axis ax (len ≥ 2);
// ok is false outside [ax[0], ax[n−1]] or for NaN.
func bracket(ax []float64, x float64) (int, float64, bool) {
	n := len(ax)
	if !(x >= ax[0] && x <= ax[n-1]) {
		return 0, 0, false
	}
	j := 0
	for j < n-2 && ax[j+1] < x {
		j++
	}
	return j, (x - ax[j]) / (ax[j+1] - ax[j]), true
}

// BCs writes the bolometric corrections BC_X = M_bol − M_X (mag) of the
// photometer's bands at (teffK, loggCgs, feh) into dst and returns their
// quality. Interpolation: monotone cubic in log Teff, linear in log g and in
// [Fe/H] (see Photometer). Outside the grid's
// domain (see Domain) or for NaN input, dst is filled with NaN and
// QualityOutsideGrid is returned: no extrapolation. It panics if
// len(dst) < len(p.Bands()) (a caller bug). It does not allocate.
func (p *Photometer) BCs(teffK, loggCgs, feh float64, dst []float64) Quality {
	nb := p.nb
	if len(dst) < nb {
		panic(fmt.Sprintf("phot: Photometer.BCs: len(dst) = %d, want >= %d", len(dst), nb))
	}
	dst = dst[:nb]
	lt := math.Log10(teffK)
	ltg := p.ltg
	ni := len(ltg) - 1
	if !(lt >= ltg[0] && lt <= ltg[ni]) {
		return fillNaN(dst, QualityOutsideGrid)
	}
	bin := int((lt - ltg[0]) / accelBinDex)
	if bin >= len(p.accel) {
		bin = len(p.accel) - 1
	}
	m := int(p.accel[bin])
	for m < ni-1 && ltg[m+1] < lt {
		m++
	}
	dx := lt - ltg[m]
	nG := len(p.logg)
	j, fy := 0, 0.0
	if nG > 1 {
		var ok bool
		if j, fy, ok = bracket(p.logg, loggCgs); !ok {
			return fillNaN(dst, QualityOutsideGrid)
		}
	} else if math.IsNaN(loggCgs) {
		return fillNaN(dst, QualityOutsideGrid)
	}
	f, ff := 0, 0.0
	if len(p.feh) > 1 {
		var ok bool
		if f, ff, ok = bracket(p.feh, feh); !ok {
			return fillNaN(dst, QualityOutsideGrid)
		}
	} else if math.IsNaN(feh) {
		return fillNaN(dst, QualityOutsideGrid)
	}
	jn := j + 1
	if nG == 1 {
		jn = j
	}
	q := QualityEmpirical
	p.slice(f, j, jn, m, dx, fy, 1-ff, dst, false)
	q = max(q, p.cellQ[(f*nG+j)*ni+m])
	if fy > 0 {
		q = max(q, p.cellQ[(f*nG+jn)*ni+m])
	}
	if ff > 0 { // second [Fe/H] slice
		f1 := f + 1
		p.slice(f1, j, jn, m, dx, fy, ff, dst, true)
		q = max(q, p.cellQ[(f1*nG+j)*ni+m])
		if fy > 0 {
			q = max(q, p.cellQ[(f1*nG+jn)*ni+m])
		}
	}
	return q
}

// AbsMags writes the absolute magnitudes M_X (mag) of the photometer's bands
// for a star of effective temperature teffK (K), surface gravity loggCgs
// (log10 cm s^-2), metallicity feh ([Fe/H], dex) and luminosity lumLsun
// (nominal solar luminosities) into dst and returns their quality:
//
//	M_X = M_bol − BC_X(Teff, log g, [Fe/H]),  M_bol = −2.5 log10(L / 3.0128e28 W)
//
// (IAU 2015 Resolution B2: M_bol = 4.74 for the nominal Sun; consts.MBol), with
// BC_X from BCs. A NaN, zero or negative luminosity or temperature (neutron
// stars, black holes, no remnant) gives NaN magnitudes and QualityNone; a star
// outside the grid gives NaN and QualityOutsideGrid. It panics if
// len(dst) < len(p.Bands()). It does not allocate.
func (p *Photometer) AbsMags(teffK, loggCgs, feh, lumLsun float64, dst []float64) Quality {
	if len(dst) < p.nb {
		panic(fmt.Sprintf("phot: Photometer.AbsMags: len(dst) = %d, want >= %d", len(dst), p.nb))
	}
	if !(lumLsun > 0) || !(teffK > 0) || math.IsInf(lumLsun, 0) {
		return fillNaN(dst[:p.nb], QualityNone)
	}
	q := p.BCs(teffK, loggCgs, feh, dst)
	if !q.HasMagnitudes() {
		return q
	}
	mbol := -2.5 * math.Log10(lumLsun*lSunOverL0) // IAU 2015 B2, as consts.MBol
	for k := range dst[:p.nb] {
		dst[k] = mbol - dst[k]
	}
	return q
}

// slice evaluates the cubics of rows (f, j) and (f, jn) in interval m at
// offset dx, blends them linearly with weight fy on jn, and writes (or, with
// add, adds) wf times the result into dst.
func (p *Photometer) slice(f, j, jn, m int, dx, fy, wf float64, dst []float64, add bool) {
	nb := p.nb
	ni := len(p.ltg) - 1
	nG := len(p.logg)
	c0 := p.coef[((f*nG+j)*ni+m)*nb*4:][:nb*4]
	c1 := p.coef[((f*nG+jn)*ni+m)*nb*4:][:nb*4]
	w0, w1 := wf*(1-fy), wf*fy
	for k := range dst[:nb] {
		a := c0[4*k : 4*k+4 : 4*k+4]
		b := c1[4*k : 4*k+4 : 4*k+4]
		v0 := ((a[3]*dx+a[2])*dx+a[1])*dx + a[0]
		v1 := ((b[3]*dx+b[2])*dx+b[1])*dx + b[0]
		v := w0*v0 + w1*v1
		if add {
			dst[k] += v
		} else {
			dst[k] = v
		}
	}
}

// lSunOverL0 is L_sun/L0 of IAU 2015 Resolutions B3 and B2.
const lSunOverL0 = consts.LSunW / consts.L0BolW

func fillNaN(dst []float64, q Quality) Quality {
	nan := math.NaN()
	for k := range dst {
		dst[k] = nan
	}
	return q
}
