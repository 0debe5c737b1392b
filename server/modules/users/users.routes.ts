import { securityLogOf } from '../../lib/security-log';
import type { Request, Response } from 'express';
import { createUserBody } from '../../../shared/schemas/auth';
import { parsed } from '../../middleware/validate';
import type { UsersService } from './users.service';

export function usersHandlers(users: UsersService) {
  return {
    async list(req: Request, res: Response) {
      const accounts = await users.list();
      // Reading every account's e-mail and roles is access to personal data (ASVS 8.3.5).
      securityLogOf(req).event(req, res, 'accounts_read', { accounts: accounts.length });
      res.json({ users: accounts });
    },
    async create(req: Request, res: Response) {
      // The site admin typed the password: its owner chooses their own at the first sign-in (ASVS 2.3.1).
      res.status(201).json({ user: await users.create(parsed(res, 'body', createUserBody), req.user!.id, { mustChangePassword: 'initial' }) });
    },
  };
}
