package phot

import (
	"fmt"
	"math"
)

// flowerTorresBCV returns BC_V in mag for effective temperature teffK from the
// Flower (1996, ApJ 469, 355) polynomial in log Teff with the corrected
// coefficients of Torres (2010, AJ 140, 1158, Table 1), valid for all
// luminosity classes:
//
//	BC_V = Σ_k c_k (log10 Teff)^k
//
// with three log Teff ranges (< 3.70, 3.70–3.90, ≥ 3.90). The coefficients are
// those of ../shared/reference/solar_and_calibration_values.tsv (rows
// flower_bc_*, marked there "from memory"). Flower's fit covers about
// 2,900–52,000 K; the caller keeps within that.
func flowerTorresBCV(teffK float64) float64 {
	lt := math.Log10(teffK)
	var c []float64
	switch {
	case lt < 3.70: // Torres 2010 Table 1, first column
		c = []float64{-1.905372914964560e+04, 1.551448667644120e+04, -4.212788193017170e+03, 3.814763284223430e+02}
	case lt < 3.90: // second column
		c = []float64{-3.705102038090150e+04, 3.856726299658040e+04, -1.506514863160250e+04, 2.617246371194160e+03, -1.706238103238640e+02}
	default: // third column
		c = []float64{-1.181154505389630e+05, 1.371459735839290e+05, -6.362338121002250e+04, 1.474129235626460e+04, -1.705872784068720e+03, 7.887317218049900e+01}
	}
	s := 0.0
	for k := len(c) - 1; k >= 0; k-- { // Horner
		s = s*lt + c[k]
	}
	return s
}

// alonsoFit is one θ_eff–colour relation of Alonso, Arribas & Martínez-Roger
// (1999, A&AS 140, 261) for giants:
//
//	θ_eff = 5040/Teff = a0 + a1 X + a2 X² + a3 X [Fe/H] + a4 [Fe/H] + a5 [Fe/H]²
//
// valid for lo ≤ X ≤ hi (at near-solar [Fe/H]). Coefficients from memory
// (eqs. 2–3 for B−V and 8–9 for V−K in the paper's numbering as remembered);
// checked here only for the internal consistency of each pair of equations in
// their overlap and against the red-clump colour (see giant_test.go). The K
// band of the paper is the TCS system, taken here as 2MASS Ks (the two differ
// by about 0.01–0.02 mag for giants, Ramírez & Meléndez 2005; from memory).
type alonsoFit struct {
	a      [6]float64
	lo, hi float64
}

var (
	alonsoBV1 = alonsoFit{[6]float64{0.5716, 0.5404, -0.06126, -0.04862, -0.01777, -0.007969}, 0.2, 0.8}
	alonsoBV2 = alonsoFit{[6]float64{0.6177, 0.4354, -0.004025, 0.05204, -0.1127, -0.01385}, 0.7, 1.8}
	alonsoVK1 = alonsoFit{[6]float64{0.5558, 0.2105, 0.001981, -0.009965, 0.01325, -0.002726}, 0.2, 2.5}
	alonsoVK2 = alonsoFit{[6]float64{0.3770, 0.3660, -0.03170, -0.003074, -0.002765, -0.002973}, 2.0, 4.9}
)

// theta returns θ_eff for colour x and metallicity feh.
func (f alonsoFit) theta(x, feh float64) float64 {
	a := f.a
	return a[0] + a[1]*x + a[2]*x*x + a[3]*x*feh + a[4]*feh + a[5]*feh*feh
}

// colour inverts the relation: the colour X at which θ(X) = 5040/teffK, on the
// branch where θ increases with X. ok is false if there is no such root.
func (f alonsoFit) colour(teffK, feh float64) (x float64, ok bool) {
	a := f.a
	th := 5040 / teffK
	A := a[2]
	B := a[1] + a[3]*feh
	C := a[0] + a[4]*feh + a[5]*feh*feh - th
	d := B*B - 4*A*C
	if d < 0 {
		return math.NaN(), false
	}
	// root with dθ/dX = 2AX + B = +sqrt(d) > 0
	return (-B + math.Sqrt(d)) / (2 * A), true
}

// alonsoPair returns the colour of a giant from two overlapping relations,
// using the first below its overlap with the second, the second above, and a
// linear blend in X across the overlap [lo2, hi1].
func alonsoPair(f1, f2 alonsoFit, teffK, feh float64) (float64, error) {
	x1, ok1 := f1.colour(teffK, feh)
	x2, ok2 := f2.colour(teffK, feh)
	switch {
	case ok1 && x1 <= f2.lo:
		if x1 < f1.lo {
			return math.NaN(), fmt.Errorf("teff_k %v K gives colour %.3f below the Alonso et al. (1999) range %.2f-%.2f", teffK, x1, f1.lo, f2.hi)
		}
		return x1, nil
	case ok2 && x2 >= f1.hi:
		if x2 > f2.hi {
			return math.NaN(), fmt.Errorf("teff_k %v K gives colour %.3f above the Alonso et al. (1999) range %.2f-%.2f", teffK, x2, f1.lo, f2.hi)
		}
		return x2, nil
	case ok1 && ok2:
		xm := 0.5 * (x1 + x2)
		w := (f1.hi - xm) / (f1.hi - f2.lo) // weight of the first relation
		w = math.Max(0, math.Min(1, w))
		return w*x1 + (1-w)*x2, nil
	}
	return math.NaN(), fmt.Errorf("teff_k %v K outside the Alonso et al. (1999) giant relations", teffK)
}

// giantBV returns the intrinsic B−V of a giant (Alonso et al. 1999).
func giantBV(teffK, feh float64) (float64, error) {
	return alonsoPair(alonsoBV1, alonsoBV2, teffK, feh)
}

// giantVK returns the intrinsic V−K of a giant (Alonso et al. 1999).
func giantVK(teffK, feh float64) (float64, error) {
	return alonsoPair(alonsoVK1, alonsoVK2, teffK, feh)
}
