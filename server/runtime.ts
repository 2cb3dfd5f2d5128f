import { randomBytes } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import type { Config } from './config';
import { openDatabase } from './db/data-source';
import { createLogger } from './logger';
import { ClipProcessingQueue } from './media/processing-queue';
import { startEmbeddedSmtp, type EmbeddedSmtp, type Mailbox } from './mail/embedded-smtp';
import { createMailer, type Mailer } from './mail/mailer';
import { startEmbeddedS3, type EmbeddedS3 } from './storage/embedded-s3';
import { ObjectStorage } from './storage/object-storage';
import { JobRunner } from './services/job-runner';
import { queueAnalysisOfReadyClip } from './services/job-queue';
import { ServerAnalysisQueue } from './services/server-analysis-queue';

/** Everything the app talks to, started from one Config; `close()` stops what it started. */
export interface Runtime {
  dataSource: DataSource;
  storage: ObjectStorage;
  mailer: Mailer;
  mailbox: Mailbox | undefined;
  jwtSecret: string;
  s3Endpoint: string;
  /** Probe, playable copy, poster and thumbnails of uploaded clips, one clip at a time. */
  mediaQueue: ClipProcessingQueue;
  /** Durable background jobs (flags judged again after a band changed); `resume()` at start. */
  jobs: JobRunner;
  /** Pose analysis of clips on the server, durable, `ANALYSIS_WORKERS` at a time; `resume()` at start. */
  analyses: ServerAnalysisQueue;
  /** Set with the local S3 stand-in: sweeps its multipart folders (it has no API for them). */
  sweepStandInUploads?: (before: Date) => Promise<number>;
  close(): Promise<void>;
}

async function readOrCreateSecret(config: Config): Promise<string> {
  if (config.jwtSecret) return config.jwtSecret;
  const file = path.join(config.dataDir, 'jwt-secret');
  try {
    const existing = (await fs.readFile(file, 'utf8')).trim();
    if (existing.length >= 32) return existing;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw error;
  }
  const secret = randomBytes(48).toString('base64url');
  await fs.writeFile(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}

export async function startRuntime(config: Config): Promise<Runtime> {
  await fs.mkdir(config.dataDir, { recursive: true });
  await fs.mkdir(config.uploadTempDir, { recursive: true });
  const closers: (() => Promise<void> | void)[] = [];
  const closeAll = async () => {
    for (const close of closers.reverse()) await close();
  };
  try {
    let embeddedS3: EmbeddedS3 | undefined;
    if (!config.s3.endpoint) {
      embeddedS3 = await startEmbeddedS3({ directory: config.s3.embeddedDir, bucket: config.s3.bucket });
      closers.push(() => embeddedS3!.close());
    }
    const s3Endpoint = config.s3.endpoint ?? embeddedS3!.endpoint;
    const storage = new ObjectStorage({ ...config.s3, endpoint: s3Endpoint });
    closers.push(() => storage.close());
    await storage.ensureBucket();

    let smtp: EmbeddedSmtp | undefined;
    if (!config.smtpUrl) {
      smtp = await startEmbeddedSmtp({ directory: config.mailDir });
      closers.push(() => smtp!.close());
    }
    const mailer = createMailer(config.smtpUrl ?? smtp!.url, config.mailFrom);
    closers.push(() => mailer.close());

    const dataSource = await openDatabase(config.databasePath);
    closers.push(() => dataSource.destroy());

    // Closed before the database and the store (closers run in reverse): a running job winds down first.
    const analyses = new ServerAnalysisQueue(dataSource, storage, createLogger(config.logLevel), {
      workers: config.analysisWorkers,
      workDir: path.join(config.dataDir, 'analysis-work'),
      pauseMs: config.jobStepPauseMs,
    });
    closers.push(() => analyses.close());
    const mediaQueue = new ClipProcessingQueue({
      dataSource,
      storage,
      logger: createLogger(config.logLevel),
      workDir: path.join(config.dataDir, 'media-work'),
      onReady: config.autoAnalysis
        ? async (clipId) => {
            if (await queueAnalysisOfReadyClip(dataSource, clipId)) analyses.resume();
          }
        : undefined,
    });
    closers.push(() => mediaQueue.close());
    const jobs = new JobRunner(dataSource, createLogger(config.logLevel), { pauseMs: config.jobStepPauseMs });
    closers.push(() => jobs.close());

    const jwtSecret = await readOrCreateSecret(config);
    return {
      dataSource,
      storage,
      mailer,
      mailbox: smtp,
      jwtSecret,
      s3Endpoint,
      mediaQueue,
      jobs,
      analyses,
      sweepStandInUploads: embeddedS3 ? (before) => embeddedS3!.sweepIncompleteUploads(before) : undefined,
      close: closeAll,
    };
  } catch (error) {
    await closeAll();
    throw error;
  }
}
