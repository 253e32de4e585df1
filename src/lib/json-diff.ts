export interface JsonChange {
  path: string;
  before: unknown;
  after: unknown;
}

/** Leaf-level differences between two JSON values, at most `limit` of them (audit detail). */
export function jsonDiff(before: unknown, after: unknown, limit = 50): JsonChange[] {
  const changes: JsonChange[] = [];
  const walk = (a: unknown, b: unknown, path: string) => {
    if (changes.length >= limit) return;
    const bothObjects = a && b && typeof a === 'object' && typeof b === 'object' && Array.isArray(a) === Array.isArray(b);
    if (bothObjects) {
      const keys = new Set([...Object.keys(a as object), ...Object.keys(b as object)]);
      for (const k of keys) walk((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], path ? `${path}.${k}` : k);
    } else if (JSON.stringify(a) !== JSON.stringify(b)) {
      changes.push({ path: path || '(root)', before: a ?? null, after: b ?? null });
    }
  };
  walk(before, after, '');
  return changes;
}
