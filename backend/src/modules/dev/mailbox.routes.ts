import { Router } from 'express';
import { sinkMessages } from '../../mail/mail-sink';
import { publicRoute } from '../auth/auth.middleware';

/** `GET /dev/mailbox`: what the local mail sink received. Mounted only while the sink runs. */
export function mailboxRouter(): Router {
  const router = Router();
  router.get('/dev/mailbox', publicRoute, (_req, res) => {
    res.json(sinkMessages());
  });
  return router;
}
