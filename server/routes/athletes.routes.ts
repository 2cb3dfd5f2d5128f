import { Router } from 'express';
import { z } from 'zod';
import {
  athleteListQuerySchema,
  createAthleteSchema,
  type CreateAthleteInput,
} from '@shared/schemas/athlete.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

export function athleteRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;

  router.get('/api/age-groups', guard.authenticate, guard.authorize('age_group:read'), async (req, res) => {
    res.json(await ctx.athletes.listAgeGroups(principalOf(req)));
  });

  router.get(
    '/api/athletes',
    guard.authenticate,
    guard.authorize('athlete:read'),
    validate({ query: athleteListQuerySchema }),
    async (req, res) => {
      res.json(
        await ctx.athletes.list(principalOf(req), req.query as { search?: string; ageGroupId?: string }),
      );
    },
  );

  router.post(
    '/api/athletes',
    guard.authenticate,
    guard.authorize('athlete:create'),
    validate({ body: createAthleteSchema }),
    async (req, res) => {
      res.status(201).json(await ctx.athletes.create(principalOf(req), req.body as CreateAthleteInput));
    },
  );

  router.get('/api/athletes/:id', guard.authenticate, guard.authorize('athlete:read'), async (req, res) => {
    res.json(await ctx.athletes.get(principalOf(req), req.params.id as string));
  });

  router.delete(
    '/api/athletes/:id',
    guard.authenticate,
    guard.authorize('athlete:erase'),
    validate({ params: z.object({ id: z.string().uuid('Not an athlete id') }) }),
    async (req, res) => {
      res.json(await ctx.erasure.eraseAthlete(principalOf(req), req.params.id as string));
    },
  );

  router.get(
    '/api/athletes/:id/clips',
    guard.authenticate,
    guard.authorize('clip:read'),
    async (req, res) => {
      const principal = principalOf(req);
      const athlete = await ctx.athletes.findVisible(principal, req.params.id as string);
      res.json(await ctx.clips.list(principal, { athleteId: athlete.id }));
    },
  );

  return router;
}
