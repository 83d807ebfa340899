import type { PartLink } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, EmptyState, Num, PartNumber } from '@tappet/ui';
import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { interchangeWords, kindWords, kindWordsBackwards, quantityWords } from './words';

const column = createColumnHelper<PartLink>();

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

export interface LinksTableProps {
  shopId: string;
  links: PartLink[];
  /** `from`: links this part starts ("is replaced by …"); `to`: links that end at this part ("replaces …"). */
  direction: 'from' | 'to';
  caption: string;
  emptyText: string;
  onEdit?: (link: PartLink) => void;
  onDelete?: (link: PartLink) => void;
}

/** The links of a part, seen from the part, with their interchange, quantity, date, source and note. */
export function LinksTable({ shopId, links, direction, caption, emptyText, onEdit, onDelete }: LinksTableProps) {
  const columns = useMemo(() => {
    const other = (l: PartLink) => (direction === 'from' ? { id: l.toPartId, number: l.toNumber } : { id: l.fromPartId, number: l.fromNumber });
    const cols = [
      column.accessor((l) => (direction === 'from' ? kindWords[l.kind] : kindWordsBackwards[l.kind]), {
        id: 'relation',
        header: 'Relation',
        cell: (info) => capitalise(info.getValue()),
      }),
      column.accessor((l) => other(l).number, {
        id: 'number',
        header: 'Number',
        cell: (info) => {
          const { id, number } = other(info.row.original);
          return id ? (
            <Link to={paths.shop.part.getHref(shopId, id)} className="text-accent underline underline-offset-4">
              <PartNumber>{number}</PartNumber>
            </Link>
          ) : (
            <span className="flex flex-col">
              <PartNumber>{number}</PartNumber>
              <span className="text-sm text-advise">Not in the catalogue</span>
            </span>
          );
        },
      }),
      column.accessor((l) => interchangeWords(l.kind, l.interchange), { id: 'interchange', header: 'Interchange' }),
      column.accessor('quantity', { header: 'Quantity', meta: { numeric: true }, cell: (info) => <Num>{quantityWords(info.getValue())}</Num> }),
      column.accessor('effectiveDate', { header: 'Effective', cell: (info) => info.getValue() ?? <span className="text-ink-muted">—</span> }),
      column.accessor('sourceReference', { header: 'Source', cell: (info) => info.getValue() ?? <span className="text-ink-muted">—</span> }),
      column.accessor('note', { header: 'Note', enableSorting: false, cell: (info) => info.getValue() ?? <span className="text-ink-muted">—</span> }),
    ];
    if (onEdit || onDelete) {
      cols.push(
        column.display({
          id: 'actions',
          header: 'Actions',
          cell: (info) => {
            const name = `${kindWords[info.row.original.kind]} ${other(info.row.original).number}`;
            return (
              <span className="flex gap-1">
                {onEdit && (
                  <Button variant="ghost" size="sm" aria-label={`Edit the link “${name}”`} onClick={() => onEdit(info.row.original)}>
                    Edit
                  </Button>
                )}
                {onDelete && (
                  <Button variant="ghost" size="sm" aria-label={`Delete the link “${name}”`} onClick={() => onDelete(info.row.original)}>
                    Delete
                  </Button>
                )}
              </span>
            );
          },
        }) as (typeof cols)[number],
      );
    }
    return cols;
  }, [direction, shopId, onEdit, onDelete]);

  return (
    <DataTable
      caption={caption}
      columns={columns}
      data={links}
      getRowId={(l) => l.id}
      empty={<EmptyState title={emptyText} />}
    />
  );
}
