#!/usr/bin/python3
"""Reference values for forecast/ets_test.go.

Run from the repository root with Debian's interpreter:

    /usr/bin/python3 testdata/statsmodels/gen_ets.py

It writes testdata/statsmodels/ets_golden.json beside this script. The
references come from statsmodels 0.13.5+dfsg (Debian bookworm package
python3-statsmodels) with numpy 1.24.2 and pandas 1.5.3; the versions in use
are recorded in the JSON.

Data: open datasets that ship with statsmodels (named by their module):
  * nile        - sm.datasets.nile, column 'volume', annual (100 points)
  * elec_equip  - sm.datasets.elec_equip, its one column, monthly (257 points)
  * co2_monthly - sm.datasets.co2, weekly readings averaged to calendar
                  months (resample('MS').mean()), the 5 empty months filled by
                  linear interpolation (526 points)
  * realcons    - sm.datasets.macrodata, column 'realcons', quarterly (203
                  points)

Sections:
  fixed     - ExponentialSmoothing with the smoothing parameters held and the
              initial states given (initialization_method='known'): fitted
              values and forecasts (forecast_hw). The forecasts again from
              the in-sample recursion (forecast_recursion: the series is
              extended by its own one-step predictions) and, for the
              additive models, from ETSModel (forecast_ets); see below.
  estimated - ExponentialSmoothing fitted with initialization_method=
              'estimated' (default SLSQP optimiser with its grid search start)
              and parameter bounds alpha, beta in [0.0001, 0.9999], gamma in
              [0, 0.9999] and phi in [0.8, 0.98]; statsmodels itself adds
              beta <= alpha and gamma <= 1 - alpha. Recorded: parameters,
              initial states, SSE.
  variance  - ETSModel (error='add') relative forecast variances
              (res._relative_forecast_variance, HKOS 2008 Table 6.1 class 1
              formulas) and res.get_prediction(...).var_pred_mean / res.mse.
  class3    - ETSModel(error='mul', trend='add', seasonal='mul') simulated
              forecast variances from the end of a fixed-parameter run, with
              normal relative errors of a given sigma, and the states at the
              end of the run. ETSModel 0.13.5 updates a multiplicative season
              with e/l_t rather than e/(l_{t-1} + phi*b_{t-1}); forecasts up
              to m steps ahead use no seasonal update, so there the two
              agree exactly, and beyond they differ at second order.

ExponentialSmoothing 0.13.5 forecasts take the seasonal for forecast steps
h = m, 2m, ... from the seasonal state before the last update (see _predict:
s[nobs + m - 1:] = [s[(nobs - 1) + j % m] ...]), so its forecasts at those
steps differ from the recursion; ETSModel's forecasts follow the recursion
at every step (additive models). All are recorded.
"""
import json
import os
import platform
import sys
import warnings

import numpy as np
import pandas as pd
import statsmodels
from statsmodels.datasets import co2, elec_equip, macrodata, nile
from statsmodels.tsa.exponential_smoothing.ets import ETSModel
from statsmodels.tsa.holtwinters import ExponentialSmoothing

warnings.simplefilter("ignore")

BOUNDS = {
    "smoothing_level": (0.0001, 0.9999),
    "smoothing_trend": (0.0001, 0.9999),
    # 0, not 0.0001: statsmodels rejects gamma_lb > 1 - alpha_ub, and
    # 1 - 0.9999 rounds below 0.0001.
    "smoothing_seasonal": (0.0, 0.9999),
    "damping_trend": (0.8, 0.98),
}


def load():
    s = {}
    s["nile"] = nile.load_pandas().data["volume"].to_numpy(dtype=float)
    s["elec_equip"] = elec_equip.load_pandas().data.iloc[:, 0].to_numpy(dtype=float)
    c = co2.load_pandas().data["co2"].resample("MS").mean().interpolate()
    s["co2_monthly"] = c.to_numpy(dtype=float)
    s["realcons"] = macrodata.load_pandas().data["realcons"].to_numpy(dtype=float)
    s["elec_equip_last120"] = s["elec_equip"][-120:]
    return s


