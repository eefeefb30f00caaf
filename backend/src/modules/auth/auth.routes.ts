import { Router } from 'express';
import { type Role, roleSchema } from '../../../../shared/roles';
import type { Config } from '../../lib/config';
import { AppError } from '../../lib/errors';
import { logger } from '../../lib/logger';
import { recordAudit } from '../audit/audit.repository';
import { publicRoute, requireSignedIn } from './auth.middleware';
import { client, oidcConfiguration } from './oidc-client';
import { upsertUser } from './users.repository';
import './session-types';

function safeReturnTo(value: unknown): string {
  const path = typeof value === 'string' ? value : '/';
  // Only paths of this app: no scheme, no host, no protocol-relative "//host".
  return path.startsWith('/') && !path.startsWith('//') && !path.startsWith('/\\') ? path : '/';
}

function rolesFromClaims(config: Config, claims: Record<string, unknown>): Role[] {
  const raw = claims[config.roleClaim];
  const groups = Array.isArray(raw) ? raw.map(String) : typeof raw === 'string' ? raw.split(/[ ,]+/) : [];
  const roles = new Set<Role>();
  for (const group of groups) {
    const role = config.roleMap[group] ?? (roleSchema.safeParse(group).success ? (group as Role) : undefined);
    if (role) roles.add(role);
  }
  return [...roles];
}

function messagePage(title: string, message: string): string {
  const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)} · Coppice</title></head><body style="font-family:system-ui,sans-serif;background:#f3ecdf;color:#2f3a40;padding:3rem"><main style="max-width:32rem;margin:auto;background:#fffdf8;border-top:6px solid #2f5d46;padding:2rem;border-radius:8px"><h1 style="color:#2f5d46">${esc(title)}</h1><p>${esc(message)}</p><p><a href="/auth/login">Sign in again</a> · <a href="/">Coppice home</a></p></main></body></html>`;
}

export function authRouter(config: Config): Router {
  const router = Router();
  const redirectUri = `${config.appUrl}/auth/callback`;

  router.get('/auth/login', publicRoute, async (req, res, next) => {
    try {
      const configuration = await oidcConfiguration(config);
      const codeVerifier = client.randomPKCECodeVerifier();
      const state = client.randomState();
      const nonce = client.randomNonce();
      req.session.pendingSignIn = { state, nonce, codeVerifier, returnTo: safeReturnTo(req.query.returnTo) };
      const url = client.buildAuthorizationUrl(configuration, {
        redirect_uri: redirectUri,
        scope: config.oidc.scope,
        code_challenge: await client.calculatePKCECodeChallenge(codeVerifier),
        code_challenge_method: 'S256',
        state,
        nonce,
      });
      req.session.save((error) => (error ? next(error) : res.redirect(url.href)));
    } catch (error) {
      if (error instanceof AppError && error.code === 'identity_provider_unavailable') {
        res.status(503).type('html').send(messagePage('Sign-in is unavailable', error.message));
        return;
      }
      next(error);
    }
  });

  router.get('/auth/callback', publicRoute, async (req, res, next) => {
    const pending = req.session.pendingSignIn;
    if (!pending) {
      res
        .status(400)
        .type('html')
        .send(
          messagePage(
            'Sign-in expired',
            'This sign-in was started too long ago or in another browser. Please sign in again.',
          ),
        );
      return;
    }
    try {
      const configuration = await oidcConfiguration(config);
      const currentUrl = new URL(req.originalUrl, config.appUrl);
      const tokens = await client.authorizationCodeGrant(configuration, currentUrl, {
        pkceCodeVerifier: pending.codeVerifier,
        expectedState: pending.state,
        expectedNonce: pending.nonce,
        idTokenExpected: true,
      });
      const claims = tokens.claims() as Record<string, unknown>;
      const email = String(claims.email ?? '');
      const user = await upsertUser({
        subject: `${configuration.serverMetadata().issuer}#${String(claims.sub)}`,
        email,
        name: String(claims.name ?? email),
        roles: rolesFromClaims(config, claims),
      });
      // A new session id at sign-in: a session id planted before sign-in is worthless afterwards.
      req.session.regenerate((error) => {
        if (error) return next(error);
        req.session.user = user;
        req.session.idToken = tokens.id_token;
        req.session.save(async (saveError) => {
          if (saveError) return next(saveError);
          await recordAudit({
            actor: { id: user.id, email: user.email },
            action: 'auth.sign_in',
            details: { roles: user.roles },
          }).catch((e) => logger.error({ err: e }, 'audit of sign-in failed'));
          res.redirect(pending.returnTo);
        });
      });
    } catch (error) {
      if (error instanceof AppError && error.status === 503) {
        res.status(503).type('html').send(messagePage('Sign-in is unavailable', error.message));
        return;
      }
      logger.warn({ err: error }, 'sign-in callback refused');
      req.session.pendingSignIn = undefined;
      res
        .status(400)
        .type('html')
        .send(
          messagePage(
            'Sign-in failed',
            'The answer from the sign-in service could not be verified. Please sign in again.',
          ),
        );
    }
  });

  router.post('/auth/logout', publicRoute, async (req, res, next) => {
    const user = req.session?.user;
    const idToken = req.session?.idToken;
    let redirectTo = '/';
    try {
      if (idToken) {
        const configuration = await oidcConfiguration(config);
        if (configuration.serverMetadata().end_session_endpoint) {
          redirectTo = client.buildEndSessionUrl(configuration, {
            id_token_hint: idToken,
            post_logout_redirect_uri: `${config.appUrl}/`,
          }).href;
        }
      }
    } catch {
      // The provider is down: the Coppice session still ends.
    }
    req.session.destroy(async (error) => {
      if (error) return next(error);
      res.clearCookie('coppice.sid', { path: '/' });
      if (user) {
        await recordAudit({ actor: { id: user.id, email: user.email }, action: 'auth.sign_out' }).catch(
          () => {},
        );
      }
      if (req.accepts(['json', 'html']) === 'json') res.json({ redirectTo });
      else res.redirect(303, redirectTo);
    });
  });

  router.get('/api/me', requireSignedIn, (req, res) => {
    const user = req.session.user!;
    res.json({ id: user.id, email: user.email, name: user.name, roles: user.roles });
  });

  return router;
}
