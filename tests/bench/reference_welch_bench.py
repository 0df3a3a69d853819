#!/usr/bin/env python3
"""Performance anchor: the reference library's Welch-averaged H1/H2/coherence on one workload.
Usage: reference_welch_bench.py [log2_samples] [nfft] [repeats]
Prints the median wall time in ms of computing Gxx, Gyy, Gyx, H1, H2 and coherence."""
import sys, time
import numpy as np
from scipy import signal

n = 1 << int(sys.argv[1] if len(sys.argv) > 1 else 21)
nfft = int(sys.argv[2] if len(sys.argv) > 2 else 4096)
reps = int(sys.argv[3] if len(sys.argv) > 3 else 7)
rng = np.random.default_rng(1)
x = rng.standard_normal(n)
b, a = signal.butter(2, 0.1)
y = signal.lfilter(b, a, x) + 0.01 * rng.standard_normal(n)

def run():
    kw = dict(fs=1.0, window="hann", nperseg=nfft, noverlap=nfft // 2, detrend=False)
    f, gxx = signal.welch(x, **kw)
    _, gyy = signal.welch(y, **kw)
    _, gxy = signal.csd(x, y, **kw)  # scipy: conj(X) * Y
    h1 = gxy / gxx
    h2 = gyy / np.conj(gxy)
    coh = np.abs(gxy) ** 2 / (gxx * gyy)
    return h1, h2, coh

run()
times = []
for _ in range(reps):
    t = time.perf_counter(); run(); times.append((time.perf_counter() - t) * 1e3)
times.sort()
print(f"samples={n} nfft={nfft} blocks={(n - nfft) // (nfft // 2) + 1} median_ms={times[len(times)//2]:.1f} min_ms={times[0]:.1f}")
