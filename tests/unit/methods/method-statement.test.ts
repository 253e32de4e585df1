import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { ENGINE_VERSION } from '../../../src/lib/calc/constants';
import { checkValueIdsIn, checkValueSections, methodSections } from '../../../src/lib/methods/method-statement';
import { CRITERION_SECTION, criterionSection, methodCitation, sectionHref } from '../../../src/lib/methods/method-reference';
import { renderMethodStatement } from '../../../src/lib/methods/render-statement';
import { committedValidationProblems, engineVersionIn } from '../../../scripts/validation-files';

// docs/methods.md against the tests that cite it, the links into it, and the committed
// validation of the engine version in the code.

const statement = readFileSync('docs/methods.md', 'utf8');
const defined = checkValueSections(statement);

/** Test sources that may cite check values: everything under tests/ except fixtures and this folder's own invented ids. */
function testSources(dir = 'tests'): string[] {
  return readdirSync(dir).flatMap((name) => {
    const file = path.join(dir, name);
    if (statSync(file).isDirectory()) return file === path.join('tests', 'fixtures') || file === path.join('tests', 'unit', 'methods') ? [] : testSources(file);
    return file.endsWith('.ts') ? [file] : [];
  });
}

describe('docs/methods.md and the tests', () => {
  const used = new Map<string, string[]>();
  for (const file of testSources()) for (const id of checkValueIdsIn(readFileSync(file, 'utf8'))) used.set(id, [...(used.get(id) ?? []), file]);

  it('defines every check-value id the tests use', () => {
    const missing = [...used.entries()].filter(([id]) => !defined.has(id)).map(([id, files]) => `${id} (${files.join(', ')})`);
    expect(missing, 'ids used in tests but not defined in docs/methods.md').toEqual([]);
  });

  it('has every check value it defines used by a test', () => {
    const unused = [...defined.keys()].filter((id) => !used.has(id));
    expect(unused, 'ids defined in docs/methods.md that no test uses').toEqual([]);
    expect(defined.size).toBeGreaterThanOrEqual(28);
  });

  it('has a numbered section for every place the app and the record link to', () => {
    const numbers = new Set(methodSections(statement).map((s) => s.number));
    for (const section of new Set(Object.values(CRITERION_SECTION))) expect(numbers.has(section), `section ${section}`).toBe(true);
    expect(numbers.has('7')).toBe(true); // the results tab's cross-check link
    expect(criterionSection('standing-voltage-normal:N1')).toBe('2.3');
    expect(criterionSection('svl-tov:F1:0')).toBe('4.4');
    expect(criterionSection('manual:drawings')).toBeUndefined();
    expect(sectionHref('4.3')).toBe('/methods#section-4-3');
    expect(methodCitation('4.3', '2.0.0')).toBe('Sheathwise method statement, engine 2.x, section 4.3');
  });
});

describe('the method page rendering', () => {
  const html = renderMethodStatement(statement);

  it('gives every numbered section an anchor and every check value a target', () => {
    for (const s of methodSections(statement)) expect(html).toContain(`<h${s.depth} id="${s.anchor}">`);
    for (const id of defined.keys()) expect(html).toContain(`<td id="check-${id}">${id}</td>`);
  });

  it('renders tables and formulas, leaving no Markdown syntax behind', () => {
    expect(html).toContain('<code>De = 658.5·√(ρ/f)</code>');
    expect(html).toContain('<td>derived: E = |Z_m|·L·I</td>');
    expect(html).not.toMatch(/^\|/m);
    expect(html).not.toContain('](');
  });
});

describe('the committed validation', () => {
  it('reads the engine version the build reads', () => expect(engineVersionIn(process.cwd())).toBe(ENGINE_VERSION));

  it(`stands for engine ${ENGINE_VERSION}: run npm run validation after changing the engine version`, () => {
    expect(committedValidationProblems(process.cwd())).toEqual([]);
  });

  it('does not stand for another engine version', () => {
    expect(committedValidationProblems(process.cwd(), '99.0.0')).toEqual(['no validation report for engine 99.0.0: run `npm run validation` and commit docs/validation/engine-99.0.0.json']);
  });
});
