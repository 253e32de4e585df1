import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

const calc = (...args: string[]) => spawnSync('node_modules/.bin/tsx', ['scripts/calc.ts', ...args], { encoding: 'utf8' });

describe('npm run calc', () => {
  it('prints a readable summary with worst values, verdicts and the caution', () => {
    const run = calc('tests/fixtures/studies/fernhollow-cross-bonded.json');
    expect(run.status).toBe(0);
    expect(run.stdout).toContain('Worst values:');
    expect(run.stdout).toMatch(/\[PASS\s*\] Standing voltage at link boxes/);
    expect(run.stdout).toContain('do not replace');
  });

  it('exits 3 when a checklist item fails', () => {
    const run = calc('tests/fixtures/studies/kestrel-single-point-ecc.json');
    expect(run.status).toBe(3);
    expect(run.stdout).toContain('[FAIL');
  });

  it('--json gives the full results and checklist', () => {
    const run = calc('tests/fixtures/studies/marrow-lane-fence-exposure.json', '--json');
    const out = JSON.parse(run.stdout);
    expect(out.results.kind).toBe('exposure');
    expect(out.checklist.length).toBeGreaterThan(0);
  });

  it('--schema prints the JSON Schema of the input', () => {
    const schema = JSON.parse(calc('--schema').stdout);
    const kinds = JSON.stringify(schema);
    expect(kinds).toContain('"bonding"');
    expect(kinds).toContain('"exposure"');
    expect(kinds).toContain('sheathMeanDiameterMm');
  });

  it('names the field to fix for bad input and exits 1', () => {
    const study = JSON.parse(readFileSync('tests/fixtures/studies/fernhollow-cross-bonded.json', 'utf8'));
    study.sections[1].lengthM = 0;
    const file = path.join(mkdtempSync(path.join(tmpdir(), 'calc-')), 'bad.json');
    writeFileSync(file, JSON.stringify(study));
    const run = calc(file);
    expect(run.status).toBe(1);
    expect(run.stderr).toContain('sections.1.lengthM: Section length must be greater than zero.');
  });
});

describe('npm run calc: input it cannot read gives one line and exit 1', () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'calc-bad-'));
  const oneLine = (run: ReturnType<typeof calc>) => {
    expect(run.status).toBe(1);
    const lines = run.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(run.stderr).not.toMatch(/\n\s+at /);
    return lines[0];
  };

  it('a missing file', () => {
    expect(oneLine(calc(path.join(dir, 'nowhere.json')))).toMatch(/^Cannot read the study .*nowhere\.json: no such file\.$/);
  });

  it('unreadable JSON', () => {
    const file = path.join(dir, 'broken.json');
    writeFileSync(file, '{ "kind": "bonding", ');
    expect(oneLine(calc(file))).toMatch(/^The study .*broken\.json is not valid JSON: /);
  });

  it('a malformed --limits file, a missing one, and --limits with nothing after it', () => {
    const limits = path.join(dir, 'limits.json');
    writeFileSync(limits, JSON.stringify({ name: 'x', version: 'one', limits: {} }));
    expect(oneLine(calc('tests/fixtures/studies/fernhollow-cross-bonded.json', '--limits', limits))).toMatch(/^The limit set .*limits\.json is not a limit set: version: /);
    expect(oneLine(calc('tests/fixtures/studies/fernhollow-cross-bonded.json', '--limits', path.join(dir, 'none.json')))).toContain('no such file');
    expect(oneLine(calc('tests/fixtures/studies/fernhollow-cross-bonded.json', '--limits'))).toBe('--limits needs a limit-set file after it.');
  });
});
