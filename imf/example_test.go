package imf_test

import (
	"fmt"
	"math/rand/v2"

	"github.com/starmock/starmock/imf"
)

// The mean mass and the mass fraction above 1 Msun of the Kroupa (2001) IMF
// on 0.08–100 Msun. Check values: population_values.tsv rows
// kroupa_mean_mass_0.08-100 = 0.5739 and
// kroupa_mass_fraction_above_1Msun_0.08-100 = 0.5501 (computed there by
// numerical integration; not published numbers).
func ExampleNewKroupa() {
	f, err := imf.NewKroupa(0.08, 100)
	if err != nil {
		panic(err)
	}
	fmt.Printf("mean mass %.4f Msun\n", f.Mean())
	fmt.Printf("mass fraction above 1 Msun %.4f\n", f.MassFraction(1, 100))
	fmt.Printf("stars above 8 Msun per Msun formed %.5f\n", imf.ExpectedNumberAbove(f, 8))
	// Output:
	// mean mass 0.5739 Msun
	// mass fraction above 1 Msun 0.5501
	// stars above 8 Msun per Msun formed 0.01093
}

// Build a mass function from a declarative spec, as a scenario file does.
func ExampleNew() {
	f, err := imf.New(imf.Spec{Kind: "broken_power_law", Breaks: []float64{0.5}, Slopes: []float64{1.3, 2.3}, LoMsun: 0.1, HiMsun: 100})
	if err != nil {
		panic(err)
	}
	lo, hi := f.Bounds()
	fmt.Printf("%s on [%g, %g] Msun, median %.3f Msun\n", f.Name(), lo, hi, f.Quantile(0.5))
	// Output:
	// broken_power_law on [0.1, 100] Msun, median 0.276 Msun
}

// Sample the stars of an invented 1000 Msun cluster ("Harrowgate 4") with
// the stop-nearest rule; the realised total is within half a stellar mass
// of the target.
func ExampleSampleTotalMass() {
	f, err := imf.NewChabrier(imf.ChabrierSingle, 0.08, 120)
	if err != nil {
		panic(err)
	}
	r := rand.New(rand.NewPCG(2026, 1))
	masses, total := imf.SampleTotalMass(f, 1000, r, nil)
	fmt.Println(len(masses) > 0, total > 1000-60 && total < 1000+60)
	// Output:
	// true true
}
