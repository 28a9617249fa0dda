package phot

import (
	"fmt"
	"math"
	"strings"

	"github.com/starmock/starmock/internal/consts"
	"gonum.org/v1/gonum/interp"
)

// TableStepLogTeffDex is the log10 Teff step of the regular table a
// Photometer precomputes from its grid. Along Teff the grid is interpolated
// with a monotone piecewise cubic (Fritsch & Butland 1984) in log Teff; the
// table samples that curve every 0.002 dex (0.46 % in Teff) and is read with
// linear interpolation, which reproduces the cubic to about 1e-4 mag (half the
// step squared times the curvature; checked in the tests against the cubic
// itself).
const TableStepLogTeffDex = 0.002

// Photometer turns (Teff, log g, [Fe/H], L) into absolute magnitudes in an
// ordered list of bands, using a bolometric-correction grid. It is built once
// (NewPhotometer precomputes a table) and is then safe for concurrent use;
// AbsMags does not allocate.
type Photometer struct {
	bands []Band
	nb    int
	// table axes
	lt0, dlt float64 // first log Teff and step
	nT       int     // number of log Teff samples
	logg     []float64
	feh      []float64
	tab      []float64 // [((f*nG+j)*nT+i)*nb+k], BC in mag
	cellQ    []Quality // [(f*nG+j)*(nT-1)+i]: worst node quality of the cell's grid interval
	grid     *Grid
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
	ltg := make([]float64, nTg)
	for i, t := range g.teffK {
		ltg[i] = math.Log10(t)
	}
	p.lt0 = ltg[0]
	span := ltg[nTg-1] - ltg[0]
	p.nT = int(math.Ceil(span/TableStepLogTeffDex)) + 1
	p.dlt = span / float64(p.nT-1)
	p.tab = make([]float64, nF*nG*p.nT*p.nb)
	p.cellQ = make([]Quality, nF*nG*(p.nT-1))
	var mask uint64
	for _, k := range cols {
		mask |= 1 << uint(k)
	}
	ys := make([]float64, nTg)
	var fb interp.FritschButland
	for f := 0; f < nF; f++ {
		for j := 0; j < nG; j++ {
			base := (f*nG + j) * p.nT
			for kk, k := range cols {
				for it := 0; it < nTg; it++ {
					ys[it] = g.bc[g.nodeIndex(it, j, f)*len(g.bands)+k]
				}
				fb.Fit(ltg, ys)
				for i := 0; i < p.nT; i++ {
					lt := p.lt0 + float64(i)*p.dlt
					if i == p.nT-1 {
						lt = ltg[nTg-1]
					}
					p.tab[(base+i)*p.nb+kk] = fb.Predict(lt)
				}
			}
			// cell qualities: worst over the two grid nodes bracketing the cell
			m := 0
			for i := 0; i < p.nT-1; i++ {
				mid := p.lt0 + (float64(i)+0.5)*p.dlt
				for m < nTg-2 && ltg[m+1] <= mid {
					m++
				}
				q := QualityEmpirical
				for _, it := range [2]int{m, m + 1} {
					n := g.nodeIndex(it, j, f)
					nq := g.quality[n]
					if g.bbMask[n]&mask != 0 {
						nq = QualityBlackbody
					}
					q = max(q, nq)
				}
				p.cellQ[(f*nG+j)*(p.nT-1)+i] = q
			}
		}
	}
	return p, nil
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
	return math.Pow(10, p.lt0), math.Pow(10, p.lt0+float64(p.nT-1)*p.dlt),
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
// quality. Interpolation: monotone cubic in log Teff (tabulated, see
// TableStepLogTeffDex), linear in log g and in [Fe/H]. Outside the grid's
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
	x := (lt - p.lt0) / p.dlt
	if !(x >= 0 && x <= float64(p.nT-1)) {
		return fillNaN(dst, QualityOutsideGrid)
	}
	i := int(x)
	if i >= p.nT-1 {
		i = p.nT - 2
	}
	fx := x - float64(i)
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
	w00 := (1 - fx) * (1 - fy)
	w10 := fx * (1 - fy)
	w01 := (1 - fx) * fy
	w11 := fx * fy
	q := QualityEmpirical
	nc := p.nT - 1
	tab := p.tab
	// first [Fe/H] slice (the only one for a single-slice grid)
	wf := 1 - ff
	r0 := ((f*nG+j)*p.nT + i) * nb
	r1 := ((f*nG+jn)*p.nT + i) * nb
	a00, a10 := tab[r0:r0+nb], tab[r0+nb:r0+2*nb]
	a01, a11 := tab[r1:r1+nb], tab[r1+nb:r1+2*nb]
	for k := range dst {
		dst[k] = wf * (w00*a00[k] + w10*a10[k] + w01*a01[k] + w11*a11[k])
	}
	q = max(q, p.cellQ[(f*nG+j)*nc+i])
	if fy > 0 {
		q = max(q, p.cellQ[(f*nG+jn)*nc+i])
	}
	if ff > 0 { // second slice
		f1 := f + 1
		r0 = ((f1*nG+j)*p.nT + i) * nb
		r1 = ((f1*nG+jn)*p.nT + i) * nb
		a00, a10 = tab[r0:r0+nb], tab[r0+nb:r0+2*nb]
		a01, a11 = tab[r1:r1+nb], tab[r1+nb:r1+2*nb]
		for k := range dst {
			dst[k] += ff * (w00*a00[k] + w10*a10[k] + w01*a01[k] + w11*a11[k])
		}
		q = max(q, p.cellQ[(f1*nG+j)*nc+i])
		if fy > 0 {
			q = max(q, p.cellQ[(f1*nG+jn)*nc+i])
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

// lSunOverL0 is L_sun/L0 of IAU 2015 Resolutions B3 and B2.
const lSunOverL0 = consts.LSunW / consts.L0BolW

func fillNaN(dst []float64, q Quality) Quality {
	nan := math.NaN()
	for k := range dst {
		dst[k] = nan
	}
	return q
}
