package phot

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/interp"
)

// Colours used to assemble the built-in grid; index order of colourCols.
const (
	cBCV = iota
	cBV
	cUB
	cVRc
	cVIc
	cVKs
	cJH
	cHKs
	cGV
	cBPRP
	cGRP
	cgr
	cri
	ciz
	nColour
)

// colourCols are the dwarf_sequence.tsv column of each colour.
var colourCols = [nColour]string{"bc_v", "b_v", "u_b", "v_rc", "v_ic", "v_ks", "j_h", "h_ks", "g_v", "bp_rp", "g_rp", "g_r", "r_i", "i_z"}

// colourBands gives the bands (X, Y) of colour X − Y; bc_v is BC_V.
var colourBands = [nColour][2]string{{"", "V"}, {"B", "V"}, {"U", "B"}, {"V", "Rc"}, {"V", "Ic"}, {"V", "Ks"},
	{"J", "H"}, {"H", "Ks"}, {"G", "V"}, {"BP", "RP"}, {"G", "RP"}, {"g", "r"}, {"r", "i"}, {"i", "z"}}

// colourSet is BC_V plus the colours at one node, with a flag per colour set
// when the value comes from blackbody photometry.
type colourSet struct {
	v  [nColour]float64
	bb [nColour]bool
}

// Limits of the built-in grid and of the relations it is built from.
const (
	gridTeffMinK   = 2330.0   // coolest dwarf node used (M9.5V of the dwarf sequence)
	gridTeffMaxK   = 200000.0 // hottest node (blackbody)
	dwarfTeffMaxK  = 45900.0  // hottest dwarf node (O3V)
	giantTeffLoK   = 3700.0   // giant calibration used at nodes in [giantTeffLoK, giantTeffHiK]
	giantTeffHiK   = 5500.0
	logTMatchLoDex = 3.3674 // log10(2330): search range for colour-matched dwarfs
	logTMatchHiDex = 4.0    // log10(10000)
)

// hotNodesK are the blackbody nodes above the dwarf sequence.
var hotNodesK = []float64{50000, 60000, 70000, 85000, 100000, 125000, 150000, 200000}

// defaultLoggNodes: giant relations at ≤ 3.0, dwarf sequence 3.5–5.5, blackbody
// (white dwarfs) at ≥ 6.5; linear in log g in between.
var defaultLoggNodes = []float64{-2.0, 3.0, 3.5, 5.5, 6.5, 10.0}

// assembler holds the intermediate products of AssembleDefaultGrid.
type assembler struct {
	bands   []Band
	bandIdx map[string]int
	teff    []float64 // dwarf node Teffs ≥ gridTeffMinK, increasing
	logT    []float64
	dwarf   []colourSet // filled dwarf colours per dwarf node
	curve   [nColour]interp.FritschButland
	bbCache map[float64][]float64
}

func newAssembler() (*assembler, error) {
	a := &assembler{bandIdx: map[string]int{}, bbCache: map[float64][]float64{}}
	for _, name := range DefaultBandNames {
		b, err := LookupBand(name)
		if err != nil {
			return nil, err
		}
		a.bandIdx[name] = len(a.bands)
		a.bands = append(a.bands, b)
	}
	rows, err := dwarfSequence()
	if err != nil {
		return nil, err
	}
	var use []dwarfRow
	for _, r := range rows {
		if r.teffK >= gridTeffMinK && r.teffK <= dwarfTeffMaxK {
			use = append(use, r)
		}
	}
	for _, r := range use {
		a.teff = append(a.teff, r.teffK)
		a.logT = append(a.logT, math.Log10(r.teffK))
	}
	a.dwarf = make([]colourSet, len(use))
	for c := 0; c < nColour; c++ {
		var xs, ys []float64
		for i, r := range use {
			if v := r.col[colourCols[c]]; !math.IsNaN(v) {
				xs = append(xs, a.logT[i])
				ys = append(ys, v)
			}
		}
		if len(xs) < 3 {
			return nil, fmt.Errorf("phot: dwarf column %s has %d values", colourCols[c], len(xs))
		}
		var fb interp.FritschButland
		fb.Fit(xs, ys) // monotone cubic through the tabulated values (Fritsch & Butland 1984)
		lo, hi := xs[0], xs[len(xs)-1]
		var vLo, vHi float64 = ys[0], ys[len(ys)-1]
		tLo, tHi := math.Pow(10, lo), math.Pow(10, hi)
		for i, lt := range a.logT {
			switch {
			case lt < lo: // cooler than the last tabulated value: blackbody-tied continuation
				a.dwarf[i].v[c] = vLo + a.bbColour(c, a.teff[i]) - a.bbColour(c, tLo)
				a.dwarf[i].bb[c] = true
			case lt > hi: // hotter than the first tabulated value
				a.dwarf[i].v[c] = vHi + a.bbColour(c, a.teff[i]) - a.bbColour(c, tHi)
				a.dwarf[i].bb[c] = true
			default:
				a.dwarf[i].v[c] = fb.Predict(lt)
			}
		}
		// continuous curve through the filled column, for colour matching
		ysAll := make([]float64, len(a.logT))
		for i := range a.logT {
			ysAll[i] = a.dwarf[i].v[c]
		}
		a.curve[c].Fit(a.logT, ysAll)
	}
	return a, nil
}

