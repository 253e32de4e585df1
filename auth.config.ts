import Credentials from '@auth/core/providers/credentials';
import { CredentialsSignin } from '@auth/core/errors';
import { defineConfig } from 'auth-astro';
import { z } from 'zod';
import { serverConfig } from './src/lib/config.server';
import { database, services } from './src/lib/server/services.server';
import { ADDRESS_FAILURE_FACTOR, verifySignIn } from './src/lib/auth/sign-in';
import { currentClientAddress } from './src/lib/auth/client-address';
import { openSession, revokeSession } from './src/lib/auth/sessions';
import { issueUnlockLink } from './src/lib/auth/account-unlock';
import { dummyPasswordHash } from './src/lib/auth/passwords';

class AccountLocked extends CredentialsSignin {
  code = 'locked';
}

const SESSION_SECONDS = 8 * 60 * 60;

// Over-long input is refused before any work; it is not counted as a failure.
const credentialsSchema = z.object({ email: z.string().email().max(320), password: z.string().min(1).max(1024) });

// Computed now, so the first sign-in for an unknown e-mail does not pay for it.
void dummyPasswordHash();

export default defineConfig({
  secret: process.env.AUTH_SECRET,
  trustHost: true,
  session: { strategy: 'jwt', maxAge: SESSION_SECONDS },
  pages: { signIn: '/signin' },
  providers: [
    Credentials({
      credentials: { email: { label: 'E-mail' }, password: { label: 'Password', type: 'password' } },
      async authorize(raw) {
        const parsed = credentialsSchema.safeParse(raw);
        if (!parsed.success) return null;
        const cfg = serverConfig();
        const outcome = await verifySignIn(
          database(),
          parsed.data.email,
          parsed.data.password,
          currentClientAddress(),
          { maxFailures: cfg.SIGN_IN_MAX_FAILURES, lockSeconds: cfg.SIGN_IN_LOCK_SECONDS, maxFailuresPerAddress: cfg.SIGN_IN_MAX_FAILURES * ADDRESS_FAILURE_FACTOR },
          {
            onAccountLocked: (user) => {
              // Not awaited: the answer must not take longer for an account that exists.
              void services()
                .then((s) => issueUnlockLink(s, user))
                .catch((err) => console.error('[sign-in] unlock link not sent', err));
            },
          },
        );
        if (!outcome.ok) {
          if (outcome.reason === 'locked') throw new AccountLocked();
          return null;
        }
        return outcome.user;
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      // Sign-in: record a server-side session, so that signing out can end it for good.
      if (user?.id) {
        token.uid = user.id;
        token.sid = await openSession(database(), user.id, SESSION_SECONDS);
      }
      return token;
    },
    session({ session, token }) {
      // Roles are not kept in the token: middleware loads them fresh from the database, after
      // checking that the session `sid` is still open.
      const u = session.user as { id?: string; sid?: string };
      if (typeof token.uid === 'string') u.id = token.uid;
      if (typeof token.sid === 'string') u.sid = token.sid;
      return session;
    },
  },
  events: {
    async signOut(message) {
      const sid = 'token' in message ? message.token?.sid : undefined;
      if (typeof sid === 'string') await revokeSession(database(), sid);
    },
  },
  logger: {
    error(error) {
      // A wrong password is an expected outcome, not a server error.
      if (error.name === 'CredentialsSignin') return;
      console.error(error);
    },
  },
});
