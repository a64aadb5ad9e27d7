#!/usr/bin/python3
"""Wide comparison of the exponential smoothing fits with statsmodels.

Run from the repository root with Debian's interpreter:

    /usr/bin/python3 testdata/statsmodels/gen_windows.py

It writes testdata/statsmodels/ets_windows.json beside this script (about a
minute). forecast/ets_windows_test.go fits every window with forelay and
checks that its SSE is at most 0.5% above the SSE recorded here.

Reference: statsmodels 0.13.5+dfsg (Debian bookworm package
python3-statsmodels) with numpy 1.24.2, scipy 1.10.1 and pandas 1.5.3; the
versions in use are recorded in the JSON.

Data: rolling windows of open datasets that ship inside statsmodels (loaded
from the package, nothing is downloaded), named by their module:
  * nile         - sm.datasets.nile 'volume', annual
  * sunspots     - sm.datasets.sunspots 'SUNACTIVITY', annual, season 11
                   (the solar cycle)
  * co2_monthly  - sm.datasets.co2, weekly readings averaged to calendar
                   months (resample('MS').mean()), empty months filled by
                   linear interpolation, season 12
  * elec_equip   - sm.datasets.elec_equip, its one column, monthly, season 12
  * elnino       - sm.datasets.elnino, the twelve monthly columns read year
                   by year into one monthly series, season 12
  * macrodata    - sm.datasets.macrodata columns realgdp, realcons, realinv,
                   cpi, m1, unemp, tbilrate, infl, quarterly, season 4
  * interest_inflation - sm.datasets.interest_inflation columns Dp and R,
                   quarterly, season 4

Methods: ses, holt, damped-holt on every window; on windows of a seasonal
series with at least max(2m, m+6) points also holt-winters-additive,
undamped and damped, and, where every value is positive,
holt-winters-multiplicative, undamped and damped.

Fit: ExponentialSmoothing(y, initialization_method='estimated', bounds=...)
.fit() (SLSQP from statsmodels' own grid start). Bounds as forelay's
(forecast/ets_fit.go): alpha, beta in [0.0001, 0.9999], phi in [0.8, 0.98],
gamma in [1 - 0.9999, 0.9999] (1 - 0.9999 is 0.0001 to 1e-13; statsmodels
rejects a gamma lower bound above 1 - alpha's upper bound, which 0.0001
itself is after rounding). statsmodels also holds beta <= alpha and
gamma <= 1 - alpha; forelay has the second and not the first, so its
feasible set contains statsmodels' and its SSE should never be clearly
higher. Recorded per fit: the window (series, start, end: 0-based, end
exclusive), method, season, damped, statsmodels' SSE and parameters.
"""
import json
import os
import platform
import sys
import warnings

import numpy as np
import pandas as pd
import scipy
import statsmodels
from statsmodels.datasets import co2, elec_equip, elnino, interest_inflation, macrodata, nile, sunspots
from statsmodels.tsa.holtwinters import ExponentialSmoothing

warnings.simplefilter("ignore")

BOUNDS = {
    "smoothing_level": (0.0001, 0.9999),
    "smoothing_trend": (0.0001, 0.9999),
    "smoothing_seasonal": (1 - 0.9999, 0.9999),
    "damping_trend": (0.8, 0.98),
}

# Window lengths and the step between window starts, per kind of series.
# The shortest windows hold two seasons, the fewest points Holt-Winters
# takes.
ANNUAL = {"season": 1, "windows": [(20, 4), (30, 5), (60, 10)]}
SUNSPOTS = {"season": 11, "windows": [(22, 11), (33, 9), (44, 9), (88, 22)]}
MONTHLY = {"season": 12, "windows": [(24, 12), (48, 24), (96, 36)]}
QUARTERLY = {"season": 4, "windows": [(12, 6), (24, 12), (40, 16)]}


