import request from 'supertest';
import type { Running } from '../../backend/src/runtime';

/** The session id in an agent's cookie jar, or undefined before there is a session. */
export function sessionId(agent: request.Agent): string | undefined {
  return agent.jar.getCookie('coppice.sid', { path: '/', domain: '127.0.0.1', secure: false, script: false })
    ?.value;
}

/** An agent's session as a Cookie header (`coppice.sid=…`), to replay it from elsewhere. */
export function sessionCookie(agent: request.Agent): string {
  const id = sessionId(agent);
  if (!id) throw new Error('no session cookie');
  return `coppice.sid=${id}`;
}

/** A minimal cookie jar for talking to the identity provider with fetch. */
export class CookieJar {
  private cookies = new Map<string, string>();
  store(response: Response) {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      if (/expires=Thu, 01 Jan 1970/i.test(line) || value === '') this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }
  header(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }
}

/** Follows redirects at the identity provider until one leaves it; returns that last URL. */
export async function followAtProvider(start: string, jar: CookieJar, init?: RequestInit): Promise<Response> {
  let response = await fetch(start, {
    ...init,
    redirect: 'manual',
    headers: { ...init?.headers, cookie: jar.header() },
  });
  jar.store(response);
  let url = start;
  for (let hops = 0; hops < 10 && response.status >= 300 && response.status < 400; hops++) {
    url = new URL(response.headers.get('location')!, url).href;
    if (!url.includes('/oidc') && !url.includes('/interaction/')) break;
    response = await fetch(url, { redirect: 'manual', headers: { cookie: jar.header() } });
    jar.store(response);
  }
  return response;
}

export type SignInSteps = {
  agent: request.Agent;
  /** The provider's answer to the login form (200 page on a wrong password, redirect otherwise). */
  loginResponse: Response;
  /** Where the provider finally sent the browser (the app's callback URL) or null. */
  callbackUrl: URL | null;
};

/** Runs the real authorization-code flow: app → provider → login form → provider → app callback. */
export async function startSignIn(running: Running, email: string, password: string): Promise<SignInSteps> {
  const agent = request.agent(running.app);
  const login = await agent.get('/auth/login?returnTo=/datasets');
  if (login.status !== 302) throw new Error(`/auth/login answered ${login.status}: ${login.text}`);
  const jar = new CookieJar();
  const atForm = await followAtProvider(login.headers.location, jar);
  const formUrl = atForm.url || '';
  const html = await atForm.text();
  const action = /<form method="post" action="([^"]+)"/.exec(html)?.[1];
  if (!action)
    throw new Error(`no sign-in form at the provider (${atForm.status} ${formUrl}): ${html.slice(0, 300)}`);
  const providerOrigin = new URL(login.headers.location).origin;
  const loginResponse = await fetch(new URL(action, providerOrigin), {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar.header() },
    body: new URLSearchParams({ username: email, password }),
  });
  jar.store(loginResponse);
  if (loginResponse.status < 300 || loginResponse.status >= 400)
    return { agent, loginResponse, callbackUrl: null };
  const next = new URL(loginResponse.headers.get('location')!, providerOrigin).href;
  const final = await followAtProvider(next, jar);
  const location = final.headers.get('location');
  const callbackUrl = location ? new URL(location, providerOrigin) : null;
  return { agent, loginResponse, callbackUrl };
}

/** Signs in through the provider and returns the app agent holding the session cookie. */
export async function signInAgent(running: Running, email: string, password: string): Promise<request.Agent> {
  const steps = await startSignIn(running, email, password);
  if (!steps.callbackUrl)
    throw new Error(`sign-in as ${email} refused by the provider (${steps.loginResponse.status})`);
  const callback = await steps.agent.get(steps.callbackUrl.pathname + steps.callbackUrl.search);
  if (callback.status !== 302)
    throw new Error(`callback answered ${callback.status}: ${callback.text.slice(0, 300)}`);
  return steps.agent;
}
