import { useState } from 'react';
import { useMutation, useQuery } from '@tanstack/react-query';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { api } from '../../lib/queries/api-client';
import { auditFacetsQuery, auditQuery, type AuditFilters, type AuditRow } from '../../lib/queries/audit.queries';
import { withQueryClient } from '../ui/with-query-client';
import { Busy, Button, Empty, ErrorNote, formatDate } from '../ui/parts';
import RecordDownload from '../revision/RecordDownload';
import { detailWords, eventSentence } from '../../lib/records/event-sentences';
import { isoDateOrNull } from '../../lib/format';

/** The list endpoint also names each event's study code, revision number and project code. */
type NamedAuditRow = AuditRow & { studyCode: string | null; revisionNumber: number | null; projectCode: string | null };
/** Filters by study code and revision number ride along in the same query string. */
type Filters = AuditFilters & { studyCode?: string; revisionNumber?: string };

const revisionWords = (r: NamedAuditRow) => (r.revisionNumber != null ? `${r.studyCode ? `${r.studyCode} ` : ''}revision ${r.revisionNumber}` : 'open');

const column = createColumnHelper<NamedAuditRow>();
const columns = [
  column.accessor('id', { header: 'No.' }),
  column.accessor('at', { header: 'When (UTC)', cell: (c) => formatDate(c.getValue()) }),
  column.accessor('actorName', { header: 'Who', cell: (c) => c.getValue() ?? 'the system' }),
  column.accessor('type', { header: 'What', cell: (c) => eventSentence({ type: c.getValue(), actorName: c.row.original.actorName, studyCode: c.row.original.studyCode, revisionNumber: c.row.original.revisionNumber }).replace(/:.*$/, '.') }),
  column.accessor('revisionId', {
    header: 'Revision',
    cell: (c) => (c.getValue() ? <span className="flex items-center gap-2"><a className="text-copper underline" href={`/revisions/${c.getValue()}`}>{revisionWords(c.row.original)}</a>{c.row.original.type === 'record.issued' && <RecordDownload revisionId={c.getValue()!} label="record" />}</span> : '—'),
  }),
  // Detail in words; the stored JSON stays one click away for an auditor who needs it.
  column.accessor('detail', {
    header: 'Detail',
    cell: (c) => (
      <span className="block max-w-md text-xs">
        {detailWords(c.row.original.type, c.getValue()) || '—'}
        <details className="text-ink-soft"><summary className="cursor-pointer">as stored</summary><code className="block whitespace-pre-wrap break-all">{JSON.stringify(c.getValue(), null, 1)}</code></details>
      </span>
    ),
  }),
];

interface ChainReport {
  ok: boolean;
  checked: number;
  firstBroken?: { id: number; reason: string };
  brokenOutsideScope?: true;
}

function ChainResult({ report }: { report: ChainReport }) {
  if (report.ok) return <span className="font-semibold text-pass" data-testid="chain-result">Chain intact: the whole chain links up, and the {report.checked} events you may see match their hashes.</span>;
  return (
    <span className="font-semibold text-fail" data-testid="chain-result">
      {report.firstBroken && <>Broken at event {report.firstBroken.id}: {report.firstBroken.reason}. </>}
      {report.brokenOutsideScope && <>The chain is {report.firstBroken ? 'also ' : ''}broken at an event outside your projects, which may hide a removed event of yours; an administrator can locate it.</>}
    </span>
  );
}

