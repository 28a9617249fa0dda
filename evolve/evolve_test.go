package evolve_test

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/starmock/starmock/evolve"
)

func model(t testing.TB, z float64) *evolve.Model {
	t.Helper()
	m, err := evolve.NewModel(z)
	if err != nil {
		t.Fatalf("NewModel(%g): %v", z, err)
	}
	return m
}

func evolveAt(t testing.TB, m *evolve.Model, massMsun, ageYr float64) evolve.Star {
	t.Helper()
	s, err := m.Evolve(massMsun, ageYr)
	if err != nil {
		t.Fatalf("Evolve(%g, %g): %v", massMsun, ageYr, err)
	}
	return s
}

func timescales(t testing.TB, m *evolve.Model, massMsun float64) evolve.Timescales {
	t.Helper()
	ts, err := m.Timescales(massMsun)
	if err != nil {
		t.Fatalf("Timescales(%g): %v", massMsun, err)
	}
	return ts
}

// within reports whether got lies in [lo, hi] and, if not, fails with the source.
func within(t *testing.T, what string, got, lo, hi float64, source string) {
	t.Helper()
	if !(got >= lo && got <= hi) {
		t.Errorf("%s = %.4g, want in [%.4g, %.4g] (%s)", what, got, lo, hi, source)
	}
}

// TestSun: 1 Msun at solar metallicity and the solar age.
func TestSun(t *testing.T) {
	t.Parallel()
	q := quantities(t, "testdata/evolution_formulae_values.tsv")
	age := num(t, q["age_sun_seismic"]) * 1e9 // 4.57 Gyr (helioseismic; meteoritic age common practice)
	for _, z := range []float64{evolve.SolarZ, evolve.ZFromFeH(0)} {
		s := evolveAt(t, model(t, z), 1, age)
		if s.Stage != evolve.MainSequence {
			t.Errorf("Sun stage %v, want main_sequence", s.Stage)
		}
		// IAU 2015 Resolution B3 nominal values; tolerances from the issue:
		// 15 % in L, 3 % in Teff, 10 % in R (HPT claim ~5 %; our MS shapes are simplified).
		within(t, "L_sun", s.LuminosityLsun, 0.85, 1.15, "IAU 2015 B3 nominal L, ±15 %")
		within(t, "Teff_sun", s.TeffK, 5772*0.97, 5772*1.03, "IAU 2015 B3 nominal Teff 5772 K, ±3 %")
		within(t, "R_sun", s.RadiusRsun, 0.9, 1.1, "IAU 2015 B3 nominal R, ±10 %")
		within(t, "logg_sun", s.LoggCgs, 4.438-0.1, 4.438+0.1, "IAU 2015 B3 nominal log g 4.438, ±0.1 dex from the R tolerance")
	}
	// Zero-age Sun: 0.70 ± 0.02 Lsun (common practice; Tout et al. 1996 fit 0.698).
	zs := evolveAt(t, model(t, 0.02), 1, 0)
	within(t, "L_ZAMS(1 Msun)", zs.LuminosityLsun, num(t, q["L_ZAMS_sun"])-0.02, num(t, q["L_ZAMS_sun"])+0.02, "common practice 0.70 ± 0.02 Lsun")
}

// TestMainSequenceLifetimes: the steep fall of t_MS with mass (common practice;
// no table of detailed-model lifetimes is in the reference folder).
func TestMainSequenceLifetimes(t *testing.T) {
	t.Parallel()
	m := model(t, 0.02)
	cases := []struct {
		mass, loYr, hiYr float64
		src              string
	}{
		// 10 Gyr is the rounded textbook value; detailed solar models give 9–12 Gyr
		// depending on overshooting and composition (from memory), HPT give 11 Gyr.
		{1, 9e9, 12e9, "common practice: about 10 Gyr"},
		{0.1, 1e11, math.Inf(1), "common practice: above 1e11 yr at 0.1–0.2 Msun"},
		{0.2, 1e11, math.Inf(1), "common practice: above 1e11 yr at 0.1–0.2 Msun"},
		{10, 10e6, 30e6, "common practice: about 10–20 Myr at 10–15 Msun (10 Msun at the long end)"},
		{12.5, 10e6, 20e6, "common practice: about 10–20 Myr at 10–15 Msun"},
		{15, 10e6, 20e6, "common practice: about 10–20 Myr at 10–15 Msun"},
		{40, 2e6, 6e6, "common practice: a few Myr above 40 Msun"},
		{100, 2e6, 6e6, "common practice: a few Myr above 40 Msun"},
	}
	for _, c := range cases {
		within(t, "t_MS", timescales(t, m, c.mass).MSLifetimeYr, c.loYr, c.hiYr, c.src)
	}
	// Rough scaling t ≈ 10 Gyr M^-2.5 within its stated factor of 2 for 0.8–3 Msun
	// (evolution_formulae_values.tsv, ms_lifetime_scaling_rule, common practice).
	for _, ms := range []float64{0.8, 1.2, 1.5, 2, 3} {
		want := 1e10 * math.Pow(ms, -2.5)
		within(t, "t_MS/scaling", timescales(t, m, ms).MSLifetimeYr/want, 0.5, 2, "t ~ 10 Gyr M^-2.5, factor 2")
	}
	prev := math.Inf(1)
	for ms := 0.1; ms <= 100; ms *= 1.05 {
		tms := timescales(t, m, ms).MSLifetimeYr
		if tms >= prev {
			t.Errorf("t_MS not decreasing with mass at %.3g Msun", ms)
		}
		prev = tms
	}
}

