package simulate

import (
	"bytes"
	"context"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"

	"github.com/starmock/starmock/evolve"
	"github.com/starmock/starmock/imf"
	"github.com/starmock/starmock/output"
	"github.com/starmock/starmock/synth"
	"github.com/starmock/starmock/synth/observe"
)

// cluster is a small invented test population ("Test Cluster A") used by the pipeline
// tests; %s markers are replaced per test.
const cluster = `seed: 99
components:
  - name: test_cluster_a
    total_mass_msun: 1500
    mass_function: {kind: kroupa, min_mass_msun: 0.1, max_mass_msun: 20}
    age: {kind: burst, age: 1.2Gyr, spread: 20Myr}
    metallicity: {kind: gaussian, feh: -0.2, sigma_dex: 0.05}
    binaries: {fraction: 0.35, mass_ratio: {kind: flat, min: 0.1, max: 1}}
    geometry: {kind: plummer, distance_pc: 2500, scale_radius_pc: 2, ra_deg: 210, dec_deg: -40}
    extinction: {law: ccm89, rv: 3.1, av_mag: 0.8, av_spread_mag: 0.05}
survey:
  bands:
    - {band: g, limit_5sigma_mag: 23.5, saturation_mag: 14, completeness: logistic, completeness_50_mag: 23.7}
    - {band: r, limit_5sigma_mag: 23.0, saturation_mag: 14}
    - {band: i, limit_5sigma_mag: 22.4, saturation_mag: 13.5}
output: {path: cat, formats: [%FORMATS%], chunk_size: 512}
`