def load():
    s = {}
    s["nile"] = nile.load_pandas().data["volume"]
    s["sunspots"] = sunspots.load_pandas().data["SUNACTIVITY"]
    s["co2_monthly"] = co2.load_pandas().data["co2"].resample("MS").mean().interpolate()
    s["elec_equip"] = elec_equip.load_pandas().data.iloc[:, 0]
    en = elnino.load_pandas().data.drop(columns="YEAR")
    s["elnino"] = pd.Series(en.to_numpy(dtype=float).ravel())
    md = macrodata.load_pandas().data
    for c in ["realgdp", "realcons", "realinv", "cpi", "m1", "unemp", "tbilrate", "infl"]:
        s["macrodata_" + c] = md[c]
    ii = interest_inflation.load_pandas().data
    for c in ["Dp", "R"]:
        s["interest_inflation_" + c] = ii[c]
    s = {k: v.to_numpy(dtype=float) for k, v in s.items()}
    kinds = {"nile": ANNUAL, "sunspots": SUNSPOTS}
    for k in s:
        if k not in kinds:
            kinds[k] = QUARTERLY if k.startswith(("macrodata", "interest")) else MONTHLY
    return s, kinds


def methods(y, season):
    out = [("ses", 1, False), ("holt", 1, False), ("damped-holt", 1, True)]
    if season > 1 and len(y) >= max(2 * season, season + 6):
        out += [("holt-winters-additive", season, False), ("holt-winters-additive", season, True)]
        if np.all(y > 0):
            out += [("holt-winters-multiplicative", season, False),
                    ("holt-winters-multiplicative", season, True)]
    return out


def fit(y, method, season, damped):
    kw = {}
    if method != "ses":
        kw["trend"] = "add"
    if damped:
        kw["damped_trend"] = True
    if method.startswith("holt-winters"):
        kw["seasonal"] = "add" if method.endswith("additive") else "mul"
        kw["seasonal_periods"] = season
    res = ExponentialSmoothing(y, initialization_method="estimated", bounds=BOUNDS, **kw).fit()
    p = res.params
    params = {"alpha": float(p["smoothing_level"])}
    if "trend" in kw:
        params["beta"] = float(p["smoothing_trend"])
    if "seasonal" in kw:
        params["gamma"] = float(p["smoothing_seasonal"])
    if damped:
        params["phi"] = float(p["damping_trend"])
    return float(res.sse), params


def dumps(out):
    """JSON with one series and one fit a line, so that diffs stay readable."""
    lines = ["{"]
    for k, v in out.items():
        if k == "series":
            lines.append(' "series": {')
            items = [f'  {json.dumps(n)}: {json.dumps(y)}' for n, y in v.items()]
            lines.append(",\n".join(items))
            lines.append(" },")
        elif k == "fits":
            lines.append(' "fits": [')
            lines.append(",\n".join("  " + json.dumps(f) for f in v))
            lines.append(" ]")
        else:
            lines.append(f" {json.dumps(k)}: {json.dumps(v)},")
    lines.append("}")
    return "\n".join(lines) + "\n"


def main():
    series, kinds = load()
    fits = []
    for name in series:
        y = series[name]
        kind = kinds[name]
        for length, step in kind["windows"]:
            for start in range(0, len(y) - length + 1, step):
                w = y[start:start + length]
                for method, season, damped in methods(w, kind["season"]):
                    sse, params = fit(w, method, season, damped)
                    fits.append({
                        "series": name, "start": start, "end": start + length,
                        "method": method, "season": season, "damped": damped,
                        "sse": sse, "params": params,
                    })
    windows = {(f["series"], f["start"], f["end"]) for f in fits}
    out = {
        "generator": "testdata/statsmodels/gen_windows.py",
        "python": platform.python_version(),
        "statsmodels": statsmodels.__version__,
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "pandas": pd.__version__,
        "bounds": {k: list(v) for k, v in BOUNDS.items()},
        "windows": len(windows),
        "series": {k: [float(v) for v in y] for k, y in series.items()},
        "fits": fits,
    }
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "ets_windows.json")
    with open(path, "w") as f:
        f.write(dumps(out))
    print("wrote", path, len(windows), "windows,", len(fits), "fits", file=sys.stderr)


if __name__ == "__main__":
    main()
