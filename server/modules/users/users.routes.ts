import type { Request, Response } from 'express';
import { createUserBody } from '../../../shared/schemas/auth';
import { parsed } from '../../middleware/validate';
import type { UsersService } from './users.service';

export function usersHandlers(users: UsersService) {
  return {
    async list(_req: Request, res: Response) {
      res.json({ users: await users.list() });
    },
    async create(req: Request, res: Response) {
      // The site admin typed the password: its owner chooses their own at the first sign-in (ASVS 2.3.1).
      res.status(201).json({ user: await users.create(parsed(res, 'body', createUserBody), req.user!.id, { mustChangePassword: 'initial' }) });
    },
  };
}
