import fs from 'node:fs/promises';
import path from 'node:path';
import type { Logger } from 'pino';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { ObjectStorage } from '../storage/object-storage';
import type { Clock } from './principal';

/** What one sweep removed. */
export interface SweepReport {
  tempFiles: number;
  incompleteUploads: number;
  orphanObjects: number;
}

export interface JanitorDeps {
  uow: UnitOfWork;
  storage: ObjectStorage;
  /** Upload scratch folder (files named `<pid>-<id>.part`). */
  uploadTempDir: string;
  logger: Logger;
  clock: Clock;
  /** The local S3 stand-in sweeps its own multipart folders (it has no API for them). */
  sweepStandInUploads?: (before: Date) => Promise<number>;
}

const CLIP_PREFIX = /^clubs\/([^/]+)\/clips\/([^/]+)\//;

function processAlive(pid: number): boolean {
  if (pid === process.pid) return false; // ours are from an earlier run that had the same pid
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Removes what a crash leaves behind: upload scratch files, multipart uploads never completed, and
 * stored objects no clip refers to (a kill between storing the video and recording the clip). Videos
 * of minors must not outlive their record, or a deletion on request could never reach them.
 */
export class StorageJanitor {
  constructor(private readonly deps: JanitorDeps) {}

  /**
   * One sweep. `graceMs`: anything younger may belong to work still running in another process on the
   * same database and store (0 at the start of a lone server: nothing else is running).
   */
  async sweep(graceMs: number): Promise<SweepReport> {
    const before = new Date(this.deps.clock.now().getTime() - graceMs);
    const report: SweepReport = {
      tempFiles: await this.sweepTempFiles(graceMs > 0 ? before : null),
      incompleteUploads: await this.sweepIncompleteUploads(before),
      orphanObjects: await this.sweepOrphanObjects(before),
    };
    if (report.tempFiles + report.incompleteUploads + report.orphanObjects > 0) {
      this.deps.logger.info({ removed: report }, 'removed leftovers of interrupted uploads');
    }
    return report;
  }

  /**
   * Scratch files of a process that is gone; with `staleBefore`, also any untouched since then (a stuck
   * upload). A live process's file is never taken for its age alone at start.
   */
  private async sweepTempFiles(staleBefore: Date | null): Promise<number> {
    let removed = 0;
    const dir = this.deps.uploadTempDir;
    for (const name of await fs.readdir(dir).catch(() => [] as string[])) {
      const file = path.join(dir, name);
      const stat = await fs.stat(file).catch(() => null);
      if (!stat) continue;
      const pid = Number(/^(\d+)-/.exec(name)?.[1] ?? NaN);
      const orphaned = Number.isInteger(pid) ? !processAlive(pid) : staleBefore === null;
      if (orphaned || (staleBefore !== null && stat.mtime < staleBefore)) {
        await fs.rm(file, { recursive: true, force: true });
        removed++;
      }
    }
    return removed;
  }

  private async sweepIncompleteUploads(before: Date): Promise<number> {
    const aborted = await this.deps.storage.abortIncompleteUploads(before);
    if (aborted !== null) return aborted;
    return this.deps.sweepStandInUploads ? this.deps.sweepStandInUploads(before) : 0;
  }

  /** Objects under a clip folder whose clip has no row, older than the grace period. */
  private async sweepOrphanObjects(before: Date): Promise<number> {
    const objects = await this.deps.storage.listObjects('clubs/');
    const clipIds = new Set(await this.deps.uow.repos.clips.allIds());
    let removed = 0;
    for (const object of objects) {
      const clipId = CLIP_PREFIX.exec(object.key)?.[2];
      if (!clipId || clipIds.has(clipId) || object.lastModified >= before) continue;
      await this.deps.storage.delete(object.key);
      removed++;
    }
    return removed;
  }
}
