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
    if op == "lstsq":
        # ordinary least squares of y on the given columns (numpy.linalg.lstsq)
        a = np.asarray(req["columns"], dtype=float).T
        y = np.asarray(req["y"], dtype=float)
        coef, *_ = np.linalg.lstsq(a, y, rcond=None)
        return coef.tolist()
    if op == "coeffs":
        return savgol_coeffs(req["window"], req["poly"], deriv=req["deriv"], use="dot").tolist()
    if op == "peaks":
        y = np.asarray(req["y"], dtype=float)
        peaks, _ = find_peaks(y)
        prom, lb, rb = peak_prominences(y, peaks)
        w = peak_widths(y, peaks, rel_height=0.5, prominence_data=(prom, lb, rb))
        return {"peaks": peaks.tolist(), "prominences": prom.tolist(), "left": lb.tolist(), "right": rb.tolist(),
                "widths": w[0].tolist(), "leftIps": w[2].tolist(), "rightIps": w[3].tolist()}
    if op == "pl_max":
        # emission maximum of a PL spectrum on its wavelength axis: savgol_filter smoothing, argmax
        # outside [exclude_lo, exclude_hi] nm, both of the counts as recorded and of counts·λ²
        # (the energy-axis spectrum I(E) = I(λ)·λ²/hc, whose maximum the engine reports); noise σ
        # as the standard deviation of y − smoothed over tail_lo..tail_hi nm
        x = np.asarray(req["x"], dtype=float)
        y = np.asarray(req["y"], dtype=float)
        s = savgol_filter(y, req["window"], req["poly"], mode="interp")
        keep = (x < req["exclude_lo"]) | (x > req["exclude_hi"])
        keep &= x > req.get("min_nm", -np.inf)
        i = int(np.argmax(np.where(keep, s, -np.inf)))
        j = int(np.argmax(np.where(keep, s * x * x, -np.inf)))
        tail = (x >= req["tail_lo"]) & (x <= req["tail_hi"])
        return {"argmaxNm": float(x[i]), "argmaxEnergyAxisNm": float(x[j]), "tailSigma": float(np.std((y - s)[tail])),
                "smoothed": s.tolist()}
    raise SystemExit("unknown op")


print(json.dumps(answer(json.load(sys.stdin))))
