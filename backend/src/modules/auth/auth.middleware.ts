import type { RequestHandler } from 'express';
import type { Role } from '../../../../shared/roles';
import { AppError } from '../../lib/errors';
import { markAccess } from '../../lib/route-table';
import './session-types';

/** 401 JSON for anyone not signed in. */
export const requireSignedIn: RequestHandler = markAccess<RequestHandler>(
  (req, _res, next) => {
    if (!req.session?.user) {
      next(new AppError('not_signed_in', 401, 'Please sign in to continue.'));
      return;
    }
    next();
  },
  { kind: 'signed-in' },
);

/** Marks a route as open to everyone, on purpose (health, sign-in). */
export const publicRoute: RequestHandler = markAccess<RequestHandler>((_req, _res, next) => next(), {
  kind: 'public',
});

/** Allows the request when the signed-in user holds at least one of `roles`; 401 or 403 otherwise. */
export function requireRole(...roles: Role[]): RequestHandler {
  return markAccess<RequestHandler>(
    (req, _res, next) => {
      const user = req.session?.user;
      if (!user) {
        next(new AppError('not_signed_in', 401, 'Please sign in to continue.'));
        return;
      }
      if (!user.roles.some((r) => roles.includes(r))) {
        next(
          new AppError(
            'forbidden',
            403,
            `This needs the role ${roles.map((r) => `"${r}"`).join(' or ')}; you are signed in as ${user.roles.join(', ') || 'no role'}.`,
          ),
        );
        return;
      }
      next();
    },
    { kind: 'roles', roles },
  );
}

/** The signed-in user of a request that passed requireSignedIn or requireRole. */
export function currentUser(req: Express.Request) {
  const user = (req as unknown as { session: { user?: import('./session-types').SessionUser } }).session.user;
  if (!user) throw new AppError('not_signed_in', 401, 'Please sign in to continue.');
  return user;
}
