package evolve

import "math"

// Main sequence: HPT 2000 §5.1 endpoints with this package's shapes, tabulated
// per metallicity (see msTable).

// msTable tabulates the main-sequence quantities of initTrack on a grid uniform
// in ln M from MinMassMsun to MaxMassMsun, so that Evolve needs no math.Pow on
// the main sequence. Linear interpolation in ln M of ln L, ln R, ln t (and of
// the wind rates) on 2048 nodes (Δ ln M = 3.7e-3) reproduces the formulae to
// better than 1e-5 relative, except within one node of a kink of the formulae
// (M_hook in t_MS, the R_TMS bridge), where the error stays below 1 per cent
// (TestMSTableAccuracy).
type msTable struct {
	lnM0, invDlnM float64
	v             [msTableN][msTableCols]float64
}

const (
	msTableN    = 2048
	msTableCols = 9 // ln lz, ln rz, ln lTMS, ln rTMS, ln tMS, ln tBGB, md0, md1, md2
)

func (m *Model) buildMSTable() {
	lo, hi := math.Log(MinMassMsun), math.Log(MaxMassMsun)
	d := (hi - lo) / (msTableN - 1)
	m.ms.lnM0, m.ms.invDlnM = lo, 1/d
	var t track
	for i := range msTableN {
		m.directMS(&t, math.Exp(lo+float64(i)*d))
		m.ms.v[i] = [msTableCols]float64{math.Log(t.lz), math.Log(t.rz), math.Log(t.lTMS), math.Log(t.rTMS),
			math.Log(t.tMS), math.Log(t.tBGB), t.md0, t.md1, t.md2}
	}
}

// initTrack fills what the main sequence needs, from the table.
func (m *Model) initTrack(t *track, mass float64) {
	x := (math.Log(mass) - m.ms.lnM0) * m.ms.invDlnM
	i := int(x)
	if i >= msTableN-1 {
		i = msTableN - 2
	}
	if i < 0 {
		i = 0
	}
	f := x - float64(i)
	a, b := &m.ms.v[i], &m.ms.v[i+1]
	var v [msTableCols]float64
	for k := range v {
		v[k] = a[k] + f*(b[k]-a[k])
	}
	t.m0 = mass
	t.lz, t.rz, t.lTMS, t.rTMS = math.Exp(v[0]), math.Exp(v[1]), math.Exp(v[2]), math.Exp(v[3])
	t.tMS, t.tBGB = math.Exp(v[4]), math.Exp(v[5])
	t.md0, t.md1, t.md2 = v[6], v[7], v[8]
	t.lnLRatio, t.lnRRatio = v[2]-v[0], v[3]-v[1]
}

// directMS evaluates the main-sequence quantities from the formulae.
func (m *Model) directMS(t *track, mass float64) {
	h := &m.h
	t.m0 = mass
	t.lz, t.rz = m.z.lumRad(mass)
	t.tBGB = h.tBGBMyr(mass)
	t.tMS = h.tMSMyr(mass, t.tBGB)
	t.lTMS = h.lTMS(mass)
	t.rTMS = math.Max(h.rTMS(mass), t.rz)
	t.lnLRatio, t.lnRRatio = math.Log(t.lTMS/t.lz), math.Log(t.rTMS/t.rz)
	t.md0, t.md1, t.md2 = 0, 0, 0
	if t.lTMS > 2000 { // winds matter only for luminous stars
		l, r := m.msLR(t, 0)
		t.md0 = mdotMsunPerMyr(l, r, mass, m.zWind, false)
		l, r = m.msLR(t, 0.5)
		t.md1 = mdotMsunPerMyr(l, r, mass, m.zWind, false)
		t.md2 = mdotMsunPerMyr(t.lTMS, t.rTMS, mass, m.zWind, false)
	}
}

// msLR gives L and R on the main sequence at fractional age τ = t/t_MS.
//
// HPT eqs. (12)–(13) have the form log(L/L_ZAMS) = α_L τ + β_L τ^η +
// (log(L_TMS/L_ZAMS) − α_L − β_L) τ² − ΔL(…) and a similar one for R, with
// mass-dependent α, β, Δ and a hook near the end of the MS. Their
// coefficients are not recalled, so this package uses the same endpoints with
// fixed shapes and no hook:
//
//	log(L/L_ZAMS) = log(L_TMS/L_ZAMS) (0.5 τ + 0.5 τ²)
//	log(R/R_ZAMS) = log(R_TMS/R_ZAMS) (0.4 τ + 0.6 τ³)
//
// checked against the present Sun and the Pecaut & Mamajek dwarf sequence.
func (m *Model) msLR(t *track, tau float64) (lumLsun, radiusRsun float64) {
	fl := 0.5*tau + 0.5*tau*tau
	fr := 0.4*tau + 0.6*tau*tau*tau
	lumLsun = t.lz * math.Exp(fl*t.lnLRatio)
	radiusRsun = t.rz * math.Exp(fr*t.lnRRatio)
	return
}

// cumLinear integrates exactly, from 0 to τ, a rate that is piecewise linear
// through its values r0, r1, r2 at τ = 0, 0.5, 1.
func cumLinear(r0, r1, r2, tau float64) float64 {
	if tau <= 0.5 {
		return r0*tau + (r1-r0)*tau*tau
	}
	u := tau - 0.5
	return 0.25*(r0+r1) + r1*u + (r2-r1)*u*u
}

// msMassLost is the mass lost by winds up to fractional MS age τ (cumLinear
// of the rates at τ = 0, 0.5, 1), capped at half the initial mass.
func (t *track) msMassLost(tau float64) float64 {
	return math.Min(cumLinear(t.md0, t.md1, t.md2, tau)*t.tMS, 0.5*t.m0)
}