// bbAB returns the AB blackbody BCs of the sixteen bands at teffK (cached).
func (a *assembler) bbAB(teffK float64) []float64 {
	if v, ok := a.bbCache[teffK]; ok {
		return v
	}
	v := make([]float64, len(a.bands))
	for k, b := range a.bands {
		v[k] = BlackbodyBCAB(b.Curve, teffK)
	}
	a.bbCache[teffK] = v
	return v
}

// bbColour returns colour c of a blackbody at teffK on the AB scale (only
// differences of it are used, so the Vega offsets cancel): BC_V for bc_v,
// X − Y = BC_Y − BC_X otherwise.
func (a *assembler) bbColour(c int, teffK float64) float64 {
	bb := a.bbAB(teffK)
	x, y := colourBands[c][0], colourBands[c][1]
	if x == "" {
		return bb[a.bandIdx[y]]
	}
	return bb[a.bandIdx[y]] - bb[a.bandIdx[x]]
}

// tie continues colour set ref (at tRefK) to teffK with blackbody colour
// differences: c(T) = c(T_ref) + c_bb(T) − c_bb(T_ref). Every value is flagged.
func (a *assembler) tie(ref colourSet, tRefK, teffK float64) colourSet {
	var out colourSet
	for c := 0; c < nColour; c++ {
		out.v[c] = ref.v[c] + a.bbColour(c, teffK) - a.bbColour(c, tRefK)
		out.bb[c] = true
	}
	return out
}

// dwarfAt returns the filled dwarf colour c at log Teff lt and whether the
// bracketing nodes are blackbody-based.
func (a *assembler) dwarfAt(c int, lt float64) (float64, bool) {
	v := a.curve[c].Predict(lt)
	i := 0
	for i < len(a.logT)-1 && a.logT[i+1] < lt {
		i++
	}
	bb := a.dwarf[i].bb[c]
	if i+1 < len(a.logT) {
		bb = bb || a.dwarf[i+1].bb[c]
	}
	return v, bb
}

