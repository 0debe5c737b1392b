import type { Request, Response } from 'express';
import { z } from 'zod';
import { idParam } from '../../../shared/schemas/common';
import { parsed } from '../../middleware/validate';
import type { MailFakeService } from './mail-fake.service';

export const caughtMailParams = z.object({ messageId: idParam });

export function mailFakeHandlers(fake: MailFakeService) {
  return {
    list(_req: Request, res: Response) {
      res.json({ messages: fake.list() });
    },
    get(_req: Request, res: Response) {
      res.json({ message: fake.get(parsed(res, 'params', caughtMailParams).messageId) });
    },
  };
}
