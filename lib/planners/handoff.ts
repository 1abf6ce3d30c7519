/**
 * Carries a planner input from one page to another in the address, without saving anything: the sizer
 * opens a candidate in the hold planner (`/hold?from=…`) or on its pack-out sheet (`/size/sheet?from=…`).
 * The input is JSON, deflated (raw DEFLATE, RFC 1951) and written in base64url (RFC 4648 §5), so a
 * candidate with its templates spelled out stays a few kilobytes. Pure: the Web streams used here exist in
 * browsers and in Node alike. The receiving page checks what it decodes with its planner's zod schema.
 */

/** The longest `from` accepted (characters) and the most JSON it may inflate to (bytes). */
export const MAX_HANDOFF_CHARS = 12_000;
export const MAX_HANDOFF_JSON_BYTES = 256_000;

function toBase64Url(bytes: Uint8Array): string {
  let bin = "";
  for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(bin).replace(/\+/g, "-").replace(/\//g, "_").replace(/=+$/, "");
}

function fromBase64Url(s: string): Uint8Array | null {
  if (!/^[A-Za-z0-9_-]*$/.test(s)) return null;
  const b64 = s.replace(/-/g, "+").replace(/_/g, "/") + "===".slice((s.length + 3) % 4);
  try {
    const bin = atob(b64);
    const out = new Uint8Array(bin.length);
    for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
    return out;
  } catch {
    return null;
  }
}

async function collect(stream: ReadableStream<Uint8Array>, maxBytes: number): Promise<Uint8Array | null> {
  const reader = stream.getReader();
  const parts: Uint8Array[] = [];
  let n = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    n += value.length;
    if (n > maxBytes) {
      await reader.cancel().catch(() => {});
      return null;
    }
    parts.push(value);
  }
  const out = new Uint8Array(n);
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

/** Any JSON value → the text of a `from` parameter. */
export async function encodeHandoff(value: unknown): Promise<string> {
  const json = new TextEncoder().encode(JSON.stringify(value));
  const packed = await collect(new Blob([json]).stream().pipeThrough(new CompressionStream("deflate-raw")), Number.MAX_SAFE_INTEGER);
  return toBase64Url(packed!);
}

/**
 * The text of a `from` parameter → the value, or null for anything that is not one (too long, not
 * base64url, not DEFLATE, inflating past the limit, not JSON). Never throws.
 */
export async function decodeHandoff(text: unknown): Promise<unknown> {
  if (typeof text !== "string" || text.length === 0 || text.length > MAX_HANDOFF_CHARS) return null;
  const bytes = fromBase64Url(text);
  if (!bytes) return null;
  try {
    const json = await collect(new Blob([bytes as BlobPart]).stream().pipeThrough(new DecompressionStream("deflate-raw")), MAX_HANDOFF_JSON_BYTES);
    if (!json) return null;
    return JSON.parse(new TextDecoder("utf-8", { fatal: true }).decode(json));
  } catch {
    return null;
  }
}
