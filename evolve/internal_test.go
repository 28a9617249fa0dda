package evolve

import (
	"math"
	"sort"
	"testing"
)

// TestMSTableAccuracy checks that the per-metallicity main-sequence table
// reproduces the direct formulae to 1e-5 relative (the interpolation error
// bound stated on msTable) at masses between its nodes.
func TestMSTableAccuracy(t *testing.T) {
	t.Parallel()
	for _, z := range []float64{1e-4, 0.001, 0.02, 0.03} {
		m, err := NewModel(z)
		if err != nil {
			t.Fatal(err)
		}
		worst := 0.0
		var errs []float64
		for i := 0; i < 3000; i++ {
			mass := MinMassMsun * math.Pow(MaxMassMsun/MinMassMsun, (float64(i)+0.37)/3000)
			var a, b track
			m.initTrack(&a, mass)
			m.directMS(&b, mass)
			for _, p := range [][2]float64{{a.lz, b.lz}, {a.rz, b.rz}, {a.lTMS, b.lTMS}, {a.rTMS, b.rTMS}, {a.tMS, b.tMS}, {a.tBGB, b.tBGB}} {
				e := math.Abs(p[0]/p[1] - 1)
				worst = math.Max(worst, e)
				errs = append(errs, e)
			}
		}
		sort.Float64s(errs)
		// Away from the kinks of the formulae (M_hook in t_MS, the R_TMS bridge)
		// linear interpolation is good to 1e-5; within one node of a kink the
		// error is bounded by 1 per cent.
		if q := errs[len(errs)*98/100]; q > 1e-5 {
			t.Errorf("Z=%g: 98th-percentile relative table error %.2e > 1e-5", z, q)
		}
		if worst > 1e-2 {
			t.Errorf("Z=%g: worst relative table error %.2e > 1e-2", z, worst)
		}
	}
}

// TestToutFormulaCheckValues compares eqs. (1)–(2) of Tout et al. (1996) with
// the implementation-check rows of testdata/evolution_formulae_values.tsv
// (computed by that file's author from the same coefficients; tolerance 1e-4
// relative as the file states, i.e. its printed 5 significant digits).
func TestToutFormulaCheckValues(t *testing.T) {
	t.Parallel()
	q := readQuantities(t, "testdata/evolution_formulae_values.tsv")
	for _, z := range []string{"0.02", "0.001", "0.0001", "0.03"} {
		zf := mustFloat(t, z)
		zm := newZAMS(math.Log10(zf / SolarZ))
		for _, ms := range []string{"0.1", "0.5", "0.8", "1", "2", "5", "10", "20", "50", "100"} {
			l, r := zm.lumRad(mustFloat(t, ms))
			wl := mustFloat(t, q["tout_check_L_M"+ms+"_Z"+z])
			wr := mustFloat(t, q["tout_check_R_M"+ms+"_Z"+z])
			if math.Abs(l/wl-1) > 1e-4 || math.Abs(r/wr-1) > 1e-4 {
				t.Errorf("Z=%s M=%s: L=%.5g R=%.5g, table L=%.5g R=%.5g", z, ms, l, r, wl, wr)
			}
		}
	}
}

// TestHPTFormulaCheckValues compares HPT eqs. (1)–(7) with the
// implementation-check rows of the same table (1e-4 relative).
func TestHPTFormulaCheckValues(t *testing.T) {
	t.Parallel()
	q := readQuantities(t, "testdata/evolution_formulae_values.tsv")
	for _, z := range []string{"0.02", "0.004", "0.001", "0.0001", "0.03"} {
		h := newHPT(mustFloat(t, z))
		for name, got := range map[string]float64{"M_hook": h.mHook, "M_HeF": h.mHeF, "M_FGB": h.mFGB, "x": h.x} {
			want := mustFloat(t, q["hpt_check_"+name+"_Z"+z])
			if math.Abs(got-want) > 1e-4*math.Abs(want)+5e-5 {
				t.Errorf("Z=%s %s = %.5f, table %.5f", z, name, got, want)
			}
		}
		for _, ms := range []string{"0.8", "1", "1.5", "2", "3", "5", "10", "20", "40", "100"} {
			m := mustFloat(t, ms)
			tb := h.tBGBMyr(m)
			tm := h.tMSMyr(m, tb)
			wb := mustFloat(t, q["hpt_check_tBGB_M"+ms+"_Z"+z])
			wm := mustFloat(t, q["hpt_check_tMS_M"+ms+"_Z"+z])
			if math.Abs(tb/wb-1) > 1e-4 || math.Abs(tm/wm-1) > 1e-4 {
				t.Errorf("Z=%s M=%s: t_BGB=%.5g t_MS=%.5g Myr, table %.5g %.5g", z, ms, tb, tm, wb, wm)
			}
		}
	}
}
