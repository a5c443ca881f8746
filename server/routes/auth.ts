import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { signInBodySchema } from '../../shared/schemas/auth.ts';
import type { DB } from '../db/database.ts';
import { findUserByEmail, verifyPassword } from '../db/users.ts';
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
    // A new session id at sign-in, so a session id planted before sign-in is worthless.
    await new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
    req.session.userId = user.id;
    await new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
    res.json({ user: { id: user.id, email: user.email, name: user.name, role: user.role } });
  });

  router.post('/sign-out', async (req, res) => {
    await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
    res.clearCookie('boardwalk.sid');
    res.status(204).end();
  });

  router.get('/me', requireUser(loadUser), (req, res) => {
    res.json({ user: currentUser(req) });
  });

  return router;
}
