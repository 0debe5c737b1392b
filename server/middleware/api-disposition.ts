import type { NextFunction, Request, Response } from 'express';

/** The name a browser would save an API answer under, were it ever opened as a page. */
export const API_ANSWER_FILENAME = 'api.json';

/**
 * Marks every API answer as a file to save, never a page to render
 * (ASVS 14.4.2): a JSON answer opened by a link or a crafted navigation is
 * then downloaded rather than shown, so nothing in it can be read as HTML.
 * Set before the route runs; a download (server/lib/download.ts, an
 * upload's file, a template) replaces it with its own name, as
 * `res.setHeader` overwrites.
 */
export function apiAnswersAsAttachments(_req: Request, res: Response, next: NextFunction) {
  // RFC 6266 §4.1: a quoted-string filename of plain ASCII needs no filename* form.
  res.setHeader('Content-Disposition', `attachment; filename="${API_ANSWER_FILENAME}"`);
  next();
}
