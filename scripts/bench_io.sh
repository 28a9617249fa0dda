#!/usr/bin/env bash
# bench_io.sh - the I/O floor of starmock's catalogue writers on this machine.
#
# Writes ROWS rows of seeded random values with the schema of a BANDS-band catalogue
# (output.CatalogueColumns: 20 truth columns + 8 per band, 60 columns for 5 bands) to
# Parquet with the same writer and settings as a real run (output.WriteRandomFloor,
# 65536-row batches, CODEC pages), COUNT times, and prints rows/s, CPU ns per row, file
# bytes per row and the peak resident memory of the benchmark process. The end-to-end
# pipeline benchmark is compared against this floor in the same script run.
#
#   ROWS=2000000 BANDS=5 CODEC=snappy COUNT=3 scripts/bench_io.sh
#   ALL=1 scripts/bench_io.sh        # also every writer benchmark (all formats)
#
# Environment: ROWS (default 2000000), BANDS (5), CODEC (snappy|zstd|none), COUNT (3),
# ALL (0|1), TMPDIR (where the files go; default the system temporary folder). GOGC
# passes through: arrow-go's Parquet encoder allocates ~1.3 kB of short-lived buffers
# per 60-column row, and GOGC=400 cut the CPU per row by ~20% here (peak RSS 186 MB ->
# 420 MB). Measured on the 2-core machine: dd of 400 MB to the same disk takes 2.9 s
# wall and 1.3 s system CPU, so at 193 bytes/row the disk alone bounds a 60-column
# random-valued catalogue near 0.7 M rows/s.
set -euo pipefail
cd "$(dirname "$0")/.."

ROWS=${ROWS:-2000000}
BANDS=${BANDS:-5}
CODEC=${CODEC:-snappy}
COUNT=${COUNT:-3}
bin=$(mktemp -d)/output.test
trap 'rm -rf "$(dirname "$bin")"' EXIT

go test -c -o "$bin" ./output/
echo "# I/O floor: $ROWS rows, $BANDS bands, codec $CODEC, $(nproc) CPUs, $(date -u +%Y-%m-%dT%H:%M:%SZ)"
run() {
	if [ -x /usr/bin/time ]; then
		/usr/bin/time -f "# peak RSS %M KiB, wall %e s" "$@"
	else
		"$@"
	fi
}
STARMOCK_FLOOR_ROWS=$ROWS STARMOCK_FLOOR_BANDS=$BANDS STARMOCK_FLOOR_CODEC=$CODEC \
	run "$bin" -test.run '^$' -test.bench '^BenchmarkIOFloor$' -test.benchtime 1x -test.count "$COUNT"

if [ "${ALL:-0}" = 1 ]; then
	echo "# writer benchmarks (262144 rows per file, 65536-row batches)"
	run "$bin" -test.run '^$' -test.bench 'BenchmarkWrite|BenchmarkParquet' -test.benchtime 3x
fi
