import type { Request, RequestHandler } from 'express';
import type { Role } from '../../shared/schemas/common.ts';
import { HttpError } from '../http-error.ts';

declare module 'express-session' {
  interface SessionData {
    userId: number;
  }
}

declare global {
  namespace Express {
    interface Request {
      /** The signed-in person, set by `requireUser`. */
      user?: SignedInUser;
    }
  }
}

export interface SignedInUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

export type UserLoader = (id: number) => Promise<SignedInUser | undefined>;

/** Loads the session's user or answers 401. */
export function requireUser(loadUser: UserLoader): RequestHandler {
  return async (req, _res, next) => {
    const id = req.session?.userId;
    const user = id ? await loadUser(id) : undefined;
    if (!user) throw new HttpError('unauthenticated', 'Sign in first.');
    req.user = user;
    next();
  };
}

/** What each role may do beyond reading and entering readings. */
const roleNames: Record<Role, string> = { admin: 'an admin', reviewer: 'a reviewer', tester: 'a tester' };

export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    const user = currentUser(req);
    if (!roles.includes(user.role)) {
      const allowed = roles.map((r) => roleNames[r]).join(' or ');
      throw new HttpError('forbidden', `Only ${allowed} can do this; you are signed in as ${roleNames[user.role]}.`);
    }
    next();
  };
}

export function currentUser(req: Request): SignedInUser {
  if (!req.user) throw new HttpError('unauthenticated', 'Sign in first.');
  return req.user;
}
