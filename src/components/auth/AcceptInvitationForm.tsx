import './zod-jitless';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { acceptInvitationSchema } from '../../lib/schemas/accept-invitation.schema';
import { useHydrated } from '../ui/use-hydrated';

const formSchema = acceptInvitationSchema
  .extend({ repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords differ.' });

type FormValues = z.input<typeof formSchema>;

export default function AcceptInvitationForm({ token }: { token: string }) {
  const [outcome, setOutcome] = useState<{ ok: boolean; text: string } | null>(null);
  const hydrated = useHydrated();
  const { register, handleSubmit, formState: { errors, isSubmitting } } = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { token } });

  const onSubmit = handleSubmit(async ({ password }) => {
    const res = await fetch('/api/invitations/accept', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ token, password }) });
    const body = await res.json();
    setOutcome(res.ok ? { ok: true, text: 'Your account is ready. Sign in with your e-mail address and the new password.' } : { ok: false, text: body.fields?.[0]?.message ?? body.message });
  });

  if (outcome?.ok) return <p role="status">{outcome.text} <a className="text-copper underline" href="/signin">Sign in</a></p>;
  return (
    <form method="post" onSubmit={onSubmit} noValidate className="space-y-4">
      <input type="hidden" {...register('token')} />
      <label className="block">
        <span className="text-sm font-semibold">New password</span>
        <input type="password" autoComplete="new-password" {...register('password')} className="mt-1 w-full rounded border border-rule bg-panel px-3 py-2" />
        {errors.password && <span className="text-sm text-fail">{errors.password.message}</span>}
      </label>
      <label className="block">
        <span className="text-sm font-semibold">Repeat the password</span>
        <input type="password" autoComplete="new-password" {...register('repeat')} className="mt-1 w-full rounded border border-rule bg-panel px-3 py-2" />
        {errors.repeat && <span className="text-sm text-fail">{errors.repeat.message}</span>}
      </label>
      {outcome && <p role="alert" className="text-sm text-fail">{outcome.text}</p>}
      <button type="submit" disabled={!hydrated || isSubmitting} className="w-full rounded bg-copper px-4 py-2 font-semibold text-paper hover:bg-copper-dark disabled:opacity-60">
        {isSubmitting ? 'Saving…' : 'Set my password'}
      </button>
    </form>
  );
}
