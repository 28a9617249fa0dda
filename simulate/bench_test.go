package simulate

import (
	"bufio"
	"context"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/starmock/starmock/output"
	"github.com/starmock/starmock/synth"
)

// benchCluster is the invented open cluster "Bench Cluster" observed in the five SDSS
// bands (u g r i z) by an invented survey: Kroupa (2001) IMF, 40% binaries, a Plummer
// (1911) sphere behind moderate dust. %STARS% is replaced by the star count.
const benchCluster = `seed: 7001
name: Bench Cluster
components:
  - name: bench_cluster
    stars: %STARS%
    mass_function: {kind: kroupa, min_mass_msun: 0.1, max_mass_msun: 100}
    age: {kind: burst, age: 2Gyr, spread: 50Myr}
    metallicity: {kind: gaussian, feh: -0.15, sigma_dex: 0.05}
    binaries: {fraction: 0.4, mass_ratio: {kind: flat, min: 0.1, max: 1.0}}
    geometry: {kind: plummer, distance_pc: 6000, scale_radius_pc: 4, max_radius_pc: 40, ra_deg: 150.0, dec_deg: 20.0}
    extinction: {law: ccm89, rv: 3.1, av_mag: 0.6, av_spread_mag: 0.05}
survey:
  name: Bench Survey
  bands:
    - {band: u, limit_5sigma_mag: 23.0, saturation_mag: 15}
    - {band: g, limit_5sigma_mag: 24.4, saturation_mag: 15}
    - {band: r, limit_5sigma_mag: 24.1, saturation_mag: 15}
    - {band: i, limit_5sigma_mag: 23.6, saturation_mag: 15}
    - {band: z, limit_5sigma_mag: 22.8, saturation_mag: 15}
output: {path: bench, formats: [parquet], chunk_size: 65536}
`

// benchStars is the benchmark size: BENCH_STARS from the environment (scripts/bench.sh),
// default 1,000,000.
func benchStars(b *testing.B) int {
	b.Helper()
	n := 1_000_000
	if v := os.Getenv("BENCH_STARS"); v != "" {
		var err error
		if n, err = strconv.Atoi(v); err != nil || n < 1 {
			b.Fatalf("BENCH_STARS %q: want a positive integer", v)
		}
	}
	return n
}

func benchScenario(b *testing.B, stars int) *synth.Scenario {
	b.Helper()
	text := strings.Replace(benchCluster, "%STARS%", strconv.Itoa(stars), 1)
	s, err := synth.Parse("bench.yaml", []byte(text))
	if err != nil {
		b.Fatal(err)
	}
	return s
}

// reportPeakRSS reports the process's peak resident set size (VmHWM in /proc/self/status,
// Linux) as peak-RSS-MiB; it reports nothing where that file does not exist. It covers
// the whole benchmark process, so scripts/bench.sh runs each benchmark on its own.
func reportPeakRSS(b *testing.B) {
	f, err := os.Open("/proc/self/status")
	if err != nil {
		return
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		if rest, ok := strings.CutPrefix(sc.Text(), "VmHWM:"); ok {
			fields := strings.Fields(rest) // "525368 kB"
			if len(fields) == 2 && fields[1] == "kB" {
				if kb, err := strconv.ParseFloat(fields[0], 64); err == nil {
					b.ReportMetric(kb/1024, "peak-RSS-MiB")
				}
			}
			return
		}
	}
}

// BenchmarkEndToEndParquet runs the whole pipeline (plan, masses, evolution, photometry,
// placement, dust, binaries, noise, Parquet writing) for the Bench Cluster with the
// default worker count (all CPUs) and reports stars/s. Compare with
// BenchmarkIOFloorSameSchema (scripts/bench.sh runs both).
func BenchmarkEndToEndParquet(b *testing.B) {
	if testing.Short() {
		b.Skip("end-to-end benchmark skipped in -short mode")
	}
	stars := benchStars(b)
	s := benchScenario(b, stars)
	out := filepath.Join(b.TempDir(), "bench")
	var rep *Report
	b.ReportAllocs()
	for b.Loop() {
		var err error
		if rep, err = Run(context.Background(), s, Options{OutPath: out}); err != nil {
			b.Fatal(err)
		}
	}
	if rep.Stars != int64(stars) || rep.Rows != int64(stars) {
		b.Fatalf("run made %d stars and %d rows, want %d of each", rep.Stars, rep.Rows, stars)
	}
	b.ReportMetric(float64(stars)*float64(b.N)/b.Elapsed().Seconds(), "stars/s")
	b.ReportMetric(float64(rep.Files[0].Bytes)/float64(stars), "bytes/row")
	reportPeakRSS(b)
}

// BenchmarkIOFloorSameSchema writes as many rows as BenchmarkEndToEndParquet, with the
// same columns (Plan.Columns of the same scenario) and the same Parquet settings
// (output.Options{}, as simulate.Run uses), filled with seeded random values by
// output.WriteRandomFloor: the cost of the file alone, no physics. Reports rows/s.
func BenchmarkIOFloorSameSchema(b *testing.B) {
	if testing.Short() {
		b.Skip("I/O floor benchmark skipped in -short mode")
	}
	stars := benchStars(b)
	plan, err := synth.NewPlan(context.Background(), benchScenario(b, stars))
	if err != nil {
		b.Fatal(err)
	}
	cols := plan.Columns()
	path := filepath.Join(b.TempDir(), "floor.parquet")
	var size int64
	b.ReportAllocs()
	for b.Loop() {
		if size, err = output.WriteRandomFloor(output.Parquet, path, cols, stars, plan.ChunkSize, 7001, output.Options{}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(stars)*float64(b.N)/b.Elapsed().Seconds(), "rows/s")
	b.ReportMetric(float64(size)/float64(stars), "bytes/row")
	reportPeakRSS(b)
}
