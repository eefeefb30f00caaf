import { Router } from 'express';
import { db } from '../../lib/db';
import { publicRoute } from '../auth/auth.middleware';

export function healthRouter(): Router {
  const router = Router();
  router.get('/api/health', publicRoute, async (_req, res) => {
    try {
      await Promise.race([
        db().query('SELECT 1'),
        new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 2000)),
      ]);
      res.json({ status: 'ok', db: 'ok' });
    } catch {
      res.status(503).json({ status: 'degraded', db: 'down' });
    }
  });
  return router;
}
