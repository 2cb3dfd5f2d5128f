import { Router } from 'express';
import { createNoteSchema, updateNoteSchema } from '@shared/schemas/note.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

export function noteRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;

  router.get('/api/clips/:id/notes', guard.authenticate, guard.authorize('note:read'), async (req, res) => {
    res.json(await ctx.notes.list(principalOf(req), req.params.id as string));
  });

  router.get(
    '/api/clips/:id/notes.vtt',
    guard.authenticate,
    guard.authorize('note:read'),
    async (req, res) => {
      const vtt = await ctx.notes.webVtt(principalOf(req), req.params.id as string);
      res.setHeader('Content-Type', 'text/vtt; charset=utf-8');
      res.attachment(vtt.fileName);
      res.send(vtt.body);
    },
  );

  router.post(
    '/api/clips/:id/notes',
    guard.authenticate,
    guard.authorize('note:write'),
    validate({ body: createNoteSchema }),
    async (req, res) => {
      res.status(201).json(await ctx.notes.create(principalOf(req), req.params.id as string, req.body));
    },
  );

  router.patch(
    '/api/notes/:id',
    guard.authenticate,
    guard.authorize('note:write'),
    validate({ body: updateNoteSchema }),
    async (req, res) => {
      res.json(await ctx.notes.update(principalOf(req), req.params.id as string, req.body));
    },
  );

  router.delete('/api/notes/:id', guard.authenticate, guard.authorize('note:write'), async (req, res) => {
    await ctx.notes.delete(principalOf(req), req.params.id as string);
    res.status(204).end();
  });

  return router;
}
