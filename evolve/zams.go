package evolve

import "math"

// Zero-age main sequence of Tout, Pols, Eggleton & Han (1996, MNRAS 281, 257).
//
// Eq. (1):  L_ZAMS = (α M^5.5 + β M^11) / (γ + M^3 + δ M^5 + ε M^7 + ζ M^8 + η M^9.5)
// Eq. (2):  R_ZAMS = (θ M^2.5 + ι M^6.5 + κ M^11 + λ M^19 + μ M^19.5) /
//                    (ν + ξ M^2 + ο M^8.5 + M^18.5 + π M^19.5)
// Eq. (3):  every coefficient is a quartic in log10(Z/0.02).
//
// The coefficients of Tables 1 and 2 were written from memory by the author of
// the project's reference table (evolution_formulae_values.tsv, copied to
// testdata/); they reproduce L = 0.698 Lsun, R = 0.888 Rsun for the zero-age
// Sun and are checked by the physical tests (ZAMS Teff, dwarf sequence).
// Valid for 0.1–100 Msun, Z = 1e-4–0.03; 0.08–0.1 and 100–150 Msun are
// extrapolations of the same rational functions.

// toutLCoef: Table 1 (L), rows α β γ δ ε ζ η, columns z^0 … z^4.
var toutLCoef = [7][5]float64{
	{0.39704170, -0.32913574, 0.34776688, 0.37470851, 0.09011915},    // α
	{8.52762600, -24.41225973, 56.43597107, 37.06152575, 5.45624060}, // β
	{0.00025546, -0.00123461, -0.00023246, 0.00045519, 0.00016176},   // γ
	{5.43288900, -8.62157806, 13.44202049, 14.51584135, 3.39793084},  // δ
	{5.56357900, -10.32345224, 19.44322980, 18.97361347, 4.16903097}, // ε
	{0.78866060, -2.90870942, 6.54713531, 4.05606657, 0.53287322},    // ζ
	{0.00586685, -0.01704237, 0.03872348, 0.02570041, 0.00383376},    // η
}

// toutRCoef: Table 2 (R), rows θ ι κ λ μ ν ξ ο π, columns z^0 … z^4.
var toutRCoef = [9][5]float64{
	{1.71535900, 0.62246212, -0.92557761, -1.16996966, -0.30631491},     // θ
	{6.59778800, -0.42450044, -12.13339427, -10.73509484, -2.51487077},  // ι
	{10.08855000, -7.11727086, -31.67119479, -24.24848322, -5.33608972}, // κ
	{1.01249500, 0.32699690, -0.00923418, -0.03876858, -0.00412750},     // λ
	{0.07490166, 0.02410413, 0.07233664, 0.03040467, 0.00197741},        // μ
	{0.01077422, 0, 0, 0, 0}, // ν
	{3.08223400, 0.94472050, -2.15200882, -2.49219496, -0.63848738},     // ξ
	{17.84778000, -7.45345690, -48.96066856, -40.05386135, -9.09331816}, // ο
	{0.00022582, -0.00186899, 0.00388783, 0.00142402, -0.00007671},      // π
}

// zams holds the Tout et al. (1996) coefficients evaluated at one Z (eq. 3).
type zams struct {
	l [7]float64
	r [9]float64
}

func newZAMS(zeta float64) zams {
	var z zams
	for i, c := range toutLCoef {
		z.l[i] = poly4(c, zeta) // Tout et al. 1996 eq. (3)
	}
	for i, c := range toutRCoef {
		z.r[i] = poly4(c, zeta) // Tout et al. 1996 eq. (3)
	}
	return z
}

func poly4(c [5]float64, x float64) float64 {
	return c[0] + x*(c[1]+x*(c[2]+x*(c[3]+x*c[4])))
}

// lumRad returns L_ZAMS (Lsun) and R_ZAMS (Rsun) for mass m (Msun),
// Tout et al. 1996 eqs. (1) and (2). Powers are built from √m to avoid math.Pow.
func (z *zams) lumRad(m float64) (lumLsun, radiusRsun float64) {
	s := math.Sqrt(m)
	m2 := m * m
	m3 := m2 * m
	m5 := m3 * m2
	m7 := m5 * m2
	m8 := m7 * m
	m11 := m8 * m3
	m19 := m11 * m8
	c := &z.l
	lumLsun = (c[0]*m5*s + c[1]*m11) / (c[2] + m3 + c[3]*m5 + c[4]*m7 + c[5]*m8 + c[6]*m8*m*s) // eq. (1)
	r := &z.r
	m18h := m11 * m7 * s // M^18.5
	radiusRsun = (r[0]*m2*s + r[1]*m5*m*s + r[2]*m11 + r[3]*m19 + r[4]*m19*s) /
		(r[5] + r[6]*m2 + r[7]*m8*s + m18h + r[8]*m19*s) // eq. (2)
	return lumLsun, radiusRsun
}
