import { Router } from 'express';
import { policyUpdateSchema } from '../../../../shared/policy';
import { currentUser, requireRole } from '../auth/auth.middleware';
import { changePolicy, currentPolicy, policyHistory } from './policy.service';

export function policyRouter(): Router {
  const router = Router();

  router.get('/api/policy', requireRole('analyst', 'privacy_officer'), async (_req, res) => {
    res.json(await currentPolicy());
  });

  router.get('/api/policy/versions', requireRole('analyst', 'privacy_officer'), async (_req, res) => {
    res.json(await policyHistory());
  });

  router.put('/api/policy', requireRole('privacy_officer'), async (req, res) => {
    const update = policyUpdateSchema.parse(req.body);
    res.json(await changePolicy(currentUser(req), update));
  });

  return router;
}
