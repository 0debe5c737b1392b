import type { Request, Response } from 'express';
import { updateMailPreferenceBody } from '../../../shared/schemas/mail';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { MailPreferencesService } from './mail-preferences.service';

export function mailPreferencesHandlers(preferences: MailPreferencesService) {
  return {
    async list(req: Request, res: Response) {
      res.json({ preferences: await preferences.listMine(req.user!.id) });
    },
    async update(req: Request, res: Response) {
      res.json({ preference: await preferences.update(req.user!.id, projectAccessOf(res).projectId, parsed(res, 'body', updateMailPreferenceBody)) });
    },
  };
}
