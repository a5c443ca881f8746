import { Router } from 'express';
import { createUserBodySchema, updateUserBodySchema } from '../../shared/schemas/auth.ts';
import type { DB } from '../db/database.ts';
import { countAdmins, createUser, findUserByEmail, findUserById, listUsers, updateUser } from '../db/users.ts';
import type { UserRow } from '../db/types.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser, requireRole } from '../middleware/auth.ts';
import { idParam } from './params.ts';

const publicUser = (u: UserRow) => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  active: u.deactivated_at === null,
  deactivatedAt: u.deactivated_at,
});

/** Admin only: people and their roles. */
export function userRoutes(db: DB): Router {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/', async (_req, res) => {
    res.json({ users: (await listUsers(db)).map(publicUser) });
  });

  router.post('/', async (req, res) => {
    const body = createUserBodySchema.parse(req.body);
    const existing = await findUserByEmail(db, body.email);
    if (existing) {
      const hint = existing.deactivated_at !== null ? ' It is deactivated: reactivate it instead.' : '';
      throw new HttpError('conflict', `There is already an account for ${body.email}.${hint}`);
    }
    res.status(201).json({ user: publicUser(await createUser(db, body)) });
  });

  router.patch('/:userId', async (req, res) => {
    const id = idParam(req, 'userId');
    const body = updateUserBodySchema.parse(req.body);
    const existing = await findUserById(db, id);
    if (!existing) throw notFound('That user');
    const me = currentUser(req);
    if (id === me.id && body.role && body.role !== 'admin') {
      throw new HttpError('conflict', 'You cannot remove your own admin role.');
    }
    if (id === me.id && body.active === false) {
      throw new HttpError('conflict', 'You cannot deactivate your own account; another admin can.');
    }
    const activeAdmin = existing.role === 'admin' && existing.deactivated_at === null;
    if (activeAdmin && body.role && body.role !== 'admin' && (await countAdmins(db)) <= 1) {
      throw new HttpError('conflict', 'This is the last admin; make someone else an admin first.');
    }
    if (activeAdmin && body.active === false && (await countAdmins(db)) <= 1) {
      throw new HttpError('conflict', 'This is the last admin who can sign in; make someone else an admin first.');
    }
    const updated = await updateUser(db, id, body, me.id);
    // An admin who changed their own password stays signed in here; their other sessions end.
    if (id === me.id && updated) req.session.sessionGeneration = updated.session_generation;
    res.json({ user: publicUser(updated!) });
  });

  return router;
}
