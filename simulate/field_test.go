package simulate

// Tests of Galactic fields (issue 6) through the whole pipeline: the magnitude-limit-aware
// sampling leaves the detected sample unchanged; whole-sky star counts against published
// cumulative counts; the local stellar mass density and luminosity function from a
// volume-limited simulation; the north–south asymmetry of polar counts from the Sun's
// height above the plane.
//
// Runs slower than ~20 s are gated behind !testing.Short() and STARMOCK_LONG=1; each check
// also has a default version that runs in seconds.

import (
	"bufio"
	"context"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"

	"github.com/starmock/starmock/output"
	"github.com/starmock/starmock/synth"
	"github.com/starmock/starmock/synth/galaxy"
)

// longField reports whether the slow versions of the field tests run: not in -short
// mode, and only with STARMOCK_LONG=1.
func longField() bool {
	return !testing.Short() && os.Getenv("STARMOCK_LONG") == "1"
}

// fieldRow is what the field tests read of one catalogue row.
type fieldRow struct {
	component     string
	stage         string
	distancePc    float64
	massInit      float64
	massMsun      float64
	compMassMsun  float64 // 0 if single
	absV          float64 // NaN if null or no V band
	app           []float64
	mag           []float64 // observed, NaN if null
	detected      bool
	lDeg, bDeg    float64
	hasCompanion  bool
	dominantStage string
	ageYr, feh    float64
	compMassInit  float64 // 0 if single
}

// fieldRun runs a scenario without writing a catalogue and calls keep for every row; it
// returns the run report, the plan and the wall-clock time.
func fieldRun(t testing.TB, text string, keep func(r *fieldRow)) (*Report, *synth.Plan, time.Duration) {
	t.Helper()
	s, err := synth.Parse("field.yaml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	var (
		plan *synth.Plan
		mu   sync.Mutex
	)
	opts := Options{Workers: 2, NoCatalogue: true, OutPath: filepath.Join(t.TempDir(), "cat"),
		OnPlan: func(p *synth.Plan) error { plan = p; return nil },
		OnBatch: func(b *output.Batch, cols []output.Column) error {
			mu.Lock()
			defer mu.Unlock()
			return scanBatch(b, cols, len(plan.Survey.Bands), keep)
		},
	}
	start := time.Now()
	rep, err := Run(context.Background(), s, opts)
	if err != nil {
		t.Fatal(err)
	}
	return rep, plan, time.Since(start)
}

func scanBatch(b *output.Batch, cols []output.Column, nBands int, keep func(r *fieldRow)) error {
	idx := map[string]int{}
	for i, c := range cols {
		idx[c.Name] = i
	}
	need := func(name string) (int, error) {
		i, ok := idx[name]
		if !ok {
			return 0, fmt.Errorf("no column %q", name)
		}
		return i, nil
	}
	f32 := func(i, j int) float64 {
		if b.Valid != nil && b.Valid[i] != nil && !b.Valid[i][j] {
			return math.NaN()
		}
		return float64(b.Cols[i].([]float32)[j])
	}
	names := []string{"component", "stage", "distance_pc", "mass_initial_msun", "mass_msun",
		"companion_mass_msun", "is_binary", "detected", "l_deg", "b_deg", "dominant_stage",
		"age_yr", "feh", "companion_mass_initial_msun"}
	pos := make([]int, len(names))
	for k, n := range names {
		i, err := need(n)
		if err != nil {
			return err
		}
		pos[k] = i
	}
	absV, hasV := idx["abs_mag_V"]
	r := &fieldRow{app: make([]float64, nBands), mag: make([]float64, nBands)}
	for j := 0; j < b.N; j++ {
		r.component = b.Cols[pos[0]].([]string)[j]
		r.stage = b.Cols[pos[1]].([]string)[j]
		r.distancePc = f32(pos[2], j)
		r.massInit = f32(pos[3], j)
		r.massMsun = f32(pos[4], j)
		r.hasCompanion = b.Cols[pos[6]].([]bool)[j]
		r.compMassMsun = 0
		if r.hasCompanion {
			if m := f32(pos[5], j); !math.IsNaN(m) {
				r.compMassMsun = m
			}
		}
		r.detected = b.Cols[pos[7]].([]bool)[j]
		r.lDeg = b.Cols[pos[8]].([]float64)[j]
		r.bDeg = b.Cols[pos[9]].([]float64)[j]
		r.dominantStage = b.Cols[pos[10]].([]string)[j]
		r.ageYr, r.feh = f32(pos[11], j), f32(pos[12], j)
		r.compMassInit = 0
		if r.hasCompanion {
			r.compMassInit = f32(pos[13], j)
		}
		r.absV = math.NaN()
		if hasV {
			r.absV = f32(absV, j)
		}
		for k := 0; k < nBands; k++ {
			r.app[k] = f32(synth.BandColumn(k, 1), j)
			r.mag[k] = f32(synth.BandColumn(k, 2), j)
		}
		keep(r)
	}
	return nil
}

