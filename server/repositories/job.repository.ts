import { In, type EntityManager } from 'typeorm';
import { JobEntity, type Job } from '../entities/job.entity';

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

  /** Jobs not finished, oldest first: the order they run in. */
  unfinished(): Promise<Job[]> {
    return this.manager.find(JobEntity, {
      where: { status: In(['queued', 'running']) },
      order: { createdAt: 'ASC', id: 'ASC' },
    });
  }

  /** The club's newest job (running or not). */
  latestForClub(clubId: string): Promise<Job | null> {
    return this.manager.findOne(JobEntity, { where: { clubId }, order: { createdAt: 'DESC', id: 'DESC' } });
  }

  /** A queued job of the club not started yet, which a new change can join. */
  queuedForClub(clubId: string): Promise<Job | null> {
    return this.manager.findOne(JobEntity, {
      where: { clubId, status: 'queued' },
      order: { createdAt: 'DESC' },
    });
  }
}
