package phot

import (
	"math"
	"strconv"
	"testing"

	"github.com/starmock/starmock/internal/consts"
)

// A flat f_ν = 3631 Jy spectrum has AB magnitude 0 by definition (Oke & Gunn
// 1983) in every band, whichever way the spectrum is given. Tolerance 1e-6 mag
// (issue 4): only rounding error is allowed.
func TestFlatABSpectrumIsZero(t *testing.T) {
	for _, b := range BuiltinBands() {
		mNu := ABMagFNu(b.Curve, func(float64) float64 { return 3631e-26 })
		mLam := ABMagFLambda(b.Curve, func(lambdaAA float64) float64 {
			l := lambdaAA * 1e-10
			return 3631e-26 * consts.C / (l * l) // F_λ = f_ν c / λ²
		})
		if math.Abs(mNu) > 1e-6 || math.Abs(mLam) > 1e-6 {
			t.Errorf("%s: flat 3631 Jy gives AB %.3g (f_nu), %.3g (f_lambda), want 0", b.Name, mNu, mLam)
		}
		// 10× the flux is 2.5 mag brighter (definition of the magnitude scale).
		m10 := ABMagFNu(b.Curve, func(float64) float64 { return 36310e-26 })
		if math.Abs(m10+2.5) > 1e-9 {
			t.Errorf("%s: 36310 Jy gives %.9f, want -2.5", b.Name, m10)
		}
	}
}

// B_λ and B_ν from internal/consts against testdata/planck_checks.tsv (astropy
// 5.2.1 BlackBody, 10 significant digits): relative tolerance 1e-8 (issue 4;
// the table's rounding is 5e-10).
func TestPlanckAgainstAstropy(t *testing.T) {
	_, rows := readTSV(t, "testdata/planck_checks.tsv")
	if len(rows) != 40 {
		t.Fatalf("%d rows, want 40", len(rows))
	}
	for _, r := range rows {
		tk, _ := strconv.ParseFloat(r[0], 64)
		um, _ := strconv.ParseFloat(r[1], 64)
		bl, _ := strconv.ParseFloat(r[2], 64)
		bn, _ := strconv.ParseFloat(r[3], 64)
		lam := um * 1e-6
		gotL := consts.PlanckLambda(lam, tk)
		gotN := consts.PlanckNu(consts.C/lam, tk)
		if d := math.Abs(gotL/bl - 1); d > 1e-8 {
			t.Errorf("B_lambda(%g um, %g K) = %.10e, astropy %.10e (rel %.2g)", um, tk, gotL, bl, d)
		}
		if d := math.Abs(gotN/bn - 1); d > 1e-8 {
			t.Errorf("B_nu(%g um, %g K) = %.10e, astropy %.10e (rel %.2g)", um, tk, gotN, bn, d)
		}
	}
}

// Blackbody BCs on the AB scale against testdata/blackbody_bc_ab.tsv, made by
// testdata/regen_blackbody_bc.py with astropy 5.2.1 and numpy 1.24.2 (an
// independent implementation: 0.5 Å grid, numpy trapz). Tolerance 2e-5 mag:
// the two quadratures differ by < 1e-5 mag, and the table prints 7 decimals.
func TestBlackbodyBCAgainstAstropy(t *testing.T) {
	_, rows := readTSV(t, "testdata/blackbody_bc_ab.tsv")
	if len(rows) != 64 {
		t.Fatalf("%d rows, want 64", len(rows))
	}
	for _, r := range rows {
		b, err := LookupBand(r[0])
		if err != nil {
			t.Fatal(err)
		}
		tk, _ := strconv.ParseFloat(r[1], 64)
		want, _ := strconv.ParseFloat(r[2], 64)
		got := BlackbodyBCAB(b.Curve, tk)
		if d := math.Abs(got - want); d > 2e-5 {
			t.Errorf("%s %g K: BC_AB %.6f, astropy/numpy %.6f (diff %.2g)", r[0], tk, got, want, d)
		}
	}
}

// The 2 Å quadrature against a 4× finer one: blackbody magnitudes must agree
// to 5e-6 mag (the accuracy claimed at maxQuadStepAA).
func TestQuadratureConverged(t *testing.T) {
	for _, b := range BuiltinBands() {
		fine := *b.Curve
		fine.prepareStep(maxQuadStepAA / 4)
		for _, tk := range []float64{2500, 5772, 40000} {
			f := func(l float64) float64 { return consts.PlanckLambda(l*1e-10, tk) }
			m1, m2 := ABMagFLambda(b.Curve, f), ABMagFLambda(&fine, f)
			if d := math.Abs(m1 - m2); d > 5e-6 {
				t.Errorf("%s %g K: 2 Å %.8f vs 0.5 Å %.8f mag", b.Name, tk, m1, m2)
			}
		}
	}
}

// Vega-band blackbody BCs are the AB ones plus m_AB − m_Vega: for Gaia G the
// offset is ZP_AB − ZP_Vega of Riello et al. (2021), 0.1136777774 mag.
func TestBlackbodyBCVegaOffset(t *testing.T) {
	g, _ := LookupBand("G")
	vega, err := BlackbodyBC(g, 8000)
	if err != nil {
		t.Fatal(err)
	}
	if d := vega - BlackbodyBCAB(g.Curve, 8000) - (25.8010446445 - 25.6873668671); math.Abs(d) > 1e-12 {
		t.Errorf("G Vega-AB BC difference off by %g", d)
	}
	if _, err := BlackbodyBC(Band{Name: "W1", System: SystemVega, Curve: g.Curve}, 8000); err == nil {
		t.Error("Vega band without offset: no error")
	}
}
