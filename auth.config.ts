import Credentials from '@auth/core/providers/credentials';
import { CredentialsSignin } from '@auth/core/errors';
import { defineConfig } from 'auth-astro';
import { z } from 'zod';
import { serverConfig } from './src/lib/config.server';
import { database } from './src/lib/server/services.server';
import { verifySignIn } from './src/lib/auth/sign-in';

class AccountLocked extends CredentialsSignin {
  code = 'locked';
}

const credentialsSchema = z.object({ email: z.string().email(), password: z.string().min(1) });

export default defineConfig({
  secret: process.env.AUTH_SECRET,
  trustHost: true,
  session: { strategy: 'jwt', maxAge: 8 * 60 * 60 },
  pages: { signIn: '/signin' },
  providers: [
    Credentials({
      credentials: { email: { label: 'E-mail' }, password: { label: 'Password', type: 'password' } },
      async authorize(raw) {
        const parsed = credentialsSchema.safeParse(raw);
        if (!parsed.success) return null;
        const cfg = serverConfig();
        const outcome = await verifySignIn(database(), parsed.data.email, parsed.data.password, {
          maxFailures: cfg.SIGN_IN_MAX_FAILURES,
          lockSeconds: cfg.SIGN_IN_LOCK_SECONDS,
        });
        if (!outcome.ok) {
          if (outcome.reason === 'locked') throw new AccountLocked();
          return null;
        }
        return outcome.user;
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user?.id) token.uid = user.id;
      return token;
    },
    session({ session, token }) {
      // Roles are not kept in the token: middleware loads them fresh from the database.
      if (typeof token.uid === 'string') (session.user as { id?: string }).id = token.uid;
      return session;
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