// TestZAMSTemperatures: O stars hot, Sun-like near 5700 K, M dwarfs cool.
func TestZAMSTemperatures(t *testing.T) {
	t.Parallel()
	m := model(t, 0.02)
	within(t, "Teff_ZAMS(20 Msun)", evolveAt(t, m, 20, 0).TeffK, 30000, 60000, "common practice: ≳ 30 000 K for O stars above 16–20 Msun")
	within(t, "Teff_ZAMS(16 Msun)", evolveAt(t, m, 16, 0).TeffK, 29000, 60000, "common practice: about 30 000 K near 16 Msun")
	// The issue quotes 5700–5800 K "near 1 Msun"; detailed solar models start
	// at about 5600–5650 K (from memory), so we allow 3 % around 5750 K.
	within(t, "Teff_ZAMS(1 Msun)", evolveAt(t, m, 1, 0).TeffK, 5750*0.97, 5750*1.03, "common practice: 5700–5800 K near 1 Msun, ±3 %")
	within(t, "Teff_ZAMS(0.1 Msun)", evolveAt(t, m, 0.1, 0).TeffK, 2000, 3000, "common practice: below about 3000 K near 0.1 Msun")
}

// TestDwarfSequence compares the main sequence with the mean dwarf sequence of
// Pecaut & Mamajek (2013; Mamajek table 2024.05.15, testdata/dwarf_sequence.tsv)
// over 0.3–10 Msun at a representative field age, min(½ t_MS, 4.57 Gyr).
// Tolerances: 0.15 dex in L and 7 % in Teff — the table's masses are tentative
// (its author's note), field dwarfs span the whole main sequence (L grows by
// a factor 2–3 from ZAMS to TMS) and our main-sequence shapes are simplified.
func TestDwarfSequence(t *testing.T) {
	t.Parallel()
	m := model(t, 0.02)
	cols, rows := readTSV(t, "testdata/dwarf_sequence.tsv")
	n := 0
	for _, r := range rows {
		ms := r[cols["mass_msun"]]
		if ms == "" || r[cols["log_l_lsun"]] == "" {
			continue
		}
		mass := num(t, ms)
		if mass < 0.3 || mass > 10 {
			continue
		}
		n++
		age := math.Min(0.5*timescales(t, m, mass).MSLifetimeYr, 4.57e9)
		s := evolveAt(t, m, mass, age)
		dl := math.Log10(s.LuminosityLsun) - num(t, r[cols["log_l_lsun"]])
		dt := s.TeffK/num(t, r[cols["teff_k"]]) - 1
		if math.Abs(dl) > 0.15 || math.Abs(dt) > 0.07 {
			t.Errorf("%s (%.3g Msun): Δlog L = %+.3f dex, ΔTeff = %+.1f %% (Pecaut & Mamajek 2013; tolerance 0.15 dex, 7 %%)",
				r[cols["spt"]], mass, dl, 100*dt)
		}
	}
	if n < 50 {
		t.Fatalf("only %d dwarf-sequence rows in 0.3–10 Msun", n)
	}
}

