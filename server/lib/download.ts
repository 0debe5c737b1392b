import type { Response } from 'express';

/** A file the server writes a piece at a time (an export), with the name the browser saves it under. */
export interface Download {
  filename: string;
  contentType: string;
  chunks: AsyncGenerator<string>;
}

/** The Content-Disposition of a file to save under `filename`: RFC 6266 §4.1 with the name in RFC 8187's UTF-8 form, so no name can break out of the header. */
export function attachmentDisposition(filename: string): string {
  return `attachment; filename*=UTF-8''${encodeURIComponent(filename)}`;
}

/** Resolves when the response can take more, or when the person has gone away. */
function drained(res: Response): Promise<void> {
  return new Promise((resolve) => {
    const done = () => {
      res.off('drain', done);
      res.off('close', done);
      resolve();
    };
    res.once('drain', done);
    res.once('close', done);
  });
}

/**
 * Streams a download as an attachment. The first piece is produced before
 * the headers go out, so an error in the query still answers with a proper
 * error status rather than a truncated file.
 */
export async function sendDownload(res: Response, file: Download): Promise<void> {
  const first = await file.chunks.next();
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', attachmentDisposition(file.filename));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'no-store');
  try {
    if (!first.done) res.write(first.value);
    for await (const chunk of file.chunks) {
      if (res.destroyed) return;
      // Wait for the socket to drain so a long export is not buffered whole in memory.
      if (!res.write(chunk)) await drained(res);
    }
    res.end();
  } catch (e) {
    // The headers are gone; the only honest signal left is a broken download.
    console.error(e);
    res.destroy(e instanceof Error ? e : undefined);
  }
}
