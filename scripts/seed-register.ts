// The demo register: circuits, sites, an owner standard's obligations and their records, all
// INVENTED for the demo (the owner standard, its intervals and criteria, the contractors and the
// network figures describe no real owner or network). Written through the real services.
import type { SessionUser } from '../src/lib/auth/roles';
import type { AppServices } from '../src/lib/services';
import { createAsset, linkStudy } from '../src/lib/register/assets.service';
import { addObligationType, recordObligation } from '../src/lib/register/obligations.service';
import { publishSystemData } from '../src/lib/register/system-data.service';
import { takeRegisterSnapshots } from '../src/lib/register/reminders.service';
import { addDays, addMonths } from '../src/lib/register/due-dates';
import { newAssetSchema, obligationTypeSchema, systemDataSchema } from '../src/lib/schemas/register.schema';

export const DEMO_OWNER_STANDARD = 'Demo owner standard OS-1 (invented)';
const BASIS = 'Invented for the Sheathwise demo: not taken from any owner\'s standard.';

export async function seedRegister(s: AppServices, people: { designer: SessionUser; approver: SessionUser; admin: SessionUser }, projectId: string, issuedStudyId: string) {
  const today = new Date().toISOString().slice(0, 10);
  const type = (body: object) => addObligationType(s, people.admin, obligationTypeSchema.parse({ ownerStandard: DEMO_OWNER_STANDARD, basis: BASIS, ...body }));
  const oversheath = await type({ name: 'Oversheath test', appliesTo: 'circuit', firstDueMonths: 0, intervalMonths: 24, criterion: { quantity: 'oversheath insulation resistance', unit: 'MΩ', comparison: 'at-least', limit: 1 } });
  const continuity = await type({ name: 'Bonding continuity test', appliesTo: 'circuit', firstDueMonths: 0, intervalMonths: 60, criterion: { quantity: 'bonding lead resistance', unit: 'mΩ', comparison: 'at-most', limit: 50 } });
  const inspection = await type({ name: 'Link-box and SVL inspection', appliesTo: 'site', firstDueMonths: 12, intervalMonths: 12, criterion: null });
  await type({ name: 'Exposure review', appliesTo: 'site', firstDueMonths: 36, intervalMonths: 36, criterion: null });

  const asset = (body: object) => createAsset(s, people.designer, projectId, newAssetSchema.parse({ ownerStandard: DEMO_OWNER_STANDARD, ...body }));
  // In service two years less three weeks ago: the two-yearly oversheath test falls due within 30 days.
  const c1 = await asset({ kind: 'circuit', code: 'FHX-C1', name: 'Fernhollow–Kestrel Bay circuit 1 (invented)', route: 'Fernhollow to Kestrel Bay, 4 major sections', inServiceOn: addDays(addMonths(today, -24), 21) });
  const kb = await asset({ kind: 'site', siteKind: 'substation', code: 'KB-SUB', name: 'Kestrel Bay substation (invented)', inServiceOn: addMonths(today, -30) });
  const lbg = await asset({ kind: 'site', siteKind: 'link-box-group', code: 'FHX-LB', name: 'Cross-bonding link boxes, circuit 1 (invented)', inServiceOn: addMonths(today, -30) });
  await asset({ kind: 'circuit', code: 'FHX-C2', name: 'Fernhollow–Kestrel Bay circuit 2, planned (invented)', route: 'Parallel to circuit 1', inServiceOn: null });

  await linkStudy(s, people.designer, c1.id, { studyId: issuedStudyId, studyCircuitId: 'C1' });
  await linkStudy(s, people.designer, kb.id, { studyId: issuedStudyId, siteEnd: 'end' });
  await linkStudy(s, people.designer, lbg.id, { studyId: issuedStudyId });

  const record = (assetId: string, typeId: string, doneOn: string, values: number[], remarks: string) =>
    recordObligation(s, people.designer, assetId, { obligationTypeId: typeId, doneOn, performedBy: 'Brackenfield Cable Testing (invented contractor)', values, remarks }, null, 0);
  await record(c1.id, oversheath.id, c1.inServiceOn!, [48, 52, 61], 'Commissioning test, 5 kV d.c. for 1 minute per section (invented readings).');
  await record(c1.id, continuity.id, c1.inServiceOn!, [12, 15, 14], 'Cross-bonding leads, each minor section (invented readings).');
  await record(kb.id, inspection.id, addMonths(today, -6), [], 'Link boxes locked and labelled; SVLs intact (invented).');
  // The link-box group's inspection was missed: overdue in the demo.

  // The site's first system data: the figures the issued study assumed, so nothing needs review yet.
  await publishSystemData(s, people.approver, kb.id, systemDataSchema.parse({ earthFaultKa: 20, threePhaseFaultKa: 31.5, clearanceTimeS: 1, gridResistanceOhm: 0.3, source: 'Network operator fault-level letter (invented)', sourceDate: addMonths(today, -30) }));
  await takeRegisterSnapshots(s, today);
}
