import { z } from 'zod';
import './plain-messages';

// Request bodies of the revision endpoints: one schema each, used by the API and the forms.

export const newStudySchema = z.object({
  code: z.string().trim().min(1, 'Give the study a code.').max(30),
  title: z.string().trim().min(3, 'Give the study a title.').max(200),
  kind: z.enum(['bonding', 'exposure']),
  limitSetId: z.uuid('Choose a limit set.'),
  inputs: z.unknown(),
});

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

export const checkValueSchema = z.object({
  itemKey: z.string().min(1, 'Choose the result you checked.'),
  checkerValue: z.number({ error: 'Enter your value as a number.' }).finite(),
  explanation: z.string().trim().max(2000).optional(),
});

/** A correction of the checker's own check value (the item stays the same). */
export const checkValueUpdateSchema = checkValueSchema.omit({ itemKey: true });

export const invitationSchema = z.object({
  email: z.email('This is not an e-mail address.').transform((e) => e.toLowerCase()),
  name: z.string().trim().min(2, 'Give the person\'s name.'),
  isAdmin: z.boolean().default(false),
});

export const acceptInvitationSchema = z.object({
  token: z.string().min(20),
  password: z.string().min(10, 'Choose a password of at least 10 characters.').max(200),
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
