import type { DataSource, EntityManager } from 'typeorm';
import { AthleteRepository } from './athlete.repository';
import { AuditRepository } from './audit.repository';
import { AuthRepository } from './auth.repository';
import { ClipMediaRepository } from './clip-media.repository';
import { ClipRepository } from './clip.repository';
import { ClubRepository } from './club.repository';
import { FlagRepository } from './flag.repository';
import { FrameResultRepository } from './frame-result.repository';
import { MemberRepository } from './member.repository';
import { NoteRepository } from './note.repository';
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
  readonly club: ClubRepository;
  readonly flags: FlagRepository;
  readonly frames: FrameResultRepository;
  readonly members: MemberRepository;
  readonly notes: NoteRepository;
  readonly rateLimits: RateLimitRepository;
  readonly referenceLines: ReferenceLineRepository;
  readonly sessions: SessionRepository;
  readonly toleranceBands: ToleranceBandRepository;
  readonly users: UserRepository;
}

const bundles = new WeakMap<EntityManager, Repositories>();

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
      club: new ClubRepository(manager),
      flags: new FlagRepository(manager),
      frames: new FrameResultRepository(manager),
      members: new MemberRepository(manager),
      notes: new NoteRepository(manager),
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

  transaction<T>(work: (manager: EntityManager) => Promise<T>): Promise<T> {
    return this.dataSource.transaction(work);
  }
}
