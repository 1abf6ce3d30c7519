"""SciPy peer for the 1-D thaw case of `npm run bench:peer`.

Solves the same semi-discrete equations as Holdline's 1-D solver (vertex-centred finite volumes, half
cells at both ends, harmonic-mean interface conductance, convective surface, enthalpy as the state and
the temperature from the same piecewise-linear H(T) table) with scipy.integrate.solve_ivp, method BDF,
given the tridiagonal sparsity of the Jacobian. Reads the case JSON written by scripts/bench-peer.ts
and prints one JSON object: for each rtol, the median CPU time of the solve and the time the centre
reaches the end point.
"""
import json
import sys
import time

import numpy as np
from scipy.integrate import solve_ivp
from scipy.sparse import diags

c = json.load(open(sys.argv[1]))
tab = c["table"]
Ht = np.array(tab["H"], dtype=float)
Kt = np.array(tab["k"], dtype=float)
Tg = tab["T0_C"] + tab["dT_K"] * np.arange(len(Ht))
n = int(c["nodes"])
L = float(c["halfSize_m"])
m = int(c["m"])
rho = float(c["rho_kg_m3"])
h = float(c["h_W_m2K"])
Tfl = float(c["fluid_C"])
end_C = float(c["end_C"])
dr = L / (n - 1)
r = dr * np.arange(n)
lo = np.maximum(0.0, r - dr / 2)
hi = np.minimum(L, r + dr / 2)
vol = (hi ** (m + 1) - lo ** (m + 1)) / (m + 1)
area = (r[:-1] + dr / 2) ** m
Asurf = L ** m
cap = rho * vol


def T_of_H(H):
    return np.interp(H, Ht, Tg)


def rhs(_t, H):
    T = T_of_H(H)
    k = np.interp(T, Tg, Kt)
    G = 2 * k[:-1] * k[1:] / (k[:-1] + k[1:]) * area / dr
    q = G * (T[1:] - T[:-1])
    dE = np.zeros(n)
    dE[:-1] += q
    dE[1:] -= q
    dE[-1] += h * (Tfl - T[-1]) * Asurf
    return dE / cap


def centre_done(_t, H):
    return T_of_H(H[:1])[0] - end_C


centre_done.terminal = True
centre_done.direction = 1

sparsity = diags([np.ones(n - 1), np.ones(n), np.ones(n - 1)], [-1, 0, 1])
H0 = np.full(n, np.interp(float(c["start_C"]), Tg, Ht))
out = []
for rtol in c["rtols"]:
    times = []
    thaw = None
    for _ in range(int(c["repeats"])):
        t0 = time.process_time()
        sol = solve_ivp(rhs, (0.0, float(c["tEnd_s"])), H0, method="BDF", rtol=rtol, atol=rtol * 1e3, jac_sparsity=sparsity, events=centre_done)
        times.append((time.process_time() - t0) * 1000)
        thaw = float(sol.t_events[0][0]) if len(sol.t_events[0]) else None
    out.append({"rtol": rtol, "ms": float(np.median(times)), "value": thaw, "nfev": int(sol.nfev), "steps": int(len(sol.t))})
print(json.dumps({"runs": out}))
