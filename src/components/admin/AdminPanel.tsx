import { lazy, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../lib/queries/api-client';
import { limitSetDetailsQuery, membersQuery, projectsQuery, usersQuery } from '../../lib/queries/admin.queries';
import { invitationSchema } from '../../lib/schemas/invitation.schema';
import { withQueryClient } from '../ui/with-query-client';
import { Busy, Button, ErrorNote } from '../ui/parts';
import LimitSetVersionForm from './LimitSetVersionForm';
import { LoadedPart } from '../ui/LoadedPart';
import { criterionLabel } from '../../lib/compare/labels';

// The catalogue brings the cable schema and the derivation code; it sits last on the page, so it
// is fetched after the rest has drawn.
const CableCatalogue = lazy(() => import('./CableCatalogue'));

const box = 'rounded-lg border border-rule bg-panel p-4';

function People() {
  const users = useQuery(usersQuery());
  const queryClient = useQueryClient();
  const { register, handleSubmit, reset, formState: { errors } } = useForm<z.input<typeof invitationSchema>>({ resolver: zodResolver(invitationSchema) });
  const invite = useMutation({
    mutationFn: (v: z.input<typeof invitationSchema>) => api<{ email: string }>('/api/admin/invitations', { method: 'POST', body: v }),
    onSuccess: () => { reset(); return queryClient.invalidateQueries({ queryKey: ['admin', 'users'] }); },
  });
  return (
    <section className={box} aria-labelledby="people">
      <h2 id="people" className="mb-2 text-lg font-semibold">People</h2>
      {users.isPending ? <Busy label="Loading…" /> : (
        <table className="mb-3 w-full text-sm" data-testid="users"><tbody>{users.data?.users.map((u) => <tr key={u.id} className="border-t border-rule"><td className="py-1">{u.name}</td><td>{u.email}</td><td data-testid="user-roles">{[u.isAdmin ? 'administrator' : '', ...u.roles.map((r) => `${r.role} in ${r.projectCode}`)].filter(Boolean).join(', ') || 'no role yet'}</td></tr>)}</tbody></table>
      )}
      <form noValidate onSubmit={handleSubmit((v) => invite.mutate(v))} className="flex flex-wrap items-end gap-2" aria-label="Invite someone">
        <label className="text-sm">E-mail<input aria-label="Invitee e-mail" {...register('email')} className="ml-1 rounded border border-rule px-1" />{errors.email && <span className="block text-xs text-fail">{errors.email.message}</span>}</label>
        <label className="text-sm">Name<input aria-label="Invitee name" {...register('name')} className="ml-1 rounded border border-rule px-1" />{errors.name && <span className="block text-xs text-fail">{errors.name.message}</span>}</label>
        <Button type="submit" disabled={invite.isPending}>Send invitation</Button>
        {invite.isSuccess && <span className="text-sm text-pass" data-testid="invited">Invitation sent to {invite.data.email}; the link works once, for three days.</span>}
      </form>
      <ErrorNote error={invite.error} />
    </section>
  );
}

function Membership() {
  const projects = useQuery(projectsQuery());
  const users = useQuery(usersQuery());
  const [projectId, setProjectId] = useState('');
  const [userId, setUserId] = useState('');
  const [role, setRole] = useState('designer');
  const members = useQuery(membersQuery(projectId));
  const queryClient = useQueryClient();
  const change = useMutation({
    mutationFn: (v: { method: 'POST' | 'DELETE'; userId: string; role: string }) => api(`/api/admin/projects/${projectId}/members`, { method: v.method, body: { userId: v.userId, role: v.role } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['admin', 'members', projectId] }),
  });
  const field = 'ml-1 rounded border border-rule px-1';
  return (
    <section className={box} aria-labelledby="membership">
      <h2 id="membership" className="mb-2 text-lg font-semibold">Project membership</h2>
      <label className="text-sm">Project<select aria-label="Project" className={field} value={projectId} onChange={(e) => setProjectId(e.target.value)}><option value="">choose…</option>{projects.data?.projects.map((p) => <option key={p.id} value={p.id}>{p.code} {p.name}</option>)}</select></label>
      {projectId && (
        <>
          <table className="my-2 w-full text-sm" data-testid="members"><tbody>{members.data?.members.map((m) => <tr key={m.userId + m.role} className="border-t border-rule"><td className="py-1">{m.name}</td><td>{m.role}</td><td><Button tone="danger" onClick={() => change.mutate({ method: 'DELETE', userId: m.userId, role: m.role })}>Remove</Button></td></tr>)}</tbody></table>
          <div className="flex flex-wrap items-end gap-2">
            <label className="text-sm">Person<select aria-label="Person" className={field} value={userId} onChange={(e) => setUserId(e.target.value)}><option value="">choose…</option>{users.data?.users.map((u) => <option key={u.id} value={u.id}>{u.name}</option>)}</select></label>
            <label className="text-sm">Role<select aria-label="Role" className={field} value={role} onChange={(e) => setRole(e.target.value)}>{['designer', 'checker', 'approver', 'auditor'].map((r) => <option key={r}>{r}</option>)}</select></label>
            <Button onClick={() => change.mutate({ method: 'POST', userId, role })} disabled={!userId || change.isPending}>Add to project</Button>
          </div>
          <ErrorNote error={change.error} />
        </>
      )}
    </section>
  );
}

function LimitSets() {
  const sets = useQuery(limitSetDetailsQuery());
  const [editing, setEditing] = useState<string | null>(null);
  return (
    <section className={box} aria-labelledby="limit-sets">
      <h2 id="limit-sets" className="mb-2 text-lg font-semibold">Limit sets</h2>
      <p className="mb-2 text-sm text-ink-soft">Each value carries its source. Publishing makes a new version; revisions keep the version they were checked against. The values are the owner’s to set from their standards and local codes.</p>
      {sets.isPending ? <Busy label="Loading…" /> : sets.error ? <ErrorNote error={sets.error} /> : sets.data.limitSets.map((s) => (
        <div key={s.id} className="mb-3">
          <h3 className="font-semibold">{s.name} <span className="text-sm text-ink-soft">version {s.latest?.version ?? '—'}, check tolerance {s.latest?.checkTolerancePct ?? '—'} %</span></h3>
          <table className="w-full text-sm" data-testid="limits"><tbody>{Object.entries(s.latest?.limits ?? {}).map(([k, l]) => <tr key={k} className="border-t border-rule"><td className="py-1">{criterionLabel(k)}</td><td className="font-mono">{l.value} {l.unit}</td><td className="text-xs">{l.source}</td></tr>)}</tbody></table>
          {editing === s.id
            ? <LimitSetVersionForm limitSetId={s.id} latest={s.latest} onDone={() => setEditing(null)} />
            : <Button tone="plain" onClick={() => setEditing(s.id)}>Publish a new version…</Button>}
        </div>
      ))}
    </section>
  );
}

function AdminPanel() {
  return (
    <div className="grid gap-4">
      <People />
      <Membership />
      <LimitSets />
      <LoadedPart loadingLabel="Loading the cable-type catalogue…">
        <CableCatalogue />
      </LoadedPart>
    </div>
  );
}

export default withQueryClient(AdminPanel);