// matchDwarf returns the log Teff of the dwarf whose colour c equals x, by
// bisection on the (monotone) filled dwarf curve between 2330 and 10000 K.
func (a *assembler) matchDwarf(c int, x float64) (float64, error) {
	lo, hi := logTMatchLoDex, logTMatchHiDex
	flo, fhi := a.curve[c].Predict(lo)-x, a.curve[c].Predict(hi)-x
	if flo*fhi > 0 {
		return math.NaN(), fmt.Errorf("phot: no dwarf with %s = %.3f", colourCols[c], x)
	}
	for k := 0; k < 60; k++ {
		mid := 0.5 * (lo + hi)
		fm := a.curve[c].Predict(mid) - x
		if fm*flo > 0 {
			lo, flo = mid, fm
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi), nil
}

// giantSet builds the colours of a solar-metallicity giant at teffK:
// BC_V from Flower (1996)/Torres (2010); B−V and V−K from Alonso et al. (1999);
// every other colour from the dwarf sequence at the dwarf of the same V−Ks
// (red and infrared colours) or the same B−V (U−B, g−r): the colour–colour
// relations of giants and dwarfs are taken to be the same, which holds to a few
// hundredths of a magnitude for K stars in V−Rc, V−Ic and J−H−K (Bessell &
// Brett 1988, Figs. 4–6; from memory) but not for U−B, whose giant values are
// therefore approximate.
func (a *assembler) giantSet(teffK float64) (colourSet, error) {
	var s colourSet
	bv, err := giantBV(teffK, 0)
	if err != nil {
		return s, err
	}
	vk, err := giantVK(teffK, 0)
	if err != nil {
		return s, err
	}
	s.v[cBCV] = flowerTorresBCV(teffK)
	s.v[cBV] = bv
	s.v[cVKs] = vk
	ltVK, err := a.matchDwarf(cVKs, vk)
	if err != nil {
		return s, err
	}
	ltBV, err := a.matchDwarf(cBV, bv)
	if err != nil {
		return s, err
	}
	for _, c := range []int{cVRc, cVIc, cJH, cHKs, cGV, cBPRP, cGRP, cri, ciz} {
		s.v[c], s.bb[c] = a.dwarfAt(c, ltVK)
	}
	for _, c := range []int{cUB, cgr} {
		s.v[c], s.bb[c] = a.dwarfAt(c, ltBV)
	}
	return s, nil
}

// bandDeps lists the colours each band's BC is built from (bandBCs).
var bandDeps = map[string][]int{
	"V": {cBCV}, "B": {cBCV, cBV}, "U": {cBCV, cBV, cUB},
	"Rc": {cBCV, cVRc}, "Ic": {cBCV, cVIc}, "Ks": {cBCV, cVKs},
	"H": {cBCV, cVKs, cHKs}, "J": {cBCV, cVKs, cHKs, cJH},
	"G": {cBCV, cGV}, "RP": {cBCV, cGV, cGRP}, "BP": {cBCV, cGV, cGRP, cBPRP},
	"r": {cBCV, cVRc, cri}, "g": {cBCV, cVRc, cri, cgr}, "i": {cBCV, cVRc, cri},
	"z": {cBCV, cVRc, cri, ciz}, "u": {cBCV, cVRc, cri, cgr, cBV, cUB},
}

// bandBCs turns a colour set into the sixteen BCs (order DefaultBandNames) and
// the mask of bands that depend on a blackbody-based colour. BC_X = M_bol − M_X,
// so BC_X = BC_V + (V − X).
func (a *assembler) bandBCs(s colourSet) ([]float64, uint64) {
	v := s.v
	bc := map[string]float64{}
	bc["V"] = v[cBCV]
	bc["B"] = v[cBCV] - v[cBV]
	bc["U"] = bc["B"] - v[cUB]
	bc["Rc"] = v[cBCV] + v[cVRc]
	bc["Ic"] = v[cBCV] + v[cVIc]
	bc["Ks"] = v[cBCV] + v[cVKs]
	bc["H"] = bc["Ks"] - v[cHKs]
	bc["J"] = bc["H"] - v[cJH]
	bc["G"] = v[cBCV] - v[cGV]
	bc["RP"] = bc["G"] + v[cGRP]
	bc["BP"] = bc["RP"] - v[cBPRP]
	// SDSS r from Cousins R: R = r − 0.2936 (r − i) − 0.1439 (Lupton 2005,
	// transformation equations on the SDSS DR7 "Transformations" page; from memory).
	bc["r"] = bc["Rc"] - 0.2936*v[cri] - 0.1439
	bc["g"] = bc["r"] - v[cgr]
	bc["i"] = bc["r"] + v[cri]
	bc["z"] = bc["i"] + v[ciz]
	// u − g = 1.28 (U − B) + 1.13 (Jester et al. 2005, AJ 130, 873, Table 1, all
	// stars with Rc − Ic < 1.15; from memory); used beyond that range for M dwarfs.
	bc["u"] = bc["g"] - (1.28*v[cUB] + 1.13)
	out := make([]float64, len(DefaultBandNames))
	var mask uint64
	for k, name := range DefaultBandNames {
		out[k] = bc[name]
		for _, c := range bandDeps[name] {
			if s.bb[c] {
				mask |= 1 << uint(k)
			}
		}
	}
	return out, mask
}

// Provenance keys of the built-in grid.
var defaultSources = [][2]string{
	{"dwarf_pm13", "Pecaut & Mamajek (2013, ApJS 208, 9) mean dwarf sequence, E. Mamajek's table version 2024.05.15: BC_V and colours; gaps in a colour column filled by monotone cubic interpolation in log Teff (Fritsch & Butland 1984); colours beyond the tabulated range continued with blackbody colour differences (bands listed in blackbody_bands); SDSS r from Cousins R by Lupton (2005), u from U-B by Jester et al. (2005)"},
	{"dwarf_pm13_all_gravities", "as dwarf_pm13, used at giant gravities above 5500 K, where BC and colours depend weakly on gravity (Flower 1996 uses one BC_V-Teff relation for all luminosity classes)"},
	{"giant_alonso99", "giants: BC_V of Flower (1996) with the Torres (2010) coefficients; B-V and V-K from Alonso, Arribas & Martinez-Roger (1999, A&AS 140, 261) at [Fe/H] = 0; other colours from the dwarf of equal V-Ks (red, infrared) or equal B-V (U-B, g-r)"},
	{"blackbody_tied_hot", "hotter than the O3V node (45900 K): BCs continued from that node with blackbody BC differences; approximate"},
	{"blackbody_tied_cool_giant", "giants cooler than the coolest giant-calibration node: continued with blackbody colour differences from it; poor for M giants, whose spectra are far from a blackbody"},
	{"blackbody_wd", "white-dwarf gravities: synthetic photometry of a blackbody, Vega bands via the AB-Vega offsets of Willmer (2018) and Riello et al. (2021); approximate"},
}

// AssembleDefaultGrid builds the built-in bolometric-correction grid from the
// embedded dwarf sequence, the giant relations and blackbody photometry, as the
// package documentation describes ("Built-in grid"). DefaultGrid reads the same
// grid from the embedded file written from this function; the tests check that
// the two agree.
func AssembleDefaultGrid() (*Grid, error) {
	a, err := newAssembler()
	if err != nil {
		return nil, err
	}
	g := &Grid{feh: []float64{0}, loggCgs: append([]float64(nil), defaultLoggNodes...), sources: defaultSources}
	g.comments = []string{
		"starmock built-in bolometric-correction grid (BC_X = M_bol - M_X, mag; M_bol on the IAU 2015 B2 scale, 4.74 for the nominal Sun)",
		"written by phot.AssembleDefaultGrid; format: see the synth/phot package documentation, 'Grid file format'",
		"single [Fe/H] = 0 slice: no metallicity dependence; log g nodes: giants <= 3.0, dwarfs 3.5-5.5, white dwarfs >= 6.5, linear in between",
	}
	for _, b := range a.bands {
		g.bands = append(g.bands, GridBand{Name: b.Name, System: b.System, Description: b.Source})
	}
	g.teffK = append(append([]float64(nil), a.teff...), hotNodesK...)
	nb := len(g.bands)
	allMask := uint64(1)<<uint(nb) - 1
	iHot := len(a.teff) - 1 // O3V node
	// coolest giant-calibration node
	iGiantLo := -1
	for i, t := range a.teff {
		if t >= giantTeffLoK && t <= giantTeffHiK {
			iGiantLo = i
			break
		}
	}
	giantLo, err := a.giantSet(a.teff[iGiantLo])
	if err != nil {
		return nil, err
	}
	for _, lg := range g.loggCgs {
		for it, t := range g.teffK {
			var s colourSet
			q := QualityEmpirical
			src := ""
			pure := false
			switch {
			case lg >= 6.5:
				pure, q, src = true, QualityBlackbody, "blackbody_wd"
			case t > dwarfTeffMaxK:
				s, q, src = a.tie(a.dwarf[iHot], a.teff[iHot], t), QualityBlackbody, "blackbody_tied_hot"
			case lg >= 3.5:
				s, src = a.dwarf[it], "dwarf_pm13"
			case t > giantTeffHiK:
				s, src = a.dwarf[it], "dwarf_pm13_all_gravities"
			case t >= giantTeffLoK:
				s, err = a.giantSet(t)
				if err != nil {
					return nil, err
				}
				src = "giant_alonso99"
			default:
				s, q, src = a.tie(giantLo, a.teff[iGiantLo], t), QualityBlackbody, "blackbody_tied_cool_giant"
			}
			var bc []float64
			var mask uint64
			if pure {
				bc = make([]float64, nb)
				for k, b := range a.bands {
					bc[k], err = BlackbodyBC(b, t)
					if err != nil {
						return nil, err
					}
				}
				mask = allMask
			} else {
				bc, mask = a.bandBCs(s)
				if q == QualityBlackbody {
					mask = allMask
				}
			}
			for k := range bc {
				bc[k] = math.Round(bc[k]*1e4) / 1e4 // the file keeps 4 decimals
			}
			g.bc = append(g.bc, bc...)
			g.quality = append(g.quality, q)
			g.bbMask = append(g.bbMask, mask)
			g.source = append(g.source, src)
		}
	}
	return g, nil
}
