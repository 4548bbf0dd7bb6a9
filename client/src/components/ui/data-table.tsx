import { flexRender, getCoreRowModel, useReactTable, type ColumnDef } from '@tanstack/react-table';

/**
 * A plain table of rows already paged by the server (TanStack Table, manual pagination).
 * `label` names the table for screen readers. A column with `meta: { numeric: true }` aligns right.
 */
export function DataTable<T>({
  columns,
  rows,
  label,
  rowKey,
}: {
  // Columns hold values of different types; TanStack Table's own examples type the list this way.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<T, any>[];
  rows: T[];
  label: string;
  rowKey: (row: T) => string | number;
}) {
  const table = useReactTable({ data: rows, columns, getCoreRowModel: getCoreRowModel(), manualPagination: true, getRowId: (r) => String(rowKey(r)) });
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-panel">
      <table className="w-full text-left text-sm" aria-label={label}>
        <thead className="border-b border-rule bg-paper text-ink-500">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => (
                <th key={header.id} scope="col" className={`px-4 py-2.5 font-medium ${isNumeric(header.column.columnDef) ? 'text-right' : ''}`}>
                  {header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext())}
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-rule last:border-0 align-top">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className={`px-4 py-3 text-ink-900 ${isNumeric(cell.column.columnDef) ? 'figures text-right' : ''}`}>
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function isNumeric<T>(def: ColumnDef<T, any>): boolean {
  return Boolean((def.meta as { numeric?: boolean } | undefined)?.numeric);
}