def hw_kwargs(method, season, damped):
    kw = {}
    if method in ("holt", "damped-holt", "holt-winters-additive", "holt-winters-multiplicative"):
        kw["trend"] = "add"
    if method == "damped-holt" or (method.startswith("holt-winters") and damped):
        kw["damped_trend"] = True
    if method == "holt-winters-additive":
        kw["seasonal"] = "add"
        kw["seasonal_periods"] = season
    if method == "holt-winters-multiplicative":
        kw["seasonal"] = "mul"
        kw["seasonal_periods"] = season
    return kw


def fl(a):
    return [float(v) for v in np.asarray(a, dtype=float)]


def fixed_case(name, series, y, method, season, damped, alpha, beta, gamma, phi, l0, b0, s0, h):
    kw = hw_kwargs(method, season, damped)
    known = {"initial_level": l0}
    if "trend" in kw:
        known["initial_trend"] = b0
    if "seasonal" in kw:
        known["initial_seasonal"] = s0
    mod = ExponentialSmoothing(y, initialization_method="known", **known, **kw)
    fit_kw = {"smoothing_level": alpha}
    if "trend" in kw:
        fit_kw["smoothing_trend"] = beta
    if "seasonal" in kw:
        fit_kw["smoothing_seasonal"] = gamma
    if kw.get("damped_trend"):
        fit_kw["damping_trend"] = phi
    res = mod.fit(optimized=False, **fit_kw)

    # The forecasts again, through the in-sample recursion: extend the series
    # one step at a time by its own one-step prediction (zero errors), so the
    # fitted value of step j is the j-step forecast.
    ext = list(y)
    for _ in range(h):
        ext.append(float(y[-1]))  # placeholder; its own prediction does not use it
        emod = ExponentialSmoothing(np.array(ext), initialization_method="known", **known, **kw)
        ext[-1] = float(emod.fit(optimized=False, **fit_kw).fittedvalues[-1])
    recursion = ext[len(y):]

    # The same model in ETSModel's innovations form (beta_ets = alpha*beta),
    # for the additive models only: ETSModel 0.13.5 updates a multiplicative
    # season with e/l_t (the new level), ExponentialSmoothing with
    # e/(l_{t-1} + phi*b_{t-1}).
    forecast_ets = None
    if kw.get("seasonal") != "mul":
        ekw = dict(kw)
        ekw["error"] = "add"
        eparams = [alpha]
        if "trend" in kw:
            eparams.append(alpha * beta)
        if "seasonal" in kw:
            eparams.append(gamma)
        if kw.get("damped_trend"):
            eparams.append(phi)
        emod = ETSModel(y, initialization_method="known", **known, **ekw)
        eres = emod.smooth(np.array(eparams))
        gap = np.max(np.abs(np.asarray(eres.fittedvalues) - np.asarray(res.fittedvalues)))
        assert gap < 1e-8 * np.max(np.abs(y)), (name, gap)
        forecast_ets = fl(eres.forecast(h))
    return {
        "name": name,
        "series": series,
        "method": method,
        "season": season,
        "damped": bool(kw.get("damped_trend", False)),
        "alpha": alpha,
        "beta": beta if "trend" in kw else None,
        "gamma": gamma if "seasonal" in kw else None,
        "phi": phi if kw.get("damped_trend") else None,
        "initial_level": l0,
        "initial_trend": b0 if "trend" in kw else None,
        "initial_seasonal": fl(s0) if "seasonal" in kw else None,
        "fitted": fl(res.fittedvalues),
        "sse": float(res.sse),
        "forecast_hw": fl(res.forecast(h)),
        "forecast_recursion": fl(recursion),
        "forecast_ets": forecast_ets,
    }


def estimated_case(name, series, y, method, season, damped):
    kw = hw_kwargs(method, season, damped)
    res = ExponentialSmoothing(y, initialization_method="estimated", bounds=BOUNDS, **kw).fit()
    p = res.params
    out = {
        "name": name,
        "series": series,
        "method": method,
        "season": season,
        "damped": bool(kw.get("damped_trend", False)),
        "alpha": float(p["smoothing_level"]),
        "sse": float(res.sse),
        "initial_level": float(p["initial_level"]),
    }
    if "trend" in kw:
        out["beta"] = float(p["smoothing_trend"])
        out["initial_trend"] = float(p["initial_trend"])
    if "seasonal" in kw:
        out["gamma"] = float(p["smoothing_seasonal"])
        out["initial_seasonal"] = fl(p["initial_seasons"])
    if kw.get("damped_trend"):
        out["phi"] = float(p["damping_trend"])
    return out


