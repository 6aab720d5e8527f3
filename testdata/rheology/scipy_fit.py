"""Fit the fixtures with SciPy as an outside reference for media/fit_test.go.

Same objective as flowregime: least squares on ln(stress), parameters
bounded to physical ranges. Writes scipy_reference.json with the library
versions. Run once with Debian's python3-scipy: /usr/bin/python3 scipy_fit.py
"""
import json
import numpy as np
import scipy
from scipy.optimize import curve_fit

models = {
    "newtonian": (lambda g, mu: mu * g, ["viscosity_Pa_s"], [1e-3], ([1e-12], [1e6])),
    "power-law": (lambda g, k, n: k * g ** n, ["consistency_Pa_sn", "flow_index"], [1, 0.5], ([1e-12, 0.05], [1e6, 2])),
    "carreau": (lambda g, e0, ei, lam, n: (ei + (e0 - ei) * (1 + (lam * g) ** 2) ** ((n - 1) / 2)) * g,
                ["zero_shear_viscosity_Pa_s", "infinite_shear_viscosity_Pa_s", "time_constant_s", "flow_index"],
                [0.06, 0.003, 3, 0.4], ([1e-12, 0, 1e-9, 0.05], [1e6, 1e6, 1e6, 2])),
    "cross": (lambda g, e0, ei, lam, m: (ei + (e0 - ei) / (1 + (lam * g) ** m)) * g,
              ["zero_shear_viscosity_Pa_s", "infinite_shear_viscosity_Pa_s", "time_constant_s", "transition_exponent"],
              [10, 0.01, 1, 0.8], ([1e-12, 0, 1e-9, 0.1], [1e6, 1e6, 1e6, 3])),
    "bingham": (lambda g, ty, mp: ty + mp * g, ["yield_stress_Pa", "plastic_viscosity_Pa_s"], [1, 0.1], ([0, 1e-12], [1e6, 1e6])),
    "herschel-bulkley": (lambda g, ty, k, n: ty + k * g ** n, ["yield_stress_Pa", "consistency_Pa_sn", "flow_index"],
                         [5, 1, 0.6], ([0, 1e-12, 0.05], [1e6, 1e6, 2])),
    "casson": (lambda g, ty, ec: (np.sqrt(ty) + np.sqrt(ec * g)) ** 2, ["yield_stress_Pa", "plastic_viscosity_Pa_s"],
               [1, 0.01], ([0, 1e-12], [1e6, 1e6])),
}

fits = {
    "blood_carreau": ["carreau", "power-law"],
    "mucus_powerlaw": ["power-law", "newtonian"],
    "mud_herschel_bulkley": ["herschel-bulkley", "bingham"],
    "gel_bingham": ["bingham", "herschel-bulkley"],
    "casson": ["casson"],
    "polymer_cross": ["cross"],
    "water_20C": ["newtonian", "power-law"],
    "honey": ["newtonian", "power-law"],
    "starch_thickening": ["power-law"],
}

out = {"library": "scipy.optimize.curve_fit (trf, bounds) on log stress", "scipy_version": scipy.__version__,
       "numpy_version": np.__version__, "fits": {}}
for data, names in fits.items():
    g, tau = np.loadtxt(data + ".csv", delimiter=",", skiprows=1, unpack=True)
    out["fits"][data] = {}
    for name in names:
        f, pnames, p0, bounds = models[name]
        popt, pcov = curve_fit(lambda x, *p: np.log(f(x, *p)), g, np.log(tau), p0=p0, bounds=bounds,
                               method="trf", max_nfev=100000, xtol=1e-15, ftol=1e-15, gtol=1e-15)
        se = np.sqrt(np.diag(pcov))
        out["fits"][data][name] = {"parameters": dict(zip(pnames, map(float, popt))),
                                   "standard_errors": dict(zip(pnames, map(float, se)))}
with open("scipy_reference.json", "w") as fh:
    json.dump(out, fh, indent=2, sort_keys=True)
    fh.write("\n")