// TestHeliumFlash: low-mass giants at the tip of the red giant branch.
func TestHeliumFlash(t *testing.T) {
	t.Parallel()
	q := quantities(t, "testdata/solar_and_calibration_values.tsv")
	mc := num(t, q["core_mass_at_helium_flash"]) // 0.475 ± 0.01 Msun, common practice
	m := model(t, 0.02)
	for _, ms := range []float64{0.8, 1, 1.2, 1.5, 1.8} {
		ts := timescales(t, m, ms)
		tip := evolveAt(t, m, ms, ts.HeIgnitionYr*(1-1e-9))
		if tip.Stage != evolve.RedGiantBranch {
			t.Errorf("%g Msun just before He ignition: stage %v", ms, tip.Stage)
			continue
		}
		within(t, "core mass at the flash", tip.CoreMassMsun, mc-0.01, mc+0.01, "common practice 0.475 ± 0.01 Msun")
		within(t, "tip luminosity", tip.LuminosityLsun, 2000, 3000, "common practice: 2000–3000 Lsun for 0.8–1.8 Msun")
		clump := evolveAt(t, m, ms, 0.5*(ts.HeIgnitionYr+ts.EndCoreHeYr))
		if clump.Stage != evolve.CoreHeliumBurning {
			t.Errorf("%g Msun mid core-He burning: stage %v", ms, clump.Stage)
		}
		within(t, "red clump luminosity", clump.LuminosityLsun, 30, 60, "common practice: 30–60 Lsun")
		// Red clump Teff 4500–5300 K (common practice; M_V ≈ +0.8, (B−V) ≈ 1;
		// the younger, more massive clump stars are the hotter ones).
		within(t, "red clump Teff", clump.TeffK, 4500, 5300, "common practice: solar-metallicity clump 4500–5300 K")
	}
	// Helium-flash mass limit near 2 Msun at solar metallicity (HPT 2000 eq. 2: 1.995).
	within(t, "M_HeF", m.HeliumFlashMassMsun(), 1.8, 2.2, "HPT 2000: about 2 Msun")
	// Above it helium ignites at a much lower luminosity (non-degenerate core).
	lo := evolveAt(t, m, 2.5, timescales(t, m, 2.5).HeIgnitionYr*(1-1e-9))
	within(t, "L at He ignition, 2.5 Msun", lo.LuminosityLsun, 20, 500, "common practice: no bright RGB tip above M_HeF")
}

// TestRadii: giants and supergiants reach 1e2–1e3 Rsun, white dwarfs ~0.01 Rsun
// (common practice).
func TestRadii(t *testing.T) {
	t.Parallel()
	m := model(t, 0.02)
	maxR := func(ms float64) float64 {
		ts := timescales(t, m, ms)
		r := 0.0
		for i := 0; i <= 4000; i++ {
			age := ts.MSLifetimeYr + (ts.EndAGBYr-ts.MSLifetimeYr)*float64(i)/4000*(1-1e-12)
			r = math.Max(r, evolveAt(t, m, ms, age).RadiusRsun)
		}
		return r
	}
	within(t, "max radius 1 Msun", maxR(1), 100, 1000, "common practice: giants reach 1e2–1e3 Rsun")
	within(t, "max radius 5 Msun", maxR(5), 100, 1500, "common practice: giants reach 1e2–1e3 Rsun")
	within(t, "max radius 15 Msun", maxR(15), 300, 2000, "common practice: red supergiants 1e2–1e3 Rsun")
	ts := timescales(t, m, 1.4)
	wd := evolveAt(t, m, 1.4, ts.EndAGBYr+1e9)
	if !wd.Stage.IsWhiteDwarf() {
		t.Fatalf("1.4 Msun after 1 Gyr of cooling: %v", wd.Stage)
	}
	within(t, "white-dwarf radius", wd.RadiusRsun, 0.008, 0.016, "common practice: about 0.01 Rsun (0.0125 Rsun at 0.6 Msun)")
}

// TestInitialFinalMassRelation checks white-dwarf masses against the values
// found in the abstract of Cummings et al. (2018, ApJ 866, 21): stars of
// 0.83 and 7.5 Msun lose 33 and 83 per cent of their mass (0.5 per cent
// rounding of the printed percentages gives the tolerance, widened to 0.02 Msun
// for the piecewise fit), and the slopes 0.08, 0.19, 0.11 in the three
// mass ranges (±0.01, rounding of the printed two digits plus the fit).
// The Kalirai et al. (2008) NGC 6791 point (1.16 → 0.53 Msun) is checked within
// the relation's 0.06 Msun scatter (Cummings et al. abstract).
func TestInitialFinalMassRelation(t *testing.T) {
	t.Parallel()
	m := model(t, 0.02)
	wd := func(mi float64) float64 {
		ts := timescales(t, m, mi)
		if !ts.Remnant.IsWhiteDwarf() {
			t.Fatalf("%g Msun ends as %v, want a white dwarf", mi, ts.Remnant)
		}
		return ts.RemnantMassMsun
	}
	within(t, "Mf(0.83)", wd(0.83), 0.83*(1-0.33)-0.02, 0.83*(1-0.33)+0.02, "Cummings et al. 2018 abstract: 33 % lost at 0.83 Msun")
	within(t, "Mf(7.5)", wd(7.5), 7.5*(1-0.83)-0.04, 7.5*(1-0.83)+0.04, "Cummings et al. 2018 abstract: 83 % lost at 7.5 Msun")
	for _, c := range []struct{ m1, m2, slope float64 }{{1, 2.5, 0.08}, {2.95, 3.5, 0.19}, {4, 7, 0.11}} {
		s := (wd(c.m2) - wd(c.m1)) / (c.m2 - c.m1)
		within(t, "IFMR slope", s, c.slope-0.01, c.slope+0.01, "Cummings et al. 2018 abstract slopes 0.08, 0.19, 0.11")
	}
	within(t, "Mf(1.16)", wd(1.16), 0.53-0.06, 0.53+0.06, "Kalirai et al. 2008 NGC 6791 point, ±0.06 scatter")
}

