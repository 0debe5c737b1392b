import type { Request, Response } from 'express';
import { createTokenBody } from '../../../shared/schemas/tokens';
import { idParam } from '../../../shared/schemas/common';
import { parsed } from '../../middleware/validate';
import type { TokensService } from './tokens.service';
import { z } from 'zod';

export const tokenParams = z.object({ tokenId: idParam });

export function tokensHandlers(tokens: TokensService) {
  return {
    async list(req: Request, res: Response) {
      res.json({ tokens: await tokens.list(req.user!.id) });
    },
    async create(req: Request, res: Response) {
      const { name, lifetimeDays } = parsed(res, 'body', createTokenBody);
      res.status(201).json(await tokens.create(req.user!.id, name, lifetimeDays));
    },
    async revoke(req: Request, res: Response) {
      await tokens.revoke(req.user!.id, parsed(res, 'params', tokenParams).tokenId);
      res.status(204).end();
    },
  };
}
