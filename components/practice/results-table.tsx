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
import Link from 'next/link';
import { useId, useMemo, useState } from 'react';
import { Select, TextInput } from '@/components/ui/field';
import { Time } from '@/components/ui/time-zone';
import type { AttemptRow } from '@/lib/validations/practice';

const column = createColumnHelper<AttemptRow>();

const searchFilter: FilterFn<AttemptRow> = (row, _id, value: string) => {
  const needle = value.trim().toLowerCase();
  if (!needle) return true;
  const r = row.original;
  return [r.apprenticeName, r.scenarioTitle, r.faultTitle, r.findingTitle ?? ''].some((t) => t.toLowerCase().includes(needle));
};

function duration(seconds: number | null) {
  if (seconds === null) return '—';
  const s = Math.round(seconds);
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

type Outcome = '' | 'right' | 'wrong' | 'running';

/** Attempts, sortable by any column and filtered by a search and by outcome; each opens its full path. */
export function ResultsTable({ rows, hide = [] }: { rows: readonly AttemptRow[]; hide?: ('apprentice' | 'scenario')[] }) {
  const [search, setSearch] = useState('');
  const [outcome, setOutcome] = useState<Outcome>('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'startedAt', desc: true }]);
  const id = useId();

  const data = useMemo(
    () =>
      rows.filter((r) =>
        outcome === '' ? true : outcome === 'running' ? r.finishedAt === null : outcome === 'right' ? r.right === true : r.right === false,
      ),
    [rows, outcome],
  );

  const columns = useMemo(
    () =>
      [
        column.accessor((r) => new Date(r.startedAt).getTime(), {
          id: 'startedAt',
          header: 'Started',
          cell: ({ row }) => (
            <Link
              href={`/practice/attempts/${row.original.id}`}
              className="flex min-h-touch items-center font-semibold underline decoration-copper decoration-2 underline-offset-4"
            >
              <Time value={row.original.startedAt} />
            </Link>
          ),
        }),
        hide.includes('apprentice') ? null : column.accessor('apprenticeName', { header: 'Apprentice' }),
        hide.includes('scenario') ? null : column.accessor('scenarioTitle', { header: 'Scenario' }),
        column.accessor('faultTitle', { header: 'Fault injected' }),
        column.accessor((r) => r.findingTitle ?? '', {
          id: 'finding',
          header: 'Finding reached',
          cell: ({ row }) =>
            row.original.findingTitle === null ? (
              <span className="text-muted">still running</span>
            ) : (
              <span>
                <span aria-hidden>{row.original.right ? '✓ ' : '✗ '}</span>
                {row.original.findingTitle}
                <span className="sr-only">{row.original.right ? ' (right)' : ' (not the fault)'}</span>
              </span>
            ),
        }),
        column.accessor((r) => r.total ?? -1, {
          id: 'score',
          header: 'Score',
          cell: ({ row }) =>
            row.original.total === null ? '—' : <span className="font-mono">{`${row.original.total} / ${row.original.max}`}</span>,
        }),
        column.accessor((r) => r.safetyLapses ?? -1, {
          id: 'safety',
          header: 'Safety lapses',
          cell: ({ row }) => <span className="font-mono">{row.original.safetyLapses ?? '—'}</span>,
        }),
        column.accessor((r) => r.seconds ?? Number.MAX_SAFE_INTEGER, {
          id: 'time',
          header: 'Time',
          cell: ({ row }) => <span className="font-mono">{duration(row.original.seconds)}</span>,
        }),
      ].filter((c) => c !== null),
    [hide],
  );

  // TanStack Table v8 hands back a stateful table object by design; the app does not run React Compiler.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter: search },
    onSortingChange: setSorting,
    onGlobalFilterChange: setSearch,
    globalFilterFn: searchFilter,
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const shown = table.getRowModel().rows;

  return (
    <div className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-[2fr_1fr]" role="search">
        <div>
          <label htmlFor={id} className="label">
            Search
          </label>
          <TextInput
            id={id}
            type="search"
            placeholder="Apprentice, scenario, fault or finding"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
          />
        </div>
        <div>
          <label htmlFor={`${id}-outcome`} className="label">
            Outcome
          </label>
          <Select id={`${id}-outcome`} value={outcome} onChange={(e) => setOutcome(e.target.value as Outcome)}>
            <option value="">Any</option>
            <option value="right">Right finding</option>
            <option value="wrong">Wrong finding</option>
            <option value="running">Still running</option>
          </Select>
        </div>
      </div>
      <p className="text-sm text-muted" role="status" aria-live="polite">
        {shown.length} {shown.length === 1 ? 'attempt' : 'attempts'}
      </p>
      {rows.length === 0 ? (
        <p className="card text-muted">No attempt yet.</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-line">
          <table className="w-full text-left text-base" data-testid="results-table">
            <thead className="bg-sunken">
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id}>
                  {hg.headers.map((h) => {
                    const sorted = h.column.getIsSorted();
                    return (
                      <th
                        key={h.id}
                        scope="col"
                        aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                        className="p-0"
                      >
                        <button
                          type="button"
                          className="flex min-h-touch w-full items-center gap-1 px-3 text-left font-semibold"
                          onClick={h.column.getToggleSortingHandler()}
                        >
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden className="text-muted">
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
              {shown.map((row) => (
                <tr key={row.id} className="border-t border-line">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-1 align-middle">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
