/**
 * The calibration example of the demo library: the lunch run's hold plan, by template names, that the
 * invented logger file public/examples/logger-trip.csv belongs to (scripts/make-calibrate-example.ts writes
 * both). The calibration page starts from it when no saved plan is chosen.
 */
export const EXAMPLE_LOG_NAME = "logger-trip.csv";

export const EXAMPLE_PLAN = {
  products: [{ product: "Roast chicken thighs, half tray", count: 1, start_C: 1 }],
  shipper: "Quillfield thin foam cooler",
  packs: [{ pack: "Gel pack, 600 g", count: 2, conditioning_C: -18 }],
  route: "Summer lunch run, Harbour Street",
  ruleSet: "England, Wales and Northern Ireland",
  boxStart_C: 8,
  extendFraction: 1,
};
