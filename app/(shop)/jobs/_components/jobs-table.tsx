'use client';
/**
 * The jobs list: what needs the member's role first, then quick filters and search kept in the URL, sortable
 * columns and pages of 20; on a phone each job is a card with its status and date.
 */
import { useShopSettings } from '@/components/shop/shop-settings-context';
import { formatWhen } from '@/domain/time';
import { type ColumnDef, flexRender, getCoreRowModel, getPaginationRowModel, getSortedRowModel, type SortingState, useReactTable } from '@tanstack/react-table';
import Link from 'next/link';
import { usePathname, useRouter, useSearchParams } from 'next/navigation';
import { useEffect, useMemo, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Input, Notice } from '@/components/ui/field';
import { JOB_STATUS_LABEL } from '@/components/data/jobs/status';
import { JOB_STATUSES, type JobStatus } from '@/domain/job';
import { jobNeeds } from '@/domain/job-queue';
import type { JobRow } from '@/components/data/jobs/types';
import { useJobs } from '@/components/data/jobs/use-jobs';
import { vehicleTitle } from '@/domain/vehicle';

const FILTERS = [{ value: 'all', label: 'All' }, ...JOB_STATUSES.map((value) => ({ value, label: JOB_STATUS_LABEL[value] }))];



const columns: ColumnDef<JobRow>[] = [
  {
    accessorKey: 'repairOrder',
    header: 'Repair order',
    cell: (c) => (
      <Link className="figures font-bold text-brand underline" href={`/jobs/${c.row.original.id}`}>
        {c.row.original.repairOrder}
      </Link>
    ),
  },
  {
    id: 'vehicle',
    header: 'Vehicle',
    accessorFn: (r) => vehicleTitle(r.vehicle),
    cell: (c) => (
      <div>
        <div className="font-bold">{vehicleTitle(c.row.original.vehicle)}</div>
        <div className="figures text-sm text-muted">{c.row.original.vehicle.vin ?? 'no VIN'}</div>
      </div>
    ),
  },
  { accessorKey: 'concern', header: 'Concern', cell: (c) => <span className="line-clamp-2">{c.row.original.concern}</span> },
  { accessorKey: 'status', header: 'Status', cell: (c) => <StatusBadge status={c.row.original.status} /> },
  {
    accessorKey: 'updatedAt',
    header: 'Updated',
    cell: (c) => <UpdatedAt at={c.row.original.updatedAt} />,
  },
];

function StatusBadge({ status }: { status: JobStatus }) {
  return <span className="rounded-md bg-raised px-2 py-1 text-sm font-bold">{JOB_STATUS_LABEL[status] ?? status}</span>;
}

/** The jobs that need this role now, each with what it needs, newest first. */
function NeedsYou({ rows, role }: { rows: JobRow[]; role: string }) {
  const waiting = rows.map((r) => ({ r, need: jobNeeds(r, role) })).filter((x): x is { r: JobRow; need: string } => x.need !== null);
  if (!waiting.length) return null;
  return (
    <section aria-labelledby="needs-you" className="rounded-xl border-2 border-brand bg-surface p-3" data-testid="needs-you">
      <h2 id="needs-you" className="text-lg font-bold">
        Needs you ({waiting.length})
      </h2>
      <ul className="mt-1 flex flex-col gap-1">
        {waiting.slice(0, 10).map(({ r, need }) => (
          <li key={r.id} className="flex flex-wrap items-baseline gap-x-2">
            {/* The link is named by what is needed (the repair order describes it), so the table's link stays the one named by the repair order. */}
            <span id={`needs-${r.id}`} className="figures font-bold">
              {r.repairOrder}
            </span>
            <span>{vehicleTitle(r.vehicle)}</span>
            <Link className="font-bold text-brand underline" href={`/jobs/${r.id}`} aria-describedby={`needs-${r.id}`}>
              {need}
            </Link>
          </li>
        ))}
      </ul>
    </section>
  );
}

