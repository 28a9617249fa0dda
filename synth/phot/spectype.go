package phot

import (
	"math"
	"strings"
	"sync"

	"github.com/starmock/starmock/internal/consts"
)

var (
	specOnce  sync.Once
	specLogT  []float64 // increasing
	specNames []string
	msLogT    []float64 // dwarf nodes with mass and radius, increasing
	msLogg    []float64 // their log g (cgs)
)

func loadSpec() {
	rows, err := dwarfSequence()
	if err != nil {
		panic(err) // embedded data corrupt: build defect
	}
	for _, r := range rows {
		specLogT = append(specLogT, math.Log10(r.teffK))
		specNames = append(specNames, strings.TrimSuffix(r.spt, "V"))
		if !math.IsNaN(r.massMsun) && !math.IsNaN(r.rRsun) {
			msLogT = append(msLogT, math.Log10(r.teffK))
			msLogg = append(msLogg, consts.LoggCgs(r.massMsun, r.rRsun))
		}
	}
}

// SpectralType returns the MK spectral type (letter and subclass, without
// luminosity class, e.g. "G2", "M4.5", "B9.5") whose temperature on the dwarf
// sequence's type–Teff scale (Pecaut & Mamajek 2013, table version 2024.05.15;
// O3 to Y4) is nearest to teffK in log Teff. The scale is that of dwarfs; it is
// applied to all luminosity classes (giants of a given type are some 100–300 K
// cooler, so a giant's type from its Teff comes out up to a few subclasses
// early: common practice for mock catalogues, not a classification).
// Temperatures more than half a subtype spacing beyond the first or last type
// (about 47,300 K and 230 K), and NaN, give "".
func SpectralType(teffK float64) string {
	specOnce.Do(loadSpec)
	lt := math.Log10(teffK)
	n := len(specLogT)
	if math.IsNaN(lt) {
		return ""
	}
	if lt < specLogT[0]-0.5*(specLogT[1]-specLogT[0]) || lt > specLogT[n-1]+0.5*(specLogT[n-1]-specLogT[n-2]) {
		return ""
	}
	i := 0
	for i < n-1 && 0.5*(specLogT[i]+specLogT[i+1]) < lt {
		i++
	}
	return specNames[i]
}

// StarSpectralType returns "WD" for a white-dwarf gravity (log g ≥ 6.5) and
// SpectralType(teffK) otherwise. The dwarf type–Teff scale does not apply to
// white dwarfs, whose own classes (DA, DB, …) depend on the atmospheric
// composition, which the evolution model does not give; "WD" says only that it
// is a white dwarf. NaN log g gives SpectralType(teffK).
func StarSpectralType(teffK, loggCgs float64) string {
	if loggCgs >= wdMinLoggCgs {
		return "WD"
	}
	return SpectralType(teffK)
}

// Luminosity-class boundaries (common practice; see LuminosityClass).
const (
	wdMinLoggCgs       = 6.5 // white dwarfs
	classIVDeltaLogg   = 0.4 // IV when log g is this far below the main sequence
	classIIIDeltaLogg  = 1.0 // III and brighter beyond this
	classIMinLogLLsun  = 4.5 // supergiants
	classIIMinLogLLsun = 3.5 // bright giants
)

// MainSequenceLoggCgs returns the log g (cgs) of the mean dwarf sequence at
// teffK, from the masses and radii of Pecaut & Mamajek (2013, table version
// 2024.05.15), g = G M / R², linear in log Teff between subtypes (O3V to L3V,
// 45,900–1,920 K). Outside that range it returns NaN.
func MainSequenceLoggCgs(teffK float64) float64 {
	specOnce.Do(loadSpec)
	lt := math.Log10(teffK)
	n := len(msLogT)
	if !(lt >= msLogT[0] && lt <= msLogT[n-1]) {
		return math.NaN()
	}
	j, w, _ := bracket(msLogT, lt)
	return (1-w)*msLogg[j] + w*msLogg[j+1]
}

// LuminosityClass returns the MK luminosity class "V", "IV", "III", "II" or
// "I" of a star with surface gravity loggCgs (cgs), luminosity lumLsun (L_sun)
// and effective temperature teffK (K), or "WD" for a white dwarf (log g ≥ 6.5).
// NaN input or a non-positive luminosity gives "".
//
// The boundaries are common practice (no single published source), chosen so
// that the classes follow the evolutionary phases:
//
//	Δ = log g − log g_MS(Teff)           (MainSequenceLoggCgs)
//	V    Δ ≥ −0.4                        (main sequence up to its end, and anything denser)
//	IV   −1.0 ≤ Δ < −0.4                 (subgiants)
//	I    Δ < −1.0 and log L ≥ 4.5        (supergiants)
//	II   Δ < −1.0 and 3.5 ≤ log L < 4.5  (bright giants, upper AGB)
//	III  Δ < −1.0 and log L < 3.5        (giants up to the red-giant-branch tip)
//
// Outside the Teff range of the main-sequence reference (hotter than 45,900 K
// or cooler than 1,920 K) log g_MS is taken at the nearest end of the range, a
// documented extension for labelling only.
func LuminosityClass(loggCgs, lumLsun, teffK float64) string {
	if math.IsNaN(loggCgs) || math.IsNaN(teffK) || !(lumLsun > 0) {
		return ""
	}
	if loggCgs >= wdMinLoggCgs {
		return "WD"
	}
	specOnce.Do(loadSpec)
	lt := math.Log10(teffK)
	var ref float64
	switch n := len(msLogT); {
	case lt < msLogT[0]:
		ref = msLogg[0]
	case lt > msLogT[n-1]:
		ref = msLogg[n-1]
	default:
		ref = MainSequenceLoggCgs(teffK)
	}
	d := loggCgs - ref
	switch {
	case d >= -classIVDeltaLogg:
		return "V"
	case d >= -classIIIDeltaLogg:
		return "IV"
	}
	logL := math.Log10(lumLsun)
	switch {
	case logL >= classIMinLogLLsun:
		return "I"
	case logL >= classIIMinLogLLsun:
		return "II"
	}
	return "III"
}
