import { z } from 'zod';

/** What a consent covers: storing clips of the athlete, and sending their reviews by e-mail. */
export const CONSENT_PURPOSES = ['store_clips', 'share_by_email'] as const;
export type ConsentPurpose = (typeof CONSENT_PURPOSES)[number];
export const CONSENT_PURPOSE_LABELS: Record<ConsentPurpose, string> = {
  store_clips: 'storing clips',
  share_by_email: 'sending reviews by e-mail',
};

export const CONSENT_ACTIONS = [
  'given',
  'withdrawn',
  'restored',
  'erased',
  'guardian_kept',
  'guardian_ended',
] as const;
export type ConsentAction = (typeof CONSENT_ACTIONS)[number];

export const CONSENT_METHODS = ['signed_form', 'email', 'in_person', 'in_app'] as const;
export type ConsentMethod = (typeof CONSENT_METHODS)[number];

/**
 * Withdrawing (or restoring) consent. A guardian or an adult athlete acts for themself and sends an
 * empty body; a head coach recording someone's request names them and says how it came.
 */
export const consentDecisionSchema = z
  .object({
    decidedBy: z.string().trim().min(1, 'Enter who asked').max(120).optional(),
    method: z.enum(['signed_form', 'email', 'in_person']).optional(),
  })
  .strict();
export type ConsentDecisionInput = z.infer<typeof consentDecisionSchema>;

/** An adult athlete keeps or ends a guardian's access. */
export const guardianAccessSchema = z.object({ keep: z.boolean() }).strict();
export type GuardianAccessInput = z.infer<typeof guardianAccessSchema>;

export const MAX_GRACE_DAYS = 365;
export const MIN_RETENTION_DAYS = 7;
export const MAX_RETENTION_DAYS = 3650;

const wholeDays = (what: string) =>
  z.number({ message: `Enter ${what} as a number of days` }).int('Use whole days');

export const privacySettingsSchema = z
  .object({
    consentGraceDays: wholeDays('the grace period')
      .min(0, 'The grace period cannot be negative')
      .max(MAX_GRACE_DAYS, `At most ${MAX_GRACE_DAYS} days`),
    retentionDaysAfterSeason: wholeDays('how long clips are kept')
      .min(
        MIN_RETENTION_DAYS,
        `At least ${MIN_RETENTION_DAYS} days, so the head coach can be told a week before`,
      )
      .max(MAX_RETENTION_DAYS, `At most ${MAX_RETENTION_DAYS} days`)
      .nullable(),
  })
  .strict();
export type PrivacySettingsInput = z.infer<typeof privacySettingsSchema>;

export interface ConsentEventDto {
  id: string;
  action: ConsentAction;
  purposes: ConsentPurpose[];
  decidedBy: string;
  method: ConsentMethod | null;
  /** The member who recorded it, or null once their account is gone. */
  recordedBy: string | null;
  recordedByRole: string;
  at: string;
}

export interface GuardianAccessDto {
  guardianId: string;
  name: string;
  /** From 18 the athlete decides: false once the athlete is an adult and has not kept this guardian. */
  hasAccess: boolean;
  keptByAthleteAt: string | null;
}

export interface ConsentRecordResponse {
  events: ConsentEventDto[];
  /** Guardians' access, for an adult athlete to keep or end (empty for minors: they always have it). */
  guardianAccess: GuardianAccessDto[];
}

export interface SeasonRetentionDto {
  seasonId: string;
  name: string;
  endsOn: string;
  /** The day its clips are erased (null: the club keeps clips). */
  erasesOn: string | null;
  clips: number;
  noticeSentAt: string | null;
}

export interface PrivacySettingsDto extends PrivacySettingsInput {
  seasons: SeasonRetentionDto[];
  /** Athletes whose consent is withdrawn and whose clips wait for erasure. */
  pendingErasures: { athleteId: string; name: string; erasureDueAt: string; clips: number }[];
  lastSweepAt: string | null;
}

/** A signed download address of all of an athlete's data (valid for minutes), and what it will hold. */
export interface AthleteExportLinkResponse {
  url: string;
  fileName: string;
  clips: number;
  /** The media files' size; the records and CSVs add a little. */
  approxBytes: number;
}
