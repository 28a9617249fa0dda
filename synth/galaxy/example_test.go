package galaxy_test

import (
	"fmt"
	"math/rand/v2"

	"github.com/starmock/starmock/synth/galaxy"
)

// The north Galactic pole in FK5 J2000 (astropy 5.2.1, Galactic frame constant) lies at
// b = 90° to within the frame bias of the ICRS (about 0.02″).
func ExampleICRSToGalactic() {
	_, b := galaxy.ICRSToGalactic(galaxy.NGPRAJ2000Deg, galaxy.NGPDecJ2000Deg)
	fmt.Printf("b = %.5f deg\n", b)
	// Output: b = 90.00000 deg
}

// The Galactic centre direction (l, b) = (0, 0) in ICRS, as astropy 5.2.1 gives it
// (testdata/coords_astropy.tsv, row gal2icrs 0 0), to 1e-6 deg.
func ExampleGalacticToICRS() {
	ra, dec := galaxy.GalacticToICRS(0, 0)
	fmt.Printf("ra = %.6f deg, dec = %.6f deg\n", ra, dec)
	// Output: ra = 266.404988 deg, dec = -28.936178 deg
}

// Expected stellar mass per component in three distance shells of a 10 deg² field at high
// latitude, for the default model (a regression example: values printed to 3 digits).
func ExampleModel_ShellMasses() {
	m := galaxy.DefaultModel()
	cone, err := galaxy.NewCone(45, 60, 1.784124)
	if err != nil {
		panic(err)
	}
	shells, err := galaxy.MakeShells(100, 100000, 3, galaxy.LogSpacing)
	if err != nil {
		panic(err)
	}
	res, err := m.ShellMasses(cone, shells, []string{galaxy.ThinDiscName, galaxy.ThickDiscName, galaxy.HaloName}, galaxy.IntegrationOptions{})
	if err != nil {
		panic(err)
	}
	for _, r := range res {
		fmt.Printf("%6.0f-%6.0f pc %-10s %.3g Msun\n", r.Shell.InnerPc, r.Shell.OuterPc, r.Component, r.PresentMassMsun)
	}
	// Output:
	//    100-  1000 pc thin_disc  5.35e+03 Msun
	//    100-  1000 pc thick_disc 2.41e+03 Msun
	//    100-  1000 pc halo       208 Msun
	//   1000- 10000 pc thin_disc  4.98e+03 Msun
	//   1000- 10000 pc thick_disc 3.82e+04 Msun
	//   1000- 10000 pc halo       7.69e+04 Msun
	//  10000-100000 pc thin_disc  3.16e-06 Msun
	//  10000-100000 pc thick_disc 229 Msun
	//  10000-100000 pc halo       3.75e+05 Msun
}

// Poisson numbers and positions of halo stars in one shell of a cone.
func ExampleShellSampler() {
	m := galaxy.DefaultModel()
	cone, _ := galaxy.NewCone(45, 60, 1.784124)
	s, err := m.NewShellSampler(cone, galaxy.Shell{InnerPc: 1000, OuterPc: 30000}, galaxy.HaloName)
	if err != nil {
		panic(err)
	}
	r := rand.New(rand.NewPCG(1, 2))
	n, _ := galaxy.PoissonCount(3.5, r)
	for i := int64(0); i < n; i++ {
		l, b, d, err := s.Sample(r)
		if err != nil {
			panic(err)
		}
		_ = cone.Contains(l, b) && d >= 1000 // every draw is inside the cone and the shell
	}
	fmt.Println("drew", n, "halo positions")
	// Output: drew 4 halo positions
}
