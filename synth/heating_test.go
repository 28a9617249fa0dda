package synth

import (
	"context"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// heatedScenario is a thin disc alone toward the north Galactic pole (cone of 3°), every
// star simulated, no dust, with the age-dependent scale height at its defaults.
const heatedScenario = `seed: 12
components:
  - {name: disc, kind: thin_disc}
field:
  area: {kind: cone, l_deg: 0, b_deg: 90, radius_deg: 3}
  min_distance_pc: 10
  max_distance_pc: 2000
  shells: 24
  skip_undetectable: false
  dust: {model: none}
  structure: {thin_disc: {heating: {}}}
survey:
  bands: [{band: V, limit_5sigma_mag: 20, saturation_mag: 5}]
output: {path: cat}
`

func heatedPlan(t *testing.T, young bool) *Plan {
	t.Helper()
	text := heatedScenario
	if young { // stars younger than 1 Gyr in a wider cone: every slice well populated
		text = strings.Replace(text, "kind: thin_disc}", "kind: thin_disc, age: {kind: constant, min_age: 0, max_age: 1Gyr}}", 1)
		text = strings.Replace(text, "radius_deg: 3}", "radius_deg: 20}", 1)
		text = strings.Replace(text, "max_distance_pc: 2000", "max_distance_pc: 1000", 1)
	}
	s, err := Parse("heated.yaml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	p, err := NewPlan(context.Background(), s)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// TestHeatedSlices checks the construction of heating.go on the plan: 8 slices covering
// the disc's ages with edges equally spaced in ln(τ + τ1); each slice's height is
// H(τ_k) of galaxy.ThinDisc.ScaleHeightAtAgePc (H ∝ (τ + τ1)^0.5, Wielen 1977) at the
// slice's geometric middle; the slices' densities at the Sun add up to the thin disc's
// density there without heating (the local normalisation, 0.040 Msun pc⁻³ in all, Gaia
// 100 pc census), and each slice's column 2 A_k H_k is proportional to its share of the
// present-day mass (both to 1e-12: identities of the construction).
func TestHeatedSlices(t *testing.T) {
	p := heatedPlan(t, false)
	f := p.Components[0].field
	if len(f.slices) != heatingDefaultSlices {
		t.Fatalf("%d slices, want %d", len(f.slices), heatingDefaultSlices)
	}
	par := p.Scenario.Field.GalaxyParams()
	t1 := par.ThinDisc.HeatingTimescaleYr
	main := f.model
	sx, sy, sz := main.Frame.SunGalactocentric()
	rhoSun := main.ThinDisc.DensityMsunPc3(sx, sy, sz)
	var sum, prevH float64
	var col0 float64
	for k, sl := range f.slices {
		ages := sl.cp.Ages.(*sliceAges)
		lo, hi := ages.lo, ages.hi
		wantLo := math.Exp(math.Log(t1)+(math.Log(10e9+t1)-math.Log(t1))*float64(k)/8) - t1
		if math.Abs(lo-wantLo) > 1e-6*wantLo+1e-3 {
			t.Errorf("slice %d starts at %.6g yr, want %.6g", k, lo, wantLo)
		}
		mid := math.Sqrt((lo+t1)*(hi+t1)) - t1
		wantH := par.ThinDisc.ScaleHeightPc * math.Sqrt((mid+t1)/(par.ThinDisc.HeatingRefAgeYr+t1))
		if math.Abs(sl.heightPc/wantH-1) > 1e-12 {
			t.Errorf("slice %d: height %.6g pc, want %.6g", k, sl.heightPc, wantH)
		}
		if sl.heightPc <= prevH {
			t.Errorf("slice %d: height %.4g pc not above the younger slice's %.4g", k, sl.heightPc, prevH)
		}
		prevH = sl.heightPc
		amp := sl.factor * sl.model.ThinDisc.NormMsunPc3
		sum += amp * math.Exp(-math.Abs(sz)/sl.heightPc)
		w := (ages.g1 - ages.g0) / sl.initialPerPresent
		col := 2 * amp * sl.heightPc / w
		if k == 0 {
			col0 = col
		} else if math.Abs(col/col0-1) > 1e-12 {
			t.Errorf("slice %d: column per present mass %.10g, slice 0 %.10g", k, col, col0)
		}
		t.Logf("slice %d: ages %.3g–%.3g yr, H = %.1f pc, mid-plane %.4g Msun/pc^3", k, lo, hi, sl.heightPc, amp)
	}
	if math.Abs(sum/rhoSun-1) > 1e-12 {
		t.Errorf("slices give %.10g Msun/pc^3 at the Sun, the thin disc %.10g", sum, rhoSun)
	}
	if f.slices[0].heightPc > 70 {
		t.Errorf("youngest slice height %.1f pc; young stars should lie within ~50–60 pc of the plane (OB stars, from memory)", f.slices[0].heightPc)
	}
}

// TestHeatedVerticalDistribution runs the heated disc and checks where the pipeline puts
// the stars of each age slice: in a cap of radius θ around the north Galactic pole the
// distance of a star of a disc of height H is distributed as
//
//	p(d) ∝ d² ∫_{cos θ}^{1} exp(−d s/H) ds = d H (e^{−d cos θ/H} − e^{−d/H})
//
// on [d_min, d_max] (volume element times the exponential law in z = d sin b, Jurić et
// al. 2008 eq. 22; the Sun's offset is a constant factor, and the radial term changes
// the result by < 0.1 % for these cones), so the mean distance of each slice's stars must
// match that law's mean (by quadrature, gonum) within 4 standard errors of the sample
// mean. Two runs: the default history (0–10 Gyr, 3° cap to 2 kpc) and stars younger
// than 1 Gyr (20° cap to 1 kpc), so that the youngest slices hold enough stars; slices
// with fewer than 100 stars are not tested, and each run must test at least 5 of its 8.
func TestHeatedVerticalDistribution(t *testing.T) {
	for _, young := range []bool{false, true} {
		p := heatedPlan(t, young)
		f := p.Components[0].field
		nk := len(f.slices)
		sumD := make([]float64, nk)
		sumD2 := make([]float64, nk)
		n := make([]float64, nk)
		sink := func(r Result) error {
			b := r.Batch
			dist := b.Cols[cDist].([]float32)
			age := b.Cols[cAge].([]float32)
			for j := 0; j < b.N; j++ {
				k := f.sliceOf(float64(age[j]))
				d := float64(dist[j])
				sumD[k] += d
				sumD2[k] += d * d
				n[k]++
			}
			return nil
		}
		if err := p.Run(context.Background(), p.Chunks, 2, sink); err != nil {
			t.Fatal(err)
		}
		dLo, dHi := f.shells[0].InnerPc, f.shells[len(f.shells)-1].OuterPc
		tested := 0
		for k, sl := range f.slices {
			if n[k] < 100 {
				t.Logf("young %v, slice %d: %.0f stars, not tested", young, k, n[k])
				continue
			}
			tested++
			h := sl.heightPc
			c0 := math.Cos(3 * math.Pi / 180)
			if young {
				c0 = math.Cos(20 * math.Pi / 180)
			}
			w := func(d float64) float64 { return d * h * (math.Exp(-d*c0/h) - math.Exp(-d/h)) }
			norm := quad.Fixed(w, dLo, dHi, 200, nil, 0)
			want := quad.Fixed(func(d float64) float64 { return d * w(d) }, dLo, dHi, 200, nil, 0) / norm
			mean := sumD[k] / n[k]
			sd := math.Sqrt(math.Max(0, sumD2[k]/n[k]-mean*mean))
			se := sd / math.Sqrt(n[k])
			t.Logf("young %v, slice %d (H = %.0f pc): %.0f stars, mean distance %.1f ± %.1f pc, law %.1f pc", young, k, h, n[k], mean, se, want)
			if math.Abs(mean-want) > 4*se {
				t.Errorf("young %v, slice %d: mean distance %.1f ± %.1f pc, the exponential law with H = %.1f pc gives %.1f pc", young, k, mean, se, h, want)
			}
		}
		if tested < 5 {
			t.Errorf("young %v: only %d slices had 100 stars or more", young, tested)
		}
	}
}
