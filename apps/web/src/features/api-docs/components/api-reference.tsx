import { Badge, createColumnHelper, DataTable, PartNumber } from '@tappet/ui';
import { useEffect, useMemo, useState } from 'react';
import { listOperations, type Operation, type OpenApiDocument } from '../lib/openapi';
import { SchemaView } from './schema-view';

const col = createColumnHelper<Operation>();

/** A path that may wrap after its slashes, never inside a word. */
function BreakablePath({ path }: { path: string }) {
  const parts = path.split('/');
  return (
    <>
      {parts.map((part, i) => (
        <span key={i}>
          {i > 0 && '/'}
          {part}
          {i < parts.length - 1 && i > 0 && <wbr />}
        </span>
      ))}
    </>
  );
}

function MethodBadge({ method }: { method: string }) {
  return <Badge tone={method === 'get' ? 'neutral' : 'accent'} className="font-mono uppercase">{method}</Badge>;
}

const columns = [
  col.accessor('method', { header: 'Method', cell: (c) => <MethodBadge method={c.getValue()} /> }),
  col.accessor('path', {
    header: 'Path',
    cell: (c) => (
      <a href={`#${c.row.original.id}`} className="font-mono">
        <BreakablePath path={c.getValue()} />
      </a>
    ),
  }),
  col.accessor('summary', { header: 'What it does' }),
  col.accessor('tag', { header: 'Group' }),
];

/**
 * The API's OpenAPI document made readable: a filterable table of every operation, then each
 * operation with its parameters, request body and responses.
 */
export function ApiReference({ doc }: { doc: OpenApiDocument }) {
  const operations = useMemo(() => listOperations(doc), [doc]);
  const groups = useMemo(() => {
    const map = new Map<string, Operation[]>();
    for (const op of operations) map.set(op.tag, [...(map.get(op.tag) ?? []), op]);
    return [...map.entries()];
  }, [operations]);

  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby="api-overview" className="flex flex-col gap-3">
        <h2 id="api-overview" className="text-lg font-bold">
          Overview
        </h2>
        <p>
          {doc.info.title}, version <PartNumber>{doc.info.version}</PartNumber> (OpenAPI <span className="font-mono">{doc.openapi}</span>).
          {doc.info.description ? ` ${doc.info.description}` : ''}
        </p>
        <p>
          Requests that change something must send the headers <code className="font-mono">X-CSRF: 1</code> and{' '}
          <code className="font-mono">Content-Type: application/json</code>. The raw document is at{' '}
          <a href="/api/openapi.json" className="font-mono">
            /api/openapi.json
          </a>
          .
        </p>
        <DataTable
          caption="API operations"
          columns={columns}
          data={operations}
          filterLabel="Filter operations"
          pageSize={25}
          getRowId={(op) => op.id}
          empty={<p>The document lists no operations.</p>}
        />
      </section>

      {groups.map(([tag, ops]) => (
        <section key={tag} aria-labelledby={`group-${tag}`} className="flex flex-col gap-4">
          <h2 id={`group-${tag}`} className="text-lg font-bold capitalize">
            {tag}
          </h2>
          {ops.map((op) => (
            <OperationCard key={op.id} doc={doc} op={op} />
          ))}
        </section>
      ))}
    </div>
  );
}

/**
 * One operation, folded to its method, path and summary until opened: the document has well over a
 * hundred operations, and rendering every schema at once made the page slow to show and to read.
 * A link to `#<operation>` (the table above) opens it.
 */
function OperationCard({ doc, op }: { doc: OpenApiDocument; op: Operation }) {
  const [open, setOpen] = useState(() => typeof window !== 'undefined' && window.location.hash === `#${op.id}`);
  useEffect(() => {
    const onHash = () => {
      if (window.location.hash === `#${op.id}`) setOpen(true);
    };
    window.addEventListener('hashchange', onHash);
    return () => window.removeEventListener('hashchange', onHash);
  }, [op.id]);
  return (
    <details id={op.id} open={open} onToggle={(e) => setOpen(e.currentTarget.open)} className="scroll-mt-4 rounded-lg border-2 border-line bg-surface p-4">
      <summary className="cursor-pointer">
        <h3 id={`${op.id}-title`} className="inline-flex flex-wrap items-center gap-2">
          <MethodBadge method={op.method} />
          <span className="font-mono text-num font-medium break-all">{op.path}</span>
        </h3>
        {op.summary && <span className="ml-2">{op.summary}</span>}
      </summary>
      {open && <OperationBody doc={doc} op={op} />}
    </details>
  );
}

function OperationBody({ doc, op }: { doc: OpenApiDocument; op: Operation }) {
  return (
    <div>
      {op.description && <p className="mt-1 text-ink-muted">{op.description}</p>}
      <p className="mt-1 text-sm text-ink-muted">{op.needsAuth ? 'Needs a signed-in session.' : 'No sign-in needed.'}</p>

      {op.parameters.length > 0 && (
        <div className="mt-4">
          <h4 className="font-bold">Parameters</h4>
          <ul className="mt-1 flex flex-col gap-1">
            {op.parameters.map((p) => (
              <li key={`${p.in}-${p.name}`} className="flex flex-wrap gap-x-2">
                <span className="font-mono font-medium">{p.name}</span>
                <span className="text-sm text-ink-muted">in {p.in}</span>
                <span className="text-sm">{p.required ? 'required' : 'optional'}</span>
                {p.schema && <SchemaView doc={doc} schema={p.schema} />}
              </li>
            ))}
          </ul>
        </div>
      )}

      {op.requestBody && (
        <div className="mt-4">
          <h4 className="font-bold">Request body (JSON)</h4>
          <div className="mt-1">
            <SchemaView doc={doc} schema={op.requestBody} />
          </div>
        </div>
      )}

      {op.responses.length > 0 && (
        <div className="mt-4">
          <h4 className="font-bold">Responses</h4>
          <ul className="mt-1 flex flex-col gap-3">
            {op.responses.map((r) => (
              <li key={r.status}>
                <p>
                  <span className="font-mono font-medium">{r.status}</span> {r.description}
                </p>
                {r.schema && (
                  <div className="mt-1 ml-4">
                    <SchemaView doc={doc} schema={r.schema} />
                  </div>
                )}
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
