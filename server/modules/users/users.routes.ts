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
      res.status(201).json({ user: await users.create(parsed(res, 'body', createUserBody), req.user!.id) });
    },
  };
}
