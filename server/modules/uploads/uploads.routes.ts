import type { Request, Response } from 'express';
import { commitBody, createUploadFields, remapBody, uploadErrorsQuery, uploadParams, uploadRowsQuery } from '../../../shared/schemas/uploads';
import { LONG_TEMPLATE, WIDE_TEMPLATE } from '../../../shared/file-reading/measurement-file';
import { projectAccessOf } from '../../middleware/access';
import { parsed } from '../../middleware/validate';
import { attachmentDisposition } from '../../lib/download';
import type { UploadsService } from './uploads.service';

function attachment(res: Response, filename: string, type: string) {
  res.setHeader('Content-Type', type);
  res.setHeader('Content-Disposition', attachmentDisposition(filename));
  res.setHeader('X-Content-Type-Options', 'nosniff');
}

export function uploadsHandlers(uploads: UploadsService) {
  return {
    async list(_req: Request, res: Response) {
      res.json({ uploads: await uploads.list(projectAccessOf(res).projectId) });
    },
    async create(req: Request, res: Response) {
      const upload = await uploads.preview(projectAccessOf(res).projectId, req.user!.id, req.file, parsed(res, 'body', createUploadFields));
      res.status(201).json({ upload });
    },
    async get(_req: Request, res: Response) {
      res.json({ upload: await uploads.get(projectAccessOf(res).projectId, parsed(res, 'params', uploadParams).uploadId) });
    },
    async rows(_req: Request, res: Response) {
      const { uploadId } = parsed(res, 'params', uploadParams);
      res.json(await uploads.rows(projectAccessOf(res).projectId, uploadId, parsed(res, 'query', uploadRowsQuery)));
    },
    async errors(_req: Request, res: Response) {
      const { uploadId } = parsed(res, 'params', uploadParams);
      res.json(await uploads.errors(projectAccessOf(res).projectId, uploadId, parsed(res, 'query', uploadErrorsQuery)));
    },
    async progress(_req: Request, res: Response) {
      const { uploadId } = parsed(res, 'params', uploadParams);
      res.json({ progress: await uploads.progress(projectAccessOf(res).projectId, uploadId) });
    },
    async remap(_req: Request, res: Response) {
      const { uploadId } = parsed(res, 'params', uploadParams);
      res.json({ upload: await uploads.remap(projectAccessOf(res).projectId, uploadId, parsed(res, 'body', remapBody).mapping) });
    },
    async commit(req: Request, res: Response) {
      const { uploadId } = parsed(res, 'params', uploadParams);
      const { confirmDuplicate } = parsed(res, 'body', commitBody);
      res.json(await uploads.commit(projectAccessOf(res).projectId, uploadId, req.user!.id, confirmDuplicate));
    },
    async discard(req: Request, res: Response) {
      const { uploadId } = parsed(res, 'params', uploadParams);
      res.json({ upload: await uploads.discard(projectAccessOf(res).projectId, uploadId, req.user!.id) });
    },
    async raw(_req: Request, res: Response) {
      const { uploadId } = parsed(res, 'params', uploadParams);
      const file = await uploads.raw(projectAccessOf(res).projectId, uploadId);
      // Sent as an opaque download so a browser never renders or runs what an upload contained.
      attachment(res, file.filename, 'application/octet-stream');
      res.setHeader('Digest', `sha-256=${Buffer.from(file.sha256, 'hex').toString('base64')}`);
      res.send(file.content);
    },
    template(layout: 'long' | 'wide') {
      return (_req: Request, res: Response) => {
        attachment(res, `starledger-${layout}-template.csv`, 'text/csv; charset=utf-8');
        res.send(layout === 'long' ? LONG_TEMPLATE : WIDE_TEMPLATE);
      };
    },
  };
}
