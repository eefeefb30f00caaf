import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { z } from 'zod';
import rolesFile from '../../../config/roles.json' with { type: 'json' };
import { type Role, roleSchema } from '../../../shared/roles';

/**
 * Configuration is read once from the environment and checked here. Outside production every
 * missing piece falls back to a local one (PostgreSQL cluster, identity provider, mail sink and
 * secrets kept in the ignored data folder); in production nothing falls back and a missing value
 * stops the process with a list of what to set.
 */
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(8080),
  APP_URL: z.url().optional(),
  DATA_DIR: z.string().default('.data'),
  DATABASE_URL: z.string().optional(),
  PGPORT: z.coerce.number().int().default(55432),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters').optional(),
  EMPLOYEE_ID_SECRET: z.string().min(32, 'EMPLOYEE_ID_SECRET must be at least 32 characters').optional(),
  OIDC_ISSUER: z.url().optional(),
  OIDC_CLIENT_ID: z.string().optional(),
  OIDC_CLIENT_SECRET: z.string().optional(),
  OIDC_SCOPE: z.string().default('openid email profile groups'),
  ROLE_CLAIM: z.string().optional(),
  ROLE_MAP: z.string().optional(),
  IDP_PORT: z.coerce.number().int().min(0).max(65535).default(8081),
  DEMO_PASSWORD: z.string().default('quillfern-demo'),
  SMTP_URL: z.string().optional(),
  SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(8025),
  MAIL_FROM: z.string().default('Coppice <coppice@quillfern.example>'),
  UPLOAD_MAX_MB: z.coerce.number().positive().default(64),
  TRUST_PROXY: z.string().optional(),
  LOG_LEVEL: z.string().default('info'),
  RUN_WORKERS: z.enum(['true', 'false']).default('true'),
});

export type Config = {
  env: 'development' | 'test' | 'production';
  production: boolean;
  host: string;
  port: number;
  appUrl: string;
  dataDir: string;
  databaseUrl: string;
  sessionSecret: string;
  employeeIdSecret: string;
  oidc: { issuer: string; clientId: string; clientSecret: string; scope: string; local: boolean };
  roleClaim: string;
  roleMap: Record<string, Role>;
  localIdp: { port: number; demoPassword: string } | null;
  mail: { smtpUrl: string | null; sinkPort: number | null; from: string };
  uploadMaxBytes: number;
  trustProxy: string | undefined;
  logLevel: string;
  runWorkers: boolean;
};

export class ConfigError extends Error {}

function localSecrets(dataDir: string): Record<string, string> {
  const file = path.join(dataDir, 'secrets.json');
  const wanted = ['sessionSecret', 'employeeIdSecret', 'oidcClientSecret', 'idpCookieKey'];
  let secrets: Record<string, string> = {};
  if (existsSync(file)) secrets = JSON.parse(readFileSync(file, 'utf8'));
  let changed = false;
  for (const key of wanted) {
    if (!secrets[key]) {
      secrets[key] = randomBytes(32).toString('hex');
      changed = true;
    }
  }
  if (changed) {
    mkdirSync(dataDir, { recursive: true });
    writeFileSync(file, JSON.stringify(secrets, null, 2), { mode: 0o600 });
  }
  return secrets;
}

export function loadConfig(source: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `- ${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`Coppice cannot start; fix these settings:\n${lines.join('\n')}`);
  }
  const env = parsed.data;
  const production = env.NODE_ENV === 'production';

  if (production) {
    const required = [
      'DATABASE_URL',
      'SESSION_SECRET',
      'EMPLOYEE_ID_SECRET',
      'OIDC_ISSUER',
      'OIDC_CLIENT_ID',
      'OIDC_CLIENT_SECRET',
      'APP_URL',
      'SMTP_URL',
    ] as const;
    const missing = required.filter((key) => !env[key]);
    if (missing.length) {
      throw new ConfigError(
        `Coppice refuses to start in production without these settings:\n${missing.map((m) => `- ${m}`).join('\n')}\n` +
          'No local identity provider, mail sink or demo accounts run in production.',
      );
    }
  }

  const dataDir = path.resolve(env.DATA_DIR);
  const secrets = production ? {} : localSecrets(dataDir);
  const localOidc = !production && !env.OIDC_ISSUER;

  let roleMap: Record<string, Role> = rolesFile.map as Record<string, Role>;
  if (env.ROLE_MAP) {
    const parsedMap = z.record(z.string(), roleSchema).safeParse(JSON.parse(env.ROLE_MAP));
    if (!parsedMap.success) throw new ConfigError('ROLE_MAP must be a JSON object of group name → role');
    roleMap = parsedMap.data;
  }

  const appUrl = (env.APP_URL ?? `http://${env.HOST}:${env.PORT}`).replace(/\/$/, '');
  return {
    env: env.NODE_ENV,
    production,
    host: env.HOST,
    port: env.PORT,
    appUrl,
    dataDir,
    databaseUrl: env.DATABASE_URL ?? `postgres://coppice@127.0.0.1:${env.PGPORT}/coppice`,
    sessionSecret: env.SESSION_SECRET ?? secrets.sessionSecret,
    employeeIdSecret: env.EMPLOYEE_ID_SECRET ?? secrets.employeeIdSecret,
    oidc: {
      issuer: env.OIDC_ISSUER ?? `http://127.0.0.1:${env.IDP_PORT}/oidc`,
      clientId: env.OIDC_CLIENT_ID ?? 'coppice-web',
      clientSecret: env.OIDC_CLIENT_SECRET ?? secrets.oidcClientSecret,
      scope: env.OIDC_SCOPE,
      local: localOidc,
    },
    roleClaim: env.ROLE_CLAIM ?? rolesFile.claim,
    roleMap,
    localIdp: localOidc ? { port: env.IDP_PORT, demoPassword: env.DEMO_PASSWORD } : null,
    mail: {
      smtpUrl: env.SMTP_URL ?? null,
      sinkPort: !production && !env.SMTP_URL ? env.SMTP_PORT : null,
      from: env.MAIL_FROM,
    },
    uploadMaxBytes: Math.round(env.UPLOAD_MAX_MB * 1024 * 1024),
    trustProxy: env.TRUST_PROXY,
    logLevel: env.LOG_LEVEL,
    runWorkers: env.RUN_WORKERS === 'true',
  };
}

/** Secret used by the local identity provider for its cookies (development and tests only). */
export function localIdpCookieKey(config: Config): string {
  return localSecrets(config.dataDir).idpCookieKey;
}
