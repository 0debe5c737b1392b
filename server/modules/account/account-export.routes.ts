import type { Request, Response } from 'express';
import { accountExportFilename } from '../../../shared/schemas/account-export';
import { attachmentDisposition } from '../../lib/download';
import type { AccountExportService } from './account-export.service';

export function accountExportHandlers(exports: AccountExportService) {
  return {
    /** The person's own data as a file to save (ASVS 8.3.2), named by the day it was made. */
    async export(req: Request, res: Response) {
      const file = await exports.of(req.user!, req.sessionID);
      res.setHeader('Content-Disposition', attachmentDisposition(accountExportFilename(new Date(file.exportedAt))));
      res.json(file);
    },
  };
}
