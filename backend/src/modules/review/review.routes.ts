import { Router } from 'express';
import { z } from 'zod';
import { approvalSchema, proxyDecisionSchema } from '../../../../shared/privacy';
import { notFound } from '../../lib/errors';
import { currentUser, requireRole } from '../auth/auth.middleware';
import { modelRunFairness } from './fairness.service';
import { approvalStatus, decideApproval, decideProxy, getProxyReport, reviewQueue } from './review.service';

const datasetId = (id: unknown): string => {
  const parsed = z.uuid().safeParse(id);
  if (!parsed.success) throw notFound('The dataset');
  return parsed.data;
};

export function reviewRouter(): Router {
  const router = Router();

  router.get('/api/datasets/:id/proxies', requireRole('analyst', 'privacy_officer'), async (req, res) => {
    res.json(await getProxyReport(datasetId(req.params.id)));
  });

  router.post('/api/datasets/:id/proxies/decisions', requireRole('privacy_officer'), async (req, res) => {
    const body = proxyDecisionSchema.parse(req.body);
    res.json(await decideProxy(currentUser(req), datasetId(req.params.id), body));
  });

  router.get('/api/datasets/:id/approval', requireRole('analyst', 'privacy_officer'), async (req, res) => {
    res.json(await approvalStatus(datasetId(req.params.id)));
  });

  router.post('/api/datasets/:id/approval', requireRole('privacy_officer'), async (req, res) => {
    const body = approvalSchema.parse(req.body ?? {});
    res.json(await decideApproval(currentUser(req), datasetId(req.params.id), body));
  });

  router.get('/api/models/:id/fairness', requireRole('privacy_officer'), async (req, res) => {
    const parsed = z.uuid().safeParse(req.params.id);
    if (!parsed.success) throw notFound('The model run');
    res.json(await modelRunFairness(currentUser(req), parsed.data));
  });

  router.get('/api/review-queue', requireRole('privacy_officer'), async (_req, res) => {
    res.json(await reviewQueue());
  });

  return router;
}
