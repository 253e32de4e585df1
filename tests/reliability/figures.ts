/** Prints a figure in the test output, so a run shows what it measured and not only pass/fail. */
export function figure(label: string, value: string | number, unit = ''): void {
  console.log(`[figure] ${label}: ${value}${unit ? ` ${unit}` : ''}`);
}

/** The p-th percentile (0–100) of a list of numbers, nearest rank. */
export function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

/** Runs `request` and returns its status with the time it took, ms. */
export async function timed(request: () => Promise<Response>): Promise<{ status: number; ms: number; response: Response }> {
  const t0 = performance.now();
  const response = await request();
  return { status: response.status, ms: performance.now() - t0, response };
}
