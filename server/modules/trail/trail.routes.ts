import type { Request, Response } from 'express';
import { activityQuery, exportTrailQuery, listTrailQuery } from '../../../shared/schemas/trail';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { TrailService } from './trail.service';

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

export function trailHandlers(trail: TrailService) {
  return {
    async list(_req: Request, res: Response) {
      res.json(await trail.list(projectAccessOf(res).projectId, parsed(res, 'query', listTrailQuery)));
    },

    async export(req: Request, res: Response) {
      const { format, ...filters } = parsed(res, 'query', exportTrailQuery);
      const file = await trail.export(projectAccessOf(res).projectId, req.user!.id, filters, format);
      const first = await file.chunks.next();
      res.setHeader('Content-Type', file.contentType);
      res.setHeader('Content-Disposition', `attachment; filename*=UTF-8''${encodeURIComponent(file.filename)}`);
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.setHeader('Cache-Control', 'no-store');
      try {
        if (!first.done) res.write(first.value);
        for await (const chunk of file.chunks) {
          if (res.destroyed) return;
          // Wait for the socket to drain so a long trail is not buffered whole in memory.
          if (!res.write(chunk)) await drained(res);
        }
        res.end();
      } catch (e) {
        // The headers are gone; the only honest signal left is a broken download.
        console.error(e);
        res.destroy(e instanceof Error ? e : undefined);
      }
    },

    async activity(req: Request, res: Response) {
      const { limit } = parsed(res, 'query', activityQuery);
      res.json({ items: await trail.activity(req.user!.id, limit) });
    },
  };
}