// TestRemnants: Chandrasekhar limit, white-dwarf progenitor limit, neutron
// stars and black holes (common practice and Smartt 2009).
func TestRemnants(t *testing.T) {
	t.Parallel()
	q := quantities(t, "testdata/solar_and_calibration_values.tsv")
	mch := num(t, q["M_Chandrasekhar"])
	for _, z := range []float64{1e-4, 0.001, 0.004, 0.02, 0.03} {
		m := model(t, z)
		maxWD := 0.0
		sawNS, sawBH := false, false
		for ms := 0.5; ms <= 150; ms *= 1.02 {
			ts := timescales(t, m, ms)
			switch {
			case ts.Remnant.IsWhiteDwarf():
				if ts.RemnantMassMsun >= mch {
					t.Errorf("Z=%g %.3g Msun: white dwarf of %.3f Msun above M_Ch = %g (common practice)", z, ms, ts.RemnantMassMsun, mch)
				}
				maxWD = ms
			case ts.Remnant == evolve.NeutronStar:
				sawNS = true
				// Observed 1.2–2 Msun (common practice; Thorsett & Chakrabarty 1999
				// mean 1.35); Fryer et al.'s rapid model puts its lightest at 1.11
				// Msun, hence the 0.1 Msun allowance below.
				within(t, "neutron-star mass", ts.RemnantMassMsun, 1.1, 2.0, "common practice 1.2–2 Msun")
			case ts.Remnant == evolve.BlackHole:
				sawBH = true
				if ms < 15 {
					t.Errorf("Z=%g: black hole from %.3g Msun (common practice: only massive stars)", z, ms)
				}
			}
		}
		// Maximum white-dwarf progenitor 8 ± 1 Msun (Smartt 2009, minimum mass for
		// core collapse), the "6–8 Msun" within that uncertainty.
		within(t, "max WD progenitor", maxWD, 6, 9, "Smartt 2009: 8 ± 1 Msun")
		if !sawNS || !sawBH {
			t.Errorf("Z=%g: neutron stars %v, black holes %v; want both", z, sawNS, sawBH)
		}
		for _, ms := range []float64{40, 60, 100} {
			if r := timescales(t, m, ms).Remnant; r != evolve.BlackHole {
				t.Errorf("Z=%g %g Msun ends as %v, want black_hole (common practice)", z, ms, r)
			}
		}
	}
	// Very massive metal-poor stars: pair-instability supernova, no remnant
	// (Heger & Woosley 2002: helium cores of 64–133 Msun).
	if r := timescales(t, model(t, 1e-4), 150).Remnant; r != evolve.NoRemnant {
		t.Errorf("150 Msun at Z = 1e-4 ends as %v, want no_remnant", r)
	}
}

// TestWhiteDwarfCooling: a 0.6 Msun white dwarf after 1 and 10 Gyr (bounds from
// memory of modern cooling sequences, wide because a Mestel-type law differs
// from them) and monotonic fading.
func TestWhiteDwarfCooling(t *testing.T) {
	t.Parallel()
	m := model(t, 0.02)
	mi := (0.6 - 0.489) / 0.080 // initial mass whose Cummings et al. WD mass is 0.6 Msun
	ts := timescales(t, m, mi)
	within(t, "WD mass", ts.RemnantMassMsun, 0.59, 0.61, "construction")
	l1 := evolveAt(t, m, mi, ts.EndAGBYr+1e9).LuminosityLsun
	l10 := evolveAt(t, m, mi, ts.EndAGBYr+1e10).LuminosityLsun
	within(t, "log L_WD at 1 Gyr", math.Log10(l1), -4, -3, "from memory of cooling sequences")
	within(t, "log L_WD at 10 Gyr", math.Log10(l10), -5.5, -4.3, "from memory of cooling sequences")
	prev := math.Inf(1)
	for i := 0; i <= 200; i++ {
		s := evolveAt(t, m, mi, ts.EndAGBYr+1e6*math.Pow(1e4, float64(i)/200))
		if s.LuminosityLsun >= prev {
			t.Fatalf("white-dwarf luminosity not falling at step %d", i)
		}
		prev = s.LuminosityLsun
	}
}

