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
 * The path of the first text (or key) holding U+0000: PostgreSQL cannot store it in text or JSONB.
 * A loop with links to the parent, not recursion or copied paths: JSON.parse takes bodies nested
 * far deeper than the call stack, and the walk stays linear in the size of the body.
 */
function nullCharacterAt(input: unknown): string[] | null {
  type Step = { value: unknown; key: string; parent: Step | null };
  const pathOf = (step: Step | null): string[] => {
    const path: string[] = [];
    for (let s = step; s?.parent; s = s.parent) path.push(s.key);
    return path.reverse();
  };
  const stack: Step[] = [{ value: input, key: '', parent: null }];
  while (stack.length) {
    const step = stack.pop()!;
    if (typeof step.value === 'string' && step.value.includes('\u0000')) return pathOf(step);
    if (step.value && typeof step.value === 'object') {
      for (const [key, value] of Object.entries(step.value)) {
        const child = { value, key, parent: step };
        if (key.includes('\u0000')) return pathOf(child);
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
    // A null character would pass any zod string and then fail in the database as a 500.
    const nul = nullCharacterAt(input);
    if (nul) {
      const message = 'This text holds an invisible null character (\\0), which cannot be saved. Remove it and try again.';
      return next(badRequest(message, { [nul.length ? nul.join('.') : '_']: message }));
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
