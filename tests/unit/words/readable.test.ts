import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { formatDifferencePct, formatMarginPct, formatNumber, formatQuantity, isoDateOrNull } from '../../../src/lib/format';
import { itemKeyLabel } from '../../../src/lib/compare/labels';
import { describeInputChanges } from '../../../src/lib/compare/input-changes';
import { eventSentence, pathChange } from '../../../src/lib/records/event-sentences';
import { jsonDiff } from '../../../src/lib/json-diff';

const fixture = () => JSON.parse(readFileSync('tests/fixtures/studies/fernhollow-cross-bonded.json', 'utf8'));

describe('numbers to a sensible precision', () => {
  it('prints quantities to three or four significant figures, negative ones alike', () => {
    expect(formatQuantity(1234.56, 'V')).toBe('1235 V');
    expect(formatQuantity(-1234.56, 'V')).toBe('-1235 V');
    expect(formatQuantity(-12.3456)).toBe('-12.35');
    expect(formatQuantity(0.0123456)).toBe('0.0123');
    expect(formatQuantity(-0.0123456)).toBe('-0.0123');
    expect(formatQuantity(3e-12)).toBe('0');
    expect(formatNumber(0.10500001)).toBe('0.105');
  });

  it('prints margins as whole per cent and near-zero cross-check differences as "agrees"', () => {
    expect(formatMarginPct(12.6)).toBe('13 %');
    expect(formatMarginPct(-4.4)).toBe('-4 %');
    expect(formatDifferencePct(5e-7)).toBe('agrees');
    expect(formatDifferencePct(-2e-6)).not.toBe('agrees');
    expect(formatDifferencePct(1.234)).toBe('1.2 %');
  });

  it('accepts only real calendar dates typed as yyyy-mm-dd', () => {
    expect(isoDateOrNull('2026-02-28')).toBe('2026-02-28');
    expect(isoDateOrNull('2026-02-30')).toBeNull();
    expect(isoDateOrNull('28/02/2026')).toBeNull();
    expect(isoDateOrNull('2026-2-8')).toBeNull();
  });
});

describe('keys in words', () => {
  it('names a computed item by its criterion and case, and counts SVLs from 1', () => {
    expect(itemKeyLabel('joint-voltage-fault:F3')).toBe('Voltage across a joint during a fault, case F3');
    expect(itemKeyLabel('svl-tov:F3:0')).toMatch(/, case F3, SVL 1$/);
    expect(itemKeyLabel('svl-continuous:LOAD:2')).toMatch(/SVL 3$/);
    expect(itemKeyLabel('manual:ecc-transposition')).toBe('Ecc transposition');
    expect(itemKeyLabel('joint-voltage-fault:F3')).not.toContain('joint-voltage-fault');
  });

  it('tells a workflow step as a sentence with the study code and revision number', () => {
    expect(eventSentence({ type: 'revision.startCheck', actorName: 'Bram Lindqvist', studyCode: 'B10', revisionNumber: 1 })).toBe('Bram Lindqvist took revision 1 of B10 for checking.');
    expect(eventSentence({ type: 'checklist.agreed-remaining', actorName: 'Bram Lindqvist', studyCode: 'B10', revisionNumber: 1, detail: { count: 12, itemKeys: [] } })).toBe('Bram Lindqvist agreed with every remaining checklist item of revision 1 of B10: 12 items');
    expect(eventSentence({ type: 'check-value.changed', actorName: 'Bram Lindqvist', revisionNumber: 1, detail: { itemKey: 'svl-tov:F3:0', from: { checkerValue: 101.23456 }, to: { checkerValue: 99 } } })).toMatch(/changed a check value on revision 1: .*case F3, SVL 1: 101\.2 → 99$/);
    // A type without a sentence of its own still reads as words, never as its dotted key.
    expect(eventSentence({ type: 'widget.re-sized', actorName: 'Ada', revisionNumber: 2 })).not.toContain('widget.');
  });
});

describe('input changes in the audit trail', () => {
  it('tells a whole added cable type as a sentence, not as JSON', () => {
    const a = fixture();
    const b = fixture();
    b.cableTypes.push({ ...a.cableTypes[0], id: 'XLPE-NEW', name: 'New cable' });
    const sentences = describeInputChanges(a, b);
    const changes = jsonDiff(a, b);
    const text = eventSentence({ type: 'revision.inputs-changed', actorName: 'Ada Designer', revisionNumber: 2, studyCode: 'B10', detail: { changes, sentences } });
    expect(text).toContain('cable type XLPE-NEW added');
    expect(text).not.toContain('{');
  });

  it('keeps older events (path, before, after only) readable without printing JSON', () => {
    const a = fixture();
    const b = fixture();
    b.cableTypes.push({ ...a.cableTypes[0], id: 'XLPE-NEW' });
    b.sections[1].lengthM = 520.123456;
    const text = eventSentence({ type: 'revision.inputs-changed', actorName: 'Ada Designer', detail: { changes: jsonDiff(a, b) } });
    expect(text).toContain('sections.1.lengthM 498 → 520.1');
    expect(text).toContain(`cableTypes.${a.cableTypes.length} added`);
    expect(text).not.toMatch(/[{}]/);
    expect(pathChange('cableTypes.0', { id: 'x' }, null)).toBe('cableTypes.0 removed');
    expect(pathChange('earthing', { a: 1 }, { a: 2 })).toBe('earthing changed');
  });
});
