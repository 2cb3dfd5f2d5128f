import type { Store } from 'express-rate-limit';
import type { Config } from '../config';
import type { AuthMiddleware } from '../middleware/auth.middleware';
import type { AthleteService } from '../services/athlete.service';
import type { AuthService } from '../services/auth.service';
import type { PasswordService } from '../services/password.service';
import type { ClipAnalysisService } from '../services/clip-analysis.service';
import type { ClipImageService } from '../services/clip-image.service';
import type { ClipService } from '../services/clip.service';
import type { ClubService } from '../services/club.service';
import type { ExportService } from '../services/export.service';
import type { FlagService } from '../services/flag.service';
import type { InvitationService } from '../services/invitation.service';
import type { NoteService } from '../services/note.service';
import type { SessionService } from '../services/session.service';
import type { SeasonPlanService } from '../services/season-plan.service';
import type { CompareStillService } from '../services/compare-still.service';
import type { ReviewService } from '../services/review.service';
import type { ErasureService } from '../services/erasure.service';
import type { ConsentService } from '../services/consent.service';
import type { DataExportService } from '../services/data-export.service';
import type { PrivacyService } from '../services/privacy.service';
import type { ToleranceBandService } from '../services/tolerance-band.service';
import type { ObjectStorage } from '../storage/object-storage';
import type { DataSource } from 'typeorm';

/** What route modules get from createApp: services and the auth middleware, nothing else. */
export interface RouteContext {
  config: Config;
  dataSource: DataSource;
  /** A rate-limit counter store shared by every server process (the database), keys under `prefix`. */
  rateLimitStore(prefix: string): Store;
  storage: ObjectStorage;
  guard: AuthMiddleware;
  auth: AuthService;
  passwords: PasswordService;
  athletes: AthleteService;
  sessions: SessionService;
  clips: ClipService;
  clipImages: ClipImageService;
  analysis: ClipAnalysisService;
  notes: NoteService;
  toleranceBands: ToleranceBandService;
  flags: FlagService;
  exports: ExportService;
  invitations: InvitationService;
  club: ClubService;
  plans: SeasonPlanService;
  compareStills: CompareStillService;
  reviews: ReviewService;
  erasure: ErasureService;
  consent: ConsentService;
  privacy: PrivacyService;
  dataExports: DataExportService;
}
