import type { Server } from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { AddressInfo } from 'node:net';
import { createApp, privacyOf } from './app';
import { loadConfig } from './config';
import { createLogger } from './logger';
import { startRuntime } from './runtime';
import { seedDemoClips } from './seed/demo-clips';
import { seedDemoClub } from './seed/demo-seed';
import { seedDemoBandChanges, seedDemoFlagReviews } from './seed/demo-standards';
import { seedDemoSeasonPlan } from './seed/demo-plan';
import { seedDemoReviews } from './seed/demo-reviews';
import { seedDemoPrivacy } from './seed/demo-privacy';
import { FrameStore } from './services/frame-store';
import { StorageJanitor } from './services/storage-janitor';
import { UnitOfWork } from './repositories/unit-of-work';
import { systemClock } from './services/principal';
import { bandService } from './services/tolerance-band.service';
import type { Clock } from './services/principal';

/** The checkout: the demo footage and keypoints live under its fixtures/. */
const DEMO_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export interface StartOptions {
  port?: number;
  dataDir?: string;
  /** Seed the demo club when the database has no club yet (default true). */
  seedDemo?: boolean;
  logLevel?: string;
  /** Settings as environment variables (see server/config.ts), over process.env. */
  env?: Record<string, string>;
  clock?: Clock;
  /** Folder holding dist/, models/ and node_modules/ (default: the checkout); benchmarks serve other builds. */
  projectRoot?: string;
}

export interface StartedStanceline {
  url: string;
  port: number;
  close(): Promise<void>;
  mailbox: { messages(): Promise<{ to: string; subject: string; text: string; html?: string }[]> };
}

/** Starts the whole product: stand-ins when no endpoints are set, migrations, demo seed, HTTP. */
export async function startStanceline(opts: StartOptions = {}): Promise<StartedStanceline> {
  const env: Record<string, string | undefined> = { ...process.env, ...opts.env };
  if (opts.dataDir !== undefined) env.DATA_DIR = opts.dataDir;
  if (opts.port !== undefined) env.PORT = String(opts.port);
  if (opts.logLevel !== undefined) env.LOG_LEVEL = opts.logLevel;
  const config = loadConfig(env);
  const logger = createLogger(config.logLevel);
  const runtime = await startRuntime(config);

  let server: Server | undefined;
  try {
    const seeded =
      (opts.seedDemo ?? true)
        ? await seedDemoClub(runtime.dataSource, { bcryptRounds: config.bcryptRounds, clock: opts.clock })
        : null;
    if (seeded) logger.info({ club: seeded.clubName }, 'seeded the demo club');
    const bands = bandService(new UnitOfWork(runtime.dataSource), opts.clock ?? systemClock);
    const added = await bands.ensureDefaultsForAllClubs();
    if (added > 0) logger.info({ bands: added }, 'seeded common-practice tolerance bands');
    if (seeded) {
      await seedDemoBandChanges(runtime.dataSource, opts.clock);
      const clips = await seedDemoClips(
        {
          dataSource: runtime.dataSource,
          storage: runtime.storage,
          frames: new FrameStore(new UnitOfWork(runtime.dataSource), bands, opts.clock ?? systemClock),
          logger,
          workDir: path.join(config.dataDir, 'media-work'),
          clock: opts.clock,
          projectRoot: DEMO_ROOT,
        },
        seeded.clubId,
      );
      logger.info({ clips: clips.length }, 'seeded the demo clips');
      await seedDemoFlagReviews(runtime.dataSource, opts.clock);
      await seedDemoSeasonPlan(runtime.dataSource, seeded.clubId, opts.clock);
      await seedDemoReviews(runtime.dataSource, seeded.clubId, opts.clock);
      await seedDemoPrivacy(runtime.dataSource, seeded.clubId, opts.clock);
    }
    // What an earlier run left when it was killed mid-upload: scratch files, parts, unrecorded objects.
    const janitor = new StorageJanitor({
      uow: new UnitOfWork(runtime.dataSource),
      storage: runtime.storage,
      uploadTempDir: config.uploadTempDir,
      logger,
      clock: opts.clock ?? systemClock,
      sweepStandInUploads: runtime.sweepStandInUploads,
    });
    await janitor.sweep(config.startupCleanupGraceMs);
    const sweeper = setInterval(() => {
      janitor
        .sweep(config.cleanupGraceMs)
        .catch((error: unknown) => logger.warn({ err: error }, 'cleanup failed'));
    }, config.cleanupIntervalMs);
    sweeper.unref();
    // Background jobs a previous run left unfinished (flags judged again after a band change).
    runtime.jobs.resume();
    // Clips queued for analysis on the server, and analyses a stopped process left half done.
    runtime.analyses.resume();
    // Clips a previous run left uploaded or half processed.
    const resumed = await runtime.mediaQueue.resume();
    if (resumed > 0) logger.info({ clips: resumed }, 'resumed clip processing');
    // The public URL depends on the port, which is only known after listen when PORT=0.
    let publicUrl = config.publicUrl ?? '';
    const app = createApp({
      config,
      dataSource: runtime.dataSource,
      storage: runtime.storage,
      mediaQueue: runtime.mediaQueue,
      jobs: runtime.jobs,
      analyses: runtime.analyses,
      mailer: runtime.mailer,
      mailbox: runtime.mailbox,
      jwtSecret: runtime.jwtSecret,
      publicUrl: () => publicUrl,
      logger,
      clock: opts.clock,
      projectRoot: opts.projectRoot,
    });
    // The daily privacy sweep: at start (what came due while the server was down), then every interval.
    const privacy = privacyOf(app);
    const runPrivacySweep = () =>
      void privacy.sweep().catch((error: unknown) => logger.warn({ err: error }, 'privacy sweep failed'));
    const privacySweeper = setInterval(runPrivacySweep, config.privacySweepIntervalMs);
    privacySweeper.unref();
    server = await new Promise<Server>((resolve, reject) => {
      const s = app.listen(config.port, config.host, () => resolve(s));
      s.once('error', reject);
    });
    // Node's default 5-minute request timeout would cut off long clip uploads on slow rink-side Wi-Fi.
    server.requestTimeout = 0;
    runPrivacySweep();
    const port = (server.address() as AddressInfo).port;
    const url = `http://localhost:${port}`;
    publicUrl = config.publicUrl ?? url;

    const mailbox = runtime.mailbox ?? { messages: async () => [] };
    const httpServer = server;
    let closed: Promise<void> | undefined;
    return {
      url,
      port,
      mailbox,
      close() {
        closed ??= (async () => {
          clearInterval(sweeper);
          clearInterval(privacySweeper);
          await privacy.idle();
          httpServer.closeAllConnections();
          await new Promise<void>((resolve) => httpServer.close(() => resolve()));
          await runtime.close();
        })();
        return closed;
      },
    };
  } catch (error) {
    server?.close();
    await runtime.close();
    throw error;
  }
}
