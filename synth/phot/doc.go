// Package phot turns a star's luminosity, effective temperature, surface
// gravity and metallicity into absolute magnitudes in standard photometric
// systems, does synthetic photometry of a spectrum through a passband, and
// labels stars with an MK spectral type and luminosity class.
//
// # Bands
//
// BuiltinBands lists U B V Rc Ic (Johnson–Cousins in the Bessell 1990 form,
// Vega), J H Ks (2MASS, Vega), u g r i z (SDSS, Doi et al. 2010 curves at
// airmass 1.3, AB), G BP RP (Gaia EDR3/DR3, Vega), and the Rubin LSST baseline
// curves lsst_u … lsst_y (release 1.9, AB). The curves are embedded from
// data/passbands/ with their source headers (see data/passbands/README.md). Each
// file states whether its numbers are a per-photon or an energy-type response
// ("response_kind"); Passband.Photon carries that, and every integral honours
// it. Pivot wavelengths come from the curves (Passband.PivotAA) and reproduce
// the kit's README table to 0.05 Å. LoadPassband reads a user filter file.
// ExtendGrid adds bands without empirical BCs (the Rubin curves, user filters)
// to a grid by blackbody photometry tied to the nearest grid band, flagged
// blackbody.
//
// # Absolute magnitudes
//
//	M_X = M_bol − BC_X(Teff, log g, [Fe/H]),  M_bol = 4.74 − 2.5 log10(L/L_sun)
//
// (IAU 2015 Resolution B2; consts.MBol). A Photometer binds a bolometric-
// correction Grid to an ordered band list and evaluates it without allocation
// (16 bands in about 90 ns on an idle core of the development machine, 110–220 ns
// under load; BenchmarkAbsMags16). Along Teff it
// interpolates each grid row with a monotone piecewise cubic in log Teff
// (Fritsch & Butland 1984; exact at the nodes, no overshoot), and linearly in
// log g and [Fe/H]. Outside the grid it returns NaN with QualityOutsideGrid:
// there is no extrapolation. NaN or non-positive L or Teff (neutron stars, black
// holes) gives NaN with QualityNone; the catalogue writes null.
//
// # Built-in grid
//
// DefaultGrid is read from data/default_bc_grid.tsv, written by
// AssembleDefaultGrid (a test checks that the two agree). Nodes: the 87
// dwarf-sequence temperatures from M9.5V (2,330 K) to O3V (45,900 K) plus eight
// blackbody nodes up to 200,000 K; log g nodes −2.0 and 3.0 (giants), 3.5 and
// 5.5 (dwarfs and subgiants), 6.5 and 10.0 (white dwarfs); one [Fe/H] = 0 slice.
// Every node records its provenance (columns quality, blackbody_bands, source):
//
//   - Dwarfs (log g 3.5–5.5), 2,330–45,900 K: BC_V and colours of the mean dwarf
//     sequence of Pecaut & Mamajek (2013), E. Mamajek's table version 2024.05.15
//     (data/dwarf_sequence.tsv): B−V, U−B, V−Rc, V−Ic, V−Ks, J−H, H−Ks, G−V,
//     BP−RP, G−RP, g−r, r−i, i−z. BC_X = BC_V + (V − X). Gaps inside a colour
//     column are filled by the monotone cubic in log Teff; beyond a column's
//     first or last value the colour is continued with blackbody colour
//     differences, c(T) = c(T_end) + c_bb(T) − c_bb(T_end), and the bands that
//     use it are listed in blackbody_bands (for example BP and RP hotter than
//     B9V, SDSS g and u for M dwarfs, which have no g−r in the table). SDSS
//     magnitudes are tied to Cousins R by R = r − 0.2936 (r − i) − 0.1439
//     (Lupton 2005), and u to g by u − g = 1.28 (U − B) + 1.13 (Jester et al. 2005,
//     valid for Rc − Ic < 1.15 and used beyond it for M dwarfs); both from memory.
//   - Giants (log g ≤ 3.0), 3,700–5,500 K: BC_V from Flower (1996) with the
//     corrected coefficients of Torres (2010); B−V and V−K from the θ_eff–colour
//     relations of Alonso, Arribas & Martínez-Roger (1999) at [Fe/H] = 0
//     (coefficients from memory; see giant.go); all other colours from the dwarf
//     of equal V−Ks (V−Rc, V−Ic, J−H, H−Ks, Gaia, r−i, i−z) or equal B−V (U−B,
//     g−r). Above 5,500 K giants use the dwarf values: BC and colours depend
//     weakly on gravity there (Flower 1996 uses one BC_V–Teff relation for all
//     classes). Below 3,700 K giant colours are continued from the 3,770 K node
//     with blackbody differences and flagged blackbody: M-giant colours are far
//     from a blackbody's, so treat them as rough.
//   - Hotter than 45,900 K (any gravity below 6.5): continued from the O3V node
//     with blackbody differences, flagged blackbody.
//   - White dwarfs (log g ≥ 6.5): blackbody synthetic photometry, flagged.
//     Between log g 5.5 and 6.5 the dwarf and blackbody values are blended
//     linearly (hot subdwarfs); the blend is flagged blackbody.
//
// # Vega zero points
//
// Without a Vega spectrum, Vega-system blackbody magnitudes use
// m_Vega = m_AB − Δ_X. For Johnson–Cousins and 2MASS, Δ_X = M_sun,AB − M_sun,Vega
// of Willmer (2018, Table 3; both columns printed to 0.01 mag, so Δ is good to
// about ±0.01 mag); for Gaia, Δ = ZP_AB − ZP_Vega of the EDR3 zero points
// (Riello et al. 2021). These offsets matter only at pure-blackbody nodes (white
// dwarfs); blackbody-tied nodes use colour differences, in which they cancel.
// User passbands are AB only.
//
// # Quality
//
// AbsMags returns the worst quality of the grid nodes it interpolates between,
// counting only the Photometer's own bands: QualityEmpirical, QualityModel (a
// user grid), QualityBlackbody, QualityOutsideGrid, QualityNone. A Photometer
// for V, Ic, J and Ks reports an M dwarf as empirical; one that includes SDSS g
// reports it as blackbody.
//
// # Grid file format
//
// LoadGrid reads, and WriteGrid writes, tab- (or space-) separated text:
//
//	# free comment lines
//	# band: NAME SYSTEM [description]      one per band column; SYSTEM is vega or ab
//	# source: KEY = description            optional provenance legend
//	teff_k  logg_cgs  feh  NAME1 NAME2 …  [quality] [blackbody_bands] [source]
//	3000    4.0       0.0  -2.51 -1.62 …   model     -                 mykey
//
// Columns teff_k (K), logg_cgs (log10 cm s^-2) and feh (dex) come first, then
// one column per band holding BC_X = M_bol − M_X in mag (|BC| ≤ 50). Optional
// columns: quality (empirical, model or blackbody; default model),
// blackbody_bands (comma-separated band names taken from blackbody photometry at
// that node, or "-") and source (a key). Rows are ordered with teff_k increasing
// fastest, then logg_cgs, then feh, each strictly increasing, and must fill the
// full rectangle: every (logg_cgs, feh) block lists the same teff_k nodes and
// every feh slice the same logg_cgs nodes. Errors name the file and line. An
// axis with a single node is not a dimension (any value is accepted).
//
// # Spectral type and luminosity class
//
// SpectralType gives the nearest subtype on the dwarf sequence's type–Teff
// scale (O3 … Y4). LuminosityClass gives V, IV, III, II or I from the gravity
// offset below the main sequence and the luminosity (boundaries are common
// practice, see its documentation) and "WD" for white dwarfs; StarSpectralType
// gives "WD" for white-dwarf gravities and the dwarf-scale type otherwise.
//
// # References
//
//   - Alonso, A., Arribas, S. & Martínez-Roger, C. 1999, A&AS 140, 261: giant
//     θ_eff–colour relations (coefficients from memory).
//   - Bessell, M. S. 1990, PASP 102, 1181: UBVRI passbands (Table 2).
//   - Bessell, M. S. & Brett, J. M. 1988, PASP 100, 1134: giant and dwarf colours.
//   - Bessell, M. & Murphy, S. 2012, PASP 124, 140: synthetic photometry definitions.
//   - Cohen, M., Wheaton, W. A. & Megeath, S. T. 2003, AJ 126, 1090: 2MASS responses.
//   - Doi, M. et al. 2010, AJ 139, 1628: SDSS response functions (Table 4).
//   - Flower, P. J. 1996, ApJ 469, 355: BC_V–Teff relation.
//   - Fritsch, F. N. & Butland, J. 1984, SIAM J. Sci. Stat. Comput. 5, 300:
//     monotone piecewise cubic interpolation.
//   - Fukugita, M. et al. 1996, AJ 111, 1748: AB photon-counting magnitudes.
//   - Jester, S. et al. 2005, AJ 130, 873: SDSS–UBVRI transformations (Table 1).
//   - Koornneef, J. et al. 1986, Highlights of Astronomy 7, 833: pivot wavelength.
//   - Lupton, R. 2005, transformation equations between SDSS ugriz and UBVRcIc,
//     SDSS DR7 web documentation (from memory).
//   - Mamajek, E. E. et al. 2015, arXiv:1510.06262: IAU 2015 Resolution B2
//     (bolometric magnitude scale).
//   - Oke, J. B. & Gunn, J. E. 1983, ApJ 266, 713: AB magnitudes.
//   - Pecaut, M. J. & Mamajek, E. E. 2013, ApJS 208, 9: mean dwarf sequence
//     (E. Mamajek's updated table, version 2024.05.15).
//   - Planck, M. 1901, Annalen der Physik 309, 553.
//   - Ramírez, I. et al. 2012, ApJ 752, 5: solar colours (test values).
//   - Riello, M. et al. 2021, A&A 649, A3: Gaia EDR3 passbands and zero points.
//   - Tokunaga, A. T. & Vacca, W. D. 2005, PASP 117, 421: pivot wavelength.
//   - Torres, G. 2010, AJ 140, 1158: corrected Flower coefficients (Table 1).
//   - Willmer, C. N. A. 2018, ApJS 236, 47: absolute magnitudes of the Sun
//     (Table 3), AB−Vega offsets.
//
// # Incomplete
//
// No metallicity dependence in the built-in grid (one [Fe/H] = 0 slice; the
// Alonso relations have [Fe/H] terms that are not used yet). No empirical Rubin LSST
// bolometric corrections (ExtendGrid gives blackbody-tied ones). Giant U−B and g−r come from dwarfs of equal B−V, which is approximate.
// M dwarfs have no empirical SDSS g−r in the dwarf table (g and u are
// blackbody-tied there), and giants below 3,700 K, stars above 45,900 K and white
// dwarfs are blackbody-based. Brown dwarfs (below 2,330 K) are outside the grid.
// Synthetic photometry of user-supplied spectrum grids is not implemented (only
// blackbodies and caller-supplied spectrum functions).
package phot
