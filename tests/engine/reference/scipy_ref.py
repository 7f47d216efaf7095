"""Reference computations with SciPy for the engine tests. Reads one JSON request on stdin,
writes one JSON answer on stdout."""
import json
import sys

import numpy as np
from scipy.signal import find_peaks, peak_prominences, peak_widths, savgol_coeffs, savgol_filter



def answer(req):
    op = req["op"]
    if op == "batch":
        return [answer(r) for r in req["requests"]]
    if op == "savgol":
        y = np.asarray(req["y"], dtype=float)
        out = savgol_filter(y, req["window"], req["poly"], deriv=req["deriv"], delta=req["delta"], mode="interp")
        return out.tolist()
    if op == "coeffs":
        return savgol_coeffs(req["window"], req["poly"], deriv=req["deriv"], use="dot").tolist()
    if op == "peaks":
        y = np.asarray(req["y"], dtype=float)
        peaks, _ = find_peaks(y)
        prom, lb, rb = peak_prominences(y, peaks)
        w = peak_widths(y, peaks, rel_height=0.5, prominence_data=(prom, lb, rb))
        return {"peaks": peaks.tolist(), "prominences": prom.tolist(), "left": lb.tolist(), "right": rb.tolist(),
                "widths": w[0].tolist(), "leftIps": w[2].tolist(), "rightIps": w[3].tolist()}
    raise SystemExit("unknown op")


print(json.dumps(answer(json.load(sys.stdin))))
