import { useState } from 'react';
import { flexRender, type OnChangeFn, type SortingState, type Table } from '@tanstack/react-table';
import { Button } from './parts';

/**
 * Keyset pages as a stack of positions: the first page starts at nothing, each later one after
 * the last row of the page before it (the `next` the server gave), so "Previous" walks back
 * through positions already seen.
 */
export function useKeysetPages() {
  const [positions, setPositions] = useState<Array<string | undefined>>([undefined]);
  return {
    after: positions[positions.length - 1],
    page: positions.length,
    reset: () => setPositions([undefined]),
    next: (position: string | null | undefined) => {
      if (position) setPositions((p) => [...p, position]);
    },
    previous: () => setPositions((p) => (p.length > 1 ? p.slice(0, -1) : p)),
  };
}

/**
 * What a server-sorted, filtered, keyset-paged table keeps: its sort, its filters and its page
 * positions. A new sort or filter starts again from the first page.
 */
export function useServerList<F extends Record<string, string | undefined>>(initialSort: string) {
  const [sorting, setSorting] = useState<SortingState>([{ id: initialSort, desc: false }]);
  const [filters, setFilters] = useState<F>({} as F);
  const pages = useKeysetPages();
  const onSortingChange: OnChangeFn<SortingState> = (s) => {
    setSorting(s);
    pages.reset();
  };
  return {
    sorting,
    onSortingChange,
    filters,
    pages,
    sort: sorting[0]?.id ?? initialSort,
    direction: (sorting[0]?.desc ? 'desc' : 'asc') as 'asc' | 'desc',
    setFilter: (key: keyof F, value: string) => {
      setFilters((f) => ({ ...f, [key]: value || undefined }));
      pages.reset();
    },
  };
}

/** The header of a server-sorted table: a sortable column's title is a button showing its direction. */
export function SortableHead<T>({ table }: { table: Table<T> }) {
  return (
    <thead className="bg-copper-light text-left">
      {table.getHeaderGroups().map((g) => (
        <tr key={g.id}>
          {g.headers.map((h) => (
            <th key={h.id} className="px-3 py-2">
              {h.column.getCanSort() ? (
                <button type="button" className="font-semibold" onClick={h.column.getToggleSortingHandler()}>
                  {flexRender(h.column.columnDef.header, h.getContext())} {({ asc: '▲', desc: '▼' } as Record<string, string>)[h.column.getIsSorted() as string] ?? ''}
                </button>
              ) : flexRender(h.column.columnDef.header, h.getContext())}
            </th>
          ))}
        </tr>
      ))}
    </thead>
  );
}

/** Previous / Next under a keyset-paged table, with where the reader is and how many there are. */
export function PageBar({ pages, total, noun, next, pageCount, busy = false }: { pages: ReturnType<typeof useKeysetPages>; total: number; noun: string; next: string | null | undefined; pageCount?: number; busy?: boolean }) {
  return (
    <div className="flex items-center gap-2 text-sm">
      <Button tone="plain" onClick={pages.previous} disabled={pages.page < 2}>Previous</Button>
      <span>Page {pages.page}{pageCount ? ` of ${pageCount}` : ''} ({total} {noun})</span>
      <Button tone="plain" onClick={() => pages.next(next)} disabled={!next || busy}>Next</Button>
    </div>
  );
}
