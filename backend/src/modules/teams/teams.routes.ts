import { Router } from 'express';
import { publishBodySchema } from '../../../../shared/briefs';
import type { Config } from '../../lib/config';
import { currentUser, requireRole } from '../auth/auth.middleware';
import { briefToCsv } from './brief-csv';
import {
  listTeamsText,
  publicationsOfRun,
  publishRun,
  viewBrief,
  viewBriefText,
  withdrawBriefsOnPolicyChange,
} from './teams.service';

export function teamsRouter(config: Config): Router {
  withdrawBriefsOnPolicyChange();
  const router = Router();

  router.post('/api/models/:id/publish', requireRole('privacy_officer'), async (req, res) => {
    const body = publishBodySchema.parse(req.body ?? {});
    res.status(202).json(await publishRun(currentUser(req), String(req.params.id), body, config.appUrl));
  });

  router.get('/api/models/:id/publications', requireRole('analyst', 'privacy_officer'), async (req, res) => {
    res.json(await publicationsOfRun(String(req.params.id)));
  });

  router.get('/api/teams', requireRole('manager', 'analyst', 'privacy_officer'), async (req, res) => {
    res.set('Cache-Control', 'no-store');
    res.type('application/json').send(await listTeamsText(currentUser(req)));
  });

  router.get(
    '/api/teams/:id/brief',
    requireRole('manager', 'analyst', 'privacy_officer'),
    async (req, res) => {
      const brief = await viewBriefText(currentUser(req), String(req.params.id), 'json');
      res.set('Cache-Control', 'no-store');
      res.type('application/json').send(brief);
    },
  );

  router.get(
    '/api/teams/:id/brief.csv',
    requireRole('manager', 'analyst', 'privacy_officer'),
    async (req, res) => {
      const brief = await viewBrief(currentUser(req), String(req.params.id), 'csv');
      const name =
        brief.team.name
          .replace(/[^A-Za-z0-9 _-]/g, '')
          .trim()
          .replace(/\s+/g, '-') || 'team';
      res.set('Cache-Control', 'no-store');
      res.attachment(`team-brief-${name}.csv`);
      res.type('text/csv; charset=utf-8').send(briefToCsv(brief));
    },
  );

  return router;
}
