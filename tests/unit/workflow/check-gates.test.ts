import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { calculateStudy, evaluateCompliance, type Study } from '../../../src/lib/calc';
import { studySchema } from '../../../src/lib/schemas/study.schema';
import { limitSetSchema } from '../../../src/lib/schemas/limit-set.schema';
import { checklistRows } from '../../../src/lib/studies/checklist-rows';
import { manualItemSubject } from '../../../src/lib/workflow/manual-item-subjects';
import { resultsHash, signOffStanding } from '../../../src/lib/workflow/sign-off';
import type { ChecklistRow } from '../../../src/lib/db/schema';

// The demo studies (invented, for the demo only) and the demo limit set's manual questions.
const study = (name: string): Study => studySchema.parse(JSON.parse(readFileSync(`tests/fixtures/studies/${name}.json`, 'utf8'))) as Study;
const limits = limitSetSchema.parse(JSON.parse(readFileSync('tests/fixtures/limit-sets/demo-owner.json', 'utf8')));
const manual = [
  { key: 'ecc-transposed', text: 'ECC transposed at mid-point.', basis: 'common practice' },
  { key: 'svl-datasheet', text: 'SVL data sheet attached.', basis: 'common practice' },
  { key: 'continuity-test', text: 'Cross-bonding continuity test specified.', basis: 'common practice' },
  { key: 'owner-specific', text: 'A question no rule knows.', basis: 'common practice' },
];
const rowsFor = (s: Study, existing: ChecklistRow[] = []) => checklistRows('r', evaluateCompliance(s, calculateStudy(s), limits), manual, existing, s).map((r, i) => ({ ...r, id: `x${i}` }) as ChecklistRow);

describe('manual questions whose subject the study lacks', () => {
  it('the ECC question does not apply to a cross-bonded route, and does apply to a single-point section', () => {
    expect(manualItemSubject('ecc-transposed', study('fernhollow-cross-bonded'))).toEqual({ what: 'a single-point bonded section', exists: false });
    expect(manualItemSubject('manual:ecc-transposed', study('kestrel-single-point-ecc'))?.exists).toBe(true);
    expect(manualItemSubject('continuity-test', study('kestrel-single-point-ecc'))?.exists).toBe(false);
    expect(manualItemSubject('svl-datasheet', study('marrow-lane-fence-exposure'))?.exists).toBe(false);
    expect(manualItemSubject('owner-specific', study('fernhollow-cross-bonded'))).toBeNull();
  });

  it('the study answers "not applicable" with a generated reason; other questions stay open', () => {
    const rows = rowsFor(study('fernhollow-cross-bonded'));
    const ecc = rows.find((r) => r.itemKey === 'manual:ecc-transposed')!;
    expect(ecc).toMatchObject({ answer: 'not-applicable', answerGenerated: true, answeredBy: null, status: 'answered' });
    expect(ecc.answerReason).toBe('Not applicable, set by the study: the study has no single-point bonded section.');
    expect(rows.find((r) => r.itemKey === 'manual:continuity-test')).toMatchObject({ answer: null, status: 'open', answerGenerated: false });
    expect(rows.find((r) => r.itemKey === 'manual:owner-specific')).toMatchObject({ answer: null, status: 'open' });
  });

  it('a "not applicable" answer is dropped once the subject exists, and a generated one once it appears', () => {
    const kestrel = study('kestrel-single-point-ecc');
    const earlier = rowsFor(study('fernhollow-cross-bonded')).map((r) => (r.itemKey === 'manual:svl-datasheet' ? { ...r, answer: 'not-applicable', answerReason: 'none', status: 'answered', answeredBy: 'u' } : r));
    const rows = rowsFor(kestrel, earlier);
    expect(rows.find((r) => r.itemKey === 'manual:svl-datasheet')).toMatchObject({ answer: null, status: 'open' });
    expect(rows.find((r) => r.itemKey === 'manual:ecc-transposed')).toMatchObject({ answer: null, status: 'open', answerGenerated: false });
    // Now cross-bonding is absent: the study answers the continuity question itself.
    expect(rows.find((r) => r.itemKey === 'manual:continuity-test')).toMatchObject({ answer: 'not-applicable', answerGenerated: true });
  });

  it('the designer\'s justification stays on an item that still fails with the same value, and a query stays on its item', () => {
    const kestrel = study('kestrel-single-point-ecc');
    const first = rowsFor(kestrel);
    const failing = first.find((r) => r.status === 'fail');
    expect(failing, 'the demo single-point study fails the demo standing-voltage limit').toBeDefined();
    const justified = first.map((r) => (r.itemKey === failing!.itemKey ? { ...r, designerJustification: 'Accepted by the owner in writing.', designerJustifiedBy: 'u', checkerVerdict: 'query' } : r));
    const again = rowsFor(kestrel, justified).find((r) => r.itemKey === failing!.itemKey)!;
    expect(again).toMatchObject({ designerJustification: 'Accepted by the owner in writing.', checkerVerdict: 'query' });
    const moved = rowsFor(kestrel, justified.map((r) => (r.itemKey === failing!.itemKey ? { ...r, value: (r.value ?? 0) + 1 } : r))).find((r) => r.itemKey === failing!.itemKey)!;
    expect(moved.designerJustification).toBeNull();
  });
});

describe('a sign-off stands while the inputs and results are the ones it signed', () => {
  const results = { cases: [{ id: 'LOAD', worstV: 12.5 }] };
  const signed = { inputsHash: 'a'.repeat(64), resultsHash: resultsHash(results) };

  it('hashes results by their canonical JSON, whatever the key order', () => {
    expect(resultsHash({ b: 1, a: [{ d: 2, c: 3 }] })).toBe(resultsHash({ a: [{ c: 3, d: 2 }], b: 1 }));
    expect(resultsHash({ a: 1 })).not.toBe(resultsHash({ a: 1.0001 }));
    expect(resultsHash(null)).toBeNull();
  });

  it('is valid on the same inputs and results, and void (saying why) after either changes', () => {
    expect(signOffStanding(signed, { inputsHash: 'a'.repeat(64), resultsHash: resultsHash({ cases: [{ worstV: 12.5, id: 'LOAD' }] }) })).toEqual({ valid: true, voidReason: null });
    expect(signOffStanding(signed, { inputsHash: 'b'.repeat(64), resultsHash: resultsHash(results) })).toEqual({ valid: false, voidReason: 'Void: the inputs changed after this signature.' });
    expect(signOffStanding(signed, { inputsHash: 'a'.repeat(64), resultsHash: resultsHash({ cases: [{ id: 'LOAD', worstV: 13 }] }) })).toEqual({ valid: false, voidReason: 'Void: the results changed after this signature.' });
    expect(signOffStanding(signed, { inputsHash: 'b'.repeat(64), resultsHash: resultsHash(null) }).voidReason).toBe('Void: the inputs and the results changed after this signature.');
    expect(signOffStanding({ inputsHash: null, resultsHash: null }, { inputsHash: 'a'.repeat(64), resultsHash: resultsHash(results) }).valid).toBe(false);
  });
});
