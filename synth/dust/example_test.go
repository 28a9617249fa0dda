package dust_test

import (
	"fmt"
	"math/rand/v2"
	"strings"

	"github.com/starmock/starmock/synth/dust"
)

// CCM89 at R_V = 3.1 evaluated at the effective wavelengths of CCM89 Table 3
// for B, V and K (0.44, 0.55, 2.2 μm). The printed values are the formula's
// (Table 3 itself lists the observed means 1.337, 1.000, 0.114; the reference
// kit's ccm_formula rows give 1.325, 0.999, 0.114).
func ExampleNewLaw() {
	law, err := dust.NewLaw("ccm89", 3.1)
	if err != nil {
		panic(err)
	}
	for _, lamAA := range []float64{4400, 5500, 22000} {
		a, _ := law.ALambdaOverAV(lamAA)
		fmt.Printf("A(%.0f Å)/A_V = %.3f\n", lamAA, a)
	}
	// Output:
	// A(4400 Å)/A_V = 1.325
	// A(5500 Å)/A_V = 0.999
	// A(22000 Å)/A_V = 0.114
}

// E(B−V) = A_V / R_V, the definition of R_V.
func ExampleEBV() {
	ebv, _ := dust.EBV(1.55, 3.1)
	fmt.Printf("E(B-V) = %.2f mag\n", ebv)
	// Output: E(B-V) = 0.50 mag
}

// A narrow band centred at 5000 Å has the law's value there whatever the
// source; PivotRatio is that fallback. (1.121501 in the reference table
// testdata/extinction_curves.tsv, python3-extinction 0.4.6.)
func ExampleBandRatio_narrowBand() {
	law, _ := dust.NewLaw("f99", 3.1)
	pb := dust.Passband{WavelengthAA: []float64{4999, 5000, 5001}, Throughput: []float64{0, 1, 0}, Photon: true}
	flat := func(float64) float64 { return 1 }
	r, _ := dust.BandRatio(law, pb, flat, 2)
	p, _ := dust.PivotRatio(law, 5000)
	fmt.Printf("band %.4f, pivot %.4f\n", r, p)
	// Output: band 1.1215, pivot 1.1215
}

// Cumulative A_V of the default exponential dust disc (Li et al. 2018 shape,
// 1 mag/kpc locally) toward the north Galactic pole: the whole layer above
// the Sun is A₀ h_z = 1e-3 mag/pc × 103 pc.
func ExampleExpDisc_pole() {
	disc, _ := dust.NewExpDisc(dust.DefaultDiscParams(8000, dust.DefaultSunAboveDustPlanePc), 0, 90)
	fmt.Printf("A_V(100 pc) = %.4f, A_V(10 kpc) = %.4f mag\n", disc.AV(100), disc.AV(10000))
	// Output: A_V(100 pc) = 0.0640, A_V(10 kpc) = 0.1030 mag
}

// Differential reddening: star-to-star scatter about a cluster's A_V.
func ExampleSpread() {
	s, _ := dust.NewSpread(dust.SpreadLognormal, 0.2)
	r := rand.New(rand.NewPCG(1, 2))
	sum := 0.0
	const n = 100000
	for i := 0; i < n; i++ {
		sum += s.Draw(0.8, r)
	}
	fmt.Printf("mean A_V %.2f mag\n", sum/n)
	// Output: mean A_V 0.80 mag
}

// A user sight-line table (format documented at AVTable) with one invented
// direction; A_V is interpolated linearly in distance, from (0, 0) to the
// first row, and held at the last value beyond the table.
func ExampleReadAVTable() {
	text := `# invented field "Copper Gate"
l_deg b_deg distance_pc av_mag
120.0 -3.5  200 0.10
120.0 -3.5 1000 0.90
`
	tab, err := dust.ReadAVTable(strings.NewReader(text), "copper_gate.txt")
	if err != nil {
		panic(err)
	}
	line, sep := tab.Nearest(120.2, -3.5)
	fmt.Printf("separation %.2f deg\n", sep)
	for _, d := range []float64{100, 600, 5000} {
		fmt.Printf("A_V(%g pc) = %.2f mag (covered: %v)\n", d, line.AV(d), line.Covers(d))
	}
	_, err = dust.ReadAVTable(strings.NewReader("l_deg b_deg distance_pc av_mag\n1 2 300 0.5\n1 2 200 0.6\n"), "bad.txt")
	fmt.Println(err)
	// Output:
	// separation 0.20 deg
	// A_V(100 pc) = 0.05 mag (covered: true)
	// A_V(600 pc) = 0.50 mag (covered: true)
	// A_V(5000 pc) = 0.90 mag (covered: false)
	// dust: bad.txt:3: invalid sight-line table: distance_pc 200 pc not above 300 pc of the previous row (must increase strictly within a direction)
}
