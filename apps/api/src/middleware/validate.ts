import type { RequestHandler } from 'express';
import type { z } from 'zod';

export interface RequestSchemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

/**
 * Parses body, query and params with the given (strict) schemas and replaces them with the parsed
 * values, so handlers only ever see validated, transformed input. A failure goes to the error
 * handler as a ZodError (400 validation_failed).
 */
export function validate(schemas: RequestSchemas): RequestHandler {
  return (req, _res, next) => {
    if (schemas.params) req.params = schemas.params.parse(req.params) as typeof req.params;
    if (schemas.query) {
      // Express 5: req.query is a getter that re-parses the URL, so shadow it with a property.
      const query = schemas.query.parse(req.query);
      Object.defineProperty(req, 'query', { value: query, writable: true, configurable: true, enumerable: true });
    }
    if (schemas.body) req.body = schemas.body.parse(req.body ?? {});
    next();
  };
}

/** The validated body, typed by its schema. */
export function bodyOf<S extends z.ZodType>(_schema: S, req: { body: unknown }): z.output<S> {
  return req.body as z.output<S>;
}
