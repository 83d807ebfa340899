import { z } from 'zod';

/** A JSON Schema node as OpenAPI 3.0/3.1 documents carry it (only what the viewer shows). */
export interface JsonSchema {
  $ref?: string;
  type?: string | string[];
  format?: string;
  description?: string;
  enum?: unknown[];
  const?: unknown;
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  nullable?: boolean;
  additionalProperties?: boolean | JsonSchema;
  minLength?: number;
  maxLength?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number | boolean;
  exclusiveMaximum?: number | boolean;
  minItems?: number;
  maxItems?: number;
  pattern?: string;
  default?: unknown;
}

const looseObject = z.record(z.string(), z.unknown());

/** Just enough of the OpenAPI document to render it; the rest is read defensively. */
export const openApiDocumentSchema = z.object({
  openapi: z.string(),
  info: z.object({ title: z.string(), version: z.string(), description: z.string().optional() }),
  paths: z.record(z.string(), looseObject),
  components: z.object({ schemas: z.record(z.string(), looseObject).optional() }).optional(),
});
export type OpenApiDocument = z.infer<typeof openApiDocumentSchema>;

export const httpMethods = ['get', 'post', 'put', 'patch', 'delete'] as const;
export type HttpMethod = (typeof httpMethods)[number];

export interface OperationParameter {
  name: string;
  in: string;
  required: boolean;
  description?: string;
  schema?: JsonSchema;
}

export interface OperationResponse {
  status: string;
  description: string;
  schema?: JsonSchema;
}

export interface Operation {
  /** A stable id for anchors: "post-api-auth-sign-in". */
  id: string;
  method: HttpMethod;
  path: string;
  summary: string;
  description?: string;
  tag: string;
  /** False when the document marks the operation as needing no authentication. */
  needsAuth: boolean;
  parameters: OperationParameter[];
  requestBody?: JsonSchema;
  responses: OperationResponse[];
}

function asRecord(value: unknown): Record<string, unknown> {
  return value && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>) : {};
}

function asString(value: unknown): string | undefined {
  return typeof value === 'string' ? value : undefined;
}

function jsonBody(content: unknown): JsonSchema | undefined {
  const media = asRecord(asRecord(content)['application/json']);
  return media.schema ? (media.schema as JsonSchema) : undefined;
}

/** Anchor-safe id for an operation. */
export function operationId(method: string, path: string): string {
  return `${method}-${path}`.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');
}

/** Every operation of the document, in path order, with its parts pulled out. */
export function listOperations(doc: OpenApiDocument): Operation[] {
  const out: Operation[] = [];
  for (const [path, item] of Object.entries(doc.paths)) {
    const shared = Array.isArray(item.parameters) ? item.parameters : [];
    for (const method of httpMethods) {
      const op = asRecord(item[method]);
      if (!item[method]) continue;
      const params = [...shared, ...(Array.isArray(op.parameters) ? op.parameters : [])].map((p) => {
        const r = asRecord(p);
        return {
          name: asString(r.name) ?? '?',
          in: asString(r.in) ?? 'query',
          required: r.required === true,
          description: asString(r.description),
          schema: r.schema as JsonSchema | undefined,
        };
      });
      const responses = Object.entries(asRecord(op.responses)).map(([status, response]) => {
        const r = asRecord(response);
        return { status, description: asString(r.description) ?? '', schema: jsonBody(r.content) };
      });
      const tags = Array.isArray(op.tags) ? op.tags.filter((t): t is string => typeof t === 'string') : [];
      out.push({
        id: operationId(method, path),
        method,
        path,
        summary: asString(op.summary) ?? '',
        description: asString(op.description),
        tag: tags[0] ?? 'other',
        needsAuth: !(Array.isArray(op.security) && op.security.length === 0),
        parameters: params,
        requestBody: jsonBody(asRecord(op.requestBody).content),
        responses,
      });
    }
  }
  return out;
}

/** Follows a local `#/components/schemas/Name` reference; unknown references stay as they are. */
export function resolveRef(doc: OpenApiDocument, schema: JsonSchema): { schema: JsonSchema; name?: string } {
  const ref = schema.$ref;
  const prefix = '#/components/schemas/';
  if (!ref || !ref.startsWith(prefix)) return { schema };
  const name = decodeURIComponent(ref.slice(prefix.length));
  const target = doc.components?.schemas?.[name];
  return target ? { schema: target as JsonSchema, name } : { schema };
}

/** A short type label: "string (uuid)", "array of object", "integer | null", "one of 3". */
export function typeLabel(schema: JsonSchema): string {
  if (schema.$ref) return schema.$ref.split('/').pop() ?? 'object';
  if (schema.const !== undefined) return `exactly ${JSON.stringify(schema.const)}`;
  if (schema.enum) return schema.enum.map((v) => JSON.stringify(v)).join(' | ');
  const variants = schema.anyOf ?? schema.oneOf;
  if (variants) {
    const nonNull = variants.filter((v) => v.type !== 'null');
    const nullable = nonNull.length < variants.length;
    const inner = nonNull.length === 1 && nonNull[0] ? typeLabel(nonNull[0]) : `one of ${nonNull.length}`;
    return nullable ? `${inner} | null` : inner;
  }
  const types = Array.isArray(schema.type) ? schema.type : schema.type ? [schema.type] : [];
  let label = types.length ? types.join(' | ') : schema.properties ? 'object' : 'any';
  if (types.includes('array') && schema.items) label = label.replace('array', `array of ${typeLabel(schema.items)}`);
  if (schema.format) label += ` (${schema.format})`;
  if (schema.nullable) label += ' | null';
  return label;
}

/** Constraints in words: "2–120 characters", "≥ 0", "at most 100 items", "pattern …". */
export function constraints(schema: JsonSchema): string[] {
  const out: string[] = [];
  if (schema.minLength !== undefined && schema.maxLength !== undefined) out.push(`${schema.minLength}–${schema.maxLength} characters`);
  else if (schema.minLength !== undefined) out.push(`at least ${schema.minLength} characters`);
  else if (schema.maxLength !== undefined) out.push(`at most ${schema.maxLength} characters`);
  if (schema.minimum !== undefined) out.push(`≥ ${schema.minimum}`);
  if (typeof schema.exclusiveMinimum === 'number') out.push(`> ${schema.exclusiveMinimum}`);
  if (schema.maximum !== undefined) out.push(`≤ ${schema.maximum}`);
  if (typeof schema.exclusiveMaximum === 'number') out.push(`< ${schema.exclusiveMaximum}`);
  if (schema.minItems !== undefined) out.push(`at least ${schema.minItems} items`);
  if (schema.maxItems !== undefined) out.push(`at most ${schema.maxItems} items`);
  if (schema.pattern) out.push(`pattern ${schema.pattern}`);
  if (schema.default !== undefined) out.push(`default ${JSON.stringify(schema.default)}`);
  if (schema.additionalProperties === false) out.push('no other fields');
  return out;
}
