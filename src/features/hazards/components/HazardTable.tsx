import { flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortingState, type Table } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { HazardDto } from '../../../contract/hazards';
import { Time } from '../../../components/ui/Time';
import { HAZARD_STATUSES } from '../../../domain/hazards/mitigation';
import { riskLevelOf, type MatrixView } from '../lib/risk';
import { PHASE_LABELS, SYSTEM_LABELS } from '../lib/labels';
import { RiskBadge } from './RiskBadge';
import { StatusBadge } from './StatusBadge';

/** Columns draw each hazard's risk with the matrix it was assessed with (`catalogue`, by matrix id). */
export function hazardColumns(catalogue: ReadonlyMap<string, MatrixView>): ColumnDef<HazardDto>[] {
  const level = (h: HazardDto, key: string | null) => riskLevelOf(catalogue.get(h.matrixId), key);
  const rankOf = (h: HazardDto, key: string | null) => level(h, key)?.rank ?? -1;
  return [
    { id: 'code', header: 'Code', accessorKey: 'code' },
    {
      id: 'title',
      header: 'Hazard',
      accessorKey: 'title',
      cell: ({ row }) => (
        <Link to={`/hazards/${row.original.id}`} className="font-bold">
          {row.original.title}
        </Link>
      ),
    },
    { id: 'system', header: 'System', accessorFn: (h) => SYSTEM_LABELS[h.system] ?? h.system },
    { id: 'phase', header: 'Phase', accessorFn: (h) => PHASE_LABELS[h.phase] ?? h.phase },
    {
      id: 'status',
      header: 'Status',
      accessorFn: (h) => HAZARD_STATUSES.indexOf(h.status),
      cell: ({ row }) => <StatusBadge status={row.original.status} />,
    },
    {
      id: 'initialRisk',
      header: 'Initial risk',
      accessorFn: (h) => rankOf(h, h.initialRisk),
      sortDescFirst: true,
      cell: ({ row }) => <RiskBadge level={level(row.original, row.original.initialRisk)} />,
    },
    {
      id: 'residualRisk',
      header: 'Residual risk',
      accessorFn: (h) => rankOf(h, h.residualRisk),
      sortDescFirst: true,
      cell: ({ row }) => <RiskBadge level={level(row.original, row.original.residualRisk)} />,
    },
    {
      id: 'updatedAt',
      header: 'Updated',
      accessorKey: 'updatedAt',
      sortDescFirst: true,
      cell: ({ row }) => <Time value={row.original.updatedAt} />,
    },
  ];
}

/** The table instance lives with the page so CSV export can use the same sorted, filtered rows. */
export function useHazardTable(hazards: readonly HazardDto[], catalogue: ReadonlyMap<string, MatrixView>) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'residualRisk', desc: true }]);
  const data = useMemo(() => [...hazards], [hazards]);
  const columns = useMemo(() => hazardColumns(catalogue), [catalogue]);
  return useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: (h) => String(h.id),
  });
}

const sortWords = { asc: 'ascending', desc: 'descending' } as const;

/**
 * The register table. From md up: a table that scrolls sideways inside its own labelled region. Below
 * md each row is drawn as a card (the same table markup, so it stays one table for assistive tech).
 */
export function HazardTable({ table }: { table: Table<HazardDto> }) {
  const rows = table.getRowModel().rows;

  return (
    <div role="region" aria-labelledby="hazard-table-caption" tabIndex={0} className="overflow-x-auto rounded-md border-2 border-line">
      <table className="w-full border-collapse text-left max-md:block md:min-w-[56rem]">
        <caption id="hazard-table-caption" className="border-b-2 border-line bg-surface p-3 text-left font-bold max-md:block">
          Hazards ({rows.length} shown)
          <span className="block text-sm font-normal text-ink-muted md:hidden">Each hazard is shown as a card on narrow screens.</span>
        </caption>
        <thead className="bg-sunken max-md:sr-only">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted();
                return (
                  <th key={header.id} scope="col" aria-sort={sorted ? sortWords[sorted] : 'none'} className="border-b-2 border-line p-0">
                    <button
                      type="button"
                      onClick={header.column.getToggleSortingHandler()}
                      className="flex min-h-12 w-full cursor-pointer items-center gap-1.5 px-3 text-left font-bold text-ink hover:bg-selected"
                    >
                      {flexRender(header.column.columnDef.header, header.getContext())}
                      <span aria-hidden="true" className="text-sm">
                        {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                      </span>
                      <span className="sr-only">{sorted ? `, sorted ${sortWords[sorted]}` : ', sort'}</span>
                    </button>
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody className="max-md:block">
          {rows.length === 0 ? (
            <tr className="max-md:block">
              <td colSpan={table.getVisibleLeafColumns().length} className="p-4 max-md:block">
                No hazard matches these filters.
              </td>
            </tr>
          ) : (
            rows.map((row) => (
              <tr key={row.id} className="border-b-2 border-line-soft align-top last:border-b-0 max-md:grid max-md:grid-cols-2 max-md:gap-x-2 max-md:border-line max-md:p-2">
                {row.getVisibleCells().map((cell) => {
                  const isTitle = cell.column.id === 'title';
                  const Tag = isTitle ? 'th' : 'td';
                  return (
                    <Tag
                      key={cell.id}
                      {...(isTitle ? { scope: 'row' } : {})}
                      className={`p-3 font-normal max-md:p-1.5 ${isTitle ? 'max-md:col-span-2 max-md:order-first' : ''}`}
                    >
                      {isTitle ? null : (
                        <span className="block text-sm font-bold text-ink-muted md:hidden">{String(cell.column.columnDef.header)}</span>
                      )}
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </Tag>
                  );
                })}
              </tr>
            ))
          )}
        </tbody>
      </table>
    </div>
  );
}
