// Text that PostgreSQL and every reader can keep: the shared zod helper for every text field, and the
// walk that checks a whole request body. Source: Unicode 15 §3.9 (a lone surrogate is not a scalar value).
import { z } from "zod";

/** NUL (U+0000): PostgreSQL's text and jsonb cannot hold it. */
const NUL = /\u0000/;
/** A high surrogate not followed by a low one, or a low surrogate not preceded by a high one. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Why the text cannot be kept, or null when it can. */
export function unsafeTextProblem(value: string): string | null {
  if (NUL.test(value)) return "must not contain a NUL character (U+0000)";
  if (LONE_SURROGATE.test(value)) return "must not contain a broken character (a lone UTF-16 surrogate)";
  return null;
}

/**
 * The text field of every schema: z.string() that refuses NUL and lone surrogates with a message
 * naming the problem (zod adds the field's path). Chain .min/.max/.trim as with z.string().
 */
export function safeText(params?: Parameters<typeof z.string>[0]) {
  return z.string(params).superRefine((value, ctx) => {
    const problem = unsafeTextProblem(value);
    if (problem) ctx.addIssue({ code: "custom", message: `This text ${problem}`, input: value });
  });
}

export type TextProblem = { path: string; message: string };

/**
 * Every string (and object key) in a parsed JSON value that cannot be kept, with its path. parseWith
 * runs this before any schema, so a field a schema forgot is still refused with a 400 naming it.
 */
export function findUnsafeText(value: unknown, path: string[] = [], found: TextProblem[] = [], depth = 0): TextProblem[] {
  if (found.length >= 20 || depth > 64) return found;
  const where = () => path.join(".") || "(body)";
  if (typeof value === "string") {
    const problem = unsafeTextProblem(value);
    if (problem) found.push({ path: where(), message: `This text ${problem}` });
  } else if (Array.isArray(value)) {
    value.forEach((item, i) => findUnsafeText(item, [...path, String(i)], found, depth + 1));
  } else if (value !== null && typeof value === "object") {
    for (const [key, item] of Object.entries(value)) {
      const keyProblem = unsafeTextProblem(key);
      if (keyProblem) found.push({ path: where(), message: `A field name ${keyProblem}` });
      else findUnsafeText(item, [...path, key], found, depth + 1);
    }
  }
  return found;
}
