package observe_test

import (
	"fmt"
	"math"

	"github.com/starmock/starmock/synth/observe"
)

// Ivezić et al. 2019 (ApJ 873, 111), eq. 5 with the r-band values of their
// Table 2 (m5 = 24.35, γ = 0.039): σ_rand is 0.2 mag at m5 by construction; the
// other values match the check rows lsst_sigma_rand_at_* of the project's
// reference table (0.0811, 0.0221, 0.4986 mag).
func ExampleIvezicSigmaRand() {
	for _, dm := range []float64{-2.5, -1, 0, 1} {
		fmt.Printf("m5%+.1f: %.4f mag\n", dm, observe.IvezicSigmaRand(24.35+dm, 24.35, 0.039))
	}
	// Output:
	// m5-2.5: 0.0221 mag
	// m5-1.0: 0.0811 mag
	// m5+0.0: 0.2000 mag
	// m5+1.0: 0.4986 mag
}

// An invented survey band ("wide-r" of an invented survey) with the Ivezić et
// al. 2019 noise model: the noise-free S/N is 5 at the 5σ depth and
// 1/0.0221 = 45.2 at m5 − 2.5 (check row lsst_sigma_rand_at_m5-2.5_gamma0.039).
func ExampleBandSpec_ExpectedSNR() {
	b := observe.BandSpec{Band: "wide-r", Limit5SigmaMag: 23.8, FloorMag: 0, SaturationMag: math.Inf(-1),
		Noise: observe.IvezicNoise(0.039)}
	if err := b.Validate(); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("S/N at m5: %.6f\n", b.ExpectedSNR(23.8))
	fmt.Printf("S/N at m5-2.5: %.1f\n", b.ExpectedSNR(21.3))
	// Output:
	// S/N at m5: 5.000000
	// S/N at m5-2.5: 45.2
}
