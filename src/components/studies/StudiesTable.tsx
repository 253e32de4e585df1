import { lazy, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { PageBar, SortableHead, useServerList } from '../ui/paged-table';
import { studiesQuery, type StudyListParams, type StudyRow } from '../../lib/queries/studies.queries';
import { withQueryClient } from '../ui/with-query-client';
import { Busy, Button, Empty, ErrorNote, StateBadge, formatDate } from '../ui/parts';
import { STATE_LABEL } from '../ui/states';
import { LoadedPart } from '../ui/LoadedPart';
import { formatMarginPct } from '../../lib/format';

// The form (with zod and react-hook-form) is fetched when someone starts a study, not with the list.
const NewStudyForm = lazy(() => import('./NewStudyForm'));

const PAGE_SIZE = 10;
const column = createColumnHelper<StudyRow>();
const columns = [
  column.accessor('code', { header: 'Code', cell: (c) => <a className="font-semibold text-copper hover:underline" href={`/revisions/${c.row.original.revisionId}`}>{c.getValue()}</a> }),
  column.accessor('title', { header: 'Title' }),
  column.accessor('kind', { header: 'Kind', enableSorting: false, cell: (c) => (c.getValue() === 'bonding' ? 'Cable bonding' : 'Metalwork exposure') }),
  column.accessor('revisionNumber', { header: 'Rev', enableSorting: false }),
  column.accessor('state', { header: 'Stage', enableSorting: false, cell: (c) => <StateBadge state={c.getValue()} /> }),
  column.accessor('worstMarginPct', { header: 'Worst margin', enableSorting: false, cell: (c) => { const v = c.getValue(); return v === null ? '—' : <span className={v < 0 ? 'font-semibold text-fail' : 'text-pass'}>{formatMarginPct(v)}</span>; } }),
  column.accessor('openRemarks', { header: 'Open remarks', enableSorting: false }),
  column.accessor('updatedAt', { id: 'updated', header: 'Last change', cell: (c) => formatDate(c.getValue()) }),
];

function StudiesTable({ projectId, canCreate }: { projectId: string; canCreate: boolean }) {
  const { sorting, onSortingChange, filters, setFilter, pages, sort, direction } = useServerList<{ state?: string; kind?: string; search?: string }>('code');
  const [creating, setCreating] = useState(false);
  const params: StudyListParams = {
    after: pages.after,
    pageSize: PAGE_SIZE,
    sort: sort as StudyListParams['sort'],
    direction,
    ...filters,
  };
  const { data, isPending, isFetching, error } = useQuery(studiesQuery(projectId, params));
  const table = useReactTable({
    data: data?.rows ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    // The server always sorts by something: a third click turns the order round, never off.
    enableSortingRemoval: false,
    state: { sorting },
    onSortingChange,
  });

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="text-sm">
          Find
          <input aria-label="Find by code or title" className="ml-2 rounded border border-rule bg-panel px-2 py-1" placeholder="code or title" onChange={(e) => setFilter('search', e.target.value)} />
        </label>
        <label className="text-sm">
          Stage
          <select aria-label="Stage" className="ml-2 rounded border border-rule bg-panel px-2 py-1" onChange={(e) => setFilter('state', e.target.value)}>
            <option value="">any</option>
            {Object.entries(STATE_LABEL).map(([k, v]) => <option key={k} value={k}>{v}</option>)}
          </select>
        </label>
        <label className="text-sm">
          Kind
          <select aria-label="Kind" className="ml-2 rounded border border-rule bg-panel px-2 py-1" onChange={(e) => setFilter('kind', e.target.value)}>
            <option value="">any</option>
            <option value="bonding">Cable bonding</option>
            <option value="exposure">Metalwork exposure</option>
          </select>
        </label>
        {isFetching && !isPending && <Busy label="Updating…" />}
        {canCreate && <Button className="ml-auto" onClick={() => setCreating((c) => !c)}>{creating ? 'Close' : 'New study'}</Button>}
      </div>
      {creating && (
        <LoadedPart loadingLabel="Loading the new-study form…">
          <NewStudyForm projectId={projectId} />
        </LoadedPart>
      )}
      {error ? <ErrorNote error={error} /> : isPending ? <Busy label="Loading studies…" /> : data.total === 0 ? (
        <Empty>No study matches. {canCreate ? 'Start one with "New study".' : ''}</Empty>
      ) : (
        <table className="w-full rounded-lg border border-rule bg-panel text-sm" data-testid="studies-table">
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} className="border-t border-rule">
                {r.getVisibleCells().map((c) => <td key={c.id} className="px-3 py-2">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {data && data.total > 0 && (
        <PageBar pages={pages} total={data.total} noun="studies" next={data.next} pageCount={Math.max(1, Math.ceil(data.total / PAGE_SIZE))} busy={isFetching} />
      )}
    </div>
  );
}

export default withQueryClient(StudiesTable);
