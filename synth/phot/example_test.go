package phot_test

import (
	"fmt"

	"github.com/starmock/starmock/synth/phot"
)

// The nominal Sun (IAU 2015: 1 L_sun, 5772 K, log g 4.438) in the built-in
// grid. Willmer (2018, Table 3) gives M_V = 4.81, M_B = 5.44, M_Ks = 3.27
// (Vega) and M_g = 5.10, M_r = 4.64 (AB); the grid agrees to 0.04 mag.
func ExamplePhotometer_AbsMags() {
	p, err := phot.NewPhotometer(mustGrid(), []string{"B", "V", "Ks", "g", "r"})
	if err != nil {
		panic(err)
	}
	mags := make([]float64, 5)
	q := p.AbsMags(5772, 4.438, 0, 1, mags)
	for k, b := range p.Bands() {
		fmt.Printf("M_%s = %.2f (%s)\n", b.Name, mags[k], b.System)
	}
	fmt.Println("quality:", q)
	fmt.Println("type:", phot.SpectralType(5772)+phot.LuminosityClass(4.438, 1, 5772))
	// Output:
	// M_B = 5.47 (vega)
	// M_V = 4.82 (vega)
	// M_Ks = 3.26 (vega)
	// M_g = 5.10 (ab)
	// M_r = 4.64 (ab)
	// quality: empirical
	// type: G2V
}

func mustGrid() *phot.Grid {
	g, err := phot.DefaultGrid()
	if err != nil {
		panic(err)
	}
	return g
}

// A flat spectrum of 3631 Jy has AB magnitude 0 in any band (Oke & Gunn 1983).
func ExampleABMagFNu() {
	r, _ := phot.LookupBand("r")
	m := phot.ABMagFNu(r.Curve, func(float64) float64 { return 3631e-26 })
	fmt.Printf("%.6f\n", m+0) // +0 turns -0 into 0
	// Output: 0.000000
}