def variance_case(name, y, model, alpha, beta, gamma, phi, season, h):
    """model is the ETS short name; beta here is ETSModel's (innovations) beta."""
    kw = {"error": "add"}
    params = [alpha]
    init = {"initial_level": float(y[0])}
    if model[1] == "A":
        kw["trend"] = "add"
        params.append(beta)
        init["initial_trend"] = 0.0
        if "d" in model:
            kw["damped_trend"] = True
    if model[-1] == "A":
        kw["seasonal"] = "add"
        kw["seasonal_periods"] = season
        params.append(gamma)
        init["initial_seasonal"] = [0.0] * season
    if kw.get("damped_trend"):
        params.append(phi)
    # get_prediction needs a dated series.
    yy = pd.Series(y, index=pd.date_range("2001-01-01", periods=len(y), freq="MS"))
    mod = ETSModel(yy, initialization_method="known", **init, **kw)
    res = mod.smooth(np.array(params))
    assert res.model.short_name == model, (res.model.short_name, model)
    n = len(y)
    steps = np.arange(1, h + 1)
    rel = res._relative_forecast_variance(steps)
    pred = res.get_prediction(start=n, end=n + h - 1)
    return {
        "name": name,
        "model": model,
        "alpha": alpha,
        "beta_innovations": beta if model[1] == "A" else None,
        "gamma": gamma if "seasonal" in kw else None,
        "phi": phi if kw.get("damped_trend") else None,
        "season": season if "seasonal" in kw else 0,
        "relative_variance": fl(rel),
        "var_pred_mean_over_mse": fl(np.asarray(pred.var_pred_mean) / res.mse),
    }


def class3_case(name, series, y, season, damped, alpha, beta, gamma, phi, l0, b0, s0, sigma, h, reps):
    kw = {"error": "mul", "trend": "add", "seasonal": "mul", "seasonal_periods": season}
    params = [alpha, alpha * beta, gamma]
    if damped:
        kw["damped_trend"] = True
        params.append(phi)
    mod = ETSModel(y, initialization_method="known", initial_level=l0, initial_trend=b0,
                   initial_seasonal=s0, **kw)
    res = mod.smooth(np.array(params))
    rng = np.random.default_rng(20240601)
    errs = rng.normal(0.0, sigma, size=(h, reps))
    sim = res.simulate(h, anchor="end", repetitions=reps, random_errors=errs)
    sim = np.asarray(sim)
    var = sim.var(axis=1)
    st = np.asarray(res.states)
    return {
        "name": name,
        "series": series,
        "season": season,
        "damped": damped,
        "alpha": alpha,
        "beta": beta,
        "gamma": gamma,
        "phi": phi if damped else None,
        "initial_level": l0,
        "initial_trend": b0,
        "initial_seasonal": fl(s0),
        "sigma": sigma,
        "repetitions": reps,
        "end_level": float(st[-1, 0]),
        "end_trend": float(st[-1, 1]),
        "end_seasonal": fl(st[-season:, 2]),
        "forecast": fl(res.forecast(h)),
        "simulated_variance": fl(var),
        "simulated_mean": fl(sim.mean(axis=1)),
    }


