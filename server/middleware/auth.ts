import type { Request, RequestHandler } from 'express';
import type { Role } from '../../shared/schemas/common.ts';
import { HttpError } from '../http-error.ts';

declare module 'express-session' {
  interface SessionData {
    userId: number;
    /** The person's session generation at sign-in; a newer one in the database ends this session. */
    sessionGeneration: number;
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

/** A person as the session check needs them. */
export interface LoadedUser {
  user: SignedInUser;
  sessionGeneration: number;
  deactivated: boolean;
}

export type UserLoader = (id: number) => Promise<LoadedUser | undefined>;

/**
 * Loads the session's user or answers 401. A session made before the person's password changed
 * or before they were deactivated (an older session generation) is ended here, at once.
 */
export function requireUser(loadUser: UserLoader): RequestHandler {
  return async (req, _res, next) => {
    const id = req.session?.userId;
    const loaded = id ? await loadUser(id) : undefined;
    if (!loaded) throw new HttpError('unauthenticated', 'Sign in first.');
    if (loaded.deactivated || loaded.sessionGeneration !== (req.session.sessionGeneration ?? 0)) {
      await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
      throw new HttpError(
        'unauthenticated',
        loaded.deactivated
          ? 'Your account has been deactivated, so you were signed out. Ask an admin if this is a mistake.'
          : 'You were signed out because your password was changed. Sign in with the new password.',
      );
    }
    req.user = loaded.user;
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
