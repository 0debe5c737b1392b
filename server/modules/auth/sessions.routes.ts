import type { Request, Response } from 'express';
import { sessionParams } from '../../../shared/schemas/sessions';
import { parsed } from '../../middleware/validate';
import { clearSessionCookie } from '../../middleware/session';
import type { SessionsService } from './sessions.service';

/** The signed-in person's own sessions: the list, ending one, ending all but this one (ASVS 3.3.4). */
export function sessionsHandlers(sessions: SessionsService) {
  return {
    async list(req: Request, res: Response) {
      res.json({ sessions: await sessions.list(req.user!.id, req.sessionID), limits: sessions.limits });
    },
    /** Ending the session in use is signing out here. */
    async end(req: Request, res: Response) {
      const { wasCurrent } = await sessions.end(req.user!.id, parsed(res, 'params', sessionParams).sessionId, req.sessionID);
      if (wasCurrent) {
        await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
        clearSessionCookie(res);
      }
      res.status(204).end();
    },
    async endOthers(req: Request, res: Response) {
      res.json({ ended: await sessions.endOthers(req.user!.id, req.sessionID) });
    },
  };
}
