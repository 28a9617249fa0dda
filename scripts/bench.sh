#!/usr/bin/env bash
# bench.sh - end-to-end speed of starmock against the I/O floor, and peak memory.
#
# Default mode: builds the simulate test binary once and runs, each in its own process,
#   BenchmarkEndToEndParquet   an invented open cluster ("Bench Cluster") of BENCH_STARS
#                              primaries (Kroupa IMF, binaries, Plummer sphere, SDSS
#                              u g r i z) simulated and written to Parquet by simulate.Run
#   BenchmarkIOFloorSameSchema the same number of rows and the same columns of random
#                              values written with the same Parquet settings
#                              (output.WriteRandomFloor)
# and prints stars/s, floor rows/s, their ratio and each process's peak resident memory
# (/usr/bin/time -f %M when present, else the VmHWM the benchmark reads from
# /proc/self/status and reports as peak-RSS-MiB), plus, with /usr/bin/time, rows per
# CPU-second of each process (less sensitive to other load than the wall-clock rates).
#
# MEMORY=1 mode: builds ./cmd/starmock and runs `starmock simulate` on a generated
# scenario of MEMORY_STARS (default 1e8) primaries (an invented big cluster, 5 bands,
# Parquet, 2 workers, --quiet) under /usr/bin/time -v, then prints peak resident memory
# and elapsed time. The target is < 500 MB peak for 1e8 stars. The catalogue (~200 bytes
# per star, ~20 GB for 1e8) goes to a fresh folder under TMPDIR (default /tmp) and is
# deleted afterwards.
#
#   scripts/bench.sh                      # 1e6 stars, both benchmarks
#   BENCH_STARS=200000 scripts/bench.sh   # smaller
#   COUNT=3 scripts/bench.sh              # 3 runs of each benchmark
#   MEMORY=1 scripts/bench.sh             # 1e8-star memory run (10-30 min on 2 cores)
#   MEMORY=1 MEMORY_STARS=10000000 scripts/bench.sh
#
# Environment: BENCH_STARS (1000000), COUNT (1), MEMORY (0|1), MEMORY_STARS (100000000),
# TMPDIR. The machine's other load changes every number here: the script prints nproc,
# the CPU model and the load average with the results.
set -euo pipefail
cd "$(dirname "$0")/.."

BENCH_STARS=${BENCH_STARS:-1000000}
COUNT=${COUNT:-1}
MEMORY=${MEMORY:-0}
MEMORY_STARS=${MEMORY_STARS:-100000000}
work=$(mktemp -d "${TMPDIR:-/tmp}/starmock-bench.XXXXXX")
trap 'rm -rf "$work"' EXIT

echo "# $(date -u +%Y-%m-%dT%H:%M:%SZ)  nproc $(nproc)  cpu: $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2- | sed 's/^ *//')"
echo "# load average: $(cut -d' ' -f1-3 /proc/loadavg)  go: $(go version | cut -d' ' -f3)  commit: $(git rev-parse --short HEAD 2>/dev/null || echo unknown)"

if [ "$MEMORY" = 1 ]; then
	bin=$work/starmock
	go build -o "$bin" ./cmd/starmock
	need=$((MEMORY_STARS / 1000000 * 250 / 1000 + 1)) # GB at ~250 bytes per star, generous
	avail=$(df -P -B1G "$work" | awk 'NR==2 {print $4}')
	echo "# catalogue folder $work: ${avail} GB free, ~${need} GB needed"
	if [ "$avail" -lt "$need" ]; then
		echo "bench.sh: not enough space in $work (${avail} GB free, ~${need} GB needed); set TMPDIR" >&2
		exit 1
	fi
	cat >"$work/big.yaml" <<EOF
# Invented scenario for the memory benchmark: the open cluster "Bench Giant 1",
# observed in five SDSS bands. Made up; the output is synthetic.
name: Bench Giant 1 memory run
seed: 4242
components:
  - name: bench_giant_1
    stars: $MEMORY_STARS
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
output:
  path: catalogue
  formats: [parquet]
  chunk_size: 65536
EOF
	echo "# starmock simulate: $MEMORY_STARS stars, 5 bands, parquet, 2 workers"
	/usr/bin/time -v -o "$work/time.txt" "$bin" simulate "$work/big.yaml" --out "$work/catalogue" --quiet --workers 2
	ls -l "$work"/catalogue.parquet | awk '{printf "# catalogue bytes: %s (%.1f bytes/star)\n", $5, $5 / '"$MEMORY_STARS"'}'
	grep -E 'Maximum resident set size|Elapsed \(wall clock\)|User time|System time|Percent of CPU' "$work/time.txt"
	awk -F: '/Maximum resident set size/ {printf "# peak RSS: %.1f MB (target < 500 MB for 1e8 stars)\n", $2 * 1024 / 1e6}' "$work/time.txt"
	exit 0
fi

bin=$work/simulate.test
go test -c -o "$bin" ./simulate/
run() { # run BENCH: one benchmark in its own process; prints its output and peak RSS
	local out=$work/$1.out
	if [ -x /usr/bin/time ]; then
		BENCH_STARS=$BENCH_STARS /usr/bin/time -f '%M %U %S' -o "$work/$1.rss" \
			"$bin" -test.run '^$' -test.bench "^$1\$" -test.count "$COUNT" -test.benchmem >"$out"
	else
		BENCH_STARS=$BENCH_STARS "$bin" -test.run '^$' -test.bench "^$1\$" -test.count "$COUNT" -test.benchmem >"$out"
		awk '{for (i = 2; i <= NF; i++) if ($i == "peak-RSS-MiB") print int($(i-1) * 1024)}' "$out" | sort -n | tail -1 >"$work/$1.rss"
	fi
	grep -E '^(Benchmark|goos|goarch|cpu)' "$out"
}
# metric NAME FILE: median of the value preceding the unit NAME over the runs
metric() {
	awk -v u="$1" '/^Benchmark/ {for (i = 2; i <= NF; i++) if ($i == u) print $(i-1)}' "$2" |
		sort -g | awk '{v[NR] = $1} END {if (NR == 0) exit 1; print (NR % 2) ? v[(NR+1)/2] : (v[NR/2] + v[NR/2+1]) / 2}'
}
echo "# $BENCH_STARS stars, $COUNT run(s) each"
run BenchmarkEndToEndParquet
run BenchmarkIOFloorSameSchema
e2e=$(metric stars/s "$work/BenchmarkEndToEndParquet.out")
floor=$(metric rows/s "$work/BenchmarkIOFloorSameSchema.out")
# report NAME UNIT MEDIAN: the median rate, the process's peak RSS and, with /usr/bin/time,
# rows per CPU-second of the whole process (user + system, all runs, setup included; less
# sensitive than wall-clock rates to other load on the machine)
report() {
	read -r rss user sys <"$work/$1.rss" || true
	printf '%-12s %s %s/s   peak RSS %s KiB' "$2" "$4" "$3" "$rss"
	if [ -n "${user:-}" ]; then
		awk -v n="$BENCH_STARS" -v c="$COUNT" -v u="$user" -v s="$sys" -v unit="$3" \
			'BEGIN {printf "   CPU %.1f s user + %.1f s sys = %.0f %s per CPU-second", u, s, n * c / (u + s), unit}'
	fi
	echo
}
report BenchmarkEndToEndParquet end-to-end: stars "$e2e"
report BenchmarkIOFloorSameSchema "I/O floor:" rows "$floor"
awk -v a="$e2e" -v b="$floor" 'BEGIN {printf "ratio end-to-end / floor: %.3f (floor is %.1fx faster)\n", a / b, b / a}'
