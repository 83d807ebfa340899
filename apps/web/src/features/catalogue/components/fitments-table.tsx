import type { Fitment } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, EmptyState, Num, PartNumber } from '@tappet/ui';
import { useMemo, type ReactNode } from 'react';

const column = createColumnHelper<Fitment>();

/** "1968–1973", "from 1968", "up to 1973", "any year". */
export function yearsWords(from: number | null, to: number | null): string {
  if (from != null && to != null) return from === to ? String(from) : `${from}–${to}`;
  if (from != null) return `from ${from}`;
  if (to != null) return `up to ${to}`;
  return 'any year';
}

function framesCell(from: string | null, to: string | null): ReactNode {
  if (!from && !to) return <span className="text-ink-muted">All frames</span>;
  return (
    <span>
      {from ? <PartNumber>{from}</PartNumber> : 'the first'}
      {' to '}
      {to ? <PartNumber>{to}</PartNumber> : 'the last'}
    </span>
  );
}

export interface FitmentsTableProps {
  fitments: Fitment[];
  onEdit?: (fitment: Fitment) => void;
  onDelete?: (fitment: Fitment) => void;
}

/** What a part fits: marque, model, years and, where it matters, frame numbers. */
export function FitmentsTable({ fitments, onEdit, onDelete }: FitmentsTableProps) {
  const columns = useMemo(() => {
    const cols = [
      column.accessor('marque', { header: 'Marque' }),
      column.accessor('model', { header: 'Model' }),
      column.accessor((f) => f.yearFrom ?? f.yearTo ?? 0, {
        id: 'years',
        header: 'Years',
        cell: (info) => <Num>{yearsWords(info.row.original.yearFrom, info.row.original.yearTo)}</Num>,
      }),
      column.display({ id: 'frames', header: 'Frame numbers', cell: (info) => framesCell(info.row.original.frameFrom, info.row.original.frameTo) }),
    ];
    if (onEdit || onDelete) {
      cols.push(
        column.display({
          id: 'actions',
          header: 'Actions',
          cell: (info) => {
            const f = info.row.original;
            const name = `${f.marque} ${f.model}`;
            return (
              <span className="flex gap-1">
                {onEdit && (
                  <Button variant="ghost" size="sm" aria-label={`Edit the fitment ${name}`} onClick={() => onEdit(f)}>
                    Edit
                  </Button>
                )}
                {onDelete && (
                  <Button variant="ghost" size="sm" aria-label={`Delete the fitment ${name}`} onClick={() => onDelete(f)}>
                    Delete
                  </Button>
                )}
              </span>
            );
          },
        }),
      );
    }
    return cols;
  }, [onEdit, onDelete]);

  return (
    <DataTable
      caption="What this part fits"
      columns={columns}
      data={fitments}
      getRowId={(f) => f.id}
      empty={<EmptyState title="No fitment recorded">Add the marques and models this part fits, with their years.</EmptyState>}
    />
  );
}
