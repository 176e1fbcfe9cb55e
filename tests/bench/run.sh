#!/usr/bin/env bash
# `npm run bench`: speed figures, each measured against a reference in the same run.
set -euo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$ROOT"
if ! /usr/bin/python3 -c "import scipy" 2>/dev/null; then
  if [ "$(id -u)" = 0 ]; then
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq python3-scipy >/dev/null
  else
    echo "The benchmark compares against Debian's scipy. Run as root: apt-get install -y python3-scipy" >&2; exit 1
  fi
fi
set +u
source server/run/setup.sh tapwright_bench --with-browser
set -u
mkdir -p bench-results
echo "== DSP engine against scipy.signal.sosfilt"
node --import tsx tests/bench/dsp.bench.ts | tee bench-results/dsp.txt
echo "== Live pipeline: publish to WebSocket frame"
node --import tsx tests/bench/pipeline.bench.ts | tee bench-results/pipeline.txt
echo "== Bench chart in headless Chromium"
node --import tsx tests/bench/chart.bench.ts | tee bench-results/chart.txt
echo "== Web app: read APIs under load, and health while the largest design is posted"
node --import tsx tests/bench/web.bench.ts | tee bench-results/web.txt
