import path from 'node:path';
import { fileURLToPath } from 'node:url';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { Config } from './config';
import type { Mailbox } from './mail/embedded-smtp';
import type { Mailer } from './mail/mailer';
import type { MediaPipeline } from './services/clip.service';
import { createAuthMiddleware } from './middleware/auth.middleware';
import { apiNotFound, createErrorHandler } from './middleware/error.middleware';
import { DatabaseRateLimitStore } from './middleware/rate-limit-store';
import { createRequestLogger } from './middleware/request-logger.middleware';
import { securityHeaders } from './middleware/security-headers.middleware';
import { athleteRoutes } from './routes/athletes.routes';
import { authRoutes } from './routes/auth.routes';
import { clipAnalysisRoutes } from './routes/clip-analysis.routes';
import { clipImageRoutes } from './routes/clip-images.routes';
import { clipRoutes } from './routes/clips.routes';
import { clubRoutes } from './routes/club.routes';
import type { RouteContext } from './routes/context';
import { devMailboxRoutes } from './routes/dev-mailbox.routes';
import { healthRoutes } from './routes/health.routes';
import { invitationRoutes } from './routes/invitations.routes';
import { noteRoutes } from './routes/notes.routes';
import { sessionRoutes } from './routes/sessions.routes';
import { staticRoutes } from './routes/static.routes';
import { toleranceBandRoutes } from './routes/tolerance-bands.routes';
import { AccessService } from './services/access.service';
import { AthleteService } from './services/athlete.service';
import { AuditService } from './services/audit.service';
import { AuthService } from './services/auth.service';
import { ClipAnalysisService } from './services/clip-analysis.service';
import { FrameStore } from './services/frame-store';
import { ClipImageService } from './services/clip-image.service';
import { ClipService } from './services/clip.service';
import { ClubService } from './services/club.service';
import { InvitationService } from './services/invitation.service';
import { NoteService } from './services/note.service';
import { PasswordService } from './services/password.service';
import { systemClock, type Clock } from './services/principal';
import { SessionService } from './services/session.service';
import { TokenService } from './services/token.service';
import { ToleranceBandService } from './services/tolerance-band.service';
import { FlagService } from './services/flag.service';
import { ExportService } from './services/export.service';
import { exportRoutes } from './routes/exports.routes';
import type { JobRunner } from './services/job-runner';
import type { ServerAnalysisQueue } from './services/server-analysis-queue';
import { flagRoutes } from './routes/flags.routes';
import { planRoutes } from './routes/plan.routes';
import { reviewRoutes } from './routes/reviews.routes';
import { ReviewService } from './services/review.service';
import { ErasureService } from './services/erasure.service';
import { ConsentService } from './services/consent.service';
import { DataExportService } from './services/data-export.service';
import { PrivacyService } from './services/privacy.service';
import { privacyRoutes } from './routes/privacy.routes';
import { SeasonPlanService } from './services/season-plan.service';
import { CompareStillService } from './services/compare-still.service';
import type { ObjectStorage } from './storage/object-storage';
import { UnitOfWork } from './repositories/unit-of-work';

export interface AppDeps {
  config: Config;
  dataSource: DataSource;
  storage: ObjectStorage;
  mailer: Mailer;
  /** Where uploaded clips go for probing, playable copies, posters and thumbnails (Runtime.mediaQueue). */
  mediaQueue: MediaPipeline;
  /** Durable background jobs (Runtime.jobs): a band change queues one and wakes it. */
  jobs: Pick<JobRunner, 'resume'>;
  /** Pose analysis on the server (Runtime.analyses): a queued clip wakes it. */
  analyses: Pick<ServerAnalysisQueue, 'resume'>;
  /** Set when the embedded SMTP fake is in use: mounts the /dev/mailbox inbox page. */
  mailbox?: Mailbox;
  jwtSecret: string;
  /** Base URL for links in e-mails; a function when it is only known after listen (port 0). */
  publicUrl: string | (() => string);
  logger: Logger;
  clock?: Clock;
  /** Folder holding dist/, models/ and node_modules/ (defaults to the checkout). */
  projectRoot?: string;
}

