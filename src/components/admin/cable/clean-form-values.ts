/**
 * Form values as the schema expects them: an empty number input reads as NaN and an empty
 * text as '', and both mean "not given" for an optional field, so they are dropped.
 */
export function cleanFormValues(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(cleanFormValues);
  if (value && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) {
      if (v === '' || v === undefined || (typeof v === 'number' && Number.isNaN(v))) continue;
      out[k] = cleanFormValues(v);
    }
    return out;
  }
  return value;
}
