import type { NextFunction, Request, Response } from 'express';
import type { z } from 'zod';
import { validationFailed } from '../lib/errors';

type Part = 'body' | 'query' | 'params';

export function zodIssues(error: z.ZodError) {
  return error.issues.map((issue) => ({ path: issue.path.join('.'), message: issue.message }));
}

/**
 * Validates one part of the request against a shared schema and stores the
 * parsed (transformed) value in `res.locals[part]`, which handlers read.
 */
export function validate<S extends z.ZodType>(part: Part, schema: S) {
  return (req: Request, res: Response, next: NextFunction) => {
    const result = schema.safeParse(req[part] ?? {});
    if (!result.success) return next(validationFailed(zodIssues(result.error)));
    res.locals[part] = result.data;
    next();
  };
}

export function parsed<S extends z.ZodType>(res: Response, part: Part, _schema: S): z.output<S> {
  return res.locals[part] as z.output<S>;
}
