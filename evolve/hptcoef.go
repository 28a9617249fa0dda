package evolve

import "math"

// Coefficients of Hurley, Pols & Tout (2000, MNRAS 315, 543; "HPT"), Appendix:
// every a_n is α + β ζ + γ ζ² + η ζ³ + μ ζ⁴ with ζ = log10(Z/0.02).
//
// a1–a10 are the rows of the project's reference table (written from memory by
// its author). a11–a32 were written from memory by this package's author; they
// are marked so and are checked by the physical tests (the Sun, lifetimes,
// the dwarf sequence, giant radii), not against the printed table. The
// "post-processing" steps HPT apply after the polynomials (a11, a12 scaled by
// a14; a18, a19 by a20; a29 raised to a32) are likewise from memory.
var hptA = [33][5]float64{
	1:  {1.593890e3, 2.053038e3, 1.231226e3, 2.327785e2, 0},       // t_BGB, eq. (4)
	2:  {2.706708e3, 1.483131e3, 5.772723e2, 7.411230e1, 0},       // t_BGB
	3:  {1.466143e2, -1.048442e2, -6.795374e1, -1.391127e1, 0},    // t_BGB
	4:  {4.141960e-2, 4.564888e-2, 2.958542e-2, 5.571483e-3, 0},   // t_BGB
	5:  {3.426349e-1, 0, 0, 0, 0},                                 // t_BGB
	6:  {1.949814e1, 1.758178, -6.008212, -4.470533, 0},           // μ, eq. (7)
	7:  {4.903830, 0, 0, 0, 0},                                    // μ
	8:  {5.212154e-2, 3.166411e-2, -2.750074e-3, -2.271549e-3, 0}, // μ
	9:  {1.312179, -3.294936e-1, 9.231860e-2, 2.610989e-2, 0},     // μ
	10: {8.073972e-1, 0, 0, 0, 0},                                 // μ
	// L_TMS, eq. (8) — from memory.
	11: {1.031538, -2.434480e-1, 7.732821, 6.460705, 1.374484},
	12: {1.043715, -1.577474, -5.168234, -5.596506, -1.299394},
	13: {7.859573e2, -8.542048, -2.642511e1, -9.585707, 0},
	14: {3.858911e3, 2.459681e3, -7.630093e1, -3.486057e2, -4.861703e1},
	15: {2.888720e2, 2.952979e2, 1.850341e2, 3.797254e1, 0},
	16: {7.196580, 5.613746e-1, 3.805871e-1, 8.398728e-2, 0},
	// R_TMS, eq. (9) — from memory (a17 is a separate function of log Z).
	18: {2.187715e-1, -2.154437, -3.768678, -1.975518, -3.021475e-1},
	19: {1.466440, 1.839725, 6.442199, 4.023635, 6.957529e-1},
	20: {2.652091e1, 8.178458e1, 1.156058e2, 7.633811e1, 1.950698e1},
	21: {1.472103, -2.947609, -3.312828, -9.945065e-1, 0},
	22: {3.071048, -5.679941, -9.745523, -3.594543, 0},
	23: {2.617890, 1.019135, -3.292551e-2, -7.445123e-2, 0},
	24: {1.075567e-2, 1.773287e-2, 9.610479e-3, 1.732469e-3, 0},
	25: {1.476246, 1.899331, 1.195010, 3.035051e-1, 0},
	26: {5.502535, -6.601663e-2, 9.968707e-2, 3.599801e-2, 0},
	// L_BGB, eq. (10) — from memory.
	27: {9.511033e1, 6.819618e1, -1.045625e1, -1.474939e1, 0},
	28: {3.113458e1, 1.012033e1, -4.650511, -2.463185, 0},
	29: {1.413057, 4.578814e-1, -6.850581e-2, -5.588658e-2, 0},
	30: {3.910862e1, 5.196646e1, 2.264970e1, 2.873680, 0},
	31: {4.597479, -2.855179e-1, 2.709724e-1, 0, 0},
	32: {6.682518, 2.827718e-1, -7.294429e-2, 0, 0},
}

// hpt holds HPT quantities that depend only on Z.
type hpt struct {
	a          [33]float64
	x          float64 // fraction of t_BGB on the MS, eq. (6)
	mHook      float64 // eq. (1)
	mHeF       float64 // eq. (2)
	mFGB       float64 // eq. (3)
	logD0      float64 // giant-branch core-mass–luminosity constant, eq. (38)
	b9, b10    float64 // L_HeI for M ≤ M_HeF, eq. (49)
	rgbZFactor float64 // metallicity factor on R_GB (this package's approximation)
}

