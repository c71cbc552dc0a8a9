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

/** Half of a UTF-16 surrogate pair without its other half: JSON allows it, UTF-8 cannot encode it. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;
const unstorable = (s: string) => s.includes('\u0000') || LONE_SURROGATE.test(s);

/**
 * The path of the first text (or key) PostgreSQL cannot store: a null character, refused by text
 * and JSONB alike, or a lone surrogate, refused by JSONB (and silently replaced in text).
 * A loop with links to the parent, not recursion or copied paths: JSON.parse takes bodies nested
 * far deeper than the call stack, and the walk stays linear in the size of the body.
 */
function unstorableTextAt(input: unknown): string[] | null {
  type Step = { value: unknown; key: string; parent: Step | null };
  const pathOf = (step: Step | null): string[] => {
    const path: string[] = [];
    for (let s = step; s?.parent; s = s.parent) path.push(s.key);
    return path.reverse();
  };
  const stack: Step[] = [{ value: input, key: '', parent: null }];
  while (stack.length) {
    const step = stack.pop()!;
    if (typeof step.value === 'string' && unstorable(step.value)) return pathOf(step);
    if (step.value && typeof step.value === 'object') {
      for (const [key, value] of Object.entries(step.value)) {
        const child = { value, key, parent: step };
        if (unstorable(key)) return pathOf(child);
        stack.push(child);
      }
    }
  }
  return null;
}

/**
 * Parses req[source] with the schema; on success the parsed value is on res.locals[source]
 * (typed through `parsed(res)`), on failure a 400 names every field.
 */
export function validate(schema: z.ZodType, source: Source = 'body') {
  return (req: Request, res: Response, next: NextFunction) => {
    const input = source === 'body' ? (req.body ?? {}) : req[source];
    // Such text would pass any zod string and then fail in the database as a 500.
    const bad = unstorableTextAt(input);
    if (bad) {
      const message = 'This text holds a character that cannot be saved (a null character, or half of an emoji). Remove it and try again.';
      return next(badRequest(message, { [bad.length ? bad.join('.') : '_']: message }));
    }
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
