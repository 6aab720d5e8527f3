"""Write the synthetic rheometer fixtures used by media/fit_test.go.

Each file is a flow curve computed from a model with stated parameters and
multiplicative log-normal noise from a fixed seed. The data are synthetic;
the blood parameters are those of Cho & Kensey (1991), Biorheology 28, 241
(recalled from memory). Run once: python3 make_fixtures.py
"""
import numpy as np

rng = np.random.default_rng(20261201)


def carreau(g, eta0, etainf, lam, n):
    return (etainf + (eta0 - etainf) * (1 + (lam * g) ** 2) ** ((n - 1) / 2)) * g


def cross(g, eta0, etainf, lam, m):
    return (etainf + (eta0 - etainf) / (1 + (lam * g) ** m)) * g


cases = {
    "blood_carreau": (np.logspace(-1, 3, 25), lambda g: carreau(g, 0.056, 0.00345, 3.313, 0.3568), 0.02),
    "mucus_powerlaw": (np.logspace(np.log10(0.5), np.log10(500), 20), lambda g: 2.0 * g ** 0.35, 0.02),
    "mud_herschel_bulkley": (np.logspace(-1, np.log10(300), 20), lambda g: 12 + 1.5 * g ** 0.6, 0.02),
    "gel_bingham": (np.logspace(-1, 2, 20), lambda g: 5 + 0.2 * g, 0.02),
    "casson": (np.logspace(0, 3, 20), lambda g: (np.sqrt(2.0) + np.sqrt(0.004 * g)) ** 2, 0.02),
    "polymer_cross": (np.logspace(-2, 3, 26), lambda g: cross(g, 10, 0.01, 1.0, 0.8), 0.02),
    "water_20C": (np.logspace(0, 3, 16), lambda g: 1.0016e-3 * g, 0.01),
    "honey": (np.logspace(-1, 2, 16), lambda g: 5.0 * g, 0.01),
    "starch_thickening": (np.logspace(0, 2.5, 16), lambda g: 0.05 * g ** 1.4, 0.02),
}

for name, (g, f, sigma) in cases.items():
    tau = f(g) * np.exp(rng.normal(0, sigma, g.size))
    with open(name + ".csv", "w") as fh:
        fh.write("shear rate (1/s),shear stress (Pa)\n")
        for gi, ti in zip(g, tau):
            fh.write(f"{gi:.6g},{ti:.6g}\n")
