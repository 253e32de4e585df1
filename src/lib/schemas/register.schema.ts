import { z } from 'zod';
import { isIsoDate } from '../register/due-dates';
import { registerStatuses } from '../register/register-status';

// Request bodies and queries of the register endpoints: one schema each, for the API and the forms.

const isoDate = (what: string) => z.string({ error: `${what}: give a date as YYYY-MM-DD.` }).refine(isIsoDate, `${what}: give a real date as YYYY-MM-DD (UTC).`);
const text = (what: string, max: number) => z.string({ error: `Give ${what}.` }).trim().min(1, `Give ${what}.`).max(max, `${what[0].toUpperCase()}${what.slice(1)} is at most ${max} characters.`);

export const newAssetSchema = z
  .strictObject({
    kind: z.enum(['circuit', 'site'], { error: 'Say whether the asset is a circuit or a site.' }),
    siteKind: z.enum(['substation', 'link-box-group', 'pipeline', 'fence', 'other']).optional(),
    code: text('a code', 30),
    name: text('a name', 200),
    route: z.string().trim().max(500).default(''),
    ownerStandard: text('the owner standard', 100),
    inServiceOn: isoDate('In service on').nullable().default(null),
  })
  .refine((a) => a.kind === 'circuit' || a.siteKind !== undefined, { path: ['siteKind'], message: 'Say what kind of site it is.' });

/**
 * A change to an asset: only the fields sent change. Its kind stays (a circuit's links, records
 * and a site's system data would not fit the other kind): remove it and add a new one instead.
 */
export const assetEditSchema = z
  .strictObject({
    kind: z.undefined({ error: 'An asset stays a circuit or a site: remove it and add a new one instead.' }).optional(),
    siteKind: z.enum(['substation', 'link-box-group', 'pipeline', 'fence', 'other'], { error: 'Choose a kind of site from the list.' }).optional(),
    code: text('a code', 30).optional(),
    name: text('a name', 200).optional(),
    route: z.string({ error: 'The route is text.' }).trim().max(500, 'The route is at most 500 characters.').optional(),
    ownerStandard: text('the owner standard', 100).optional(),
    inServiceOn: isoDate('In service on').nullable().optional(),
  })
  // Only once every key is known and valid: an unknown key is named on its own, not taken for an empty change.
  .refine((a) => Object.values(a).some((v) => v !== undefined), { path: ['name'], message: 'Change at least one field.', when: (payload) => payload.issues.length === 0 });

/** A change to a study link: the circuit in the study, or the route end of a site (null clears it). */
export const studyLinkEditSchema = z
  .object({
    studyCircuitId: z.string({ error: 'The circuit id in the study is text.' }).trim().min(1, 'Give the circuit id, or clear it.').max(40).nullable().optional(),
    siteEnd: z.enum(['start', 'end'], { error: 'The route end is start or end.' }).nullable().optional(),
  })
  .refine((l) => l.studyCircuitId !== undefined || l.siteEnd !== undefined, { path: ['studyCircuitId'], message: 'Change the circuit id or the route end.' });

export const studyLinkSchema = z.object({
  studyId: z.uuid('Choose a study.'),
  studyCircuitId: z.string().trim().min(1).max(40).optional(),
  siteEnd: z.enum(['start', 'end']).optional(),
});

export const obligationTypeSchema = z.object({
  ownerStandard: text('the owner standard', 100),
  name: text('a name', 120),
  appliesTo: z.enum(['circuit', 'site', 'both'], { error: 'Say whether it applies to circuits, sites or both.' }),
  firstDueMonths: z.number({ error: 'First due: a number of months.' }).int('First due: whole months.').min(0).max(600),
  intervalMonths: z.number({ error: 'Interval: a number of months.' }).int('Interval: whole months.').min(1, 'The interval is at least a month; leave it empty for a one-off.').max(600).nullable(),
  criterion: z
    .object({
      quantity: text('the measured quantity', 120),
      unit: z.string().trim().max(20),
      comparison: z.enum(['at-least', 'at-most']),
      limit: z.number({ error: 'The limit must be a number.' }).finite(),
    })
    .nullable()
    .default(null),
  remindDaysBefore: z.number().int().min(0).max(365).default(30),
  basis: text('the basis (clause of the owner standard, or "invented for the demo")', 300),
});

/** The fields of an obligation record, sent as multipart fields beside the optional evidence file. */
export const obligationRecordSchema = z.object({
  obligationTypeId: z.uuid('Choose the obligation.'),
  doneOn: isoDate('Done on'),
  performedBy: text('who did the work', 120),
  /** Measured values, comma separated in the form; judged against the criterion. */
  values: z
    .string()
    .max(1000)
    .default('')
    .transform((s, ctx) => {
      const parts = s.split(/[,;\s]+/).filter(Boolean);
      const numbers = parts.map(Number);
      if (numbers.some((n) => !Number.isFinite(n))) {
        ctx.addIssue({ code: 'custom', message: 'Values must be numbers separated by commas.' });
        return z.NEVER;
      }
      return numbers;
    }),
  remarks: z.string().trim().max(2000, 'Remarks are at most 2,000 characters.').default(''),
});

const positiveOrNull = (what: string, max: number) => z.number({ error: `${what} must be a number.` }).positive(`${what} must be above zero.`).max(max, `${what} above ${max} is out of range: check the units.`).nullable().default(null);

export const systemDataSchema = z
  .object({
    threePhaseFaultKa: positiveOrNull('Three-phase fault level (kA)', 500),
    earthFaultKa: positiveOrNull('Earth-fault level (kA)', 500),
    clearanceTimeS: positiveOrNull('Fault clearance time (s)', 10),
    gridResistanceOhm: positiveOrNull('Earth grid resistance (Ω)', 1000),
    maxLoads: z.array(z.object({ circuitAssetId: z.uuid('Choose the circuit.'), maxLoadA: z.number().positive('The load must be above zero.').max(20_000) })).max(50).default([]),
    source: text('the source of the figures', 300),
    sourceDate: isoDate('Source date'),
  })
  .refine((d) => d.threePhaseFaultKa !== null || d.earthFaultKa !== null || d.clearanceTimeS !== null || d.gridResistanceOhm !== null || d.maxLoads.length > 0, {
    path: ['earthFaultKa'],
    message: 'Give at least one figure.',
  });

export const registerSorts = ['code', 'name', 'status', 'nextDue', 'margin'] as const;

export const registerQuerySchema = z.object({
  projectId: z.uuid().optional(),
  kind: z.enum(['circuit', 'site']).optional(),
  status: z.enum(registerStatuses).optional(),
  search: z.string().trim().max(100).optional(),
  sort: z.enum(registerSorts).default('code'),
  direction: z.enum(['asc', 'desc']).default('asc'),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
  /** The opaque position after the last row of the previous page (keyset paging). */
  after: z.string().max(500).optional(),
});

export const applyProposalsSchema = z.object({
  revisionId: z.uuid(),
  version: z.number().int().positive(),
  /** The proposals the designer confirmed, by the inputs field each changes. */
  accept: z.array(z.string().min(1).max(200)).min(1, 'Confirm at least one new value.').max(500),
});

export type RegisterQuery = z.output<typeof registerQuerySchema>;
export type SystemDataInput = z.output<typeof systemDataSchema>;
