package evolve

import "math"

// wdLum is the Mestel-type cooling law of HPT 2000 eq. (90):
// L = 635 M Z^0.4 / [A (t + 0.1)]^1.4 with t in Myr and A the mean ion mass
// number (4 He, 12 CO, 16 ONe).
func wdLum(st Stage, massMsun, metallicityZ, coolMyr float64) float64 {
	a := 12.0
	switch st {
	case HeliumWhiteDwarf:
		a = 4
	case OxygenNeonWhiteDwarf:
		a = 16
	}
	return 635 * massMsun * math.Pow(metallicityZ, 0.4) / math.Pow(a*(coolMyr+0.1), 1.4)
}

// wdRadius is the white-dwarf mass–radius relation of HPT 2000 eq. (91)
// (after Tout et al. 1997): R = max(R_NS, 0.0115 √((M_Ch/M)^(2/3) − (M/M_Ch)^(2/3))).
func wdRadius(massMsun float64) float64 {
	x := math.Cbrt(chandrasekharMsun / massMsun)
	x *= x
	return math.Max(rNSRsun, 0.0115*math.Sqrt(math.Max(x-1/x, 0)))
}
