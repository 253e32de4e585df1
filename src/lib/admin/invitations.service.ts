import { randomBytes } from 'node:crypto';
import { and, eq, gt, isNull } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { invitations, users } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import { sha256Hex } from '../canonical-json';
import { hashPassword } from '../auth/passwords';
import { invitationMessage } from '../mail/workflow-messages';
import { MAIL_QUEUE } from '../mail/mail-delivery';
import type { invitationSchema } from '../schemas/revision-actions.schema';

const VALID_HOURS = 72;

/** Invites a person by e-mail with a single-use link that expires after three days. */
export async function inviteUser(s: AppServices, admin: SessionUser, body: z.output<typeof invitationSchema>) {
  const [existing] = await s.db.select({ id: users.id }).from(users).where(eq(users.email, body.email));
  if (existing) throw new AppError('InvalidInput', undefined, [{ field: 'email', message: 'An account with this e-mail already exists.' }]);
  const token = randomBytes(24).toString('base64url');
  const expiresAt = new Date(Date.now() + VALID_HOURS * 3600_000);
  return inTransaction(s.pool, async (tx, sqlExecutor) => {
    const [row] = await tx.insert(invitations).values({ email: body.email, name: body.name, isAdmin: body.isAdmin, tokenHash: sha256Hex(token), expiresAt, invitedBy: admin.id }).returning({ id: invitations.id });
    await appendAudit(tx, { actorId: admin.id, type: 'user.invited', detail: { email: body.email, name: body.name, isAdmin: body.isAdmin } });
    await s.jobs?.enqueue(sqlExecutor, MAIL_QUEUE, [invitationMessage(s.appUrl, body.email, body.name, token, admin.name, expiresAt)]);
    return { id: row.id, email: body.email, expiresAt };
  });
}

/** Turns an unused, unexpired invitation into an account with the chosen password. */
export async function acceptInvitation(s: AppServices, token: string, password: string) {
  const passwordHash = await hashPassword(password);
  return inTransaction(s.pool, async (tx) => {
    const [invitation] = await tx
      .update(invitations)
      .set({ usedAt: new Date() })
      .where(and(eq(invitations.tokenHash, sha256Hex(token)), isNull(invitations.usedAt), gt(invitations.expiresAt, new Date())))
      .returning();
    if (!invitation) throw new AppError('InvalidInput', undefined, [{ field: 'token', message: 'This invitation link has been used or has expired. Ask an administrator for a new one.' }]);
    const [user] = await tx.insert(users).values({ email: invitation.email, name: invitation.name, isAdmin: invitation.isAdmin, passwordHash }).returning({ id: users.id, email: users.email });
    await appendAudit(tx, { actorId: user.id, type: 'user.joined', detail: { email: user.email, invitationId: invitation.id } });
    return user;
  });
}