func newHPT(metallicityZ float64) hpt {
	zeta := math.Log10(metallicityZ / SolarZ)
	sigma := math.Log10(metallicityZ)
	var h hpt
	for i := 1; i < len(hptA); i++ {
		h.a[i] = poly4(hptA[i], zeta)
	}
	h.a[11] *= h.a[14] // HPT Appendix post-processing (from memory)
	h.a[12] *= h.a[14]
	// a17, HPT Appendix (from memory): log a17 = max(0.097 − 0.1072(σ+3), max(0.097, min(0.1461, 0.1461 + 0.1237(σ+2))))
	h.a[17] = math.Pow(10, math.Max(0.097-0.1072*(sigma+3), math.Max(0.097, math.Min(0.1461, 0.1461+0.1237*(sigma+2)))))
	h.a[18] *= h.a[20]
	h.a[19] *= h.a[20]
	h.a[29] = math.Pow(h.a[29], h.a[32])
	h.x = math.Max(0.95, math.Min(0.95-0.03*(zeta+0.30103), 0.99)) // eq. (6)
	h.mHook = 1.0185 + 0.16015*zeta + 0.0892*zeta*zeta             // eq. (1)
	h.mHeF = 1.995 + 0.25*zeta + 0.087*zeta*zeta                   // eq. (2)
	h.mFGB = 13.048 * math.Pow(metallicityZ/SolarZ, 0.06) /
		(1 + 0.0012*math.Pow(SolarZ/metallicityZ, 1.27)) // eq. (3)
	h.logD0 = 5.37 + 0.135*zeta // eq. (38), from memory
	// eq. (49) low-mass branch, from memory: b9 = 2.751631e3 + 3.557098e2 ζ, b10 = −3.820831e-2 + 5.872664e-2 ζ
	h.b9 = 2.751631e3 + 3.557098e2*zeta
	h.b10 = -3.820831e-2 + 5.872664e-2*zeta
	// Metal-poor giants are hotter at a given L. HPT's R_GB coefficients carry
	// this; we do not recall them, so R_GB is scaled by 10^(0.04 ζ)
	// (≈ 17 per cent smaller at ζ = −2), an approximation of this package.
	h.rgbZFactor = math.Pow(10, 0.04*zeta)
	return h
}

// lTMS is the luminosity at the end of the main sequence, HPT eq. (8), in Lsun.
func (h *hpt) lTMS(m float64) float64 {
	a := &h.a
	m3 := m * m * m
	p16 := math.Pow(m, a[16])
	return (a[11]*m3 + a[12]*m3*m + a[13]*p16*math.Pow(m, 1.8)) / (a[14] + a[15]*m3*m*m + p16)
}

// rTMS is the radius at the end of the main sequence, HPT eq. (9), in Rsun,
// with the linear bridge between M = a17 and a17 + 0.1 that HPT use.
func (h *hpt) rTMS(m float64) float64 {
	a := &h.a
	low := func(m float64) float64 {
		return (a[18] + a[19]*math.Pow(m, a[21])) / (a[20] + math.Pow(m, a[22]))
	}
	high := func(m float64) float64 {
		const c1 = -8.672073e-2
		p := math.Pow(m, a[26])
		m3 := m * m * m
		return (c1*m3 + a[23]*p + a[24]*p*m*math.Sqrt(m)) / (a[25] + m3*m*m)
	}
	m1, m2 := a[17], a[17]+0.1
	if low(m1) > high(m2) {
		// Deviation from HPT: with the remembered coefficients the low-mass
		// branch overshoots at low Z (R_TMS falls by up to a factor 3 across the
		// bridge at Z = 1e-4). There the bridge starts at min(1, a17) Msun and
		// is geometric, so R_TMS stays continuous and bounded.
		m1 = math.Min(1, a[17])
		if m > m1 && m < m2 {
			r0, r1 := low(m1), high(m2)
			return r0 * math.Pow(r1/r0, (m-m1)/(m2-m1))
		}
	}
	switch {
	case m <= m1:
		return low(m)
	case m >= m2:
		return high(m)
	default:
		r0, r1 := low(m1), high(m2)
		return r0 + (r1-r0)*(m-m1)/(m2-m1)
	}
}

// lBGB is the luminosity at the base of the giant branch, HPT eq. (10), in Lsun.
func (h *hpt) lBGB(m float64) float64 {
	const c2, c3 = 9.301992, 4.637345 // HPT eq. (10), from memory
	a := &h.a
	return (a[27]*math.Pow(m, a[31]) + a[28]*math.Pow(m, c2)) /
		(a[29] + a[30]*math.Pow(m, c3) + math.Pow(m, a[32]))
}
