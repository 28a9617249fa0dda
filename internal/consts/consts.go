// Package consts holds the physical constants and nominal solar values that every
// starmock package shares, each with its source, so no package carries its own copy.
//
// References
//
//   - IAU 2015 Resolution B3: Prša et al. 2016, AJ 152, 41 (nominal solar values).
//   - IAU 2015 Resolution B2: Mamajek et al. 2015, arXiv:1510.06262 (bolometric zero points, parsec).
//   - CODATA 2018: Tiesinga et al. 2021, Rev. Mod. Phys. 93, 025010 (σ_SB); SI 2019 exact h, c, k_B.
package consts

import "math"

// Nominal solar values (IAU 2015 Resolution B3), SI units.
const (
	RSunM      = 6.957e8        // nominal solar radius, m
	LSunW      = 3.828e26       // nominal solar luminosity, W
	TeffSunK   = 5772.0         // nominal solar effective temperature, K
	GMSunM3S2  = 1.3271244e20   // nominal solar mass parameter, m^3 s^-2
	SSunWM2    = 1361.0         // nominal total solar irradiance, W m^-2
	LogGSunCgs = 4.438067627    // log10 of GM/R^2 in cgs for the nominal Sun (derived from the two rows above)
	MBolSun    = 4.74           // bolometric absolute magnitude of the nominal Sun (IAU 2015 B2, rounded)
	L0BolW     = 3.0128e28      // luminosity of M_bol = 0 (IAU 2015 B2), W
	F0BolWM2   = 2.518021002e-8 // irradiance of m_bol = 0 (IAU 2015 B2), W m^-2
)

// Physical constants (SI 2019 exact values and CODATA 2018).
const (
	SigmaSB    = 5.670374419e-8        // Stefan–Boltzmann constant, W m^-2 K^-4 (CODATA 2018)
	C          = 299792458.0           // speed of light, m s^-1 (exact)
	H          = 6.62607015e-34        // Planck constant, J s (exact)
	KB         = 1.380649e-23          // Boltzmann constant, J K^-1 (exact)
	AU         = 149597870700.0        // astronomical unit, m (IAU 2012 B2)
	Parsec     = 3.0856775814913673e16 // parsec, m: (648000/π) au (IAU 2015 B2)
	YearJulian = 31557600.0            // Julian year, s
	ABZeroJy   = 3631.0                // AB magnitude zero point, Jy (Oke & Gunn 1983)
	Jansky     = 1e-26                 // W m^-2 Hz^-1
)

// MBol returns the bolometric absolute magnitude of a star of luminosity lumLsun
// (in nominal solar luminosities) on the IAU 2015 Resolution B2 scale:
//
//	M_bol = −2.5 log10(L / L0),  L0 = 3.0128e28 W
//
// which gives 4.7400 for the nominal Sun. lumLsun must be positive.
func MBol(lumLsun float64) float64 {
	return -2.5 * math.Log10(lumLsun*LSunW/L0BolW)
}

// TeffFromLR returns the effective temperature in K of a star of luminosity lumLsun
// and radius radiusRsun (nominal solar units), from L = 4π R² σ T⁴.
func TeffFromLR(lumLsun, radiusRsun float64) float64 {
	r := radiusRsun * RSunM
	return math.Pow(lumLsun*LSunW/(4*math.Pi*r*r*SigmaSB), 0.25)
}

// LoggCgs returns log10 of the surface gravity in cm s^-2 of a star of mass massMsun
// and radius radiusRsun, using the nominal GM_sun (IAU 2015 B3).
func LoggCgs(massMsun, radiusRsun float64) float64 {
	r := radiusRsun * RSunM
	g := GMSunM3S2 * massMsun / (r * r) // m s^-2
	return math.Log10(g * 100)
}

// DistanceModulus returns μ = 5 log10(d / 10 pc) for a distance in parsecs.
func DistanceModulus(distancePc float64) float64 {
	return 5*math.Log10(distancePc) - 5
}

// DistanceFromModulus returns the distance in parsecs for a distance modulus μ in mag.
func DistanceFromModulus(mu float64) float64 {
	return 10 * math.Pow(10, mu/5)
}

// PlanckLambda returns the blackbody spectral radiance B_λ(T) in W m^-3 sr^-1 at
// vacuum wavelength lambdaM (m) and temperature tK (K) (Planck 1901):
//
//	B_λ = 2hc² / λ⁵ / (exp(hc/λkT) − 1)
func PlanckLambda(lambdaM, tK float64) float64 {
	x := H * C / (lambdaM * KB * tK)
	return 2 * H * C * C / math.Pow(lambdaM, 5) / math.Expm1(x)
}

// PlanckNu returns the blackbody spectral radiance B_ν(T) in W m^-2 Hz^-1 sr^-1 at
// frequency nuHz (Hz) and temperature tK (K) (Planck 1901):
//
//	B_ν = 2hν³ / c² / (exp(hν/kT) − 1)
func PlanckNu(nuHz, tK float64) float64 {
	x := H * nuHz / (KB * tK)
	return 2 * H * nuHz * nuHz * nuHz / (C * C) / math.Expm1(x)
}
