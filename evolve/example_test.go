package evolve_test

import (
	"fmt"

	"github.com/starmock/starmock/evolve"
)

// The present Sun: 1 Msun at solar metallicity and 4.57 Gyr (IAU 2015 nominal
// values L = 1 Lsun, Teff = 5772 K, R = 1 Rsun; the model is within 4 %).
func ExampleModel_Evolve() {
	m, err := evolve.NewModel(evolve.ZFromFeH(0))
	if err != nil {
		panic(err)
	}
	s, err := m.Evolve(1, 4.57e9)
	if err != nil {
		panic(err)
	}
	fmt.Printf("%s: L = %.2f Lsun, Teff = %.0f K, R = %.2f Rsun, log g = %.2f\n",
		s.Stage, s.LuminosityLsun, s.TeffK, s.RadiusRsun, s.LoggCgs)
	// Output:
	// main_sequence: L = 0.97 Lsun, Teff = 5702 K, R = 1.01 Rsun, log g = 4.43
}

// The milestones and fate of a 2 Msun star of [Fe/H] = −1 (this model's
// values, pinned as a regression; the physics is tested in evolve_test.go).
func ExampleModel_Timescales() {
	m, err := evolve.NewModel(evolve.ZFromFeH(-1))
	if err != nil {
		panic(err)
	}
	ts, err := m.Timescales(2)
	if err != nil {
		panic(err)
	}
	fmt.Printf("main sequence ends at %.2f Gyr, helium ignites at %.2f Gyr\n", ts.MSLifetimeYr/1e9, ts.HeIgnitionYr/1e9)
	fmt.Printf("fate: %s of %.2f Msun\n", ts.Remnant, ts.RemnantMassMsun)
	// Output:
	// main sequence ends at 0.85 Gyr, helium ignites at 0.86 Gyr
	// fate: carbon_oxygen_white_dwarf of 0.65 Msun
}

// Converting [Fe/H] to the metal mass fraction of the fits (X = 0.76 − 3Z).
func ExampleZFromFeH() {
	for _, feh := range []float64{-2, -1, 0, 0.15} {
		fmt.Printf("[Fe/H] = %+.2f → Z = %.5f\n", feh, evolve.ZFromFeH(feh))
	}
	// Output:
	// [Fe/H] = -2.00 → Z = 0.00022
	// [Fe/H] = -1.00 → Z = 0.00215
	// [Fe/H] = +0.00 → Z = 0.02000
	// [Fe/H] = +0.15 → Z = 0.02736
}
