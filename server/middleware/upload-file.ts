import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';
import { AppError } from '../lib/errors';

/** Largest file accepted, bytes. A night's measurements are kilobytes; a season of a large survey a few megabytes. */
export const MAX_UPLOAD_BYTES = 20 * 1024 * 1024;

// Browsers send a file name as UTF-8 without saying so; busboy's default (latin1) would turn "Größe-α.csv" into mojibake.
const receive = multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 10 } }).single('file');

/** One multipart file in field `file`, kept in memory; multer's errors become messages that say what to do. */
export function uploadFile(req: Request, res: Response, next: NextFunction) {
  receive(req, res, (err: unknown) => {
    if (!err) return next();
    const code = (err as { code?: string }).code;
    if (code === 'LIMIT_FILE_SIZE') {
      return next(new AppError(413, 'payload_too_large', `The file is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB. Split it into several files.`));
    }
    if (code === 'LIMIT_UNEXPECTED_FILE' || code === 'LIMIT_FILE_COUNT') {
      return next(new AppError(400, 'validation_failed', 'Send one file, in the form field "file".', [{ path: 'file', message: 'One file, field "file".' }]));
    }
    next(new AppError(400, 'validation_failed', 'The upload could not be read as a multipart form.', [{ path: 'file', message: String((err as Error).message) }]));
  });
}
