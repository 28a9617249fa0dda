package phot

import (
	"fmt"
	"math"
)

// ExtendGrid returns a copy of g with one more band column per entry of extra,
// computed from blackbody synthetic photometry tied to the grid: for a new band
// X the reference R is the grid band with a built-in curve whose pivot
// wavelength is nearest to X's in log λ, and at every node
//
//	BC_X,AB = BC_R,AB(node) + [BC_bb,X(T) − BC_bb,R(T)]      (AB blackbody BCs)
//
// with BC_R,AB = BC_R − Δ_R for a Vega reference (Δ = m_AB − m_Vega, VegaOffset).
// So X inherits the empirical spectrum shape of R and only the colour term
// X − R comes from a blackbody. If the grid has no band with a curve, BC_X is the
// pure blackbody value. New Vega bands need a VegaOffset (built-in names only);
// user bands should be AB. Every node of the new columns is listed in
// blackbody_bands, so a Photometer that uses them reports QualityBlackbody:
// blackbody colours are approximate, poor for cool stars. Bands without a
// curve, names already in the grid and more than MaxGridBands columns in total
// give an error.
func ExtendGrid(g *Grid, extra []Band) (*Grid, error) {
	nb0 := len(g.bands)
	if nb0+len(extra) > MaxGridBands {
		return nil, fmt.Errorf("grid would have %d bands, want at most %d", nb0+len(extra), MaxGridBands)
	}
	out := &Grid{teffK: g.teffK, loggCgs: g.loggCgs, feh: g.feh, quality: g.quality, source: g.source,
		sources: g.sources, comments: g.comments}
	out.bands = append([]GridBand(nil), g.bands...)
	// reference candidates: grid bands with a built-in curve of the same system
	type ref struct {
		col  int
		band Band
	}
	var refs []ref
	for k, gb := range g.bands {
		if b, err := LookupBand(gb.Name); err == nil && b.System == gb.System {
			refs = append(refs, ref{k, b})
		}
	}
	nbNew := nb0 + len(extra)
	nodes := len(g.quality)
	out.bc = make([]float64, nodes*nbNew)
	out.bbMask = make([]uint64, nodes)
	for n := 0; n < nodes; n++ {
		copy(out.bc[n*nbNew:], g.bc[n*nb0:(n+1)*nb0])
		out.bbMask[n] = g.bbMask[n]
	}
	for e, b := range extra {
		if b.Curve == nil {
			return nil, fmt.Errorf("band %q has no passband curve", b.Name)
		}
		if g.BandIndex(b.Name) >= 0 {
			return nil, fmt.Errorf("band %q is already in the grid", b.Name)
		}
		for _, prev := range extra[:e] {
			if prev.Name == b.Name {
				return nil, fmt.Errorf("band %q given twice", b.Name)
			}
		}
		var off float64
		if b.System == SystemVega {
			v, err := VegaOffset(b.Name)
			if err != nil {
				return nil, err
			}
			off = v
		}
		col := nb0 + e
		r := -1
		best := math.Inf(1)
		for i, c := range refs {
			if d := math.Abs(math.Log(c.band.PivotAA / b.PivotAA)); d < best {
				best, r = d, i
			}
		}
		desc := b.Source
		var refOff float64
		if r >= 0 {
			desc = fmt.Sprintf("%s; blackbody-tied to %s", b.Source, refs[r].band.Name)
			if refs[r].band.System == SystemVega {
				v, err := VegaOffset(refs[r].band.Name)
				if err != nil {
					return nil, err
				}
				refOff = v
			}
		} else {
			desc = b.Source + "; pure blackbody"
		}
		out.bands = append(out.bands, GridBand{Name: b.Name, System: b.System, Description: desc})
		for it, t := range g.teffK {
			bbX := BlackbodyBCAB(b.Curve, t)
			bbR := 0.0
			if r >= 0 {
				bbR = BlackbodyBCAB(refs[r].band.Curve, t)
			}
			for ig := range g.loggCgs {
				for ife := range g.feh {
					n := g.nodeIndex(it, ig, ife)
					v := bbX + off // pure blackbody, in X's system
					if r >= 0 {
						v = g.bc[n*nb0+refs[r].col] - refOff + bbX - bbR + off
					}
					out.bc[n*nbNew+col] = v
					out.bbMask[n] |= 1 << uint(col)
				}
			}
		}
	}
	return out, nil
}
