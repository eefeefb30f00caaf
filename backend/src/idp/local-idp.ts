import { generateKeyPairSync, timingSafeEqual } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import path from 'node:path';
import express from 'express';
import Provider, { type KoaContextWithOIDC } from 'oidc-provider';
import demoAccounts from '../../../config/demo-accounts.json' with { type: 'json' };
import { logger } from '../lib/logger';
import { localIdpAdapterFactory } from './memory-adapter';
import { confirmSignOutPage, escapeHtml, loginPage, signedOutPage } from './pages';

/**
 * The local OpenID Connect provider for development, tests and the demo: oidc-provider on its own
 * loopback port with the seeded demo accounts of config/demo-accounts.json. Never started in
 * production, where the app talks to the organisation's own provider with the same client code.
 */
export type LocalIdpOptions = {
  port: number;
  host?: string;
  clientId: string;
  clientSecret: string;
  redirectUris: string[];
  postLogoutRedirectUris: string[];
  password: string;
  cookieKey: string;
  dataDir: string;
};

export type DemoAccount = { sub: string; email: string; name: string; groups: string[] };
export const DEMO_ACCOUNTS: DemoAccount[] = demoAccounts.accounts;

function signingKeys(dataDir: string) {
  const file = path.join(dataDir, 'idp-jwks.json');
  if (existsSync(file)) return JSON.parse(readFileSync(file, 'utf8'));
  const { privateKey } = generateKeyPairSync('rsa', { modulusLength: 2048 });
  const jwk = {
    ...privateKey.export({ format: 'jwk' }),
    kid: `local-${Date.now()}`,
    use: 'sig',
    alg: 'RS256',
  };
  const jwks = { keys: [jwk] };
  mkdirSync(dataDir, { recursive: true });
  writeFileSync(file, JSON.stringify(jwks), { mode: 0o600 });
  return jwks;
}

function samePassword(given: string, expected: string): boolean {
  const a = Buffer.from(given);
  const b = Buffer.from(expected);
  return a.length === b.length && timingSafeEqual(a, b);
}

export function findDemoAccount(email: string): DemoAccount | undefined {
  const wanted = email.trim().toLowerCase();
  return DEMO_ACCOUNTS.find((a) => a.email === wanted);
}

export async function startLocalIdp(
  options: LocalIdpOptions,
): Promise<{ issuer: string; stop: () => Promise<void> }> {
  const host = options.host ?? '127.0.0.1';
  const issuer = `http://${host}:${options.port}/oidc`;

  const provider = new Provider(issuer, {
    adapter: localIdpAdapterFactory(),
    clients: [
      {
        client_id: options.clientId,
        client_secret: options.clientSecret,
        redirect_uris: options.redirectUris,
        post_logout_redirect_uris: options.postLogoutRedirectUris,
        grant_types: ['authorization_code'],
        response_types: ['code'],
        token_endpoint_auth_method: 'client_secret_basic',
      },
    ],
    pkce: { required: () => true },
    scopes: ['openid', 'email', 'profile', 'groups'],
    claims: { openid: ['sub'], email: ['email', 'email_verified'], profile: ['name'], groups: ['groups'] },
    conformIdTokenClaims: false,
    findAccount: async (_ctx: KoaContextWithOIDC, sub: string) => {
      const account = DEMO_ACCOUNTS.find((a) => a.sub === sub);
      if (!account) return undefined;
      return {
        accountId: sub,
        claims: async () => ({
          sub,
          email: account.email,
          email_verified: true,
          name: account.name,
          groups: account.groups,
        }),
      };
    },
    // The app is a first-party client: its grant is created here, so no consent page is shown.
    loadExistingGrant: async (ctx: KoaContextWithOIDC) => {
      const grantId =
        ctx.oidc.result?.consent?.grantId || ctx.oidc.session!.grantIdFor(ctx.oidc.client!.clientId);
      if (grantId) return ctx.oidc.provider.Grant.find(grantId);
      const grant = new ctx.oidc.provider.Grant({
        clientId: ctx.oidc.client!.clientId,
        accountId: ctx.oidc.session!.accountId,
      });
      grant.addOIDCScope('openid email profile groups');
      grant.addOIDCClaims(['email', 'email_verified', 'name', 'groups']);
      await grant.save();
      return grant;
    },
    interactions: {
      url: (_ctx: KoaContextWithOIDC, interaction: { uid: string }) => `/interaction/${interaction.uid}`,
    },
    features: {
      devInteractions: { enabled: false },
      rpInitiatedLogout: {
        enabled: true,
        logoutSource: async (ctx: KoaContextWithOIDC, form: string) => {
          ctx.body = confirmSignOutPage(form);
        },
        postLogoutSuccessSource: async (ctx: KoaContextWithOIDC) => {
          ctx.body = signedOutPage();
        },
      },
    },
    jwks: signingKeys(options.dataDir),
    cookies: { keys: [options.cookieKey] },
    ttl: {
      Session: 8 * 3600,
      Interaction: 600,
      Grant: 8 * 3600,
      AccessToken: 3600,
      IdToken: 3600,
      AuthorizationCode: 120,
    },
    renderError: async (ctx: KoaContextWithOIDC, out: { error: string; error_description?: string }) => {
      ctx.type = 'html';
      ctx.body = loginPage({
        action: '#',
        email: '',
        error: `Sign-in could not continue: ${escapeHtml(String(out.error_description ?? out.error))}. Go back to Coppice and start again.`,
        disabled: true,
      });
    },
  });
  provider.proxy = false;

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', false);

  app.use(
    '/idp-assets',
    express.static(path.resolve('node_modules/@fontsource/work-sans/files'), { maxAge: '1d', index: false }),
  );

  app.get('/interaction/:uid', async (req, res, next) => {
    try {
      const details = await provider.interactionDetails(req, res);
      res.type('html').send(
        loginPage({
          action: `/interaction/${details.uid}/login`,
          email: String(details.params.login_hint ?? ''),
        }),
      );
    } catch (error) {
      next(error);
    }
  });

  app.post(
    '/interaction/:uid/login',
    express.urlencoded({ extended: false, limit: '4kb' }),
    async (req, res, next) => {
      try {
        const details = await provider.interactionDetails(req, res);
        const username = String(req.body?.username ?? '');
        const password = String(req.body?.password ?? '');
        const account = findDemoAccount(username);
        if (!account || !samePassword(password, options.password)) {
          res
            .status(401)
            .type('html')
            .send(
              loginPage({
                action: `/interaction/${details.uid}/login`,
                email: username,
                error: 'That e-mail and password do not match a Coppice account. Check both and try again.',
              }),
            );
          return;
        }
        await provider.interactionFinished(
          req,
          res,
          { login: { accountId: account.sub } },
          { mergeWithLastSubmission: false },
        );
      } catch (error) {
        next(error);
      }
    },
  );

  app.use('/oidc', provider.callback());

  app.use((error: unknown, _req: express.Request, res: express.Response, _next: express.NextFunction) => {
    logger.warn({ err: error }, 'local identity provider error');
    res
      .status(400)
      .type('html')
      .send(
        loginPage({
          action: '#',
          email: '',
          error: 'This sign-in link has expired or is not valid. Go back to Coppice and sign in again.',
          disabled: true,
        }),
      );
  });

  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(options.port, host, () => resolve(s));
    s.on('error', reject);
  });
  return {
    issuer,
    stop: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
