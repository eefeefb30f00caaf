import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import request from 'supertest';
import { CookieJar, followAtProvider } from './sign-in';

export type CoppiceProcess = { child: ChildProcess; output: () => string; stop: () => Promise<void> };

/**
 * Starts the built app server or job worker (`dist/server/server.js`, `dist/server/worker.js`) as a
 * process of its own, as `npm run serve` / `npm run worker` do, and resolves once its output
 * matches `ready`.
 */
export function spawnCoppice(
  entry: 'server' | 'worker',
  env: Record<string, string>,
  ready: RegExp,
  timeoutMs = 60_000,
): Promise<CoppiceProcess> {
  // The built bundles, as production runs them (npm test builds them first; see scripts/build-server.mjs).
  const bundle = `dist/server/${entry}.js`;
  if (!existsSync(bundle)) {
    return Promise.reject(new Error(`${bundle} is missing: run \`npm run build:server\` first.`));
  }
  const child = spawn(process.execPath, ['--enable-source-maps', bundle], {
    env: { PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '/tmp', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null || child.signalCode !== null) return resolve();
      const force = setTimeout(() => child.kill('SIGKILL'), 10_000);
      child.once('exit', () => {
        clearTimeout(force);
        resolve();
      });
      child.kill('SIGTERM');
    });
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => {
      void stop();
      reject(new Error(`${entry} did not start within ${timeoutMs} ms:\n${output.slice(-2000)}`));
    }, timeoutMs);
    const onData = (chunk: Buffer) => {
      output += chunk.toString();
      if (ready.test(output)) {
        clearTimeout(timer);
        resolve({ child, output: () => output, stop });
      }
    };
    child.stdout.on('data', onData);
    child.stderr.on('data', onData);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`${entry} exited with ${code} before it was ready:\n${output.slice(-2000)}`));
    });
  });
}

/**
 * The authorization-code flow over real HTTP, started at one app process and finished at another
 * (as behind a load balancer): returns a supertest agent for each process holding the cookie.
 */
export async function signInAcross(
  startUrl: string,
  finishUrl: string,
  email: string,
  password = 'quillfern-demo',
) {
  const starter = request.agent(startUrl);
  const login = await starter.get('/auth/login?returnTo=/');
  if (login.status !== 302) throw new Error(`/auth/login answered ${login.status}`);
  const jar = new CookieJar();
  const atForm = await followAtProvider(login.headers.location, jar);
  const html = await atForm.text();
  const action = /<form method="post" action="([^"]+)"/.exec(html)?.[1];
  if (!action) throw new Error('no sign-in form at the provider');
  const providerOrigin = new URL(login.headers.location).origin;
  const posted = await fetch(new URL(action, providerOrigin), {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar.header() },
    body: new URLSearchParams({ username: email, password }),
  });
  jar.store(posted);
  const final = await followAtProvider(new URL(posted.headers.get('location')!, providerOrigin).href, jar);
  const callback = new URL(final.headers.get('location')!, providerOrigin);
  const cookie = String(login.headers['set-cookie'] ?? '').split(';')[0];
  const finished = await request(finishUrl)
    .get(callback.pathname + callback.search)
    .set('cookie', cookie);
  if (finished.status !== 302) throw new Error(`callback answered ${finished.status}: ${finished.text}`);
  const session = String(finished.headers['set-cookie'] ?? '').split(';')[0];
  return { cookie: session };
}
