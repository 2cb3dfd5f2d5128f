import { AsyncLocalStorage } from 'node:async_hooks';
import type { DataSource, EntityManager } from 'typeorm';
import { AthleteRepository } from './athlete.repository';
import { AuditRepository } from './audit.repository';
import { AuthRepository } from './auth.repository';
import { ClipMediaRepository } from './clip-media.repository';
import { ClipRepository } from './clip.repository';
import { ClipTurnsRepository } from './clip-turns.repository';
import { ClubRepository } from './club.repository';
import { ExportRepository } from './export.repository';
import { FlagRepository } from './flag.repository';
import { FrameResultRepository } from './frame-result.repository';
import { JobRepository } from './job.repository';
import { MemberRepository } from './member.repository';
import { NoteRepository } from './note.repository';
import { PlanRepository } from './plan.repository';
import { ReviewRepository } from './review.repository';
import { RateLimitRepository } from './rate-limit.repository';
import { ReferenceLineRepository } from './reference-line.repository';
import { SessionRepository } from './session.repository';
import { ToleranceBandRepository } from './tolerance-band.repository';
import { UserRepository } from './user.repository';

/** Every repository, each writing through one entity manager (the data source's, or a transaction's). */
export interface Repositories {
  readonly manager: EntityManager;
  readonly athletes: AthleteRepository;
  readonly audit: AuditRepository;
  readonly auth: AuthRepository;
  readonly clipMedia: ClipMediaRepository;
  readonly clips: ClipRepository;
  readonly clipTurns: ClipTurnsRepository;
  readonly club: ClubRepository;
  readonly exports: ExportRepository;
  readonly flags: FlagRepository;
  readonly frames: FrameResultRepository;
  readonly jobs: JobRepository;
  readonly members: MemberRepository;
  readonly notes: NoteRepository;
  readonly plans: PlanRepository;
  readonly reviews: ReviewRepository;
  readonly rateLimits: RateLimitRepository;
  readonly referenceLines: ReferenceLineRepository;
  readonly sessions: SessionRepository;
  readonly toleranceBands: ToleranceBandRepository;
  readonly users: UserRepository;
}

const bundles = new WeakMap<EntityManager, Repositories>();
/** The last transaction queued per database; the next one starts when it has settled. */
const queues = new WeakMap<DataSource, Promise<void>>();
/** Which database's transaction the current async call chain runs in. */
const insideTransaction = new AsyncLocalStorage<DataSource>();

/** The repositories of one manager, made once and kept as long as the manager lives. */
export function repositoriesFor(manager: EntityManager): Repositories {
  let bundle = bundles.get(manager);
  if (!bundle) {
    bundle = {
      manager,
      athletes: new AthleteRepository(manager),
      audit: new AuditRepository(manager),
      auth: new AuthRepository(manager),
      clipMedia: new ClipMediaRepository(manager),
      clips: new ClipRepository(manager),
      clipTurns: new ClipTurnsRepository(manager),
      club: new ClubRepository(manager),
      exports: new ExportRepository(manager),
      flags: new FlagRepository(manager),
      frames: new FrameResultRepository(manager),
      jobs: new JobRepository(manager),
      members: new MemberRepository(manager),
      notes: new NoteRepository(manager),
      plans: new PlanRepository(manager),
      reviews: new ReviewRepository(manager),
      rateLimits: new RateLimitRepository(manager),
      referenceLines: new ReferenceLineRepository(manager),
      sessions: new SessionRepository(manager),
      toleranceBands: new ToleranceBandRepository(manager),
      users: new UserRepository(manager),
    };
    bundles.set(manager, bundle);
  }
  return bundle;
}

/**
 * Where services get their repositories: `repos` outside a transaction, `transaction(work)` for a
 * group of writes that stand or fall together, `of(manager)` for the repositories of the transaction
 * a caller is in. A test hands a service a unit of work over fake repositories instead.
 */
export class UnitOfWork {
  constructor(
    private readonly dataSource: DataSource,
    private readonly make: (manager: EntityManager) => Repositories = repositoriesFor,
  ) {}

  get repos(): Repositories {
    return this.make(this.dataSource.manager);
  }

  of(manager: EntityManager): Repositories {
    return this.make(manager);
  }

  /**
   * Runs `work` in a transaction of its own. better-sqlite3 gives TypeORM one connection, on which a
   * second request's transaction would start as a savepoint inside the first (and a rollback of one
   * could undo the other's writes); so transactions of one database run one after another, in order.
   * A transaction started from inside one joins it, as before.
   */
  transaction<T>(work: (manager: EntityManager) => Promise<T>): Promise<T> {
    if (insideTransaction.getStore() === this.dataSource) return this.dataSource.transaction(work);
    const run = () => insideTransaction.run(this.dataSource, () => this.dataSource.transaction(work));
    const previous = queues.get(this.dataSource) ?? Promise.resolve();
    const next = previous.then(run, run);
    queues.set(
      this.dataSource,
      next.then(
        () => undefined,
        () => undefined,
      ),
    );
    return next;
  }
}
