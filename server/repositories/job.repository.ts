import { In, type EntityManager } from 'typeorm';
import { JobEntity, type Job, type JobKind } from '../entities/job.entity';

export class JobRepository {
  constructor(private readonly manager: EntityManager) {}

  findById(id: string): Promise<Job | null> {
    return this.manager.findOneBy(JobEntity, { id });
  }

  async insert(job: Job): Promise<void> {
    await this.manager.insert(JobEntity, job);
  }

  async update(id: string, patch: Partial<Omit<Job, 'id'>>): Promise<void> {
    await this.manager.update(JobEntity, { id }, patch);
  }

  /** Jobs of a kind not finished, oldest first: the order they run in. */
  unfinished(kind: JobKind): Promise<Job[]> {
    return this.manager.find(JobEntity, {
      where: { kind, status: In(['queued', 'running']) },
      order: { createdAt: 'ASC', id: 'ASC' },
    });
  }

  /** The club's newest flag re-check (running or not). */
  latestForClub(clubId: string): Promise<Job | null> {
    return this.manager.findOne(JobEntity, {
      where: { clubId, kind: 'flag-reevaluation' },
      order: { createdAt: 'DESC', id: 'DESC' },
    });
  }

  /** A queued flag re-check of the club not started yet, which a new change can join. */
  queuedForClub(clubId: string): Promise<Job | null> {
    return this.manager.findOne(JobEntity, {
      where: { clubId, kind: 'flag-reevaluation', status: 'queued' },
      order: { createdAt: 'DESC' },
    });
  }

  /**
   * Holds a clip's queued analysis until `until` (a browser is analysing the clip and posting its
   * frames). A job already running is left as it is. Returns whether a queued job was held.
   */
  async holdQueuedAnalysis(clipId: string, until: Date): Promise<boolean> {
    const queued = await this.manager.find(JobEntity, {
      where: { kind: 'clip-analysis', clipId, status: 'queued' },
    });
    for (const job of queued) {
      await this.manager.update(
        JobEntity,
        { id: job.id },
        { payload: { ...job.payload, notBefore: until.toISOString() }, updatedAt: new Date() },
      );
    }
    return queued.length > 0;
  }

  /** The newest analysis job of each of these clips. */
  async latestAnalyses(clipIds: readonly string[]): Promise<Map<string, Job>> {
    const out = new Map<string, Job>();
    if (clipIds.length === 0) return out;
    const rows = await this.manager.find(JobEntity, {
      where: { kind: 'clip-analysis', clipId: In([...clipIds]) },
      order: { createdAt: 'ASC', id: 'ASC' },
    });
    for (const job of rows) out.set(job.clipId!, job);
    return out;
  }
}
