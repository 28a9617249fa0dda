package evolve

import "math"

// Giant-branch core-mass–luminosity relation and core growth,
// Hurley, Pols & Tout (2000) §5.3, eqs. (37)–(40):
//
//	L = min(B Mc^q, D Mc^p)                                  eq. (37)
//	dMc/dt = A L                                             eq. (39)
//	B = max(3e4, 500 + 1.75e4 M^0.6), q = 3                  eq. (38)
//	log10 D = 5.37 + 0.135 ζ,  p = 6 (M ≤ M_HeF) … 5 (M ≥ 2.5)
//
// HPT let D fall with mass above M_HeF; we keep D = D0 for all masses (the
// min() with B Mc^3 then governs massive cores) — a simplification, checked by
// the red-giant tip and AGB tests. The closed-form solution of eq. (39) on each
// branch, Mc^(1−n) = Mc0^(1−n) − (n−1) A K t, is HPT eq. (40).
type coreLum struct {
	b, d, p, q float64
	mx         float64 // crossover core mass where B Mc^q = D Mc^p
}

func newCoreLum(h *hpt, m float64) coreLum {
	c := coreLum{q: 3, d: math.Pow(10, h.logD0)}
	c.b = math.Max(3e4, 500+1.75e4*math.Pow(m, 0.6)) // eq. (38)
	switch {                                         // eq. (38): p
	case m <= h.mHeF:
		c.p = 6
	case m >= 2.5:
		c.p = 5
	default:
		c.p = 6 - (m-h.mHeF)/(2.5-h.mHeF)
	}
	c.mx = math.Pow(c.b/c.d, 1/(c.p-c.q))
	return c
}

// lum returns L (Lsun) for core mass mc (Msun), eq. (37).
func (c *coreLum) lum(mc float64) float64 {
	if mc < c.mx {
		if c.p == 6 { // degenerate cores: avoid math.Pow
			m3 := mc * mc * mc
			return c.d * m3 * m3
		}
		return c.d * math.Pow(mc, c.p)
	}
	return c.b * mc * mc * mc
}

// core inverts lum (q = 3 always).
func (c *coreLum) core(lumLsun float64) float64 {
	var dBranch float64
	if c.p == 6 {
		dBranch = math.Sqrt(math.Cbrt(lumLsun / c.d))
	} else {
		dBranch = math.Pow(lumLsun/c.d, 1/c.p)
	}
	return math.Max(math.Cbrt(lumLsun/c.b), dBranch)
}

// branchTime is the time for dMc/dt = A K Mc^n to take the core from m0 to m1.
func branchTime(k, n, a, m0, m1 float64) float64 {
	return (math.Pow(m0, 1-n) - math.Pow(m1, 1-n)) / ((n - 1) * a * k)
}

// branchCore is the core mass a time dt after m0 on one branch (eq. 40).
func branchCore(k, n, a, m0, dt float64) float64 {
	v := math.Pow(m0, 1-n) - (n-1)*a*k*dt
	if v <= 0 {
		return math.Inf(1)
	}
	return math.Pow(v, 1/(1-n))
}

// growTime returns the time (Myr) for the core to grow from m0 to m1 at rate
// constant a (Msun Lsun^-1 Myr^-1).
func (c *coreLum) growTime(a, m0, m1 float64) float64 {
	if m1 <= m0 {
		return 0
	}
	t := 0.0
	if m0 < c.mx {
		t += branchTime(c.d, c.p, a, m0, math.Min(m1, c.mx))
	}
	if m1 > c.mx {
		t += branchTime(c.b, c.q, a, math.Max(m0, c.mx), m1)
	}
	return t
}

// coreAfter returns the core mass a time dt (Myr) after it was m0.
func (c *coreLum) coreAfter(a, m0, dt float64) float64 {
	if m0 < c.mx {
		tx := branchTime(c.d, c.p, a, m0, c.mx)
		if dt < tx {
			return branchCore(c.d, c.p, a, m0, dt)
		}
		return branchCore(c.b, c.q, a, c.mx, dt-tx)
	}
	return branchCore(c.b, c.q, a, m0, dt)
}

// intLPow returns ∫ L(Mc)^e dMc from m0 to m1 (closed form on each branch),
// used by the analytic Reimers integral.
func (c *coreLum) intLPow(e, m0, m1 float64) float64 {
	f := func(k, n, lo, hi float64) float64 {
		g := n*e + 1
		return math.Pow(k, e) * (math.Pow(hi, g) - math.Pow(lo, g)) / g
	}
	s := 0.0
	if m0 < c.mx {
		s += f(c.d, c.p, m0, math.Min(m1, c.mx))
	}
	if m1 > c.mx {
		s += f(c.b, c.q, math.Max(m0, c.mx), m1)
	}
	return s
}

// rgbB3 is the exponent b3 of the giant-branch radius relation (see rGB).
const rgbB3 = 0.71

// hydrogenRate is HPT's A_H (Msun Lsun^-1 Myr^-1), eq. (43):
// log10 A_H = max(−4.8, min(−5.7 + 0.8 M, −4.1 + 0.14 M)).
func hydrogenRate(m float64) float64 {
	return math.Pow(10, math.Max(-4.8, math.Min(-5.7+0.8*m, -4.1+0.14*m)))
}

