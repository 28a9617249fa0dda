package phot

import (
	"bytes"
	"embed"
	"errors"
	"fmt"
	"sort"
	"strings"
	"sync"
)

//go:embed data
var dataFS embed.FS

// System is the magnitude system of a band: "vega" or "ab".
type System string

const (
	// SystemVega: magnitudes relative to Vega (Johnson–Cousins, 2MASS, Gaia VEGAMAG).
	SystemVega System = "vega"
	// SystemAB: AB magnitudes, m = −2.5 log10(f_ν / 3631 Jy) (Oke & Gunn 1983).
	SystemAB System = "ab"
)

// ParseSystem returns the System named by word ("vega" or "ab", case-insensitive).
func ParseSystem(word string) (System, error) {
	switch strings.ToLower(strings.TrimSpace(word)) {
	case "vega":
		return SystemVega, nil
	case "ab":
		return SystemAB, nil
	}
	return "", fmt.Errorf("magnitude system %q, want \"vega\" or \"ab\"", word)
}

// Band is a photometric band: its name as used in grids and catalogue columns,
// its magnitude system, its pivot wavelength (Å, computed from the curve by
// Passband.PivotAA), a short source description and its response curve.
type Band struct {
	Name    string
	System  System
	PivotAA float64
	Source  string
	Curve   *Passband
}

// ErrUnknownBand is wrapped by LookupBand for a name that is not built in.
var ErrUnknownBand = errors.New("unknown band")

type bandSpec struct {
	name, file, label string
	system            System
}

// builtinSpecs lists the built-in bands in catalogue order. The sixteen bands of
// the built-in bolometric-correction grid come first; the Rubin LSST bands
// (lsst_*) have curves for synthetic photometry but no empirical BCs.
var builtinSpecs = []bandSpec{
	{"U", "johnson_cousins_U.tsv", "Johnson-Cousins U (Bessell 1990, PASP 102, 1181, Table 2, UX)", SystemVega},
	{"B", "johnson_cousins_B.tsv", "Johnson-Cousins B (Bessell 1990, PASP 102, 1181, Table 2)", SystemVega},
	{"V", "johnson_cousins_V.tsv", "Johnson-Cousins V (Bessell 1990, PASP 102, 1181, Table 2)", SystemVega},
	{"Rc", "johnson_cousins_R.tsv", "Cousins R (Bessell 1990, PASP 102, 1181, Table 2)", SystemVega},
	{"Ic", "johnson_cousins_I.tsv", "Cousins I (Bessell 1990, PASP 102, 1181, Table 2)", SystemVega},
	{"J", "twomass_J.tsv", "2MASS J (Cohen, Wheaton & Megeath 2003, AJ 126, 1090)", SystemVega},
	{"H", "twomass_H.tsv", "2MASS H (Cohen, Wheaton & Megeath 2003, AJ 126, 1090)", SystemVega},
	{"Ks", "twomass_Ks.tsv", "2MASS Ks (Cohen, Wheaton & Megeath 2003, AJ 126, 1090)", SystemVega},
	{"u", "sdss_u.tsv", "SDSS u, airmass 1.3 (Doi et al. 2010, AJ 139, 1628, Table 4)", SystemAB},
	{"g", "sdss_g.tsv", "SDSS g, airmass 1.3 (Doi et al. 2010, AJ 139, 1628, Table 4)", SystemAB},
	{"r", "sdss_r.tsv", "SDSS r, airmass 1.3 (Doi et al. 2010, AJ 139, 1628, Table 4)", SystemAB},
	{"i", "sdss_i.tsv", "SDSS i, airmass 1.3 (Doi et al. 2010, AJ 139, 1628, Table 4)", SystemAB},
	{"z", "sdss_z.tsv", "SDSS z, airmass 1.3 (Doi et al. 2010, AJ 139, 1628, Table 4)", SystemAB},
	{"G", "gaia_dr3_G.tsv", "Gaia EDR3/DR3 G (Riello et al. 2021, A&A 649, A3)", SystemVega},
	{"BP", "gaia_dr3_BP.tsv", "Gaia EDR3/DR3 BP (Riello et al. 2021, A&A 649, A3)", SystemVega},
	{"RP", "gaia_dr3_RP.tsv", "Gaia EDR3/DR3 RP (Riello et al. 2021, A&A 649, A3)", SystemVega},
	{"lsst_u", "lsst_u.tsv", "Rubin LSST u, throughputs release 1.9 (X = 1.2)", SystemAB},
	{"lsst_g", "lsst_g.tsv", "Rubin LSST g, throughputs release 1.9 (X = 1.2)", SystemAB},
	{"lsst_r", "lsst_r.tsv", "Rubin LSST r, throughputs release 1.9 (X = 1.2)", SystemAB},
	{"lsst_i", "lsst_i.tsv", "Rubin LSST i, throughputs release 1.9 (X = 1.2)", SystemAB},
	{"lsst_z", "lsst_z.tsv", "Rubin LSST z, throughputs release 1.9 (X = 1.2)", SystemAB},
	{"lsst_y", "lsst_y.tsv", "Rubin LSST y, throughputs release 1.9 (X = 1.2)", SystemAB},
}