// refValues reads testdata/field/population_excerpt.tsv (rows copied from the shared
// reference table population_values.tsv, with its source header): quantity → value.
func refValues(t *testing.T) map[string]float64 {
	t.Helper()
	f, err := os.Open(filepath.Join("..", "testdata", "field", "population_excerpt.tsv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	out := map[string]float64{}
	sc := bufio.NewScanner(f)
	header := true
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || line == "" {
			continue
		}
		if header { // the column-name row
			header = false
			continue
		}
		fields := strings.Split(line, "\t")
		v, err := strconv.ParseFloat(fields[1], 64)
		if err != nil {
			t.Fatalf("population_excerpt.tsv: %s: %v", fields[0], err)
		}
		out[fields[0]] = v
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return out
}

// ksCritical returns the two-sample Kolmogorov–Smirnov critical distance at false-alarm
// rate alpha for samples of sizes n and m (asymptotic form, e.g. Press et al., Numerical
// Recipes, §14.3; common practice): D_crit = sqrt(−ln(α/2)/2) · sqrt((n+m)/(n m)).
func ksCritical(alpha float64, n, m int) float64 {
	return math.Sqrt(-math.Log(alpha/2)/2) * math.Sqrt(float64(n+m)/(float64(n)*float64(m)))
}

// ---------------------------------------------------------------------------------------
// 1. Magnitude-limit-aware sampling.

// skipField is a high-latitude field (invented survey depths g ≈ 22, r ≈ 21.5) with the
// exponential dust disc; %RADIUS% and %SKIP% are replaced per run.
const skipField = `seed: 31
components:
  - {name: thin, kind: thin_disc}
  - {name: thick, kind: thick_disc}
  - {name: halo, kind: halo}
  - {name: bulge, kind: bulge}
field:
  area: {kind: cone, l_deg: 60, b_deg: 40, radius_deg: %RADIUS%}
  dust: {model: disc}
  skip_undetectable: %SKIP%
survey:
  bands:
    - {band: g, limit_5sigma_mag: 22, saturation_mag: 14}
    - {band: r, limit_5sigma_mag: 21.5, saturation_mag: 14}
output: {path: cat, formats: [parquet]}
`

func skipScenario(radiusDeg string, skip bool) string {
	s := strings.Replace(skipField, "%RADIUS%", radiusDeg, 1)
	return strings.Replace(s, "%SKIP%", strconv.FormatBool(skip), 1)
}

// TestFieldSkipUndetectableSameSample: issue 6 asks that the magnitude-limit-aware
// sampling skip only stars that can never pass the detection rule, so the detected
// sample is statistically the same with and without it (same seed). Checks:
//
//  1. total and per-component numbers of detected stars agree within Poisson:
//     |N1 − N2| < 4 √(N1 + N2) (false-alarm rate 6e-5 per comparison for independent
//     Poisson counts; the runs share their seed, and any correlation only narrows the
//     difference);
//  2. the observed r magnitudes of the detected stars agree by a two-sample KS test at
//     false-alarm rate 1e-3 (D_crit from the asymptotic distribution, common practice);
//  3. soundness of the bound on the actual sample: every star detected in the full run is
//     one the skipping run may draw (exact: any other is a detectable star the bound
//     would have dropped), except stars whose true magnitude is more than 3 mag below the
//     5σ depth: those pass only by a ≥ 4.7σ noise fluctuation, the bound drops them by
//     design, and their number must stay within that Gaussian tail's rate.
//
// Default: a 0.5 deg² cone (radius 0.4°); STARMOCK_LONG=1: 7 deg² (radius 1.5°).
func TestFieldSkipUndetectableSameSample(t *testing.T) {
	radius := "0.4"
	if longField() {
		radius = "1.5"
	}
	skipSameSample(t, skipScenario(radius, false), skipScenario(radius, true), 1, 1000)
}

// TestFieldSkipUndetectableBright is the same comparison for a bright survey, where the
// bound drops almost every system and its age cells decide: a 12.6 deg² cone (radius
// 2°) at (l, b) = (60°, 20°) seen to V ≈ 10 (the whole-sky benchmark's regime, two
// magnitudes deeper for more stars). Checks 1–3 as above on V; at least 50 detected
// stars.
func TestFieldSkipUndetectableBright(t *testing.T) {
	off := strings.Replace(fmt.Sprintf(brightField, false), "radius_deg: 5.64", "radius_deg: 2", 1)
	off = strings.Replace(off, "limit_5sigma_mag: 8,", "limit_5sigma_mag: 10,", 1)
	on := strings.Replace(off, "skip_undetectable: false", "skip_undetectable: true", 1)
	skipSameSample(t, off, on, 0, 50)
}

// skipSameSample runs a field without (off) and with (on) the bound and makes the checks
// of TestFieldSkipUndetectableSameSample, comparing the observed magnitudes of band
// index band and requiring at least minDetected detected stars in the full run.
func skipSameSample(t *testing.T, offText, onText string, band, minDetected int) {
	type sample struct {
		n       int
		perComp map[string]int
		magR    []float64
		rep     *Report
		elapsed time.Duration
	}
	type detRow struct {
		comp                      string
		dPc, m1, m2, age, fq, app float64
	}
	var fullRows []detRow // detected stars of the run without the bound
	var samples [2]sample
	var violations, noiseOnly int
	for k, skip := range []bool{false, true} {
		s := sample{perComp: map[string]int{}}
		text := offText
		if skip {
			text = onText
		}
		rep, plan, el := fieldRun(t, text, func(r *fieldRow) {
			if !r.detected {
				return
			}
			s.n++
			s.perComp[r.component]++
			if !math.IsNaN(r.mag[band]) {
				s.magR = append(s.magR, r.mag[band])
			}
			if !skip {
				fullRows = append(fullRows, detRow{r.component, r.distancePc, r.massInit, r.compMassInit, r.ageYr, r.feh, r.app[band]})
			}
		})
		s.rep, s.elapsed = rep, el
		samples[k] = s
		if skip {
			// Soundness: every detected star of the full run must be one the bound keeps
			// (synth.ComponentPlan.MayDetect). Catalogue values are float32 and [Fe/H] is
			// rounded to 0.01 dex: a star is accepted if the bound keeps it at the inner
			// shell edge's side of its distance and at either side of its rounded [Fe/H].
			cps := map[string]*synth.ComponentPlan{}
			for _, cp := range plan.Components {
				cps[cp.Name] = cp
			}
			m5 := plan.Survey.Specs[band].Limit5SigmaMag
			for _, row := range fullRows {
				cp := cps[row.comp]
				d := row.dPc * (1 - 1e-6)
				if cp.MayDetect(d, row.m1, row.m2, row.age, row.fq-0.004) || cp.MayDetect(d, row.m1, row.m2, row.age, row.fq+0.004) {
					continue
				}
				if row.app > m5+3 {
					noiseOnly++ // detected by an upward noise fluctuation of ≥ 4.7σ
					t.Logf("noise-only detection dropped by the bound: %s star at %.1f pc, true magnitude %.2f (5σ depth %.2f)", row.comp, row.dPc, row.app, m5)
					continue
				}
				violations++
				if violations <= 5 {
					t.Errorf("detected %s star at %.1f pc (m1 %.4f, m2 %.4f Msun, age %.4g yr, [Fe/H] %.2f, true magnitude %.2f) is one the skip bound never draws",
						row.comp, row.dPc, row.m1, row.m2, row.age, row.fq, row.app)
				}
			}
		}
	}
	off, on := samples[0], samples[1]
	t.Logf("skip off: %d stars simulated, %d detected, %v; skip on: %d simulated, %d detected, %v",
		off.rep.Stars, off.n, off.elapsed.Round(time.Millisecond), on.rep.Stars, on.n, on.elapsed.Round(time.Millisecond))
	if violations > 0 {
		t.Errorf("%d detected stars lie outside the skip bound", violations)
	}
	// Stars more than 3 mag below the 5σ depth pass only by a ≥ 4.7σ upward fluctuation
	// of their flux (one-sided Gaussian tail 1.3e-6, common practice); the bound drops
	// them by design. Their number must stay within that rate over every system drawn
	// without the bound (Poisson, 4σ).
	if e := 1.3e-6 * float64(off.rep.Stars); float64(noiseOnly) > e+4*math.Sqrt(e)+1 {
		t.Errorf("%d noise-only detections dropped by the bound, more than the Gaussian tail allows (%.2f expected at most)", noiseOnly, e)
	}
	if off.n < minDetected {
		t.Fatalf("only %d detected stars in the full run; the field is too small for the test", off.n)
	}
	check := func(what string, n1, n2 int) {
		d, lim := math.Abs(float64(n1-n2)), 4*math.Sqrt(float64(n1+n2))
		t.Logf("%-12s detected: off %6d, on %6d (|diff| %4.0f, limit %.0f)", what, n1, n2, d, lim)
		if d >= lim && n1+n2 > 0 {
			t.Errorf("%s: detected counts differ: %d without the bound, %d with it (limit %.0f)", what, n1, n2, lim)
		}
	}
	check("all", off.n, on.n)
	for _, c := range []string{"thin", "thick", "halo", "bulge"} {
		check(c, off.perComp[c], on.perComp[c])
	}
	sort.Float64s(off.magR)
	sort.Float64s(on.magR)
	d := stat.KolmogorovSmirnov(off.magR, nil, on.magR, nil)
	crit := ksCritical(1e-3, len(off.magR), len(on.magR))
	t.Logf("observed magnitudes (band %d) of detected stars: KS D = %.4f, critical %.4f (alpha 1e-3)", band, d, crit)
	if d > crit {
		t.Errorf("observed magnitudes (band %d) differ with and without the bound: KS D = %.4f > %.4f", band, d, crit)
	}
}

// BenchmarkSkipUndetectable times Galactic fields with the bound off and on: the deep
// field of TestFieldSkipUndetectableSameSample (g ≈ 22, r ≈ 21.5 at b = 40°) in a 0.5 deg²
// cone (radius 0.4°) and a 12.6 deg² cone (radius 2°), where most stars can be detected
// and the bound saves little, and a bright survey (V ≈ 8, the whole-sky benchmark's
// depth) in a 100 deg² cone (radius 5.64°) at b = 20°, where almost nothing can. It
// reports the systems drawn per run. The bound's brightness grid is built once per run
// (about 1–2 s of CPU), so it pays off only when the field is large or shallow.
func BenchmarkSkipUndetectable(b *testing.B) {
	type field struct{ name, text string }
	var fields []field
	for _, radius := range []string{"0.4", "2"} {
		for _, skip := range []bool{false, true} {
			name := "deep/radius" + radius + "deg/off"
			if skip {
				name = "deep/radius" + radius + "deg/on"
			}
			fields = append(fields, field{name, skipScenario(radius, skip)})
		}
	}
	for _, skip := range []bool{false, true} {
		name := "bright/radius5.64deg/off"
		if skip {
			name = "bright/radius5.64deg/on"
		}
		fields = append(fields, field{name, fmt.Sprintf(brightField, skip)})
	}
	for _, f := range fields {
		b.Run(f.name, func(b *testing.B) {
			b.ReportAllocs()
			var stars int64
			for i := 0; i < b.N; i++ {
				rep, _, _ := fieldRun(b, f.text, func(*fieldRow) {})
				stars = rep.Stars
			}
			b.ReportMetric(float64(stars), "stars/op")
		})
	}
}

// brightField is a 100 deg² cone at (l, b) = (60°, 20°) seen to V ≈ 8 (%v: skip_undetectable).
const brightField = `seed: 37
components:
  - {name: thin, kind: thin_disc}
  - {name: thick, kind: thick_disc}
  - {name: halo, kind: halo}
  - {name: bulge, kind: bulge}
field:
  area: {kind: cone, l_deg: 60, b_deg: 20, radius_deg: 5.64}
  min_distance_pc: 1
  max_distance_pc: 30000
  skip_undetectable: %v
survey:
  bands: [{band: V, limit_5sigma_mag: 8, saturation_mag: -30}]
output: {path: cat, formats: [parquet]}
`

// ---------------------------------------------------------------------------------------
// 2. Whole-sky star counts.

// skyField holds all four Galactic components out to 30 kpc behind the default dust disc,
// observed in V alone; %AREA% and %LIMIT% are replaced per run.
const skyField = `seed: 41
components:
  - {name: thin, kind: thin_disc}
  - {name: thick, kind: thick_disc}
  - {name: halo, kind: halo}
  - {name: bulge, kind: bulge}
field:
  area: %AREA%
  min_distance_pc: 1
  max_distance_pc: 30000
survey:
  bands: [{band: V, limit_5sigma_mag: %LIMIT%, saturation_mag: -30}]
output: {path: cat, formats: [parquet]}
`

// skyCounts runs skyField over the given area and returns, for each magnitude m in mags,
// the counts of stars with true app_mag_V < m per HEALPix pixel (nside, Galactic, RING)
// of the listed pixels; pixels == nil means the whole sky, returned as one entry.
func skyCounts(t *testing.T, limit string, nside int64, pixels []int64, mags []float64) ([][]float64, *Report, time.Duration) {
	t.Helper()
	area := "{kind: galactic_box, l_min_deg: 0, l_max_deg: 360, b_min_deg: -90, b_max_deg: 90}"
	var hp *galaxy.HEALPix
	slot := map[int64]int{}
	if pixels != nil {
		ps := make([]string, len(pixels))
		for i, p := range pixels {
			ps[i] = strconv.FormatInt(p, 10)
			slot[p] = i
		}
		area = fmt.Sprintf("{kind: healpix, nside: %d, pixels: [%s]}", nside, strings.Join(ps, ", "))
		var err error
		if hp, err = galaxy.NewHEALPix(nside, galaxy.Ring); err != nil {
			t.Fatal(err)
		}
	}
	text := strings.Replace(strings.Replace(skyField, "%AREA%", area, 1), "%LIMIT%", limit, 1)
	n := 1
	if pixels != nil {
		n = len(pixels)
	}
	counts := make([][]float64, len(mags))
	for i := range counts {
		counts[i] = make([]float64, n)
	}
	bad := 0
	rep, _, el := fieldRun(t, text, func(r *fieldRow) {
		k := 0
		if hp != nil {
			pix := hp.Ang2Pix((90-r.bDeg)*math.Pi/180, r.lDeg*math.Pi/180)
			var ok bool
			if k, ok = slot[pix]; !ok {
				bad++
				return
			}
		}
		for i, m := range mags {
			if r.app[0] < m {
				counts[i][k]++
			}
		}
	})
	if bad > 0 {
		t.Errorf("%d stars outside the requested HEALPix pixels", bad)
	}
	return counts, rep, el
}

// TestFieldStarCountsWholeSky compares the model's whole-sky counts of stars brighter than
// V (true apparent magnitude, dust included) with the Hipparcos-based cumulative counts
// compiled in OEIS A053406 (population_values.tsv rows N_stars_brighter_than_V4…V8, copied
// to testdata/field/population_excerpt.tsv). Bar: a factor 1.5 (issue 6's first bar), with
// the model's own sampling error added: the check is
//
//	|ln(N_model/N_ref)| < ln 1.5 + 3 σ/N_model
//
// where σ is the larger of the Poisson error and, for a sky sample, the scatter between
// the sampled pixels (the standard error of an equal-area systematic sample, common
// practice). Catalogue counts are complete at these magnitudes (the reference row says to
// V ≈ 8–9), and their own Poisson errors are ≤ 4 %, so they are neglected.
//
// Runtime (2 CPUs, with the detectability bound): the whole sky to a limit of V = 6 takes
// ~20 s (9·10⁶ proposals drawn), to V = 8 ~2 min (1.2·10⁸). The default version counts
// V < 4, 5, 6 on the whole sky (limit V = 6); STARMOCK_LONG=1 counts V < 4 … 8 (limit
// V = 8). The per-pixel mode (an equal-area systematic sample of HEALPix pixels) is kept
// for quick experiments.
func TestFieldStarCountsWholeSky(t *testing.T) {
	ref := refValues(t)
	type job struct {
		limit  string
		mags   []float64
		pixels []int64
	}
	jobs := []job{{"6", []float64{4, 5, 6}, nil}}
	if longField() {
		jobs = []job{{"8", []float64{4, 5, 6, 7, 8}, nil}}
	}
	const npix = 192 // nside 4
	for _, j := range jobs {
		counts, rep, el := skyCounts(t, j.limit, 4, j.pixels, j.mags)
		t.Logf("limit V = %s, pixels %v: %d systems simulated in %v", j.limit, j.pixels, rep.Stars, el.Round(time.Second))
		for i, m := range j.mags {
			want := ref[fmt.Sprintf("N_stars_brighter_than_V%d", int(m))]
			if want == 0 {
				t.Fatalf("no reference count for V < %g", m)
			}
			var got, sigma float64
			if j.pixels == nil {
				got = counts[i][0]
				sigma = math.Sqrt(got)
			} else {
				k := float64(len(j.pixels))
				scale := npix / k
				sum := 0.0
				for _, c := range counts[i] {
					sum += c
				}
				got = scale * sum
				sd := stat.StdDev(counts[i], nil)
				sigma = math.Max(math.Sqrt(scale*got), npix*sd/math.Sqrt(k))
			}
			ratio := got / want
			t.Logf("V < %g: model %.0f ± %.0f, reference %.0f (OEIS A053406, Hipparcos), ratio %.3f; per pixel %v",
				m, got, sigma, want, ratio, counts[i])
			if got == 0 {
				t.Errorf("V < %g: no model star (reference %.0f)", m, want)
				continue
			}
			if math.Abs(math.Log(ratio)) > math.Log(1.5) {
				t.Logf("V < %g: NOTE the point estimate %.3f is outside the factor-1.5 bar; the check below allows the sampling error (%.0f %%)", m, ratio, 100*sigma/got)
			}
			if lim := math.Log(1.5) + 3*sigma/got; math.Abs(math.Log(ratio)) > lim {
				t.Errorf("V < %g: model/reference = %.3f is outside the factor-1.5 bar (allowed |ln ratio| < %.3f with the model's sampling error): the model's bright-star counts disagree with Hipparcos",
					m, ratio, lim)
			}
		}
	}
}

// ---------------------------------------------------------------------------------------
// 3. Local density and luminosity function.

// localField is the whole sky out to %R% pc, no dust, every star simulated.
const localField = `seed: 51
components:
  - {name: thin, kind: thin_disc}
  - {name: thick, kind: thick_disc}
  - {name: halo, kind: halo}
  - {name: bulge, kind: bulge}
field:
  area: {kind: cone, l_deg: 0, b_deg: 90, radius_deg: 180}
  min_distance_pc: 0.5
  max_distance_pc: %R%
  shells: 16
  dust: {model: none}
  skip_undetectable: false
survey:
  bands: [{band: V, limit_5sigma_mag: 30, saturation_mag: -30}]
output: {path: cat, formats: [parquet]}
`

// localLF is a local luminosity function of stars, Φ(M_V) in stars pc⁻³ mag⁻¹ in 1-mag
// bins centred on integer M_V. All values are FROM MEMORY, rounded readings of the shape
// of the nearby-star luminosity function of Wielen, Jahreiß & Krüger (1983, IAU Colloq.
// 76, 163) as updated with Hipparcos and the 8/20 pc samples of Reid, Gizis & Hawley
// (2002, AJ 124, 2721): a rise from ~3e-4 at M_V = 1 to ~3e-3 for G dwarfs, the shallow
// "Wielen dip" near M_V = 7, a maximum of ~1e-2 near M_V = 12–13 (early/mid M dwarfs) and a
// decline beyond. We have not checked these numbers against the papers: treat them as
// good to a factor ~1.5, which with the model's own approximations is why the test
// allows a factor 2.
var localLF = []struct{ mv, phi float64 }{
	{1, 3e-4}, {2, 5e-4}, {3, 1.0e-3}, {4, 2.0e-3}, {5, 3.0e-3}, {6, 3.5e-3}, {7, 3.0e-3},
	{8, 4.0e-3}, {9, 5.0e-3}, {10, 6.0e-3}, {11, 8.0e-3}, {12, 1.0e-2}, {13, 1.0e-2},
	{14, 8.0e-3}, {15, 6.0e-3},
}

// poissonOutside reports whether n lies outside the central band of a Poisson law with
// mean anywhere in [muLo, muHi] at two-sided false-alarm rate alpha: n < Q(α/2; muLo) or
// n > Q(1−α/2; muHi).
func poissonOutside(n, muLo, muHi, alpha float64) bool {
	lo := distuv.Poisson{Lambda: muLo}
	hi := distuv.Poisson{Lambda: muHi}
	tooSmall := n < muLo && lo.CDF(n) < alpha/2     // P(N ≤ n | muLo)
	tooLarge := n > muHi && 1-hi.CDF(n-1) < alpha/2 // P(N ≥ n | muHi)
	return tooSmall || tooLarge
}

// TestFieldLocalDensityAndLF simulates every star within 25 pc of the Sun (whole sky, no
// dust, no skipping; STARMOCK_LONG=1: 100 pc, the census volume) and checks:
//
//  1. the present-day mass density of stars and remnants (primaries plus companions,
//     column mass_msun and companion_mass_msun) against the model's normalisation, 0.040
//     Msun pc⁻³ (population_values.tsv row local_stellar_mass_density_100pc_kroupa, Gaia
//     100 pc census, arXiv:2507.06052), averaged over the sphere with the model's own
//     density law (the vertical curvature over 25 pc is ~0.1 %). Tolerance: 4 σ of the
//     compound-Poisson error √(Σ m²)/V plus 5 % for the pipeline's conversion from present
//     to initial mass (a 20000-primary Monte Carlo per component, from primaries only, applied
//     to companions too);
//  2. the luminosity function of primaries (abs_mag_V; companions are not counted: the
//     catalogue has no companion magnitude, so the model's faint bins are low by up to the
//     binary fraction, ~25 %) against localLF (from memory): each bin's count must be
//     compatible with a Poisson mean anywhere between half and twice the reference (false
//     alarm 1e-3 per bin).
func TestFieldLocalDensityAndLF(t *testing.T) {
	ref := refValues(t)
	rMax := 25.0
	if longField() {
		rMax = 100
	}
	const rMin = 0.5
	text := strings.Replace(localField, "%R%", strconv.FormatFloat(rMax, 'g', -1, 64), 1)
	var mass, mass2 float64
	var nSys, nComp int
	nRemnant := 0
	bins := make([]float64, len(localLF))
	rep, _, el := fieldRun(t, text, func(r *fieldRow) {
		m := r.massMsun + r.compMassMsun
		mass += m
		mass2 += m * m
		nSys++
		if r.hasCompanion {
			nComp++
		}
		if r.stage == "carbon_oxygen_white_dwarf" || r.stage == "helium_white_dwarf" || r.stage == "oxygen_neon_white_dwarf" ||
			r.stage == "neutron_star" || r.stage == "black_hole" {
			nRemnant++
		}
		if !math.IsNaN(r.absV) {
			i := int(math.Floor(r.absV + 0.5 - localLF[0].mv))
			if i >= 0 && i < len(bins) {
				bins[i]++
			}
		}
	})
	vol := 4 * math.Pi / 3 * (rMax*rMax*rMax - rMin*rMin*rMin)
	t.Logf("sphere %.1f–%.0f pc: %d systems (%d with companions, %d remnant primaries), %v", rMin, rMax, nSys, nComp, nRemnant, el.Round(time.Millisecond))
	_ = rep

	// Model density averaged over the sphere (midpoint rule in r, cos θ, φ; the density is
	// smooth here, 1e-4 accuracy is ample).
	model := galaxy.DefaultModel()
	var avg, wsum float64
	const nr, nc, nphi = 24, 24, 12
	for i := 0; i < nr; i++ {
		r := rMin + (rMax-rMin)*(float64(i)+0.5)/nr
		for j := 0; j < nc; j++ {
			b := math.Asin(-1+2*(float64(j)+0.5)/nc) * 180 / math.Pi
			for k := 0; k < nphi; k++ {
				l := 360 * (float64(k) + 0.5) / nphi
				x, y, z := model.Frame.ToGalactocentric(l, b, r)
				avg += model.DensityMsunPc3(x, y, z) * r * r
				wsum += r * r
			}
		}
	}
	want := avg / wsum * ref["local_stellar_mass_density_100pc_kroupa"] / model.DensityAtSunMsunPc3()
	got := mass / vol
	sigma := math.Sqrt(mass2) / vol
	t.Logf("present-day stellar mass density: %.5f ± %.5f Msun/pc^3; model normalisation %.5f (0.040 at the Sun, arXiv:2507.06052); ratio %.3f",
		got, sigma, want, got/want)
	if math.Abs(got-want) > 4*sigma+0.05*want {
		t.Errorf("local mass density %.5f Msun/pc^3, want %.5f ± (4×%.5f + 5%%)", got, want, sigma)
	}

	for i, row := range localLF {
		mu := row.phi * vol
		phi := bins[i] / vol
		t.Logf("M_V %4.1f: model %.2e pc^-3 mag^-1 (%4.0f primaries), reference %.1e (from memory), ratio %.2f",
			row.mv, phi, bins[i], row.phi, phi/row.phi)
		if poissonOutside(bins[i], mu/2, 2*mu, 1e-3) {
			t.Errorf("M_V = %g: %.0f primaries in %.0f pc^3 (%.2e pc^-3 mag^-1) is incompatible with the local luminosity function %.1e (from memory) within a factor 2",
				row.mv, bins[i], vol, phi, row.phi)
		}
	}
}

// ---------------------------------------------------------------------------------------
// 4. Structure: polar counts.

// poleField is a cone of %RADIUS% at b = %B%, 300–2000 pc, no dust, every star simulated.
const poleField = `seed: %SEED%
components:
  - {name: thin, kind: thin_disc}
  - {name: thick, kind: thick_disc}
  - {name: halo, kind: halo}
field:
  area: {kind: cone, l_deg: 0, b_deg: %B%, radius_deg: %RADIUS%}
  min_distance_pc: 300
  max_distance_pc: 2000
  dust: {model: none}
  skip_undetectable: false
survey:
  bands: [{band: V, limit_5sigma_mag: 30, saturation_mag: -30}]
output: {path: cat, formats: [parquet]}
`

// coneMass integrates a component's present-day density over a cone of radius radiusDeg
// about the Galactic pole (north if sign > 0) from d0 to d1 pc, by nested Gauss–Legendre
// quadrature (gonum quad.Fixed): ∫ dφ ∫ sin ψ dψ ∫ ρ d² dd.
func coneMass(m *galaxy.Model, c galaxy.Component, sign, radiusDeg, d0, d1 float64) float64 {
	rad := radiusDeg * math.Pi / 180
	return quad.Fixed(func(phi float64) float64 {
		return quad.Fixed(func(psi float64) float64 {
			b := sign * (90 - psi*180/math.Pi)
			l := phi * 180 / math.Pi
			return math.Sin(psi) * quad.Fixed(func(d float64) float64 {
				x, y, z := m.Frame.ToGalactocentric(l, b, d)
				return c.DensityMsunPc3(x, y, z) * d * d
			}, d0, d1, 48, nil, 0)
		}, 0, rad, 12, nil, 0)
	}, 0, 2*math.Pi, 8, nil, 0)
}

// TestFieldPoleSymmetry: toward the two Galactic poles the counts of stars between 300 pc
// and 2 kpc differ only because the Sun sits z⊙ = 25 pc above the mid-plane
// (Bland-Hawthorn & Gerhard 2016, the model's default): for each component the expected
// north/south ratio is the ratio of the density law integrated over the two cones
// (galaxy.DefaultModel, our own nested Gauss–Legendre; for the thin disc ≈ e^(−2 z⊙/H) =
// 0.846). Checks, per component:
//
//  1. the plan's expected numbers of systems (summed over shells) have the north/south
//     ratio of the integrated density law to 1e-4 (both are quadratures of a smooth
//     integrand accurate to ≲1e-6; the pipeline integrates with its own shell nodes);
//  2. each run's realised count is within 4 √N of its expected number (Poisson, false
//     alarm 6e-5);
//  3. given the total T = N + S, the north count N lies within 4 √(T p (1−p)) of T p with
//     p = M_N/(M_N + M_S) (binomial, false alarm 6e-5 for independent runs).
//
// Both cones use the same seed: the pipeline converts present-day to initial mass with a
// Monte Carlo over 20000 primaries drawn from the seed's plan stream, and that factor moves
// the expected numbers by ~1.5 % rms between seeds (measured: thin-disc totals 12190–12618
// for seeds 61–66 in the 2° cone), which would swamp a 1 % test of the ratio. Sharing the
// seed correlates the Poisson draws of the two cones, which can only make check 3 more
// lenient, never raise false alarms. Default: cones of radius 2°; STARMOCK_LONG=1: 5°.
func TestFieldPoleSymmetry(t *testing.T) {
	radius := 2.0
	if longField() {
		radius = 5
	}
	counts := [2]map[string]float64{{}, {}}
	expected := [2]map[string]float64{{}, {}}
	for k, b := range []string{"90", "-90"} {
		text := strings.NewReplacer("%SEED%", "61", "%B%", b, "%RADIUS%", strconv.FormatFloat(radius, 'g', -1, 64)).Replace(poleField)
		rep, plan, el := fieldRun(t, text, func(r *fieldRow) {
			if r.distancePc > 300 {
				counts[k][r.component]++
			}
		})
		for _, cp := range plan.Components {
			for _, sh := range cp.Shells() {
				expected[k][cp.Name] += sh.ExpectedSystems
			}
		}
		t.Logf("b = %s: %d systems, %v", b, rep.Stars, el.Round(time.Millisecond))
	}
	model := galaxy.DefaultModel()
	for _, c := range []struct {
		name string
		comp galaxy.Component
	}{{"thin", model.ThinDisc}, {"thick", model.ThickDisc}, {"halo", model.Halo}} {
		mn := coneMass(model, c.comp, 1, radius, 300, 2000)
		ms := coneMass(model, c.comp, -1, radius, 300, 2000)
		law := mn / ms
		en, es := expected[0][c.name], expected[1][c.name]
		if rel := (en/es)/law - 1; math.Abs(rel) > 1e-4 {
			t.Errorf("%s: plan's expected north/south %.6f, integrated density law %.6f (rel. diff %.2g > 1e-4)", c.name, en/es, law, rel)
		}
		n, s := counts[0][c.name], counts[1][c.name]
		for k, pair := range [][2]float64{{n, en}, {s, es}} {
			if math.Abs(pair[0]-pair[1]) > 4*math.Sqrt(pair[1]) {
				t.Errorf("%s cone %d: %.0f stars, plan expects %.1f (4σ Poisson %.0f)", c.name, k, pair[0], pair[1], 4*math.Sqrt(pair[1]))
			}
		}
		total := n + s
		p := mn / (mn + ms)
		sd := math.Sqrt(total * p * (1 - p))
		t.Logf("%-6s north %7.0f south %7.0f: ratio %.4f ± %.4f; plan %.4f; density law %.4f", c.name, n, s, n/s, (n/s)*math.Sqrt(1/n+1/s), en/es, law)
		if total < 100 {
			t.Errorf("%s: only %.0f stars beyond 300 pc toward the poles", c.name, total)
			continue
		}
		if math.Abs(n-total*p) >= 4*sd {
			t.Errorf("%s: north/south = %.0f/%.0f = %.4f, density law %.4f (4σ binomial band ±%.0f stars)", c.name, n, s, n/s, law, 4*sd)
		}
	}
}
