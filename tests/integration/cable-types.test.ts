import { beforeAll, describe, expect, it } from 'vitest';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoIds, demoSessions, fixtureInputs, json, send } from '../helpers/workflow-api';
import { cableTypeSchema, type CableType } from '../../src/lib/schemas/bonding-study.schema';
import { demoCableTypes } from '../../scripts/demo-cable-types';

// The cable catalogue through the real server and PostgreSQL: construction entries are derived
// on the way in, stored with their figures, refused by field when wrong, and a study built on
// one calculates exactly as the same figures entered directly.

type Row = { code: string; data: CableType };
const catalogue = async (s: HttpSession): Promise<Row[]> => (await json(await s.fetch('/api/cable-types'), 200)).cableTypes;
const ENGINE = ['conductorResistanceOhmPerKm', 'conductorGmrMm', 'sheathMeanDiameterMm', 'sheathResistanceOhmPerKm'] as const;
const unique = (p: string) => `${p}${process.pid % 1000}-${Date.now() % 100000}`;

describe('cable types entered as construction', () => {
  let sessions: Record<DemoRole, HttpSession>;
  beforeAll(async () => {
    sessions = await demoSessions();
  });

  it('the demo catalogue holds illustrative constructions with their derived figures', async () => {
    const rows = await catalogue(sessions.designer);
    const demo = demoCableTypes.filter((t) => t.entry === 'construction');
    expect(demo.length).toBeGreaterThanOrEqual(3);
    for (const t of demo) {
      const row = rows.find((r) => r.code === t.id);
      expect(row, t.id).toBeDefined();
      expect(row!.data).toEqual(JSON.parse(JSON.stringify(cableTypeSchema.parse(t))));
    }
  });

  it('an administrator adds a construction: stored with its derived figures; a designer cannot add one', async () => {
    const code = unique('XC');
    const body = { ...demoCableTypes.find((t) => t.id === 'XC132-630CW')!, id: code, name: 'Added by the test (illustrative construction, not a maker\'s data)' };
    expect((await send(sessions.designer, 'POST', '/api/admin/cable-types', body)).status).toBe(403);
    const added = await json(await send(sessions.admin, 'POST', '/api/admin/cable-types', body), 201);
    const expected = cableTypeSchema.parse(body);
    for (const k of ENGINE) expect(added.data[k], k).toBe(expected[k]);
    expect(added.data.construction.screen.foil).toEqual({ material: 'aluminium', thicknessMm: 0.2 });
    expect((await catalogue(sessions.designer)).find((r) => r.code === code)?.data).toEqual(added.data);
  });

  it('bad construction is refused by field and nothing is saved', async () => {
    const code = unique('XB');
    const good = demoCableTypes.find((t) => t.id === 'XC33-400CW')!;
    const bad = { ...good, id: code, construction: { ...(good as { construction: object }).construction, conductor: { material: 'aluminium', crossSectionMm2: 400, diameterMm: 15, stranding: 'stranded', strandCount: 50, operatingTemperatureC: 90 } } };
    const res = await json(await send(sessions.admin, 'POST', '/api/admin/cable-types', bad), 422);
    expect(res.fields.map((f: { field: string }) => f.field).sort()).toEqual(['construction.conductor.diameterMm', 'construction.conductor.strandCount']);
    const typed = await json(await send(sessions.admin, 'POST', '/api/admin/cable-types', { ...good, id: code, conductorGmrMm: 12 }), 422);
    expect(typed.fields.map((f: { field: string }) => f.field)).toEqual(['conductorGmrMm']);
    // A missing or empty identifier is named in words, not in the parser's terms.
    const { id: _id, ...noId } = good;
    const missing = await json(await send(sessions.admin, 'POST', '/api/admin/cable-types', noId), 422);
    expect(missing.fields).toContainEqual({ field: 'id', message: 'Id is required.' });
    const empty = await json(await send(sessions.admin, 'POST', '/api/admin/cable-types', { ...good, id: '' }), 422);
    expect(empty.fields[0].field).toBe('id');
    expect(empty.fields[0].message).not.toMatch(/Invalid input|expected|Too small/);
    expect((await catalogue(sessions.admin)).some((r) => r.code === code)).toBe(false);
  });

  it('a study on a catalogue construction calculates exactly as the same figures entered directly', async () => {
    const { projectId, limitSetId } = await demoIds(sessions.designer);
    const fromCatalogue = (await catalogue(sessions.designer)).find((r) => r.code === 'XC132-1000PB')!.data;
    const base = fixtureInputs('fernhollow-cross-bonded');
    const typeId = base.cableTypes[0].id;
    const direct = { id: typeId, name: 'the same figures typed in', oversheathThicknessMm: fromCatalogue.oversheathThicknessMm, overallDiameterMm: fromCatalogue.overallDiameterMm, oversheathWithstandKv: fromCatalogue.oversheathWithstandKv, ...Object.fromEntries(ENGINE.map((k) => [k, fromCatalogue[k]])) };
    const results = [];
    for (const [suffix, cableType] of [['C', { ...fromCatalogue, id: typeId }], ['D', direct]] as const) {
      const created = await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/studies`, { code: unique(`K${suffix}`), title: 'Construction against direct', kind: 'bonding', limitSetId, inputs: { ...base, cableTypes: [cableType] } }), 201);
      await json(await send(sessions.designer, 'POST', `/api/revisions/${created.revision.id}/calculate`), 200);
      const detail = await json(await sessions.designer.fetch(`/api/revisions/${created.revision.id}`), 200);
      if (suffix === 'C') expect(detail.revision.inputs.cableTypes[0].construction).toEqual(fromCatalogue.entry === 'construction' ? fromCatalogue.construction : undefined);
      results.push(detail.revision.results);
    }
    expect(results[0]).toBeTruthy();
    expect(results[0]).toEqual(results[1]);
  });
});
