import type { NextFunction, Request, Response } from 'express';
import type { z } from 'zod';
import { validationFailed } from '../lib/errors';

type Part = 'body' | 'query' | 'params';

export function zodIssues(error: z.ZodError) {
  return error.issues.map((issue) => ({ path: issue.path.join('.'), message: issue.message }));
}

/**
 * The paths of strings holding U+0000, which no text of Starledger's means
 * and which PostgreSQL's text type cannot store (it would answer 500, while
 * SQLite kept it): refused on both engines alike, naming the field.
 */
function nulCharacterIssues(value: unknown, path: string[] = []): { path: string; message: string }[] {
  if (typeof value === 'string') return value.includes('\u0000') ? [{ path: path.join('.'), message: 'Remove the NUL character (U+0000): text may not contain it.' }] : [];
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([key, v]) => nulCharacterIssues(v, [...path, key]));
  return [];
}

/**
 * Validates one part of the request against a shared schema and stores the
 * parsed (transformed) value in `res.locals[part]`, which handlers read.
 */
export function validate<S extends z.ZodType>(part: Part, schema: S) {
  return (req: Request, res: Response, next: NextFunction) => {
    const result = schema.safeParse(req[part] ?? {});
    if (!result.success) return next(validationFailed(zodIssues(result.error)));
    const nul = nulCharacterIssues(result.data);
    if (nul.length > 0) return next(validationFailed(nul));
    res.locals[part] = result.data;
    next();
  };
}

export function parsed<S extends z.ZodType>(res: Response, part: Part, _schema: S): z.output<S> {
  return res.locals[part] as z.output<S>;
}
