import { Router } from 'express';
import { z } from 'zod';
import {
  driverActionSchema,
  modelRunRequestSchema,
  publicationRequestSchema,
  sendBackSchema,
} from '../../../../shared/models';
import type { Config } from '../../lib/config';
import { notFound } from '../../lib/errors';
import { currentUser, requireRole } from '../auth/auth.middleware';
import {
  cancelRun,
  connectModelRuns,
  createModelRun,
  featureOptions,
  getRun,
  listRuns,
  requestPublication,
  sendBack,
  setDriverAction,
} from './models.service';

const idSchema = z.uuid();

/** A malformed id cannot name a run: 404 rather than a database error. */
function runId(value: unknown): string {
  const parsed = idSchema.safeParse(value);
  if (!parsed.success) throw notFound('The model run');
  return parsed.data;
}

export function modelsRouter(config: Config): Router {
  connectModelRuns();
  const router = Router();
  const readers = requireRole('analyst', 'privacy_officer');

  router.post('/api/models', requireRole('analyst'), async (req, res) => {
    const body = modelRunRequestSchema.parse(req.body);
    res.status(202).json(await createModelRun(currentUser(req), body));
  });

  router.get('/api/models', readers, async (req, res) => {
    const datasetId = typeof req.query.datasetId === 'string' ? req.query.datasetId : undefined;
    if (datasetId !== undefined && !idSchema.safeParse(datasetId).success) {
      res.json([]);
      return;
    }
    res.json(await listRuns({ datasetId }));
  });

  router.get('/api/models/feature-options', requireRole('analyst'), async (req, res) => {
    const parsed = idSchema.safeParse(req.query.datasetId);
    if (!parsed.success) throw notFound('The dataset');
    res.json(await featureOptions(parsed.data));
  });

  router.get('/api/models/:id', readers, async (req, res) => {
    res.json(await getRun(runId(req.params.id)));
  });

  router.post('/api/models/:id/cancel', requireRole('analyst'), async (req, res) => {
    res.json(await cancelRun(currentUser(req), runId(req.params.id)));
  });

  router.put('/api/models/:id/drivers/:feature/action', requireRole('analyst'), async (req, res) => {
    const { text } = driverActionSchema.parse(req.body);
    res.json(await setDriverAction(currentUser(req), runId(req.params.id), String(req.params.feature), text));
  });

  router.post('/api/models/:id/publication-request', requireRole('analyst'), async (req, res) => {
    const { comment } = publicationRequestSchema.parse(req.body ?? {});
    res.json(await requestPublication(currentUser(req), runId(req.params.id), comment, config.appUrl));
  });

  router.post('/api/models/:id/send-back', requireRole('privacy_officer'), async (req, res) => {
    const { comment } = sendBackSchema.parse(req.body);
    res.json(await sendBack(currentUser(req), runId(req.params.id), comment, config.appUrl));
  });

  return router;
}