/** On a phone: a card per job with its status and date, instead of columns. */
function JobCards({ rows }: { rows: JobRow[] }) {
  return (
    <ul className="flex flex-col gap-2 md:hidden" data-testid="job-cards">
      {rows.map((r) => (
        <li key={r.id} className="rounded-xl border border-line bg-surface p-3">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <Link className="figures font-bold text-brand underline" href={`/jobs/${r.id}`}>
              {r.repairOrder}
            </Link>
            <StatusBadge status={r.status} />
          </div>
          <div className="font-bold">{vehicleTitle(r.vehicle)}</div>
          <p className="line-clamp-2">{r.concern}</p>
          <UpdatedAt at={r.updatedAt} />
        </li>
      ))}
    </ul>
  );
}

/** In the shop's time zone, with the zone named, as on every page. */
function UpdatedAt({ at }: { at: string }) {
  const { timeZone } = useShopSettings();
  return <span className="figures text-sm">{formatWhen(at, timeZone)}</span>;
}

export function JobsTable({ role }: { role: string }) {
  const params = useSearchParams();
  const router = useRouter();
  const path = usePathname();
  const status = params.get('status') ?? 'all';
  const q = params.get('q') ?? '';
  const [search, setSearch] = useState(q);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'updatedAt', desc: true }]);

  // Search is kept in the URL, a moment after typing stops.
  useEffect(() => {
    if (search === q) return;
    const t = setTimeout(() => setParam('q', search), 300);
    return () => clearTimeout(t);
  }, [search]);

  function setParam(key: string, value: string) {
    const next = new URLSearchParams(params);
    if (value && value !== 'all') next.set(key, value);
    else next.delete(key);
    router.replace(`${path}?${next}`, { scroll: false });
  }

  const query = useJobs({ q: q || undefined, status });
  const data = useMemo(() => query.data ?? [], [query.data]);
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageSize: 20 } },
  });

  return (
    <div className="flex flex-col gap-3">
      <NeedsYou rows={data} role={role} />
      <div className="flex flex-wrap items-center gap-2">
        <div role="group" aria-label="Status" className="flex flex-wrap gap-1">
          {FILTERS.map((f) => (
            <button
              key={f.value}
              type="button"
              aria-pressed={status === f.value}
              onClick={() => setParam('status', f.value)}
              className={`min-h-touch rounded-lg border px-3 font-bold ${status === f.value ? 'border-brand bg-brand text-brand-ink' : 'border-line bg-surface hover:bg-raised'}`}
            >
              {f.label}
            </button>
          ))}
        </div>
        <label className="ml-auto flex min-w-64 flex-1 items-center gap-2 md:max-w-sm">
          <span className="sr-only">Search</span>
          <Input type="search" placeholder="Search repair order, VIN or concern" value={search} onChange={(e) => setSearch(e.target.value)} />
        </label>
      </div>
      {query.isError && <Notice tone="error">{(query.error as Error).message}</Notice>}
      <JobCards rows={table.getRowModel().rows.map((r) => r.original)} />
      <div className="hidden overflow-x-auto rounded-xl border border-line bg-surface md:block">
        <table className="w-full text-left">
          <thead className="bg-raised">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => (
                  <th key={h.id} scope="col" className="p-0" aria-sort={h.column.getIsSorted() === 'asc' ? 'ascending' : h.column.getIsSorted() === 'desc' ? 'descending' : 'none'}>
                    <button type="button" onClick={h.column.getToggleSortingHandler()} className="min-h-touch w-full px-3 text-left font-bold">
                      {flexRender(h.column.columnDef.header, h.getContext())}
                      <span aria-hidden="true"> {h.column.getIsSorted() === 'asc' ? '▲' : h.column.getIsSorted() === 'desc' ? '▼' : ''}</span>
                    </button>
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} className="border-t border-line align-top">
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="px-3 py-3">
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {!query.isPending && data.length === 0 && (
        <p className="p-6 text-center text-muted">{q || status !== 'all' ? 'No job matches; clear the search or pick another status.' : 'No jobs yet. Start one with "New job".'}</p>
      )}
      {query.isPending && <p className="p-6 text-center text-muted">Loading jobs…</p>}
      {table.getPageCount() > 1 && (
        <div className="flex items-center justify-end gap-2">
          <Button variant="secondary" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
            Previous
          </Button>
          <span className="figures">
            Page {table.getState().pagination.pageIndex + 1} of {table.getPageCount()}
          </span>
          <Button variant="secondary" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
            Next
          </Button>
        </div>
      )}
    </div>
  );
}
