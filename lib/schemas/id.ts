/**
 * Row ids in URLs and requests: a positive whole number written plainly ("12"), at most 2^31 − 1 (the
 * largest SQLite/Prisma `Int` the app stores). Anything else ("1.5", "0x1", " 1", "01", 30 digits) is no
 * id at all, so the caller answers 404 rather than reaching some other row or failing in the database.
 */
export const MAX_ID = 2 ** 31 - 1;

const ID_TEXT = /^[1-9][0-9]{0,9}$/;

export function parseId(raw: unknown): number | null {
  if (typeof raw === "number") return Number.isInteger(raw) && raw >= 1 && raw <= MAX_ID ? raw : null;
  if (typeof raw !== "string" || !ID_TEXT.test(raw)) return null;
  const n = Number(raw);
  return n <= MAX_ID ? n : null;
}
