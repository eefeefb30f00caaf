import { type NextFunction, type Request, type Response, Router } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { datasetMappingSchema } from '../../../../shared/datasets';
import type { Config } from '../../lib/config';
import { AppError, notFound } from '../../lib/errors';
import { currentUser, requireRole } from '../auth/auth.middleware';
import {
  deleteDataset,
  getDataset,
  listDatasets,
  mapDataset,
  previewMapping,
  uploadDataset,
} from './datasets.service';

const idSchema = z.uuid();

function datasetId(req: Request): string {
  const parsed = idSchema.safeParse(req.params.id);
  if (!parsed.success) throw notFound('The dataset');
  return parsed.data;
}

function receiveFile(config: Config) {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: config.uploadMaxBytes, files: 1, fields: 5, fieldSize: 1024 },
  }).single('file');
  const maxMb = Math.round(config.uploadMaxBytes / 1024 / 1024);
  return (req: Request, res: Response, next: NextFunction) => {
    upload(req, res, (error: unknown) => {
      if (!error) return next();
      const code = (error as { code?: string }).code;
      if (code === 'LIMIT_FILE_SIZE') {
        return next(
          new AppError(
            'file_too_large',
            413,
            `The file is larger than ${maxMb} MB. Split the export (for example by region) or remove columns you do not need, and upload again.`,
            { limitBytes: config.uploadMaxBytes },
          ),
        );
      }
      next(
        new AppError(
          'upload_invalid',
          400,
          'Send one file in the form field "file" (multipart/form-data).',
          code ? { reason: code } : undefined,
        ),
      );
    });
  };
}

export function datasetsRouter(config: Config): Router {
  const router = Router();

  router.post('/api/datasets', requireRole('analyst'), receiveFile(config), async (req, res) => {
    const user = currentUser(req);
    if (!req.file) {
      throw new AppError(
        'file_missing',
        400,
        'Choose a staff export (.xlsx or .csv) to upload, in the form field "file".',
      );
    }
    const body = (req.body ?? {}) as { name?: string; sheet?: string };
    const dataset = await uploadDataset({
      bytes: new Uint8Array(req.file.buffer.buffer, req.file.buffer.byteOffset, req.file.buffer.byteLength),
      fileName: Buffer.from(req.file.originalname, 'latin1').toString('utf8'),
      name: typeof body.name === 'string' ? body.name : undefined,
      sheet: typeof body.sheet === 'string' ? body.sheet : undefined,
      user,
      config,
    });
    res.status(201).json(dataset);
  });

  router.get('/api/datasets', requireRole('analyst', 'privacy_officer'), async (_req, res) => {
    res.json(await listDatasets());
  });

  router.get('/api/datasets/:id', requireRole('analyst', 'privacy_officer'), async (req, res) => {
    res.json(await getDataset(datasetId(req)));
  });

  router.put('/api/datasets/:id/mapping', requireRole('analyst'), async (req, res) => {
    const id = datasetId(req);
    const mapping = datasetMappingSchema.parse(req.body);
    res.json(await mapDataset(id, mapping, currentUser(req)));
  });

  router.post('/api/datasets/:id/mapping/preview', requireRole('analyst'), async (req, res) => {
    const id = datasetId(req);
    const mapping = datasetMappingSchema.parse(req.body);
    res.json({ preview: await previewMapping(id, mapping) });
  });

  router.delete('/api/datasets/:id', requireRole('analyst', 'privacy_officer'), async (req, res) => {
    await deleteDataset(datasetId(req), currentUser(req));
    res.status(204).end();
  });

  return router;
}
