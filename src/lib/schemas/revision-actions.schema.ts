import { z } from 'zod';
import './plain-messages';

// Request bodies of the revision endpoints: one schema each, used by the API and the forms.
// The ones a browser form also uses live in their own modules (a shared module lands whole in
// every page bundle that touches it) and are re-exported here for the server.
export { newStudySchema } from './new-study.schema';
export { checkValueSchema, checkValueUpdateSchema } from './check-value.schema';
export { invitationSchema } from './invitation.schema';
export { acceptInvitationSchema } from './accept-invitation.schema';

export const updateInputsSchema = z.object({ version: z.number().int().positive(), inputs: z.unknown() });

export const stepSchema = z.object({
  step: z.enum(['submit', 'startCheck', 'return', 'pass', 'issue', 'withdraw']),
  version: z.number().int().positive(),
  reason: z.string().trim().max(4000).optional(),
  statement: z.string().trim().max(1000).optional(),
  /** Asked again for the steps that sign (submit, pass, issue); never stored. */
  password: z.string().max(1024, 'A password is at most 1024 characters.').optional(),
});

export const checklistUpdateSchema = z.union([
  z
    .object({ answer: z.enum(['yes', 'no', 'not-applicable']), reason: z.string().trim().max(2000).optional() })
    .refine((v) => v.answer !== 'not-applicable' || !!v.reason, { path: ['reason'], message: 'Say why the item does not apply.' }),
  // A query opens a remark thread on the item, so it needs the question (required by the
  // service once it knows the person may query: a refused person hears why first).
  z.object({ verdict: z.enum(['agree', 'query']), remark: z.string().trim().max(4000).optional() }),
  z.object({ justification: z.string().trim().min(10, 'A justification needs at least a sentence.').max(4000) }),
]);

export const remarkSchema = z.object({
  body: z.string().trim().min(1, 'Write the remark.').max(4000, 'A remark can hold up to 4,000 characters: split a longer one.'),
  itemKey: z.string().optional(),
  field: z.string().optional(),
  parentId: z.uuid().optional(),
});

/** Closes (resolved) or reopens a remark thread. */
export const remarkUpdateSchema = z.object({ resolved: z.boolean() });

/** "Agree with every remaining item": the count the checker was shown and confirmed. */
export const agreeRemainingSchema = z.object({
  verdict: z.literal('agree', { error: 'Only "agree" can be given to every remaining item.' }),
  count: z.number({ error: 'Confirm the number of items.' }).int().min(1, 'No item is left to agree with.'),
});

export const membershipSchema = z.object({
  userId: z.uuid(),
  role: z.enum(['designer', 'checker', 'approver', 'auditor']),
});

export const listQuerySchema = z.object({
  page: z.coerce.number().int().min(0).default(0),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});

export const fileUploadSchema = z.object({ kind: z.enum(['data-sheet', 'drawing', 'measurements', 'other']) });