// TestMetallicityTrends: metal-poor stars are hotter and brighter on the main
// sequence and live shorter (common practice) — checked for 0.5–5 Msun, where
// bound–free opacity dominates; above ~10 Msun electron scattering makes the
// dependence weak — and all relations are continuous in Z.
func TestMetallicityTrends(t *testing.T) {
	t.Parallel()
	poor, rich := model(t, 0.001), model(t, 0.02)
	for _, ms := range []float64{0.5, 0.8, 1, 2, 5} {
		for _, tau := range []float64{0, 0.5} {
			ap := tau * timescales(t, poor, ms).MSLifetimeYr
			ar := tau * timescales(t, rich, ms).MSLifetimeYr
			p, r := evolveAt(t, poor, ms, ap), evolveAt(t, rich, ms, ar)
			if p.TeffK <= r.TeffK || p.LuminosityLsun <= r.LuminosityLsun {
				t.Errorf("%g Msun at τ=%g: Z=0.001 Teff %.0f L %.3g vs Z=0.02 Teff %.0f L %.3g; want hotter and brighter", ms, tau, p.TeffK, p.LuminosityLsun, r.TeffK, r.LuminosityLsun)
			}
		}
		if timescales(t, poor, ms).MSLifetimeYr >= timescales(t, rich, ms).MSLifetimeYr {
			t.Errorf("%g Msun: metal-poor star does not live shorter", ms)
		}
	}
	// Continuity in Z: a step of 0.002 dex in Z changes ZAMS L, R, t_MS,
	// t_He-ign and the remnant mass by less than 1 % (smooth fits; 1 % leaves room
	// for the steepest ζ-derivatives, ~5 per dex).
	for _, ms := range []float64{0.3, 1, 3, 10, 40} {
		for lz := math.Log10(evolve.MinZ); lz < math.Log10(evolve.MaxZ)-0.002; lz += 0.05 {
			a, b := model(t, math.Pow(10, lz)), model(t, math.Pow(10, lz+0.002))
			sa, sb := evolveAt(t, a, ms, 0), evolveAt(t, b, ms, 0)
			ta, tb := timescales(t, a, ms), timescales(t, b, ms)
			for _, p := range [][2]float64{{sa.LuminosityLsun, sb.LuminosityLsun}, {sa.RadiusRsun, sb.RadiusRsun},
				{ta.MSLifetimeYr, tb.MSLifetimeYr}, {ta.HeIgnitionYr, tb.HeIgnitionYr}} {
				if math.Abs(p[1]/p[0]-1) > 0.01 {
					t.Errorf("%g Msun, log Z = %.3f: jump %.4g → %.4g over 0.002 dex", ms, lz, p[0], p[1])
				}
			}
		}
	}
}

// transitions returns the ages (yr) at which the stage changes for one mass.
func transitionAges(ts evolve.Timescales) []float64 {
	return []float64{ts.MSLifetimeYr, ts.BGBYr, ts.HeIgnitionYr, ts.EndCoreHeYr}
}

// TestContinuity: L and R are continuous across stage transitions (HPT's design
// aim). The helium flash (degenerate ignition, treated as instantaneous by
// HPT), envelope loss and remnant formation are genuine jumps and excluded.
// Tolerance 1e-3 relative for a step of 1e-9 of the age (the formulae are
// continuous by construction; the table adds < 1e-5).
func TestContinuity(t *testing.T) {
	t.Parallel()
	for _, z := range []float64{1e-4, 0.001, 0.02, 0.03} {
		m := model(t, z)
		for _, ms := range []float64{0.9, 1, 1.5, 2.5, 3, 5, 7, 10, 15, 20} {
			ts := timescales(t, m, ms)
			for _, age := range transitionAges(ts) {
				if age > evolve.MaxAgeYr || age == 0 {
					continue
				}
				a := evolveAt(t, m, ms, age*(1-1e-9))
				b := evolveAt(t, m, ms, age*(1+1e-9))
				if a.Stage == b.Stage || b.Stage.IsRemnant() || b.Stage == evolve.HeliumMainSequence || b.Stage == evolve.HeliumGiant {
					continue
				}
				if a.Stage == evolve.RedGiantBranch && b.Stage == evolve.CoreHeliumBurning && ms <= m.HeliumFlashMassMsun() {
					continue // helium flash
				}
				if math.Abs(b.LuminosityLsun/a.LuminosityLsun-1) > 1e-3 || math.Abs(b.RadiusRsun/a.RadiusRsun-1) > 1e-3 {
					t.Errorf("Z=%g %g Msun %v→%v at %.4g yr: L %.5g→%.5g, R %.5g→%.5g", z, ms, a.Stage, b.Stage, age,
						a.LuminosityLsun, b.LuminosityLsun, a.RadiusRsun, b.RadiusRsun)
				}
			}
		}
	}
}

