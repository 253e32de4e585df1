import { boolean, index, integer, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';

export const users = pgTable('users', {
  id: uuid('id').primaryKey().defaultRandom(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash'),
  isAdmin: boolean('is_admin').notNull().default(false),
  // Superseded by sign_in_throttles (which also covers unknown e-mails and client addresses);
  // no longer read or written by sign-in, kept until users.repo.ts stops naming them.
  failedSignIns: integer('failed_sign_ins').notNull().default(0),
  lockedUntil: timestamp('locked_until', { withTimezone: true }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export type User = typeof users.$inferSelect;

/**
 * One row per sign-in. The JWT carries the row id; middleware accepts the cookie only while the
 * row is neither revoked (sign-out) nor expired, so a copied cookie dies with the session.
 */
export const userSessions = pgTable(
  'user_sessions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
  },
  (t) => [index('user_sessions_expires_at_idx').on(t.expiresAt)],
);

export const throttleKinds = ['account', 'address'] as const;
export type ThrottleKind = (typeof throttleKinds)[number];

/**
 * Failed sign-ins counted per account (the normalised e-mail, whether or not an account has it,
 * so a lock says nothing about existence) and per client address. Kept in the database so the
 * count survives restarts and is shared by server processes.
 */
export const signInThrottles = pgTable(
  'sign_in_throttles',
  {
    kind: text('kind', { enum: throttleKinds }).notNull(),
    key: text('key').notNull(),
    failures: integer('failures').notNull().default(0),
    windowStartedAt: timestamp('window_started_at', { withTimezone: true }).notNull().defaultNow(),
    lockedUntil: timestamp('locked_until', { withTimezone: true }),
  },
  (t) => [primaryKey({ columns: [t.kind, t.key] })],
);

/** Single-use links, e-mailed to an account's owner when the account locks, that clear the lock. */
export const accountUnlocks = pgTable('account_unlocks', {
  tokenHash: text('token_hash').primaryKey(),
  userId: uuid('user_id')
    .notNull()
    .references(() => users.id, { onDelete: 'cascade' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  usedAt: timestamp('used_at', { withTimezone: true }),
});
