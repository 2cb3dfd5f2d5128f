import { AgeGroupEntity } from '../entities/age-group.entity';
import { AthleteEntity } from '../entities/athlete.entity';
import { AuditEventEntity } from '../entities/audit-event.entity';
import { ClipAthleteEntity } from '../entities/clip-athlete.entity';
import { ClipEntity } from '../entities/clip.entity';
import { ClubEntity } from '../entities/club.entity';
import { CoachAssignmentEntity } from '../entities/coach-assignment.entity';
import { FlagEntity } from '../entities/flag.entity';
import { FocusPointEntity } from '../entities/focus-point.entity';
import { FrameResultEntity } from '../entities/frame-result.entity';
import { GuardianLinkEntity } from '../entities/guardian-link.entity';
import { InvitationEntity } from '../entities/invitation.entity';
import { NoteEntity } from '../entities/note.entity';
import { ReferenceLineEntity } from '../entities/reference-line.entity';
import { RefreshTokenEntity } from '../entities/refresh-token.entity';
import { ReviewEntity } from '../entities/review.entity';
import { ToleranceBandEntity } from '../entities/tolerance-band.entity';
import { TrainingSessionEntity } from '../entities/training-session.entity';
import { UserEntity } from '../entities/user.entity';
import { ToleranceBandChangeEntity } from '../entities/tolerance-band-change.entity';
import { JobEntity } from '../entities/job.entity';
import { ClipTurnsEntity } from '../entities/clip-turns.entity';
import { SeasonEntity } from '../entities/season.entity';
import { SeasonBaselineEntity } from '../entities/season-baseline.entity';
import { CompareStillEntity } from '../entities/compare-still.entity';
import { ReviewItemEntity } from '../entities/review-item.entity';
import { ReviewReceiptEntity } from '../entities/review-receipt.entity';

import { DataSource } from 'typeorm';
import { InitialSchema1796163026000 } from '../migrations/1796163026000-initial-schema';
import { ClipWorkspace1796250000000 } from '../migrations/1796250000000-clip-workspace';
import { ClipProxySize1796250000001 } from '../migrations/1796250000001-clip-proxy-size';
import { RateLimitHitEntity } from '../entities/rate-limit-hit.entity';
import { PasswordResetEntity } from '../entities/password-reset.entity';
import { SessionsAndRateLimits1796260000000 } from '../migrations/1796260000000-sessions-and-rate-limits';
import { ClipProcessingStarts1796260000001 } from '../migrations/1796260000001-clip-processing-starts';
import { PasswordReset1796260000002 } from '../migrations/1796260000002-password-reset';
import { FrameResultSummaryIndex1796260000003 } from '../migrations/1796260000003-frame-result-summary-index';
import { StandardsAndFlags1796270000000 } from '../migrations/1796270000000-standards-and-flags';
import { SeasonPlan1796280000000 } from '../migrations/1796280000000-season-plan';
import { Reviews1796290000000 } from '../migrations/1796290000000-reviews';
import { ConsentLifecycle1796300000000 } from '../migrations/1796300000000-consent-lifecycle';
import { ClipFacing1796300000001 } from '../migrations/1796300000001-clip-facing';
import { ClipAnalysisJobs1796310000000 } from '../migrations/1796310000000-clip-analysis-jobs';
import { CarefulReading1796320000000 } from '../migrations/1796320000000-careful-reading';
import { ConsentEventEntity } from '../entities/consent-event.entity';

export const ALL_ENTITIES = [
  ClubEntity,
  UserEntity,
  AgeGroupEntity,
  AthleteEntity,
  GuardianLinkEntity,
  CoachAssignmentEntity,
  TrainingSessionEntity,
  ClipEntity,
  ClipAthleteEntity,
  FrameResultEntity,
  ReferenceLineEntity,
  ToleranceBandEntity,
  FlagEntity,
  NoteEntity,
  FocusPointEntity,
  ReviewEntity,
  InvitationEntity,
  RefreshTokenEntity,
  AuditEventEntity,
  RateLimitHitEntity,
  PasswordResetEntity,
  ToleranceBandChangeEntity,
  JobEntity,
  ClipTurnsEntity,
  SeasonEntity,
  SeasonBaselineEntity,
  CompareStillEntity,
  ReviewItemEntity,
  ReviewReceiptEntity,
  ConsentEventEntity,
];

// Listed explicitly (no globs): bundlers and tsx cannot resolve migration globs reliably.
export const ALL_MIGRATIONS = [
  InitialSchema1796163026000,
  ClipWorkspace1796250000000,
  ClipProxySize1796250000001,
  SessionsAndRateLimits1796260000000,
  ClipProcessingStarts1796260000001,
  PasswordReset1796260000002,
  FrameResultSummaryIndex1796260000003,
  StandardsAndFlags1796270000000,
  SeasonPlan1796280000000,
  Reviews1796290000000,
  ConsentLifecycle1796300000000,
  ClipFacing1796300000001,
  ClipAnalysisJobs1796310000000,
  CarefulReading1796320000000,
];

/** SQLite through better-sqlite3: WAL journal, foreign keys on (the driver always enables them), no synchronize. */
export function createDataSource(databasePath: string): DataSource {
  return new DataSource({
    type: 'better-sqlite3',
    database: databasePath,
    enableWAL: true,
    synchronize: false,
    migrationsRun: false,
    entities: ALL_ENTITIES,
    migrations: ALL_MIGRATIONS,
    prepareDatabase: (db: { pragma(sql: string): unknown }) => {
      // Wait for a competing writer (CLI, second process) instead of failing with SQLITE_BUSY.
      db.pragma('busy_timeout = 5000');
    },
  });
}

export async function openDatabase(databasePath: string): Promise<DataSource> {
  const dataSource = createDataSource(databasePath);
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  return dataSource;
}
