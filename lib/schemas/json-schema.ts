import { z } from "zod";
import { libraryFileSchema, settingsSchema, templateSchemas } from "./templates";
import { warmupInputSchema } from "./warmup";
import { holdInputSchema } from "./hold";
import { thawInputSchema } from "./thaw";
import { sizeInputSchema } from "./size";
import { coolInputSchema } from "./cool";
import { calibrateInputSchema } from "./calibrate";

/** Inputs whose JSON Schema `holdline schema <name>` and /api/v1/schema/<name> print. */
export const NAMED_SCHEMAS: Record<string, z.ZodType> = {
  product: templateSchemas.products,
  shipper: templateSchemas.shippers,
  pack: templateSchemas.packs,
  route: templateSchemas.routes,
  ruleset: templateSchemas.rulesets,
  material: templateSchemas.materials,
  settings: settingsSchema,
  library: libraryFileSchema,
  warmup: warmupInputSchema,
  hold: holdInputSchema,
  thaw: thawInputSchema,
  size: sizeInputSchema,
  cool: coolInputSchema,
  calibrate: calibrateInputSchema,
};

export function jsonSchemaOf(name: string): object | null {
  // Own names only: "constructor", "__proto__" or "toString" are not schemas.
  if (!Object.hasOwn(NAMED_SCHEMAS, name)) return null;
  const s = NAMED_SCHEMAS[name];
  return z.toJSONSchema(s, { io: "input", unrepresentable: "any" });
}