// TestContinuityAGB: L, R and mass are continuous where the early AGB turns
// into the thermally pulsing AGB (an age not in Timescales, found by
// bisection); same tolerance as TestContinuity.
func TestContinuityAGB(t *testing.T) {
	t.Parallel()
	checked := 0
	for _, z := range []float64{1e-4, 0.02} {
		m := model(t, z)
		for _, ms := range []float64{0.9, 1, 1.5, 2.5, 4, 6} {
			ts := timescales(t, m, ms)
			lo, hi := ts.EndCoreHeYr, ts.EndAGBYr*(1-1e-12)
			if evolveAt(t, m, ms, hi).Stage != evolve.ThermallyPulsingAGB {
				continue // no TP-AGB for this mass
			}
			for range 200 {
				mid := 0.5 * (lo + hi)
				if evolveAt(t, m, ms, mid).Stage == evolve.EarlyAGB {
					lo = mid
				} else {
					hi = mid
				}
			}
			a, b := evolveAt(t, m, ms, lo), evolveAt(t, m, ms, hi)
			if a.Stage != evolve.EarlyAGB || b.Stage != evolve.ThermallyPulsingAGB {
				t.Errorf("Z=%g %g Msun: bisection ended on %v/%v", z, ms, a.Stage, b.Stage)
				continue
			}
			checked++
			for _, p := range [][2]float64{{a.LuminosityLsun, b.LuminosityLsun}, {a.RadiusRsun, b.RadiusRsun}, {a.MassMsun, b.MassMsun}} {
				if math.Abs(p[1]/p[0]-1) > 1e-3 {
					t.Errorf("Z=%g %g Msun E-AGB→TP-AGB: %.5g → %.5g", z, ms, p[0], p[1])
				}
			}
		}
	}
	if checked < 8 {
		t.Errorf("only %d E-AGB→TP-AGB transitions checked", checked)
	}
}

// TestTrackOrder: along a track the stage never goes back and the mass never
// grows (property of any single-star track).
func TestTrackOrder(t *testing.T) {
	t.Parallel()
	for _, z := range []float64{1e-4, 0.02} {
		m := model(t, z)
		for _, ms := range []float64{0.8, 1, 2, 4, 8, 12, 25, 60, 120} {
			ts := timescales(t, m, ms)
			prev := evolve.Star{MassMsun: math.Inf(1)}
			end := math.Min(ts.EndAGBYr*1.5, evolve.MaxAgeYr)
			for i := 0; i <= 5000; i++ {
				s := evolveAt(t, m, ms, end*float64(i)/5000)
				if s.Stage < prev.Stage {
					t.Errorf("Z=%g %g Msun: stage went back %v → %v", z, ms, prev.Stage, s.Stage)
				}
				if s.MassMsun > prev.MassMsun*(1+1e-9) {
					t.Errorf("Z=%g %g Msun: mass grew %.5g → %.5g (%v → %v)", z, ms, prev.MassMsun, s.MassMsun, prev.Stage, s.Stage)
				}
				prev = s
			}
		}
	}
}

// TestGridFinite: no NaN, Inf or negative value over masses 0.08–150 Msun ×
// Z 1e-4–0.03 × ages 0–13.8 Gyr (property test, including the extrapolated
// mass ranges).
func TestGridFinite(t *testing.T) {
	t.Parallel()
	bad := func(x float64) bool { return math.IsNaN(x) || math.IsInf(x, 0) || x < 0 }
	for _, z := range []float64{1e-4, 3e-4, 0.001, 0.003, 0.006, 0.01, 0.02, 0.03} {
		m := model(t, z)
		for i := 0; i <= 80; i++ {
			ms := evolve.MinMassMsun * math.Pow(evolve.MaxMassMsun/evolve.MinMassMsun, float64(i)/80)
			ts := timescales(t, m, ms)
			for _, v := range []float64{ts.MSLifetimeYr, ts.BGBYr, ts.HeIgnitionYr, ts.EndCoreHeYr, ts.EndAGBYr, ts.RemnantMassMsun} {
				if bad(v) {
					t.Errorf("Z=%g M=%.3g: bad timescale %+v", z, ms, ts)
				}
			}
			if !(ts.MSLifetimeYr <= ts.BGBYr && ts.BGBYr <= ts.HeIgnitionYr && ts.HeIgnitionYr <= ts.EndCoreHeYr && ts.EndCoreHeYr <= ts.EndAGBYr) {
				t.Errorf("Z=%g M=%.3g: milestones out of order %+v", z, ms, ts)
			}
			for j := 0; j <= 60; j++ {
				age := 13.8e9 * float64(j) / 60
				s := evolveAt(t, m, ms, age)
				for _, v := range []float64{s.MassMsun, s.LuminosityLsun, s.TeffK, s.RadiusRsun, s.CoreMassMsun, s.StageFraction} {
					if bad(v) {
						t.Errorf("Z=%g M=%.3g age=%.3g: bad value in %+v", z, ms, age, s)
					}
				}
				if math.IsNaN(s.LoggCgs) || math.IsInf(s.LoggCgs, 0) {
					t.Errorf("Z=%g M=%.3g age=%.3g: bad log g in %+v", z, ms, age, s)
				}
				if s.StageFraction >= 1 {
					t.Errorf("stage fraction %g ≥ 1", s.StageFraction)
				}
			}
		}
	}
}

