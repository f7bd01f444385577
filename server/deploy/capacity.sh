#!/usr/bin/env bash
# The server's CPU per batch row and per workbook fill, for the capacity
# figures of the README: steamcell serve on 127.0.0.1, its user+system CPU
# time read from /proc before and after each request (Linux only). CPU
# time, not wall time, because the machine may be shared. Bounded: three
# runs of each, then the server is stopped.
#
#   bash server/deploy/capacity.sh                   # 200,000 rows, the demo workbook
#   ROWS=50000 WORKBOOK=big.xlsx bash server/deploy/capacity.sh
set -euo pipefail
cd "$(dirname "$0")/../.."
: "${ROWS:=200000}"
: "${WORKBOOK:=testdata/demo/kestrel_bay_tests.xlsx}"
work=$(mktemp -d)
go build -o "$work/steamcell" ./cmd/steamcell

# Invented rows: half superheated steam, half feedwater, fixed seed.
awk -v n="$ROWS" 'BEGIN { srand(16); print "tag,p [bar],t [°C]";
  for (i = 0; i < n; i++) {
    if (i % 2 == 0) printf "KB-%04d,%.3f,%.2f\n", i % 2000, 5 + rand() * 115, 350 + rand() * 190;
    else            printf "KB-%04d,%.3f,%.2f\n", i % 2000, 2 + rand() * 148, 30 + rand() * 170 } }' >"$work/rows.csv"

"$work/steamcell" serve --addr 127.0.0.1:0 >"$work/serve.out" 2>/dev/null &
pid=$!
trap 'kill $pid; rm -rf "$work"' EXIT
for _ in $(seq 100); do grep -q listening "$work/serve.out" && break; sleep 0.1; done
url=$(grep -o 'http://[0-9.:]*' "$work/serve.out")
tck=$(getconf CLK_TCK)
cpu() { awk '{ print $14 + $15 }' "/proc/$pid/stat"; }

for q in get=h ""; do
	for run in 1 2 3; do
		c0=$(cpu)
		curl -s --fail -H 'Content-Type: text/csv' --data-binary @"$work/rows.csv" "$url/batch?$q" -o "$work/answer.csv"
		c1=$(cpu)
		ok=$(grep -c ',ok,' "$work/answer.csv" || true)
		awk -v r="$ROWS" -v ok="$ok" -v c=$((c1 - c0)) -v tck="$tck" -v q="${q:-every default property}" -v run=$run 'BEGIN {
			s = c / tck; printf "batch (%s) run %d: %d rows, %d ok: server CPU %.2f s = %.1f us/row = %.0f rows/s per core\n", q, run, r, ok, s, s / r * 1e6, r / s }'
	done
done
for run in 1 2 3; do
	c0=$(cpu)
	curl -s --fail --data-binary @"$WORKBOOK" "$url/workbook?name=$(basename "$WORKBOOK")" -o "$work/filled.xlsx"
	c1=$(cpu)
	awk -v c=$((c1 - c0)) -v tck="$tck" -v run=$run -v wb="$WORKBOOK" 'BEGIN { printf "workbook %s run %d: server CPU %.2f s\n", wb, run, c / tck }'
done
