import type { AuditEventView } from '@tappet/contracts';
import { Button, buttonClasses, createColumnHelper, DataTable, EmptyState, ErrorState, FormMessage, LoadingState, PartNumber, Select, TextField } from '@tappet/ui';
import { useMemo } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { auditCsvHref, emptyAuditFilters, useAuditEvents, type AuditFilters } from '../api/get-audit-events';
import { actionWord, entityOptions, fieldWords, showValue } from './words';
import { formatDateTime } from '../../../lib/dates';

const column = createColumnHelper<AuditEventView>();
export interface AuditLogProps {
  shopId: string;
  filters: AuditFilters;
  page: number;
  onChange: (filters: AuditFilters, page: number) => void;
  /** People and keys to filter by (value = user id or API key id). */
  actors: Array<{ value: string; label: string }>;
  pageSize?: number;
}

function Who({ actor }: { actor: AuditEventView['actor'] }) {
  if (actor.apiKeyId) return <span>API key “{actor.apiKeyLabel ?? 'unnamed'}”</span>;
  if (actor.userId) return <span className="font-bold">{actor.userName ?? 'A former account'}</span>;
  return <span className="text-ink-muted">Tappet (system)</span>;
}

function Changes({ changes }: { changes: AuditEventView['changes'] }) {
  const entries = Object.entries(changes);
  if (entries.length === 0) return <span className="text-ink-muted">No fields recorded</span>;
  return (
    // Relative: the visually hidden words must stay inside the table's scroll box, or they widen the page.
    <ul className="relative flex flex-col gap-1">
      {entries.map(([field, { before, after }]) => (
        <li key={field} className="break-words">
          <span className="font-bold">{fieldWords(field)}</span>: <span className="font-mono">{showValue(before)}</span> <span aria-hidden="true">→</span>{' '}
          <span className="sr-only">changed to </span>
          <span className="font-mono">{showValue(after)}</span>
        </li>
      ))}
    </ul>
  );
}

/** The owner's view of the append-only audit log: filters in the URL, pages from the API, CSV of the same filters. */
export function AuditLog({ shopId, filters, page, onChange, actors, pageSize = 50 }: AuditLogProps) {
  const events = useAuditEvents(shopId, filters, page, pageSize);
  const rangeWrong = Boolean(filters.from && filters.to && filters.from > filters.to);

  const columns = useMemo(
    () => [
      column.accessor('createdAt', {
        header: 'When',
        cell: (info) => (
          <time dateTime={info.getValue()}>
            {formatDateTime(info.getValue(), { seconds: true })}
          </time>
        ),
      }),
      column.display({ id: 'who', header: 'Who', cell: (info) => <Who actor={info.row.original.actor} /> }),
      column.accessor('action', {
        header: 'What',
        cell: (info) => {
          const e = info.row.original;
          return (
            <div className="flex flex-col gap-0.5">
              <span className="font-bold">{actionWord(e.action)}</span>
              <span className="text-sm text-ink-muted">
                {e.entity}
                {e.entityId && (
                  <>
                    {' '}
                    {/* The first 8 characters tell records apart on screen; the CSV and the tooltip carry the whole id. */}
                    <span title={e.entityId}>
                      <PartNumber className="text-sm">{e.entityId.length > 12 ? `${e.entityId.slice(0, 8)}…` : e.entityId}</PartNumber>
                    </span>
                  </>
                )}
              </span>
            </div>
          );
        },
      }),
      column.display({ id: 'changes', header: 'Changed fields (before → after)', cell: (info) => <Changes changes={info.row.original.changes} /> }),
      column.accessor('ip', { header: 'From', enableSorting: false, cell: (info) => <span className="font-mono text-sm">{info.getValue() ?? '—'}</span> }),
    ],
    [],
  );

  function set<K extends keyof AuditFilters>(key: K, value: AuditFilters[K]) {
    onChange({ ...filters, [key]: value }, 1);
  }

  const filtered = Object.values(filters).some(Boolean);
  const total = events.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));

  return (
    <div className="flex flex-col gap-5">
      <form role="search" aria-label="Filter the audit log" onSubmit={(e) => e.preventDefault()} className="grid grid-cols-1 gap-4 rounded-lg border-2 border-line bg-surface p-4 sm:grid-cols-2 lg:grid-cols-4">
        <Select label="Person or key" value={filters.actor} onChange={(e) => set('actor', e.target.value)} placeholder="Anyone" options={actors} />
        <Select label="Kind of record" value={filters.entity} onChange={(e) => set('entity', e.target.value)} placeholder="Any" options={entityOptions} />
        <TextField label="From" type="date" value={filters.from} onChange={(e) => set('from', e.target.value)} />
        <TextField label="To (that day included)" type="date" value={filters.to} onChange={(e) => set('to', e.target.value)} error={rangeWrong ? 'Pick a day on or after “From”.' : undefined} />
        <div className="flex flex-wrap items-center gap-3 sm:col-span-2 lg:col-span-4">
          <a className={buttonClasses('secondary', 'sm')} href={auditCsvHref(shopId, filters)} download>
            Download these events as CSV
          </a>
          {filtered && (
            <Button variant="ghost" size="sm" type="button" onClick={() => onChange(emptyAuditFilters, 1)}>
              Clear the filters
            </Button>
          )}
        </div>
      </form>

      {events.isPending ? (
        <LoadingState label="Loading the audit log…" />
      ) : events.isError ? (
        <ErrorState message={errorMessage(events.error)} onRetry={() => void events.refetch()} />
      ) : (
        <>
          {rangeWrong && <FormMessage>“From” is after “To”, so no event can match.</FormMessage>}
          <DataTable
            caption="Audit events, newest first"
            columns={columns}
            data={events.data.events}
            getRowId={(e) => e.id}
            pageSize={pageSize}
            empty={
              filtered ? (
                <EmptyState title="No events match these filters" action={<Button variant="secondary" onClick={() => onChange(emptyAuditFilters, 1)}>Clear the filters</Button>}>
                  Widen the dates or pick another person or kind of record.
                </EmptyState>
              ) : (
                <EmptyState title="Nothing recorded yet">Every change anyone makes in the shop appears here, with who, when and from where.</EmptyState>
              )
            }
          />
          {total > 0 && (
            <nav aria-label="Audit log pages" className="flex flex-wrap items-center gap-3">
              <span className="tabular">
                Page {page} of {pages} · {total} {total === 1 ? 'event' : 'events'}
              </span>
              {pages > 1 && (
                <>
                  <Button variant="secondary" size="sm" disabled={page <= 1} onClick={() => onChange(filters, page - 1)}>
                    Newer events
                  </Button>
                  <Button variant="secondary" size="sm" disabled={page >= pages} onClick={() => onChange(filters, page + 1)}>
                    Older events
                  </Button>
                </>
              )}
            </nav>
          )}
        </>
      )}
    </div>
  );
}
