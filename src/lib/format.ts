/** How Sheathwise prints a quantity in summaries and records: 3 significant figures below 100, whole numbers above. */
export function formatQuantity(value: number, unit = ''): string {
  // Below a nanounit a value is the solver's rounding noise, not a result.
  const text = value >= 100 ? value.toFixed(0) : value >= 1 ? value.toFixed(2) : Math.abs(value) < 1e-9 ? '0' : value.toPrecision(3);
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
