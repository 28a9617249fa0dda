package synth

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// liveScenario is one Galactic component seen by a bright V survey (the regime where the
// bound drops most systems) in one nside-4 HEALPix pixel near the plane.
func liveScenario(t *testing.T, kind string) *ComponentPlan {
	t.Helper()
	text := `seed: 31
components:
  - {name: c, kind: ` + kind + `}
field:
  area: {kind: healpix, nside: 4, pixels: [74]}
  min_distance_pc: 1
  max_distance_pc: 30000
survey:
  bands: [{band: V, limit_5sigma_mag: 8, saturation_mag: -30}]
output: {path: cat, formats: [parquet]}
`
	s, err := Parse("live.yaml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	p, err := NewPlan(context.Background(), s)
	if err != nil {
		t.Fatal(err)
	}
	return p.Components[0]
}

// TestLiveSamplerMatchesBruteForce checks that the bound's sampler draws exactly the
// systems it keeps, at the right rate: per shell, the fraction of the component's systems
// the bound keeps (MayDetect), estimated by drawing systems from the unrestricted
// population (mass function, age distribution, metallicity and binaries as for a run
// without the bound), against the sampler's summed envelope weight times its acceptance
// rate, for both classes. The two estimates must agree within 4 combined standard errors
// (binomial; common practice), and every accepted draw must be one MayDetect keeps.
func TestLiveSamplerMatchesBruteForce(t *testing.T) {
	// The last case has a single [Fe/H] and no companions (one bin, no class 2).
	for _, kind := range []string{"thin_disc", "thick_disc", "halo, metallicity: {kind: fixed, feh: -1.2}, binaries: {fraction: 0}"} {
		cp := liveScenario(t, kind)
		f, lb := cp.field, cp.field.slices[0].live
		for _, sh := range []int{30, 40, 48, 54} {
			d := math.Sqrt(f.shells[sh].InnerPc * f.shells[sh].OuterPc)
			if f.shells[sh].InnerPc*(1+1e-9) > d || d >= f.shells[sh].OuterPc {
				t.Fatalf("shell %d: distance %g outside", sh, d)
			}
			rm := newStream(7, 0, sh, streamMass)
			rs := newStream(7, 0, sh, streamStars)
			const n = 400000
			hit := 0
			for i := 0; i < n; i++ {
				m1 := cp.IMF.Rand(rm)
				a := cp.Ages.Age(rs)
				feh := cp.FeH.FeH(rs)
				m2 := 0.0
				if cp.binaries != nil {
					m2 = cp.binaries.draw(m1, rs)
				}
				if cp.MayDetect(d, m1, m2, a, feh) {
					hit++
				}
			}
			pb := float64(hit) / n
			sb := math.Sqrt(pb * (1 - pb) / n)
			var est, v float64
			for k, comp := range []bool{false, true} {
				w := lb.prim.weight(sh)
				if comp {
					w = lb.comp.weight(sh)
				}
				if w == 0 {
					continue // nothing to propose (no companions)
				}
				const m = 100000
				acc := 0
				for i := 0; i < m; i++ {
					m1, m2, a, feh, keep, err := lb.draw(cp, sh, comp, rm, rs)
					if err != nil {
						t.Fatal(err)
					}
					if !keep {
						continue
					}
					acc++
					if !cp.MayDetect(d, m1, m2, a, feh) {
						t.Fatalf("%s shell %d class %d: accepted draw (m1 %g, m2 %g, age %g, [Fe/H] %g) is not one the bound keeps", kind, sh, k+1, m1, m2, a, feh)
					}
				}
				pa := float64(acc) / m
				est += w * pa
				v += w * w * pa * (1 - pa) / m
			}
			se := math.Sqrt(sb*sb + v)
			t.Logf("%s shell %d (%.0f pc): kept fraction by brute force %.5f ± %.5f, by the sampler %.5f ± %.5f",
				kind, sh, d, pb, sb, est, math.Sqrt(v))
			if math.Abs(est-pb) > 4*se {
				t.Errorf("%s shell %d: sampler rate %.5f differs from the brute-force %.5f by more than 4σ (%.5f)", kind, sh, est, pb, se)
			}
		}
	}
}

// TestCompanionProbMatchesDraws checks H, the probability that a system has its
// companion in a mass interval, against the companions of 10⁶ systems drawn with the
// component's binary model (binomial 4σ; common practice).
func TestCompanionProbMatchesDraws(t *testing.T) {
	cp := liveScenario(t, "thin_disc")
	lb := cp.field.slices[0].live
	r := newStream(3, 0, 0, streamMass)
	const n = 1000000
	ivs := [][2]float64{{0.08, 0.1}, {0.3, 0.32}, {0.95, 1.0}, {2, 2.2}}
	counts := make([]int, len(ivs))
	for i := 0; i < n; i++ {
		m1 := cp.IMF.Rand(r)
		m2 := cp.binaries.draw(m1, r)
		for k, iv := range ivs {
			if m2 >= iv[0] && m2 < iv[1] {
				counts[k]++
			}
		}
	}
	for k, iv := range ivs {
		h := lb.companionTable(cp, iv[0], iv[1]).h
		p := float64(counts[k]) / n
		se := math.Sqrt(h * (1 - h) / n)
		t.Logf("companion in [%g, %g) Msun: H = %.6f, draws %.6f ± %.6f", iv[0], iv[1], h, p, se)
		if math.Abs(h-p) > 4*se+1e-9 {
			t.Errorf("companion in [%g, %g): H = %.6f but draws give %.6f ± %.6f", iv[0], iv[1], h, p, se)
		}
	}
}

// TestGaussFeHDistribution checks the truncated normal's CDF and quantile against
// gonum's distuv.Normal (renormalised to [MinFeH, MaxFeH]) and against each other.
func TestGaussFeHDistribution(t *testing.T) {
	g := newGaussFeH(-0.6, 0.3)
	n := distuv.Normal{Mu: g.mean, Sigma: g.sigma}
	lo, hi := n.CDF(MinFeH), n.CDF(MaxFeH)
	for _, x := range []float64{-2.2, -1.5, -0.9, -0.6, -0.2, 0.1} {
		want := (n.CDF(x) - lo) / (hi - lo)
		if got := g.CDF(x); math.Abs(got-want) > 1e-12 {
			t.Errorf("CDF(%g) = %.15g, gonum gives %.15g", x, got, want)
		}
		if back := g.Quantile(g.CDF(x)); math.Abs(back-x) > 1e-9 {
			t.Errorf("Quantile(CDF(%g)) = %.12g", x, back)
		}
	}
	if g.Quantile(0) != MinFeH || g.Quantile(1) != MaxFeH {
		t.Errorf("quantile ends %g, %g; want %g, %g", g.Quantile(0), g.Quantile(1), MinFeH, MaxFeH)
	}
}

// TestFeHBins checks the metallicity bins of the bound: lattice edges inside the range,
// no bin narrower than a fifth of a step, one zero-width bin for a fixed value.
func TestFeHBins(t *testing.T) {
	e := fehBins(newGaussFeH(-0.1, 0.2))
	if math.Abs(e[0]+1.3) > 1e-12 || e[len(e)-1] != MaxFeH {
		t.Errorf("edges %v: want −1.3 … %g", e, MaxFeH)
	}
	for i := 1; i < len(e); i++ {
		if w := e[i] - e[i-1]; w < boundFeHStep/5 || w > boundFeHStep*1.2+1e-9 {
			t.Errorf("bin [%g, %g] has width %g", e[i-1], e[i], w)
		}
	}
	if f := fehBins(fixedFeH(-0.5)); len(f) != 2 || f[0] != -0.5 || f[1] != -0.5 {
		t.Errorf("fixed [Fe/H]: bins %v, want [-0.5 -0.5]", f)
	}
}