// TestExtrapolatedMasses: the documented extrapolations 0.08–0.1 and
// 100–150 Msun keep the ZAMS luminosity rising with mass.
func TestExtrapolatedMasses(t *testing.T) {
	t.Parallel()
	m := model(t, 0.02)
	prev := 0.0
	for _, ms := range []float64{0.08, 0.09, 0.1, 0.11, 90, 100, 120, 150} {
		l := evolveAt(t, m, ms, 0).LuminosityLsun
		if l <= prev {
			t.Errorf("ZAMS L not rising at %g Msun", ms)
		}
		prev = l
	}
}

// TestBadInput: clear errors naming the field, wrapping ErrOutOfRange.
func TestBadInput(t *testing.T) {
	t.Parallel()
	for _, z := range []float64{0, -0.01, 5e-5, 0.031, math.NaN(), math.Inf(1)} {
		_, err := evolve.NewModel(z)
		if !errors.Is(err, evolve.ErrOutOfRange) || !strings.Contains(err.Error(), "metallicity") {
			t.Errorf("NewModel(%g): err = %v", z, err)
		}
	}
	m := model(t, 0.02)
	for _, c := range []struct {
		mass, age float64
		field     string
	}{{-1, 1e9, "mass"}, {0.05, 1e9, "mass"}, {151, 1e9, "mass"}, {math.NaN(), 1e9, "mass"},
		{1, -1, "age"}, {1, math.NaN(), "age"}, {1, 2e13, "age"}, {1, math.Inf(1), "age"}} {
		_, err := m.Evolve(c.mass, c.age)
		var re *evolve.RangeError
		if !errors.As(err, &re) || re.Field != c.field || !errors.Is(err, evolve.ErrOutOfRange) {
			t.Errorf("Evolve(%g, %g): err = %v, want a %s range error", c.mass, c.age, err, c.field)
		} else if msg := err.Error(); msg != strings.ToLower(msg[:1])+msg[1:] || strings.HasSuffix(msg, ".") {
			t.Errorf("message style: %q", msg)
		}
	}
	if _, err := m.Timescales(-2); !errors.Is(err, evolve.ErrOutOfRange) {
		t.Errorf("Timescales(-2): err = %v", err)
	}
}

// TestMetallicityConversion: [Fe/H] = 0 is the fits' solar Z = 0.02, the
// conversion round-trips and is monotonic (construction; X = 0.76 − 3Z from
// Pols et al. 1998).
func TestMetallicityConversion(t *testing.T) {
	t.Parallel()
	if z := evolve.ZFromFeH(0); math.Abs(z-0.02) > 1e-12 {
		t.Errorf("ZFromFeH(0) = %g, want 0.02", z)
	}
	for feh := -2.5; feh <= 0.3; feh += 0.1 {
		if back := evolve.FeHFromZ(evolve.ZFromFeH(feh)); math.Abs(back-feh) > 1e-12 {
			t.Errorf("round trip %g → %g", feh, back)
		}
	}
	// Small-Z limit: Z ≈ Z_sun 10^[Fe/H] (common practice) within 5 % at [Fe/H] = −2.
	within(t, "Z([Fe/H]=-2)/(0.02·0.01)", evolve.ZFromFeH(-2)/(0.02*0.01), 0.95, 1.12, "common practice Z ~ Z_sun 10^[Fe/H]")
	if !math.IsNaN(evolve.FeHFromZ(-1)) {
		t.Error("FeHFromZ(-1) should be NaN")
	}
}

