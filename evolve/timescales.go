package evolve

import "math"

// Timescales gives the ages (yr) at which a star passes each point of its
// evolution, and its fate. A phase the star skips has zero length: its start
// and end ages coincide (for example HeIgnitionYr = BGBYr for stars that ignite
// helium in the Hertzsprung gap, and HeIgnitionYr = EndCoreHeYr = EndAGBYr for
// stars that lose their envelope on the giant branch and end as helium white
// dwarfs). EndAGBYr is the end of nuclear evolution (for core-collapse
// progenitors the supernova).
type Timescales struct {
	MSLifetimeYr    float64 // end of core hydrogen burning (HPT eq. 5)
	BGBYr           float64 // end of the Hertzsprung gap / base of the giant branch (HPT eq. 4)
	HeIgnitionYr    float64 // helium ignition (tip of the giant branch)
	EndCoreHeYr     float64 // end of core helium burning
	EndAGBYr        float64 // end of the AGB (or of the supergiant phase), birth of the remnant
	Remnant         Stage   // final remnant
	RemnantMassMsun float64 // final remnant mass (0 for no_remnant)
}

// Timescales returns the ages of the evolutionary milestones and the final
// remnant of a star of initial mass massMsun (range as for Evolve).
func (m *Model) Timescales(massMsun float64) (Timescales, error) {
	if err := checkRange("mass", massMsun, "Msun", MinMassMsun, MaxMassMsun); err != nil {
		return Timescales{}, err
	}
	var t track
	m.initTrack(&t, massMsun)
	m.fill(&t)
	ts := Timescales{
		MSLifetimeYr: t.tMS * 1e6, BGBYr: t.tBGB * 1e6, HeIgnitionYr: t.tHeI * 1e6,
		EndCoreHeYr: (t.tHeI + t.tHe) * 1e6, EndAGBYr: t.tEnd * 1e6,
		Remnant: t.remnant, RemnantMassMsun: t.mRem,
	}
	if t.heWD {
		ts.EndCoreHeYr = ts.HeIgnitionYr
	}
	return ts, nil
}

// tBGBMyr is the time to the base of the giant branch, HPT eq. (4), in Myr.
func (h *hpt) tBGBMyr(m float64) float64 {
	s := math.Sqrt(m)
	m2 := m * m
	m4 := m2 * m2
	m7 := m4 * m2 * m
	a := &h.a
	return (a[1] + a[2]*m4 + a[3]*m4*m*s + m7) / (a[4]*m2 + a[5]*m7)
}

// tMSMyr is the main-sequence lifetime, HPT eqs. (5)–(7), in Myr.
func (h *hpt) tMSMyr(m, tBGB float64) float64 {
	a := &h.a
	mu := math.Max(0.5, 1-0.01*math.Max(a[6]/math.Pow(m, a[7]), a[8]+a[9]/math.Pow(m, a[10]))) // eq. (7)
	tHook := mu * tBGB                                                                         // eq. (5)
	return math.Max(tHook, h.x*tBGB)                                                           // eq. (5)
}
