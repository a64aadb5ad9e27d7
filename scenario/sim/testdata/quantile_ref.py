"""Reference values for scenario.Quantile (Hyndman & Fan definition 7).

Run with Debian's interpreter: /usr/bin/python3 quantile_ref.py
numpy 1.24.2; numpy.quantile's default method "linear" is definition 7.
The printed Go table rows are pasted into quantile_test.go.
"""
import numpy as np

samples = {
    "five": [3.0, 1.0, 4.0, 1.0, 5.0],
    "ten": [12.5, -3.0, 7.25, 7.25, 0.0, 99.0, 41.0, -17.5, 8.0, 2.0],
    "two": [10.0, 20.0],
    "one": [42.0],
}
levels = [0.0, 0.05, 0.10, 0.25, 0.5, 0.9, 0.95, 1.0]

print("numpy", np.__version__)
for name, x in samples.items():
    q = np.quantile(np.array(x), levels)  # method="linear" (the default)
    print('{"%s", []float64{%s}, []float64{%s}},' % (
        name, ", ".join(repr(v) for v in x), ", ".join(repr(float(v)) for v in q)))
