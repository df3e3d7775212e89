/**
 * Text safety at the API's edge, in one place. A NUL character or a lone surrogate (half of a UTF-16
 * pair, which no UTF-8 text can hold) is refused in every string of every request, with the field
 * named, before anything is stored, printed or e-mailed. Row versions are bounded like the database's
 * integer column, so that a huge one is a field error rather than a database failure.
 */
import { z } from 'zod';

/** Half of a UTF-16 surrogate pair with no other half (add the `g` flag to replace them all). */
export const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

/** Why `text` cannot be kept, or null when it can. */
export function unsafeTextReason(text: string): string | null {
  if (text.includes('\u0000')) return 'Contains a NUL character (U+0000); remove it';
  if (LONE_SURROGATE.test(text))
    return 'Contains a broken character (half of a surrogate pair); retype or paste it again';
  return null;
}

/** The refinement for one text field: `z.string().superRefine(safeText)`. */
export function safeText(text: string, ctx: z.RefinementCtx): void {
  const reason = unsafeTextReason(text);
  if (reason) ctx.addIssue({ code: 'custom', message: reason });
}

const MAX_DEPTH = 64;

function walk(value: unknown, path: PropertyKey[], ctx: z.RefinementCtx, depth: number): void {
  if (typeof value === 'string') {
    const reason = unsafeTextReason(value);
    if (reason) ctx.addIssue({ code: 'custom', message: reason, path });
    return;
  }
  if (value === null || typeof value !== 'object' || depth > MAX_DEPTH) return;
  if (Array.isArray(value)) {
    value.forEach((v, i) => walk(v, [...path, i], ctx, depth + 1));
    return;
  }
  for (const [key, v] of Object.entries(value)) {
    const reason = unsafeTextReason(key);
    if (reason) ctx.addIssue({ code: 'custom', message: `Field name: ${reason}`, path: [...path, key] });
    walk(v, [...path, key], ctx, depth + 1);
  }
}

/** Every string (and field name) anywhere in a request's body or query, checked with `safeText`. */
export const safeRequestTextSchema = z.unknown().superRefine((value, ctx) => walk(value, [], ctx, 0));

/** The largest row version: the database keeps versions as 32-bit integers. */
export const ROW_VERSION_MAX = 2_147_483_647;

/** A row version sent back with a change (optimistic concurrency). */
export const rowVersionSchema = (required: string, min = 1) =>
  z.int({ error: required }).min(min).max(ROW_VERSION_MAX, 'This version was never given out; reload and try again');
