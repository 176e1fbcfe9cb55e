#!/usr/bin/python3
"""Time scipy.signal.sosfilt for tests/bench/dsp.bench.ts (run with /usr/bin/python3).

Usage: scipy_sosfilt.py SAMPLES_F64LE SOS_JSON OUTPUT_F64LE
Reads float64 little-endian samples and a JSON list of sos rows, runs sosfilt 3 times, writes the
output (for the bench's equality check) and prints one JSON line: best-of-3 seconds and versions.
"""
import json
import sys
import time

import numpy as np
import scipy
from scipy import signal


def main():
    samples_path, sos_json, output_path = sys.argv[1:4]
    x = np.fromfile(samples_path, dtype="<f8")
    sos = np.array(json.loads(sos_json), dtype=np.float64)
    best = float("inf")
    y = None
    for _ in range(3):
        start = time.perf_counter()
        y = signal.sosfilt(sos, x)
        best = min(best, time.perf_counter() - start)
    y.astype("<f8").tofile(output_path)
    print(json.dumps({"seconds": best, "samples": int(x.size), "scipyVersion": scipy.__version__,
                      "numpyVersion": np.__version__}))


if __name__ == "__main__":
    main()
