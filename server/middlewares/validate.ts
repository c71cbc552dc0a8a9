import type { NextFunction, Request, Response } from 'express';
import type { z } from 'zod';
import { badRequest } from '../errors';

/** Turns zod issues into `{ "path.to.field": "message" }`, first message per path. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    if (!(key in fields)) fields[key] = issue.message;
  }
  return fields;
}

type Source = 'body' | 'query' | 'params';

/**
 * Parses req[source] with the schema; on success the parsed value is on res.locals[source]
 * (typed through `parsed(res)`), on failure a 400 names every field.
 */
export function validate(schema: z.ZodType, source: Source = 'body') {
  return (req: Request, res: Response, next: NextFunction) => {
    const input = source === 'body' ? (req.body ?? {}) : req[source];
    const result = schema.safeParse(input);
    if (!result.success) {
      const fields = fieldErrors(result.error);
      const count = Object.keys(fields).length;
      return next(badRequest(count === 1 ? Object.values(fields)[0] : `Check the ${count} highlighted fields.`, fields));
    }
    res.locals[source] = result.data;
    next();
  };
}

export function parsed<T>(res: Response, source: Source = 'body'): T {
  return res.locals[source] as T;
}
