/** How Sheathwise prints a quantity in summaries and records: 3 significant figures below 100, whole numbers above (negative values alike). */
export function formatQuantity(value: number, unit = ''): string {
  const size = Math.abs(value);
  // Below a nanounit a value is the solver's rounding noise, not a result.
  const text = !Number.isFinite(value) ? String(value) : size >= 100 ? value.toFixed(0) : size >= 1 ? value.toFixed(2) : size < 1e-9 ? '0' : value.toPrecision(3);
  return unit ? `${text} ${unit}` : text;
}

/** An input as typed, to at most four significant figures and without trailing zeros (520, 0.105, 1.234e+6 stays 1234000). */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (Number.isInteger(value) && Math.abs(value) < 1e15) return String(value);
  return String(Number(value.toPrecision(4)));
}

/** A margin as a whole per cent. */
export const formatMarginPct = (pct: number): string => `${Math.round(pct)} %`;

/** A cross-check difference: below a millionth of a per cent the two agree to the solver's precision. */
export const formatDifferencePct = (pct: number): string => (Math.abs(pct) < 1e-6 ? 'agrees' : `${Number(pct.toPrecision(2))} %`);

/** A date as ISO yyyy-mm-dd. */
export const formatIsoDate = (d: Date | string | null | undefined): string => (d ? new Date(d).toISOString().slice(0, 10) : '—');

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** A typed yyyy-mm-dd that is a real calendar date (2026-02-30 is not), or null. */
export function isoDateOrNull(text: string): string | null {
  if (!ISO_DATE.test(text)) return null;
  const d = new Date(`${text}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === text ? text : null;
}
