#!/usr/bin/python3
"""Reference values for forecast/lintrend.go: OLS linear trend, with and
without seasonal dummies, computed with statsmodels.

Run with Debian's interpreter (python3-statsmodels 0.13.5, numpy 1.24.2,
pandas 1.5.3):

    /usr/bin/python3 gen_ols.py

It writes ols_golden.json beside this script. Data: datasets shipped with
statsmodels (elec_equip, monthly, 257 points; nile, annual, 100 points).

Design (matching lintrend.go): column 1 is the constant, column 2 is
t = 1..n, and with dummies column s+1 (s = 2..m) is 1 when
((t-1) mod m) + 1 == s, i.e. seasons count from the first observation.
"""
import json
import os
import sys

import numpy as np
import pandas as pd
import statsmodels
import statsmodels.api as sm
from statsmodels.datasets import elec_equip, nile

H = 24


def design(n0, n1, m):
    """Rows for t = n0+1 .. n1 (0-based positions n0..n1-1)."""
    rows = []
    for i in range(n0, n1):
        r = [1.0, float(i + 1)]
        if m > 1:
            d = [0.0] * (m - 1)
            s = i % m
            if s > 0:
                d[s - 1] = 1.0
            r += d
        rows.append(r)
    return np.array(rows)


def case(name, y, m):
    y = np.asarray(y, dtype=float)
    n = len(y)
    X = design(0, n, m)
    res = sm.OLS(y, X).fit()
    Xf = design(n, n + H, m)
    pred = res.get_prediction(Xf)
    var_factor = pred.se_obs ** 2 / res.scale
    return {
        "name": name,
        "season": m,
        "dummies": m > 1,
        "y": y.tolist(),
        "coef": res.params.tolist(),
        "fitted": res.fittedvalues.tolist(),
        "forecast": pred.predicted_mean.tolist(),
        "var_factor": var_factor.tolist(),
        "scale": float(res.scale),
    }


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    ee = elec_equip.load().data.iloc[:, 0].to_numpy()
    nl = nile.load().data["volume"].to_numpy()
    out = {
        "generator": "gen_ols.py",
        "python": sys.version.split()[0],
        "statsmodels": statsmodels.__version__,
        "numpy": np.__version__,
        "pandas": pd.__version__,
        "horizon": H,
        "cases": [
            case("elec_equip trend", ee, 1),
            case("elec_equip trend + 12 dummies", ee, 12),
            case("elec_equip last 30, trend + 12 dummies", ee[-30:], 12),
            case("nile trend", nl, 1),
            case("nile trend + 4 dummies", nl, 4),
        ],
    }
    with open(os.path.join(here, "ols_golden.json"), "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
