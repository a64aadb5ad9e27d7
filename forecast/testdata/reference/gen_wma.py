#!/usr/bin/python3
"""Reference values for forecast/movingavg.go: weighted moving average
weights fitted by minimising the in-sample one-step SSE with the weights
non-negative and summing to one, solved with scipy's SLSQP.

Run with Debian's interpreter (python3-scipy 1.10.1, numpy 1.24.2,
python3-statsmodels 0.13.5 for the datasets):

    /usr/bin/python3 gen_wma.py

It writes wma_golden.json beside this script. Weights are oldest first:
the prediction of y[t] is sum_j w[j] * y[t-k+j], j = 0..k-1, for t >= k.
"""
import json
import os
import sys

import numpy as np
import scipy
from scipy.optimize import minimize
from statsmodels.datasets import elec_equip, nile


def lagged(y, k):
    A = np.array([y[t - k:t] for t in range(k, len(y))])
    return A, y[k:]


def case(name, y, k):
    y = np.asarray(y, dtype=float)
    A, b = lagged(y, k)

    def sse(w):
        r = b - A @ w
        return float(r @ r)

    # SLSQP works on the SSE divided by that of equal weights, so that the
    # objective is of order one whatever the units of the data.
    s0 = sse(np.full(k, 1.0 / k))

    def obj(w):
        return sse(w) / s0

    def grad(w):
        return -2.0 * A.T @ (b - A @ w) / s0

    best = None
    # Several starting points; keep the best SLSQP answer.
    starts = [np.full(k, 1.0 / k)] + [np.eye(k)[i] for i in range(k)]
    for w0 in starts:
        r = minimize(obj, w0, jac=grad, method="SLSQP",
                     bounds=[(0.0, 1.0)] * k,
                     constraints=[{"type": "eq", "fun": lambda w: np.sum(w) - 1.0,
                                   "jac": lambda w: np.ones_like(w)}],
                     options={"ftol": 1e-12, "maxiter": 1000})
        if best is None or r.fun < best.fun:
            best = r
    w = np.clip(best.x, 0.0, None)
    w = w / w.sum()
    return {"name": name, "window": k, "y": y.tolist(),
            "weights": w.tolist(), "sse": sse(w), "success": bool(best.success)}


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    ee = elec_equip.load().data.iloc[:, 0].to_numpy()
    nl = nile.load().data["volume"].to_numpy()
    out = {
        "generator": "gen_wma.py",
        "python": sys.version.split()[0],
        "scipy": scipy.__version__,
        "numpy": np.__version__,
        "cases": [
            case("nile k=3", nl, 3),
            case("nile k=5", nl, 5),
            case("elec_equip k=3", ee, 3),
            case("elec_equip k=6", ee, 6),
            case("elec_equip k=12", ee, 12),
            case("elec_equip last 40 k=4", ee[-40:], 4),
        ],
    }
    with open(os.path.join(here, "wma_golden.json"), "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