// heliumRate is HPT's A_He = 7.66e-5 Msun Lsun^-1 Myr^-1 (§5.4, from memory).
const heliumRate = 7.66e-5

// rGB is the giant-branch radius (Rsun) at luminosity lumLsun for current mass
// m, after HPT eq. (46), R_GB = A (L^b1 + b2 L^b3) with b1 = 0.4, b2 = 0.383,
// b3 = 0.71 and A = min(1.1 M^-0.3, 2 M^-0.5) — the ζ = 0 values as
// remembered (uncertain), times a metallicity factor 10^(0.04 ζ) of this package.
// The remembered b3 ≈ 0.76 put the solar-metallicity giant-branch tip at
// 2800 K, far cooler than observed (≈ 3300–3500 K, common practice); b3 = 0.71
// gives about 3300 K at the tip and 4300 K at 100 Lsun.
func (h *hpt) rGB(m, lumLsun float64) float64 {
	a := math.Min(1.1*math.Exp(-0.3*math.Log(m)), 2/math.Sqrt(m))
	lnL := math.Log(lumLsun)
	return h.rgbZFactor * a * (math.Exp(0.4*lnL) + 0.383*math.Exp(rgbB3*lnL))
}

// reimersRGBIntegral is ∫ R_GB(M=1, L(Mc)) dMc; with the mass factor
// 1.1 M^-0.3 it gives the Reimers integral in closed form.
func (h *hpt) reimersRGBIntegral(c *coreLum, m0, m1 float64) float64 {
	return h.rgbZFactor * 1.1 * (c.intLPow(0.4, m0, m1) + 0.383*c.intLPow(rgbB3, m0, m1))
}

// mcBGBHigh is the core mass at the base of the giant branch for M > M_HeF,
// HPT eq. (44): Mc = min(0.95 Mc,BAGB, (C^4 + c1 M^c2)^(1/4)), c1 = 9.20925e-5,
// c2 = 5.402216 (from memory), C the core mass at M_HeF.
func mcBGBHigh(c, m, mcBAGB float64) float64 {
	const c1, c2 = 9.20925e-5, 5.402216
	return math.Min(0.95*mcBAGB, math.Sqrt(math.Sqrt(c*c*c*c+c1*math.Pow(m, c2))))
}

// mcBAGB is the core mass at the base of the AGB, HPT eq. (66):
// Mc,BAGB = (b36 M^b37 + b38)^(1/4), b36 = 4.36e-4, b37 = 5.22, b38 = 0.0843
// (from memory, metallicity dependence not recalled and omitted). It gives
// 0.54 Msun at 1 Msun, 1.6 Msun at 6.3 Msun, 7.2 Msun at 20 Msun.
func mcBAGB(m float64) float64 {
	return math.Sqrt(math.Sqrt(4.36e-4*math.Pow(m, 5.22) + 0.0843))
}

// massForMcBAGB inverts mcBAGB.
func massForMcBAGB(mc float64) float64 {
	return math.Pow((mc*mc*mc*mc-0.0843)/4.36e-4, 1/5.22)
}

// fillRGB sets the first giant branch: its duration and the mass lost on it.
func (m *Model) fillRGB(t *track) {
	h := &m.h
	cl := &t.cl
	// First giant branch.
	t.kReimers = 4e-13 * reimersEta / (t.aH * 1e-6)
	t.mcStrip = t.mcHeI
	switch {
	case t.hgToHe:
		t.tRGB = 0
		t.mHeI = t.mBGB
	case t.degenerate:
		t.tRGB = cl.growTime(t.aH, t.mcBGB, t.mcHeI)
		t.mHeI = t.rgbMass(h, t.mcHeI)
		if t.mHeI <= t.mcHeI { // envelope lost before the flash: helium white dwarf
			lo, hi := t.mcBGB, t.mcHeI
			for range 40 {
				mid := 0.5 * (lo + hi)
				if t.rgbMass(h, mid) > mid {
					lo = mid
				} else {
					hi = mid
				}
			}
			t.heWD = true
			t.mcStrip = lo
			t.tRGB = cl.growTime(t.aH, t.mcBGB, lo)
			t.mHeI = lo
		}
	default:
		lm := math.Sqrt(t.lBGB * t.lHeI)
		// this package: ΔMc / (A_H ⟨L⟩), at least 1 per cent of t_MS so that
		// L rises continuously from L_BGB to L_HeI
		t.tRGB = math.Max((t.mcHeI-t.mcBGB)/(t.aH*lm), 0.01*t.tMS)
		rm := h.rGB(t.mBGB, lm)
		t.mHeI = math.Max(t.mBGB-t.tRGB*mdotMsunPerMyr(lm, rm, t.mBGB, m.zWind, true), t.mcHeI)
	}
	t.mcHeI = math.Min(t.mcHeI, t.mHeI)
	t.tHeI = t.tBGB + t.tRGB
}

// rgbMass is the mass on a degenerate-core giant branch when the core has grown
// to mc: the closed-form Reimers integral (massloss.go).
func (t *track) rgbMass(h *hpt, mc float64) float64 {
	v := math.Pow(t.mBGB, 2.3) - 2.3*t.kReimers*h.reimersRGBIntegral(&t.cl, t.mcBGB, mc)
	if v <= 0 {
		return 0
	}
	return math.Pow(v, 1/2.3)
}
