import { z } from 'zod';

/** Copy a study into a project (its own or another), from a chosen revision or the latest. */
export const copyStudySchema = z.strictObject({
  projectId: z.uuid('Choose the project to copy into.'),
  code: z.string().trim().min(1, 'Give the copy a code.').max(30),
  title: z.string().trim().min(3, 'Give the copy a title.').max(200),
  fromRevisionId: z.uuid('Choose a revision of this study.').optional(),
});

/** Start the next revision from a chosen issued revision (or, without one, from the latest). */
export const newRevisionSchema = z.strictObject({
  fromRevisionId: z.uuid('Choose an issued revision of this study.').optional(),
});
