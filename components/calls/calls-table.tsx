'use client';

import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type FilterFn,
  type SortingState,
} from '@tanstack/react-table';
import clsx from 'clsx';
import Link from 'next/link';
import { useId, useMemo, useState } from 'react';
import { CallStatusBadge } from '@/components/calls/call-status';
import { formatDate, formatRelative, STATUS_LABELS } from '@/components/calls/format';
import { useTimeZone } from '@/components/ui/time-zone';
import { Select, TextInput } from '@/components/ui/field';
import { useCalls, type CallFilter, type CallRow } from '@/lib/swr/use-calls';
import { CALL_STATUSES, type CallStatus } from '@/lib/validations/field';

export interface Assignee {
  id: string;
  name: string;
}

interface Props {
  /** Server-rendered rows for `initialFilter`, so the first paint needs no fetch. */
  initialCalls?: CallRow[];
  initialFilter?: CallFilter;
  /** Leads and admins filter by technician; technicians choose between theirs and all they can see. */
  technicianChoice: 'everyone' | 'mine-or-visible' | 'none';
  assignees?: Assignee[];
}

const column = createColumnHelper<CallRow>();

/** Search across the site, the unit and the complaint. */
const searchFilter: FilterFn<CallRow> = (row, _columnId, value: string) => {
  const needle = value.trim().toLowerCase();
  if (!needle) return true;
  const c = row.original;
  return [c.siteName, c.unitLabel, c.complaint, c.siteAddress].some((text) => text.toLowerCase().includes(needle));
};

const SORT_LABELS: Record<string, string> = {
  openedAt: 'Opened',
  site: 'Site / unit',
  complaint: 'Complaint',
  technician: 'Technician',
  status: 'Status',
};