const DEFAULT_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** Builds the Express app (no listen): routes -> services -> repositories, one error handler last. */
export function createApp(deps: AppDeps): Express {
  const { config, dataSource } = deps;
  const clock = deps.clock ?? systemClock;
  const publicUrl = deps.publicUrl;
  const publicUrlNow = typeof publicUrl === 'function' ? publicUrl : () => publicUrl;
  // One unit of work hands every service its repositories.
  const uow = new UnitOfWork(dataSource);
  const access = new AccessService(uow);
  const audit = new AuditService(clock);
  const tokens = new TokenService(deps.jwtSecret, config.accessTokenTtlMs, config.mediaTokenTtlMs, clock);
  const auth = new AuthService(uow, tokens, audit, clock, config.refreshTtlMs, config.bcryptRounds);
  const sessions = new SessionService(uow, access, audit, clock);
  const clips = new ClipService(uow, access, sessions, deps.storage, tokens, audit, clock, deps.mediaQueue);
  const toleranceBands = new ToleranceBandService(uow, clock, access, () => deps.jobs.resume());
  const frameStore = new FrameStore(uow, toleranceBands, clock);
  const analysis = new ClipAnalysisService(
    uow,
    access,
    clips,
    frameStore,
    audit,
    clock,
    () => deps.analyses.resume(),
    deps.config.analysisBrowserHoldMs,
  );
  const passwords = new PasswordService(uow, auth, audit, deps.mailer, clock, publicUrlNow);
  const compareStills = new CompareStillService(uow, clips, deps.storage, clock);
  const athletes = new AthleteService(uow, access, audit, clock);
  const exports = new ExportService(uow, access, frameStore);
  const erasure = new ErasureService(uow, clips, deps.storage, frameStore, audit);
  const privacy = new PrivacyService({
    uow,
    erasure,
    mailer: deps.mailer,
    audit,
    clock,
    logger: deps.logger,
    publicUrl: publicUrlNow,
  });
  const ctx: RouteContext = {
    config,
    dataSource,
    rateLimitStore: (prefix) => new DatabaseRateLimitStore(uow, clock, prefix),
    storage: deps.storage,
    guard: createAuthMiddleware({ auth, access, tokens }),
    auth,
    passwords,
    athletes,
    sessions,
    clips,
    clipImages: new ClipImageService(clips),
    analysis,
    notes: new NoteService(uow, clips, analysis, audit, clock),
    toleranceBands,
    flags: new FlagService(uow, access, tokens, clock),
    exports,
    invitations: new InvitationService(
      uow,
      access,
      auth,
      audit,
      deps.mailer,
      clock,
      publicUrlNow,
      config.invitationTtlMs,
    ),
    club: new ClubService(uow, clock),
    plans: new SeasonPlanService(uow, access, audit, clock, frameStore),
    compareStills,
    erasure,
    privacy,
    consent: new ConsentService({ uow, access, athletes, audit, clock, privacy, logger: deps.logger }),
    dataExports: new DataExportService(uow, access, exports, deps.storage, tokens, clock),
    reviews: new ReviewService({
      uow,
      access,
      clips,
      frames: frameStore,
      passwords,
      mailer: deps.mailer,
      audit,
      clock,
      publicUrl: publicUrlNow,
    }),
  };

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(createRequestLogger(deps.logger));
  app.use(securityHeaders({ https: publicUrlNow().startsWith('https://') }));
  // A batch of 500 frames of 33 keypoints is about 2 MB of JSON; every other body stays small.
  app.use(['/api/clips/:id/frames', '/api/clips/:id/frames/:frameIndex'], express.json({ limit: '8mb' }));
  // A side-by-side still arrives as a PNG data URL of a few hundred kB (6 MB at most).
  app.use('/api/compare-stills', express.json({ limit: '9mb' }));
  app.use(express.json({ limit: '1mb' }));
  app.use(cookieParser());

  app.use(healthRoutes(ctx));
  app.use(authRoutes(ctx));
  app.use(athleteRoutes(ctx));
  app.use(sessionRoutes(ctx));
  app.use(clipRoutes(ctx));
  app.use(clipImageRoutes(ctx));
  app.use(clipAnalysisRoutes(ctx));
  app.use(noteRoutes(ctx));
  app.use(toleranceBandRoutes(ctx));
  app.use(flagRoutes(ctx));
  app.use(exportRoutes(ctx));
  app.use(invitationRoutes(ctx));
  app.use(clubRoutes(ctx));
  app.use(planRoutes(ctx));
  app.use(reviewRoutes(ctx));
  app.use(privacyRoutes(ctx));
  app.use('/api', apiNotFound);
  // Only the embedded fake has a mailbox, and only an explicit setting shows it.
  if (deps.mailbox && config.devMailbox) app.use(devMailboxRoutes(deps.mailbox));
  app.use(staticRoutes(deps.projectRoot ?? DEFAULT_ROOT));

  app.use(createErrorHandler({ maxUploadBytes: config.maxUploadBytes }));
  // The daily privacy sweep is scheduled by whoever runs the server (start.ts); tests call it directly.
  app.locals.privacy = privacy;
  return app;
}

/** The app's privacy service: its daily sweep is scheduled by whoever runs the server. */
export function privacyOf(app: Express): PrivacyService {
  return app.locals.privacy as PrivacyService;
}
