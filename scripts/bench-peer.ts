/**
 * npm run bench:peer — Holdline's solvers against a SciPy peer on the same equations.
 *
 * For a thaw (the 1-D enthalpy solver) and a box (the network model) this script writes the case with
 * Holdline's own property tables to a temporary JSON file, runs Holdline at several accuracy settings,
 * runs scripts/peer/*.py (scipy.integrate.solve_ivp, BDF, with the Jacobian's sparsity) at several
 * tolerances on the same semi-discrete equations, and measures each against a fine reference (Holdline
 * with very small steps, Richardson-extrapolated, cross-checked against the peer at its tightest
 * tolerance). Times are CPU time of the solve alone (process.cpuUsage / time.process_time), median of
 * repeats, so other work on a shared machine inflates them less than wall time would.
 *
 * "At equal accuracy" compares, for a target error, the cheapest run of each that meets it. The last
 * lines read `peer ratio thaw: N` and `peer ratio box: N` (peer time over Holdline time at Holdline's
 * default accuracy; the 0.1 % ratios are printed above them). Nothing is asserted.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir, loadavg } from "node:os";
import { join } from "node:path";
import { DEMO_SCENARIO as D } from "../lib/db/demo-scenario";
import { foodThermal } from "../lib/physics/properties";
import { solve1D } from "../lib/physics/solver1d";
import { runNetwork, type NetworkSpec } from "../lib/physics/shipper";
import { packMaterial } from "../lib/physics/hold";
import type { PropertyTable } from "../lib/physics/table";

/** The Python with NumPy and SciPy: HOLDLINE_PYTHON if set, else Debian's, else the first python3 on PATH. */
const PY = [process.env.HOLDLINE_PYTHON, "/usr/bin/python3", "python3"].find((p): p is string => {
  if (!p) return false;
  try {
    execFileSync(p, ["-c", "import numpy, scipy"], { stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
}) ?? "/usr/bin/python3";
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
function cpuTime<T>(fn: () => T, runs: number, warm: number): { ms: number; value: T } {
  let value = fn();
  for (let i = 1; i < warm; i++) value = fn();
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c = process.cpuUsage();
    value = fn();
    const d = process.cpuUsage(c);
    out.push((d.user + d.system) / 1000);
  }
  return { ms: median(out), value };
}
const tableJson = (t: PropertyTable) => ({ T0_C: t.T0_C, dT_K: t.dT_K, H: Array.from(t.H), k: Array.from(t.k) });
/** Linear interpolation of the time a series first reaches `level` going up. */
function crossing(t: number[], y: number[], level: number): number | null {
  for (let i = 1; i < t.length; i++) if (y[i] >= level && y[i - 1] < level) return t[i - 1] + ((level - y[i - 1]) / (y[i] - y[i - 1])) * (t[i] - t[i - 1]);
  return null;
}

interface Run {
  setting: string;
  ms: number;
  value: number | null;
}
const relErr = (v: number | null, ref: number) => (v === null ? Infinity : Math.abs(v - ref) / ref);
/** The cheapest run whose error is at most `target`. */
function cheapest(runs: Run[], ref: number, target: number): Run | null {
  let best: Run | null = null;
  for (const r of runs) if (relErr(r.value, ref) <= target && (!best || r.ms < best.ms)) best = r;
  return best;
}

const dir = mkdtempSync(join(tmpdir(), "holdline-peer-"));
const havePeer = (() => {
  if (PY.includes("/") && !existsSync(PY)) return false;
  try {
    execFileSync(PY, ["-c", "import scipy.integrate, numpy"], { stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
})();
const peer = (script: string, caseFile: string): Run[] | null => {
  if (!havePeer) return null;
  const out = JSON.parse(execFileSync(PY, [join("scripts", "peer", script), caseFile], { encoding: "utf8", maxBuffer: 1 << 26 })) as { runs: { rtol: number; ms: number; value: number | null; steps: number }[] };
  return out.runs.map((r) => ({ setting: `rtol ${r.rtol.toExponential(0)} (${r.steps} steps)`, ms: r.ms, value: r.value }));
};

function report(name: string, unit: string, ours: Run[], oursDefault: Run, ref: number, refNote: string, theirs: Run[] | null): void {
  console.log(`\n${name}: reference ${ref.toFixed(1)} ${unit} (${refNote})`);
  console.log("  Holdline:");
  for (const r of ours) console.log(`    ${r.setting.padEnd(28)} ${r.ms.toFixed(2).padStart(9)} ms  error ${(relErr(r.value, ref) * 100).toFixed(4)} %`);
  if (!theirs) {
    console.log(`  SciPy peer skipped: ${PY} with numpy and scipy not found (Debian: apt-get install -y python3-scipy)`);
    return;
  }
  console.log("  SciPy solve_ivp BDF:");
  for (const r of theirs) console.log(`    ${r.setting.padEnd(28)} ${r.ms.toFixed(2).padStart(9)} ms  error ${(relErr(r.value, ref) * 100).toFixed(4)} %`);
  const eDefault = relErr(oursDefault.value, ref);
  for (const [label, target] of [[`Holdline's default accuracy (${(eDefault * 100).toFixed(3)} %)`, eDefault], ["0.1 %", 1e-3]] as const) {
    const a = cheapest(ours, ref, target);
    const b = cheapest(theirs, ref, target);
    console.log(`  at ${label}: Holdline ${a ? `${a.ms.toFixed(2)} ms (${a.setting})` : "not reached"}, SciPy ${b ? `${b.ms.toFixed(2)} ms (${b.setting})` : "not reached"}${a && b ? `, ratio ${(b.ms / a.ms).toFixed(1)}` : ""}`);
  }
}
const ratioAt = (ours: Run[], theirs: Run[] | null, ref: number, target: number): string => {
  if (!theirs) return "skipped (no SciPy)";
  const a = cheapest(ours, ref, target);
  const b = cheapest(theirs, ref, target);
  return a && b ? (b.ms / a.ms).toFixed(1) : "n/a";
};

console.log(`Holdline vs SciPy solve_ivp BDF, same equations and tables (CPU time, median; load average ${loadavg().map((x) => x.toFixed(1)).join(" ")})`);

// ---------- Thaw: a 50 mm frozen cod block (slab, half-thickness 25 mm) from −18 °C in 4 °C air, h = 10 W/(m²·K), to −1 °C at the centre.
const cod = D.products.find((p) => p.name.startsWith("Cod"))!;
const food = foodThermal({ composition: cod.composition, initialFreezing_C: cod.initialFreezing_C });
const THAW_NODES = Number(process.env.THAW_NODES ?? 31); // the thaw planner's count
const thawCase = { m: 0, halfSize_m: 0.025, nodes: THAW_NODES, rho_kg_m3: food.rho_kg_m3, h_W_m2K: 10, fluid_C: 4, start_C: -18, end_C: -1, tEnd_s: 4 * 24 * 3600 };
const thawRun = (adaptive: { target_K: number; dtMax_s: number } | undefined, dt_s: number) => {
  const r = solve1D({
    shape: "slab",
    halfSize_m: thawCase.halfSize_m,
    nodes: thawCase.nodes,
    material: food,
    initial_C: thawCase.start_C,
    boundary: { kind: "convective", h_W_m2K: () => thawCase.h_W_m2K, fluid_C: () => thawCase.fluid_C },
    tEnd_s: thawCase.tEnd_s,
    dt_s,
    adaptive,
    stopWhen: (s) => s.center_C >= thawCase.end_C,
  });
  return crossing(r.t_s, r.center_C, thawCase.end_C);
};
// Reference: fixed 2 s and 1 s steps, Richardson-extrapolated (BDF2 is second order).
const t2 = thawRun(undefined, 2)!;
const t1 = thawRun(undefined, 1)!;
const thawRef = (4 * t1 - t2) / 3;
const thawTargets = [4, 2, 1, 0.5, 0.25, 0.1, 0.05, 0.02];
for (let i = 0; i < 20; i++) for (const k of thawTargets) thawRun({ target_K: k, dtMax_s: 900 }, 60); // warm the JIT
const thawOurs: Run[] = thawTargets.map((k) => {
  const { ms, value } = cpuTime(() => thawRun({ target_K: k, dtMax_s: 900 }, 60), 7, 3);
  return { setting: `target ${k} K${k === 1 ? " (planner default)" : ""}`, ms, value };
});
const thawFile = join(dir, "thaw.json");
writeFileSync(thawFile, JSON.stringify({ ...thawCase, table: tableJson(food.table), rtols: [1e-2, 1e-3, 1e-4, 1e-5, 1e-6, 1e-7], repeats: 3 }));
const thawPeer = peer("thaw_peer.py", thawFile);
report(`Thaw, ${THAW_NODES} nodes (time for the centre to reach −1 °C)`, "s", thawOurs, thawOurs[2], thawRef, `Holdline with 1 s and 2 s fixed steps, second-order Richardson; 1 s alone differs by ${((Math.abs(t1 - thawRef) / thawRef) * 100).toFixed(4)} %`, thawPeer);
const thawDefaultErr = relErr(thawOurs[2].value, thawRef);


// ---------- Box: a thin foam box (one inside-air zone) with a gel pack lying on a chilled product and covering
// part of the lid, through three segments (22 °C, a 10-minute lid opening, 30 °C van, 26 °C doorstep with sun on the lid),
// until the product's surface rises through 8 °C.
const gel = packMaterial(D.packs.find((p) => p.name.startsWith("Gel"))!);
const chicken = D.products.find((p) => p.name.startsWith("Roast chicken"))!;
const chickenMat = foodThermal({ composition: chicken.composition, initialFreezing_C: chicken.initialFreezing_C });
const plastic = { thickness_m: 0.0015, k_W_mK: 0.2, rho_kg_m3: 950, c_J_kgK: 1900, insulation: false };
const foam = { thickness_m: 0.03, k_W_mK: 0.035, rho_kg_m3: 25, c_J_kgK: 1300, insulation: true };
const layers = [plastic, foam, plastic];
const inner = { L: 0.35, W: 0.25, H: 0.2 };
const packCover_m2 = 0.2 * 0.15;
const segs = [
  { start_s: 0, end_s: 2 * 3600, air_C: 22, outerH_W_m2K: 8, sun_W_m2: 0, openExchange_W_K: 0 },
  { start_s: 2 * 3600, end_s: 2 * 3600 + 600, air_C: 22, outerH_W_m2K: 8, sun_W_m2: 0, openExchange_W_K: 2.5 },
  { start_s: 2 * 3600 + 600, end_s: 10 * 3600, air_C: 30, outerH_W_m2K: 12, sun_W_m2: 0, openExchange_W_K: 0 },
  { start_s: 10 * 3600, end_s: 48 * 3600, air_C: 26, outerH_W_m2K: 10, sun_W_m2: 300, openExchange_W_K: 0 },
].map((g) => {
  const lid = g.air_C + (0.4 * g.sun_W_m2) / g.outerH_W_m2K;
  return { ...g, solAir_C: { base: g.air_C, sidesLower: g.air_C, sidesUpper: g.air_C, lid } };
});
const BOX_LIMIT_C = 8;
let assembled: unknown = null;
const boxRun = (targetChange_K: number, dtMax_s: number, keep = false) => {
  let prevT = 0;
  let prevS = 0;
  let hit: number | null = null;
  const spec: NetworkSpec = {
    faces: [
      { kind: "base", layers, area_m2: inner.L * inner.W, inner: { zone: 0, h_W_m2K: 4 } },
      { kind: "sidesLower", layers, area_m2: (inner.L + inner.W) * inner.H, inner: { zone: 0, h_W_m2K: 4 } },
      { kind: "sidesUpper", layers, area_m2: (inner.L + inner.W) * inner.H, inner: { zone: 0, h_W_m2K: 4 } },
      { kind: "lid", layers, area_m2: inner.L * inner.W - packCover_m2, inner: { zone: 0, h_W_m2K: 4 } },
      { kind: "lid", layers, area_m2: packCover_m2, inner: { body: 0, h_W_m2K: 50 } },
    ],
    zones: [{ volume_m3: inner.L * inner.W * inner.H * 0.6 }],
    edgeConductance_W_K: 0.12,
    edgeZoneShare: [1],
    openZoneShare: [1],
    bodies: [
      { label: "gel pack", material: gel, shapeM: 0, halfSize_m: 0.0125, volume_m3: 0.2 * 0.15 * 0.025, area_m2: 2 * 0.2 * 0.15, count: 1, nodes: 5, start_C: -18, zoneG_W_K: [4 * 0.2 * 0.15 * 0.3] },
      { label: "product", material: chickenMat, shapeM: 0, halfSize_m: 0.02, volume_m3: 0.3 * 0.2 * 0.04, area_m2: 2 * 0.3 * 0.2, count: 1, nodes: 9, start_C: 2, zoneG_W_K: [4 * 0.3 * 0.2 * 1.2] },
    ],
    contacts: [{ a: 0, b: 1, conductance_W_K: 50 * 0.2 * 0.15 }],
    boxStart_C: 22,
    ambient: (t) => {
      const g = segs.find((x) => t < x.end_s) ?? segs[segs.length - 1];
      return { air_C: g.air_C, solAir_C: g.solAir_C, outerH_W_m2K: g.outerH_W_m2K, openExchange_W_K: g.openExchange_W_K };
    },
    breakpoints_s: segs.map((g) => g.end_s),
    tEnd_s: segs[segs.length - 1].end_s,
    dtMax_s,
    targetChange_K,
    onAssembled: keep ? (a) => (assembled = a) : undefined,
    onStep: (t, st) => {
      const s = st.bodySurface_C[1];
      if (t > 0 && s >= BOX_LIMIT_C && prevS < BOX_LIMIT_C) {
        hit = prevT + ((BOX_LIMIT_C - prevS) / (s - prevS)) * (t - prevT);
        return true;
      }
      prevT = t;
      prevS = s;
    },
  };
  runNetwork(spec);
  return hit as number | null;
};
const boxSettings: [number, number][] = [[8, 3600], [4, 3600], [2, 3600], [1, 1800], [0.5, 900], [0.25, 600], [0.1, 300], [0.05, 120]];
for (let i = 0; i < 10; i++) for (const [k, m] of boxSettings) boxRun(k, m);
const b2 = boxRun(0.005, 4)!;
const b1 = boxRun(0.0025, 2, true)!;
const boxRef = (4 * b1 - b2) / 3;
const boxOurs: Run[] = boxSettings.map(([k, m]) => {
  const { ms, value } = cpuTime(() => boxRun(k, m), 7, 3);
  return { setting: `target ${k} K, ≤ ${m} s${k === 2 && m === 3600 ? " (planner default)" : ""}`, ms, value };
});
const boxFile = join(dir, "box.json");
writeFileSync(boxFile, JSON.stringify({ network: assembled, segments: segs, probeChain: 5 + 1, limit_C: BOX_LIMIT_C, rtols: [1e-2, 1e-3, 1e-4, 1e-5, 1e-6, 1e-7], repeats: 3 }));
const boxPeer = peer("box_peer.py", boxFile);
report("Box network (time for the product's surface to rise through 8 °C)", "s", boxOurs, boxOurs[2], boxRef, `Holdline with steps ≤ 2 s and ≤ 4 s, second-order Richardson; the finer alone differs by ${((Math.abs(b1 - boxRef) / boxRef) * 100).toFixed(4)} %`, boxPeer);
const boxDefaultErr = relErr(boxOurs[2].value, boxRef);
const ratios = {
  thaw: ratioAt(thawOurs, thawPeer, thawRef, thawDefaultErr),
  thaw01: ratioAt(thawOurs, thawPeer, thawRef, 1e-3),
  box: ratioAt(boxOurs, boxPeer, boxRef, boxDefaultErr),
  box01: ratioAt(boxOurs, boxPeer, boxRef, 1e-3),
};
console.log(`\npeer ratio thaw at 0.1 %: ${ratios.thaw01}`);
console.log(`peer ratio box at 0.1 %: ${ratios.box01}`);
console.log(`peer ratio thaw: ${ratios.thaw}`);
console.log(`peer ratio box: ${ratios.box}`);
rmSync(dir, { recursive: true, force: true });
