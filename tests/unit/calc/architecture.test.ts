import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

// The calculation core stays framework-free (style guide, principle 2): it may import its own
// modules, and only types (erased at build time) from the shared input schemas.

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = path.join(dir, f);
    return statSync(p).isDirectory() ? sources(p) : p.endsWith('.ts') ? [p] : [];
  });
}

describe('src/lib/calc boundary', () => {
  const files = sources('src/lib/calc');

  it('has modules to check', () => expect(files.length).toBeGreaterThan(10));

  for (const file of files) {
    it(`${file} imports only the core itself, or types`, () => {
      const text = readFileSync(file, 'utf8');
      const imports = [...text.matchAll(/^\s*(import|export)\s+(type\s+)?[^'"]*from\s+'([^']+)'/gm)];
      for (const [, , typeOnly, spec] of imports) {
        const target = path.resolve(path.dirname(file), spec);
        const insideCore = spec.startsWith('.') && target.startsWith(path.resolve('src/lib/calc'));
        expect(insideCore || (typeOnly && spec.includes('/schemas/')), `${file} imports ${spec}`).toBe(true);
      }
    });
  }
});
