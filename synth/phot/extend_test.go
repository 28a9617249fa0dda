package phot

import (
	"math"
	"testing"
)

// Consistency checks of the blackbody-tied extension: a copy of a grid band
// under a new name reproduces that band exactly (the colour term vanishes), and
// is flagged blackbody.
func TestExtendGridCopyOfBand(t *testing.T) {
	g, _ := DefaultGrid()
	r, _ := LookupBand("r")
	rc := r
	rc.Name = "r_copy"
	g2, err := ExtendGrid(g, []Band{rc})
	if err != nil {
		t.Fatal(err)
	}
	p, err := NewPhotometer(g2, []string{"r", "r_copy"})
	if err != nil {
		t.Fatal(err)
	}
	dst := make([]float64, 2)
	q := p.AbsMags(5772, 4.44, 0, 1, dst)
	if math.Abs(dst[0]-dst[1]) > 1e-12 || q != QualityBlackbody {
		t.Errorf("r %.6f vs r_copy %.6f (%v), want equal and blackbody", dst[0], dst[1], q)
	}
	// a Vega reference: a copy of V renamed, declared AB, is V_AB = V − Δ_V
	v, _ := LookupBand("V")
	vab := v
	vab.Name, vab.System = "V_ab", SystemAB
	g3, err := ExtendGrid(g, []Band{vab})
	if err != nil {
		t.Fatal(err)
	}
	p3, _ := NewPhotometer(g3, []string{"V", "V_ab"})
	p3.AbsMags(5772, 4.44, 0, 1, dst)
	off, _ := VegaOffset("V")
	if math.Abs((dst[1]-dst[0])-off) > 1e-12 {
		t.Errorf("V_ab - V = %.6f, want the AB-Vega offset %.6f", dst[1]-dst[0], off)
	}
}

// The Rubin bands tied to SDSS: for the Sun the LSST and SDSS r magnitudes
// differ only by the small blackbody colour term of two nearly equal passbands
// (pivots 6208 vs 6177 Å): |Δ| < 0.05 mag (common practice: r-band
// transformations between the two systems are a few hundredths for solar
// colours).
func TestExtendGridLSST(t *testing.T) {
	g, _ := DefaultGrid()
	var lsst []Band
	for _, n := range []string{"lsst_u", "lsst_g", "lsst_r", "lsst_i", "lsst_z", "lsst_y"} {
		b, err := LookupBand(n)
		if err != nil {
			t.Fatal(err)
		}
		lsst = append(lsst, b)
	}
	g2, err := ExtendGrid(g, lsst)
	if err != nil {
		t.Fatal(err)
	}
	p, err := NewPhotometer(g2, []string{"r", "lsst_r"})
	if err != nil {
		t.Fatal(err)
	}
	dst := make([]float64, 2)
	p.AbsMags(5772, 4.44, 0, 1, dst)
	if math.Abs(dst[0]-dst[1]) > 0.05 {
		t.Errorf("Sun: r %.3f, lsst_r %.3f", dst[0], dst[1])
	}
	if _, err := ExtendGrid(g, []Band{{Name: "V", Curve: lsst[0].Curve}}); err == nil {
		t.Error("duplicate name: no error")
	}
	if _, err := ExtendGrid(g, []Band{{Name: "x"}}); err == nil {
		t.Error("no curve: no error")
	}
}
