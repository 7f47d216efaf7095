"""SciPy pipeline for the engine benchmark: reads float64 arrays (N spectra x 4096 + reference)
from a binary file, runs savgol_filter, find_peaks, peak_widths and the difference vs reference
for spectra [start, end), and prints wall-clock and process CPU seconds as JSON.
Usage: engine-reference.py FILE N M WINDOW [START END]"""
import json
import sys
import time

import numpy as np
from scipy.signal import find_peaks, peak_widths, savgol_filter

path, n, m, window = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), int(sys.argv[4])
start = int(sys.argv[5]) if len(sys.argv) > 5 else 1
end = int(sys.argv[6]) if len(sys.argv) > 6 else n + 1
data = np.fromfile(path, dtype=np.float64).reshape(n + 1, m)
ref = data[0]
t0 = time.perf_counter()
c0 = time.process_time()
rs = savgol_filter(ref, window, 2, mode="interp")
count = 0
for k in range(start, end):
    y = data[k]
    s = savgol_filter(y, window, 2, mode="interp")
    d2 = savgol_filter(y, window * 3 | 1, 2, deriv=2, mode="interp")
    peaks, props = find_peaks(s, prominence=0.01)
    w = peak_widths(s, peaks, rel_height=0.5)
    diff = s - rs
    dpeaks, _ = find_peaks(diff, prominence=0.01)
    count += len(peaks) + len(dpeaks) + int(d2.argmin() > 0)
dt = time.perf_counter() - t0
cpu = time.process_time() - c0
print(json.dumps({"seconds": dt, "cpuSeconds": cpu, "spectra": end - start, "spectraPerSecond": (end - start) / dt, "check": count}))
