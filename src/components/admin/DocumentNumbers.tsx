import { useEffect, useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../lib/queries/api-client';
import { projectsQuery } from '../../lib/queries/admin.queries';
import { withQueryClient } from '../ui/with-query-client';
import { Busy, Button, ErrorNote } from '../ui/parts';

type PatternAnswer = { pattern: string; isDefault: boolean; example: string };

function ProjectPattern({ project }: { project: { id: string; code: string; name: string } }) {
  const key = ['admin', 'document-number', project.id];
  const queryClient = useQueryClient();
  const current = useQuery({ queryKey: key, queryFn: () => api<PatternAnswer>(`/api/admin/projects/${project.id}/document-number`) });
  const [pattern, setPattern] = useState('');
  useEffect(() => { if (current.data) setPattern(current.data.pattern); }, [current.data]);
  const save = useMutation({
    mutationFn: () => api<PatternAnswer>(`/api/admin/projects/${project.id}/document-number`, { method: 'PUT', body: { pattern } }),
    onSuccess: (answer) => queryClient.setQueryData(key, answer),
  });
  if (current.isPending) return <Busy label="Loading…" />;
  return (
    <form className="flex flex-wrap items-end gap-2 border-t border-rule py-2 text-sm" aria-label={`Document number of ${project.code}`} onSubmit={(e) => { e.preventDefault(); save.mutate(); }}>
      <span className="w-40 font-semibold">{project.code} {project.name}</span>
      <label>Pattern<input aria-label={`Pattern for ${project.code}`} value={pattern} onChange={(e) => setPattern(e.target.value)} className="ml-1 w-72 rounded border border-rule px-1 font-mono" /></label>
      <Button type="submit" disabled={save.isPending}>Save</Button>
      <span className="text-ink-soft">e.g. <span className="font-mono">{current.data?.example}</span>{current.data?.isDefault ? ' (the default)' : ''}</span>
      {save.error && <ErrorNote error={save.error} />}
    </form>
  );
}

/** The administrator's setting of each project's document-number pattern for its records. */
function DocumentNumbers() {
  const projects = useQuery(projectsQuery());
  return (
    <section className="rounded-lg border border-rule bg-panel p-4" aria-labelledby="document-numbers">
      <h2 id="document-numbers" className="mb-2 text-lg font-semibold">Record document numbers</h2>
      <p className="mb-2 text-sm text-ink-soft">Placeholders: {'{project}'} project code, {'{study}'} study code, {'{revision}'} revision number, {'{revision:2}'} padded to two digits. The number appears in the record's header, its file name and the audit trail; records already issued keep theirs.</p>
      {projects.isPending ? <Busy label="Loading…" /> : projects.error ? <ErrorNote error={projects.error} /> : projects.data.projects.map((p) => <ProjectPattern key={p.id} project={p} />)}
    </section>
  );
}

export default withQueryClient(DocumentNumbers);
