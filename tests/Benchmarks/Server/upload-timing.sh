#!/usr/bin/env bash
# Scripted measurement of capture uploads against a running Release server (docs/performance.md, "Server"):
# one 1,000,000-row, 3-channel capture (the file of shared/BENCHMARKS.md section 2), then twenty concurrent uploads of
# a 10 MB capture. Start the server first: dotnet run -c Release --project src/Server
set -euo pipefail
base="${PATCHPROOF_URL:-http://127.0.0.1:5080}"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT

python3 - "$work" <<'PY'
import math, sys
work = sys.argv[1]
def write(path, rows):
    with open(path, "w") as f:
        f.write("Board,QH-L3\nSample interval,1e-6 s\nRecord length,%d\nTIME,CH1,CH2,CH3\n" % rows)
        for i in range(rows):
            t = i * 1e-6
            f.write("%.6e,%.6e,%.6e,%.6e\n" % (t, math.sin(2 * math.pi * 997 * t), math.cos(2 * math.pi * 613 * t), 0.5 * math.sin(2 * math.pi * 211 * t)))
write(work + "/million.csv", 1_000_000)
write(work + "/ten-mb.csv", 190_000)
PY

board="$(curl -sf "$base/api/benches" | python3 -c 'import json,sys; print(json.load(sys.stdin)[0]["id"])')"
board="$(curl -sf "$base/api/benches/$board/boards" | python3 -c 'import json,sys; print(json.load(sys.stdin)[0]["id"])')"
echo "board $board; files: $(du -h "$work/million.csv" | cut -f1) and $(du -h "$work/ten-mb.csv" | cut -f1)"

for run in 1 2 3; do
  curl -s -o /dev/null -w "1,000,000 rows, run $run: HTTP %{http_code}, %{time_total} s\n" \
    -F "file=@$work/million.csv;type=text/csv" "$base/api/boards/$board/captures"
done

server_pid="$(pgrep -f 'Patchproof.Server' | head -1 || true)"
start=$(date +%s.%N)
seq 1 20 | xargs -P 20 -I{} curl -s -o /dev/null -w "%{http_code}\n" -F "file=@$work/ten-mb.csv;type=text/csv" "$base/api/boards/$board/captures" > "$work/codes"
end=$(date +%s.%N)
echo "20 concurrent 10 MB uploads: $(sort "$work/codes" | uniq -c | tr '\n' ' ')in $(python3 -c "print(round($end - $start, 2))") s"
if [ -n "$server_pid" ]; then
  echo "server peak resident memory: $(grep VmHWM /proc/"$server_pid"/status | awk '{print $2/1024 " MB"}')"
fi
