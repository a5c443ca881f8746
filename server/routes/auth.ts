import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { changePasswordBodySchema, signInBodySchema } from '../../shared/schemas/auth.ts';
import type { DB } from '../db/database.ts';
import { findUserByEmail, findUserById, updateUser, verifyPassword } from '../db/users.ts';
import { HttpError } from '../http-error.ts';
import { currentUser, requireUser, type UserLoader } from '../middleware/auth.ts';

export function authRoutes(db: DB, loadUser: UserLoader, options: { signInAttemptsPerMinute: number }): Router {
  const router = Router();
  const signInLimit = rateLimit({
    windowMs: 60_000,
    limit: options.signInAttemptsPerMinute,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) =>
      next(new HttpError('too_many_requests', 'Too many sign-in attempts. Wait a minute and try again.')),
  });

  router.post('/sign-in', signInLimit, async (req, res) => {
    const body = signInBodySchema.parse(req.body);
    const user = await findUserByEmail(db, body.email);
    if (!(await verifyPassword(user, body.password)) || !user) {
      throw new HttpError('unauthenticated', 'That e-mail and password do not match an account.');
    }
    // Said only once the password matched, so it tells a guesser nothing.
    if (user.deactivated_at !== null) {
      throw new HttpError('forbidden', 'This account has been deactivated, so it cannot sign in. Ask an admin of your company to reactivate it.');
    }
    // A new session id at sign-in, so a session id planted before sign-in is worthless.
    await new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
    req.session.userId = user.id;
    req.session.sessionGeneration = user.session_generation;
    await new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
    res.json({ user: { id: user.id, email: user.email, name: user.name, role: user.role } });
  });

  /**
   * Signing out ends this session. Without one (already signed out, session expired or ended
   * elsewhere) it answers 204 all the same: the outcome the caller wants already holds, and a
   * retried sign-out after a lost answer must not look like a failure.
   */
  router.post('/sign-out', async (req, res) => {
    await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
    res.clearCookie('boardwalk.sid');
    res.status(204).end();
  });

  router.get('/me', requireUser(loadUser), (req, res) => {
    res.json({ user: currentUser(req) });
  });

  /** A person changes their own password: their other sessions end, this one goes on. */
  router.post('/password', requireUser(loadUser), signInLimit, async (req, res) => {
    const body = changePasswordBodySchema.parse(req.body);
    const me = currentUser(req);
    const row = await findUserById(db, me.id);
    if (!(await verifyPassword(row, body.currentPassword))) {
      throw new HttpError('bad_request', 'The current password is not right; nothing was changed.', { field: 'currentPassword' });
    }
    const updated = await updateUser(db, me.id, { password: body.newPassword }, me.id);
    req.session.sessionGeneration = updated!.session_generation;
    await new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
    res.status(204).end();
  });

  return router;
}
