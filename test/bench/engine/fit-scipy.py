"""Reference timing for fit.bench.ts: SciPy least_squares (trf) on the same Cole-Cole spectra.

Reads JSON from stdin: {"frequencyHz": [...], "cases": [{"re": [...], "im": [...], "start": [rInf, r0, tau, alpha]}]}
Writes JSON to stdout: {"scipy": version, "parameters": [[...], ...], "millis": [...]}
Run by fit.bench.ts; by hand: python3 test/bench/engine/fit-scipy.py < cases.json
"""
import json
import sys
import time

import numpy as np
import scipy
from scipy.optimize import least_squares


def main() -> None:
    data = json.load(sys.stdin)
    omega = 2 * np.pi * np.asarray(data["frequencyHz"], dtype=float)
    lower = np.zeros(4)
    upper = np.array([np.inf, np.inf, np.inf, 1.0])
    parameters, millis = [], []
    for case in data["cases"]:
        z_obs = np.asarray(case["re"]) + 1j * np.asarray(case["im"])
        modulus = np.abs(z_obs)

        def residual(p, z_obs=z_obs, modulus=modulus):
            r_inf, r0, tau, alpha = p
            z = r_inf + (r0 - r_inf) / (1 + (1j * omega * tau) ** alpha)
            d = (z_obs - z) / modulus
            return np.concatenate([d.real, d.imag])

        start = np.clip(np.asarray(case["start"], dtype=float), lower + 1e-12, upper)
        t0 = time.perf_counter()
        fit = least_squares(residual, start, method="trf", bounds=(lower, upper), x_scale="jac")
        millis.append((time.perf_counter() - t0) * 1000)
        parameters.append(fit.x.tolist())
    json.dump({"scipy": scipy.__version__, "parameters": parameters, "millis": millis}, sys.stdout)


if __name__ == "__main__":
    main()
