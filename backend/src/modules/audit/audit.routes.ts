import { Router } from 'express';
import { auditQuerySchema } from '../../../../shared/audit';
import { currentUser, requireRole } from '../auth/auth.middleware';
import { exportAudit, searchAudit } from './audit.service';

export function auditRouter(): Router {
  const router = Router();

  router.get('/api/audit', requireRole('privacy_officer'), async (req, res) => {
    res.json(await searchAudit(auditQuerySchema.parse(req.query)));
  });

  router.get('/api/audit/export.csv', requireRole('privacy_officer'), async (req, res) => {
    const { csv } = await exportAudit(currentUser(req), auditQuerySchema.parse(req.query));
    const day = new Date().toISOString().slice(0, 10);
    res
      .status(200)
      .type('text/csv; charset=utf-8')
      .attachment(`coppice-audit-trail-${day}.csv`)
      .set('cache-control', 'no-store')
      .send(`\uFEFF${csv}`);
  });

  return router;
}
