import { createHash } from 'node:crypto';

/**
 * JSON with object keys sorted at every level, so that equal values give equal text whatever
 * the key order (PostgreSQL's jsonb reorders keys).
 */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v) =>
    v && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.keys(v).sort().map((k) => [k, (v as Record<string, unknown>)[k]]))
      : v,
  );
}

export const sha256Hex = (data: string | Uint8Array): string => createHash('sha256').update(data).digest('hex');

/** The hash that ties results to the inputs they were computed from. */
export const inputsHash = (inputs: unknown): string => sha256Hex(canonicalJson(inputs));
