/** How Sheathwise prints a quantity in summaries and records: 3 significant figures below 100, whole numbers above. */
export function formatQuantity(value: number, unit = ''): string {
  // Below a nanounit a value is the solver's rounding noise, not a result.
  const text = value >= 100 ? value.toFixed(0) : value >= 1 ? value.toFixed(2) : Math.abs(value) < 1e-9 ? '0' : value.toPrecision(3);
  return unit ? `${text} ${unit}` : text;
}
