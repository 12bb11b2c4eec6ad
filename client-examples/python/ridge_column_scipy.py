"""A compact scipy version of the mid-ocean-ridge column, for the Monte Carlo benchmark.

What a researcher's notebook loop does without the service: for each Monte Carlo draw of the
potential temperature and the water, integrate one isentropic decompression column and take the
crust. Dry Katz, Spiegelman & Langmuir (2003, G-cubed 4(9) 1073, doi:10.1029/2002GC000433;
parameters of their Table 2) on the first melting branch (cpx present, which holds for the draws
below about 1500 °C); the isentropic melting rate of Katz et al. (2003) integrated in u = F^(1/β1)
with scipy's solve_ivp (RK45), crust = (ρs/ρc) ∫F dz of a passive triangular regime (McKenzie &
Bickle 1988). Water is drawn but, as in a notebook that keeps the dry law, not used.

Usage: python ridge_column_scipy.py [columns] [seed]  -> prints JSON {columns, seconds, ...}
"""
import json
import math
import sys
import time

import numpy as np
from scipy.integrate import solve_ivp
from scipy.optimize import brentq

A1, A2, A3 = 1085.7, 132.9, -5.1          # solidus, °C, °C/GPa, °C/GPa²
B1, B2, B3 = 1475.0, 80.0, -3.2           # lherzolite liquidus
BETA1 = 1.5
CP, DS = 1000.0, 300.0                    # J/kg/K
ALPHA_S, ALPHA_F = 4.0e-5, 6.8e-5         # 1/K
RHO_S, RHO_F, RHO_C = 3300.0, 2900.0, 2900.0
G = 9.81
K0 = 273.15


def ts(p):   # K, p in Pa
    g = p / 1e9
    return A1 + A2 * g + A3 * g * g + K0


def tl(p):
    g = p / 1e9
    return B1 + B2 * g + B3 * g * g + K0


def dts(p):  # K/Pa
    return (A2 + 2 * A3 * p / 1e9) / 1e9


def dtl(p):
    return (B2 + 2 * B3 * p / 1e9) / 1e9


def rhs(p, y):
    u = max(y[0], 1e-12)
    f = u ** BETA1
    span = tl(p) - ts(p)
    t = ts(p) + u * span
    dt_dp = dts(p) + u * (dtl(p) - dts(p))   # (∂T/∂P) at fixed u
    dt_du = span
    num = CP / t * dt_dp - ((1 - f) * ALPHA_S / RHO_S + f * ALPHA_F / RHO_F)
    den = CP / t * dt_du + DS * BETA1 * u ** (BETA1 - 1)
    du_dp = -num / den
    return [du_dp, -f / (RHO_S * G)]         # second: ∫F dz accumulated upward (dz = −dP/(ρ g))


def crust_km(tp_c):
    tp = tp_c + K0
    adiabat = lambda p: tp * math.exp(ALPHA_S * p / (RHO_S * CP)) - ts(p)
    p0 = brentq(adiabat, 0.0, 10e9)
    sol = solve_ivp(rhs, (p0, 0.0), [1e-9, 0.0], method="RK45", rtol=1e-6, atol=1e-9,
                    t_eval=np.linspace(p0, 0.0, int(p0 / (RHO_S * G * 1000)) + 2))
    integral = sol.y[1, -1]
    return RHO_S / RHO_C * integral / 1000.0, integral / 1000.0


def main():
    columns = int(sys.argv[1]) if len(sys.argv) > 1 else 200
    seed = int(sys.argv[2]) if len(sys.argv) > 2 else 42
    rng = np.random.default_rng(seed)
    tp = rng.normal(1350.0, 25.0, columns)
    water = rng.uniform(0.0, 0.02, columns)  # drawn as in the study; the dry law ignores it
    crust = np.empty(columns)
    start = time.perf_counter()
    for i in range(columns):
        crust[i] = crust_km(tp[i])[0]
    seconds = time.perf_counter() - start
    _, melt1350 = crust_km(1350.0)
    print(json.dumps({"columns": columns, "seconds": seconds, "msPerColumn": 1000 * seconds / columns,
                      "crustMeanKm": float(crust.mean()), "crustSdKm": float(crust.std(ddof=1)),
                      "meltThicknessAt1350Km": melt1350, "waterDrawnMeanWtPct": float(water.mean())}))


if __name__ == "__main__":
    main()
