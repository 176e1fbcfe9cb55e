#!/usr/bin/python3
"""Time a long FIR's design and response in scipy for tests/bench/dsp.bench.ts (run with /usr/bin/python3).

Usage: scipy_fir_response.py TAPS CUTOFF_HZ FS_HZ FREQS_JSON
Designs signal.firwin(TAPS, CUTOFF_HZ, fs=FS_HZ) (Hamming window) and evaluates signal.freqz and
signal.group_delay at the given frequencies in Hz, 5 times; prints one JSON line with the best seconds.
"""
import json
import sys
import time
import warnings

import numpy as np
import scipy
from scipy import signal


def main():
    taps, cutoff, fs = int(sys.argv[1]), float(sys.argv[2]), float(sys.argv[3])
    freqs = np.array(json.loads(sys.argv[4]), dtype=np.float64)
    best = float("inf")
    for _ in range(5):
        start = time.perf_counter()
        h = signal.firwin(taps, cutoff, fs=fs)
        signal.freqz(h, worN=freqs, fs=fs)
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            signal.group_delay((h, [1.0]), w=freqs, fs=fs)
        best = min(best, time.perf_counter() - start)
    print(json.dumps({"seconds": best, "scipyVersion": scipy.__version__}))


if __name__ == "__main__":
    main()