export function CallsTable({ initialCalls, initialFilter = {}, technicianChoice, assignees = [] }: Props) {
  const [status, setStatus] = useState<CallStatus | ''>(initialFilter.status ?? '');
  const [technician, setTechnician] = useState<string>(initialFilter.technician ?? '');
  const [search, setSearch] = useState('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'openedAt', desc: true }]);
  const filter: CallFilter = { status: status || undefined, technician: technician || undefined };
  const isInitial = filter.status === initialFilter.status && filter.technician === initialFilter.technician;
  const { data, error, isLoading, isValidating, mutate } = useCalls(filter, { fallbackData: isInitial ? initialCalls : undefined });
  const searchId = useId();

  const columns = useMemo(
    () => [
      column.accessor((c) => new Date(c.openedAt).getTime(), {
        id: 'openedAt',
        header: 'Opened',
        cell: ({ row }) => <Opened at={row.original.openedAt} />,
      }),
      column.accessor((c) => `${c.siteName} ${c.unitLabel}`, {
        id: 'site',
        header: 'Site / unit',
        cell: ({ row }) => (
          <Link
            href={`/calls/${row.original.id}`}
            className="flex min-h-touch flex-col justify-center font-semibold underline decoration-copper decoration-2 underline-offset-4"
          >
            {row.original.siteName}
            <span className="block font-normal text-muted">{row.original.unitLabel}</span>
          </Link>
        ),
      }),
      column.accessor('complaint', { header: 'Complaint', cell: (info) => <span className="line-clamp-3">{info.getValue()}</span> }),
      column.accessor((c) => c.technicianName ?? '', {
        id: 'technician',
        header: 'Technician',
        cell: ({ row }) => row.original.technicianName ?? <span className="text-muted">Unassigned</span>,
      }),
      column.accessor((c) => CALL_STATUSES.indexOf(c.status), {
        id: 'status',
        header: 'Status',
        cell: ({ row }) => <CallStatusBadge status={row.original.status} />,
      }),
    ],
    [],
  );

  // TanStack Table v8 hands back a stateful table object by design; the app does not run React Compiler.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: data ?? [],
    columns,
    state: { sorting, globalFilter: search },
    onSortingChange: setSorting,
    onGlobalFilterChange: setSearch,
    globalFilterFn: searchFilter,
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const rows = table.getRowModel().rows;
  const filtered = Boolean(search.trim() || status || (technician && technicianChoice === 'everyone'));
  const count = rows.length;

  return (
    <div className="space-y-4">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr]" role="search">
        <div>
          <label htmlFor={searchId} className="label">
            Search
          </label>
          <TextInput
            id={searchId}
            type="search"
            placeholder="Site, unit or complaint"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
          />
        </div>
        <div>
          <label htmlFor={`${searchId}-status`} className="label">
            Status
          </label>
          <Select id={`${searchId}-status`} value={status} onChange={(e) => setStatus(e.target.value as CallStatus | '')}>
            <option value="">Any status</option>
            {CALL_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s]}
              </option>
            ))}
          </Select>
        </div>
        {technicianChoice !== 'none' && (
          <div>
            <label htmlFor={`${searchId}-tech`} className="label">
              Technician
            </label>
            <Select id={`${searchId}-tech`} value={technician} onChange={(e) => setTechnician(e.target.value)}>
              <option value="">{technicianChoice === 'everyone' ? 'Everyone' : 'Mine and my apprentices’'}</option>
              <option value="me">Mine</option>
              {technicianChoice === 'everyone' &&
                assignees.map((a) => (
                  <option key={a.id} value={a.id}>
                    {a.name}
                  </option>
                ))}
            </Select>
          </div>
        )}
      </div>

      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm text-muted" aria-live="polite" role="status">
          {data ? `${count} ${count === 1 ? 'call' : 'calls'}${filtered ? ' match' : ''}` : ''}
          {isValidating && data ? ' · refreshing…' : ''}
        </p>
        <label className="flex items-center gap-2 text-sm xl:hidden">
          <span className="font-semibold">Sort by</span>
          <Select
            className="w-auto"
            value={`${sorting[0]?.id ?? 'openedAt'}:${sorting[0]?.desc ? 'desc' : 'asc'}`}
            onChange={(e) => {
              const [id, dir] = e.target.value.split(':');
              setSorting([{ id, desc: dir === 'desc' }]);
            }}
          >
            {Object.entries(SORT_LABELS).flatMap(([id, label]) => [
              <option key={`${id}:desc`} value={`${id}:desc`}>
                {label} {id === 'openedAt' ? '(newest first)' : '(Z–A)'}
              </option>,
              <option key={`${id}:asc`} value={`${id}:asc`}>
                {label} {id === 'openedAt' ? '(oldest first)' : '(A–Z)'}
              </option>,
            ])}
          </Select>
        </label>
      </div>

      {error && (
        <div role="alert" className="card flex flex-wrap items-center justify-between gap-3 border-2 border-ink">
          <p className="font-semibold">
            <span aria-hidden>⚠ </span>The calls could not be loaded: {error.message}
          </p>
          <button type="button" className="btn-secondary" onClick={() => mutate()}>
            Retry
          </button>
        </div>
      )}
      {!data && isLoading && (
        <p role="status" className="card text-muted">
          Loading calls…
        </p>
      )}
      {data && data.length === 0 && !filtered && (
        <div className="card space-y-3 text-center">
          <p className="text-lg font-semibold">No calls yet — start one</p>
          <Link href="/calls/new" className="btn-primary">
            New call
          </Link>
        </div>
      )}
      {data && count === 0 && (data.length > 0 || filtered) && <p className="card text-muted">No calls match the search and filters.</p>}

      {count > 0 && (
        <>
          <table className="hidden w-full table-fixed border-separate border-spacing-0 overflow-hidden rounded-xl border border-line bg-raised text-left xl:table">
            <caption className="sr-only">Service calls, sortable by column</caption>
            <colgroup>
              <col className="w-[8.5rem]" />
              <col className="w-[24%]" />
              <col />
              <col className="w-[9rem]" />
              <col className="w-[9rem]" />
            </colgroup>
            <thead className="text-sm">
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const sorted = header.column.getIsSorted();
                    return (
                      <th
                        key={header.id}
                        scope="col"
                        aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                        className="border-b border-line bg-sunken p-0"
                      >
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="flex min-h-touch w-full items-center gap-1 px-3 text-left font-semibold hover:bg-surface"
                        >
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          <span aria-hidden className="font-mono text-muted">
                            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                          </span>
                        </button>
                      </th>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody>
              {rows.map((row) => (
                <tr key={row.id}>
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="break-words border-b border-line px-3 py-3 align-top">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>

          <ul className="grid gap-3 md:grid-cols-2 xl:hidden" aria-label="Service calls">
            {rows.map(({ original: c }) => (
              <li key={c.id}>
                <Link href={`/calls/${c.id}`} className={clsx('card flex h-full flex-col gap-2 p-4 hover:border-copper')}>
                  <span className="flex items-start justify-between gap-2">
                    <span className="font-bold">
                      {c.siteName}
                      <span className="block font-normal text-muted">{c.unitLabel}</span>
                    </span>
                    <CallStatusBadge status={c.status} />
                  </span>
                  <span className="line-clamp-3">{c.complaint}</span>
                  <span className="mt-auto flex flex-wrap justify-between gap-2 text-sm text-muted">
                    <Opened at={c.openedAt} />
                    <span>{c.technicianName ?? 'Unassigned'}</span>
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        </>
      )}
    </div>
  );
}

function Opened({ at }: { at: string }) {
  const timeZone = useTimeZone();
  return (
    <time dateTime={at} className="block">
      {/* "5 minutes ago" moves on between the server's render and the browser's. */}
      <span className="block font-semibold" suppressHydrationWarning>
        {formatRelative(at, timeZone)}
      </span>
      <span className="block text-sm text-muted">{formatDate(at, timeZone)}</span>
    </time>
  );
}
