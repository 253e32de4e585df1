import { describe, expect, it } from 'vitest';
import { Document, Packer } from 'docx';
import demoLimits from '../../fixtures/limit-sets/demo-owner.json';
import type { LimitSet } from '../../../src/lib/schemas/limit-set.schema';
import { explorationBlocks, sweepFigureSvg } from '../../../src/lib/records/record-explorations';
import { runExploration, type SweepResult } from '../../../src/lib/explore/run-exploration';
import { referenceStudy, sections } from '../../helpers/reference-study';
import { hasCell, readDocx } from '../../helpers/docx-text';

const limits = demoLimits as LimitSet;

describe('design exploration section of the record', () => {
  it('prints the chosen option with its reason, the appraisal table, the sweep figure and table', async () => {
    const study = referenceStudy({ sections: sections(500, 500, 500), bonding: [{ kind: 'cross-bonded', sectionIds: ['S1', 'S2', 'S3'] }] });
    const appraisal = await runExploration({ kind: 'appraisal', study, limits });
    const sweep = (await runExploration({ kind: 'sweep', study: referenceStudy(), limits, axes: [{ input: { kind: 'load-current' }, fromValue: 500, toValue: 3000, points: 6 }] })) as SweepResult;
    const saved = (kind: string, result: unknown) => ({ id: kind, kind, params: {}, inputsHash: 'a'.repeat(64), engineVersion: '2.0.0', savedAt: new Date('2026-03-01'), savedBy: 'Test Designer (invented)', result });
    const blocks = explorationBlocks({
      choice: { optionKey: 'cross-bonded', reason: 'Lowest losses (test).', chosenBy: 'Test Designer (invented)', chosenAt: new Date('2026-03-02') },
      saved: [saved('appraisal', appraisal), saved('sweep', sweep)],
    });
    const doc = readDocx(await Packer.toBuffer(new Document({ sections: [{ children: blocks }] })));
    expect(doc.bodyText).toContain('Bonding arrangement chosen: cross-bonded, by Test Designer (invented) on 2026-03-02. Reason: Lowest losses (test).');
    expect(hasCell(doc.bodyText, 'Solidly bonded at every current earthing position')).toBe(true);
    expect(doc.bodyText).toContain(`inputs hash ${'a'.repeat(64)}; engine 2.0.0`);
    // Standing voltage 49.54 V/km × 0.5 km per kA passes 65 V between 2.5 and 3 kA: the last point fails.
    expect(doc.bodyText).toContain('standing-voltage-normal first fails at 3000.');
    expect(hasCell(doc.bodyText, '3000')).toBe(true);
    expect(doc.media.length).toBe(1);
    const svg = sweepFigureSvg(sweep, 'standing-voltage-normal', 800, 400);
    expect(svg).toContain('limit 65 V');
    expect(svg).toContain('first fails');
  });

  it('prints a two-input sweep as a family of curves, one per value of the second input, and the table of every point', async () => {
    const axes = [
      { input: { kind: 'load-current' as const }, fromValue: 500, toValue: 3000, points: 6 },
      { input: { kind: 'soil-resistivity' as const }, fromValue: 20, toValue: 1000, points: 3 },
    ];
    const sweep = (await runExploration({ kind: 'sweep', study: referenceStudy(), limits, axes })) as SweepResult;
    const svg = sweepFigureSvg(sweep, 'standing-voltage-normal', 800, 400);
    // Three curves (stroke of a path), each named at its end by its soil resistivity.
    expect(svg.match(/<path d="M/g)).toHaveLength(3);
    for (const v of ['20', '510', '1000']) expect(svg).toContain(`>${v}</text>`);
    expect(svg).toContain('limit 65 V');
    const blocks = explorationBlocks({ choice: null, saved: [{ id: 's2', kind: 'sweep', params: {}, inputsHash: 'b'.repeat(64), engineVersion: '2.0.0', savedAt: new Date('2026-03-01'), savedBy: 'Test Designer (invented)', result: sweep }] });
    const doc = readDocx(await Packer.toBuffer(new Document({ sections: [{ children: blocks }] })));
    expect(doc.bodyText).toContain('one curve per value of Soil resistivity, Ω·m (20, 510, 1000)');
    expect(doc.bodyText).toContain('standing-voltage-normal first fails at 3000 (Largest normal-load current (all load cases scaled), A) with 20 (Soil resistivity, Ω·m).');
    expect(hasCell(doc.bodyText, 'Soil resistivity, Ω·m')).toBe(true);
    expect(doc.media.length).toBe(1);
  });

  it('adds nothing when nothing was saved', () => {
    expect(explorationBlocks(undefined)).toEqual([]);
    expect(explorationBlocks({ choice: null, saved: [] })).toEqual([]);
  });
});
