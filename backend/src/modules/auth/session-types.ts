import type { Role } from '../../../../shared/roles';

export type SessionUser = { id: string; email: string; name: string; roles: Role[] };

declare module 'express-session' {
  interface SessionData {
    user?: SessionUser;
    idToken?: string;
    pendingSignIn?: { state: string; nonce: string; codeVerifier: string; returnTo: string };
  }
}
