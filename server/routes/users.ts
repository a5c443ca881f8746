import { Router } from 'express';
import { createUserBodySchema, updateUserBodySchema } from '../../shared/schemas/auth.ts';
import type { DB } from '../db/database.ts';
import { countAdmins, createUser, findUserByEmail, findUserById, listUsers, updateUser } from '../db/users.ts';
import type { UserRow } from '../db/types.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser, requireRole } from '../middleware/auth.ts';
import { idParam } from './params.ts';

const publicUser = (u: UserRow) => ({ id: u.id, email: u.email, name: u.name, role: u.role });

/** Admin only: people and their roles. */
export function userRoutes(db: DB): Router {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/', async (_req, res) => {
    res.json({ users: (await listUsers(db)).map(publicUser) });
  });

  router.post('/', async (req, res) => {
    const body = createUserBodySchema.parse(req.body);
    if (await findUserByEmail(db, body.email)) {
      throw new HttpError('conflict', `There is already an account for ${body.email}.`);
    }
    res.status(201).json({ user: publicUser(await createUser(db, body)) });
  });

  router.patch('/:userId', async (req, res) => {
    const id = idParam(req, 'userId');
    const body = updateUserBodySchema.parse(req.body);
    const existing = await findUserById(db, id);
    if (!existing) throw notFound('That user');
    if (existing.role === 'admin' && body.role && body.role !== 'admin' && (await countAdmins(db)) <= 1) {
      throw new HttpError('conflict', 'This is the last admin; make someone else an admin first.');
    }
    if (id === currentUser(req).id && body.role && body.role !== 'admin') {
      throw new HttpError('conflict', 'You cannot remove your own admin role.');
    }
    const updated = await updateUser(db, id, body);
    res.json({ user: publicUser(updated!) });
  });

  return router;
}