def main():
    s = load()
    ee = s["elec_equip"]
    ee_s0 = [-4.0, -3.0, 8.0, 0.5, 1.0, 6.5, 2.0, -22.0, 5.0, 3.0, 2.0, 1.0]
    ee_m0 = [0.96, 0.97, 1.08, 1.0, 1.01, 1.06, 1.02, 0.78, 1.05, 1.03, 1.02, 1.01]
    rc_s0 = [-3.0, 1.0, 0.5, 1.5]
    rc_m0 = [0.998, 1.001, 1.0, 1.001]
    fixed = [
        fixed_case("nile ses", "nile", s["nile"], "ses", 1, False, 0.25, None, None, None, 1110.0, None, None, 10),
        fixed_case("nile holt", "nile", s["nile"], "holt", 1, False, 0.3, 0.1, None, None, 1120.0, -2.5, None, 10),
        fixed_case("nile damped holt", "nile", s["nile"], "damped-holt", 1, True, 0.3, 0.1, None, 0.9, 1120.0, -2.5, None, 10),
        fixed_case("elec_equip hw additive", "elec_equip", ee, "holt-winters-additive", 12, False,
                   0.45, 0.05, 0.3, None, 75.0, 0.2, ee_s0, 30),
        fixed_case("elec_equip hw additive damped", "elec_equip", ee, "holt-winters-additive", 12, True,
                   0.45, 0.05, 0.3, 0.92, 75.0, 0.2, ee_s0, 30),
        fixed_case("elec_equip hw multiplicative", "elec_equip", ee, "holt-winters-multiplicative", 12, False,
                   0.5, 0.04, 0.25, None, 75.0, 0.2, ee_m0, 30),
        fixed_case("elec_equip hw multiplicative damped", "elec_equip", ee, "holt-winters-multiplicative", 12, True,
                   0.5, 0.04, 0.25, 0.9, 75.0, 0.2, ee_m0, 30),
        fixed_case("realcons hw additive", "realcons", s["realcons"], "holt-winters-additive", 4, False,
                   0.8, 0.2, 0.1, None, 1700.0, 10.0, rc_s0, 10),
        fixed_case("realcons hw multiplicative damped", "realcons", s["realcons"], "holt-winters-multiplicative", 4, True,
                   0.8, 0.2, 0.1, 0.95, 1700.0, 10.0, rc_m0, 10),
    ]
    estimated = []
    for series, method, season, damped in [
        ("nile", "ses", 1, False),
        ("nile", "holt", 1, False),
        ("nile", "damped-holt", 1, True),
        ("realcons", "holt", 1, False),
        ("realcons", "damped-holt", 1, True),
        ("elec_equip", "holt-winters-additive", 12, False),
        ("elec_equip", "holt-winters-additive", 12, True),
        ("elec_equip", "holt-winters-multiplicative", 12, False),
        ("elec_equip", "holt-winters-multiplicative", 12, True),
        ("elec_equip_last120", "holt-winters-additive", 12, False),
        ("elec_equip_last120", "holt-winters-multiplicative", 12, False),
        ("co2_monthly", "holt-winters-additive", 12, False),
        ("co2_monthly", "holt-winters-multiplicative", 12, False),
        ("co2_monthly", "holt-winters-additive", 12, True),
        ("realcons", "holt-winters-additive", 4, False),
        ("realcons", "holt-winters-multiplicative", 4, True),
    ]:
        name = f"{series} {method}" + (" damped" if damped and method.startswith("holt-winters") else "")
        estimated.append(estimated_case(name, series, s[series], method, season, damped))
    y = s["elec_equip"]
    H = 30
    variance = [
        variance_case("ANN", y, "ANN", 0.3, None, None, None, 12, H),
        variance_case("AAN", y, "AAN", 0.4, 0.12, None, None, 12, H),
        variance_case("AAdN", y, "AAdN", 0.4, 0.12, None, 0.9, 12, H),
        variance_case("AAA m=12", y, "AAA", 0.45, 0.0225, 0.3, None, 12, H),
        variance_case("AAdA m=12", y, "AAdA", 0.45, 0.0225, 0.3, 0.92, 12, H),
        variance_case("AAdA m=4", y, "AAdA", 0.6, 0.3, 0.2, 0.85, 4, H),
    ]
    class3 = [
        class3_case("elec_equip M,Ad,M", "elec_equip", ee, 12, True, 0.5, 0.04, 0.25, 0.9,
                    75.0, 0.2, ee_m0, 0.04, 24, 200000),
        class3_case("realcons M,A,M", "realcons", s["realcons"], 4, False, 0.8, 0.2, 0.1, None,
                    1700.0, 10.0, rc_m0, 0.01, 12, 200000),
    ]
    out = {
        "generator": "testdata/statsmodels/gen_ets.py",
        "python": platform.python_version(),
        "statsmodels": statsmodels.__version__,
        "numpy": np.__version__,
        "pandas": pd.__version__,
        "series": {k: fl(v) for k, v in s.items() if k != "elec_equip_last120"},
        "fixed": fixed,
        "estimated": estimated,
        "variance": variance,
        "class3": class3,
    }
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "ets_golden.json")
    with open(path, "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")
    print("wrote", path, file=sys.stderr)


if __name__ == "__main__":
    main()