function AuditBrowser() {
  const [filters, setFilters] = useState<Filters>({});
  const [dateText, setDateText] = useState({ from: '', to: '' });
  const [pagination, setPagination] = useState({ pageIndex: 0, pageSize: 20 });
  const facets = useQuery(auditFacetsQuery());
  const { data, isPending, error } = useQuery(auditQuery(filters, pagination.pageIndex, pagination.pageSize));
  const verify = useMutation({ mutationFn: () => api<ChainReport>('/api/audit/verify') });
  const table = useReactTable({ data: (data?.events ?? []) as NamedAuditRow[], columns, getCoreRowModel: getCoreRowModel(), manualPagination: true, rowCount: data?.total ?? 0, state: { pagination }, onPaginationChange: setPagination });
  const set = (k: keyof Filters, v: string) => {
    setFilters((f) => ({ ...f, [k]: v || undefined }));
    setPagination((p) => ({ ...p, pageIndex: 0 }));
  };
  const exportHref = `/api/audit/export?${new URLSearchParams(Object.entries(filters).filter(([, v]) => v) as Array<[string, string]>)}`;
  const field = 'ml-1 rounded border border-rule bg-panel px-1 py-0.5';

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-3 rounded border border-rule bg-panel p-3">
        <Button onClick={() => verify.mutate()} disabled={verify.isPending}>{verify.isPending ? 'Verifying…' : 'Verify the chain'}</Button>
        {verify.data && <ChainResult report={verify.data} />}
        <a className="ml-auto text-sm text-copper underline" href={exportHref}>Export these events as CSV</a>
      </div>
      <div className="flex flex-wrap gap-3 text-sm">
        <label>What<select aria-label="Event type" className={field} onChange={(e) => set('type', e.target.value)}><option value="">any</option>{facets.data?.types.map((t) => <option key={t} value={t}>{eventSentence({ type: t, actorName: 'someone', revisionNumber: null }).replace(/^someone /, '').replace(/[.:].*$/, '')}</option>)}</select></label>
        <label>Who<select aria-label="Person" className={field} onChange={(e) => set('actorId', e.target.value)}><option value="">anyone</option>{facets.data?.people.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}</select></label>
        <label>Study code<input aria-label="Study code" className={`${field} w-20`} onChange={(e) => set('studyCode', e.target.value.trim())} /></label>
        <label>Revision<input aria-label="Revision number or id" placeholder="number or id" className={`${field} w-28`} onChange={(e) => { const v = e.target.value.trim(); set('revisionNumber', /^\d+$/.test(v) ? v : ''); set('revisionId', /^\d+$/.test(v) ? '' : v); }} /></label>
        {/* Typed as ISO text: a native date picker shows the browser's locale format. */}
        {(['from', 'to'] as const).map((k) => {
          const text = dateText[k];
          const bad = text !== '' && !isoDateOrNull(text);
          return (
            <label key={k}>{k === 'from' ? 'From' : 'To'}
              <input aria-label={k === 'from' ? 'From date' : 'To date'} placeholder="yyyy-mm-dd" pattern="\d{4}-\d{2}-\d{2}" inputMode="numeric" className={`${field} w-28 font-mono`} aria-invalid={bad} value={text}
                onChange={(e) => {
                  const v = e.target.value.trim();
                  setDateText((d) => ({ ...d, [k]: v }));
                  const iso = isoDateOrNull(v);
                  if (v === '' || iso) set(k, iso ? (k === 'to' ? `${iso}T23:59:59.999Z` : `${iso}T00:00:00Z`) : '');
                }} />
              {bad && <span className="ml-1 text-xs text-fail">use yyyy-mm-dd</span>}
            </label>
          );
        })}
      </div>
      {error ? <ErrorNote error={error} /> : isPending ? <Busy label="Loading events…" /> : data.total === 0 ? <Empty>No event matches these filters.</Empty> : (
        <>
          <table className="w-full rounded border border-rule bg-panel text-sm" data-testid="audit-table">
            <thead className="bg-copper-light text-left">{table.getHeaderGroups().map((g) => <tr key={g.id}>{g.headers.map((h) => <th key={h.id} className="px-2 py-1">{flexRender(h.column.columnDef.header, h.getContext())}</th>)}</tr>)}</thead>
            <tbody>{table.getRowModel().rows.map((r) => <tr key={r.id} className="border-t border-rule">{r.getVisibleCells().map((c) => <td key={c.id} className="px-2 py-1">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}</tr>)}</tbody>
          </table>
          <div className="flex items-center gap-2 text-sm">
            <Button tone="plain" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>Previous</Button>
            <span>Page {pagination.pageIndex + 1} of {table.getPageCount()} ({data.total} events)</span>
            <Button tone="plain" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>Next</Button>
          </div>
        </>
      )}
    </div>
  );
}

export default withQueryClient(AuditBrowser);
