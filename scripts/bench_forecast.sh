#!/usr/bin/env bash
# bench_forecast.sh - speed and peak memory of Galactic-field forecasts (issue 6).
#
# Builds ./cmd/starmock and runs `starmock forecast` on
#   testdata/scenarios/deep_10deg2.yaml   10 deg^2 at b = 60 deg to r = 24 (thin and thick
#                                         discs, halo; invented Orlen Deep Survey g r i)
#   testdata/scenarios/sky_v8.yaml        the whole sky to V = 8 (all four components)
# each under /usr/bin/time, and prints wall time, CPU time, peak resident memory, the
# systems drawn and the stars detected. SKIP_OFF=1 also runs the deep field with
# skip_undetectable: false (the whole sky without the bound would take hours).
#
#   scripts/bench_forecast.sh
#   ONLY=deep scripts/bench_forecast.sh    # or ONLY=sky
#
# The machine's other load changes every number: the script prints nproc, the CPU model
# and the load average with the results.
set -euo pipefail
cd "$(dirname "$0")/.."
work=$(mktemp -d "${TMPDIR:-/tmp}/starmock-fcbench.XXXXXX")
trap 'rm -rf "$work"' EXIT
go build -o "$work/starmock" ./cmd/starmock
echo "machine: $(nproc) CPUs, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ *//'), load $(cut -d' ' -f1-3 /proc/loadavg)"
run() { # name scenario
	local name=$1 scen=$2
	local log="$work/$name.log"
	if command -v /usr/bin/time >/dev/null; then
		/usr/bin/time -f "%e %U %S %M" -o "$work/$name.time" "$work/starmock" forecast "$scen" --out "$work/$name" >"$log" 2>&1
		read -r wall user sys rss <"$work/$name.time"
		printf '%-16s wall %7.1f s  cpu %7.1f s  peak %6.0f MiB  %s\n' "$name" "$wall" "$(awk -v u="$user" -v s="$sys" 'BEGIN{print u+s}')" "$(awk -v r="$rss" 'BEGIN{print r/1024}')" "$(head -1 "$log" | sed 's/^synthetic forecast //')"
	else
		local t0 t1
		t0=$(date +%s.%N)
		"$work/starmock" forecast "$scen" --out "$work/$name" >"$log" 2>&1
		t1=$(date +%s.%N)
		printf '%-16s wall %7.1f s  %s\n' "$name" "$(awk -v a="$t0" -v b="$t1" 'BEGIN{print b-a}')" "$(head -1 "$log" | sed 's/^synthetic forecast //')"
	fi
}
if [[ ${ONLY:-deep} != sky ]]; then
	run deep_10deg2 testdata/scenarios/deep_10deg2.yaml
	if [[ ${SKIP_OFF:-0} == 1 ]]; then
		sed 's/^field:/field:\n  skip_undetectable: false/' testdata/scenarios/deep_10deg2.yaml >"$work/deep_off.yaml"
		run deep_10deg2_off "$work/deep_off.yaml"
	fi
fi
if [[ ${ONLY:-sky} != deep ]]; then
	run sky_v8 testdata/scenarios/sky_v8.yaml
fi
