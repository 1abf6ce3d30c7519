/**
 * The inputs the speed benchmarks share (npm run bench, scripts/bench-hot.ts): a 48-hour hold with the
 * uncertainty band and a 2,000-candidate sizing, both from the demo library.
 */
import { DEMO_SCENARIO as D } from "../lib/db/demo-scenario";
import { holdInputSchema } from "../lib/schemas/hold";
import { sizeInputSchema } from "../lib/schemas/size";

const find = <T extends { name: string }>(xs: T[], start: string) => xs.find((x) => x.name.startsWith(start))!;

/** A 48-hour route with 6 segments, one box, 4 pack lines and 3 product lines. */
export const route48 = {
  name: "bench: 48 h, 6 segments",
  notes: "",
  segments: [
    { label: "depot", duration_s: 4 * 3600, airTemp_C: 22, airSpeed_m_s: 0.5, sun_W_m2: 0, lidOpenings: 0, lidOpenDuration_s: 0 },
    { label: "sorting", duration_s: 10 * 3600, airTemp_C: 18, airSpeed_m_s: 0.3, sun_W_m2: 0, lidOpenings: 0, lidOpenDuration_s: 0 },
    { label: "trunk", duration_s: 12 * 3600, airTemp_C: 12, airSpeed_m_s: 2, sun_W_m2: 0, lidOpenings: 0, lidOpenDuration_s: 0 },
    { label: "van", duration_s: 8 * 3600, airTemp_C: 25, airSpeed_m_s: 0.5, sun_W_m2: 0, lidOpenings: 1, lidOpenDuration_s: 60 },
    { label: "store", duration_s: 10 * 3600, airTemp_C: 20, airSpeed_m_s: 0.2, sun_W_m2: 0, lidOpenings: 0, lidOpenDuration_s: 0 },
    { label: "doorstep", duration_s: 4 * 3600, airTemp_C: 28, airSpeed_m_s: 1, sun_W_m2: 400, lidOpenings: 0, lidOpenDuration_s: 0 },
  ],
};

export const holdInput = (band: boolean) =>
  holdInputSchema.parse({
    products: [
      { product: find(D.products, "Cod fillets"), count: 2, start_C: -20 },
      { product: find(D.products, "Vanilla ice"), count: 1, start_C: -22 },
      { product: find(D.products, "Roast chicken"), count: 1, start_C: -19 },
    ],
    shipper: find(D.shippers, "Quillfield thick"),
    materials: D.materials,
    packs: [
      { pack: find(D.packs, "Eutectic"), count: 4, conditioning_C: -30 },
      { pack: find(D.packs, "Water ice"), count: 2, conditioning_C: -25 },
      { pack: find(D.packs, "Gel"), count: 2, conditioning_C: -25 },
      { pack: find(D.packs, "Dry ice"), count: 2, conditioning_C: -78.5 },
    ],
    route: route48,
    ruleSet: D.rulesets[0],
    uncertainty: band ? { outerH_frac: 0.3, insulationK_frac: 0.1, conditioning_K: 2 } : { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 },
    extendFraction: 0,
  });

/** About 2,000 candidates: 5 box variants × 0–10 ice × 0–10 gel packs × 2 × 2 conditioning, less repeats. */
export const sizeInput = (prune: boolean) =>
  sizeInputSchema.parse({
    products: [
      { product: find(D.products, "Roast chicken"), count: 1, start_C: 2 },
      { product: find(D.products, "Steamed rice"), count: 1, start_C: 3 },
    ],
    route: find(D.routes, "Overnight"),
    ruleSet: D.rulesets[1],
    materials: D.materials,
    boxes: D.shippers.map((sh) => ({ shipper: sh, thicknessVariants_m: sh.name.includes("thin") ? [0.04, 0.06] : [] })),
    packs: [
      { pack: find(D.packs, "Water ice"), minCount: 0, maxCount: 10, conditioning_C: [-18, -25] },
      { pack: find(D.packs, "Gel"), minCount: 0, maxCount: 10, conditioning_C: [-18, -25] },
    ],
    margin: { kind: "percent", value: 20 },
    prune,
  });
