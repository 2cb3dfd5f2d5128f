import { Router } from 'express';
import { z } from 'zod';
import { recordConsentSchema, type RecordConsentInput } from '@shared/schemas/athlete.schema';
import {
  consentDecisionSchema,
  guardianAccessSchema,
  privacySettingsSchema,
  type ConsentDecisionInput,
  type GuardianAccessInput,
  type PrivacySettingsInput,
} from '@shared/schemas/consent.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

const athleteParams = z.object({ id: z.string().uuid('Not an athlete id') });

/** Consent given, withdrawn and restored; an adult athlete's guardians; the club's privacy settings; data downloads. */
export function privacyRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;

  router.get(
    '/api/athletes/:id/consent',
    guard.authenticate,
    guard.authorize('consent:read'),
    validate({ params: athleteParams }),
    async (req, res) => {
      res.json(await ctx.consent.record(principalOf(req), req.params.id as string));
    },
  );

  router.post(
    '/api/athletes/:id/consent',
    guard.authenticate,
    guard.authorize('athlete:consent'),
    validate({ params: athleteParams, body: recordConsentSchema }),
    async (req, res) => {
      res.json(
        await ctx.consent.give(principalOf(req), req.params.id as string, req.body as RecordConsentInput),
      );
    },
  );

  for (const action of ['withdraw', 'restore'] as const) {
    router.post(
      `/api/athletes/:id/consent/${action}`,
      guard.authenticate,
      guard.authorize('consent:decide'),
      validate({ params: athleteParams, body: consentDecisionSchema }),
      async (req, res) => {
        res.json(
          await ctx.consent[action](
            principalOf(req),
            req.params.id as string,
            req.body as ConsentDecisionInput,
          ),
        );
      },
    );
  }

  router.put(
    '/api/athletes/:id/guardians/:guardianId/access',
    guard.authenticate,
    guard.authorize('consent:decide'),
    validate({
      params: athleteParams.extend({ guardianId: z.string().uuid('Not a guardian id') }),
      body: guardianAccessSchema,
    }),
    async (req, res) => {
      res.json(
        await ctx.consent.setGuardianAccess(
          principalOf(req),
          req.params.id as string,
          req.params.guardianId as string,
          (req.body as GuardianAccessInput).keep,
        ),
      );
    },
  );

  router.post(
    '/api/athletes/:id/export-link',
    guard.authenticate,
    guard.authorize('athlete:export'),
    validate({ params: athleteParams }),
    async (req, res) => {
      res.json(await ctx.dataExports.link(principalOf(req), req.params.id as string));
    },
  );

  router.get(
    '/api/athletes/:id/export.zip',
    guard.authenticateExport,
    guard.authorize('athlete:export'),
    validate({ params: athleteParams }),
    async (req, res) => {
      let closed = false;
      res.on('close', () => (closed = true));
      // Who may download, and what, is settled before the first byte: refusals are plain 4xx answers.
      const plan = await ctx.dataExports.plan(principalOf(req), req.params.id as string);
      res.setHeader('Content-Type', 'application/zip');
      res.setHeader('Content-Disposition', `attachment; filename="${plan.fileName}"`);
      res.setHeader('Cache-Control', 'no-store');
      try {
        await ctx.dataExports.write(plan, res, () => closed);
      } catch (error) {
        // Headers are out: the only honest signal left is a cut connection, so no half zip looks whole.
        res.destroy(error instanceof Error ? error : undefined);
      }
    },
  );

  router.get('/api/club/privacy', guard.authenticate, guard.authorize('privacy:manage'), async (req, res) => {
    res.json(await ctx.privacy.settings(principalOf(req)));
  });

  router.put(
    '/api/club/privacy',
    guard.authenticate,
    guard.authorize('privacy:manage'),
    validate({ body: privacySettingsSchema }),
    async (req, res) => {
      res.json(await ctx.privacy.updateSettings(principalOf(req), req.body as PrivacySettingsInput));
    },
  );

  return router;
}
