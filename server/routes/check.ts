import { Router } from 'express';
import { checkBoard } from '../../shared/checker/index.ts';
import { checkInputSchema } from '../../shared/schemas/check.ts';

/** Checks a board sent in the body without storing anything. */
export function checkRoutes(): Router {
  const router = Router();
  router.post('/', (req, res) => {
    const input = checkInputSchema.parse(req.body);
    res.json({ findings: checkBoard(input) });
  });
  return router;
}