// DefaultBandNames are the sixteen bands of the built-in grid, in catalogue order.
var DefaultBandNames = []string{"U", "B", "V", "Rc", "Ic", "J", "H", "Ks", "u", "g", "r", "i", "z", "G", "BP", "RP"}

var (
	builtinOnce  sync.Once
	builtinBands []Band
	builtinErr   error
)

func loadBuiltins() {
	for _, s := range builtinSpecs {
		raw, err := dataFS.ReadFile("data/passbands/" + s.file)
		if err != nil {
			builtinErr = fmt.Errorf("phot: embedded passband %s: %w", s.file, err)
			return
		}
		pb, err := parsePassband(bytes.NewReader(raw), s.file, false)
		if err != nil {
			builtinErr = fmt.Errorf("phot: embedded passband: %w", err)
			return
		}
		pb.Name = s.name
		pb.Source = s.label + "; file data/passbands/" + s.file
		builtinBands = append(builtinBands, Band{Name: s.name, System: s.system, PivotAA: pb.PivotAA(), Source: s.label, Curve: pb})
	}
}

// BuiltinBands returns the built-in bands: U B V Rc Ic (Johnson–Cousins, Vega),
// J H Ks (2MASS, Vega), u g r i z (SDSS, AB), G BP RP (Gaia DR3, Vega), then
// lsst_u … lsst_y (Rubin, AB). The curves are shared and must not be modified.
// It panics only if the embedded data are corrupt (a build defect).
func BuiltinBands() []Band {
	builtinOnce.Do(loadBuiltins)
	if builtinErr != nil {
		panic(builtinErr)
	}
	out := make([]Band, len(builtinBands))
	copy(out, builtinBands)
	return out
}

// LookupBand returns the built-in band with the given name (case-sensitive:
// "r" is SDSS r, "Rc" is Cousins R). Unknown names give an error wrapping
// ErrUnknownBand that lists the valid names.
func LookupBand(name string) (Band, error) {
	for _, b := range BuiltinBands() {
		if b.Name == name {
			return b, nil
		}
	}
	return Band{}, fmt.Errorf("%w %q, want one of %s", ErrUnknownBand, name, strings.Join(builtinNames(), ", "))
}

func builtinNames() []string {
	var n []string
	for _, s := range builtinSpecs {
		n = append(n, s.name)
	}
	return n
}

// vegaOffsets are Δ_X = m_AB − m_Vega per Vega band, in mag.
//
// Johnson–Cousins and 2MASS: Δ = M_sun,AB − M_sun,Vega from Willmer 2018 (ApJS 236,
// 47, Table 3), both columns printed to 0.01 mag, so Δ is good to about ±0.01 mag
// (Willmer used his own copies of the curves and a Vega spectrum).
// Gaia: Δ = ZP_AB − ZP_Vega of the EDR3 zero points (Riello et al. 2021, zeropt.dat
// as copied in data/passbands/gaia_dr3_*.tsv), exact for these curves.
var vegaOffsets = map[string]float64{
	"U":  6.32 - 5.60, // Willmer 2018 Table 3
	"B":  5.31 - 5.44,
	"V":  4.80 - 4.81,
	"Rc": 4.60 - 4.42,
	"Ic": 4.51 - 4.10,
	"J":  4.54 - 3.67,
	"H":  4.66 - 3.32,
	"Ks": 5.08 - 3.27,
	"G":  25.8010446445 - 25.6873668671, // Riello et al. 2021 EDR3 zero points
	"BP": 25.3539555559 - 25.3385422158,
	"RP": 25.1039837393 - 24.7478955012,
}

// VegaOffset returns Δ_X = m_AB − m_Vega in mag for a built-in Vega band (see
// the package documentation, "Vega zero points"). Other names give an error.
func VegaOffset(name string) (float64, error) {
	if v, ok := vegaOffsets[name]; ok {
		return v, nil
	}
	var names []string
	for k := range vegaOffsets {
		names = append(names, k)
	}
	sort.Strings(names)
	return 0, fmt.Errorf("band %q has no AB-Vega offset, want one of %s", name, strings.Join(names, ", "))
}
