"""SciPy peer for the box case of `npm run bench:peer`.

Solves the same network equations as Holdline's box model (lib/physics/shipper.ts), as exported by its
`onAssembled` hook: wall chains of constant capacities, enthalpy chains for the pack and the product
(state: specific enthalpy, temperature from the same piecewise-linear H(T) table, harmonic-mean k
between nodes), each chain's last node coupled to the inside air, contact links between last nodes,
outer films to each face kind's sol-air temperature, edge conduction and lid-opening exchange to the
outside air. Conditions are piecewise constant; the solve restarts at every change (exact events), with
scipy.integrate.solve_ivp, method BDF and the Jacobian's sparsity. Prints, for each rtol, the median
CPU time and the time the product's surface first rises through the limit.
"""
import json
import sys
import time

import numpy as np
from scipy.integrate import solve_ivp
from scipy.sparse import lil_matrix

c = json.load(open(sys.argv[1]))
net = c["network"]
chains = net["chains"]
zones = net["zones"]
offs = []
N = 0
for ch in chains:
    offs.append(N)
    N += len(ch["capacity"])
nZ = len(zones)
Ntot = N + nZ
is_H = np.zeros(Ntot, dtype=bool)
cap = np.zeros(Ntot)
tables = []
Tinit = np.zeros(Ntot)
for ci, ch in enumerate(chains):
    n = len(ch["capacity"])
    sl = slice(offs[ci], offs[ci] + n)
    cap[sl] = ch["capacity"]
    Tinit[sl] = ch["T0_C"]
    if ch["table"] is not None:
        is_H[sl] = True
        t = ch["table"]
        Tg = t["T0_C"] + t["dT_K"] * np.arange(len(t["H"]))
        tables.append((ci, sl, np.array(t["H"]), Tg, np.array(t["k"])))
for z in range(nZ):
    cap[N + z] = zones[z]["C_J_K"]
    Tinit[N + z] = zones[z]["T0_C"]

# Links as index arrays: constant conductances, and harmonic-k links of enthalpy chains.
ci_a, ci_b, ci_G = [], [], []
hk = []  # (chain, i_global_a, i_global_b, factor)
for ci, ch in enumerate(chains):
    o = offs[ci]
    for i, g in enumerate(ch["link"]):
        if ch["table"] is None:
            ci_a.append(o + i)
            ci_b.append(o + i + 1)
            ci_G.append(g)
        else:
            hk.append((o + i, o + i + 1, g))
    last = o + len(ch["capacity"]) - 1
    for z, u in enumerate(ch["U_W_K"]):
        if u != 0:
            ci_a.append(last)
            ci_b.append(N + z)
            ci_G.append(u)
for l in net["links"]:
    a = offs[l["a"]] + len(chains[l["a"]]["capacity"]) - 1
    b = offs[l["b"]] + len(chains[l["b"]]["capacity"]) - 1
    ci_a.append(a)
    ci_b.append(b)
    ci_G.append(l["G_W_K"])
ci_a = np.array(ci_a, dtype=int)
ci_b = np.array(ci_b, dtype=int)
ci_G = np.array(ci_G)
hk_a = np.array([x[0] for x in hk], dtype=int)
hk_b = np.array([x[1] for x in hk], dtype=int)
hk_f = np.array([x[2] for x in hk])
faces = [(offs[ci], ch["face"]) for ci, ch in enumerate(chains) if ch["face"] is not None]
face_idx = np.array([f[0] for f in faces], dtype=int)
face_half = np.array([f[1]["halfOuter_K_W"] for f in faces])
face_area = np.array([f[1]["area_m2"] for f in faces])
face_kind = [f[1]["kind"] for f in faces]
edge = net["edgeConductance_W_K"] * np.array([z["edgeShare"] for z in zones])
open_share = np.array([z["openShare"] for z in zones])

sp = lil_matrix((Ntot, Ntot))
for i in range(Ntot):
    sp[i, i] = 1
for a, b in list(zip(ci_a, ci_b)) + list(zip(hk_a, hk_b)):
    sp[a, b] = 1
    sp[b, a] = 1
sp = sp.tocsr()


def temps(y):
    T = y.copy()
    kk = np.zeros(Ntot)
    for _ci, sl, Ht, Tg, Kt in tables:
        T[sl] = np.interp(y[sl], Ht, Tg)
        kk[sl] = np.interp(T[sl], Tg, Kt)
    return T, kk


def make_rhs(seg):
    G_out = 1.0 / (face_half + 1.0 / (seg["outerH_W_m2K"] * face_area))
    Te = np.array([seg["solAir_C"][k] for k in face_kind])
    Tamb = seg["air_C"]
    Gopen = seg["openExchange_W_K"] * open_share

    def rhs(_t, y):
        T, kk = temps(y)
        q = np.zeros(Ntot)
        f = ci_G * (T[ci_b] - T[ci_a])
        np.add.at(q, ci_a, f)
        np.add.at(q, ci_b, -f)
        if len(hk_a):
            ka, kb = kk[hk_a], kk[hk_b]
            g = hk_f * 2 * ka * kb / (ka + kb)
            f2 = g * (T[hk_b] - T[hk_a])
            np.add.at(q, hk_a, f2)
            np.add.at(q, hk_b, -f2)
        np.add.at(q, face_idx, G_out * (Te - T[face_idx]))
        q[N:] += (edge + Gopen) * (Tamb - T[N:])
        return q / cap

    return rhs


probe = offs[c["probeChain"]] + len(chains[c["probeChain"]]["capacity"]) - 1
limit = float(c["limit_C"])


def crossed(_t, y):
    T, _ = temps(y)
    return T[probe] - limit


crossed.terminal = True
crossed.direction = 1

y0 = Tinit.copy()
for _ci, sl, Ht, Tg, Kt in tables:
    y0[sl] = np.interp(Tinit[sl], Tg, Ht)
segs = c["segments"]
out = []
for rtol in c["rtols"]:
    atol = np.where(is_H, rtol * 1e3, rtol * 1.0)
    times = []
    hit = None
    steps = 0
    for _ in range(int(c["repeats"])):
        t0 = time.process_time()
        y = y0.copy()
        hit = None
        steps = 0
        for seg in segs:
            sol = solve_ivp(make_rhs(seg), (seg["start_s"], seg["end_s"]), y, method="BDF", rtol=rtol, atol=atol, jac_sparsity=sp, events=crossed)
            steps += len(sol.t)
            if len(sol.t_events[0]):
                hit = float(sol.t_events[0][0])
                break
            y = sol.y[:, -1]
        times.append((time.process_time() - t0) * 1000)
    out.append({"rtol": rtol, "ms": float(np.median(times)), "value": hit, "steps": steps})
print(json.dumps({"runs": out}))