func parse(t *testing.T, text string) *synth.Scenario {
	t.Helper()
	s, err := synth.Parse("test.yaml", []byte(text))
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func run(t *testing.T, text string, opts Options) *Report {
	t.Helper()
	rep, err := Run(context.Background(), parse(t, text), opts)
	if err != nil {
		t.Fatal(err)
	}
	return rep
}

func readTable(t *testing.T, f output.Format, path string) *output.Table {
	t.Helper()
	tab, err := output.ReadFile(f, path, nil)
	if err != nil {
		t.Fatal(err)
	}
	return tab
}

func col[T any](t *testing.T, tab *output.Table, name string) ([]T, []bool) {
	t.Helper()
	for i, c := range tab.Columns {
		if c.Name == name {
			v := tab.Batch.Cols[i].([]T)[:tab.Batch.N]
			var valid []bool
			if tab.Batch.Valid != nil && tab.Batch.Valid[i] != nil {
				valid = tab.Batch.Valid[i][:tab.Batch.N]
			}
			return v, valid
		}
	}
	t.Fatalf("no column %q", name)
	return nil, nil
}

// TestWorkersByteIdentical: the same scenario and seed give byte-identical files in every
// format for 1, 2 and 8 workers (DESIGN.md, determinism).
func TestWorkersByteIdentical(t *testing.T) {
	text := strings.Replace(cluster, "%FORMATS%", "parquet, arrow, fits, csv", 1)
	var first map[string][]byte
	for _, w := range []int{1, 2, 8} {
		dir := t.TempDir()
		rep := run(t, text, Options{Workers: w, OutPath: filepath.Join(dir, "cat")})
		got := map[string][]byte{}
		for _, f := range rep.Files {
			b, err := os.ReadFile(f.Path)
			if err != nil {
				t.Fatal(err)
			}
			got[filepath.Base(f.Path)] = b
			side, err := os.ReadFile(output.SidecarPath(f.Path))
			if err != nil {
				t.Fatal(err)
			}
			got[filepath.Base(f.Path)+".manifest.json"] = side
		}
		if len(got) != 8 {
			t.Fatalf("workers %d: %d files, want 4 catalogues and 4 sidecars", w, len(got))
		}
		if first == nil {
			first = got
			continue
		}
		for name, b := range got {
			if !bytes.Equal(b, first[name]) {
				t.Errorf("workers %d: %s differs from the 1-worker run", w, name)
			}
		}
	}
}

// TestShardsConcatenate: the part files of shards 0..N−1, read in order, hold exactly the
// rows of the unsharded run.
func TestShardsConcatenate(t *testing.T) {
	text := strings.Replace(cluster, "%FORMATS%", "parquet", 1)
	dir := t.TempDir()
	whole := run(t, text, Options{OutPath: filepath.Join(dir, "whole")})
	const n = 3
	for i := 0; i < n; i++ {
		run(t, text, Options{OutPath: filepath.Join(dir, "parts"), ShardIndex: i, ShardCount: n})
	}
	a := readTable(t, output.Parquet, whole.Files[0].Path)
	b, err := output.ReadDataset(filepath.Join(dir, "parts"), output.Parquet, nil)
	if err != nil {
		t.Fatal(err)
	}
	if a.Batch.N != b.Batch.N || a.Batch.N == 0 {
		t.Fatalf("rows: whole %d, shards %d", a.Batch.N, b.Batch.N)
	}
	for i, c := range a.Columns {
		if !equalColumn(a.Batch, b.Batch, i) {
			t.Errorf("column %s differs between the whole run and the concatenated shards", c.Name)
		}
	}
}

func equalColumn(a, b *output.Batch, i int) bool {
	n := a.N
	va, vb := a.Valid[i], b.Valid[i]
	for j := 0; j < n; j++ {
		if (va == nil) != (vb == nil) || (va != nil && va[j] != vb[j]) {
			return false
		}
		if va != nil && !va[j] {
			continue
		}
		switch x := a.Cols[i].(type) {
		case []float32:
			y := b.Cols[i].([]float32)
			if math.Float32bits(x[j]) != math.Float32bits(y[j]) {
				return false
			}
		case []float64:
			if math.Float64bits(x[j]) != math.Float64bits(b.Cols[i].([]float64)[j]) {
				return false
			}
		case []int64:
			if x[j] != b.Cols[i].([]int64)[j] {
				return false
			}
		case []bool:
			if x[j] != b.Cols[i].([]bool)[j] {
				return false
			}
		case []string:
			if x[j] != b.Cols[i].([]string)[j] {
				return false
			}
		}
	}
	return true
}

// TestEqualMassBinaries: an unresolved pair of equal stars is 2.5 log10 2 = 0.7526 mag
// brighter than one of them (exact arithmetic). Every system here is a q ≈ 1 pair of
// main-sequence stars without dust at a fixed distance, so app − (abs + μ) = −0.7526.
// Tolerance 2e-3 mag: q ≥ 0.9999 makes the companion at most ~1e-3 mag fainter, and
// float32 magnitudes carry ~2e-6 relative error.
func TestEqualMassBinaries(t *testing.T) {
	text := `seed: 5
components:
  - name: twins
    stars: 3000
    mass_function: {kind: salpeter, min_mass_msun: 0.3, max_mass_msun: 1.2}
    age: {kind: burst, age: 500Myr}
    metallicity: {kind: fixed, feh: 0}
    binaries: {fraction: 1, mass_ratio: {kind: flat, min: 0.9999, max: 1}}
    geometry: {kind: fixed, distance_pc: 800, ra_deg: 10, dec_deg: 10}
    extinction: {law: ccm89, av_mag: 0}
survey:
  bands: [{band: V, limit_5sigma_mag: 25, saturation_mag: 5}]
output: {path: cat, formats: [parquet]}
`
	rep := run(t, text, Options{OutPath: filepath.Join(t.TempDir(), "cat")})
	tab := readTable(t, output.Parquet, rep.Files[0].Path)
	abs, _ := col[float32](t, tab, "abs_mag_V")
	app, _ := col[float32](t, tab, "app_mag_V")
	dm, _ := col[float32](t, tab, "distance_modulus_mag")
	bin, _ := col[bool](t, tab, "is_binary")
	want := -2.5 * math.Log10(2)
	for j := range abs {
		if !bin[j] {
			t.Fatalf("row %d is single with fraction 1", j)
		}
		if d := float64(app[j]) - float64(abs[j]) - float64(dm[j]); math.Abs(d-want) > 2e-3 {
			t.Errorf("row %d: pair brightening %.5f mag, want %.5f", j, d, want)
		}
	}
}

// TestTurnoffAndReddening: (1) the most massive main-sequence stars of a single-age
// cluster sit just below the mass whose main-sequence lifetime (package evolve) equals
// the cluster age, and no main-sequence star is above it; (2) with the same seed, adding
// A_V = 0.93 mag (E(B−V) = A_V/R_V = 0.3 for R_V = 3.1) reddens the B − V colour of the
// turn-off stars by 0.3 mag within 0.03 mag (band-integrated coefficients of a ~7000 K
// blackbody differ from the monochromatic E(B−V) by ~1 %; the photometry tests bound the
// coefficients to 0.02).
func TestTurnoffAndReddening(t *testing.T) {
	text := `seed: 11
components:
  - name: test_cluster_b
    stars: 40000
    mass_function: {kind: salpeter, min_mass_msun: 0.8, max_mass_msun: 3}
    age: {kind: burst, age: 1.5Gyr}
    metallicity: {kind: fixed, feh: 0}
    geometry: {kind: fixed, distance_pc: 1000, ra_deg: 10, dec_deg: 10}
    extinction: {law: ccm89, rv: 3.1, av_mag: %AV%}
survey:
  bands: [{band: B, limit_5sigma_mag: 25, saturation_mag: 2}, {band: V, limit_5sigma_mag: 25, saturation_mag: 2}]
output: {path: cat, formats: [parquet]}
`
	model, err := evolve.NewModel(evolve.ZFromFeH(0))
	if err != nil {
		t.Fatal(err)
	}
	// Turn-off mass by bisection of t_MS(M) = 1.5 Gyr.
	lo, hi := 0.8, 3.0
	for i := 0; i < 60; i++ {
		mid := 0.5 * (lo + hi)
		ts, err := model.Timescales(mid)
		if err != nil {
			t.Fatal(err)
		}
		if ts.MSLifetimeYr > 1.5e9 {
			lo = mid
		} else {
			hi = mid
		}
	}
	mTO := lo
	var colours [2]map[int64]float64
	for k, av := range []string{"0", "0.93"} {
		rep := run(t, strings.Replace(text, "%AV%", av, 1), Options{OutPath: filepath.Join(t.TempDir(), "cat")})
		tab := readTable(t, output.Parquet, rep.Files[0].Path)
		ids, _ := col[int64](t, tab, "star_id")
		m0, _ := col[float32](t, tab, "mass_initial_msun")
		st, _ := col[string](t, tab, "stage")
		bm, _ := col[float32](t, tab, "app_mag_B")
		vm, _ := col[float32](t, tab, "app_mag_V")
		maxMS := 0.0
		colours[k] = map[int64]float64{}
		for j := range ids {
			if st[j] == "main_sequence" {
				maxMS = math.Max(maxMS, float64(m0[j]))
				if float64(m0[j]) > 0.9*mTO {
					colours[k][ids[j]] = float64(bm[j] - vm[j])
				}
			}
		}
		if k == 0 && (maxMS > mTO*(1+1e-9) || maxMS < 0.99*mTO) {
			t.Errorf("most massive main-sequence star %.4f Msun, turn-off mass from t_MS %.4f Msun", maxMS, mTO)
		}
	}
	var sum float64
	n := 0
	for id, c0 := range colours[0] {
		if c1, ok := colours[1][id]; ok {
			sum += c1 - c0
			n++
		}
	}
	if n < 100 {
		t.Fatalf("only %d turn-off stars", n)
	}
	if e := sum / float64(n); math.Abs(e-0.3) > 0.03 {
		t.Errorf("turn-off reddening E(B-V) = %.4f, want 0.3 ± 0.03", e)
	}
}

// TestNoiseAndCounts checks, on one run: (1) the flux pulls (observed − true)/error are
// standard normal (KS at false-alarm rate 1e-3, D_crit = 1.949/√n); (2) the realised total
// initial mass of the primaries is within half the largest allowed mass of the target
// (the stop-nearest rule); (3) the fraction of primaries above 1 Msun follows the IMF and
// (4) the binary fraction follows the scenario, both within 4 binomial standard errors.
func TestNoiseAndCounts(t *testing.T) {
	text := strings.Replace(cluster, "%FORMATS%", "parquet", 1)
	text = strings.Replace(text, "total_mass_msun: 1500", "total_mass_msun: 20000", 1)
	rep := run(t, text, Options{OutPath: filepath.Join(t.TempDir(), "cat")})
	tab := readTable(t, output.Parquet, rep.Files[0].Path)
	app, appOK := col[float32](t, tab, "app_mag_r")
	flux, _ := col[float32](t, tab, "flux_r")
	ferr, _ := col[float32](t, tab, "flux_err_r")
	var pulls []float64
	for j := range app {
		if appOK[j] && app[j] < 30 {
			pulls = append(pulls, (float64(flux[j])-observe.FluxFromMag(float64(app[j])))/float64(ferr[j]))
		}
	}
	sort.Float64s(pulls)
	d := 0.0
	for i, p := range pulls {
		f := 0.5 * math.Erfc(-p/math.Sqrt2)
		d = math.Max(d, math.Max(math.Abs(f-float64(i)/float64(len(pulls))), math.Abs(float64(i+1)/float64(len(pulls))-f)))
	}
	if crit := 1.949 / math.Sqrt(float64(len(pulls))); d > crit {
		t.Errorf("flux pulls: KS D = %.4g > %.4g (n = %d)", d, crit, len(pulls))
	}

	m0, _ := col[float32](t, tab, "mass_initial_msun")
	bin, _ := col[bool](t, tab, "is_binary")
	var total float64
	above, nbin := 0, 0
	for j := range m0 {
		total += float64(m0[j])
		if m0[j] >= 1 {
			above++
		}
		if bin[j] {
			nbin++
		}
	}
	if math.Abs(total-20000) > 10+0.01 { // half of max_mass_msun = 20, float32 sums
		t.Errorf("realised total %.2f Msun, target 20000 ± 10", total)
	}
	n := float64(len(m0))
	f, err := imf.New(imf.Spec{Kind: "kroupa", LoMsun: 0.1, HiMsun: 20})
	if err != nil {
		t.Fatal(err)
	}
	p := f.NumberFraction(1, 20)
	if got, sig := float64(above)/n, math.Sqrt(p*(1-p)/n); math.Abs(got-p) > 4*sig {
		t.Errorf("fraction above 1 Msun %.4f, IMF %.4f ± %.4f", got, p, 4*sig)
	}
	if got, sig := float64(nbin)/n, math.Sqrt(0.35*0.65/n); math.Abs(got-0.35) > 4*sig {
		t.Errorf("binary fraction %.4f, scenario 0.35 ± %.4f", got, 4*sig)
	}
}

// TestBadOutputLeavesNothing: an unwritable output path is an error before any star is
// made, and a run that fails midway (cancelled) leaves no file under the final name.
func TestBadOutputLeavesNothing(t *testing.T) {
	dir := t.TempDir()
	blocker := filepath.Join(dir, "file")
	if err := os.WriteFile(blocker, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	text := strings.Replace(cluster, "%FORMATS%", "parquet, csv", 1)
	_, err := Run(context.Background(), parse(t, text), Options{OutPath: filepath.Join(blocker, "sub", "cat")})
	if err == nil {
		t.Fatal("writing under a regular file succeeded")
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	out := filepath.Join(dir, "cancelled", "cat")
	if _, err := Run(ctx, parse(t, text), Options{OutPath: out}); err == nil {
		t.Fatal("cancelled run succeeded")
	}
	ents, _ := os.ReadDir(filepath.Dir(out))
	for _, e := range ents {
		t.Errorf("left behind: %s", e.Name())
	}
}

// TestCancelMidRun: cancelling a run while chunks are queued ends it with the context's
// error (no deadlock) and leaves no output.
func TestCancelMidRun(t *testing.T) {
	text := strings.Replace(cluster, "%FORMATS%", "parquet", 1)
	text = strings.Replace(text, "total_mass_msun: 1500", "total_mass_msun: 200000", 1)
	dir := t.TempDir()
	ctx, cancel := context.WithCancel(context.Background())
	n := 0
	_, err := Run(ctx, parse(t, text), Options{Workers: 2, OutPath: filepath.Join(dir, "cat"), Progress: func(done, total int64) {
		n++
		if n == 3 {
			cancel()
		}
	}})
	if err == nil {
		t.Fatal("cancelled run succeeded")
	}
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		t.Errorf("left behind: %s", e.Name())
	}
}

// TestFieldWorkersByteIdentical: a Galactic field (all four components, dust disc,
// skipping undetectable stars) gives byte-identical Parquet for 1 and 3 workers.
func TestFieldWorkersByteIdentical(t *testing.T) {
	text := `seed: 8
components:
  - {name: thin, kind: thin_disc}
  - {name: thick, kind: thick_disc}
  - {name: halo, kind: halo}
  - {name: bulge, kind: bulge}
field:
  area: {kind: cone, l_deg: 10, b_deg: 20, radius_deg: 0.2}
  max_distance_pc: 40000
  shells: 24
survey:
  bands: [{band: g, limit_5sigma_mag: 19, saturation_mag: 10}, {band: r, limit_5sigma_mag: 18.5, saturation_mag: 10}]
output: {path: cat, formats: [parquet], chunk_size: 2000}
`
	var first []byte
	for _, w := range []int{1, 3} {
		rep := run(t, text, Options{Workers: w, OutPath: filepath.Join(t.TempDir(), "cat")})
		b, err := os.ReadFile(rep.Files[0].Path)
		if err != nil {
			t.Fatal(err)
		}
		if rep.Rows == 0 {
			t.Fatal("no rows")
		}
		if first == nil {
			first = b
		} else if !bytes.Equal(b, first) {
			t.Errorf("workers %d: Parquet differs from the 1-worker run", w)
		}
	}
}
