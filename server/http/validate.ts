import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { HttpError } from './errors';

/** The zod schemas a route validates its params, query and body with. */
export interface Schemas {
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
}

/** What a schema parses to; undefined where the route has no schema for that part. */
export type Out<S> = S extends z.ZodType ? z.output<S> : undefined;

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** The parsed, validated params, query and body (set by `validate`). */
      valid: { params?: unknown; query?: unknown; body?: unknown };
    }
  }
}

/** Collapses zod issues to one message per field path ("points.3.resistance"). */
export function issuesToFields(issues: readonly z.core.$ZodIssue[], prefix?: string): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of issues) {
    const key = [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || (prefix ?? 'body');
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Validates params, query and body; the parsed values are handed on as `req.valid`. */
export function validate<S extends Schemas>(schemas: S): RequestHandler {
  return (req, _res, next) => {
    const fields: Record<string, string> = {};
    const valid: Record<string, unknown> = {};
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(req[part] ?? {});
      if (result.success) valid[part] = result.data;
      else Object.assign(fields, issuesToFields(result.error.issues, part === 'body' ? undefined : part));
    }
    if (Object.keys(fields).length > 0) {
      const first = Object.entries(fields)[0]!;
      return next(new HttpError(422, 'invalid', `${first[0]}: ${first[1]}`, fields));
    }
    req.valid = valid;
    next();
  };
}
