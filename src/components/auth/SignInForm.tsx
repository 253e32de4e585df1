import './zod-jitless';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { signIn } from 'auth-astro/client';
import { signInSchema, type SignInInput } from '../../lib/schemas/sign-in.schema';
import { useHydrated } from '../ui/use-hydrated';

const MESSAGES: Record<string, string> = {
  // Worded so that it tells no more than a wrong password does: not whether the account exists,
  // and not whether this password was right. Unknown e-mails lock just like real ones.
  locked: 'Signing in with this e-mail, or from this network, is paused after too many failed attempts. Try again in a few minutes. If it is your account, look in your e-mail for a link that unlocks it.',
  credentials: 'That e-mail and password do not match an account. Check both and try again.',
};

export default function SignInForm({ next }: { next: string }) {
  const [failure, setFailure] = useState<string | null>(null);
  const hydrated = useHydrated();
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<SignInInput>({ resolver: zodResolver(signInSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setFailure(null);
    const res = await signIn('credentials', { ...values, redirect: false, callbackUrl: next });
    if (!res) return; // signed in: the browser is already on its way
    const data = (await res.json()) as { url: string };
    const code = new URL(data.url).searchParams.get('code');
    setFailure(MESSAGES[code ?? 'credentials'] ?? MESSAGES.credentials);
  });

  return (
    // method="post": should the browser ever submit it itself, the password stays out of the address.
    <form method="post" onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Sign in">
      <label className="block">
        <span className="text-sm font-semibold">E-mail</span>
        <input
          type="email"
          autoComplete="username"
          {...register('email')}
          aria-invalid={!!errors.email}
          className="mt-1 w-full rounded border border-rule bg-panel px-3 py-2"
        />
        {errors.email && <span className="text-sm text-fail">{errors.email.message}</span>}
      </label>
      <label className="block">
        <span className="text-sm font-semibold">Password</span>
        <input
          type="password"
          autoComplete="current-password"
          {...register('password')}
          aria-invalid={!!errors.password}
          className="mt-1 w-full rounded border border-rule bg-panel px-3 py-2"
        />
        {errors.password && <span className="text-sm text-fail">{errors.password.message}</span>}
      </label>
      {failure && (
        <p role="alert" className="rounded border border-fail bg-fail/10 px-3 py-2 text-sm text-fail">
          {failure}
        </p>
      )}
      <button
        type="submit"
        disabled={!hydrated || isSubmitting}
        className="w-full rounded bg-copper px-4 py-2 font-semibold text-paper hover:bg-copper-dark disabled:opacity-60"
      >
        {isSubmitting ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
