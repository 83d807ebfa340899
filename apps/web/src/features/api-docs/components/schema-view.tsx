import { constraints, resolveRef, typeLabel, type JsonSchema, type OpenApiDocument } from '../lib/openapi';

const maxDepth = 6;

/** A JSON schema as nested lists of fields with their types, rules and descriptions. */
export function SchemaView({ doc, schema, depth = 0, seen = [] }: { doc: OpenApiDocument; schema: JsonSchema; depth?: number; seen?: string[] }) {
  const { schema: resolved, name } = resolveRef(doc, schema);
  if (name && seen.includes(name)) return <p className="text-ink-muted">{name} (see above)</p>;
  const trail = name ? [...seen, name] : seen;
  if (depth > maxDepth) return <p className="text-ink-muted">…</p>;

  const merged = mergeAllOf(doc, resolved);
  const variants = merged.anyOf ?? merged.oneOf;
  const nonNull = variants?.filter((v) => v.type !== 'null') ?? [];

  if (merged.properties) {
    const required = new Set(merged.required ?? []);
    const rules = constraints(merged);
    return (
      <div className="flex flex-col gap-1">
        {(name || rules.length > 0) && (
          <p className="text-sm text-ink-muted">
            {name && <span className="font-mono">{name}</span>}
            {name && rules.length > 0 && ' · '}
            {rules.join(', ')}
          </p>
        )}
        <ul className="flex flex-col gap-2 border-l-2 border-line pl-3">
          {Object.entries(merged.properties).map(([field, child]) => (
            <FieldRow key={field} doc={doc} field={field} schema={child} required={required.has(field)} depth={depth} seen={trail} />
          ))}
        </ul>
      </div>
    );
  }

  const items = merged.items ? resolveRef(doc, merged.items).schema : undefined;
  if (items && (items.properties || items.allOf)) {
    return (
      <div className="flex flex-col gap-1">
        <p className="text-sm text-ink-muted">A list; each item:</p>
        <SchemaView doc={doc} schema={merged.items ?? {}} depth={depth + 1} seen={trail} />
      </div>
    );
  }

  if (nonNull.length > 1) {
    return (
      <div className="flex flex-col gap-1">
        <p className="text-sm text-ink-muted">One of:</p>
        <ol className="flex list-decimal flex-col gap-2 pl-6">
          {nonNull.map((variant, i) => (
            <li key={i}>
              <SchemaView doc={doc} schema={variant} depth={depth + 1} seen={trail} />
            </li>
          ))}
        </ol>
      </div>
    );
  }

  return (
    <p>
      <span className="font-mono text-sm">{typeLabel(merged)}</span>
      {constraints(merged).length > 0 && <span className="text-sm text-ink-muted"> · {constraints(merged).join(', ')}</span>}
    </p>
  );
}

function FieldRow({ doc, field, schema, required, depth, seen }: { doc: OpenApiDocument; field: string; schema: JsonSchema; required: boolean; depth: number; seen: string[] }) {
  const { schema: resolved } = resolveRef(doc, schema);
  const merged = mergeAllOf(doc, resolved);
  const variants = merged.anyOf ?? merged.oneOf;
  const single = variants?.filter((v) => v.type !== 'null');
  const inner = single && single.length === 1 && single[0] ? mergeAllOf(doc, resolveRef(doc, single[0]).schema) : merged;
  const itemSchema = inner.items ? resolveRef(doc, inner.items).schema : undefined;
  const nested = inner.properties || (itemSchema && (itemSchema.properties || itemSchema.allOf));
  const rules = constraints(inner);
  return (
    <li>
      <p className="flex flex-wrap items-baseline gap-x-2">
        <span className="font-mono font-medium">{field}</span>
        <span className="font-mono text-sm text-ink-muted">{typeLabel(merged)}</span>
        <span className="text-sm">{required ? 'required' : 'optional'}</span>
        {rules.length > 0 && <span className="text-sm text-ink-muted">{rules.join(', ')}</span>}
      </p>
      {merged.description && <p className="text-sm text-ink-muted">{merged.description}</p>}
      {nested && (
        <div className="mt-1">
          <SchemaView doc={doc} schema={inner} depth={depth + 1} seen={seen} />
        </div>
      )}
    </li>
  );
}

/** Folds `allOf` parts into one object schema (properties and required lists joined). */
function mergeAllOf(doc: OpenApiDocument, schema: JsonSchema): JsonSchema {
  if (!schema.allOf) return schema;
  const parts = schema.allOf.map((s) => mergeAllOf(doc, resolveRef(doc, s).schema));
  const { allOf: _allOf, ...rest } = schema;
  return parts.reduce<JsonSchema>(
    (acc, part) => ({
      ...part,
      ...acc,
      properties: { ...part.properties, ...acc.properties },
      required: [...(acc.required ?? []), ...(part.required ?? [])],
    }),
    rest,
  );
}
