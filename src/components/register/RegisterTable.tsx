import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { PageBar, SortableHead, useServerList } from '../ui/paged-table';
import { registerCsvHref, registerQuery, type RegisterParams, type RegisterRow } from '../../lib/queries/register.queries';
import { formatMarginPct } from '../../lib/format';
import { withQueryClient } from '../ui/with-query-client';
import { Busy, Button, Empty, ErrorNote } from '../ui/parts';
import { STATUSES, StatusBadge } from './status-words';
import AssetPanel from './AssetPanel';
import NewAssetForm from './NewAssetForm';
import StatusChart from './StatusChart';

const column = createColumnHelper<RegisterRow>();
const columns = [
  column.accessor('projectCode', { header: 'Project', enableSorting: false }),
  column.accessor('code', { header: 'Asset' }),
  column.accessor('name', { header: 'Name' }),
  column.accessor('kind', { header: 'Kind', enableSorting: false }),
  column.accessor('status', { header: 'Status', cell: (c) => <StatusBadge status={c.getValue()} /> }),
  column.accessor('issued', { header: 'Issued revisions', enableSorting: false, cell: (c) => c.getValue() || '—' }),
  column.accessor('worstMarginPct', { id: 'margin', header: 'Worst margin', cell: (c) => { const v = c.getValue(); return v === null ? '—' : <span className={v < 0 ? 'font-semibold text-fail' : ''}>{formatMarginPct(v)}</span>; } }),
  column.accessor('openRemarks', { header: 'Open remarks', enableSorting: false }),
  column.display({ id: 'obligations', header: 'Done / due / overdue', cell: (c) => `${c.row.original.done} / ${c.row.original.dueSoon} / ${c.row.original.overdue}` }),
  column.accessor('nextDueOn', { id: 'nextDue', header: 'Next due', cell: (c) => c.getValue() ?? '—' }),
];

/**
 * The register: one row per asset, sorted, filtered and paged on the server. Pages are keyset
 * pages, so "Previous" walks back through the positions already seen.
 */
function RegisterTable({ projectId, roles, initialAsset }: { projectId?: string; roles: Record<string, string[]>; initialAsset?: string }) {
  const canAdd = !!projectId && (roles[projectId] ?? []).some((r) => r === 'designer' || r === 'approver');
  const { sorting, onSortingChange, filters, setFilter, pages, sort, direction } = useServerList<{ status?: string; kind?: string; search?: string }>('code');
  const [selected, setSelected] = useState<string | undefined>(initialAsset);
  const [adding, setAdding] = useState(false);
  const base = { projectId, sort: sort as RegisterParams['sort'], direction, ...filters } as const;
  const params: RegisterParams = { ...base, pageSize: 25, after: pages.after };
  const { data, isPending, isFetching, error } = useQuery(registerQuery(params));
  const table = useReactTable({
    data: data?.rows ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    // The server always sorts by something: a third click turns the order round, never off.
    enableSortingRemoval: false,
    state: { sorting, columnVisibility: { projectCode: !projectId } },
    onSortingChange,
  });

  return (
    <div className="space-y-4">
      <StatusChart projectId={projectId} />
      <div className="flex flex-wrap items-end gap-3">
        <label className="text-sm">
          Find
          <input aria-label="Find by asset code or name" className="ml-2 rounded border border-rule bg-panel px-2 py-1" placeholder="code or name" onChange={(e) => setFilter('search', e.target.value)} />
        </label>
        <label className="text-sm">
          Status
          <select aria-label="Status" className="ml-2 rounded border border-rule bg-panel px-2 py-1" onChange={(e) => setFilter('status', e.target.value)}>
            <option value="">any</option>
            {STATUSES.map((s) => <option key={s} value={s}>{s}</option>)}
          </select>
        </label>
        <label className="text-sm">
          Kind
          <select aria-label="Kind" className="ml-2 rounded border border-rule bg-panel px-2 py-1" onChange={(e) => setFilter('kind', e.target.value)}>
            <option value="">any</option>
            <option value="circuit">circuits</option>
            <option value="site">sites</option>
          </select>
        </label>
        {isFetching && !isPending && <Busy label="Updating…" />}
        <a className="ml-auto text-sm font-semibold text-copper hover:underline" href={registerCsvHref(base)} download>Export CSV</a>
        {canAdd && projectId && <Button onClick={() => setAdding((a) => !a)}>{adding ? 'Close' : 'New asset'}</Button>}
      </div>
      {adding && projectId && <NewAssetForm projectId={projectId} onCreated={(id) => { setAdding(false); setSelected(id); }} />}
      {error ? <ErrorNote error={error} /> : isPending ? <Busy label="Loading the register…" /> : data.total === 0 ? (
        <Empty>No asset matches.{canAdd && projectId ? ' Add one with "New asset".' : ''}</Empty>
      ) : (
        <table className="w-full rounded-lg border border-rule bg-panel text-sm" data-testid="register-table">
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} data-asset={r.original.code} className={`cursor-pointer border-t border-rule hover:bg-copper-light/40 ${selected === r.original.id ? 'bg-copper-light/60' : ''}`} onClick={() => setSelected(r.original.id)}>
                {r.getVisibleCells().map((c) => <td key={c.id} className="px-3 py-2">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {data && data.total > 0 && (
        <PageBar pages={pages} total={data.total} noun="assets" next={data.next} />
      )}
      {selected && <AssetPanel assetId={selected} roles={roles} onClose={() => setSelected(undefined)} />}
    </div>
  );
}

export default withQueryClient(RegisterTable);