// TestStageWords: every stage has a unique snake_case word that parses back.
func TestStageWords(t *testing.T) {
	t.Parallel()
	seen := map[string]bool{}
	for _, s := range evolve.AllStages() {
		w := s.String()
		if seen[w] || w != strings.ToLower(w) || strings.ContainsAny(w, " -") {
			t.Errorf("bad or duplicate word %q", w)
		}
		seen[w] = true
		back, err := evolve.ParseStage(" " + strings.ToUpper(w) + " ")
		if err != nil || back != s {
			t.Errorf("ParseStage(%q) = %v, %v", w, back, err)
		}
		if s.Label() == "" {
			t.Errorf("%v has no label", s)
		}
		wd := s == evolve.HeliumWhiteDwarf || s == evolve.CarbonOxygenWhiteDwarf || s == evolve.OxygenNeonWhiteDwarf
		if s.IsWhiteDwarf() != wd {
			t.Errorf("%v IsWhiteDwarf = %v", s, s.IsWhiteDwarf())
		}
		rem := wd || s == evolve.NeutronStar || s == evolve.BlackHole || s == evolve.NoRemnant
		if s.IsRemnant() != rem {
			t.Errorf("%v IsRemnant = %v", s, s.IsRemnant())
		}
	}
	if len(seen) != 14 {
		t.Errorf("%d stages, contract lists 14", len(seen))
	}
	if _, err := evolve.ParseStage("giant"); err == nil {
		t.Error("ParseStage(giant) should fail")
	}
}

// TestNoAllocation: Evolve allocates nothing (contract).
func TestNoAllocation(t *testing.T) {
	m := model(t, 0.02)
	masses := []float64{0.3, 1, 1.5, 3, 8, 20, 60}
	allocs := testing.AllocsPerRun(100, func() {
		for _, ms := range masses {
			for _, age := range []float64{1e6, 4.2e6, 9.3e6, 1e8, 1e9, 1.2e10} { // includes core He burning and a stripped helium star
				_, _ = m.Evolve(ms, age)
			}
		}
	})
	if allocs != 0 {
		t.Errorf("Evolve allocates %.1f times per run", allocs)
	}
}

// TestEvolveBatch: the batch gives exactly Evolve's results, reuses dst and
// reports the index of a bad star.
func TestEvolveBatch(t *testing.T) {
	t.Parallel()
	m := model(t, 0.004)
	masses := []float64{0.5, 1, 2, 5, 20}
	ages := []float64{1e9, 5e9, 1e9, 1e8, 9e6}
	dst := make([]evolve.Star, 0, 8)
	out, err := m.EvolveBatch(dst, masses, ages)
	if err != nil {
		t.Fatal(err)
	}
	if &out[0] != &dst[:1][0] {
		t.Error("EvolveBatch did not reuse dst")
	}
	for i := range masses {
		if want := evolveAt(t, m, masses[i], ages[i]); out[i] != want {
			t.Errorf("star %d: %+v, want %+v", i, out[i], want)
		}
	}
	_, err = m.EvolveBatch(nil, []float64{1, -1}, []float64{1e9, 1e9})
	if !errors.Is(err, evolve.ErrOutOfRange) || !strings.Contains(err.Error(), "star 1") {
		t.Errorf("bad batch: err = %v", err)
	}
	defer func() {
		if recover() == nil {
			t.Error("length mismatch did not panic")
		}
	}()
	_, _ = m.EvolveBatch(nil, []float64{1}, nil)
}

// TestRandomStates: a seeded random sample of (Z, mass, age) over the whole
// accepted domain, ages concentrated on each star's nuclear lifetime: every
// value finite and non-negative, StageFraction in [0, 1), core mass never
// above the star's mass (property test).
func TestRandomStates(t *testing.T) {
	t.Parallel()
	n := 200000
	if testing.Short() {
		n = 20000
	}
	r := rand.New(rand.NewPCG(3, 4))
	models := make([]*evolve.Model, 12)
	for i := range models {
		models[i] = model(t, math.Min(evolve.MaxZ, math.Pow(10, math.Log10(evolve.MinZ)+float64(i)/11*math.Log10(evolve.MaxZ/evolve.MinZ))))
	}
	bad := 0
	for i := 0; i < n && bad < 10; i++ {
		m := models[r.IntN(len(models))]
		ms := evolve.MinMassMsun * math.Pow(evolve.MaxMassMsun/evolve.MinMassMsun, r.Float64())
		ts := timescales(t, m, ms)
		age := r.Float64() * math.Min(ts.EndAGBYr*1.2, evolve.MaxAgeYr)
		if r.IntN(3) == 0 {
			age = math.Pow(10, 13*r.Float64())
		}
		s := evolveAt(t, m, ms, age)
		ok := s.StageFraction >= 0 && s.StageFraction < 1 && !math.IsNaN(s.LoggCgs) && !math.IsInf(s.LoggCgs, 0) &&
			(s.CoreMassMsun <= s.MassMsun*(1+1e-9) || s.Stage == evolve.NoRemnant)
		for _, v := range []float64{s.MassMsun, s.LuminosityLsun, s.TeffK, s.RadiusRsun, s.CoreMassMsun} {
			ok = ok && !math.IsNaN(v) && !math.IsInf(v, 0) && v >= 0
		}
		if !ok {
			bad++
			t.Errorf("Z=%g M=%.4g age=%.4g: %+v", m.MetallicityZ(), ms, age, s)
		}
	}
}
