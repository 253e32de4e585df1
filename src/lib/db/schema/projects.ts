import { pgEnum, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './users';

export const projectRoles = ['designer', 'checker', 'approver', 'auditor'] as const;
export type ProjectRole = (typeof projectRoles)[number];

export const projectRoleEnum = pgEnum('project_role', projectRoles);

export const projects = pgTable('projects', {
  id: uuid('id').primaryKey().defaultRandom(),
  code: text('code').notNull().unique(),
  name: text('name').notNull(),
  description: text('description').notNull().default(''),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const memberships = pgTable(
  'memberships',
  {
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: projectRoleEnum('role').notNull(),
  },
  (t) => [primaryKey({ columns: [t.projectId, t.userId, t.role] })],
);

export type Project = typeof projects.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
