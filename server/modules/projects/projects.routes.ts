import type { Request, Response } from 'express';
import { createProjectBody, updateProjectBody } from '../../../shared/schemas/projects';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import type { ProjectsService } from './projects.service';

export function projectsHandlers(projects: ProjectsService) {
  return {
    async list(req: Request, res: Response) {
      res.json({ projects: await projects.listMine(req.user!.id) });
    },
    async create(req: Request, res: Response) {
      res.status(201).json({ project: await projects.create(parsed(res, 'body', createProjectBody), req.user!.id) });
    },
    async get(req: Request, res: Response) {
      res.json({ project: await projects.get(projectAccessOf(res).projectId, req.user!.id) });
    },
    async update(req: Request, res: Response) {
      const { projectId } = projectAccessOf(res);
      res.json({ project: await projects.update(projectId, parsed(res, 'body', updateProjectBody), req.user!.id) });
    },
  };
}
